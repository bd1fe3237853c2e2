/** Totals and the exit decision over a set of file reports. */
import type { FileReport, Report, Severity } from './types.js';
import { REPORT_VERSION, SEVERITY_RANK } from './types.js';
import { VERSION } from '../version.js';

export type FailOn = Severity | 'never';

export function totalsOf(files: readonly FileReport[]): NonNullable<Report['totals']> {
  const t = { files: files.length, unreadable: 0, error: 0, warning: 0, note: 0 };
  for (const f of files) {
    if (!f.ok) t.unreadable++;
    for (const x of f.findings) t[x.severity]++;
  }
  return t;
}

export function makeReport(files: FileReport[]): Report {
  return { reportVersion: REPORT_VERSION, plumbline: VERSION, files, totals: totalsOf(files) };
}

/** True when some finding is at or above the fail-on severity. */
export function failsAt(files: readonly FileReport[], failOn: FailOn): boolean {
  if (failOn === 'never') return false;
  const limit = SEVERITY_RANK[failOn];
  return files.some((f) => f.findings.some((x) => SEVERITY_RANK[x.severity] >= limit));
}
