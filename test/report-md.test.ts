/**
 * The Markdown report, rendered with micromark and its GFM extension (a
 * CommonMark/GFM reference implementation) the way GitHub renders comments
 * and job summaries: one table row per file with the right counts, one
 * details block per file with findings, and nothing from a chart turned into
 * markup.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { micromark } from 'micromark';
import { gfm, gfmHtml } from 'micromark-extension-gfm';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditFile, auditText } from '../engine/audit/audit-file.js';
import { formatMarkdown, formatNumber, measuresText } from '../engine/report/format-md.js';
import { makeReport } from '../engine/report/totals.js';
import type { FileReport, Report } from '../engine/report/types.js';
import { REAL_CHARTS } from './support/real-charts.js';

const render = (md: string): string => micromark(md, { allowDangerousHtml: true, extensions: [gfm()], htmlExtensions: [gfmHtml()] });

let report: Report;
const titles = new Map<string, string | null>();

beforeAll(async () => {
  const names = ['mpl-bar-truncated-01.svg', 'ec-line-dual-axis-01.svg', 'mpl-grouped-bar-redgreen-01.svg', 'vl-pie-many-01.svg', 'mpl-heatmap-jet-01.svg', 'vl-bar-clean-01.svg'];
  const files: FileReport[] = [];
  for (const n of names) {
    const r = await auditFile(join(REAL_CHARTS, n));
    files.push(r.report);
    titles.set(r.report.path, r.analysis?.chart.title ?? null);
  }
  report = makeReport(files);
});

function tableRows(html: string): string[][] {
  const body = /<tbody>([\s\S]*?)<\/tbody>/.exec(html)?.[1] ?? '';
  return [...body.matchAll(/<tr>([\s\S]*?)<\/tr>/g)].map((m) => [...m[1]!.matchAll(/<td[^>]*>([\s\S]*?)<\/td>/g)].map((c) => c[1]!));
}

describe('formatMarkdown', () => {
  it('renders a table with one row per file and the counts of each severity', () => {
    const html = render(formatMarkdown(report, { titles }));
    const rows = tableRows(html);
    expect(rows).toHaveLength(report.files.length);
    report.files.forEach((f, i) => {
      const row = rows[i]!;
      expect(row).toHaveLength(7);
      const count = (s: string): string => String(f.findings.filter((x) => x.severity === s).length);
      expect([row[4], row[5], row[6]]).toEqual([count('error'), count('warning'), count('note')]);
      expect(row[3]).toBe(`${Math.round(f.ink!.data * 100)} %`);
      expect(row[2]).toContain(f.chart!.kind);
    });
  });

  it('has a summary line with the totals and a details block per file with findings', () => {
    const md = formatMarkdown(report, { titles });
    const t = report.totals!;
    expect(md).toContain(`${t.files} files checked: ${t.error} error${t.error === 1 ? '' : 's'}, ${t.warning} warnings, ${t.note} notes`);
    const html = render(md);
    const withFindings = report.files.filter((f) => f.findings.length > 0).length;
    expect(html.match(/<details>/g)?.length).toBe(withFindings);
    // every finding appears once as a list item with its rule id in a code span
    const items = html.match(/<li>/g)?.length ?? 0;
    expect(items).toBe(report.files.reduce((n, f) => n + f.findings.length, 0));
    for (const f of report.files) for (const x of f.findings) expect(html).toContain(`<code>${x.rule}</code>`);
  });

  it('shows where each finding is and its numbers', () => {
    const md = formatMarkdown(report);
    const truncated = report.files[0]!.findings.find((x) => x.rule === 'truth.truncated-baseline')!;
    const e = truncated.elements[0]!;
    expect(md).toContain(`line ${e.line}:${e.column}`);
    expect(md).toContain(`lieFactor ${formatNumber(truncated.measures.lieFactor as number)}`);
  });

  const hostile = '&lt;img src=x onerror=alert(1)&gt; ](javascript:alert(1)) @octocat | pipes |';
  const noMarkup = /<img|<b>x|<a\s|href=|@octocat/;

  it('escapes a hostile drawn title and file name', () => {
    const svg = readFileSync(join(REAL_CHARTS, 'vl-bar-clean-01.svg'), 'utf8').replaceAll('Pastries sold by weekday', hostile);
    const r = auditText(svg, 'charts/<b>x</b>|[y](javascript:z).svg');
    expect(r.report.ok).toBe(true);
    const title = r.analysis!.chart.title!;
    expect(title).toContain('<img src=x onerror=alert(1)>');
    const html = render(formatMarkdown(makeReport([r.report]), { titles: new Map([[r.report.path, title]]) }));
    expect(html).not.toMatch(noMarkup);
    expect(tableRows(html)[0]).toHaveLength(7);
    // the title is readable as text
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;');
  });

  it('escapes a hostile root <title> quoted in a finding', () => {
    const svg = readFileSync(join(REAL_CHARTS, 'vl-bar-clean-01.svg'), 'utf8').replace(/<svg\b([^>]*)>/, `<svg$1><title>${hostile}</title>`);
    const r = auditText(svg, 'charts/evil.svg');
    const quoted = r.report.findings.find((x) => x.message.includes('<img src=x'));
    expect(quoted).toBeDefined();
    const html = render(formatMarkdown(makeReport([r.report])));
    expect(html).not.toMatch(noMarkup);
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;');
  });

  it('says so when there are no files', () => {
    const md = formatMarkdown(makeReport([]));
    expect(md).toContain('0 files checked');
    expect(render(md)).not.toContain('<table>');
  });
});

describe('measuresText', () => {
  it('lists scalars, arrays and objects and leaves out nulls', () => {
    const s = measuresText({ lieFactor: 3.21234, scale: 'linear', ok: true, none: null, list: [1, 2.5], marks: [{ color: '#fff', ratio: 1.234567 }] });
    expect(s).toBe('lieFactor 3.212 · scale linear · ok yes · list: 1; 2.5 · marks: color #fff, ratio 1.235');
  });
});

describe('all real charts', () => {
  it('render to Markdown with balanced details blocks', async () => {
    const files: FileReport[] = [];
    for (const n of readdirSync(REAL_CHARTS).filter((f) => f.endsWith('.svg'))) files.push((await auditFile(join(REAL_CHARTS, n))).report);
    const html = render(formatMarkdown(makeReport(files)));
    expect(html.match(/<details>/g)?.length).toBe(html.match(/<\/details>/g)?.length);
    expect(tableRows(html)).toHaveLength(files.length);
  });
});
