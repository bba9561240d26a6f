/**
 * The command a user types: `npx skyspan ...` from a subfolder of the project
 * runs the project's own bin (npm exec installs the root package as a link in
 * its cache, so no network is needed), and a relative path is taken from the
 * folder the user stands in. Runs through a separate, fresh npm cache.
 * Expected texts are skyspan's own output (common practice, no source).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const version = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version as string;
const env = { ...process.env, npm_config_cache: mkdtempSync(join(tmpdir(), 'skyspan-npx-')), npm_config_offline: 'true',
  npm_config_yes: 'true', npm_config_update_notifier: 'false' };
const npx = (cwd: string, args: string[]) => execFileSync('npx', ['skyspan', ...args], { cwd, env, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });

describe('npx skyspan inside the project', () => {
  it('prints the version from a subfolder', () => {
    expect(npx(join(root, 'test'), ['--version']).trim()).toBe(version);
  }, 300000);
  it('reads a file by a path relative to the folder the user stands in', () => {
    const out = npx(join(root, 'examples', 'demo'), ['info', 'demo-map.fits']);
    expect(out.startsWith('demo-map.fits: ')).toBe(true);
    expect(out).toMatch(/HEALPix map: Nside 16, RING, frame galactic/);
  }, 300000);
});
