/**
 * The one place where degrees become radians and back. Everything inside
 * skyspan works in radians; degrees exist only at the file, CLI and API edges.
 */

/** Radians, branded so that a degree value cannot be passed by mistake. */
export type Rad = number & { readonly __unit?: 'rad' };
/** Degrees, branded likewise. */
export type Deg = number & { readonly __unit?: 'deg' };

const DEG_PER_RAD = 180 / Math.PI;

/** Degrees to radians. */
export function degToRad(deg: Deg | number): Rad {
  return (deg / DEG_PER_RAD) as Rad;
}

/** Radians to degrees. */
export function radToDeg(rad: Rad | number): Deg {
  return (rad * DEG_PER_RAD) as Deg;
}

/** Arcminutes to radians. */
export function arcminToRad(arcmin: number): Rad {
  return degToRad(arcmin / 60);
}

/** Radians to arcminutes. */
export function radToArcmin(rad: number): number {
  return radToDeg(rad) * 60;
}

/** Radians to arcseconds. */
export function radToArcsec(rad: number): number {
  return radToDeg(rad) * 3600;
}

/** Colatitude theta (rad, 0 at the north pole) from latitude (rad). */
export function thetaFromLat(lat: number): Rad {
  return (Math.PI / 2 - lat) as Rad;
}

/** Latitude (rad) from colatitude theta (rad). */
export function latFromTheta(theta: number): Rad {
  return (Math.PI / 2 - theta) as Rad;
}
