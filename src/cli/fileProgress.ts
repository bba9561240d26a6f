/**
 * A progress bar for jobs over many files, on standard error when it is a
 * terminal (checked on file descriptor 2, so it also works from the worker
 * thread the CLI runs commands in): files done, rate and time left. Quiet
 * (null) otherwise.
 */
import { isatty, WriteStream } from 'node:tty';
import { SingleBar } from 'cli-progress';

/** A started bar: `tick(done, total)` after each file, `stop()` at the end. */
export interface FileProgress { tick(done: number, total: number): void; stop(): void }

/** A progress bar labelled `label` when standard error is a terminal, else null. */
export function fileProgress(label: string): FileProgress | null {
  if (!isatty(2)) return null;
  const stream = new WriteStream(2);
  const bar = new SingleBar({ format: `${label} {bar} {value}/{total} | {rate} files/min | {eta_formatted} left`, stream, clearOnComplete: true });
  const t0 = performance.now();
  let started = false;
  return {
    tick(done, total) {
      if (!started) { bar.start(total, 0, { rate: '-' }); started = true; }
      const minutes = (performance.now() - t0) / 60000;
      bar.update(done, { rate: minutes > 0 ? (done / minutes).toPrecision(3) : '-' });
    },
    stop() { if (started) bar.stop(); },
  };
}
