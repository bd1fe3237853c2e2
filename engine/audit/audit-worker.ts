/**
 * One file of a batch → its report, through the cache when there is one.
 * The default export is the pool worker's handler; `auditOne` is the same
 * work on the calling thread (`--jobs 1`). Only the small FileReport leaves
 * this module: documents, scenes and charts are dropped here.
 */
import { open } from 'node:fs/promises';
import type { Config } from '../config/config.js';
import { DEFAULT_LIMITS } from '../read/parse-xml.js';
import { decodeSvgBytes } from '../read/read-file.js';
import type { FileReport } from '../report/types.js';
import { auditFile, auditText, unreadable } from './audit-file.js';
import { cacheKey, readCachedReport, writeCachedReport } from './cache.js';
import { markTaskStarted, poolSharedData, type PoolTask } from './worker-pool.js';

export interface AuditJob {
  config: Config;
  /** Cache folder, or null for no cache. */
  cacheDir: string | null;
  /** `configHash(config)`, computed once per batch. */
  settingsHash: string;
  /** Per-file time budget, milliseconds: a file whose analysis took longer is reported as not checked. */
  budgetMs: number;
}

export interface AuditOutcome {
  report: FileReport;
  /**
   * 'analysed': read and checked now; 'cache': taken from the cache;
   * 'over-budget': took longer than the time budget; 'failed': the work
   * itself broke down (worker died), not the file.
   */
  source: 'analysed' | 'cache' | 'over-budget' | 'failed';
}

export const TIME_BUDGET_RULE = 'plumbline.time-budget';

/** Report of a file that was not checked because its analysis ran over the time budget. */
export function overBudgetReport(path: string, message: string): FileReport {
  return {
    path,
    ok: false,
    error: { message, line: null, column: null },
    findings: [{ rule: TIME_BUDGET_RULE, severity: 'error', message, elements: [], measures: {} }],
  };
}

/** A duration for messages: "20 s", "1.5 s", "250 ms". */
export function seconds(ms: number): string {
  if (ms < 1000) return `${Math.round(ms)} ms`;
  const s = ms / 1000;
  return `${Number.isInteger(s) ? s : s.toFixed(1)} s`;
}

/** The report, or the over-budget report when the analysis that made it took longer than the budget. */
function withinBudget(path: string, report: FileReport, tookMs: number, budgetMs: number): AuditOutcome {
  if (tookMs <= budgetMs) return { report, source: 'analysed' };
  return {
    report: overBudgetReport(path, `analysis took ${(tookMs / 1000).toFixed(2)} s, over the ${seconds(budgetMs)} per-file time budget; the file was not checked`),
    source: 'over-budget',
  };
}

/** The file's bytes when it is a regular file within the size limit; null otherwise (the normal path reports why). */
async function readBytesForCache(path: string): Promise<Uint8Array | null> {
  let handle;
  try {
    handle = await open(path, 'r');
  } catch {
    return null;
  }
  try {
    const info = await handle.stat();
    if (!info.isFile() || info.size > DEFAULT_LIMITS.maxChars) return null;
    return await handle.readFile();
  } catch {
    return null;
  } finally {
    await handle.close().catch(() => undefined);
  }
}

/** The cached report of this file, or null (no cache, no entry, or a file the cache does not cover). */
export async function cachedOutcome(path: string, job: AuditJob): Promise<AuditOutcome | null> {
  if (job.cacheDir === null) return null;
  const bytes = await readBytesForCache(path);
  if (bytes === null) return null;
  const hit = await readCachedReport(job.cacheDir, cacheKey(bytes, job.settingsHash), path);
  return hit ? { report: hit, source: 'cache' } : null;
}

export async function auditOne(path: string, job: AuditJob): Promise<AuditOutcome> {
  const bytes = job.cacheDir === null ? null : await readBytesForCache(path);
  if (job.cacheDir === null || bytes === null) {
    const t0 = performance.now();
    const report = (await auditFile(path, job.config)).report;
    return withinBudget(path, report, performance.now() - t0, job.budgetMs);
  }
  const key = cacheKey(bytes, job.settingsHash);
  const hit = await readCachedReport(job.cacheDir, key, path);
  if (hit) return { report: hit, source: 'cache' };
  const t0 = performance.now();
  let report: FileReport;
  try {
    report = auditText(decodeSvgBytes(bytes, path), path, job.config).report;
  } catch (err) {
    report = unreadable(path, err);
  }
  const outcome = withinBudget(path, report, performance.now() - t0, job.budgetMs);
  // Only real results are kept: an over-budget verdict depends on the machine, not the file.
  if (outcome.source === 'analysed') await writeCachedReport(job.cacheDir, key, report);
  return outcome;
}

/** Pool handler: one path in, its outcome out. */
export default async function auditTask(task: PoolTask<string>): Promise<AuditOutcome> {
  markTaskStarted(task.slot);
  return auditOne(task.input, poolSharedData<AuditJob>());
}
