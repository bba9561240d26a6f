/**
 * The compiled command for tests: `ensureBuilt()` runs the build
 * (scripts/build.mjs: tsc, then the command bundle) when dist/ is missing or
 * older than a source file, and
 * `runBin(argv)` runs `node bin/skyspan.js` as a user would, with its exit
 * code, stdout and stderr.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

/** The package folder. */
export const ROOT = resolve(__dirname, '../..');
/** The installed entry point. */
export const BIN = join(ROOT, 'bin/skyspan.js');

function newestMtimeMs(dir: string): number {
  let t = 0;
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    const s = statSync(p);
    t = Math.max(t, s.isDirectory() ? newestMtimeMs(p) : s.mtimeMs);
  }
  return t;
}

/** Builds dist/ (tsc, then the command bundle in dist/bin/) unless it is newer than every file under src/ and the build's own files. */
export function ensureBuilt(): void {
  const stamp = join(ROOT, 'dist/bin/meta.json');
  const build = ['tsconfig.build.json', 'scripts/build.mjs', 'scripts/bundle-cli.mjs'];
  const sources = Math.max(newestMtimeMs(join(ROOT, 'src')), ...build.map((f) => statSync(join(ROOT, f)).mtimeMs));
  if (existsSync(stamp) && statSync(stamp).mtimeMs >= sources) return;
  execFileSync(process.execPath, [join(ROOT, 'scripts/build.mjs')], { cwd: ROOT, stdio: 'pipe' });
}

/** What a finished run of the command gave. */
export interface BinRun { code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }

/**
 * Runs `node [nodeArgs] bin/skyspan.js argv`; `onStart` gets the child (to
 * send it signals). Resolves when the process has exited.
 */
export function runBin(argv: string[], opts: { nodeArgs?: string[]; env?: NodeJS.ProcessEnv; onStart?: (c: ChildProcess) => void } = {}): Promise<BinRun> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [...(opts.nodeArgs ?? []), BIN, ...argv],
      { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, ...opts.env } });
    let stdout = '', stderr = '';
    child.stdout!.on('data', (d) => { stdout += d; });
    child.stderr!.on('data', (d) => { stderr += d; });
    child.on('error', fail);
    child.on('close', (code, signal) => done({ code, signal, stdout, stderr }));
    opts.onStart?.(child);
  });
}
