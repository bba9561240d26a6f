/**
 * An interrupted run loses nothing: the CLI is started as a real program
 * (node with the tsx loader on src/cli/main.ts), given a job that writes a
 * large map, and sent SIGINT or SIGTERM; afterwards no temporary file and no
 * partial output may remain, and stderr says what was finished.
 * Expectations: the atomic-write contract (temporary file + rename), common
 * practice, no source; exit codes 128 + signal number are the shell's
 * convention (POSIX, from memory).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readlinkSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { interruptMessage } from '../../src/cli/main.js';
import { readSkyMap, writeMapFile } from '../../src/io/mapFile.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const ROOT = resolve(__dirname, '../..');
const dir = tempDir('skyspan-interrupt-');
const NSIDE = 1024; // 12.6 M pixels, 100 MB as float64: the write takes long enough to be caught
const input = join(dir, 'big.fits');
writeMapFile(input, testMap(NSIDE, { f64: true, frame: 'galactic' }));

interface Run { code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string; sawTemporary: boolean }

/** Starts `skyspan argv`, sends `sig` once `trigger()` is true (polled every 2 ms), waits for the exit. */
function runAndInterrupt(argv: string[], sig: NodeJS.Signals, trigger: (pid: number) => boolean): Promise<Run> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...argv], { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '', stderr = '', sent = false, exited = false;
    child.stdout.on('data', (d) => { stdout += d; });
    child.stderr.on('data', (d) => { stderr += d; });
    const poll = () => {
      if (exited || sent) return;
      if (trigger(child.pid!)) { sent = true; child.kill(sig); return; }
      setTimeout(poll, 2);
    };
    poll();
    child.on('error', fail);
    child.on('close', (code, signal) => { exited = true; done({ code, signal, stdout, stderr, sawTemporary: sent }); });
  });
}

/** True when process `pid` has `file` open (reads the links in /proc/<pid>/fd). */
function holdsOpen(pid: number, file: string): boolean {
  try {
    return readdirSync(`/proc/${pid}/fd`).some((fd) => { try { return readlinkSync(`/proc/${pid}/fd/${fd}`) === file; } catch { return false; } });
  } catch { return false; }
}

const temporaries = (folder: string) => readdirSync(folder).filter((f) => f.endsWith('.tmp'));

describe('an interrupted run (child process)', () => {
  it('SIGINT while the output is being written: no partial output, no temporary file, stderr says so', async () => {
    const outDir = mkdtempSync(join(dir, 'int-'));
    const out = join(outDir, 'nested.fits');
    const r = await runAndInterrupt(['remap', input, out, '--ordering', 'nested'], 'SIGINT', () => temporaries(outDir).length > 0);
    expect(r.sawTemporary).toBe(true); // the signal was sent while `.nested.fits.*.tmp` existed
    expect(temporaries(outDir)).toEqual([]);
    expect(r.stderr).toMatch(/^skyspan: interrupted by SIGINT; /m);
    if (r.code === 130) {
      // Interrupted before the rename: nothing at the output path.
      expect(existsSync(out)).toBe(false);
      expect(r.stderr).toContain('no output was finished');
      expect(r.stderr).toMatch(/removed the partial file .*\.nested\.fits\..*\.tmp/);
    } else {
      // The rename won the race: the output must then be complete.
      expect(r.stderr).toContain(`finished and complete: ${out}`);
      const m = readSkyMap(out);
      expect(m.planes[0].length).toBe(12 * NSIDE * NSIDE);
    }
    expect(r.stderr).not.toMatch(/^\s+at /m);
  }, 90_000);

  it('SIGTERM before anything is written: exit 143, nothing written, stderr says no output was finished', async () => {
    const outDir = mkdtempSync(join(dir, 'term-'));
    const out = join(outDir, 'coarse.fits.gz');
    // Sent once the child holds the (100 MB) input open (Linux /proc): by then the CLI and its handlers are loaded.
    const r = await runAndInterrupt(['remap', input, out, '--nside', '256'], 'SIGTERM', (pid) => holdsOpen(pid, input));
    expect(r.code).toBe(143);
    expect(existsSync(out)).toBe(false);
    expect(temporaries(outDir)).toEqual([]);
    expect(r.stderr).toContain('skyspan: interrupted by SIGTERM; no output was finished');
  }, 90_000);

  it('a finished run through the same entry point exits 0 and leaves only its output', async () => {
    const outDir = mkdtempSync(join(dir, 'ok-'));
    const small = join(outDir, 'small.fits');
    writeMapFile(small, testMap(4, { frame: 'galactic' }));
    const out = join(outDir, 'small-2.fits');
    const r = await runAndInterrupt(['remap', small, out, '--nside', '2', '--json'], 'SIGINT', () => false);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ nside: 2 });
    expect(statSync(out).size % 2880).toBe(0);
    expect(temporaries(outDir)).toEqual([]);
  }, 90_000);
});

describe('interruptMessage', () => {
  it('lists the finished outputs and the removed partial file on one line', () => {
    const m = interruptMessage('SIGINT', ['a.csv', 'a.md'], ['.a.json.1.x.tmp']);
    expect(m).toBe('skyspan: interrupted by SIGINT; finished and complete: a.csv, a.md; removed the partial file .a.json.1.x.tmp; no partial output was left\n');
    expect(interruptMessage('SIGTERM', [], [])).toBe('skyspan: interrupted by SIGTERM; no output was finished; no partial output was left\n');
  });
});
