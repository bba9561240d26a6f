/**
 * `skyspan build`: builds a HEALPix template from a template spec file by
 * line-of-sight integration, optionally with pair absorption on the CMB.
 */
import type { Command } from 'commander';
import { SingleBar } from 'cli-progress';
import { InputError, UsageError } from '../../core/errors.js';
import { energyToGeV } from '../../physics/units.js';
import { readTemplateSpec } from '../../templates/readSpecFile.js';
import { buildTemplate } from '../../templates/buildTemplate.js';
import { writeTemplate } from '../../templates/writeTemplate.js';
import type { CliIo } from '../main.js';

interface Options {
  out: string; nside: string; energies?: string; absorption?: boolean; workers?: string;
  quiet?: boolean; force?: boolean; json?: boolean;
}

/** Parses "1e3,10TeV,1 PeV": numbers in GeV unless a unit follows. */
function parseEnergies(text: string): number[] {
  return text.split(',').map((tok) => {
    const m = /^\s*([0-9.eE+-]+)\s*([A-Za-z]*)\s*$/.exec(tok);
    const v = m ? Number(m[1]) : NaN;
    if (!m || !(v > 0) || !Number.isFinite(v)) throw new UsageError(`--energies: '${tok}' is not a positive energy (e.g. 1000 or 10TeV)`);
    return m[2] ? energyToGeV(v, m[2], { keyPath: '--energies' }) : v;
  });
}

/** Registers `skyspan build SPEC -o FILE [--nside] [--energies] [--absorption] [--workers] [--quiet] [--force] [--json]`. */
export function register(program: Command, io: CliIo): void {
  program
    .command('build')
    .description('build a HEALPix template (Galactic frame, RING) from a 3D model spec by line-of-sight integration')
    .argument('<spec>', 'template spec file (YAML)')
    .requiredOption('-o, --out <file>', 'output FITS file (.fits or .fits.gz)')
    .option('--nside <n>', 'HEALPix Nside of the template', '128')
    .option('--energies <list>', 'energy planes, comma-separated, GeV unless a unit is given (e.g. 10TeV,100TeV)')
    .option('--absorption', 'weight emission by its survival against pair production on the CMB; also writes <out>-survival')
    .option('--workers <n>', 'worker threads (default: 2 for large jobs)')
    .option('--quiet', 'no progress bar')
    .option('--force', 'replace existing outputs')
    .option('--json', 'print a JSON summary')
    .addHelpText('after', '\nExample:\n  skyspan build templates/hi-dl_h2-ns_lorimer_h4.yaml -o my.fits.gz --nside 64 --energies 100TeV,1PeV --absorption\n')
    .action(async (specPath: string, opts: Options) => {
      const nside = Number(opts.nside);
      if (!Number.isInteger(nside)) throw new UsageError(`--nside '${opts.nside}' is not an integer`);
      const workers = opts.workers === undefined ? undefined : Number(opts.workers);
      if (workers !== undefined && !(Number.isInteger(workers) && workers >= 0)) throw new UsageError(`--workers '${opts.workers}' is not a count`);
      const spec = readTemplateSpec(specPath);
      const energiesGeV = opts.energies ? parseEnergies(opts.energies) : undefined;
      const showBar = !opts.quiet && process.stderr.isTTY === true;
      const bar = showBar ? new SingleBar({ format: 'integrating {bar} {percentage}% | {value}/{total} pixels', stream: process.stderr }) : null;
      let started = false;
      const t0 = Date.now();
      try {
        const built = await buildTemplate(spec, {
          nside, energiesGeV, absorption: !!opts.absorption, workers,
          onProgress: bar ? (done, total) => { if (!started) { bar.start(total, 0); started = true; } bar.update(done); } : undefined,
        });
        bar?.stop();
        const files = writeTemplate(opts.out, built, { force: opts.force, inputs: [specPath] });
        const summary = { template: spec.name, nside, planes: built.map.planes.length, energiesGeV: energiesGeV ?? spec.energiesGeV ?? null,
          absorption: !!opts.absorption, unit: built.map.unit, files, seconds: (Date.now() - t0) / 1000 };
        if (opts.json) io.out(JSON.stringify(summary, null, 2) + '\n');
        else io.out(`wrote ${files.join(', ')} (${spec.name}, Nside ${nside}, ${summary.planes} plane${summary.planes > 1 ? 's' : ''}, ${built.map.unit})\n`);
      } catch (e) {
        // Problems found while tabulating the model carry a key path but not the file: add it.
        if (e instanceof InputError && e.location.file === undefined && e.location.keyPath !== undefined) {
          throw new InputError(e.message, { file: specPath });
        }
        throw e;
      } finally {
        if (started) bar?.stop();
      }
    });
}
