/**
 * The per-file time budget and in-order delivery of `auditFiles`, on workers
 * (compiled dist/, built by `npm test`) and on the calling thread.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG } from '../engine/config/config.js';
import { auditFiles, auditWorkerFile, type BatchStats } from '../engine/audit/audit-batch.js';
import type { FileReport } from '../engine/report/types.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const realCharts = path.resolve(repoRoot, '../shared/real-charts');
const tmp = mkdtempSync(path.join(os.tmpdir(), 'plumbline-batch-budget-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

// Three of the largest real charts (thousands of elements each): none can be read, understood and checked in 1 ms.
const heavy = ['mpl-scatter-overplot-01.svg', 'gg-scatter-log-bw-01.svg', 'vl-scatter-clean-01.svg'].map((f) => path.join(realCharts, f));

describe('per-file time budget', () => {
  it('runs on workers from the built dist/', () => {
    expect(auditWorkerFile()).toBe(path.join(repoRoot, 'dist/engine/audit/audit-worker.js'));
  });

  for (const jobs of [2, 1]) {
    it(`--jobs ${jobs}: every file over budget is reported as not checked, the batch completes, nothing is cached`, async () => {
      const cacheDir = path.join(tmp, `cache-${jobs}`);
      let stats: BatchStats | null = null;
      const reports = await auditFiles(heavy, DEFAULT_CONFIG, { jobs, cacheDir, progress: false, timeoutMs: 1, onStats: (s) => (stats = s) });
      expect(reports.map((r) => r.path)).toEqual(heavy);
      for (const r of reports) {
        expect(r.ok).toBe(false);
        expect(r.error?.message).toMatch(/^analysis (stopped after 1 ms \(the per-file time budget\)|took [\d.]+ s, over the 1 ms per-file time budget); the file was not checked$/);
        expect(r.findings).toEqual([{ rule: 'plumbline.time-budget', severity: 'error', message: r.error!.message, elements: [], measures: {} }]);
      }
      expect(stats).toMatchObject({ files: 3, overBudget: 3, analysed: 0, failed: 0, workers: jobs === 1 ? 0 : 2 });
      expect(readdirSync(cacheDir)).toEqual([]);
    });
  }

  it('a generous budget leaves the same files checked', async () => {
    const reports = await auditFiles(heavy, DEFAULT_CONFIG, { jobs: 2, cacheDir: null, progress: false, timeoutMs: 600_000 });
    expect(reports.every((r) => r.ok)).toBe(true);
  });
});

describe('in-order delivery', () => {
  it('onReport sees every file once, in input order, whatever order workers finish in', async () => {
    // Slow first, fast after: workers finish out of order.
    const names = readdirSync(realCharts).filter((f) => f.endsWith('.svg')).sort();
    const files = [heavy[0]!, ...names.slice(0, 7).map((f) => path.join(realCharts, f))];
    const seen: { index: number; report: FileReport }[] = [];
    const reports = await auditFiles(files, DEFAULT_CONFIG, { jobs: 2, cacheDir: null, progress: false, onReport: (report, index) => seen.push({ index, report }) });
    expect(seen.map((s) => s.index)).toEqual(files.map((_, i) => i));
    expect(seen.map((s) => s.report)).toEqual(reports);
    expect(reports.map((r) => r.path)).toEqual(files);
  });

  it('an empty batch gives an empty list', async () => {
    expect(await auditFiles([], DEFAULT_CONFIG, { jobs: 2, cacheDir: null, progress: false })).toEqual([]);
  });
});
