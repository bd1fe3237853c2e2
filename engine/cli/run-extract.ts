/** `plumbline extract`: the data table recovered from one chart. */
import { auditFile } from '../audit/audit-file.js';
import { UsageError } from './usage-error.js';

export async function runExtract(file: string, opts: { format: 'json' | 'csv' }): Promise<number> {
  const { report, analysis } = await auditFile(file);
  if (!analysis || !report.chart) {
    process.stderr.write(`plumbline: ${file}: ${report.error?.message ?? 'cannot read'}${report.error?.line ? ` (line ${report.error.line}, column ${report.error.column})` : ''}\n`);
    return 1;
  }
  const chart = report.chart;
  if (opts.format === 'json') {
    process.stdout.write(JSON.stringify({ path: file, kind: chart.kind, orientation: chart.orientation, axes: chart.axes, series: chart.series }, null, 2) + '\n');
    return 0;
  }
  if (opts.format !== 'csv') throw new UsageError(`unknown format ${String(opts.format)}`);
  const rows = [['series', 'x', 'y', 'value'].join(',')];
  for (const s of chart.series) {
    for (const p of s.points) {
      const v = (p as { value?: number | null }).value;
      rows.push([csv(s.name ?? s.color ?? ''), csv(p.x === null ? '' : String(p.x)), String(p.y), v === undefined || v === null ? '' : String(v)].join(','));
    }
  }
  process.stdout.write(rows.join('\n') + '\n');
  return 0;
}

function csv(s: string): string {
  // RFC 4180 quoting; a leading formula character is neutralised for spreadsheets.
  const safe = /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}
