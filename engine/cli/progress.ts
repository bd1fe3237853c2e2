/**
 * Progress of a batch on a terminal: files done / total, rate, time left and
 * failures so far. Drawn only on a terminal (never into a pipe or a log file),
 * and only on stderr, so reports on stdout stay clean.
 */
import { SingleBar } from 'cli-progress';

export interface BatchProgress {
  start(total: number): void;
  /** One more file settled; `failed`: it could not be checked (unreadable, stopped, crashed). */
  advance(failed: boolean): void;
  stop(): void;
}

interface TerminalStream extends NodeJS.WritableStream {
  isTTY?: boolean;
}

function formatRate(perSecond: number): string {
  if (!Number.isFinite(perSecond) || perSecond <= 0) return '-';
  return perSecond >= 10 ? perSecond.toFixed(0) : perSecond.toFixed(1);
}

/**
 * A progress bar on `stream` when it is a terminal, labelled with the command
 * name; null when the stream is not a terminal (nothing is ever written then).
 */
export function terminalProgress(label: string, stream: TerminalStream = process.stderr): BatchProgress | null {
  if (!stream.isTTY) return null;
  const bar = new SingleBar({
    stream,
    format: `${label} {bar} {value}/{total} files | {rate} files/s | ETA {eta_formatted} | {failed} failed`,
    barsize: 24,
    fps: 8,
    etaBuffer: 50,
    hideCursor: null,
    clearOnComplete: false,
  });
  let t0 = 0;
  let done = 0;
  let failed = 0;
  let active = false;
  const payload = (): { rate: string; failed: number } => {
    const seconds = (performance.now() - t0) / 1000;
    return { rate: formatRate(seconds > 0 ? done / seconds : 0), failed };
  };
  return {
    start(total: number): void {
      t0 = performance.now();
      done = 0;
      failed = 0;
      active = true;
      bar.start(total, 0, payload());
    },
    advance(isFailure: boolean): void {
      if (!active) return;
      done++;
      if (isFailure) failed++;
      bar.update(done, payload());
    },
    stop(): void {
      if (!active) return;
      active = false;
      bar.update(done, payload());
      bar.stop();
    },
  };
}
