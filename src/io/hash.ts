/** Content hashes of inputs, recorded in outputs so a result names exactly what it was computed from. */
import { createHash } from 'node:crypto';
import { closeSync, openSync, readSync } from 'node:fs';
import { InputError } from '../core/errors.js';

/** SHA-256 of a file's bytes as 64 lower-case hex digits (FIPS 180-4), read in 1 MiB chunks. */
export function sha256File(path: string): string {
  let fd: number;
  try {
    fd = openSync(path, 'r');
  } catch (e) {
    throw new InputError(`cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})`, { file: path });
  }
  try {
    const hash = createHash('sha256');
    const buf = Buffer.allocUnsafe(1 << 20);
    for (;;) {
      const n = readSync(fd, buf, 0, buf.length, null);
      if (n === 0) break;
      hash.update(buf.subarray(0, n));
    }
    return hash.digest('hex');
  } finally {
    closeSync(fd);
  }
}
