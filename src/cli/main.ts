/**
 * The command line: a thin commander layer. It parses, calls the library, and
 * prints; every command lives in its own file under commands/ and registers
 * itself in commands/index.ts. `runCli(argv)` returns the exit code
 * (0 ok, 1 failure, 2 usage) and is what the tests call.
 */
import { Command, CommanderError } from 'commander';
import { isSkyspanError } from '../core/errors.js';
import { removePendingTemporaryFiles } from '../io/atomicWrite.js';
import { registerCommands } from './commands/index.js';
import { VERSION } from '../version.js';
import { fileURLToPath } from 'node:url';

/** Where the CLI writes; tests replace these to capture output. */
export interface CliIo {
  out: (text: string) => void;
  err: (text: string) => void;
}

const defaultIo: CliIo = {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
};

/** Builds the commander program with every command registered. */
export function buildProgram(io: CliIo): Command {
  const program = new Command();
  program
    .name('skyspan')
    .description('Scale partial-sky gamma-ray measurements with HEALPix templates and compare them with neutrino data.')
    .version(VERSION, '-V, --version')
    .option('--debug', 'show stack traces of errors')
    .exitOverride()
    .configureOutput({ writeOut: io.out, writeErr: io.err })
    .showHelpAfterError('(run with --help for usage)');
  registerCommands(program, io);
  return program;
}

/**
 * Runs the CLI on argv (without node and script path) and returns the exit
 * code. Errors become one line on stderr; `--debug` adds the stack.
 */
export async function runCli(argv: string[], io: CliIo = defaultIo): Promise<number> {
  const debug = argv.includes('--debug');
  const program = buildProgram(io);
  try {
    await program.parseAsync(argv, { from: 'user' });
    return typeof process.exitCode === 'number' && process.exitCode !== 0 ? process.exitCode : 0;
  } catch (e) {
    if (e instanceof CommanderError) {
      if (e.code === 'commander.helpDisplayed' || e.code === 'commander.version' || e.code === 'commander.help') return 0;
      return e.exitCode === 0 ? 0 : 2;
    }
    if (isSkyspanError(e)) {
      io.err(`skyspan: ${e.message}\n`);
      if (debug && e.stack) io.err(e.stack + '\n');
      return e.exitCode;
    }
    const err = e as NodeJS.ErrnoException;
    if (err && err.code === 'EPIPE') return 0;
    io.err(`skyspan: internal error: ${err?.message ?? String(e)}${debug ? '' : ' (run with --debug for the stack)'}\n`);
    if (debug && err?.stack) io.err(err.stack + '\n');
    return 1;
  }
}

export function installSignalHandlers(io: CliIo): void {
  for (const sig of ['SIGINT', 'SIGTERM'] as const) {
    process.on(sig, () => {
      removePendingTemporaryFiles();
      io.err(`skyspan: interrupted by ${sig}; finished outputs are complete, no partial file was left\n`);
      process.exit(sig === 'SIGINT' ? 130 : 143);
    });
  }
  process.stdout.on('error', (e: NodeJS.ErrnoException) => { if (e.code === 'EPIPE') process.exit(0); });
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  installSignalHandlers(defaultIo);
  runCli(process.argv.slice(2)).then((code) => { process.exitCode = code; });
}
