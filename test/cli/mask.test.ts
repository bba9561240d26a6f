import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, type CliIo } from '../../src/cli/main.js';
import { readMapFile } from '../../src/io/mapFile.js';
import { parseRegionDocument } from '../../src/regions/document.js';
import { evaluateRegion } from '../../src/regions/evaluate.js';
import { tempDir } from '../helpers/tempDir.js';

function capture(): CliIo & { stdout: string; stderr: string } {
  const io = { stdout: '', stderr: '', out: (t: string) => { io.stdout += t; }, err: (t: string) => { io.stderr += t; } };
  return io;
}

const REGIONS = `# invented survey region for the test
regions:
  survey:
    all:
      - site: { latDeg: 33, maxZenithDeg: 45, weight: zenith }
      - band: { frame: galactic, absLatDeg: [0, 5] }
  plane: { band: { frame: galactic, absLatDeg: [0, 5] } }
`;

describe('skyspan mask (mask writing through writeMapFile; values checked against evaluateRegion)', () => {
  const dir = tempDir('skyspan-mask-');
  const file = join(dir, 'regions.yaml');
  writeFileSync(file, REGIONS);

  it('writes FRACTION and EXPOSURE columns that read back as the evaluated weights', async () => {
    const out = join(dir, 'survey.fits');
    const io = capture();
    const code = await runCli(['mask', file, 'survey', '-o', out, '--nside', '32', '--frame', 'equatorial', '--exposure'], io);
    expect(io.stderr).toBe('');
    expect(code).toBe(0);
    expect(io.stdout).toMatch(/^region survey: [0-9.]+ sr/);
    const { maps } = readMapFile(out);
    expect(maps.map((m) => m.column)).toEqual(['FRACTION', 'EXPOSURE']);
    expect(maps[0].nside).toBe(32);
    expect(maps[0].frame).toBe('equatorial');
    const w = evaluateRegion(parseRegionDocument(REGIONS, file), 'survey', { nside: 32, frame: 'equatorial' });
    expect(Array.from(maps[0].planes[0])).toEqual(Array.from(w.fraction));
    expect(Array.from(maps[1].planes[0])).toEqual(Array.from(w.exposure!));
  });

  it('--json prints the summary; --centre gives 0/1 values; an existing output needs --force', async () => {
    const out = join(dir, 'plane.fits.gz');
    const io = capture();
    expect(await runCli(['mask', file, 'plane', '-o', out, '--nside', '16', '--centre', '--json'], io)).toBe(0);
    const s = JSON.parse(io.stdout);
    expect(s.region).toBe('plane');
    expect(s.mode).toBe('centre');
    expect(s.solidAngleSr).toBeCloseTo((s.pixelsTouched * 4 * Math.PI) / (12 * 16 * 16), 12); // centre mode: whole pixels
    const { maps } = readMapFile(out);
    expect(maps[0].planes[0].every((v) => v === 0 || v === 1)).toBe(true);
    const again = capture();
    expect(await runCli(['mask', file, 'plane', '-o', out, '--nside', '16'], again)).toBe(1);
    expect(again.stderr).toContain('exists already');
    expect(await runCli(['mask', file, 'plane', '-o', out, '--nside', '16', '--force'], capture())).toBe(0);
  });

  it('bad input: one line and exit 1; bad options: exit 2', async () => {
    const io = capture();
    expect(await runCli(['mask', file, 'nowhere', '--nside', '16'], io)).toBe(1);
    expect(io.stderr.trim().split('\n')).toHaveLength(1);
    expect(io.stderr).toContain("found no region 'nowhere', expected one of: survey, plane");
    const bad = capture();
    expect(await runCli(['mask', file, 'plane', '--nside', '100'], bad)).toBe(1);
    expect(bad.stderr).toContain('NSIDE is 100');
    const exp = capture();
    expect(await runCli(['mask', file, 'plane', '--nside', '8', '--exposure'], exp)).toBe(1);
    expect(exp.stderr).toContain('has no weighted site');
    expect(await runCli(['mask', file, 'plane', '--frame', 'ecliptic'], capture())).toBe(2);
    expect(await runCli(['mask', file, 'plane', '--nside', 'abc'], capture())).toBe(2);
    expect(existsSync(join(dir, 'nothing.fits'))).toBe(false);
  });

  it('--help shows an example', async () => {
    const io = capture();
    expect(await runCli(['mask', '--help'], io)).toBe(0);
    expect(io.stdout).toContain('Example:');
  });
});
