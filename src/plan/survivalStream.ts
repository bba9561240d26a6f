/**
 * A template file's survival map (the `-survival.fits` beside it) reduced
 * over a region without decoding it whole: the file streams in row blocks
 * (io/mapStream.ts) and, for every plane, the sums of regionWeights.ts's
 * emission-weighted mean survival
 *
 *   P_A = sum(f w T_abs) / sum(f w T_abs / S),   T_abs = S T
 *
 * accumulate pixel by pixel in file order, exactly as regionSurvival does
 * on the whole map (the same operations in the same order, so the same
 * bits). Memory: the region weights, the template plane(s) already held
 * for the factors, and one row block. A file the stream reader cannot take
 * is read whole and reduced by regionSurvival.
 */
import { InputError } from '../core/errors.js';
import { readSkyMap } from '../io/mapFile.js';
import { StreamNotPossible, streamMapFile, type MapStreamPlan } from '../io/mapStream.js';
import type { MapArray, SkyMap } from '../maps/skyMap.js';
import type { RegionWeights } from '../regions/types.js';
import { regionSurvival } from './regionWeights.js';

/** Region weights of the survival map's grid (its Nside, and its frame: galactic unless equatorial). */
export type SurvivalWeights = (nside: number, frame: 'galactic' | 'equatorial') => RegionWeights;

/** Per survival plane: its energy (GeV) and the region's mean survival P_A. */
export interface RegionSurvivalByPlane { energiesGeV: Float64Array; survival: Float64Array }

const gridFrame = (f: string): 'galactic' | 'equatorial' => (f === 'equatorial' ? 'equatorial' : 'galactic');

/** Template plane paired with survival plane `e` (the last plane for later survival planes). */
const templatePlane = (template: SkyMap, e: number): MapArray => template.planes[Math.min(e, template.planes.length - 1)];

function checkGrid(file: string, nside: number, template: SkyMap): void {
  if (nside !== template.nside) throw new InputError(`survival map is at Nside ${nside}, the template at ${template.nside}`, { file });
}

function checkEnergies(file: string, energies: Float64Array | null, planes: number): Float64Array {
  if (!energies) throw new InputError('survival map states no energies', { file });
  if (planes !== energies.length) throw new InputError(`survival map has ${planes} planes for ${energies.length} energies`, { file });
  return energies;
}

/**
 * The mean survival of `template` in the region of `weights`, per plane of
 * the survival map `file`, streamed (see module doc). `frame` is assumed
 * when the file does not state one; `useExposure` false ignores the
 * region's exposure; `blockBytes` the bytes of rows decoded at a time. InputError when the survival map states no energies or
 * is on another Nside than the template.
 */
export async function streamRegionSurvival(file: string, template: SkyMap, weights: SurvivalWeights, useExposure: boolean,
  frame?: 'galactic' | 'equatorial', blockBytes?: number): Promise<RegionSurvivalByPlane> {
  let num = new Float64Array(0), den = new Float64Array(0);
  let f: Float32Array | null = null, e: Float32Array | null = null;
  let ts: MapArray[] = [];
  const sink = {
    begin(plan: MapStreamPlan) {
      checkGrid(file, plan.nside, template);
      const w = weights(plan.nside, gridFrame(plan.frame));
      f = w.fraction;
      e = useExposure ? w.exposure : null;
      num = new Float64Array(plan.planes.length);
      den = new Float64Array(plan.planes.length);
      ts = plan.planes.map((_, q) => templatePlane(template, q));
    },
    window(p0: number, n: number, planes: MapArray[]) {
      for (let q = 0; q < planes.length; q++) {
        const s = planes[q], T = ts[q];
        let nq = num[q], dq = den[q];
        for (let i = 0; i < n; i++) {
          const p = p0 + i, fp = f![p];
          if (fp === 0) continue;
          const sp = s[i], t = sp * T[p];
          if (!(sp > 0) || !Number.isFinite(t)) continue;
          const ww = e ? fp * e[p] : fp;
          nq += ww * t;
          dq += ww * t / sp;
        }
        num[q] = nq; den[q] = dq;
      }
    },
  };
  let res;
  try {
    res = await streamMapFile(file, sink, { frame, blockBytes });
  } catch (err) {
    if (!(err instanceof StreamNotPossible)) throw err;
    return wholeRegionSurvival(file, template, weights, useExposure, frame);
  }
  const energiesGeV = checkEnergies(file, res.energiesGeV, num.length);
  return { energiesGeV, survival: Float64Array.from(num, (x, q) => x / den[q]) };
}

/** The same, with the survival map decoded whole (the path of a file the stream reader cannot take, and the reference of the tests). */
export function wholeRegionSurvival(file: string, template: SkyMap, weights: SurvivalWeights, useExposure: boolean,
  frame?: 'galactic' | 'equatorial'): RegionSurvivalByPlane {
  const survival = readSkyMap(file, { frame });
  const energiesGeV = checkEnergies(file, survival.energiesGeV, survival.planes.length);
  checkGrid(file, survival.nside, template);
  const w = weights(survival.nside, gridFrame(survival.frame));
  const out = survival.planes.map((s, q) => {
    const T = templatePlane(template, q);
    return regionSurvival(Float64Array.from(s, (v, i) => v * T[i]), s, w, useExposure);
  });
  return { energiesGeV, survival: Float64Array.from(out) };
}
