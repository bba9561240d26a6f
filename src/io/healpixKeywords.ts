/**
 * The HEALPix FITS keywords (Gorski et al. 2005, ApJ 622, 759, and the
 * HEALPix FITS convention it describes): PIXTYPE, ORDERING, NSIDE, INDXSCHM,
 * OBJECT, FIRSTPIX/LASTPIX, COORDSYS and BAD_DATA, read with clear errors.
 */
import { InputError } from '../core/errors.js';
import type { FrameName } from '../sphere/frames.js';
import { MAX_NSIDE, type Ordering } from '../sphere/nside.js';
import type { FitsHeader } from './fits/header.js';
import type { Hdu } from './fits/hdu.js';

/** True when a BINTABLE HDU declares itself a HEALPix map (PIXTYPE = 'HEALPIX', or NSIDE with ORDERING). */
export function isHealpixHdu(hdu: Hdu): boolean {
  if (hdu.kind !== 'bintable') return false;
  const h = hdu.header;
  const pixtype = h.get('PIXTYPE');
  if (typeof pixtype === 'string' && pixtype.trim().toUpperCase() === 'HEALPIX') return true;
  return h.has('NSIDE') && h.has('ORDERING');
}

/** ORDERING: RING or NESTED (NEST accepted); anything else is an InputError. */
export function readOrdering(h: FitsHeader): Ordering {
  const raw = h.get('ORDERING');
  if (raw === undefined || raw === null) {
    throw new InputError('ORDERING is missing, so the pixel order is unknown', { file: h.file, keyword: 'ORDERING', byteOffset: h.start },
      "add ORDERING = 'RING' or 'NESTED' to the map's header");
  }
  const v = String(raw).trim().toUpperCase();
  if (v === 'RING') return 'RING';
  if (v === 'NESTED' || v === 'NEST') return 'NESTED';
  throw new InputError(`ORDERING is "${String(raw)}", expected RING or NESTED`, { file: h.file, keyword: 'ORDERING', byteOffset: h.offsetOf('ORDERING') });
}

/** NSIDE when present (must be a power of two from 1 to 8192), else null. */
export function readNside(h: FitsHeader): number | null {
  const v = h.get('NSIDE');
  if (v === undefined || v === null) return null;
  if (typeof v !== 'number' || !Number.isInteger(v) || !(v >= 1 && v <= MAX_NSIDE) || (v & (v - 1)) !== 0) {
    throw new InputError(`NSIDE is ${JSON.stringify(v)}, expected a power of two from 1 to ${MAX_NSIDE}`,
      { file: h.file, keyword: 'NSIDE', byteOffset: h.offsetOf('NSIDE') });
  }
  return v;
}

/**
 * COORDSYS: G or GALACTIC -> galactic; C, Q, CELESTIAL, EQUATORIAL -> equatorial;
 * E or ECLIPTIC is refused (skyspan has no ecliptic frame); missing or other -> unknown.
 */
export function readFrame(h: FitsHeader): { frame: FrameName; coordsys: string | null } {
  const raw = h.get('COORDSYS');
  if (typeof raw !== 'string') return { frame: 'unknown', coordsys: null };
  const v = raw.trim().toUpperCase();
  if (v === 'G' || v === 'GALACTIC') return { frame: 'galactic', coordsys: raw };
  if (v === 'C' || v === 'Q' || v === 'CELESTIAL' || v === 'EQUATORIAL' || v === 'ICRS') return { frame: 'equatorial', coordsys: raw };
  if (v === 'E' || v === 'ECLIPTIC') {
    throw new InputError('the map is in ecliptic coordinates (COORDSYS = E), which skyspan does not handle',
      { file: h.file, keyword: 'COORDSYS', byteOffset: h.offsetOf('COORDSYS') },
      'rotate it to Galactic or equatorial coordinates first');
  }
  return { frame: 'unknown', coordsys: raw };
}

/** INDXSCHM (or OBJECT = 'PARTIAL' with a PIXEL column): how pixels are indexed. */
export function readScheme(h: FitsHeader, hasPixelColumn: boolean): 'IMPLICIT' | 'EXPLICIT' {
  const raw = h.get('INDXSCHM');
  if (typeof raw === 'string') {
    const v = raw.trim().toUpperCase();
    if (v === 'EXPLICIT') return 'EXPLICIT';
    if (v === 'IMPLICIT') return 'IMPLICIT';
    throw new InputError(`INDXSCHM is "${raw}", expected IMPLICIT or EXPLICIT`, { file: h.file, keyword: 'INDXSCHM', byteOffset: h.offsetOf('INDXSCHM') });
  }
  const obj = h.get('OBJECT');
  if (hasPixelColumn && typeof obj === 'string' && obj.trim().toUpperCase() === 'PARTIAL') return 'EXPLICIT';
  return hasPixelColumn ? 'EXPLICIT' : 'IMPLICIT';
}

const ENERGY_UNITS: Record<string, number> = { EV: 1e-9, KEV: 1e-6, MEV: 1e-3, GEV: 1, TEV: 1e3, PEV: 1e6 };

/** Factor converting an energy unit (eV .. PeV, case-insensitive) to GeV, or NaN when unknown. */
export function energyUnitToGeV(unit: string): number {
  return ENERGY_UNITS[unit.trim().toUpperCase()] ?? NaN;
}
