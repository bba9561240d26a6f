/**
 * Packages loaded at first use. A heavy package (mathjs: about 0.8 s and
 * 90 MB to load) that a module needs only on some paths is loaded the
 * first time that path runs, synchronously (through the package's CommonJS
 * build), so the module's functions stay synchronous and commands that never
 * take the path never pay for it. Common practice, no source.
 */
import { createRequire } from 'node:module';

const requireHere = createRequire(import.meta.url);

/**
 * Returns a function that loads package `name` on its first call and
 * returns the same module afterwards.
 * @example const mathjs = lazyRequire<typeof import('mathjs')>('mathjs'); mathjs().parse('R + z')
 */
export function lazyRequire<T>(name: string): () => T {
  let loaded: T | undefined;
  return () => (loaded ??= requireHere(name) as T);
}
