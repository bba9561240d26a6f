/**
 * `skyspan cache`: location, entry count by kind and size, removal of all
 * entries or of those not used for a given age, --json; only files named
 * like entries (and leftover temporaries) are touched. The expected counts
 * and sizes are those of files this test writes itself (common practice, no
 * source).
 */
import { mkdirSync, mkdtempSync, readdirSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { parseAgeMs } from '../../src/plan/cacheFolder.js';

const hex = (c: string) => c.repeat(64);

async function cli(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '', err = '';
  const code = await runCli(argv, { out: (t) => { out += t; }, err: (t) => { err += t; } });
  return { code, out, err };
}

/** A cache folder with entries of known sizes and ages (days before now), a leftover temporary and an unrelated file. */
function makeCache(): string {
  const dir = mkdtempSync(join(tmpdir(), 'skyspan-cachecmd-'));
  const now = Date.now() / 1000;
  const files: [string, number, number][] = [[`region-${hex('a')}.bin`, 1000, 1], [`region-${hex('b')}.bin`, 3000, 40],
    [`template-${hex('c')}.bin`, 5000, 10], [`survival-${hex('d')}.bin`, 7000, 100], [`.region-${hex('e')}.bin.123.abc.tmp`, 500, 2]];
  for (const [name, size, days] of files) {
    writeFileSync(join(dir, name), Buffer.alloc(size));
    utimesSync(join(dir, name), now - days * 86400, now - days * 86400);
  }
  writeFileSync(join(dir, 'README.txt'), 'not an entry');
  return dir;
}

describe('skyspan cache', () => {
  it('shows location, entries by kind, size and leftover temporaries', async () => {
    const dir = makeCache();
    const r = await cli(['cache', dir]);
    expect(r.code).toBe(0);
    expect(r.out).toContain(`cache folder: ${dir}\n`);
    expect(r.out).toContain('entries: 4 (region 2, survival 1, template 1), 16 KiB\n');
    expect(r.out).toContain('leftover temporary files of interrupted runs: 1 (1 KiB)');
    const j = JSON.parse((await cli(['cache', dir, '--json'])).out);
    expect(j).toMatchObject({ dir, exists: true, entries: 4, bytes: 16000, byKind: { region: 2, survival: 1, template: 1 }, temporaries: { count: 1, bytes: 500 } });
    expect(Date.parse(j.newestUsedUtc) - Date.parse(j.oldestUsedUtc)).toBe(99 * 86400e3);
  });

  it('removes entries not used for longer than an age, then all; other files stay', async () => {
    const dir = makeCache();
    const r = JSON.parse((await cli(['cache', dir, '--older-than', '30d', '--json'])).out);
    expect(r.removed).toEqual({ entries: 2, bytes: 10000, temporaries: 0 });
    expect(r.entries).toBe(2);
    expect(r.byKind).toEqual({ region: 1, template: 1 });
    const t = await cli(['cache', dir, '--remove-all']);
    expect(t.out).toContain('removed 2 entries (6 KiB) and 1 leftover temporary file\n');
    expect(t.out).toContain('entries: 0, 0 KiB\n');
    expect(readdirSync(dir)).toEqual(['README.txt']);
  });

  it('finds the cache of a run from its output folder', async () => {
    const cache = makeCache();
    const outDir = mkdtempSync(join(tmpdir(), 'skyspan-cachecmd-out-'));
    writeFileSync(join(outDir, 'provenance.json'), JSON.stringify({ tool: 'skyspan', cache, outputs: [] }));
    expect(JSON.parse((await cli(['cache', outDir, '--json'])).out)).toMatchObject({ dir: cache, entries: 4 });
  });

  it('a folder not created yet is an empty cache; bad options are usage errors; a file is refused in one line', async () => {
    const missing = join(mkdtempSync(join(tmpdir(), 'skyspan-cachecmd-')), 'none');
    expect(JSON.parse((await cli(['cache', missing, '--json'])).out)).toMatchObject({ exists: false, entries: 0, bytes: 0 });
    expect((await cli(['cache', missing])).out).toContain('(not created yet)');
    const bad = await cli(['cache', missing, '--older-than', '30 days']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--older-than is '30 days', expected a number and a unit s, m, h, d or w/);
    expect((await cli(['cache', missing, '--older-than', '1d', '--remove-all'])).code).toBe(2);
    const file = join(mkdtempSync(join(tmpdir(), 'skyspan-cachecmd-')), 'f');
    mkdirSync(join(file, '..'), { recursive: true });
    writeFileSync(file, 'x');
    const e = await cli(['cache', file]);
    expect(e.code).toBe(1);
    expect(e.err).toBe(`skyspan: ${file}: is not a folder (name the cache folder, as given to skyspan run --cache-dir)\n`);
  });

  it('parses ages in s, m, h, d and w', () => {
    expect(parseAgeMs('90s')).toBe(90e3);
    expect(parseAgeMs('45m')).toBe(45 * 60e3);
    expect(parseAgeMs('1.5h')).toBe(5400e3);
    expect(parseAgeMs('30d')).toBe(30 * 86400e3);
    expect(parseAgeMs('2w')).toBe(14 * 86400e3);
    expect(parseAgeMs('-1d')).toBeNull();
    expect(parseAgeMs('d')).toBeNull();
  });
});
