/**
 * `skyspan cache [FOLDER]`: where the cache of `skyspan run` is, how many
 * entries it holds and their size; `--remove-all` or `--older-than AGE`
 * removes entries (plan/cacheFolder.ts). FOLDER is the cache folder, or an
 * output folder of a run (its provenance.json names the cache it used).
 */
import type { Command } from 'commander';
import { UsageError } from '../../core/errors.js';
import { formatBytes } from '../../core/memory.js';
import { parseAgeMs, removeCacheEntries, resolveCacheFolder, summariseCache, type CacheFolderSummary, type CacheRemoval } from '../../plan/cacheFolder.js';
import type { CliIo } from '../main.js';

interface Options { removeAll?: boolean; olderThan?: string; json?: boolean }

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function text(s: CacheFolderSummary, removed: CacheRemoval | null): string {
  const kinds = Object.entries(s.byKind).sort().map(([k, n]) => `${k} ${n}`).join(', ');
  const lines = [`cache folder: ${s.dir}${s.exists ? '' : ' (not created yet)'}`];
  if (removed) {
    lines.push(`removed ${plural(removed.entries, 'entry', 'entries')} (${formatBytes(removed.bytes)})`
      + (removed.temporaries ? ` and ${plural(removed.temporaries, 'leftover temporary file')}` : ''));
  }
  lines.push(`entries: ${s.entries}${kinds ? ` (${kinds})` : ''}, ${formatBytes(s.bytes)}`);
  if (s.oldestUsedUtc) lines.push(`last used: oldest ${s.oldestUsedUtc}, newest ${s.newestUsedUtc}`);
  if (s.temporaries.count) lines.push(`leftover temporary files of interrupted runs: ${s.temporaries.count} (${formatBytes(s.temporaries.bytes)}); --remove-all deletes them`);
  return lines.join('\n') + '\n';
}

function action(folder: string | undefined, o: Options, io: CliIo): void {
  if (o.removeAll && o.olderThan !== undefined) throw new UsageError('give --remove-all or --older-than, not both');
  const age = o.olderThan === undefined ? null : parseAgeMs(o.olderThan);
  if (o.olderThan !== undefined && age === null) throw new UsageError(`--older-than is '${o.olderThan}', expected a number and a unit s, m, h, d or w (e.g. 30d)`);
  const dir = resolveCacheFolder(folder ?? '.skyspan-cache');
  const removed = o.removeAll || age !== null ? removeCacheEntries(dir, age) : null;
  const s = summariseCache(dir);
  io.out(o.json ? JSON.stringify({ ...s, ...(removed ? { removed } : {}) }, null, 2) + '\n' : text(s, removed));
}

/** Registers `cache`. */
export function register(program: Command, io: CliIo): void {
  program.command('cache')
    .description('show the cache of skyspan run (location, entries, size) and remove all entries or old ones')
    .argument('[folder]', 'the cache folder, or an output folder of skyspan run (default: .skyspan-cache)')
    .option('--remove-all', 'remove every entry and leftover temporary file')
    .option('--older-than <age>', 'remove entries not used for longer than AGE: a number and s, m, h, d or w (e.g. 30d)')
    .option('--json', 'print the summary as JSON')
    .addHelpText('after', '\nExamples:\n  skyspan cache out/northern-plane\n  skyspan cache out/.skyspan-cache --older-than 30d\n'
      + 'Only files named like cache entries are counted or removed; anything else in the folder is left alone.\n')
    .action((folder: string | undefined, o: Options) => action(folder, o, io));
}
