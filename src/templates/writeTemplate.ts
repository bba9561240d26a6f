/**
 * Writing a built template (and its survival map) as HEALPix FITS files.
 */
import { writeMapFile } from '../io/mapFile.js';
import type { BuiltTemplate } from './buildTemplate.js';

/** Path of the survival map beside a template path: name-survival.fits(.gz). */
export function survivalPathFor(path: string): string {
  const m = /^(.*?)(\.fits(\.gz)?)?$/i.exec(path)!;
  return `${m[1]}-survival${m[2] ?? '.fits'}`;
}

/**
 * Writes the template to `path` (float32 unless dtype says otherwise) with the
 * model spec, integration settings and units in the header, and with absorption
 * the emission-weighted survival probability to {@link survivalPathFor}(path).
 * Returns the paths written.
 */
export function writeTemplate(path: string, built: BuiltTemplate,
  opts: { force?: boolean; inputs?: string[]; dtype?: 'float32' | 'float64' } = {}): string[] {
  const header = {
    CONTENT: built.survival ? 'template, absorbed' : 'template',
    BUNIT: built.map.unit,
    FRAMEDEF: 'Galactic l, b; l = 0 toward the Galactic centre',
  };
  writeMapFile(path, built.map, { force: opts.force, inputs: opts.inputs, dtype: opts.dtype ?? 'float32', header });
  const written = [path];
  if (built.survival) {
    const sp = survivalPathFor(path);
    writeMapFile(sp, built.survival, { force: opts.force, inputs: opts.inputs, dtype: opts.dtype ?? 'float32',
      header: { CONTENT: 'emission-weighted mean survival probability', BUNIT: '1' } });
    written.push(sp);
  }
  return written;
}
