/**
 * Unit strings as table files write them, turned into the syntax
 * physics/units.ts reads. FITS (Pence et al. 2010, A&A 524, A42, section
 * 4.3.2) and astropy's generic format write a power as digits right after the
 * unit ("cm-2", "cm2", "TeV-1") or with "**"; astropy's generic format also
 * writes "1 / (cm2 s sr TeV)". mathjs needs "^" for powers; products by
 * spaces and quotients with parentheses it reads as they are.
 */

/**
 * Rewrites "cm-2" as "cm^-2", "cm2" as "cm^2" and "**" as "^"; leaves numbers
 * (such as the "1" of "1 / (...)" or "1e-12") alone.
 * @example fileUnitToMathjs('cm-2 s-1 sr-1 TeV-1') // 'cm^-2 s^-1 sr^-1 TeV^-1'
 * @example fileUnitToMathjs('1 / (cm2 s sr TeV)') // '1 / (cm^2 s sr TeV)'
 */
export function fileUnitToMathjs(text: string): string {
  return text.replace(/\*\*/g, '^').replace(/(^|[^A-Za-z0-9_.^])([A-Za-z]+)([+-]?\d+)(?![\d.eE])/g, '$1$2^$3');
}
