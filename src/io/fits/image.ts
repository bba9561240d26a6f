/**
 * Image data (primary or IMAGE extension): BITPIX 8/16/32/64/-32/-64 decoded
 * big-endian, with physical = BZERO + BSCALE * stored and BLANK (integer
 * images only) becoming NaN (Pence et al. 2010, A&A 524, A42, section 5.3 and
 * 4.4.2.5).
 */
import type { DecodedArray, ElementType } from './decode.js';
import { decodeContiguous } from './decode.js';
import type { Hdu } from './hdu.js';

/** Element type of each BITPIX value. */
export function bitpixElement(bitpix: number): ElementType {
  switch (bitpix) {
    case 8: return 'uint8';
    case 16: return 'int16';
    case 32: return 'int32';
    case 64: return 'int64';
    case -32: return 'float32';
    default: return 'float64';
  }
}

/** An image's axes (NAXIS1 fastest) and values in file order. */
export interface ImageData {
  readonly dims: number[];
  readonly data: DecodedArray;
}

/** Decodes the image of an HDU (empty for NAXIS = 0). Scaled or blanked images come back as Float64Array. */
export function readImage(bytes: Uint8Array, hdu: Hdu): ImageData {
  const count = hdu.dims.length === 0 ? 0 : hdu.dims.reduce((a, b) => a * b, 1);
  const raw = decodeContiguous(bytes, hdu.dataStart, count, bitpixElement(hdu.bitpix));
  const h = hdu.header;
  const scale = h.number('BSCALE', 1)!, zero = h.number('BZERO', 0)!;
  const blankRaw = hdu.bitpix > 0 ? h.get('BLANK') : undefined;
  const blank = typeof blankRaw === 'number' ? blankRaw : undefined;
  if (scale === 1 && zero === 0 && blank === undefined) return { dims: hdu.dims, data: raw };
  const out = new Float64Array(count);
  const bl = blank ?? NaN;
  for (let i = 0; i < count; i++) {
    const v = raw[i];
    out[i] = v === bl ? NaN : zero + scale * v;
  }
  return { dims: hdu.dims, data: out };
}
