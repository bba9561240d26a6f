/** Content hashes of inputs, recorded in outputs so a result names exactly what it was computed from. */
import { createHash } from 'node:crypto';
import { closeSync, readSync } from 'node:fs';
import { openInput } from './inputFile.js';

/** SHA-256 of a file's bytes as 64 lower-case hex digits (FIPS 180-4), read in 1 MiB chunks. */
export function sha256File(path: string): string {
  const { fd } = openInput(path, 'map'); // a regular file within the map cap, or an InputError
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
