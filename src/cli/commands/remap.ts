/**
 * `skyspan remap IN OUT`: writes the maps of IN to a new file at another
 * Nside (averaging for intensive quantities, summing for extensive ones,
 * blanks excluded), ordering or frame (interpolation on the four nearest
 * pixels), with the layout and element type chosen.
 */
import type { Command } from 'commander';
import { UsageError } from '../../core/errors.js';
import { assertNsideFits, estimateMapBytes } from '../../core/memory.js';
import { readMapFile, writeMapFile } from '../../io/mapFile.js';
import { reframe } from '../../maps/reframe.js';
import { reorder } from '../../maps/reorder.js';
import { resample } from '../../maps/resample.js';
import type { SkyMap } from '../../maps/skyMap.js';
import type { FrameName } from '../../sphere/frames.js';
import { isValidNside, MAX_NSIDE, type Ordering } from '../../sphere/nside.js';
import type { CliIo } from '../main.js';

interface Options {
  nside?: string; ordering?: string; frame?: string; inputFrame?: string; quantity: string;
  layout?: string; dtype?: string; force?: boolean; json?: boolean;
}

function choice<T extends string>(value: string | undefined, option: string, allowed: readonly T[]): T | undefined {
  if (value === undefined) return undefined;
  const v = value.toLowerCase() as T;
  if (!allowed.includes(v)) throw new UsageError(`${option} '${value}' is not one of ${allowed.join(', ')}`);
  return v;
}

/** Registers `skyspan remap`. */
export function register(program: Command, io: CliIo): void {
  program
    .command('remap')
    .description('write the maps of a HEALPix file at another Nside, ordering or frame')
    .argument('<in>', 'input map file (.fits or .fits.gz)')
    .argument('<out>', 'output map file (.fits, or .fits.gz to compress)')
    .option('--nside <n>', `output Nside (a power of two, 1..${MAX_NSIDE})`)
    .option('--ordering <scheme>', 'output ordering: ring or nested (default: as the input)')
    .option('--frame <frame>', 'output frame: galactic or equatorial (default: as the input)')
    .option('--input-frame <frame>', 'frame of the input when its file does not say (COORDSYS missing)')
    .option('--quantity <kind>', 'intensive (average when degrading) or extensive (sum)', 'intensive')
    .option('--layout <layout>', 'implicit (full sky) or explicit (only non-blank pixels)', 'implicit')
    .option('--dtype <type>', 'float32 or float64 (default: as the input)')
    .option('--force', 'replace OUT if it exists')
    .option('--json', 'print a JSON summary')
    .addHelpText('after', '\nExample:\n  skyspan remap examples/demo/demo-map.fits demo-eq-8.fits --nside 8 --frame equatorial --ordering nested\n')
    .action((inPath: string, outPath: string, opts: Options) => {
      const nside = opts.nside === undefined ? undefined : Number(opts.nside);
      if (nside !== undefined && !isValidNside(nside)) throw new UsageError(`--nside '${opts.nside}' is not a power of two from 1 to ${MAX_NSIDE}`);
      const ordering = choice(opts.ordering, '--ordering', ['ring', 'nested'] as const)?.toUpperCase() as Ordering | undefined;
      const frame = choice(opts.frame, '--frame', ['galactic', 'equatorial'] as const);
      const inputFrame = choice(opts.inputFrame, '--input-frame', ['galactic', 'equatorial'] as const);
      const quantity = choice(opts.quantity, '--quantity', ['intensive', 'extensive'] as const)!;
      const layout = choice(opts.layout, '--layout', ['implicit', 'explicit'] as const);
      const dtype = choice(opts.dtype, '--dtype', ['float32', 'float64'] as const);
      const { maps } = readMapFile(inPath, { frame: inputFrame as FrameName | undefined });
      if (nside !== undefined) {
        // The resampled planes (float64) and a reordered copy, beside the input's planes already held.
        const planes = maps.reduce((a, x) => a + x.planes.length, 0);
        assertNsideFits(estimateMapBytes(nside, planes, 8, 2), `remapping ${planes} plane${planes === 1 ? '' : 's'} of ${inPath}`, nside);
      }
      const out: SkyMap[] = maps.map((m0) => {
        let m = m0;
        if (frame && m.frame !== frame) {
          if (m.frame === 'unknown') throw new UsageError(`${inPath} does not say its frame (COORDSYS); give it with --input-frame galactic|equatorial`);
          m = reframe(reorder(m, 'RING'), frame);
        }
        if (nside !== undefined && nside !== m.nside) m = resample(reorder(m, 'RING'), nside, { quantity }).map;
        return reorder(m, ordering ?? m0.ordering);
      });
      writeMapFile(outPath, out, { force: opts.force, inputs: [inPath], layout, dtype });
      const m = out[0];
      const summary = { input: inPath, output: outPath, maps: out.map((x) => x.column), nside: m.nside, ordering: m.ordering, frame: m.frame,
        quantity, layout, planes: out.reduce((a, x) => a + x.planes.length, 0) };
      if (opts.json) io.out(JSON.stringify(summary, null, 2) + '\n');
      else io.out(`wrote ${outPath}: ${summary.maps.join(', ')} at Nside ${m.nside}, ${m.ordering}, frame ${m.frame}\n`);
    });
}
