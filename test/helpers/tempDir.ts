/**
 * Temporary folders for tests that remove themselves: `tempDir(prefix)`
 * makes a folder under the system temporary folder, and the file's
 * `afterAll` removes every folder it made. (vitest evaluates this module once
 * per test file, so the hook belongs to the file that imports it.)
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll } from 'vitest';

const made: string[] = [];
afterAll(() => { for (const d of made.splice(0)) rmSync(d, { recursive: true, force: true }); });

/** A new empty folder `<tmp>/<prefix>XXXXXX`, removed after the test file's last test. */
export function tempDir(prefix: string): string {
  const d = mkdtempSync(join(tmpdir(), prefix));
  made.push(d);
  return d;
}
