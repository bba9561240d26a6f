/**
 * The ensemble of templates shipped in the top-level templates/ folder: one
 * spec file (name.yaml) and one map (name.fits.gz, Nside 128, RING, Galactic,
 * one plane, float32) per template. The factor command uses it when no
 * templates are named.
 */
import { existsSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join, resolve } from 'node:path';
import { InputError } from '../core/errors.js';
import { readSkyMap } from '../io/mapFile.js';
import type { SkyMap } from '../maps/skyMap.js';
import { buildTemplate, type BuiltTemplate } from './buildTemplate.js';
import { readTemplateSpec } from './readSpecFile.js';
import type { TemplateSpec } from './templateSpec.js';

/** Nside of the shipped templates. */
export const ENSEMBLE_NSIDE = 128;
/** Mantissa bits dropped (rounded) before writing: 15 bits kept, 1.5e-5 relative, below the quadrature error. */
export const ENSEMBLE_DROPPED_BITS = 8;

/** The templates/ folder of the package (from src/templates or dist/src/templates). */
export function shippedEnsembleDir(): string {
  const here = fileURLToPath(new URL('.', import.meta.url));
  for (const up of ['../..', '../../..']) {
    const d = resolve(here, up, 'templates');
    if (existsSync(join(d, 'build-ensemble.ts'))) return d;
  }
  throw new InputError('the shipped templates folder was not found', { file: resolve(here, '../../templates') });
}

/** Names of the shipped templates (spec files in the folder), sorted. */
export function shippedTemplateNames(dir = shippedEnsembleDir()): string[] {
  return readdirSync(dir).filter((f) => f.endsWith('.yaml')).map((f) => f.slice(0, -5)).sort();
}

/**
 * Rounds a float32 plane in place to (23 - dropped) mantissa bits, to nearest
 * (ties away from zero in magnitude), so that gzip compresses the files well.
 * Relative change at most 2^-(24 - dropped).
 */
export function roundMantissa(plane: Float32Array, dropped = ENSEMBLE_DROPPED_BITS): Float32Array {
  const bits = new Uint32Array(plane.buffer, plane.byteOffset, plane.length);
  const half = 1 << (dropped - 1), mask = ~((1 << dropped) - 1) >>> 0;
  for (let i = 0; i < bits.length; i++) {
    const b = bits[i];
    if ((b & 0x7f800000) === 0x7f800000) continue; // keep Inf and NaN
    bits[i] = ((b + half) & mask) >>> 0;
  }
  return plane;
}

/** Builds one shipped template exactly as the ensemble script does (Nside 128, one plane, rounded float32). */
export async function buildShippedTemplate(spec: TemplateSpec, opts: { nside?: number; workers?: number } = {}): Promise<BuiltTemplate> {
  const built = await buildTemplate(spec, { nside: opts.nside ?? ENSEMBLE_NSIDE, workers: opts.workers });
  const plane = roundMantissa(Float32Array.from(built.map.planes[0]));
  return { map: { ...built.map, planes: [plane] }, survival: null };
}

/** One shipped template: its name, map, checked spec and file. */
export interface ShippedTemplate {
  name: string;
  map: SkyMap;
  spec: TemplateSpec;
  file: string;
}

/** Reads every shipped template (spec and map). Throws InputError when a map is missing: run `npm run templates`. */
export function loadShippedEnsemble(dir = shippedEnsembleDir()): ShippedTemplate[] {
  return shippedTemplateNames(dir).map((name) => {
    const file = join(dir, `${name}.fits.gz`);
    if (!existsSync(file)) throw new InputError('shipped template map is missing', { file }, 'run `npm run templates`');
    const spec = readTemplateSpec(join(dir, `${name}.yaml`));
    return { name, map: readSkyMap(file, { frame: 'galactic' }), spec, file };
  });
}
