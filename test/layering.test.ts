/**
 * The layering rule (LAYERS below, in order): a module under src/<layer>/ imports only
 * from its own layer and the layers before it. (Project rule, no outside source.)
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve, dirname } from 'node:path';
import { describe, expect, it } from 'vitest';

const LAYERS = ['core', 'sphere', 'maps', 'io', 'regions', 'physics', 'templates', 'scaling', 'compare', 'populations', 'render', 'plan', 'cli'];
const SRC = resolve(__dirname, '..', 'src');

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? walk(p) : p.endsWith('.ts') ? [p] : [];
  });
}

function layerOf(file: string): number {
  const top = relative(SRC, file).split('/')[0];
  return LAYERS.indexOf(top);
}

describe('layering', () => {
  const files = walk(SRC).filter((f) => layerOf(f) >= 0);
  it('finds the source tree', () => {
    expect(files.length).toBeGreaterThan(5);
  });
  it('no module imports from a later layer', () => {
    const violations: string[] = [];
    for (const file of files) {
      const text = readFileSync(file, 'utf8');
      for (const m of text.matchAll(/(?:from|import)\s*\(?\s*['"](\.[^'"]+)['"]/g)) {
        const target = resolve(dirname(file), m[1]);
        const rel = relative(SRC, target);
        if (rel.startsWith('..')) continue;
        const tl = LAYERS.indexOf(rel.split('/')[0]);
        if (tl > layerOf(file)) violations.push(`${relative(SRC, file)} imports ${rel}`);
      }
    }
    expect(violations).toEqual([]);
  });
});
