/**
 * Test-only preload (`node --require`), loaded in the main thread and in the
 * worker that runs the command. It wraps fs.openSync/writeSync to stop a
 * skyspan process at a chosen point of a write, so the tests can check what
 * is left behind. SKYSPAN_TEST_KILL selects the point:
 *   cache-entry    SIGKILL half-way through the array bytes of the second
 *                  cache entry written (its temporary file holds a preamble,
 *                  a header and half the data);
 *   output-folder  after the first file is written into the temporary output
 *                  folder, send SKYSPAN_TEST_SIGNAL (default SIGINT) to the
 *                  process and stall this thread so the main thread handles it.
 */
const fs = require('node:fs');
const { syncBuiltinESMExports } = require('node:module');

const mode = process.env.SKYSPAN_TEST_KILL;
const paths = new Map();
const open = fs.openSync, write = fs.writeSync;
const entryTemporaries = new Set();

fs.openSync = function (p, ...rest) {
  const fd = open.call(this, p, ...rest);
  paths.set(fd, String(p));
  return fd;
};
fs.writeSync = function (fd, buf, off, len, ...rest) {
  const p = paths.get(fd) ?? '';
  if (mode === 'cache-entry' && /\/\.[a-z]+-[0-9a-f]{64}\.bin\..+\.tmp$/.test(p)) {
    entryTemporaries.add(p);
    const n = typeof len === 'number' ? len : buf.length;
    if (entryTemporaries.size === 2 && n > 4096) {
      write.call(this, fd, buf, off ?? 0, n >> 1);
      process.kill(process.pid, 'SIGKILL');
    }
  }
  const result = write.call(this, fd, buf, off, len, ...rest);
  if (mode === 'output-folder' && /\/\.[^/]+\.tmp\/[^/]+$/.test(p)) {
    process.kill(process.pid, process.env.SKYSPAN_TEST_SIGNAL || 'SIGINT');
    Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 20000);
  }
  return result;
};
syncBuiltinESMExports();
