/**
 * Region weights for a run, through the cache: the key holds the region
 * document as given, the SHA-256 of every file it names (catalogues,
 * exposure maps), the region name, Nside, frame and coverage mode. Also the
 * emission-weighted mean survival probability of a template in a region.
 */
import { resolve } from 'node:path';
import { sha256File } from '../io/hash.js';
import { evaluateRegion } from '../regions/evaluate.js';
import { regionBaseDir } from '../regions/catalogue.js';
import type { RegionDocument, RegionNode, RegionWeights } from '../regions/types.js';
import type { ArtefactCache } from './cache.js';

function filesOf(node: RegionNode, out: Set<string>): void {
  if (node.kind === 'sources') out.add(node.file);
  if (node.kind === 'site' && node.weight.kind === 'map') out.add(node.weight.file);
  if (node.kind === 'all' || node.kind === 'any') for (const n of node.items) filesOf(n, out);
  for (const n of node.except) filesOf(n, out);
}

/** Files a region document names, resolved against its folder, with their SHA-256. */
export function regionFiles(doc: RegionDocument): { path: string; sha256: string }[] {
  const set = new Set<string>();
  for (const n of doc.regions.values()) filesOf(n, set);
  const base = regionBaseDir(doc.file, undefined);
  return [...set].sort().map((f) => { const path = resolve(base, f); return { path, sha256: sha256File(path) }; });
}

/** True when region `name` is the whole sky with nothing taken away (directly or by reference). */
export function isWholeSky(doc: RegionDocument, name: string, depth = 0): boolean {
  const n = doc.regions.get(name);
  if (!n || n.except.length > 0 || depth > 32) return false;
  if (n.kind === 'sky') return true;
  return n.kind === 'ref' ? isWholeSky(doc, n.name, depth + 1) : false;
}

/** A cached region evaluator for one document. */
export function cachedRegions(doc: RegionDocument, cache: ArtefactCache): (name: string, o: { nside: number; frame: 'galactic' | 'equatorial'; mode: 'fraction' | 'centre' }) => RegionWeights {
  const docKey = { source: doc.source, files: regionFiles(doc).map((f) => f.sha256) };
  return (name, o) => {
    const key = cache.key('region', { docKey, name, ...o });
    const label = `region ${name} at Nside ${o.nside} (${o.frame}, ${o.mode})`;
    const hit = cache.get('region', key, label);
    if (hit) {
      const m = hit.meta as { solidAngleSr: number; notes: string[]; hasExposure: boolean };
      return { nside: o.nside, frame: o.frame, name, mode: o.mode, fraction: hit.arrays[0] as Float32Array,
        exposure: m.hasExposure ? hit.arrays[1] as Float32Array : null, solidAngleSr: m.solidAngleSr, notes: m.notes };
    }
    const w = evaluateRegion(doc, name, o);
    cache.put('region', key, label, { meta: { solidAngleSr: w.solidAngleSr, notes: w.notes, hasExposure: w.exposure !== null },
      arrays: w.exposure ? [w.fraction, w.exposure] : [w.fraction] });
    return w;
  };
}

/**
 * Emission-weighted mean survival probability in a region, from an absorbed
 * template plane T_abs (emission times survival, per pixel) and its survival
 * plane S (the emission-weighted survival along each line of sight):
 *
 *   P_A = sum(f w T_abs) / sum(f w T_abs / S)
 *
 * i.e. the fraction of the emitted intensity that arrives, averaged over the
 * region with the same coverage f and exposure w as the factors
 * (intrinsic T = T_abs / S; common practice, no source). RING planes on the
 * weights' grid; `useExposure` false ignores w. Pixels with S <= 0 or a
 * non-finite value are skipped.
 */
export function regionSurvival(tAbs: ArrayLike<number>, s: ArrayLike<number>, w: RegionWeights, useExposure: boolean): number {
  let num = 0, den = 0;
  const f = w.fraction, e = useExposure ? w.exposure : null;
  for (let p = 0; p < f.length; p++) {
    const fp = f[p];
    if (fp === 0) continue;
    const t = tAbs[p], sp = s[p];
    if (!(sp > 0) || !Number.isFinite(t)) continue;
    const ww = e ? fp * e[p] : fp;
    num += ww * t;
    den += ww * t / sp;
  }
  return num / den;
}
