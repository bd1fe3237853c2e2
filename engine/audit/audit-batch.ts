/**
 * Many files → their reports, in input order, with bounded memory: only the
 * small FileReports come back to this thread; documents and scenes live and
 * die inside the worker that read them.
 *
 * `jobs` > 1 runs files on a worker-thread pool (`worker-pool.ts`), fed a few
 * at a time whatever the batch size. `jobs` = 1 (or a single file) runs on
 * the calling thread. Workers load the compiled `audit-worker.js`; when this
 * module runs from TypeScript sources (tests, tsx) it uses the compiled file
 * under dist/ if one was built, and otherwise runs on the calling thread.
 *
 * Per-file time budget: with workers, a file still running after the budget
 * is stopped (its worker is replaced) and reported as not checked. On the
 * calling thread work cannot be interrupted, so the budget is checked after
 * the fact: a file that took longer gets the same not-checked report, which
 * keeps reports independent of `jobs`.
 */
import { existsSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Config } from '../config/config.js';
import type { FileReport } from '../report/types.js';
import { PACKAGE_ROOT } from '../version.js';
import { terminalProgress, type BatchProgress } from '../cli/progress.js';
import { auditOne, cachedOutcome, overBudgetReport, seconds, type AuditJob, type AuditOutcome } from './audit-worker.js';
import { configHash } from './cache.js';
import { runOnPool, type TaskOutcome } from './worker-pool.js';
import { unreadable } from './audit-file.js';

export type { BatchProgress } from '../cli/progress.js';

/** Default per-file time budget, milliseconds. */
export const DEFAULT_TIME_BUDGET_MS = 20_000;
/** Default heap limit of one worker, MB: a file that needs more is reported instead of exhausting memory. */
export const DEFAULT_WORKER_HEAP_MB = 2048;
/** Cache lookups in flight at once on the calling thread. */
const CACHE_LOOKUP_LANES = 16;

export interface BatchOptions {
  /** Files analysed in parallel; 1 = on the calling thread, no workers. */
  jobs: number;
  /** Cache folder for reports of unchanged files, or null. */
  cacheDir: string | null;
  /** true: a progress bar on stderr when it is a terminal; or a caller's own progress sink. */
  progress: boolean | BatchProgress;
  /** Per-file time budget, milliseconds (default 20 s). */
  timeoutMs?: number;
  /** Heap limit of each worker, MB (default 2048). */
  workerHeapMb?: number;
  /** Called once per file in input order, as soon as the file and all before it are done. */
  onReport?: (report: FileReport, index: number) => void;
  /** Called once at the end with counts of what happened. */
  onStats?: (stats: BatchStats) => void;
}

export interface BatchStats {
  files: number;
  /** Read and checked in this run. */
  analysed: number;
  /** Taken from the cache. */
  fromCache: number;
  /** Over the time budget. */
  overBudget: number;
  /** Worker died or the task failed outside the per-file error handling. */
  failed: number;
  /** Worker threads used; 0 = on the calling thread. */
  workers: number;
}

/** The compiled worker file next to this module, or under dist/ when running from sources; null if not built. */
export function auditWorkerFile(): string | null {
  const here = fileURLToPath(import.meta.url);
  const candidates = here.endsWith('.js')
    ? [join(dirname(here), 'audit-worker.js')]
    : [join(PACKAGE_ROOT, 'dist', 'engine', 'audit', 'audit-worker.js')];
  return candidates.find((f) => existsSync(f)) ?? null;
}

function fromPool(path: string, outcome: TaskOutcome<AuditOutcome>): AuditOutcome {
  switch (outcome.kind) {
    case 'done':
      return outcome.value;
    case 'stopped':
      return {
        report: overBudgetReport(path, `analysis stopped after ${seconds(outcome.afterMs)} (the per-file time budget); the file was not checked`),
        source: 'over-budget',
      };
    default:
      return { report: unreadable(path, new Error(`analysis failed: ${outcome.message}`)), source: 'failed' };
  }
}

/** One file on the calling thread; never throws. */
async function auditHere(path: string, job: AuditJob): Promise<AuditOutcome> {
  try {
    return await auditOne(path, job);
  } catch (err) {
    return { report: unreadable(path, new Error(`analysis failed: ${(err as Error).message}`)), source: 'failed' };
  }
}

/** Settles every file the cache holds (a few lookups at a time); returns the indexes of the others, in order. */
async function serveFromCache(
  files: readonly string[],
  job: AuditJob,
  settle: (index: number, outcome: AuditOutcome) => void,
): Promise<number[]> {
  const misses: number[] = [];
  const found = new Array<AuditOutcome | null>(files.length).fill(null);
  let next = 0;
  const lane = async (): Promise<void> => {
    while (next < files.length) {
      const i = next++;
      found[i] = await cachedOutcome(files[i]!, job).catch(() => null);
    }
  };
  await Promise.all(Array.from({ length: Math.min(CACHE_LOOKUP_LANES, files.length) }, lane));
  for (let i = 0; i < files.length; i++) {
    const hit = found[i];
    if (hit) settle(i, hit);
    else misses.push(i);
  }
  return misses;
}

export async function auditFiles(files: string[], config: Config, options: BatchOptions): Promise<FileReport[]> {
  const timeoutMs = options.timeoutMs ?? DEFAULT_TIME_BUDGET_MS;
  if (!(timeoutMs > 0)) throw new Error(`time budget must be positive, got ${timeoutMs} ms`);
  let cacheDir: string | null = null;
  if (options.cacheDir !== null) {
    cacheDir = resolve(options.cacheDir);
    try {
      await mkdir(cacheDir, { recursive: true });
    } catch (err) {
      throw new Error(`cannot use cache folder ${options.cacheDir}: ${(err as Error).message}`);
    }
  }
  const job: AuditJob = { config, cacheDir, settingsHash: configHash(config), budgetMs: timeoutMs };
  const progress = options.progress === true ? terminalProgress('audit') : options.progress || null;

  const results = new Array<FileReport>(files.length);
  const stats: BatchStats = { files: files.length, analysed: 0, fromCache: 0, overBudget: 0, failed: 0, workers: 0 };
  // Reports finished ahead of an earlier file wait here until it is done.
  const waiting = new Map<number, FileReport>();
  let nextOut = 0;

  const settle = (index: number, outcome: AuditOutcome): void => {
    results[index] = outcome.report;
    if (outcome.source === 'analysed') stats.analysed++;
    else if (outcome.source === 'cache') stats.fromCache++;
    else if (outcome.source === 'over-budget') stats.overBudget++;
    else stats.failed++;
    progress?.advance(!outcome.report.ok);
    if (options.onReport) {
      waiting.set(index, outcome.report);
      for (let r = waiting.get(nextOut); r !== undefined; r = waiting.get(nextOut)) {
        waiting.delete(nextOut);
        options.onReport(r, nextOut++);
      }
    }
  };

  progress?.start(files.length);
  try {
    const jobs = Math.max(1, Math.floor(options.jobs));
    const workerFile = jobs > 1 && files.length > 1 ? auditWorkerFile() : null;
    if (workerFile) {
      // Cache hits are served here, so a batch of unchanged files starts no worker at all.
      const misses = cacheDir === null ? files.map((_, i) => i) : await serveFromCache(files, job, settle);
      const threads = Math.min(jobs, misses.length);
      if (threads > 1) {
        stats.workers = threads;
        await runOnPool<string, AuditOutcome, AuditJob>(
          misses.map((i) => files[i]!),
          { filename: workerFile, threads, timeoutMs, shared: job, maxHeapMb: options.workerHeapMb ?? DEFAULT_WORKER_HEAP_MB },
          (k, outcome) => settle(misses[k]!, fromPool(files[misses[k]!]!, outcome)),
        );
      } else {
        for (const i of misses) settle(i, await auditHere(files[i]!, job));
      }
    } else {
      for (let i = 0; i < files.length; i++) settle(i, await auditHere(files[i]!, job));
    }
  } finally {
    progress?.stop();
  }
  options.onStats?.(stats);
  if (/\bbatch\b/.test(process.env.PLUMBLINE_DEBUG ?? '')) {
    process.stderr.write(
      `plumbline: batch: ${stats.files} files, ${stats.analysed} analysed, ${stats.fromCache} from cache, ` +
        `${stats.overBudget} over budget, ${stats.failed} failed, ${stats.workers} workers\n`,
    );
  }
  return results;
}
