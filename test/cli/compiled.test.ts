/**
 * The installed command as users run it: `node bin/skyspan.js`, which runs the
 * compiled dist/ (built here first when missing or stale), not the TypeScript
 * the other CLI tests call in-process. Exit codes 0/1/2 and one-line errors:
 * the project's CLI contract (common practice, no source); 130 = 128 + SIGINT
 * is the shell's convention (POSIX, from memory). Which packages a command
 * loads is seen through a module resolve hook (Node's module.register API).
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { COMMANDS } from '../../src/cli/commands/index.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { VERSION } from '../../src/version.js';
import { ensureBuilt, ROOT, runBin } from '../helpers/compiled.js';
import { tempDir } from '../helpers/tempDir.js';
import { testMap } from '../io/fitsMutate.js';

const dir = tempDir('skyspan-compiled-');
const HEAVY = ['mathjs', 'd3-geo', 'd3-geo-projection', 'd3-scale', 'd3-scale-chromatic', 'pngjs', 'zod', 'yaml', 'cli-progress'];
// Prints every file of the bundle (dist/bin/) and every package the program resolves, one line each, on stderr.
const HOOK = 'data:text/javascript,' + encodeURIComponent(`import { register } from 'node:module';
register('data:text/javascript,' + encodeURIComponent(\`export async function resolve(s, c, next) {
  const r = await next(s, c);
  const m = /node_modules\\\\/((?:@[^/]+\\\\/)?[^/]+)/.exec(r.url);
  if (m) process.stderr.write('package loaded: ' + m[1] + '\\\\n');
  const b = /\\\\/dist\\\\/bin\\\\/([^/]+\\\\.js)$/.exec(r.url);
  if (b) process.stderr.write('bundle file loaded: ' + b[1] + '\\\\n');
  return r;
}\`));`);
/**
 * The packages a run loaded: those resolved from node_modules, and those bundled
 * into the files of dist/bin/ it loaded (dist/bin/meta.json, written by the build).
 */
function loadedPackages(stderr: string): string[] {
  const meta = JSON.parse(readFileSync(join(ROOT, 'dist/bin/meta.json'), 'utf8')) as { outputs: Record<string, { packages: string[] }> };
  const files = [...stderr.matchAll(/^bundle file loaded: (\S+)$/gm)].map((m) => m[1]);
  const external = [...stderr.matchAll(/^package loaded: (\S+)$/gm)].map((m) => m[1]);
  return [...new Set([...external, ...files.flatMap((f) => meta.outputs[f]?.packages ?? [`unknown bundle file ${f}`])])].sort();
}
const bundleFiles = (stderr: string) => [...stderr.matchAll(/^bundle file loaded: (\S+)$/gm)].map((m) => m[1]);

beforeAll(() => ensureBuilt(), 180_000);

describe('the compiled command (node bin/skyspan.js)', () => {
  it('--version prints the version and loads no package', async () => {
    const r = await runBin(['--version'], { nodeArgs: ['--import', HOOK] });
    expect(r.code).toBe(0);
    expect(r.stdout).toBe(`${VERSION}\n`);
    expect(bundleFiles(r.stderr).length).toBeGreaterThan(0); // the hook sees the bundle
    expect(loadedPackages(r.stderr)).toEqual([]);
  });

  it('--help lists every command of the table and loads commander only', async () => {
    const r = await runBin(['--help'], { nodeArgs: ['--import', HOOK] });
    expect(r.code).toBe(0);
    for (const c of COMMANDS) expect(r.stdout).toMatch(new RegExp(`^  ${c.name}\\s`, 'm'));
    expect(loadedPackages(r.stderr)).toEqual(['commander']);
  });

  it('info on a map loads none of the heavy packages (run in one thread so the hook sees every import)', async () => {
    const map = join(dir, 'small.fits');
    writeMapFile(map, testMap(4, { frame: 'galactic' }));
    const r = await runBin(['info', map, '--json'], { nodeArgs: ['--import', HOOK], env: { SKYSPAN_SINGLE_THREAD: '1' } });
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).maps[0].nside).toBe(4);
    expect(loadedPackages(r.stderr)).toContain('commander'); // the hook sees this run's imports
    expect(loadedPackages(r.stderr).filter((p) => HEAVY.includes(p))).toEqual([]);
  });

  it('a failing command exits 1 with one line naming the file, no stack', async () => {
    const missing = join(dir, 'no-such-map.fits');
    const r = await runBin(['info', missing]);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.split('\n')).toEqual([expect.stringMatching(/^skyspan: .*no-such-map\.fits/), '']);
  });

  it('a mistyped command exits 2 and names the command it resembles', async () => {
    const r = await runBin(['infoo', 'x.fits']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain("unknown command 'infoo'");
    expect(r.stderr).toContain('info');
  });

  it('remap interrupted by SIGINT while writing: exit 130, no temporary file, stderr says what happened', async () => {
    const input = join(dir, 'big.fits');
    const NSIDE = 1024; // 12.6 M pixels, 100 MB as float64: the write takes long enough to be caught
    writeMapFile(input, testMap(NSIDE, { f64: true, frame: 'galactic' }));
    const outDir = tempDir('skyspan-compiled-int-');
    const out = join(outDir, 'nested.fits');
    const temporaries = () => readdirSync(outDir).filter((f) => f.endsWith('.tmp'));
    let sent = false;
    const r = await runBin(['remap', input, out, '--ordering', 'nested'], {
      onStart: (child) => {
        const poll = () => {
          if (child.exitCode !== null) return;
          if (temporaries().length > 0) { sent = true; child.kill('SIGINT'); return; }
          setTimeout(poll, 2);
        };
        poll();
      },
    });
    expect(sent).toBe(true);
    expect(r.code).toBe(130);
    expect(temporaries()).toEqual([]);
    expect(r.stderr).toMatch(/^skyspan: interrupted by SIGINT; /m);
    // Interrupted before the rename, nothing is at the output path; after it, the output is listed as complete.
    if (existsSync(out)) expect(r.stderr).toContain(`finished and complete: ${out}`);
    else expect(r.stderr).toContain('no output was finished');
    expect(r.stderr).not.toMatch(/^\s+at /m);
  }, 120_000);
});
