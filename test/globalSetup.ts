/**
 * Runs once around `npm test`: points TMPDIR at a fresh folder for the whole
 * run (test workers, child processes, the Python references and the browser
 * inherit it) and removes that folder at the end, so a run leaves nothing in
 * the system temporary folder even when a test forgets to clean up.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export default function setup(): () => void {
  const outer = process.env.TMPDIR;
  const dir = mkdtempSync(join(tmpdir(), 'skyspan-test-run-'));
  process.env.TMPDIR = dir;
  return () => {
    rmSync(dir, { recursive: true, force: true });
    if (outer === undefined) delete process.env.TMPDIR; else process.env.TMPDIR = outer;
  };
}
