// Error messages are one line naming the place (project convention, common practice, no source).
import { describe, expect, it } from 'vitest';
import { InputError, UsageError, ComputeError } from '../../src/core/errors.js';

describe('InputError', () => {
  it('names file and keyword and the fix on one line', () => {
    const e = new InputError('NSIDE is 100, expected a power of two from 1 to 8192', { file: 'map.fits', keyword: 'NSIDE' }, 'regenerate the map');
    expect(e.message).toBe('map.fits, keyword NSIDE: NSIDE is 100, expected a power of two from 1 to 8192 (regenerate the map)');
    expect(e.exitCode).toBe(1);
  });
  it('folds newlines into one line', () => {
    expect(new InputError('a\nb', { keyPath: 'x.y' }).message).toBe('key x.y: a b');
  });
  it('maps usage to exit 2 and compute to 1', () => {
    expect(new UsageError('x').exitCode).toBe(2);
    expect(new ComputeError('x').exitCode).toBe(1);
  });
});
