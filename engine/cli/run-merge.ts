/** `plumbline merge`: shard reports → one report (same contract), files in path order, totals recomputed. */
import { readFile } from 'node:fs/promises';
import type { FileReport, Report } from '../report/types.js';
import { REPORT_VERSION } from '../report/types.js';
import { failsAt, makeReport } from '../report/totals.js';
import { writeFileAtomic } from '../report/write-atomic.js';
import { parseFailOn } from './options.js';
import { UsageError } from './usage-error.js';

export function mergeReports(reports: Report[]): Report {
  const byPath = new Map<string, FileReport>();
  for (const r of reports) {
    if (r.reportVersion !== REPORT_VERSION) throw new UsageError(`cannot merge reportVersion ${String(r.reportVersion)} (expected ${REPORT_VERSION})`);
    for (const f of r.files) byPath.set(f.path, f);
  }
  const files = [...byPath.values()].sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  return makeReport(files);
}

export async function runMerge(paths: string[], opts: { out?: string; failOn: string }): Promise<number> {
  const reports: Report[] = [];
  for (const p of paths) {
    let parsed: unknown;
    try {
      parsed = JSON.parse(await readFile(p, 'utf8'));
    } catch (err) {
      throw new UsageError(`cannot read report ${p}: ${(err as Error).message}`);
    }
    if (!parsed || typeof parsed !== 'object' || !Array.isArray((parsed as Report).files)) throw new UsageError(`${p} is not a plumbline JSON report`);
    reports.push(parsed as Report);
  }
  const merged = mergeReports(reports);
  const text = JSON.stringify(merged, null, 2) + '\n';
  if (opts.out) await writeFileAtomic(opts.out, text);
  else process.stdout.write(text);
  return failsAt(merged.files, parseFailOn(opts.failOn)) ? 1 : 0;
}
