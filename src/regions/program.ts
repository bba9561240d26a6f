/**
 * A region compiled for one template frame: a tree of plain nodes holding only
 * numbers, with disc centres already turned into unit vectors of the template
 * frame (a disc is a disc in every frame) and boxes, bands and sites kept in
 * their own frame (evaluated on rotated pixel centres).
 */
import { InputError } from '../core/errors.js';
import { HALF_PI } from '../core/math.js';
import { convertLonLat, rotationMatrix } from '../sphere/frameRotation.js';
import { declinationBand } from './exposure.js';
import { readSourceList } from './catalogue.js';
import type { RegionDocument, RegionNode, ShapeFrame, SiteWeight } from './types.js';

/** Node kinds of a compiled region. */
export enum Op { Sky, Lat, AbsLat, Wedge, Disc, Ring, Discs, All, Any, Minus }

/** One compiled node; fields unused by a kind stay 0 or empty. */
export interface PNode {
  op: Op;
  /** 0: the template frame, 1: the other frame. */
  side: 0 | 1;
  a: number; b: number; c: number; d: number;
  /** Disc centres (x, y, z interleaved), radii and colatitudes, for Disc, Ring and Discs. */
  centres: Float64Array;
  radii: Float64Array;
  colat: Float64Array;
  /** Indices of the discs near the current ring (Discs only) and their count. */
  active: Int32Array;
  activeCount: number;
  kids: PNode[];
}

/** A weighted site found in the region (at most one). */
export interface WeightedSite {
  latRad: number;
  maxZenithRad: number;
  weight: Exclude<SiteWeight, { kind: 'none' }>;
  keyPath: string;
}

/** The compiled region. */
export interface Program {
  root: PNode;
  templateFrame: ShapeFrame;
  /** Rotation from the template frame to the other frame (row-major). */
  toOther: Float64Array;
  /** True when some node needs the other frame. */
  usesOther: boolean;
  /** Whether some node needs longitude and latitude, per side (0 template frame, 1 other frame). */
  needAngles: [boolean, boolean];
  site: WeightedSite | null;
  notes: string[];
  /** Source files read (catalogues), for provenance. */
  inputs: string[];
}

function node(op: Op, side: 0 | 1 = 0, a = 0, b = 0, c = 0, d = 0, kids: PNode[] = []): PNode {
  const e = new Float64Array(0);
  return { op, side, a, b, c, d, centres: e, radii: e, colat: e, active: new Int32Array(0), activeCount: 0, kids };
}

function discSet(lon: ArrayLike<number>, lat: ArrayLike<number>, frames: ShapeFrame[], radii: ArrayLike<number>, to: ShapeFrame): PNode {
  const n = radii.length;
  const p = node(Op.Discs);
  p.centres = new Float64Array(3 * n);
  p.radii = Float64Array.from(radii);
  p.colat = new Float64Array(n);
  p.active = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const c = frames[i] === to ? { lonRad: lon[i], latRad: lat[i] } : convertLonLat(lon[i], lat[i], frames[i], to);
    const cb = Math.cos(c.latRad);
    p.centres[3 * i] = cb * Math.cos(c.lonRad);
    p.centres[3 * i + 1] = cb * Math.sin(c.lonRad);
    p.centres[3 * i + 2] = Math.sin(c.latRad);
    p.colat[i] = HALF_PI - c.latRad;
  }
  return p;
}

interface Ctx {
  doc: RegionDocument;
  frame: ShapeFrame;
  baseDir: string;
  program: Program;
}

/**
 * Compiles region `name` of `doc` for pixels in `templateFrame`. Reads
 * catalogues (relative to baseDir). Throws {@link InputError} for an unknown
 * name or a weighted site that sits under `any` or `except`, or a second one.
 */
export function compileRegion(doc: RegionDocument, name: string, templateFrame: ShapeFrame, baseDir: string): Program {
  const root = doc.regions.get(name);
  if (!root) {
    throw new InputError(`found no region '${name}', expected one of: ${[...doc.regions.keys()].join(', ')}`, { file: doc.file });
  }
  const other: ShapeFrame = templateFrame === 'galactic' ? 'equatorial' : 'galactic';
  const program: Program = {
    root: node(Op.Sky), templateFrame, toOther: rotationMatrix(templateFrame, other), usesOther: false, needAngles: [false, false], site: null, notes: [], inputs: [],
  };
  program.root = build(root, { doc, frame: templateFrame, baseDir, program }, true);
  return program;
}

/** Side (0 template frame, 1 other frame) of a shape tested on longitude/latitude in frame f. */
function sideOf(f: ShapeFrame, ctx: Ctx): 0 | 1 {
  const side = f === ctx.frame ? 0 : 1;
  if (side === 1) ctx.program.usesOther = true;
  ctx.program.needAngles[side] = true;
  return side;
}

/** A latitude node; in the other frame it carries that frame's pole as a template-frame unit vector. */
function latNode(op: Op, side: 0 | 1, lo: number, hi: number, ctx: Ctx): PNode {
  const p = node(op, side, lo, hi);
  if (side === 1) {
    const m = ctx.program.toOther; // the other frame's z axis is the third row
    p.centres = new Float64Array([m[6], m[7], m[8]]);
  }
  return p;
}

function build(n: RegionNode, ctx: Ctx, positive: boolean): PNode {
  let p: PNode;
  switch (n.kind) {
    case 'sky': p = node(Op.Sky); break;
    case 'ref': p = build(ctx.doc.regions.get(n.name) as RegionNode, ctx, positive); break;
    case 'site': {
      const band = declinationBand(n.latRad, n.maxZenithRad);
      p = latNode(Op.Lat, sideOf('equatorial', ctx), band.minRad, band.maxRad, ctx);
      if (n.weight.kind !== 'none') {
        if (!positive) {
          throw new InputError('found a weighted site under any or except, expected weights only on sites that every pixel of the region must lie in',
            { file: ctx.doc.file, keyPath: `${n.keyPath}.site.weight` }, 'move the weight to the site used in all, or drop it');
        }
        if (ctx.program.site) {
          throw new InputError(`found a second weighted site (the first is at ${ctx.program.site.keyPath}), expected at most one`,
            { file: ctx.doc.file, keyPath: `${n.keyPath}.site.weight` });
        }
        ctx.program.site = { latRad: n.latRad, maxZenithRad: n.maxZenithRad, weight: n.weight, keyPath: n.keyPath };
      }
      break;
    }
    case 'box': {
      const s = sideOf(n.frame, ctx);
      const parts: PNode[] = [];
      if (n.latMinRad > -HALF_PI || n.latMaxRad < HALF_PI) parts.push(latNode(Op.Lat, s, n.latMinRad, n.latMaxRad, ctx));
      if (n.lonWidthRad < 2 * Math.PI) parts.push(node(Op.Wedge, s, n.lonFromRad, n.lonWidthRad));
      p = parts.length === 0 ? node(Op.Sky) : parts.length === 1 ? parts[0] : node(Op.All, 0, 0, 0, 0, 0, parts);
      break;
    }
    case 'band': p = latNode(Op.AbsLat, sideOf(n.frame, ctx), n.absLatMinRad, n.absLatMaxRad, ctx); break;
    case 'disc': case 'ring': {
      const r = n.kind === 'disc' ? n.radiusRad : n.outerRad;
      p = discSet([n.lonRad], [n.latRad], [n.frame], [r], ctx.frame);
      if (n.kind === 'ring') { p.op = Op.Ring; p.a = n.innerRad; p.b = n.outerRad; } else p.op = Op.Disc;
      break;
    }
    case 'sources': {
      const list = readSourceList(n, ctx.baseDir, ctx.doc.file);
      ctx.program.inputs.push(list.file);
      if (list.radiusRad.length === 0) {
        ctx.program.notes.push(`catalogue ${n.file} (${n.keyPath}) has no sources; it masks nothing`);
        p = node(Op.Any, 0, 0, 0, 0, 0, []);
      } else {
        p = discSet(list.lonRad, list.latRad, list.frames, list.radiusRad, ctx.frame);
      }
      break;
    }
    case 'all': p = node(Op.All, 0, 0, 0, 0, 0, n.items.map((c) => build(c, ctx, positive))); break;
    case 'any': p = node(Op.Any, 0, 0, 0, 0, 0, n.items.map((c) => build(c, ctx, false))); break;
  }
  if (n.except.length > 0) {
    const cut = n.except.length === 1 ? build(n.except[0], ctx, false) : node(Op.Any, 0, 0, 0, 0, 0, n.except.map((c) => build(c, ctx, false)));
    p = node(Op.Minus, 0, 0, 0, 0, 0, [p, cut]);
  }
  return p;
}
