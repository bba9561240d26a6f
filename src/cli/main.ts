/**
 * The command line: a thin commander layer. It parses, calls the library, and
 * prints; every command lives in its own file under commands/ and registers
 * itself in commands/index.ts. `runCli(argv)` returns the exit code
 * (0 ok, 1 failure, 2 usage) and is what the tests call.
 */
import { Command, CommanderError } from 'commander';
import { isSkyspanError } from '../core/errors.js';
import { existsSync, unlinkSync } from 'node:fs';
import { resolve } from 'node:path';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { finishedOutputs, onTemporaryFileEvent, pendingTemporaryFiles, removePendingTemporaryFiles,
  type TemporaryFileEvent } from '../io/atomicWrite.js';
import { registerCommands } from './commands/index.js';
import { VERSION } from '../version.js';
import { commanderErrorLine } from './errorLine.js';
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
    .configureOutput({ writeOut: io.out, writeErr: io.err, outputError: (text, write) => write(commanderErrorLine(text)) });
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

/** The line printed on an interrupt: what was finished, what partial file was removed. */
export function interruptMessage(signal: string, finished: readonly string[], removed: readonly string[]): string {
  const done = finished.length ? `finished and complete: ${finished.join(', ')}` : 'no output was finished';
  const gone = removed.length ? `; removed the partial ${removed.length === 1 ? 'file' : 'files'} ${removed.join(', ')}` : '';
  return `skyspan: interrupted by ${signal}; ${done}${gone}; no partial output was left\n`;
}

/**
 * Handles SIGINT/SIGTERM for a command running in this thread: deletes the
 * pending temporary files, says what was finished, exits 130/143. A signal
 * is seen only when the thread is idle, so {@link runAsProgram} runs commands
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

type WorkerMessage = { kind: 'out' | 'err'; text: string } | { kind: 'exit'; code: number } | TemporaryFileEvent;

/** Worker-thread body: runs the command and reports output, temporary files and the exit code to the main thread. */
function runAsWorker(argv: string[]): void {
  const port = parentPort!;
  const send = (m: WorkerMessage) => port.postMessage(m);
  onTemporaryFileEvent(send);
  runCli(argv, { out: (text) => send({ kind: 'out', text }), err: (text) => send({ kind: 'err', text }) })
    .then((code) => send({ kind: 'exit', code }));
}

/**
 * Runs the CLI as a program. The command runs in a worker thread, so this
 * thread stays idle and handles SIGINT/SIGTERM at once even while the command
 * computes or writes synchronously: it deletes the temporary files in flight
 * (outputs are renamed into place only when complete), says which outputs
 * were finished and exits 130 (SIGINT) or 143 (SIGTERM).
 * SKYSPAN_SINGLE_THREAD=1 runs the command in this thread instead.
 */
export function runAsProgram(argv: string[]): void {
  if (process.env.SKYSPAN_SINGLE_THREAD === '1') {
    installSignalHandlers(defaultIo);
    runCli(argv).then((code) => { process.exitCode = code; });
    return;
  }
  const self = import.meta.url;
  // Under tsx the worker needs the TypeScript loader registered before it imports this module.
  const boot = self.endsWith('.ts')
    ? `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((m) => { m.register(); return import(${JSON.stringify(self)}); });`
    : `import(${JSON.stringify(self)});`;
  const worker = new Worker(boot, { eval: true, workerData: { skyspanCliArgv: argv } });
  const inFlight = new Map<string, string>();
  const finished: string[] = [];
  let code = 1;
  worker.on('message', (m: WorkerMessage) => {
    if ('text' in m) (m.kind === 'out' ? defaultIo.out : defaultIo.err)(m.text);
    else if (m.kind === 'exit') code = m.code;
    else if (m.kind === 'start') inFlight.set(m.temporary, m.output);
    else { inFlight.delete(m.temporary); if (m.kind === 'finish') finished.push(m.output); }
  });
  worker.on('error', (e) => {
    defaultIo.err(`skyspan: internal error: ${e.message} (run with SKYSPAN_SINGLE_THREAD=1 and --debug for the stack)\n`);
    code = 1;
  });
  worker.on('exit', () => { process.exitCode = code; });
  for (const sig of ['SIGINT', 'SIGTERM'] as const) {
    process.on(sig, () => {
      const removed: string[] = [];
      for (const [tmp, output] of inFlight) {
        try { unlinkSync(tmp); removed.push(tmp); } catch {
          if (existsSync(output)) finished.push(output); // renamed into place just before the signal
        }
      }
      defaultIo.err(interruptMessage(sig, finished, removed));
      process.exit(sig === 'SIGINT' ? 130 : 143);
    });
  }
  process.stdout.on('error', (e: NodeJS.ErrnoException) => { if (e.code === 'EPIPE') process.exit(0); });
}

if (!isMainThread && (workerData as { skyspanCliArgv?: string[] } | null)?.skyspanCliArgv) {
  runAsWorker((workerData as { skyspanCliArgv: string[] }).skyspanCliArgv);
} else if (isMainThread && process.argv[1] && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  runAsProgram(process.argv.slice(2));
}
