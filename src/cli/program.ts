/**
 * The command line as a program (what `bin/skyspan.js` runs). This module
 * loads only Node's own modules and the command table, so `--version` costs
 * no more than Node's start-up. A command named in the table runs in a worker
 * thread that imports `main` and that command's module once; this thread stays
 * idle and acts on SIGINT/SIGTERM at once. `--help`, `help` and unknown
 * commands run in this thread (nothing to interrupt, no worker to start).
 */
import { existsSync } from 'node:fs';
import { MessageChannel, receiveMessageOnPort, Worker } from 'node:worker_threads';
import { removeTemporary, type TemporaryFileEvent } from '../io/atomicWrite.js';
import { VERSION } from '../version.js';
import { findCommand } from './commands/index.js';

/** A message from the worker: output, the exit code, or a temporary-file event. */
export type WorkerMessage = { kind: 'out' | 'err'; text: string } | { kind: 'exit'; code: number } | TemporaryFileEvent;

const out = (t: string) => process.stdout.write(t);
const err = (t: string) => process.stderr.write(t);

/** The line printed on an interrupt: what was finished, what partial file was removed. */
export function interruptMessage(signal: string, finished: readonly string[], removed: readonly string[]): string {
  const done = finished.length ? `finished and complete: ${finished.join(', ')}` : 'no output was finished';
  const gone = removed.length ? `; removed the partial ${removed.length === 1 ? 'file' : 'files'} ${removed.join(', ')}` : '';
  return `skyspan: interrupted by ${signal}; ${done}${gone}; no partial output was left\n`;
}

/** The `main` module beside this one: compiled (.js) or, under tsx, TypeScript (.ts). */
function mainModuleUrl(): string {
  return new URL(import.meta.url.endsWith('.ts') ? './main.ts' : './main.js', import.meta.url).href;
}

/** Runs `runCli` in this thread (help, version with other options, unknown commands). */
async function runHere(argv: string[]): Promise<void> {
  const main = (await import(mainModuleUrl())) as typeof import('./main.js');
  main.installSignalHandlers({ out, err });
  process.exitCode = await main.runCli(argv);
}

/**
 * Runs the CLI as a program. A command runs in a worker thread, so this
 * thread handles SIGINT/SIGTERM at once even while the command computes or
 * writes synchronously: it deletes the temporary files in flight (outputs are
 * renamed into place only when complete), says which outputs were finished
 * and exits 130 (SIGINT) or 143 (SIGTERM). SKYSPAN_SINGLE_THREAD=1 runs the
 * command in this thread instead.
 */
export function runAsProgram(argv: string[]): void {
  if (argv.length === 1 && (argv[0] === '--version' || argv[0] === '-V')) { out(VERSION + '\n'); return; }
  const single = process.env.SKYSPAN_SINGLE_THREAD === '1';
  if (single || !findCommand(argv) || argv.includes('--help') || argv.includes('-h') || argv.includes('help')) {
    void runHere(argv);
    return;
  }
  process.stdout.on('error', (e: NodeJS.ErrnoException) => { if (e.code === 'EPIPE') process.exit(0); });
  const self = mainModuleUrl();
  // Under tsx the worker needs the TypeScript loader registered before it imports main.ts.
  const boot = self.endsWith('.ts')
    ? `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((m) => { m.register(); return import(${JSON.stringify(self)}); });`
    : `import(${JSON.stringify(self)});`;
  // Temporary-file events come on a port of their own, which the signal handler drains
  // synchronously (receiveMessageOnPort): a file the worker announced just before the
  // signal is known even when its message has not been dispatched yet.
  const events = new MessageChannel();
  const worker = new Worker(boot, { eval: true, workerData: { skyspanCliArgv: argv, skyspanTemporaryPort: events.port2 }, transferList: [events.port2] });
  const inFlight = new Map<string, string>();
  const finished: string[] = [];
  let code = 1;
  const onTemporary = (m: TemporaryFileEvent) => {
    if (m.kind === 'start') inFlight.set(m.temporary, m.output);
    else { inFlight.delete(m.temporary); if (m.kind === 'finish') finished.push(m.output); }
  };
  events.port1.on('message', onTemporary);
  events.port1.unref();
  worker.on('message', (m: WorkerMessage) => {
    if ('text' in m) (m.kind === 'out' ? out : err)(m.text);
    else if (m.kind === 'exit') code = m.code;
    else onTemporary(m);
  });
  worker.on('error', (e) => {
    err(`skyspan: internal error: ${e.message} (run with SKYSPAN_SINGLE_THREAD=1 and --debug for the stack)\n`);
    code = 1;
  });
  worker.on('exit', () => { process.exitCode = code; });
  for (const sig of ['SIGINT', 'SIGTERM'] as const) {
    process.on(sig, () => {
      for (let m = receiveMessageOnPort(events.port1); m; m = receiveMessageOnPort(events.port1)) onTemporary(m.message as TemporaryFileEvent);
      const removed: string[] = [];
      for (const [tmp, output] of inFlight) {
        try { removeTemporary(tmp, output); removed.push(tmp); } catch {
          if (existsSync(output)) finished.push(output); // renamed into place just before the signal
        }
      }
      err(interruptMessage(sig, finished, removed));
      process.exit(sig === 'SIGINT' ? 130 : 143);
    });
  }
}
