import { describe, expect, it } from 'vitest';
import { parseTemplateSpec } from '../../src/templates/templateSpec.js';
import { InputError } from '../../src/core/errors.js';

const GOOD = `name: ok
gas:
  - component: hiDickeyLockman
  - component: h2Ferriere2001
    factor: 2
cosmicRays: {distribution: green2015, haloHeightKpc: 4}
energiesGeV: [1000, 100000]`;

function errorOf(text: string): InputError {
  try {
    parseTemplateSpec(text, 'spec.yaml');
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('no error thrown');
}

describe('template specs (common practice, no source: one line naming the key path)', () => {
  it('fills defaults in a good spec', () => {
    const s = parseTemplateSpec(GOOD, 'spec.yaml');
    expect(s.observer).toEqual({ rSunKpc: 8.5, zSunKpc: 0 });
    expect(s.integration).toEqual({ maxDistanceKpc: 30, stepKpc: 0.5, nodesPerSegment: 6 });
    expect(s.gas![1].factor).toBe(2);
  });
  const cases: [string, string, RegExp][] = [
    ['unknown component', GOOD.replace('h2Ferriere2001', 'h2Fancy'), /^spec\.yaml, key gas\[1\]\.component: unknown component "h2Fancy", expected one of /],
    ['negative scale height', 'name: x\ngas: [{component: exponentialSlab, densityCm3: 1, scaleHeightKpc: -0.1}]\ncosmicRays: {distribution: constant}',
      /^spec\.yaml, key gas\[0\]\.scaleHeightKpc: must be > 0, got -0\.1$/],
    ['negative halo height', GOOD.replace('haloHeightKpc: 4', 'haloHeightKpc: -4'), /key cosmicRays\.haloHeightKpc: must be > 0, got -4$/],
    ['unknown variable', 'name: x\ngas: [{component: expression, expression: "exp(-R/3) * exp(-abs(y)/0.1)"}]\ncosmicRays: {distribution: constant}',
      /^spec\.yaml, key gas\[0\]\.expression: expression '.*' uses unknown variable 'y' \(only R and z \(kpc\) are defined\)$/],
    ['syntax error', 'name: x\ngas: [{component: expression, expression: "exp(-R/ * 3"}]\ncosmicRays: {distribution: constant}',
      /^spec\.yaml, key gas\[0\]\.expression: expression 'exp\(-R\/ \* 3' has a syntax error: /],
    ['unknown key', GOOD.replace('name: ok', 'name: ok\nhalo: 3'), /^spec\.yaml, key \(top level\): unknown key 'halo'$/],
    ['cosmic-ray expression with unknown variable', 'name: x\ngas: [{component: uniform, densityCm3: 1}]\ncosmicRays: {distribution: expression, expression: "R + t"}',
      /key cosmicRays\.expression: .*unknown variable 't'/],
    ['missing halo height', GOOD.replace(', haloHeightKpc: 4', ''), /key cosmicRays\.haloHeightKpc: is missing/],
    ['both gas and sources', GOOD + '\nsources: {distribution: lorimer2006, scaleHeightKpc: 0.2}', /key sources: gives both gas and sources/],
    ['bad YAML', 'name: [x', /^spec\.yaml: not valid YAML/],
  ];
  for (const [what, text, pattern] of cases) {
    it(`rejects ${what} with one line`, () => {
      const e = errorOf(text);
      expect(e.message).toMatch(pattern);
      expect(e.message).not.toContain('\n');
    });
  }
});
