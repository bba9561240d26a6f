#!/usr/bin/env node
// Entry point of the installed command: runs the bundled JavaScript in dist/bin/
// (built by `npm ci` through the `prepare` script, or `npm run build`).
// runAsProgram runs the command in a worker thread so that SIGINT/SIGTERM are
// handled at once (temporary files removed, finished outputs listed).
let program;
try {
  program = await import('../dist/bin/program.js');
} catch (e) {
  if (e?.code !== 'ERR_MODULE_NOT_FOUND') throw e;
  process.stderr.write(`skyspan: the compiled program is missing (${e.message.split('\n')[0]}); run \`npm run build\` in the package folder\n`);
  process.exit(1);
}
program.runAsProgram(process.argv.slice(2));
