/**
 * Walking the HDUs of a FITS file: each header, the size of its data
 * (Pence et al. 2010, A&A 524, A42, eq. 1 for primary and image data, eq. 2
 * for extensions: |BITPIX|/8 * GCOUNT * (PCOUNT + NAXIS1*...*NAXISn)), and the
 * check that the data lies inside the file before anything is allocated.
 */
import { InputError } from '../../core/errors.js';
import { BLOCK, FitsHeader, readHeader } from './header.js';

/** Kind of HDU, from SIMPLE / XTENSION. */
export type HduKind = 'primary' | 'image' | 'bintable' | 'table' | 'other';

/** One header-data unit located in the file's bytes. */
export interface Hdu {
  readonly index: number;
  readonly kind: HduKind;
  /** XTENSION value (or 'PRIMARY'). */
  readonly xtension: string;
  readonly name: string;
  readonly header: FitsHeader;
  readonly bitpix: number;
  readonly dims: number[];
  /** Byte offset of the data and its size in bytes (without padding). */
  readonly dataStart: number;
  readonly dataBytes: number;
  readonly notes: string[];
}

const VALID_BITPIX = new Set([8, 16, 32, 64, -32, -64]);

function describeKind(xt: string): HduKind {
  if (xt === 'BINTABLE') return 'bintable';
  if (xt === 'IMAGE') return 'image';
  if (xt === 'TABLE') return 'table';
  return 'other';
}

/**
 * Reads the mandatory keywords of an HDU header and checks its data fits in
 * `fileLength` bytes (Infinity when the length is not known yet, as in a stream).
 */
export function locateHdu(fileLength: number, header: FitsHeader, index: number, file: string): Hdu {
  const notes = [...header.notes];
  let xtension = 'PRIMARY';
  if (index === 0) {
    if (header.cards[0]?.keyword !== 'SIMPLE') {
      throw new InputError('the file does not start with SIMPLE', { file, byteOffset: 0 }, 'this is not a FITS file');
    }
    if (header.get('SIMPLE') !== true) notes.push('SIMPLE is not T: the file says it does not conform to the standard');
  } else {
    const xt = header.string('XTENSION');
    if (header.cards[0]?.keyword !== 'XTENSION' || xt === undefined) {
      throw new InputError('extension header does not start with XTENSION', { file, byteOffset: header.start });
    }
    xtension = xt.toUpperCase();
  }
  const bitpix = header.int('BITPIX', -64, 64);
  if (!VALID_BITPIX.has(bitpix)) {
    throw new InputError(`BITPIX is ${bitpix}, expected 8, 16, 32, 64, -32 or -64`, { file, keyword: 'BITPIX', byteOffset: header.offsetOf('BITPIX') });
  }
  const naxis = header.int('NAXIS', 0, 999);
  const dims: number[] = [];
  for (let k = 1; k <= naxis; k++) dims.push(header.int(`NAXIS${k}`, 0, Number.MAX_SAFE_INTEGER));
  const pcount = index === 0 ? 0 : header.int('PCOUNT', 0, Number.MAX_SAFE_INTEGER);
  const gcount = index === 0 ? 1 : header.int('GCOUNT', 0, Number.MAX_SAFE_INTEGER);
  const groups = index === 0 && header.get('GROUPS') === true && dims[0] === 0;
  let elements = 0;
  if (naxis > 0) {
    elements = 1;
    for (let k = groups ? 1 : 0; k < naxis; k++) elements *= dims[k];
  }
  if (groups) {
    notes.push('random-groups primary HDU (data not read)');
    elements = (header.optInt('PCOUNT', 0, Number.MAX_SAFE_INTEGER, 0) + elements) * header.optInt('GCOUNT', 0, Number.MAX_SAFE_INTEGER, 1);
  }
  const dataBytes = (Math.abs(bitpix) / 8) * gcount * (pcount + elements);
  const dataStart = header.end;
  if (!Number.isSafeInteger(dataBytes) || dataStart + dataBytes > fileLength) {
    throw new InputError(
      `HDU ${index} declares ${dataBytes} data bytes from byte ${dataStart}, but the file ends at byte ${fileLength}`,
      { file, byteOffset: dataStart, keyword: naxis >= 2 ? 'NAXIS2' : 'NAXIS' },
      'the file is truncated or its NAXISn values are wrong');
  }
  const kind = index === 0 ? 'primary' : describeKind(xtension);
  const name = header.string('EXTNAME', index === 0 ? 'PRIMARY' : '') ?? '';
  return { index, kind, xtension, name, header, bitpix, dims, dataStart, dataBytes, notes };
}

/** True when the rest of the file is only zero or blank fill (tolerated after the last HDU). */
function onlyFill(bytes: Uint8Array, from: number): boolean {
  for (let i = from; i < bytes.length; i++) if (bytes[i] !== 0 && bytes[i] !== 32) return false;
  return true;
}

/**
 * Splits a FITS byte stream into HDUs. Every size is checked against the
 * stream length before use; malformed input throws InputError naming the
 * file, byte offset and keyword.
 */
export function walkHdus(bytes: Uint8Array, file: string): Hdu[] {
  if (bytes.length < BLOCK) {
    throw new InputError(`file has ${bytes.length} bytes, less than one 2880-byte FITS block`, { file, byteOffset: bytes.length },
      'the file is truncated or not FITS');
  }
  if (String.fromCharCode(...bytes.subarray(0, 9)) !== 'SIMPLE  =') {
    throw new InputError('the file does not start with SIMPLE', { file, byteOffset: 0 }, 'this is not a FITS file');
  }
  const hdus: Hdu[] = [];
  let pos = 0;
  while (pos < bytes.length) {
    if (hdus.length > 0 && onlyFill(bytes, pos)) break;
    if (hdus.length > 0 && (bytes.length - pos < 8 || String.fromCharCode(...bytes.subarray(pos, pos + 8)) !== 'XTENSION')) {
      hdus[hdus.length - 1].notes.push(`ignored ${bytes.length - pos} bytes after this HDU that are not a FITS extension`);
      break;
    }
    const header = readHeader(bytes, pos, file);
    const hdu = locateHdu(bytes.length, header, hdus.length, file);
    hdus.push(hdu);
    const padded = Math.ceil(hdu.dataBytes / BLOCK) * BLOCK;
    if (hdu.dataStart + padded > bytes.length) {
      hdu.notes.push('last data block is not padded to 2880 bytes');
    }
    pos = hdu.dataStart + padded;
  }
  return hdus;
}
