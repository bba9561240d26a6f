/**
 * The regions of a run in words and as drawable discs: one sentence per
 * region the plan names (site latitude and zenith cut with the declinations
 * they give, exposure weighting, boxes, bands, masked discs), and every disc of
 * a mask (disc shapes and catalogue sources, radii after PSF growth) with its
 * centre in Galactic coordinates, for the footprint picture.
 */
import { readSourceList, regionBaseDir } from '../regions/catalogue.js';
import type { RegionDocument, RegionNode } from '../regions/types.js';
import { radToDeg } from '../sphere/angles.js';
import { convertLonLat } from '../sphere/frameRotation.js';

/** A mask disc in Galactic coordinates (radians). */
export interface MaskDisc { lonRad: number; latRad: number; radiusRad: number }

const d = (rad: number) => String(Number(radToDeg(rad).toFixed(2)));

function lookup(doc: RegionDocument, n: RegionNode, seen: Set<string>): RegionNode | null {
  if (n.kind !== 'ref') return n;
  if (seen.has(n.name)) return null;
  seen.add(n.name);
  const t = doc.regions.get(n.name);
  return t ? lookup(doc, t, seen) : null;
}

function phrase(doc: RegionDocument, n: RegionNode, depth: number): string {
  const frame = (f: string) => (f === 'galactic' ? 'l' : 'RA');
  const lat = (f: string) => (f === 'galactic' ? 'b' : 'dec');
  let s: string;
  switch (n.kind) {
    case 'sky': s = 'the whole sky'; break;
    case 'site': {
      const w = n.weight.kind === 'none' ? 'unweighted' : n.weight.kind === 'zenith' ? 'weighted by the relative exposure of a flat array (Sommers 2001)'
        : n.weight.kind === 'time' ? 'weighted by the time within the cut' : `weighted by the exposure map ${n.weight.file}`;
      s = `a site at latitude ${d(n.latRad)} deg seeing zenith angles below ${d(n.maxZenithRad)} deg (declinations ${d(Math.max(-Math.PI / 2, n.latRad - n.maxZenithRad))} to ${d(Math.min(Math.PI / 2, n.latRad + n.maxZenithRad))} deg), ${w}`;
      break;
    }
    case 'box': {
      const lo = radToDeg(n.lonFromRad), hi = lo + radToDeg(n.lonWidthRad);
      s = `the box ${frame(n.frame)} ${Number(lo.toFixed(2))} to ${Number((hi % 360).toFixed(2))} deg, ${lat(n.frame)} ${d(n.latMinRad)} to ${d(n.latMaxRad)} deg`;
      break;
    }
    case 'band': s = `the band ${d(n.absLatMinRad)} <= |${lat(n.frame)}| <= ${d(n.absLatMaxRad)} deg`; break;
    case 'disc': s = `a disc of ${d(n.radiusRad)} deg around (${d(n.lonRad)}, ${d(n.latRad)}) deg`; break;
    case 'ring': s = `a ring of radii ${d(n.innerRad)} to ${d(n.outerRad)} deg around (${d(n.lonRad)}, ${d(n.latRad)}) deg`; break;
    case 'sources': {
      let count = '';
      try {
        const list = readSourceList(n, regionBaseDir(doc.file, undefined), doc.file);
        const r = Array.from(list.radiusRad);
        count = `${r.length} discs of radius ${d(Math.min(...r))} to ${d(Math.max(...r))} deg`;
      } catch { count = 'discs'; }
      s = `${count} around the sources of ${n.file}`;
      break;
    }
    case 'all': s = depth > 2 ? 'an intersection' : `the intersection of ${n.items.map((k) => phrase(doc, k, depth + 1)).join('; ')}`; break;
    case 'any': s = depth > 2 ? 'a union' : `the union of ${n.items.map((k) => phrase(doc, k, depth + 1)).join('; ')}`; break;
    case 'ref': {
      const t = depth > 2 ? null : lookup(doc, n, new Set());
      s = t ? `'${n.name}' (${phrase(doc, t, depth + 1)})` : `'${n.name}'`;
      break;
    }
  }
  if (n.except.length) s += `, without ${n.except.map((k) => phrase(doc, k, depth + 1)).join(' and ')}`;
  return s;
}

/**
 * One sentence per named region: `role: 'name' is <description>`.
 * `roles` lists [role, region name] pairs in the order shown.
 */
export function describeRegions(doc: RegionDocument, roles: [string, string][]): string[] {
  return roles.filter(([, name]) => doc.regions.has(name)).map(([role, name]) => `${role}: '${name}' is ${phrase(doc, doc.regions.get(name)!, 0)}.`);
}

/** Every disc drawn by a region (disc shapes and catalogue sources, followed through references and lists), Galactic coordinates. */
export function maskDiscs(doc: RegionDocument, name: string): MaskDisc[] {
  const out: MaskDisc[] = [];
  const seen = new Set<string>();
  const walk = (n: RegionNode): void => {
    if (n.kind === 'ref') {
      if (seen.has(n.name)) return;
      seen.add(n.name);
      const t = doc.regions.get(n.name);
      if (t) walk(t);
    } else if (n.kind === 'disc') {
      const g = convertLonLat(n.lonRad, n.latRad, n.frame, 'galactic');
      out.push({ ...g, radiusRad: n.radiusRad });
    } else if (n.kind === 'sources') {
      const list = readSourceList(n, regionBaseDir(doc.file, undefined), doc.file);
      for (let i = 0; i < list.radiusRad.length; i++) {
        const g = convertLonLat(list.lonRad[i], list.latRad[i], list.frames[i], 'galactic');
        out.push({ ...g, radiusRad: list.radiusRad[i] });
      }
    } else if (n.kind === 'all' || n.kind === 'any') n.items.forEach(walk);
    for (const e of n.except) walk(e);
  };
  const root = doc.regions.get(name);
  if (root) walk(root);
  return out;
}
