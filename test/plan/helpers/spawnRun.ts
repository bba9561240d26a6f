/**
 * Runs the skyspan CLI as a real program (node with the tsx loader on
 * src/cli/main.ts, the command in its worker thread), optionally with the
 * test-only preload killHook.cjs, and collects its exit.
 */
import { spawn } from 'node:child_process';
import { resolve } from 'node:path';

const ROOT = resolve(__dirname, '../../..');

/** How a child run ended. */
export interface ChildRun { code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }

/** Starts `skyspan argv`; `kill` selects a stop point of killHook.cjs (none: runs to the end). */
export function spawnRun(argv: string[], kill?: { mode: 'cache-entry' | 'output-folder'; signal?: NodeJS.Signals }): Promise<ChildRun> {
  const pre = kill ? ['--require', resolve(__dirname, 'killHook.cjs')] : [];
  const env = { ...process.env, SKYSPAN_SINGLE_THREAD: '', SKYSPAN_TEST_KILL: kill?.mode ?? '', SKYSPAN_TEST_SIGNAL: kill?.signal ?? '' };
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [...pre, '--import', 'tsx', 'src/cli/main.ts', ...argv], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '', stderr = '';
    child.stdout.on('data', (d) => { stdout += d; });
    child.stderr.on('data', (d) => { stderr += d; });
    child.on('error', fail);
    child.on('close', (code, signal) => done({ code, signal, stdout, stderr }));
  });
}
