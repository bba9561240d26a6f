#!/usr/bin/env node
// Entry point of the installed command: runs the TypeScript CLI through tsx's loader.
import { register } from 'tsx/esm/api';
register();
const { runCli, installSignalHandlers } = await import('../src/cli/main.ts');
installSignalHandlers({ out: (t) => process.stdout.write(t), err: (t) => process.stderr.write(t) });
process.exitCode = await runCli(process.argv.slice(2));
