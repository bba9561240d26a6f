/**
 * The parsed form of a region file: every angle in radians, every reference
 * checked, every key path remembered for error messages. Built by
 * `parseRegionDocument` (document.ts) and turned into pixel weights by
 * `evaluateRegion` (evaluate.ts).
 */
import type { FrameName } from '../sphere/frames.js';

/** A frame a region shape can be drawn in. */
export type ShapeFrame = 'galactic' | 'equatorial';

/** Exposure weighting of a site: none, by cos(zenith), by time, or from a HEALPix map. */
export type SiteWeight =
  | { kind: 'none' }
  | { kind: 'zenith' }
  | { kind: 'time' }
  | { kind: 'map'; file: string; column: string | number | undefined; frame: ShapeFrame | undefined };

/** Column names of a source catalogue (defaults: name, lon, lat, frame, radius). */
export interface CatalogueColumns {
  name: string;
  lon: string;
  lat: string;
  frame: string;
  radius: string;
}

/** Fields every node carries. */
interface NodeBase {
  /** Key path of the node in the file, e.g. `regions.measured.all[1]`. */
  keyPath: string;
  /** Regions subtracted from this one (the `except` key). */
  except: RegionNode[];
}

/** One region, as a tree. */
export type RegionNode = NodeBase & (
  | { kind: 'sky' }
  | { kind: 'site'; latRad: number; maxZenithRad: number; weight: SiteWeight }
  | { kind: 'box'; frame: ShapeFrame; lonFromRad: number; lonWidthRad: number; latMinRad: number; latMaxRad: number }
  | { kind: 'band'; frame: ShapeFrame; absLatMinRad: number; absLatMaxRad: number }
  | { kind: 'disc'; frame: ShapeFrame; lonRad: number; latRad: number; radiusRad: number }
  | { kind: 'ring'; frame: ShapeFrame; lonRad: number; latRad: number; innerRad: number; outerRad: number }
  | {
      kind: 'sources'; file: string; frame: ShapeFrame | null; defaultRadiusRad: number | null;
      growth: { psfRad: number; times: number } | null; columns: CatalogueColumns;
    }
  | { kind: 'all'; items: RegionNode[] }
  | { kind: 'any'; items: RegionNode[] }
  | { kind: 'ref'; name: string }
);

/** A parsed region file. */
export interface RegionDocument {
  /** The file it came from, if any (used in messages and to resolve relative paths). */
  file: string | undefined;
  /** Named regions, in file order. */
  regions: Map<string, RegionNode>;
  /** The document as given (plain data), for provenance records. */
  source: unknown;
}

/** Pixel weights of one region at one Nside and frame (RING order). */
export interface RegionWeights {
  nside: number;
  frame: FrameName;
  name: string;
  mode: 'fraction' | 'centre';
  /** Covered fraction per RING pixel, 0..1. */
  fraction: Float32Array;
  /** Relative exposure per RING pixel (maximum 1), or null when the region is unweighted. */
  exposure: Float32Array | null;
  /** Sum of fraction times pixel area, in sr. */
  solidAngleSr: number;
  /** What was assumed or approximated, one sentence each. */
  notes: string[];
  /**
   * Optional ring bounds of the nonzero pixels: for ring r (0-based, north to
   * south), only pixels j = ringSpans[2r] .. ringSpans[2r + 1] of the ring can
   * have a nonzero fraction or exposure (-1: none on that ring). Lets readers
   * skip the untouched sky; absent means every pixel must be looked at.
   */
  ringSpans?: Int32Array;
}
