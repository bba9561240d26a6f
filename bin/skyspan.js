#!/usr/bin/env node
// Entry point of the installed command: runs the TypeScript CLI through tsx's loader.
// runAsProgram runs the command in a worker thread so that SIGINT/SIGTERM are
// handled at once (temporary files removed, finished outputs listed).
import { register } from 'tsx/esm/api';
register();
const { runAsProgram } = await import('../src/cli/main.ts');
runAsProgram(process.argv.slice(2));
