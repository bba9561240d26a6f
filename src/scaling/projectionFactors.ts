/**
 * Projection factors: for each gamma-ray template t, the normalisation on the
 * neutrino template T_nu that a sky shaped like t carries per unit of the
 * intensity measured in region A,
 *
 *   q_t = sum(a T_t T_nu) / (<T_t>_A,w sum(a T_nu^2)),
 *
 * so that the neutrino analysis's normalisation predicted from the measured
 * intensity I_A is N = r (q_t / P_t) I_A — the same form as the region-average
 * prediction r (k_I,t / P_t) I_A with k_I replaced by q_t (r the conversion
 * ratio, P_t the survival; compare/predict.ts). It follows from
 * templateProjection.ts with the predicted sky P = (I_A / <T_t>_A,w) T_t:
 * the template scaled to the measured intensity in A. <T_t>_A,w is the factor
 * table's mean in the measured region (factorRow.ts). When T_nu is T_t
 * divided by its mean over the whole sky and a is constant, q_t is the
 * whole-sky k_I (the two modes agree; checked in the tests).
 *
 * The neutrino template and the acceptance are brought to each gamma-ray
 * template's grid (frame: reframe.ts; ordering: reorder.ts; Nside:
 * resample.ts, as intensive quantities). A neutrino template with energy
 * planes uses the plane nearest the neutrino reference energy; the acceptance
 * its first plane.
 */
import { InputError } from '../core/errors.js';
import { reframe } from '../maps/reframe.js';
import { reorder } from '../maps/reorder.js';
import { resample } from '../maps/resample.js';
import type { MapArray, SkyMap } from '../maps/skyMap.js';
import { projectionSums } from './templateProjection.js';

/** One gamma-ray template's plane and its mean in the measured region (template units). */
export interface ProjectionTemplate { name: string; map: SkyMap; plane: number; meanMeasured: number }

/** The projection factor of one template. */
export interface ProjectionFactor {
  template: string;
  plane: number;
  /** q_t, dimensionless per unit of T_nu (see module comment). */
  q: number;
  /** sum(a T_t T_nu) / sum(a T_nu^2) in template units per unit of T_nu. */
  projected: number;
  pixels: number;
  blank: number;
}

/** Index of the plane whose energy is nearest `energyGeV` in log (0 for a map without energy planes). */
export function planeNearest(map: SkyMap, energyGeV: number | undefined): number {
  const e = map.energiesGeV;
  if (!e || e.length <= 1 || energyGeV === undefined) return 0;
  let best = 0;
  for (let i = 1; i < e.length; i++) if (Math.abs(Math.log(e[i] / energyGeV)) < Math.abs(Math.log(e[best] / energyGeV))) best = i;
  return best;
}

/** One plane of `map` on the grid of `like` (frame, ordering, Nside). */
export function alignPlane(map: SkyMap, plane: number, like: SkyMap, what: string): MapArray {
  let m: SkyMap = { ...map, planes: [map.planes[plane]], energiesGeV: null };
  if (m.frame !== like.frame) {
    if (like.frame === 'unknown') throw new InputError(`the gamma-ray template '${like.column}' has no frame, so the ${what} cannot be brought to it`, { keyPath: 'templates.frame' }, 'state the templates\' frame');
    m = reframe(m, like.frame);
  }
  m = reorder(m, like.ordering);
  if (m.nside !== like.nside) m = resample(m, like.nside, { quantity: 'intensive' }).map;
  return m.planes[0];
}

/**
 * q_t for every template (see module comment). `nuEnergyGeV` picks the
 * neutrino template's plane when it has several. Throws InputError for a
 * negative acceptance or a non-positive mean in the measured region.
 */
export function projectionFactors(templates: readonly ProjectionTemplate[], nuTemplate: SkyMap, acceptance: SkyMap | null,
  nuEnergyGeV?: number): ProjectionFactor[] {
  const nuPlane = planeNearest(nuTemplate, nuEnergyGeV);
  const grids = new Map<string, { t: MapArray; a: MapArray | null }>();
  return templates.map((tp) => {
    if (!(tp.meanMeasured > 0)) throw new InputError(`template '${tp.name}': mean in the measured region is ${tp.meanMeasured}, expected > 0`, { keyPath: 'gamma.region' });
    const key = `${tp.map.nside}/${tp.map.ordering}/${tp.map.frame}`;
    let g = grids.get(key);
    if (!g) {
      g = { t: alignPlane(nuTemplate, nuPlane, tp.map, 'neutrino template'), a: acceptance ? alignPlane(acceptance, 0, tp.map, 'acceptance map') : null };
      if (g.a) for (let i = 0; i < g.a.length; i++) if (g.a[i] < 0 && g.a[i] > -1e29) throw new InputError(`the acceptance is ${g.a[i]} at pixel ${i} (on the template grid), expected >= 0`, { keyPath: 'neutrino.acceptance' });
      grids.set(key, g);
    }
    const s = projectionSums(tp.map.planes[tp.plane], g.t, g.a, g.t.length);
    if (!(s.denominator > 0)) throw new InputError(`the neutrino template and the acceptance do not overlap on template '${tp.name}' (sum(a T_nu^2) = ${s.denominator})`, { keyPath: 'neutrino.template' });
    const projected = s.numerator / s.denominator;
    return { template: tp.name, plane: tp.plane, q: projected / tp.meanMeasured, projected, pixels: s.pixels, blank: s.blank };
  });
}
