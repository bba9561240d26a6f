/**
 * The streamed description of a map file (src/io/fitsDescribeStream.ts)
 * against the whole-file one (src/io/fitsDescribe.ts + maps/stats.ts): the
 * same HDUs and, per plane, the same min, mean, max and counts, exactly, with
 * row blocks far smaller than the map, for a gzip cube with blanks and a
 * BAD_DATA value. (Equivalence of two implementations: common practice, no
 * source.) And the streamed SHA-256 against node:crypto's over the file.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { describeFitsFile } from '../../src/io/fitsDescribe.js';
import { describeFitsFileStreamed } from '../../src/io/fitsDescribeStream.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { streamMapFile } from '../../src/io/mapStream.js';
import { planeStats } from '../../src/maps/stats.js';

const dir = mkdtempSync(join(tmpdir(), 'skyspan-mapstream-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('streamed map files', () => {
  const p = join(dir, 'cube.fits.gz');
  const npix = 12 * 16 * 16;
  const planes = [0, 1, 2, 3].map((j) => Float64Array.from({ length: npix }, (_, i) => (i % (7 + j) === 0 ? NaN : Math.sin(i * 0.01 + j) * (j + 1))));
  writeMapFile(p, { nside: 16, ordering: 'NESTED', frame: 'equatorial', column: 'C', unit: 'arb', planes, energiesGeV: Float64Array.from([1, 2, 3, 4]) }, { dtype: 'float32' });

  it('describes a gzip cube with exactly the whole-file statistics', async () => {
    const whole = describeFitsFile(p);
    const s = await describeFitsFileStreamed(p, { blockBytes: 700 });
    expect(s.hdus).toEqual(whole.hdus);
    expect(s.bytes).toBe(whole.bytes);
    expect(s.maps).toHaveLength(1);
    expect(s.maps[0].planes).toEqual(whole.maps[0].planes.map(planeStats));
    expect(Array.from(s.maps[0].energiesGeV!)).toEqual([1, 2, 3, 4]);
    expect(s.maps[0].planes[0].blankCount).toBeGreaterThan(0);
  });

  it('hashes the file from the bytes it decodes (SHA-256, FIPS 180-4, as node:crypto computes it)', async () => {
    let windows = 0;
    const r = await streamMapFile(p, { begin() {}, window() { windows++; } }, { blockBytes: 1000 });
    expect(windows).toBeGreaterThan(1); // several row blocks
    expect(r.sha256).toBe(createHash('sha256').update(readFileSync(p)).digest('hex'));
  });
});
