/**
 * Access to the Python reference (Debian's python3-healpy, python3-astropy,
 * python3-scipy). Under CI=true a missing reference is a failure, not a skip.
 */
import { execFileSync, spawnSync } from 'node:child_process';

/** Debian's interpreter; the python3 first on PATH may lack the packages. */
export const PYTHON = '/usr/bin/python3';

let cached: boolean | undefined;

/** True when /usr/bin/python3 imports healpy, astropy and scipy. */
export function pythonAvailable(): boolean {
  if (cached === undefined) {
    const r = spawnSync(PYTHON, ['-c', 'import healpy, astropy, scipy'], { stdio: 'ignore' });
    cached = r.status === 0;
  }
  return cached;
}

/**
 * True when a Python-gated test should be skipped, visibly: the reference is
 * missing and CI is not 'true'. Use as `it.skipIf(skipWithoutPython)(...)` and
 * call {@link requirePython} inside, which fails the test under CI=true.
 */
export const skipWithoutPython: boolean = !pythonAvailable() && process.env.CI !== 'true';

/**
 * Returns true when the reference can run. Outside CI a missing reference
 * returns false (the caller skips); under CI=true it throws, failing the test.
 */
export function requirePython(): boolean {
  if (pythonAvailable()) return true;
  if (process.env.CI === 'true') {
    throw new Error('the Python reference (/usr/bin/python3 with healpy, astropy, scipy) is missing under CI=true');
  }
  return false;
}

/** Runs a committed script in scripts/ with arguments and returns its stdout. */
export function runPython(script: string, args: string[] = [], input?: string): string {
  return execFileSync(PYTHON, [script, ...args], { encoding: 'utf8', input, maxBuffer: 1 << 28 });
}
