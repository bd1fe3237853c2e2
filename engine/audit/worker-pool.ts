/**
 * A worker-thread pool (piscina) that runs one task per input, in bounded
 * batches, with a per-task time budget.
 *
 * - At most `threads` tasks are in flight, one per worker, so a batch of any
 *   size never sits in a queue all at once and each task starts as soon as
 *   it is handed over.
 * - The time budget counts from the moment a worker starts the task (the
 *   worker raises a flag in shared memory), not from when it was queued, so
 *   a worker's start-up time is never charged to a file. A task over budget
 *   is aborted: piscina terminates its worker and starts a fresh one, and the
 *   batch goes on.
 * - A task that throws, or whose worker dies, settles as `failed`; the others
 *   are not affected.
 *
 * The worker side calls `markTaskStarted(slot)` first thing in its handler.
 */
import { existsSync } from 'node:fs';
import { workerData as threadData } from 'node:worker_threads';
import { Piscina } from 'piscina';

/** What the pool sends to a worker: the caller's input and the slot whose start flag to raise. */
export interface PoolTask<T> {
  slot: number;
  input: T;
}

/** Data every worker receives once (piscina `workerData`). */
export interface PoolWorkerData<D> {
  /** One Int32 flag per slot: 1 once the worker has started the slot's current task. */
  started: SharedArrayBuffer;
  shared: D;
}

export type TaskOutcome<R> =
  | { kind: 'done'; value: R }
  | { kind: 'stopped'; afterMs: number }
  | { kind: 'failed'; message: string };

export interface PoolOptions<D> {
  /** Compiled JavaScript file whose default export handles one `PoolTask`. */
  filename: string;
  threads: number;
  /** Per-task budget of running time, milliseconds. */
  timeoutMs: number;
  /** Sent to every worker once. Must be structured-cloneable. */
  shared: D;
  /** Heap limit of each worker; a task that needs more fails instead of taking the process down. */
  maxHeapMb?: number;
  /** How often the budget is checked, milliseconds (default 50). */
  tickMs?: number;
}

/**
 * Runs `handle(inputs[i])` on the pool for every input. `onSettled` is called
 * once per input, in completion order, with the input's index. Resolves when
 * every input has settled; never rejects because of a task (an exception
 * thrown by `onSettled` is re-thrown once the pool is shut down).
 */
export async function runOnPool<T, R, D>(
  inputs: readonly T[],
  options: PoolOptions<D>,
  onSettled: (index: number, outcome: TaskOutcome<R>) => void,
): Promise<void> {
  if (inputs.length === 0) return;
  if (!existsSync(options.filename)) throw new Error(`worker file not found: ${options.filename}`);
  const threads = Math.max(1, Math.min(options.threads, inputs.length));
  const started = new SharedArrayBuffer(4 * threads);
  const flags = new Int32Array(started);
  const data: PoolWorkerData<D> = { started, shared: options.shared };
  const pool = new Piscina({
    filename: options.filename,
    minThreads: threads,
    maxThreads: threads,
    concurrentTasksPerWorker: 1,
    idleTimeout: 60_000,
    workerData: data,
    ...(options.maxHeapMb ? { resourceLimits: { maxOldGenerationSizeMb: options.maxHeapMb } } : {}),
  });
  // Worker errors outside a task (rare) must not crash the process; tasks see their own errors.
  pool.on('error', () => undefined);

  interface Running {
    index: number;
    controller: AbortController;
    startedAt: number | null;
  }
  const running: (Running | null)[] = new Array<Running | null>(threads).fill(null);
  let next = 0;
  let settled = 0;
  let callbackError: unknown = null;

  await new Promise<void>((resolveAll) => {
    const timer = setInterval(() => {
      const now = performance.now();
      for (let slot = 0; slot < threads; slot++) {
        const r = running[slot];
        if (!r) continue;
        if (r.startedAt === null) {
          if (Atomics.load(flags, slot) === 1) r.startedAt = now;
        } else if (now - r.startedAt > options.timeoutMs) {
          r.controller.abort();
        }
      }
    }, options.tickMs ?? 50);

    const launch = (slot: number): void => {
      if (next >= inputs.length) return;
      const index = next++;
      const controller = new AbortController();
      const r: Running = { index, controller, startedAt: null };
      running[slot] = r;
      Atomics.store(flags, slot, 0);
      const task: PoolTask<T> = { slot, input: inputs[index]! };
      pool.run(task, { signal: controller.signal }).then(
        (value: R) => finish(slot, r, { kind: 'done', value }),
        (err: unknown) =>
          finish(
            slot,
            r,
            controller.signal.aborted
              ? { kind: 'stopped', afterMs: options.timeoutMs }
              : { kind: 'failed', message: err instanceof Error ? err.message : String(err) },
          ),
      );
    };

    const finish = (slot: number, r: Running, outcome: TaskOutcome<R>): void => {
      if (running[slot] !== r) return;
      running[slot] = null;
      settled++;
      try {
        onSettled(r.index, outcome);
      } catch (err) {
        callbackError ??= err;
      }
      if (settled === inputs.length) {
        clearInterval(timer);
        resolveAll();
      } else launch(slot);
    };

    for (let slot = 0; slot < threads; slot++) launch(slot);
  });
  await pool.destroy();
  if (callbackError !== null) throw callbackError;
}

/** Worker side: raises the start flag of `slot`, so the budget starts counting now. */
export function markTaskStarted(slot: number): void {
  const data = threadData as PoolWorkerData<unknown> | null;
  if (!data || !(data.started instanceof SharedArrayBuffer)) return;
  Atomics.store(new Int32Array(data.started), slot, 1);
}

/** Worker side: the `shared` value given to `runOnPool`. */
export function poolSharedData<D>(): D {
  const data = threadData as PoolWorkerData<D> | null;
  if (!data) throw new Error('not running in a pool worker');
  return data.shared;
}
