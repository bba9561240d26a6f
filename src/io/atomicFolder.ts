/**
 * A folder of outputs written as one: the files go into a temporary sibling
 * folder `.<name>.<pid>.<random>.tmp` beside the destination, and only when
 * every file is written and flushed is that folder renamed into place. Over
 * an existing folder the old one is first renamed aside to `.<...>.old`
 * and deleted after the swap, so the destination always holds one run's
 * complete output, never a mix. A sibling lies on the same file system, so
 * the renames never cross devices; a destination that is itself a mount
 * point cannot be swapped and is refused before anything is written. A
 * failure (or SIGINT/SIGTERM, through atomicWrite.ts's list of pending
 * temporaries) removes the temporary folder and leaves the old one as it was.
 * Node has no atomic exchange of two folders, so between the two renames
 * (microseconds) the destination is briefly absent; a kill there leaves the
 * previous output complete under its `.old` name.
 */
import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, fsyncSync, lstatSync, mkdirSync, openSync, readdirSync, realpathSync, renameSync, rmSync,
  statSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../core/errors.js';
import { checkWritable, trackTemporary, writeFileAtomic, type AtomicWriteOptions } from './atomicWrite.js';

/** One file of a folder. */
export interface FolderFile { name: string; data: string | Uint8Array }

/** Options of {@link writeFolderAtomic}. */
export interface FolderWriteOptions extends AtomicWriteOptions {
  /** Names an existing destination may hold and still be replaced as a whole with `force` (the outputs of the run that wrote it). */
  replaceable?: ReadonlySet<string>;
  /** Injectable so tests can simulate a failing disk. */
  writer?: (fd: number, chunk: Uint8Array) => void;
}

const defaultWriter = (fd: number, chunk: Uint8Array) => {
  let off = 0;
  while (off < chunk.length) off += writeSync(fd, chunk, off, chunk.length - off);
};

function flushFolder(dir: string): void {
  try { const fd = openSync(dir, 'r'); try { fsyncSync(fd); } finally { closeSync(fd); } } catch { /* not every file system flushes folders */ }
}

/** The folder a destination path stands for: a symbolic link is followed, so the real folder is the one replaced. */
function realTarget(outDir: string): string {
  const target = resolve(outDir);
  try { return lstatSync(target).isSymbolicLink() ? realpathSync(target) : target; } catch { return target; }
}

/**
 * Writes `files` into the folder `outDir` as a whole (see module comment) and
 * returns their paths. Every destination is checked first (an input is never
 * overwritten, an existing output only with `force`). An existing folder is
 * replaced as a whole only with `force` and only when every entry in it is a
 * file named in `replaceable` or in `files`; without `force`, new files are
 * added beside unrelated ones, each through writeFileAtomic.
 */
export function writeFolderAtomic(outDir: string, files: readonly FolderFile[], options: FolderWriteOptions = {}): string[] {
  const target = realTarget(outDir);
  const paths = files.map((f) => join(target, f.name));
  const exists = existsSync(target);
  if (exists && !statSync(target).isDirectory()) {
    throw new InputError('exists and is not a folder', { file: outDir }, 'choose a folder for the outputs');
  }
  for (const p of paths) checkWritable(p, options);
  const entries = exists ? readdirSync(target) : [];
  if (entries.length > 0 && !options.force) {
    for (const f of files) writeFileAtomic(join(target, f.name), f.data, options);
    return paths;
  }
  if (entries.length > 0) {
    const ours = new Set([...files.map((f) => f.name), ...(options.replaceable ?? [])]);
    const foreign = entries.find((e) => !ours.has(e) || !lstatSync(join(target, e)).isFile());
    if (foreign !== undefined) {
      throw new InputError(`holds '${foreign}', which is not an output of the run that wrote this folder`, { file: outDir },
        '--force replaces the whole folder: move it elsewhere, or choose an output folder of its own');
    }
  }
  const parent = dirname(target);
  if (exists && statSync(target).dev !== statSync(parent).dev) {
    throw new InputError('is a mount point, and a folder cannot be replaced as a whole across devices', { file: outDir },
      'choose a folder inside it');
  }
  const id = `${process.pid}.${randomBytes(4).toString('hex')}`;
  const stage = join(parent, `.${basename(target)}.${id}.tmp`), old = join(parent, `.${basename(target)}.${id}.old`);
  try {
    mkdirSync(stage, { recursive: true }); // with the parent, when missing
  } catch (e) {
    throw new InputError(`cannot create the output folder: ${(e as NodeJS.ErrnoException).code ?? String(e)}`, { file: outDir },
      'choose a folder you can write to');
  }
  trackTemporary('start', stage, target);
  try {
    const write = options.writer ?? defaultWriter;
    for (const f of files) {
      const fd = openSync(join(stage, f.name), 'wx');
      try {
        write(fd, typeof f.data === 'string' ? Buffer.from(f.data, 'utf8') : f.data);
        fsyncSync(fd);
      } finally { closeSync(fd); }
    }
    flushFolder(stage);
    if (exists) {
      renameSync(target, old);
      try { renameSync(stage, target); } catch (e) { renameSync(old, target); throw e; }
    } else {
      renameSync(stage, target);
    }
    flushFolder(parent);
  } catch (e) {
    try { rmSync(stage, { recursive: true, force: true }); } catch { /* left for the signal handler */ }
    trackTemporary('abandon', stage, target);
    const code = (e as NodeJS.ErrnoException).code ?? (e as Error).message;
    throw new InputError(`writing failed: ${code}`, { file: outDir },
      code === 'EXDEV' ? 'the folder and its parent lie on different devices: choose a folder inside it'
        : `free disk space or choose another folder; ${exists ? 'the previous outputs are intact' : 'nothing was written'}`);
  }
  if (exists) try { rmSync(old, { recursive: true, force: true }); } catch { /* a leftover hidden sibling, harmless */ }
  trackTemporary('finish', stage, target);
  return paths;
}
