/**
 * `skyspan mask`: evaluates one region of a region file on a HEALPix grid and
 * writes it as a FITS map of covered fractions (plus the relative exposure
 * with --exposure), or prints a summary.
 */
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError, UsageError } from '../../core/errors.js';
import { assertNsideFits, estimateMapBytes } from '../../core/memory.js';
import { evaluateRegion } from '../../regions/evaluate.js';
import { writeRegionMask } from '../../regions/mask.js';
import { VERSION } from '../../version.js';
import type { CliIo } from '../main.js';
import { parseInteger, readRegionFile } from '../options.js';

interface Options {
  out?: string; nside: string; frame: string; centre?: boolean; depth?: string; exposure?: boolean; force?: boolean; json?: boolean;
}

function action(file: string, name: string, o: Options, io: CliIo): void {
  if (o.frame !== 'galactic' && o.frame !== 'equatorial') throw new UsageError(`--frame is '${o.frame}', expected galactic or equatorial`);
  const nside = parseInteger(o.nside, '--nside');
  const depth = o.depth === undefined ? undefined : parseInteger(o.depth, '--depth');
  const doc = readRegionFile(file);
  // Evaluation peak as for a factor job (Float32 fraction and exposure plus working arrays), then the written copy.
  assertNsideFits(estimateMapBytes(nside, 1, 16), `evaluating region '${name}'`, nside);
  const t0 = Date.now();
  const w = evaluateRegion(doc, name, { nside, frame: o.frame, mode: o.centre ? 'centre' : 'fraction', depth });
  const seconds = (Date.now() - t0) / 1000;
  if (o.exposure && !w.exposure) throw new InputError(`region ${name} has no weighted site, so there is no exposure to write`, { file, keyPath: `regions.${name}` });
  if (o.out) {
    writeRegionMask(o.out, w, {
      force: o.force, inputs: [resolve(file)], withExposure: o.exposure,
      header: { CREATOR: `skyspan ${VERSION}`, REGFILE: file.length <= 60 ? file : file.slice(-60) },
    });
  }
  const summary = {
    region: name, file, nside, frame: w.frame, mode: w.mode, solidAngleSr: w.solidAngleSr,
    skyFraction: w.solidAngleSr / (4 * Math.PI), pixelsTouched: countPositive(w.fraction), weighted: w.exposure !== null,
    output: o.out ?? null, seconds, notes: w.notes,
  };
  if (o.json) { io.out(JSON.stringify(summary, null, 2) + '\n'); return; }
  io.out(`region ${name}: ${w.solidAngleSr.toPrecision(7)} sr (${(100 * summary.skyFraction).toFixed(4)} % of the sky), `
    + `${summary.pixelsTouched} pixels at Nside ${nside} ${w.frame}, ${w.mode} mode${o.out ? `, written to ${o.out}` : ''}\n`);
  for (const n of w.notes) io.out(`  note: ${n}\n`);
}

function countPositive(a: Float32Array): number {
  let n = 0;
  for (let i = 0; i < a.length; i++) if (a[i] > 0) n++;
  return n;
}

/** Registers `skyspan mask`. */
export function register(program: Command, io: CliIo): void {
  program.command('mask')
    .description('evaluate a region of a region file on a HEALPix grid and write it as a FITS map of covered fractions')
    .argument('<regions>', 'region file (YAML or JSON)')
    .argument('<name>', 'name of the region to evaluate')
    .option('-o, --out <file>', 'FITS file to write (.fits or .fits.gz); without it only the summary is printed')
    .option('--nside <n>', 'HEALPix Nside of the mask', '256')
    .option('--frame <frame>', 'frame of the mask pixels: galactic or equatorial', 'galactic')
    .option('--centre', 'count a pixel when its centre is inside (default: covered fraction)')
    .option('--depth <k>', 'sub-division levels for covered fractions (default: by Nside, see docs/regions.md)')
    .option('--exposure', 'also write the relative exposure of the weighted site as a second column')
    .option('--force', 'replace an existing output file')
    .option('--json', 'print the summary as JSON')
    .addHelpText('after', '\nExample:\n  skyspan mask regions.yaml survey -o survey.fits --nside 256 --frame galactic\n')
    .action((file: string, name: string, o: Options) => action(file, name, o, io));
}
