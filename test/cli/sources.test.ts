/**
 * `skyspan sources` through runCli: tables, JSON, SVG, refusal to overwrite,
 * bad input as one line with exit 1 (project rules, no outside source).
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, type CliIo } from '../../src/cli/main.js';
import { tempDir } from '../helpers/tempDir.js';

function capture(): CliIo & { stdout: string; stderr: string } {
  const io = { stdout: '', stderr: '', out: (t: string) => { io.stdout += t; }, err: (t: string) => { io.stderr += t; } };
  return io;
}

// An invented population and survey, labelled as invented.
const SECTION = `# invented example population
populations:
  name: invented-nebulae
  count: 2000
  spatial: { distribution: green2015, scaleHeightKpc: 0.1 }
  luminosity: { alpha: 1.8, minErgPerS: 1.0e32, maxErgPerS: 1.0e35 }
  spectrum: { pivotTeV: 10, index: 2.4, indexSpread: 0.1 }
  energiesTeV: [10, 30]
  threshold: { fluxErgCm2S: 2.0e-12, referenceDecDeg: 30, siteLatDeg: 30, maxZenithDeg: 45 }
  regions: { measured: survey, neutrino: plane, counts: [survey] }
  realisations: 6
  seed: 2
  nside: 16
`;
const REGIONS = `regions:
  survey:
    box: { frame: galactic, lonDeg: [20, 80], latDeg: [-4, 4] }
  plane:
    box: { frame: galactic, lonDeg: [-180, 180], latDeg: [-5, 5] }
`;

describe('skyspan sources', () => {
  const dir = tempDir('skyspan-sources-');
  const sec = join(dir, 'pop.yaml'), reg = join(dir, 'regions.yaml');
  writeFileSync(sec, SECTION);
  writeFileSync(reg, REGIONS);

  it('writes the N(>S) tables, the intensities and the SVG; refuses to overwrite without --force', async () => {
    const out = join(dir, 'out'), io = capture();
    expect(await runCli(['sources', sec, '--regions', reg, '-o', out], io)).toBe(0);
    for (const f of ['-counts.csv', '-counts.json', '-intensities.csv', '-lognlogs.svg']) expect(existsSync(join(out, `invented-nebulae${f}`))).toBe(true);
    const doc = JSON.parse(readFileSync(join(out, 'invented-nebulae-counts.json'), 'utf8'));
    expect(doc.realisations).toBe(6);
    expect(doc.counts.map((c: { region: string }) => c.region)).toEqual(['(sky)', 'survey']);
    expect(doc.unresolvedMeasured[0].mean).toBeGreaterThan(0);
    expect(readFileSync(join(out, 'invented-nebulae-lognlogs.svg'), 'utf8')).toMatch(/^<svg/);
    const again = capture();
    expect(await runCli(['sources', sec, '--regions', reg, '-o', out], again)).toBe(1);
    expect(await runCli(['sources', sec, '--regions', reg, '-o', out, '--force', '--seed', '3'], capture())).toBe(0);
  });

  it('prints JSON with --json and honours --realisations', async () => {
    const io = capture();
    expect(await runCli(['sources', sec, '--regions', reg, '--json', '--realisations', '3'], io)).toBe(0);
    expect(JSON.parse(io.stdout).realisations).toBe(3);
  });

  it('names the key path of a bad value and exits 1; a bad option exits 2', async () => {
    const bad = join(dir, 'bad.yaml');
    writeFileSync(bad, SECTION.replace('scaleHeightKpc: 0.1', 'scaleHeightKpc: -1'));
    const io = capture();
    expect(await runCli(['sources', bad, '--regions', reg], io)).toBe(1);
    expect(io.stderr).toMatch(/bad\.yaml, key populations\.spatial\.scaleHeightKpc/);
    expect(io.stderr.trim().split('\n').length).toBe(1);
    const io2 = capture();
    expect(await runCli(['sources', sec, '--regions', reg, '--seed', 'x'], io2)).toBe(2);
    const io3 = capture();
    expect(await runCli(['sources', sec], io3)).toBe(1);
    expect(io3.stderr).toMatch(/no region document/);
  });
});
