/**
 * The list of commands: name, one-line summary (shown by `skyspan --help`)
 * and a loader. A command module exports `register(program, io)` and is
 * imported only when its command runs, so `--version`, `--help` and each
 * command load nothing they do not use. Add one line per command, nothing else;
 * the summary is the command's `.description()` (a test keeps them equal).
 */
import type { Command } from 'commander';
import type { CliIo } from '../main.js';

/** What a command module exports. */
export interface CommandModule {
  register: (program: Command, io: CliIo) => void;
}

/** One command of the table. */
export interface CommandEntry {
  /** The name typed on the command line. */
  name: string;
  /** The one-line description shown in `skyspan --help`. */
  summary: string;
  /** Imports the command's module. */
  load: () => Promise<CommandModule>;
}

/** Every command, in the order `--help` lists them. */
export const COMMANDS: readonly CommandEntry[] = [
  { name: 'info', summary: 'describe a FITS file: its HDUs and, for HEALPix maps, Nside, ordering, frame, columns and statistics', load: () => import('./info.js') },
  { name: 'remap', summary: 'write the maps of a HEALPix file at another Nside, ordering or frame', load: () => import('./remap.js') },
  { name: 'factors', summary: 'extrapolation factors of templates from a measured region to target regions, as tables with provenance', load: () => import('./factors.js') },
  { name: 'build', summary: 'build a HEALPix template (Galactic frame, RING) from a 3D model spec by line-of-sight integration', load: () => import('./build.js') },
  { name: 'mask', summary: 'evaluate a region of a region file on a HEALPix grid and write it as a FITS map of covered fractions', load: () => import('./mask.js') },
  { name: 'draw', summary: 'draw a HEALPix map file as a PNG picture (Mollweide or a zoomed window) with regions outlined', load: () => import('./draw.js') },
  { name: 'convert-spectrum', summary: 'convert hadronic gamma-ray points to a neutrino spectrum (or back) by the KAB 2006 functions or the K_pi rule', load: () => import('./convertSpectrum.js') },
  { name: 'compare', summary: 'predict the neutrino intensity from gamma-ray points and extrapolation factors, and weigh it against a neutrino measurement', load: () => import('./compare.js') },
  { name: 'expect-gamma', summary: 'from a neutrino measurement, the hadronic gamma-ray intensity a survey footprint should see (for planning)', load: () => import('./expectGamma.js') },
  { name: 'sources', summary: 'Monte Carlo source populations: N(>S), which sources a survey resolves, unresolved-source intensities', load: () => import('./sources.js') },
  { name: 'merge-factors', summary: 'combine the partial results of skyspan factors --shard K/N into the tables of a single run', load: () => import('./mergeFactors.js') },
  { name: 'run', summary: 'run a plan file: factors, conversion, comparison, pictures, tables, report and provenance in one folder', load: () => import('./run.js') },
  { name: 'cache', summary: 'show the cache of skyspan run (location, entries, size) and remove all entries or old ones', load: () => import('./cache.js') },
];

/**
 * The command an argument list runs: the first argument that is not an
 * option (the one after `help` for `help NAME`), if the table has it.
 * The program's own options (`--debug`, `--version`, `--help`) take no value.
 */
export function findCommand(argv: readonly string[]): CommandEntry | undefined {
  const words = argv.filter((a) => !a.startsWith('-'));
  const name = words[0] === 'help' ? words[1] : words[0];
  return COMMANDS.find((c) => c.name === name);
}

/**
 * Registers the command `wanted` (its module imported) and, for every other
 * command, a placeholder with its name and summary, so that the program's
 * help lists them all and a mistyped name gets a suggestion.
 */
export async function registerCommands(program: Command, io: CliIo, wanted?: CommandEntry): Promise<void> {
  const loaded = wanted ? await wanted.load() : undefined;
  for (const c of COMMANDS) {
    if (c === wanted) loaded!.register(program, io);
    else program.command(c.name).description(c.summary).allowUnknownOption().allowExcessArguments();
  }
}
