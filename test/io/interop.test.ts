/**
 * Interop with the reference HEALPix implementation: maps written by skyspan
 * are read by Debian's python3-healpy (healpy.read_map) and python3-astropy
 * (scripts/read_with_healpy.py), and maps written by healpy.write_map
 * (scripts/write_with_healpy.py) are read by skyspan. Values, Nside,
 * ordering and frame must agree exactly.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { requirePython, runPython } from '../helpers/python.js';
import { readMapFile, writeMapFile } from '../../src/io/mapFile.js';
import { BLANK, type MapArray, type SkyMap } from '../../src/maps/skyMap.js';
import type { FrameName } from '../../src/sphere/frames.js';
import type { Ordering } from '../../src/sphere/nside.js';
import { tempDir } from '../helpers/tempDir.js';

const have = requirePython();
const dir = tempDir('skyspan-interop-');

function plane(nside: number, k: number, f64: boolean, blankEvery = 0): MapArray {
  const n = 12 * nside * nside;
  const a = f64 ? new Float64Array(n) : new Float32Array(n);
  for (let i = 0; i < n; i++) a[i] = blankEvery && i % blankEvery === 1 ? BLANK : Math.cos(0.11 * i + k) * 10 ** k + k;
  return a;
}
function map(nside: number, ordering: Ordering, frame: FrameName, column: string, planes: MapArray[], energies: number[] | null = null): SkyMap {
  return { nside, ordering, frame, column, unit: 'cm^-2 s^-1 sr^-1', planes, energiesGeV: energies ? Float64Array.from(energies) : null };
}

const COORD: Record<FrameName, string | null> = { galactic: 'G', equatorial: 'C', unknown: null };

const cases: { file: string; maps: SkyMap[]; layout: 'implicit' | 'explicit'; dtype?: 'float32' | 'float64' }[] = [
  { file: 'ring32.fits', maps: [map(16, 'RING', 'galactic', 'I', [plane(16, 0, false)])], layout: 'implicit' },
  { file: 'nest64.fits', maps: [map(8, 'NESTED', 'equatorial', 'A', [plane(8, 1, true)]), map(8, 'NESTED', 'equatorial', 'B', [plane(8, 2, true)])], layout: 'implicit' },
  { file: 'partial32.fits', maps: [map(16, 'RING', 'galactic', 'S', [plane(16, 1, false, 3)])], layout: 'explicit' },
  { file: 'partial64nest.fits', maps: [map(8, 'NESTED', 'equatorial', 'S', [plane(8, 0, true, 4)]), map(8, 'NESTED', 'equatorial', 'T', [plane(8, 3, true, 5)])], layout: 'explicit' },
  { file: 'cube.fits', maps: [map(4, 'RING', 'galactic', 'MODEL', [plane(4, 0, false), plane(4, 1, false), plane(4, 2, false)], [1, 10, 100])], layout: 'implicit' },
  { file: 'cube_partial.fits.gz', maps: [map(4, 'NESTED', 'galactic', 'MODEL', [plane(4, 0, true, 2), plane(4, 1, true, 2)], [0.5, 5])], layout: 'explicit' },
  { file: 'unknown.fits.gz', maps: [map(2, 'RING', 'unknown', 'X', [plane(2, 0, false)])], layout: 'implicit' },
];

describe.skipIf(!have)('skyspan writes, healpy and astropy read', () => {
  let read: any[];
  beforeAll(() => {
    for (const c of cases) writeMapFile(join(dir, c.file), c.maps, { layout: c.layout, force: true });
    read = JSON.parse(runPython('scripts/read_with_healpy.py', cases.map((c) => join(dir, c.file))));
  });
  it.each(cases.map((c, i) => [c.file, i] as const))('%s', (_name, i) => {
    const c = cases[i], r = read[i];
    const m0 = c.maps[0];
    expect(r.nside).toBe(m0.nside);
    expect(r.ordering).toBe(m0.ordering);
    expect(r.coordsys ?? null).toBe(COORD[m0.frame]);
    expect(r.explicit).toBe(c.layout === 'explicit');
    const planes = c.maps.flatMap((m) => m.planes);
    expect(r.values).toEqual(planes.map((p) => Array.from(p)));
    if (m0.energiesGeV) {
      expect(r.energies.values).toEqual(Array.from(m0.energiesGeV));
      expect(r.energies.unit).toBe('GeV');
    } else {
      expect(r.columns.filter((x: any) => x.name !== 'PIXEL').map((x: any) => x.name)).toEqual(c.maps.map((m) => m.column));
    }
    // And skyspan reads its own file back the same way.
    const back = readMapFile(join(dir, c.file)).maps;
    expect(back.flatMap((m) => m.planes).map((p) => Array.from(p))).toEqual(planes.map((p) => Array.from(p)));
  });
});

describe.skipIf(!have)('healpy writes, skyspan reads', () => {
  let written: any[];
  beforeAll(() => {
    written = JSON.parse(runPython('scripts/write_with_healpy.py', [dir]));
  });
  it('reads every healpy.write_map layout with identical values, Nside, ordering and frame', () => {
    expect(written.length).toBeGreaterThanOrEqual(8);
    for (const w of written) {
      const { maps, hdus } = readMapFile(join(dir, w.file));
      const frame = w.coordsys === 'G' ? 'galactic' : w.coordsys === 'C' ? 'equatorial' : 'unknown';
      expect(maps.map((m) => m.column), w.file).toEqual(w.columns);
      for (const m of maps) {
        expect(m.nside, w.file).toBe(w.nside);
        expect(m.ordering, w.file).toBe(w.ordering);
        expect(m.frame, w.file).toBe(frame);
      }
      expect(maps.map((m) => Array.from(m.planes[0])), w.file).toEqual(w.values);
      expect(hdus[1].healpix?.scheme).toBe(w.file.startsWith('partial') ? 'EXPLICIT' : 'IMPLICIT');
    }
  });
});
