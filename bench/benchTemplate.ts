/**
 * The analytic template the factor benchmarks read: an Nside-N float32 RING
 * map written once by scripts/make_bench_template.py (healpy) into bench/data/
 * (gitignored), shared by bench/factors.ts and bench/peakMemory.ts.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const HERE = dirname(fileURLToPath(import.meta.url));
const ROOT = resolve(HERE, '..');
const DATA = join(HERE, 'data');

/** Path of the benchmark template at an Nside (the file may not exist yet). */
export function benchTemplatePath(nside: number): string {
  return join(DATA, `factor-template-${nside}.fits`);
}

/** Writes the benchmark template with healpy unless it exists; returns its path. */
export function ensureBenchTemplate(nside: number): string {
  const path = benchTemplatePath(nside);
  if (!existsSync(path)) {
    mkdirSync(DATA, { recursive: true });
    console.log(`generating ${path} with healpy (one-off, ${(12 * nside * nside * 4 / 1e6).toFixed(0)} MB)...`);
    execFileSync('/usr/bin/python3', [join(ROOT, 'scripts/make_bench_template.py'), path, String(nside)], { stdio: 'inherit' });
  }
  return path;
}
