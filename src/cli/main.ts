/**
 * The command line: a thin commander layer. It parses, calls the library, and
 * prints; every command lives in its own file under commands/ and is listed
 * in the table of commands/index.ts, which imports only the module of the
 * command being run. `runCli(argv)` returns the exit code
 * (0 ok, 1 failure, 2 usage) and is what the tests call; `runAsProgram`
 * (program.ts) runs it as a program, in a worker thread.
 */
import { Command, CommanderError } from 'commander';
import { isSkyspanError } from '../core/errors.js';
import { resolve } from 'node:path';
import { isMainThread, parentPort, workerData, type MessagePort } from 'node:worker_threads';
import { finishedOutputs, onTemporaryFileEvent, pendingTemporaryFiles, removePendingTemporaryFiles } from '../io/atomicWrite.js';
import { findCommand, registerCommands } from './commands/index.js';
import { interruptMessage, runAsProgram, type WorkerMessage } from './program.js';
import { VERSION } from '../version.js';
import { commanderErrorLine } from './errorLine.js';
import { fileURLToPath } from 'node:url';

export { interruptMessage, runAsProgram };

/** Where the CLI writes; tests replace these to capture output. */
export interface CliIo {
  out: (text: string) => void;
  err: (text: string) => void;
}

const defaultIo: CliIo = {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
};

/**
 * Builds the commander program for an argument list: the command it names
 * is imported and registered, every other command is listed by name only.
 */
export async function buildProgram(io: CliIo, argv: readonly string[] = []): Promise<Command> {
  const program = new Command();
  program
    .name('skyspan')
    .description('Scale partial-sky gamma-ray measurements with HEALPix templates and compare them with neutrino data.')
    .version(VERSION, '-V, --version')
    .option('--debug', 'show stack traces of errors')
    .exitOverride()
    .configureOutput({ writeOut: io.out, writeErr: io.err, outputError: (text, write) => write(commanderErrorLine(text)) });
  await registerCommands(program, io, findCommand(argv));
  return program;
}

/**
 * Runs the CLI on argv (without node and script path) and returns the exit
 * code. Errors become one line on stderr; `--debug` adds the stack.
 */
export async function runCli(argv: string[], io: CliIo = defaultIo): Promise<number> {
  const debug = argv.includes('--debug');
  try {
    const program = await buildProgram(io, argv);
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

/**
 * Handles SIGINT/SIGTERM for a command running in this thread: deletes the
 * pending temporary files, says what was finished, exits 130/143. A signal
 * is seen only when the thread is idle, so `runAsProgram` runs commands
 * in a worker thread instead.
 */
export function installSignalHandlers(io: CliIo): void {
  for (const sig of ['SIGINT', 'SIGTERM'] as const) {
    process.on(sig, () => {
      const removed = pendingTemporaryFiles();
      removePendingTemporaryFiles();
      io.err(interruptMessage(sig, finishedOutputs(), removed));
      process.exit(sig === 'SIGINT' ? 130 : 143);
    });
  }
  process.stdout.on('error', (e: NodeJS.ErrnoException) => { if (e.code === 'EPIPE') process.exit(0); });
}

/** Worker-thread body: runs the command and reports output, temporary files and the exit code to the main thread. */
function runAsWorker(argv: string[]): void {
  const port = parentPort!;
  const send = (m: WorkerMessage) => port.postMessage(m);
  const temporaryPort = (workerData as { skyspanTemporaryPort?: MessagePort } | null)?.skyspanTemporaryPort;
  onTemporaryFileEvent((e) => (temporaryPort ?? port).postMessage(e));
  runCli(argv, { out: (text) => send({ kind: 'out', text }), err: (text) => send({ kind: 'err', text }) })
    .then((code) => send({ kind: 'exit', code }));
}

if (!isMainThread && (workerData as { skyspanCliArgv?: string[] } | null)?.skyspanCliArgv) {
  runAsWorker((workerData as { skyspanCliArgv: string[] }).skyspanCliArgv);
} else if (isMainThread && process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  runAsProgram(process.argv.slice(2));
}
