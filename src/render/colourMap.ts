/**
 * Colour maps as 256-entry lookup tables built once from d3-scale-chromatic's
 * perceptually uniform interpolators (viridis, magma, inferno: van der Walt &
 * Smith 2015; cividis: Nunez, Anderton & Renslow 2018, PLoS ONE 13, e0199239).
 * Each map also names the colour used for blank pixels, chosen to be absent
 * from that map.
 */
import { interpolateCividis, interpolateInferno, interpolateMagma, interpolateViridis } from 'd3-scale-chromatic';
import { InputError } from '../core/errors.js';

/** Names of the colour maps skyspan offers. */
export type ColourMapName = 'magma' | 'viridis' | 'cividis' | 'inferno';

/** A colour map as a table: rgb[3k..3k+2] is entry k of 256. */
export interface ColourLut {
  readonly name: ColourMapName;
  readonly rgb: Uint8Array;
  /** Colour for blank pixels, 0xRRGGBB. */
  readonly blank: number;
}

/** Number of entries in every table. */
export const LUT_SIZE = 256;

const SOURCES: Record<ColourMapName, { f: (t: number) => string; blank: number }> = {
  magma: { f: interpolateMagma, blank: 0x8fa3b5 },
  inferno: { f: interpolateInferno, blank: 0x8fa3b5 },
  viridis: { f: interpolateViridis, blank: 0xd2d2d2 },
  cividis: { f: interpolateCividis, blank: 0xe8a5bd },
};

/** Parses '#rrggbb' or 'rgb(r, g, b)' (the two forms d3-scale-chromatic returns) to 0xRRGGBB. */
export function parseCssColour(s: string): number {
  if (s[0] === '#' && s.length === 7) return parseInt(s.slice(1), 16);
  const m = /^rgb\(\s*(\d+(?:\.\d+)?)\s*,\s*(\d+(?:\.\d+)?)\s*,\s*(\d+(?:\.\d+)?)\s*\)$/.exec(s);
  if (!m) throw new Error(`unparsable colour '${s}'`);
  const c = (x: string) => Math.max(0, Math.min(255, Math.round(Number(x))));
  return (c(m[1]) << 16) | (c(m[2]) << 8) | c(m[3]);
}

const cache = new Map<ColourMapName, ColourLut>();

/** True when name is a known colour map. */
export function isColourMapName(name: string): name is ColourMapName {
  return Object.prototype.hasOwnProperty.call(SOURCES, name);
}

/**
 * The lookup table of a colour map. Entry k samples the interpolator at
 * (k + 0.5) / 256, so for viridis/magma/inferno (themselves 256-entry tables in
 * d3-scale-chromatic, indexed by floor(256 t)) entry k equals interpolate(t)
 * for every t in [k/256, (k+1)/256).
 */
export function colourLut(name: ColourMapName | string): ColourLut {
  if (!isColourMapName(name)) {
    throw new InputError(`colour map '${name}' is unknown`, {}, `choose one of ${Object.keys(SOURCES).join(', ')}`);
  }
  let lut = cache.get(name);
  if (!lut) {
    const rgb = new Uint8Array(3 * LUT_SIZE);
    for (let k = 0; k < LUT_SIZE; k++) {
      const c = parseCssColour(SOURCES[name].f((k + 0.5) / LUT_SIZE));
      rgb[3 * k] = c >> 16; rgb[3 * k + 1] = (c >> 8) & 255; rgb[3 * k + 2] = c & 255;
    }
    lut = { name, rgb, blank: SOURCES[name].blank };
    cache.set(name, lut);
  }
  return lut;
}

/** Table index of a normalised value t in [0, 1]: floor(256 t), clamped to 0..255. */
export function lutIndex(t: number): number {
  const k = Math.floor(t * LUT_SIZE);
  return k < 0 ? 0 : k > LUT_SIZE - 1 ? LUT_SIZE - 1 : k;
}
