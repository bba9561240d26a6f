/**
 * The emission model tabulated once on a grid in (R, u), u = z / (|z| + z_s),
 * for bilinear interpolation in the line-of-sight loop. u maps the whole z axis
 * onto (-1, 1) and packs nodes near the plane: with z_s = 0.5 kpc and 1025 nodes
 * the spacing is 1 pc at z = 0, 4 pc at 0.5 kpc, 120 pc at 5 kpc.
 *
 * Value at a node, plane e: q(R, z, E_e) = gas(R, z) * cr(R, z) * (E_e / E_pivot)^(-g (R - R_sun))
 * for gas templates (g = cosmicRays.indexGradientPerKpc: the spectral index
 * changes with radius, planes relative to the local spectrum), or
 * src(R) / src(R_sun) * exp(-|z|/h) * the same spectral factor for source templates.
 * User expressions are evaluated (by mathjs) only on a coarser sub-grid, every
 * 4th R node (0.1 kpc) and every 2nd u node, and interpolated from there.
 */
import { InputError } from '../core/errors.js';
import type { TemplateSpec } from './templateSpec.js';
import { RADIAL_LAWS, radialLaw, type RadialLawName } from './radialLaws.js';
import { HI_DISC_DEFAULTS, h2FerriereCm3, h2NakanishiSofueCm3, hiDiscCm3, hiNakanishiSofueCm3 } from './gasModels.js';
import { haloVertical, smoothedRadialProfile } from './cosmicRays.js';
import { compileExpression } from './userExpression.js';

/** A tabulated model: values[((iR * nU) + iU) * nE + e]. */
export interface ModelGrid {
  readonly nR: number;
  readonly nU: number;
  readonly nE: number;
  readonly dRKpc: number;
  readonly zScaleKpc: number;
  readonly values: Float32Array;
}

/** Grid resolution options (defaults: dR = 0.025 kpc, 1025 u nodes, z_s = 0.5 kpc). */
export interface GridOptions {
  dRKpc?: number;
  nU?: number;
  zScaleKpc?: number;
  /** Typed-array storage to use (e.g. over a SharedArrayBuffer). */
  allocate?: (length: number) => Float32Array;
}

/** z (kpc) of grid node u, clamped to +-1e4 kpc at the ends. */
export function zOfU(u: number, zScaleKpc: number): number {
  const a = 1 - Math.abs(u);
  return a <= 0 ? Math.sign(u) * 1e4 : (zScaleKpc * u) / a;
}

/** Strides of the coarser table on which user expressions are evaluated (every 4th R node, every 2nd u node). */
export const EXPRESSION_STRIDE_R = 4;
/** Stride in u of the expression table (see EXPRESSION_STRIDE_R). */
export const EXPRESSION_STRIDE_U = 2;

/**
 * Tabulates f(R, z) on every 4th R node and every 2nd u node of the main grid
 * (mathjs evaluation is slow) and returns a lookup (iR, iU) -> value that
 * interpolates bilinearly between those nodes (exact on them).
 */
function coarseTable(f: (r: number, z: number) => number, nR: number, nU: number, dR: number, zAt: Float64Array,
  keyPath: string): (i: number, j: number) => number {
  const sr = EXPRESSION_STRIDE_R, su = EXPRESSION_STRIDE_U;
  const nRc = Math.ceil((nR - 1) / sr) + 1, nUc = Math.ceil((nU - 1) / su) + 1;
  const t = new Float64Array(nRc * nUc);
  for (let a = 0; a < nRc; a++) {
    for (let b = 0; b < nUc; b++) {
      const r = a * sr * dR, z = zAt[Math.min(b * su, nU - 1)];
      const v = f(r, z);
      if (!(v >= 0) || !Number.isFinite(v)) {
        throw new InputError(`expression gives ${v} at R = ${r.toFixed(3)} kpc, z = ${z.toPrecision(4)} kpc`, { keyPath },
          'a density must be finite and >= 0 everywhere within reach of the line of sight');
      }
      t[a * nUc + b] = v;
    }
  }
  return (i, j) => {
    const a = Math.floor(i / sr), b = Math.floor(j / su);
    const ta = (i - a * sr) / sr, tb = (j - b * su) / su;
    const a1 = Math.min(a + 1, nRc - 1), b1 = Math.min(b + 1, nUc - 1);
    return (1 - ta) * ((1 - tb) * t[a * nUc + b] + tb * t[a * nUc + b1]) + ta * ((1 - tb) * t[a1 * nUc + b] + tb * t[a1 * nUc + b1]);
  };
}

function gasFunction(spec: TemplateSpec, nR: number, nU: number, dR: number, zAt: Float64Array): (r: number, z: number, i: number, j: number) => number {
  const rSun = spec.observer.rSunKpc;
  const parts = (spec.gas ?? []).map((g, i): ((r: number, z: number, iR: number, iU: number) => number) => {
    const f = g.factor;
    switch (g.component) {
      case 'hiDickeyLockman': {
        const p = { ...HI_DISC_DEFAULTS, rSunKpc: rSun };
        if (g.holeRadiusKpc !== undefined) p.holeRadiusKpc = g.holeRadiusKpc;
        if (g.holeScaleKpc !== undefined) p.holeScaleKpc = g.holeScaleKpc;
        if (g.outerScaleKpc !== undefined) p.outerScaleKpc = g.outerScaleKpc;
        if (g.flareScaleKpc !== undefined) p.flareScaleKpc = g.flareScaleKpc;
        return (r, z) => f * hiDiscCm3(p, r, z);
      }
      case 'hiNakanishiSofue2003': return (r, z) => f * hiNakanishiSofueCm3(r, z);
      case 'h2Ferriere2001': return (r, z) => f * h2FerriereCm3(rSun, r, z);
      case 'h2NakanishiSofue2006': return (r, z) => f * h2NakanishiSofueCm3(r, z);
      case 'uniform': return () => f * g.densityCm3;
      case 'exponentialSlab': return (_r, z) => f * g.densityCm3 * Math.exp(-Math.abs(z) / g.scaleHeightKpc);
      case 'expression': {
        const e = compileExpression(g.expression, { keyPath: `gas[${i}].expression` });
        const table = coarseTable((r, z) => e.evaluate(r, z), nR, nU, dR, zAt, `gas[${i}].expression`);
        return (_r, _z, iR, iU) => f * table(iR, iU);
      }
    }
  });
  return (r, z, iR, iU) => {
    let s = 0;
    for (const p of parts) s += p(r, z, iR, iU);
    return s;
  };
}

/**
 * Tables kept between builds in one process: the shipped ensemble's templates
 * share two gas models and four cosmic-ray profiles, and both take longer to
 * tabulate than the line-of-sight integration itself. Keyed by everything
 * they depend on; at most `max` per kind, the oldest dropped. Never mutated.
 */
const GAS_TABLES = new Map<string, Float64Array>();
const RADIAL_TABLES = new Map<string, Float64Array>();
function reused(tables: Map<string, Float64Array>, max: number, key: string, make: () => Float64Array): Float64Array {
  const hit = tables.get(key);
  if (hit) return hit;
  const made = make();
  tables.set(key, made);
  if (tables.size > max) tables.delete(tables.keys().next().value!);
  return made;
}

/**
 * Tabulates the spec's model for the given energies (null: one plane without
 * spectral factor) on R in [0, rMaxKpc].
 */
export function buildModelGrid(spec: TemplateSpec, energiesGeV: ArrayLike<number> | null, rMaxKpc: number, opts: GridOptions = {}): ModelGrid {
  const dR = opts.dRKpc ?? 0.025, nU = opts.nU ?? 1025, zs = opts.zScaleKpc ?? 0.5;
  if (!(nU >= 3) || nU % 2 !== 1) throw new InputError(`grid nU is ${nU}, expected an odd count >= 3 (a node at z = 0)`, { keyPath: 'grid.nU' });
  const nR = Math.ceil(rMaxKpc / dR) + 2;
  const nE = energiesGeV ? energiesGeV.length : 1;
  const rSun = spec.observer.rSunKpc;
  const values = opts.allocate ? opts.allocate(nR * nU * nE) : new Float32Array(nR * nU * nE);
  const rs = new Float64Array(nR);
  for (let i = 0; i < nR; i++) rs[i] = i * dR;
  const du = 2 / (nU - 1);
  const zs_ = new Float64Array(nU);
  for (let j = 0; j < nU; j++) zs_[j] = zOfU(-1 + j * du, zs);
  zs_[(nU - 1) / 2] = 0;

  // Spatial density per (R, z) and the spectral gradient.
  let density: (iR: number, z: number, iU: number) => number;
  let gradient = 0, pivot = 1000;
  if (spec.sources) {
    const law = RADIAL_LAWS[spec.sources.distribution as RadialLawName];
    const h = spec.sources.scaleHeightKpc;
    gradient = spec.sources.indexGradientPerKpc; pivot = spec.sources.pivotGeV;
    const radial = Float64Array.from(rs, (r) => radialLaw(law, r, rSun));
    density = (iR, z) => radial[iR] * Math.exp(-Math.abs(z) / h);
  } else {
    const cr = spec.cosmicRays!;
    gradient = cr.indexGradientPerKpc; pivot = cr.pivotGeV;
    const gasGrid = reused(GAS_TABLES, 2, JSON.stringify([spec.gas ?? [], rSun, nR, nU, dR, zs]), () => {
      const gas = gasFunction(spec, nR, nU, dR, zs_);
      const t = new Float64Array(nR * nU);
      for (let i = 0; i < nR; i++) for (let j = 0; j < nU; j++) t[i * nU + j] = gas(rs[i], zs_[j], i, j);
      return t;
    });
    let crf: (iR: number, z: number, iU: number) => number;
    if (cr.distribution === 'constant') crf = () => 1;
    else if (cr.distribution === 'expression') {
      const e = compileExpression(cr.expression!, { keyPath: 'cosmicRays.expression' });
      const table = coarseTable((r, z) => e.evaluate(r, z), nR, nU, dR, zs_, 'cosmicRays.expression');
      crf = (iR, _z, iU) => table(iR, iU);
    } else {
      const H = cr.haloHeightKpc!;
      const radial = reused(RADIAL_TABLES, 8, JSON.stringify([cr.distribution, rSun, H, nR, dR]),
        () => smoothedRadialProfile(RADIAL_LAWS[cr.distribution as RadialLawName], rSun, H, rs));
      crf = (iR, z) => radial[iR] * haloVertical(cr.verticalProfile, z, H);
    }
    density = (iR, z, iU) => { const c = crf(iR, z, iU); return c === 0 ? 0 : c * gasGrid[iR * nU + iU]; };
  }
  const logE = energiesGeV ? Float64Array.from(energiesGeV, (e) => Math.log(e / pivot)) : new Float64Array(1);
  // The spectral factor depends on R and E only: one exp per (R, E), not per node.
  const spectral = new Float64Array(nE);
  for (let i = 0; i < nR; i++) {
    const dg = gradient * (rs[i] - rSun);
    for (let e = 0; e < nE; e++) spectral[e] = dg === 0 ? 1 : Math.exp(-dg * logE[e]);
    for (let j = 0; j < nU; j++) {
      const d = density(i, zs_[j], j);
      const base = (i * nU + j) * nE;
      for (let e = 0; e < nE; e++) values[base + e] = d * spectral[e];
    }
  }
  return { nR, nU, nE, dRKpc: dR, zScaleKpc: zs, values };
}
