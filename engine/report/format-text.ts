/** The terminal report: one table per file, worst findings first; colour only on a TTY without NO_COLOR. */
import type { FileReport, Report } from './types.js';

export interface TextOptions {
  color: boolean;
}

const paint = (on: boolean, code: string, s: string): string => (on ? `\u001b[${code}m${s}\u001b[0m` : s);

export function useColor(stream: NodeJS.WriteStream): boolean {
  return Boolean(stream.isTTY) && !('NO_COLOR' in process.env) && process.env.TERM !== 'dumb';
}

export function formatText(report: Report, opts: TextOptions): string {
  const out: string[] = [];
  for (const f of report.files) out.push(fileBlock(f, opts));
  const t = report.totals!;
  const summary = `${t.files} file${t.files === 1 ? '' : 's'}: ${t.error} error${t.error === 1 ? '' : 's'}, ${t.warning} warning${t.warning === 1 ? '' : 's'}, ${t.note} note${t.note === 1 ? '' : 's'}${t.unreadable ? `, ${t.unreadable} unreadable` : ''}`;
  out.push(paint(opts.color, '1', summary));
  return out.join('\n') + '\n';
}

function fileBlock(f: FileReport, opts: TextOptions): string {
  const lines: string[] = [];
  const head = f.ok && f.chart
    ? `${f.path}  ${f.chart.kind}${f.chart.threeD ? ' (3D)' : ''}${f.ink ? `  data ink ${(f.ink.data * 100).toFixed(0)}%` : ''}`
    : `${f.path}  unreadable`;
  lines.push(paint(opts.color, '1;4', head));
  if (f.findings.length === 0) {
    lines.push(`  ${paint(opts.color, '32', 'no findings')}`);
  } else {
    const sevWidth = 7;
    const ruleWidth = Math.max(...f.findings.map((x) => x.rule.length));
    for (const x of f.findings) {
      const where = x.elements[0] ? `${x.elements[0].line}:${x.elements[0].column}` : '';
      const sev = x.severity.padEnd(sevWidth);
      const sevColored = paint(opts.color, x.severity === 'error' ? '31' : x.severity === 'warning' ? '33' : '36', sev);
      lines.push(`  ${sevColored} ${x.rule.padEnd(ruleWidth)}  ${where.padEnd(9)} ${x.message}`);
    }
  }
  return lines.join('\n') + '\n';
}
