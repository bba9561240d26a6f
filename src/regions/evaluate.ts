/**
 * Pixel weights of a region: for every RING pixel of a template at a given
 * Nside and frame, the fraction of the pixel inside the region, and the
 * relative exposure where the region carries a weighted site.
 *
 * Method. Per ring of the template the candidate longitudes come from
 * candidates.ts, so only pixels that can be inside are visited. 'centre' mode:
 * a pixel counts 1 when its centre is inside (centres inside intervals that
 * are exact are filled without a test). 'fraction' mode: the signed distance
 * d of the centre to the region's edge (distance.ts) decides pixels with
 * |d| >= the pixel radius bound at once; the others are split into their four
 * NESTED children, recursively, down to `depth` levels (4^depth sub-pixels);
 * the leaves count by their centres. Only cells cut by an edge are split, so
 * the cost grows like 2^depth per edge pixel, not 4^depth.
 */
import { ComputeError, InputError } from '../core/errors.js';
import { CompensatedSum, TWO_PI } from '../core/math.js';
import { assertNside, nside2npix, pixelAreaSr } from '../sphere/nside.js';
import { ringTable } from '../sphere/ringTable.js';
import { candidates } from './candidates.js';
import { innerIntervals } from './inner.js';
import { beginRing, setPoint, signedDistance } from './distance.js';
import { compileRegion, type PNode, type Program } from './program.js';
import { pixelRadiusBound, RADIUS_PER_RESOLUTION, ringToFaceXY, subpixelCentre } from './subpixels.js';
import { regionBaseDir } from './catalogue.js';
import { fillExposure } from './siteExposure.js';
import type { RegionDocument, RegionWeights, ShapeFrame } from './types.js';

/** Options of {@link evaluateRegion}. */
export interface EvaluateOptions {
  nside: number;
  frame: ShapeFrame;
  /** 'fraction' (default): covered fraction per pixel; 'centre': 1 when the centre is inside. */
  mode?: 'fraction' | 'centre';
  /** Folder for relative catalogue and exposure-map paths (default: the region file's folder). */
  baseDir?: string;
  /** Sub-division levels in fraction mode (default {@link defaultDepth}); 0 to 12. */
  depth?: number;
}

/**
 * Default sub-division depth: enough levels that the finest sub-pixels are at
 * Nside 4096 or finer, at least 1 and at most 6 levels (Nside 64: 6, 256: 4,
 * 2048: 1). With leaves counted as diamonds cut by a straight edge this keeps
 * solid angles within about 1e-5 relative of the closed forms (measured:
 * docs/regions.md, test/regions/solidAngle.test.ts).
 */
export function defaultDepth(nside: number): number {
  const k = Math.ceil(Math.log2(4096 / nside));
  return Math.max(1, Math.min(6, k));
}

/**
 * Evaluates region `name` of `doc` on the RING pixels of Nside opts.nside in
 * frame opts.frame. Fractions are 0..1; solidAngleSr = sum(fraction) * 4 pi /
 * (12 Nside^2). Throws {@link InputError} for a bad Nside, frame or name.
 *
 * @example
 * const doc = parseRegionDocument('regions:\n  north:\n    box: { frame: equatorial, latDeg: [0, 90] }\n');
 * evaluateRegion(doc, 'north', { nside: 16, frame: 'equatorial' }).solidAngleSr // 2 pi to 1e-4
 */
export function evaluateRegion(doc: RegionDocument, name: string, opts: EvaluateOptions): RegionWeights {
  assertNside(opts.nside, { keyPath: 'nside' });
  if (opts.frame !== 'galactic' && opts.frame !== 'equatorial') {
    throw new InputError(`found frame '${String(opts.frame)}', expected galactic or equatorial`, { keyPath: 'frame' });
  }
  const mode = opts.mode ?? 'fraction';
  const depth = opts.depth ?? defaultDepth(opts.nside);
  if (!(Number.isInteger(depth) && depth >= 0 && depth <= 12)) {
    throw new InputError(`found depth ${depth}, expected an integer from 0 to 12`, { keyPath: 'depth' });
  }
  if (opts.nside * 2 ** depth > 2 ** 24) {
    throw new InputError(`Nside ${opts.nside} with depth ${depth} goes below Nside 2^24, expected a smaller depth`, { keyPath: 'depth' });
  }
  const baseDir = regionBaseDir(doc.file, opts.baseDir);
  const prog = compileRegion(doc, name, opts.frame, baseDir);
  const fraction = new Float32Array(nside2npix(opts.nside));
  const spans = new Int32Array(2 * (4 * opts.nside - 1)).fill(-1);
  if (mode === 'centre') fillCentres(prog, opts.nside, fraction, spans);
  else fillFractions(prog, opts.nside, depth, fraction, spans);
  const solidAngleSr = sumSpans(opts.nside, fraction, spans) * pixelAreaSr(opts.nside);
  if (!Number.isFinite(solidAngleSr)) throw new ComputeError(`region ${name}: solid angle is not finite`);
  const notes = [...prog.notes];
  if (mode === 'fraction') {
    notes.push(`fractional coverage: edge pixels split ${depth} times (finest Nside ${opts.nside * 2 ** depth})`);
  } else notes.push('centre mode: a pixel counts fully when its centre is inside');
  if (prog.usesOther) notes.push(`shapes drawn in the other frame are tested on pixel centres rotated out of the ${opts.frame} frame`);
  if (solidAngleSr === 0) notes.push(`region ${name} covers no pixel at Nside ${opts.nside}`);
  const exposure = prog.site ? fillExposure(prog, opts.nside, fraction, spans, baseDir, doc.file, notes) : null;
  return { nside: opts.nside, frame: opts.frame, name, mode, fraction, exposure, solidAngleSr, notes, ringSpans: spans };
}

/** Pixel index range [j0, j1] of the ring pixels with phi0 + j dphi in [s, e]. */
function pixelRange(s: number, e: number, phi0: number, dphi: number, n: number, pad: number, out: Int32Array): void {
  let j0 = Math.ceil((s - phi0) / dphi) - pad;
  let j1 = Math.floor((e - phi0) / dphi) + pad;
  if (j0 < 0) j0 = 0;
  if (j1 > n - 1) j1 = n - 1;
  out[0] = j0; out[1] = j1;
}

/**
 * Sum of the fractions over the touched span of every ring: plain sums within
 * a ring (at most 32768 values), a compensated sum across rings (Neumaier 1974).
 */
function sumSpans(nside: number, fraction: Float32Array, spans: Int32Array): number {
  const t = ringTable(nside);
  const total = new CompensatedSum();
  for (let r = 0; r < t.count; r++) {
    if (spans[2 * r] < 0) continue;
    const a = t.first[r] + spans[2 * r], b = t.first[r] + spans[2 * r + 1];
    let s = 0;
    for (let p = a; p <= b; p++) s += fraction[p];
    total.add(s);
  }
  return total.value();
}

function widen(spans: Int32Array, r: number, j0: number, j1: number): void {
  if (j1 < j0) return;
  if (spans[2 * r] < 0 || j0 < spans[2 * r]) spans[2 * r] = j0;
  if (j1 > spans[2 * r + 1]) spans[2 * r + 1] = j1;
}

function fillCentres(prog: Program, nside: number, fraction: Float32Array, spans: Int32Array): void {
  const t = ringTable(nside);
  const R = pixelRadiusBound(nside);
  const P = new Float64Array(10);
  const jr = new Int32Array(2);
  const root = prog.root;
  for (let r = 0; r < t.count; r++) {
    const z = t.z[r], st = t.sinTheta[r];
    beginRing(root, t.theta[r], R);
    const c = candidates(root, z, st, Math.atan2(z, st), 0);
    const phi0 = t.phi0[r], dphi = t.dphi[r], n = t.length[r], first = t.first[r];
    for (let k = 0; k < c.iv.length; k += 2) {
      pixelRange(c.iv[k], c.iv[k + 1], phi0, dphi, n, 1, jr);
      let j0 = jr[0], j1 = jr[1];
      widen(spans, r, j0, j1);
      if (c.iv[k + 1] >= TWO_PI - dphi || c.iv[k] <= dphi) widen(spans, r, 0, n - 1);
      if (c.exact && j1 - j0 >= 4) {
        // interior filled at once; the two pixels at each end go through the per-pixel test
        fraction.fill(1, first + j0 + 2, first + j1 - 1);
        testCentre(prog, P, z, st, phi0, dphi, first, j0, fraction);
        testCentre(prog, P, z, st, phi0, dphi, first, j0 + 1, fraction);
        testCentre(prog, P, z, st, phi0, dphi, first, j1 - 1, fraction);
        testCentre(prog, P, z, st, phi0, dphi, first, j1, fraction);
        j0 = j1 + 1;
      }
      for (let j = j0; j <= j1; j++) testCentre(prog, P, z, st, phi0, dphi, first, j, fraction);
      // a range ending at 2 pi also reaches the pixel at phi = 0 (and one starting at 0 the last pixel)
      if (c.iv[k + 1] >= TWO_PI - dphi && jr[0] > 0) testCentre(prog, P, z, st, phi0, dphi, first, 0, fraction);
      if (c.iv[k] <= dphi && jr[1] < n - 1) testCentre(prog, P, z, st, phi0, dphi, first, n - 1, fraction);
    }
  }
}

function testCentre(prog: Program, P: Float64Array, z: number, st: number, phi0: number, dphi: number,
  first: number, j: number, fraction: Float32Array): void {
  const phi = phi0 + j * dphi;
  setPoint(prog, P, st * Math.cos(phi), st * Math.sin(phi), z);
  if (signedDistance(prog.root, P) >= 0) fraction[first + j] = 1;
}

function fillFractions(prog: Program, nside: number, depth: number, fraction: Float32Array, spans: Int32Array): void {
  const t = ringTable(nside);
  const R = pixelRadiusBound(nside);
  const P = new Float64Array(10);
  const fxy = new Float64Array(3);
  const zp = new Float64Array(3);
  const jr = new Int32Array(2);
  const root = prog.root;
  for (let r = 0; r < t.count; r++) {
    const z = t.z[r], st = t.sinTheta[r];
    beginRing(root, t.theta[r], R);
    const lat = Math.atan2(z, st);
    const c = candidates(root, z, st, lat, R);
    if (c.iv.length === 0) continue;
    const phi0 = t.phi0[r], dphi = t.dphi[r], n = t.length[r], first = t.first[r];
    // pixels whose centres are inside by R or more are wholly inside: filled without a test
    // (the pixel at each end of a range is left to the test, against rounding)
    const inner = innerIntervals(root, z, st, lat, R);
    for (let k = 0; k < inner.length; k += 2) {
      pixelRange(inner[k], inner[k + 1], phi0, dphi, n, -1, jr);
      if (jr[1] >= jr[0]) fraction.fill(1, first + jr[0], first + jr[1] + 1);
    }
    for (let k = 0; k < c.iv.length; k += 2) {
      pixelRange(c.iv[k], c.iv[k + 1], phi0, dphi, n, 1, jr);
      widen(spans, r, jr[0], jr[1]);
      for (let j = jr[0]; j <= jr[1]; j++) {
        if (fraction[first + j] === 1) continue;
        const phi = phi0 + j * dphi;
        setPoint(prog, P, st * Math.cos(phi), st * Math.sin(phi), z);
        const d = signedDistance(root, P);
        if (d >= R) fraction[first + j] = 1;
        else if (d > -R) {
          if (depth === 0) { fraction[first + j] = d >= 0 ? 1 : 0; continue; }
          ringToFaceXY(nside, first + j, fxy);
          fraction[first + j] = cover(prog, root, P, zp, fxy[0], fxy[1], fxy[2], nside, depth);
        }
      }
    }
  }
}

/** Half-diagonal of a sub-pixel taken as a square of its area (resolution / sqrt 2), over its radius bound. */
const LEAF_HALF_DIAGONAL_PER_RADIUS = 1 / (RADIUS_PER_RESOLUTION * Math.SQRT2);

/** Fraction of pixel (face, ix, iy) at Nside ns inside the region, splitting `levels` more times. */
function cover(prog: Program, root: PNode, P: Float64Array, zp: Float64Array,
  face: number, ix: number, iy: number, ns: number, levels: number): number {
  const ns2 = 2 * ns;
  const Rc = pixelRadiusBound(ns2);
  let sum = 0;
  for (let q = 0; q < 4; q++) {
    const cx = 2 * ix + (q & 1), cy = 2 * iy + (q >> 1);
    subpixelCentre(face, cx, cy, ns2, zp);
    const st = zp[1], phi = zp[2];
    setPoint(prog, P, st * Math.cos(phi), st * Math.sin(phi), zp[0]);
    const d = signedDistance(root, P);
    if (levels === 1) {
      // leaf: area fraction of a diamond (a square standing on a corner, the shape of a HEALPix
      // pixel) cut parallel to a diagonal by an edge at distance d from its centre
      const u = d / (Rc * LEAF_HALF_DIAGONAL_PER_RADIUS);
      sum += u <= -1 ? 0 : u >= 1 ? 1 : u >= 0 ? 1 - 0.5 * (1 - u) * (1 - u) : 0.5 * (1 + u) * (1 + u);
    } else if (d >= Rc) sum += 1;
    else if (d > -Rc) sum += cover(prog, root, P, zp, face, cx, cy, ns2, levels - 1);
  }
  return sum / 4;
}
