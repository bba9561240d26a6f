/**
 * Write failures lose nothing: with an injected writer that fails part-way
 * (as a full disk would, ENOSPC), the earlier output stays byte for byte, no
 * partial file and no temporary file remain, and the error is one line
 * naming the file. Also the bookkeeping the interrupt handler relies on.
 * Expectations: the atomic-write contract (temporary file in the same folder,
 * rename when complete); common practice, no source.
 */
import { existsSync, readdirSync, readFileSync, writeFileSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors.js';
import {
  finishedOutputs, onTemporaryFileEvent, pendingTemporaryFiles, writeFileAtomic, type TemporaryFileEvent,
} from '../../src/io/atomicWrite.js';
import { writeMapFile } from '../../src/io/mapFile.js';
import { testMap } from '../io/fitsMutate.js';
import { tempDir } from '../helpers/tempDir.js';

const dir = tempDir('skyspan-atomic-');
const temporaries = () => readdirSync(dir).filter((f) => f.endsWith('.tmp'));

/** A writer that writes `okChunks` chunks, then half of the next and fails with `code`. */
function failingWriter(okChunks: number, code = 'ENOSPC') {
  let n = 0;
  return (fd: number, chunk: Uint8Array) => {
    if (n++ < okChunks) { writeSync(fd, chunk); return; }
    writeSync(fd, chunk, 0, chunk.length >> 1);
    throw Object.assign(new Error('no space left on device'), { code });
  };
}

afterEach(() => onTemporaryFileEvent(null));

describe('a writer failing mid-file', () => {
  const chunks = [new Uint8Array(1000).fill(1), new Uint8Array(1000).fill(2), new Uint8Array(1000).fill(3)];

  it('leaves the earlier output byte for byte, no temporary file, and one clear line', () => {
    const out = join(dir, 'table.csv');
    writeFileSync(out, 'earlier,result\n1,2\n');
    let err: unknown;
    try { writeFileAtomic(out, chunks, { force: true, writer: failingWriter(1) }); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(InputError);
    expect((err as Error).message).toBe(`${out}: writing failed: ENOSPC (free disk space or choose another folder; earlier outputs are intact)`);
    expect(readFileSync(out, 'utf8')).toBe('earlier,result\n1,2\n');
    expect(temporaries()).toEqual([]);
    expect(pendingTemporaryFiles()).toEqual([]);
  });

  it('a new output that fails is not created at all', () => {
    const out = join(dir, 'new.bin');
    expect(() => writeFileAtomic(out, chunks, { writer: failingWriter(2, 'EIO') })).toThrow(/new\.bin: writing failed: EIO/);
    expect(existsSync(out)).toBe(false);
    expect(temporaries()).toEqual([]);
  });

  it('a map written through writeMapFile keeps the earlier map when a later write fails', () => {
    const out = join(dir, 'map.fits');
    writeMapFile(out, testMap(4));
    const before = readFileSync(out);
    // The same path through writeFileAtomic with a failing writer, as writeMapFile would hit a full disk.
    expect(() => writeFileAtomic(out, [new Uint8Array(2880), new Uint8Array(2880)], { force: true, writer: failingWriter(1) })).toThrow(InputError);
    expect(readFileSync(out).equals(before)).toBe(true);
    expect(temporaries()).toEqual([]);
  });

  it('a folder that does not exist gives one line naming the reason', () => {
    expect(() => writeFileAtomic(join(dir, 'no', 'such', 'x.csv'), 'a')).toThrow(/x\.csv: cannot write here: ENOENT \(check that the folder exists and is writable\)/);
  });
});

describe('bookkeeping for the interrupt handler', () => {
  it('reports start then finish for a completed output, start then abandon for a failed one', () => {
    const events: TemporaryFileEvent[] = [];
    onTemporaryFileEvent((e) => events.push(e));
    const ok = join(dir, 'ok.txt'), bad = join(dir, 'bad.txt');
    writeFileAtomic(ok, 'done\n');
    expect(() => writeFileAtomic(bad, ['x', 'y'].map((t) => Buffer.from(t)), { writer: failingWriter(0) })).toThrow(InputError);
    expect(events.map((e) => [e.kind, e.output])).toEqual([['start', ok], ['finish', ok], ['start', bad], ['abandon', bad]]);
    // Temporary files sit in the output's folder and are named after it.
    expect(events[0].temporary.startsWith(join(dir, '.ok.txt.'))).toBe(true);
    expect(events[0].temporary.endsWith('.tmp')).toBe(true);
    expect(finishedOutputs()).toContain(ok);
    expect(finishedOutputs()).not.toContain(bad);
  });

  it('a temporary file is pending while the data is written, and gone after', () => {
    const out = join(dir, 'watched.txt');
    let seen: string[] = [];
    writeFileAtomic(out, 'abc', { writer: (fd, c) => { seen = pendingTemporaryFiles(); writeSync(fd, c); } });
    expect(seen).toHaveLength(1);
    expect(seen[0]).toMatch(/\.watched\.txt\.\d+\.[0-9a-z]+\.tmp$/);
    expect(existsSync(seen[0])).toBe(false);
    expect(pendingTemporaryFiles()).toEqual([]);
    expect(readFileSync(out, 'utf8')).toBe('abc');
  });
});
