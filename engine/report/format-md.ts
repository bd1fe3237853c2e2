/**
 * The Markdown report, for PR comments, job summaries and report files: a
 * summary line, one table row per file, and a collapsible block per file with
 * its findings. Everything that comes from a chart or a path is escaped with
 * `escapeMarkdown`; only the report's own words and rule ids (from the
 * catalogue, `family.name`) are written as they are.
 */
import { escapeMarkdown, escapeMarkdownShort } from './escape-md.js';
import { totalsOf } from './totals.js';
import type { FileReport, Finding, Report, Severity } from './types.js';
import { SEVERITY_RANK } from './types.js';

export interface MarkdownOptions {
  /** Chart titles by report path, shown beside the chart kind. */
  titles?: ReadonlyMap<string, string | null>;
  /** Print each finding's redraw fix under it; default true. */
  fixes?: boolean;
  /** First line of the document; default `### plumbline`. `null`: none. */
  heading?: string | null;
  /** Largest number of findings listed per file; default 50 (the rest are counted). */
  maxFindingsPerFile?: number;
}

type Totals = NonNullable<Report['totals']>;

/** Rules whose findings concern accessibility (text alternatives, contrast, colour vision). */
export const ACCESSIBILITY_RULE = /^(access\.|text\.low-contrast|text\.too-small|color\.(cvd-|low-contrast))/;
export const ACCESSIBILITY_NOTE =
  'Accessibility findings come from automated checks; they do not replace review by people, nor the accessibility requirements that apply where a figure is published.';

const SEVERITY_MARK: Record<Severity, string> = { error: '❌', warning: '⚠️', note: 'ℹ️' };

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** "3 files: 1 error, 2 warnings, 4 notes" (plus unreadable files when there are some). */
export function summaryText(t: Totals): string {
  const parts = [plural(t.error, 'error'), plural(t.warning, 'warning'), plural(t.note, 'note')];
  if (t.unreadable) parts.push(`${t.unreadable} unreadable`);
  return `${plural(t.files, 'file')} checked: ${parts.join(', ')}`;
}

/** The worst severity among a file's findings, or null when it has none. */
export function worstSeverity(f: FileReport): Severity | null {
  let worst: Severity | null = null;
  for (const x of f.findings) if (worst === null || SEVERITY_RANK[x.severity] > SEVERITY_RANK[worst]) worst = x.severity;
  return worst;
}

export function countBySeverity(findings: readonly Finding[]): Record<Severity, number> {
  const c: Record<Severity, number> = { error: 0, warning: 0, note: 0 };
  for (const x of findings) c[x.severity]++;
  return c;
}

function statusCell(f: FileReport): string {
  if (!f.ok) return '⛔ unreadable';
  const w = worstSeverity(f);
  return w ? `${SEVERITY_MARK[w]} ${w}` : '✅ clean';
}

/** A share 0..1 as a whole percentage, or a dash. */
export function percent(v: number | null | undefined): string {
  return typeof v === 'number' && Number.isFinite(v) ? `${Math.round(v * 100)} %` : '–';
}

function chartCell(f: FileReport, titles: ReadonlyMap<string, string | null> | undefined): string {
  if (!f.chart) return '–';
  const kind = `${f.chart.kind}${f.chart.threeD ? ' (3D)' : ''}`;
  const title = titles?.get(f.path);
  return title && title.trim() !== '' ? `${kind}: “${escapeMarkdownShort(title.trim(), 60)}”` : kind;
}

/** The table of files: status, chart kind (and title), data-ink share, counts by severity. */
export function filesTable(files: readonly FileReport[], titles?: ReadonlyMap<string, string | null>): string {
  const rows = ['| File | Status | Chart | Data ink | Errors | Warnings | Notes |', '|---|---|---|---:|---:|---:|---:|'];
  for (const f of files) {
    const c = countBySeverity(f.findings);
    rows.push(
      `| ${escapeMarkdown(f.path)} | ${statusCell(f)} | ${chartCell(f, titles)} | ${percent(f.ink?.data)} | ${c.error} | ${c.warning} | ${c.note} |`,
    );
  }
  return rows.join('\n');
}

/** A number for people: up to 4 significant digits, no exponent for ordinary sizes. */
export function formatNumber(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  if (Number.isInteger(v) && Math.abs(v) < 1e9) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a < 1e-4 || a >= 1e9)) return v.toExponential(3);
  return String(Number(v.toPrecision(4)));
}

type MeasureValue = Finding['measures'][string];

function scalarText(v: unknown): string | null {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return formatNumber(v);
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'string') return v;
  return null;
}

/**
 * The numbers behind a finding as plain (unescaped) text: `key value` pairs,
 * lists joined, objects shown as their fields; null values left out. Cut at
 * `maxItems` entries.
 */
export function measuresText(measures: Finding['measures'], maxItems = 16): string {
  const parts: string[] = [];
  const entries = Object.entries(measures) as [string, MeasureValue][];
  for (const [key, value] of entries) {
    if (parts.length >= maxItems) {
      parts.push('…');
      break;
    }
    const s = scalarText(value);
    if (s !== null) {
      parts.push(`${key} ${s}`);
      continue;
    }
    if (Array.isArray(value)) {
      const items: string[] = [];
      for (const item of value.slice(0, 6)) {
        const one = scalarText(item);
        if (one !== null) items.push(one);
        else if (item && typeof item === 'object') {
          const fields = Object.entries(item)
            .map(([k, x]) => {
              const t = scalarText(x);
              return t === null ? null : `${k} ${t}`;
            })
            .filter((x): x is string => x !== null);
          items.push(fields.join(', '));
        }
      }
      if (value.length > 6) items.push(`… ${value.length - 6} more`);
      if (items.length > 0) parts.push(`${key}: ${items.join('; ')}`);
    }
  }
  return parts.join(' · ');
}

function where(x: Finding): string {
  const e = x.elements[0];
  if (!e) return '';
  const more = x.elements.length > 1 ? ` (+${x.elements.length - 1})` : '';
  return `line ${e.line}:${e.column}${more}`;
}

/** One finding as a Markdown list item (two or three lines). */
export function findingItem(x: Finding, fixes = true): string {
  const loc = where(x);
  const lines = [`- ${SEVERITY_MARK[x.severity]} **${x.severity}** \`${x.rule}\`${loc ? ` · ${loc}` : ''}: ${escapeMarkdown(x.message)}`];
  const numbers = measuresText(x.measures);
  if (numbers) lines.push(`  <br><sub>${escapeMarkdownShort(numbers, 400)}</sub>`);
  if (fixes && x.fix) lines.push(`  <br><sub>Redraw: ${escapeMarkdown(x.fix)}</sub>`);
  return lines.join('\n');
}

/** A file's findings in a `<details>` block, worst first. */
export function fileDetails(f: FileReport, opts: MarkdownOptions = {}): string {
  const c = countBySeverity(f.findings);
  const counts = [c.error && plural(c.error, 'error'), c.warning && plural(c.warning, 'warning'), c.note && plural(c.note, 'note')]
    .filter(Boolean)
    .join(', ');
  const kind = f.chart ? ` · ${f.chart.kind}${f.chart.threeD ? ' (3D)' : ''}` : f.ok ? '' : ' · unreadable';
  const head = `<details>\n<summary><b>${escapeMarkdown(f.path)}</b>${kind} · ${counts || 'no findings'}</summary>\n`;
  const limit = opts.maxFindingsPerFile ?? 50;
  const sorted = [...f.findings].sort((a, b) => SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity] || a.rule.localeCompare(b.rule));
  const items = sorted.slice(0, limit).map((x) => findingItem(x, opts.fixes ?? true));
  if (sorted.length > limit) items.push(`- … and ${sorted.length - limit} more`);
  if (items.length === 0) items.push('No findings.');
  return `${head}\n${items.join('\n')}\n\n</details>`;
}

/** Markdown report: heading, summary line, table of files, then a details block per file with findings. */
export function formatMarkdown(report: Report, opts: MarkdownOptions = {}): string {
  const totals = report.totals ?? totalsOf(report.files);
  const out: string[] = [];
  const heading = opts.heading === undefined ? '### plumbline' : opts.heading;
  if (heading) out.push(heading, '');
  out.push(`**${summaryText(totals)}.**`, '');
  if (report.files.length > 0) {
    out.push(filesTable(report.files, opts.titles), '');
    for (const f of report.files) if (f.findings.length > 0) out.push(fileDetails(f, opts), '');
  }
  if (report.files.some((f) => f.findings.some((x) => ACCESSIBILITY_RULE.test(x.rule)))) out.push(`<sub>${ACCESSIBILITY_NOTE}</sub>`, '');
  out.push(`<sub>plumbline ${report.plumbline.replace(/[^0-9A-Za-z.+-]/g, '')}, report version ${report.reportVersion}</sub>`);
  return out.join('\n') + '\n';
}
