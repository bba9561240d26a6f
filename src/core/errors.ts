/**
 * Typed errors. Every failure a user can cause is an {@link InputError} (bad file,
 * bad key, bad value) or a {@link UsageError} (bad command line); the CLI prints
 * `error.message` as one line and exits with `error.exitCode`. Anything else is a
 * bug and is shown with its stack only under `--debug`.
 */

/** Where in an input the problem sits: a file, a key path, a row or a byte offset. */
export interface InputLocation {
  /** File path as the user gave it. */
  file?: string;
  /** Key path in a YAML/JSON document, e.g. `regions.plane.lonDeg[1]`. */
  keyPath?: string;
  /** 1-based row of a table (e.g. a FITS binary table). */
  row?: number;
  /** 1-based line in a text file (CSV), counting comment and blank lines. */
  line?: number;
  /** Byte offset in a binary file. */
  byteOffset?: number;
  /** Header keyword or column name in a FITS file. */
  keyword?: string;
}

/** Base class: carries the process exit code the CLI should use. */
export class SkyspanError extends Error {
  readonly exitCode: number;
  constructor(message: string, exitCode: number) {
    super(message);
    this.name = new.target.name;
    this.exitCode = exitCode;
  }
}

function formatLocation(loc: InputLocation): string {
  const parts: string[] = [];
  if (loc.file !== undefined) parts.push(loc.file);
  if (loc.keyPath !== undefined) parts.push(`key ${loc.keyPath}`);
  if (loc.row !== undefined) parts.push(`row ${loc.row}`);
  if (loc.line !== undefined) parts.push(`line ${loc.line}`);
  if (loc.keyword !== undefined) parts.push(`keyword ${loc.keyword}`);
  if (loc.byteOffset !== undefined) parts.push(`byte ${loc.byteOffset}`);
  return parts.join(', ');
}

/**
 * A problem with something the user supplied. The message reads
 * `<file>, key <path>: <problem>` plus an optional fix, all on one line.
 *
 * @example
 * new InputError('NSIDE is 100, expected a power of two from 1 to 8192',
 *   { file: 'map.fits', keyword: 'NSIDE' }).message
 * // 'map.fits, keyword NSIDE: NSIDE is 100, expected a power of two from 1 to 8192'
 */
export class InputError extends SkyspanError {
  readonly location: InputLocation;
  readonly problem: string;
  constructor(problem: string, location: InputLocation = {}, hint?: string) {
    const where = formatLocation(location);
    const text = (where ? `${where}: ` : '') + problem + (hint ? ` (${hint})` : '');
    super(text.replace(/\s*\n\s*/g, ' '), 1);
    this.location = location;
    this.problem = problem;
  }
}

/** A bad command line: unknown option, missing argument. Exit code 2. */
export class UsageError extends SkyspanError {
  constructor(message: string) {
    super(message, 2);
  }
}

/**
 * A computation whose result cannot be trusted (empty region, zero template,
 * mostly non-finite Monte Carlo, not enough memory). Exit code 1.
 */
export class ComputeError extends SkyspanError {
  constructor(message: string) {
    super(message, 1);
  }
}

/** True for errors whose message is meant for the user as one line. */
export function isSkyspanError(e: unknown): e is SkyspanError {
  return e instanceof SkyspanError;
}
