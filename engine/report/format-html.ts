/**
 * The HTML report: one self-contained page. Styles are inline, pictures are
 * `data:` URIs, there is no script, and a Content-Security-Policy forbids
 * every other source, so opening the file makes no request at all.
 *
 * Per file: the chart as drawn and as redraw would write it (PNG thumbnails
 * rendered with the bundled fonts), the ink shares as a bar, the findings
 * worst first with their numbers, and the recovered data table. Everything
 * that comes from a chart or a path is HTML-escaped.
 */
import { analyzeSvg } from '../audit/analyze.js';
import { renderPng } from '../raster/render.js';
import { ACCESSIBILITY_NOTE, ACCESSIBILITY_RULE, countBySeverity, formatNumber, summaryText, worstSeverity } from './format-md.js';
import { totalsOf } from './totals.js';
import type { AxisValue, FileReport, Finding, Report } from './types.js';
import { SEVERITY_RANK } from './types.js';

/** What redraw would write for one file, as far as the HTML report needs it. */
export interface RedrawPreview {
  /** The redrawn SVG text. */
  output: string;
  /** Rule ids whose fixes were applied. */
  applied: readonly string[];
  changed: boolean;
}

export interface HtmlOptions {
  /** Reads a report path's SVG text for thumbnails; null (or a rejection) when unavailable. Without it, no thumbnails. */
  loadSvg?: (path: string) => Promise<string | null>;
  /** Produces the redrawn version for the "after" thumbnail; null or absent: no "after" picture. */
  redraw?: ((text: string, path: string) => RedrawPreview | null) | null;
  /** Thumbnail render width in pixels; default 560. */
  thumbnailWidth?: number;
  /** Files that get thumbnails (the first ones); default 300. */
  maxThumbnails?: number;
  /** Rows of the recovered data table per file; default 200. */
  maxTableRows?: number;
  /** Page title; default "plumbline report". */
  title?: string;
}

const HTML_ESCAPES: Readonly<Record<string, string>> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Escapes text for HTML element content and quoted attribute values. */
export function escapeHtml(text: string): string {
  return String(text).replace(/[&<>"']/g, (c) => HTML_ESCAPES[c] ?? c);
}

const STYLE = `
:root{--fg:#1d2330;--muted:#5b6474;--line:#d9dde5;--bg:#f6f7f9;--card:#fff;--err:#b3261e;--warn:#8a5a00;--note:#255f99;--ok:#1e7a3c;
--ink-data:#2f5d9e;--ink-guides:#9aa3b2;--ink-labels:#c9ced8;--ink-decoration:#d9822b;color-scheme:light}
*{box-sizing:border-box}
html{-webkit-text-size-adjust:100%}
body{margin:0;background:var(--bg);color:var(--fg);font:15px/1.5 system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans","DejaVu Sans",sans-serif}
header,main,footer{max-width:1120px;margin:0 auto;padding:0 20px}
header{padding-top:28px}
h1{font-size:1.6rem;line-height:1.2;margin:0 0 4px}
h2{font-size:1.15rem;line-height:1.3;margin:0;word-break:break-word}
h3{font-size:.8rem;text-transform:uppercase;letter-spacing:.06em;color:var(--muted);margin:20px 0 8px}
.summary{color:var(--muted);margin:0 0 16px}
table{border-collapse:collapse;width:100%;font-variant-numeric:tabular-nums}
th,td{text-align:left;padding:6px 10px;border-bottom:1px solid var(--line);vertical-align:top}
th{font-weight:600;color:var(--muted);font-size:.85rem}
td.num,th.num{text-align:right}
.scroll{overflow-x:auto;-webkit-overflow-scrolling:touch}
.overview a{color:inherit}
.file{background:var(--card);border:1px solid var(--line);border-radius:10px;padding:20px;margin:20px 0}
.file-head{display:flex;flex-wrap:wrap;gap:8px 14px;align-items:baseline}
.meta{color:var(--muted);margin:4px 0 0}
.badge{display:inline-block;font-size:.78rem;font-weight:600;border-radius:999px;padding:1px 9px;border:1px solid currentColor}
.error{color:var(--err)}.warning{color:var(--warn)}.note{color:var(--note)}.clean{color:var(--ok)}
.thumbs{display:grid;grid-template-columns:repeat(2,minmax(0,1fr));gap:16px;margin-top:16px}
figure{margin:0}
figure img{display:block;width:100%;height:auto;background:#fff;border:1px solid var(--line);border-radius:6px}
figcaption{font-size:.85rem;color:var(--muted);margin-top:6px}
.placeholder{display:flex;align-items:center;justify-content:center;min-height:120px;border:1px dashed var(--line);border-radius:6px;color:var(--muted);font-size:.9rem;padding:12px;text-align:center}
.ink-bar{display:flex;height:14px;border-radius:7px;overflow:hidden;background:var(--line)}
.ink-bar span{display:block;height:100%}
.ink-legend{display:flex;flex-wrap:wrap;gap:4px 18px;margin:8px 0 0;padding:0;list-style:none;font-size:.88rem;font-variant-numeric:tabular-nums}
.ink-legend i{display:inline-block;width:10px;height:10px;border-radius:2px;margin-right:6px;vertical-align:baseline}
.findings{list-style:none;margin:0;padding:0}
.findings li{border-left:4px solid currentColor;padding:8px 12px;margin:0 0 10px;background:var(--bg);border-radius:0 6px 6px 0}
.findings .head{display:flex;flex-wrap:wrap;gap:4px 10px;align-items:baseline}
.findings .msg{color:var(--fg);margin:4px 0 0}
.findings code{font:600 .85rem/1.4 ui-monospace,"DejaVu Sans Mono",monospace;color:var(--fg)}
.loc{color:var(--muted);font-size:.85rem;font-variant-numeric:tabular-nums}
.numbers{display:flex;flex-wrap:wrap;gap:2px 16px;margin:6px 0 0;font-size:.86rem;color:var(--muted);font-variant-numeric:tabular-nums}
.numbers dt{display:inline;font-weight:600}.numbers dd{display:inline;margin:0 0 0 4px}
.fix{margin:6px 0 0;font-size:.88rem;color:var(--fg)}
details{margin-top:8px}
summary{cursor:pointer;font-weight:600}
.none{color:var(--ok);margin:0}
.error-text{color:var(--err)}
footer{color:var(--muted);font-size:.85rem;padding-bottom:32px}
@media (max-width:640px){
.thumbs{grid-template-columns:minmax(0,1fr)}
body{font-size:14px}
header,main,footer{padding:0 12px}
.file{padding:14px;border-radius:8px}
th,td{padding:5px 6px}
.overview .hide-narrow{display:none}
}
@media (prefers-color-scheme:dark){
:root{--fg:#e6e8ec;--muted:#a3abb8;--line:#3a4150;--bg:#15181e;--card:#1d2129;--err:#ff8a80;--warn:#ffcc66;--note:#8ab4f8;--ok:#7ddc95;color-scheme:dark}
}
`;

const INK_PARTS = [
  ['data', 'data', '--ink-data'],
  ['guides', 'guides', '--ink-guides'],
  ['labels', 'labels', '--ink-labels'],
  ['decoration', 'decoration', '--ink-decoration'],
] as const;

function pct(v: number): string {
  return `${(v * 100).toFixed(v >= 0.1 || v === 0 ? 0 : 1)} %`;
}

function inkBlock(f: FileReport): string {
  if (!f.ink) return '';
  const ink = f.ink;
  const bar = INK_PARTS.map(([key, , color]) => {
    const v = Math.max(0, Math.min(1, ink[key]));
    return v > 0 ? `<span style="width:${(v * 100).toFixed(2)}%;background:var(${color})"></span>` : '';
  }).join('');
  const legend = INK_PARTS.map(([key, label, color]) => `<li><i style="background:var(${color})"></i>${label} <b>${pct(ink[key])}</b></li>`).join('');
  return `<h3>Ink</h3><div class="ink-bar" role="img" aria-label="${escapeHtml(
    INK_PARTS.map(([key, label]) => `${label} ${pct(ink[key])}`).join(', '),
  )}">${bar}</div><ul class="ink-legend">${legend}</ul>`;
}

function measureValue(v: unknown): string | null {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return formatNumber(v);
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'string') return v;
  if (Array.isArray(v)) {
    const parts = v.slice(0, 6).map((x) => {
      if (x && typeof x === 'object' && !Array.isArray(x)) {
        return Object.entries(x as Record<string, unknown>)
          .map(([k, y]) => {
            const t = measureValue(y);
            return t === null ? null : `${k} ${t}`;
          })
          .filter((s): s is string => s !== null)
          .join(', ');
      }
      return measureValue(x) ?? '–';
    });
    if (v.length > 6) parts.push(`… ${v.length - 6} more`);
    return parts.join('; ');
  }
  return null;
}

function findingItem(x: Finding): string {
  const e = x.elements[0];
  const loc = e ? `line ${e.line}:${e.column}${x.elements.length > 1 ? ` (+${x.elements.length - 1} more)` : ''}` : '';
  const numbers = Object.entries(x.measures)
    .map(([k, v]) => {
      const t = measureValue(v);
      return t === null ? '' : `<div><dt>${escapeHtml(k)}</dt><dd>${escapeHtml(t.length > 300 ? `${t.slice(0, 299)}…` : t)}</dd></div>`;
    })
    .filter(Boolean)
    .slice(0, 14)
    .join('');
  return `<li class="${x.severity}"><div class="head"><span class="badge ${x.severity}">${x.severity}</span><code>${escapeHtml(x.rule)}</code>${
    loc ? `<span class="loc">${escapeHtml(loc)}</span>` : ''
  }</div><p class="msg">${escapeHtml(x.message)}</p>${numbers ? `<dl class="numbers">${numbers}</dl>` : ''}${
    x.fix ? `<p class="fix"><b>Redraw:</b> ${escapeHtml(x.fix)}</p>` : ''
  }</li>`;
}

function axisText(v: AxisValue | null, time: boolean): string {
  if (v === null) return '–';
  if (typeof v === 'number') {
    if (time && Number.isFinite(v)) {
      const iso = new Date(v).toISOString();
      return iso.endsWith('T00:00:00.000Z') ? iso.slice(0, 10) : iso.replace('.000Z', 'Z');
    }
    return formatNumber(v);
  }
  return v;
}

interface PointExtra {
  x: AxisValue | null;
  y: number;
  value?: number | null;
  yCategory?: AxisValue | null;
}

function dataTable(f: FileReport, maxRows: number): string {
  const chart = f.chart;
  if (!chart || chart.series.length === 0) return '';
  const time = chart.axes.x?.scale === 'time';
  const series = chart.series;
  const heat = series.some((s) => s.points.some((p) => (p as PointExtra).yCategory !== undefined && (p as PointExtra).yCategory !== null));
  let head: string[];
  let rows: string[][];
  if (heat) {
    head = ['x', 'y', 'value'];
    rows = series.flatMap((s) =>
      s.points.map((p) => {
        const q = p as PointExtra;
        return [axisText(q.x, time), axisText(q.yCategory ?? null, false), q.value === null || q.value === undefined ? '–' : formatNumber(q.value)];
      }),
    );
  } else {
    const pie = chart.kind === 'pie' || chart.kind === 'donut';
    head = [pie ? 'slice' : 'x', ...series.map((s, i) => s.name ?? (series.length === 1 ? (pie ? 'share' : 'value') : `series ${i + 1}`))];
    const order: string[] = [];
    const cells = new Map<string, string[]>();
    series.forEach((s, si) => {
      for (const p of s.points) {
        const key = `${typeof p.x}:${String(p.x)}`;
        let row = cells.get(key);
        if (!row) {
          row = [axisText(p.x, time), ...series.map(() => '')];
          cells.set(key, row);
          order.push(key);
        }
        const cell = pie ? pct(p.y) : formatNumber(p.y);
        row[si + 1] = row[si + 1] ? `${row[si + 1]}, ${cell}` : cell;
      }
    });
    rows = order.map((k) => cells.get(k)!);
  }
  const shown = rows.slice(0, maxRows);
  const th = head.map((h, i) => `<th${i > 0 ? ' class="num"' : ''} scope="col">${escapeHtml(h)}</th>`).join('');
  const body = shown.map((r) => `<tr>${r.map((c, i) => (i === 0 ? `<th scope="row">${escapeHtml(c)}</th>` : `<td class="num">${escapeHtml(c)}</td>`)).join('')}</tr>`).join('');
  const more = rows.length > shown.length ? `<p class="meta">… ${rows.length - shown.length} more rows (plumbline extract prints them all)</p>` : '';
  const count = rows.length;
  return `<details${count <= 24 ? ' open' : ''}><summary>Recovered data (${count} row${count === 1 ? '' : 's'})</summary><div class="scroll"><table><thead><tr>${th}</tr></thead><tbody>${body}</tbody></table></div>${more}</details>`;
}

interface Preview {
  before: string | null;
  beforeError: string | null;
  after: string | null;
  afterNote: string | null;
  width: number;
  height: number;
  title: string | null;
}

function pngSize(png: Buffer): { width: number; height: number } {
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}

function errorText(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

async function preview(f: FileReport, opts: HtmlOptions, width: number): Promise<Preview> {
  const out: Preview = { before: null, beforeError: null, after: null, afterNote: null, width, height: Math.round(width * 0.75), title: null };
  if (!opts.loadSvg) return out;
  let text: string | null;
  try {
    text = await opts.loadSvg(f.path);
  } catch (err) {
    out.beforeError = `cannot read the file: ${errorText(err)}`;
    return out;
  }
  if (text === null) {
    out.beforeError = 'the file is not available';
    return out;
  }
  try {
    const png = renderPng(text, { width, background: 'white' });
    const size = pngSize(png);
    out.width = size.width;
    out.height = size.height;
    out.before = `data:image/png;base64,${png.toString('base64')}`;
  } catch (err) {
    out.beforeError = `no picture: ${errorText(err)}`;
    return out;
  }
  if (f.ok) {
    try {
      out.title = analyzeSvg(text, { file: f.path }).chart.title;
    } catch {
      out.title = null;
    }
  }
  if (opts.redraw && f.ok) {
    try {
      const r = opts.redraw(text, f.path);
      if (r && r.changed) {
        const png = renderPng(r.output, { width, background: 'white' });
        out.after = `data:image/png;base64,${png.toString('base64')}`;
        out.afterNote = r.applied.length > 0 ? `fixes of ${r.applied.join(', ')}` : null;
      } else if (r) out.afterNote = 'redraw changes nothing in this chart';
    } catch (err) {
      out.afterNote = `redraw failed: ${errorText(err)}`;
    }
  }
  return out;
}

function figure(src: string | null, alt: string, caption: string, w: number, h: number, missing: string | null): string {
  if (!src) return `<figure><div class="placeholder">${escapeHtml(missing ?? 'no picture')}</div><figcaption>${escapeHtml(caption)}</figcaption></figure>`;
  return `<figure><img src="${src}" width="${w}" height="${h}" alt="${escapeHtml(alt)}" decoding="async"><figcaption>${escapeHtml(caption)}</figcaption></figure>`;
}

function fileSection(f: FileReport, i: number, p: Preview | null, maxRows: number): string {
  const c = countBySeverity(f.findings);
  const worst = worstSeverity(f);
  const badges = f.ok
    ? (['error', 'warning', 'note'] as const)
        .filter((s) => c[s] > 0)
        .map((s) => `<span class="badge ${s}">${c[s]} ${s}${c[s] === 1 ? '' : 's'}</span>`)
        .join(' ') || '<span class="badge clean">no findings</span>'
    : '<span class="badge error">unreadable</span>';
  const metaParts: string[] = [];
  if (f.chart) {
    metaParts.push(`${f.chart.kind}${f.chart.threeD ? ' (3D)' : ''}${f.chart.orientation ? `, ${f.chart.orientation}` : ''}`);
    metaParts.push(`${f.chart.counts.marks} marks, ${f.chart.series.length} series`);
  }
  if (p?.title) metaParts.unshift(`“${p.title}”`);
  if (f.error) metaParts.push(`line ${f.error.line ?? '?'}: ${f.error.message}`);
  const meta = metaParts.length ? `<p class="meta">${escapeHtml(metaParts.join(' · '))}</p>` : '';
  let thumbs = '';
  if (p && (p.before || p.beforeError)) {
    const name = p.title ? `“${p.title}”` : f.path;
    thumbs = `<div class="thumbs">${figure(p.before, `The chart ${name} as drawn`, 'As drawn', p.width, p.height, p.beforeError)}${
      p.after || p.afterNote
        ? figure(p.after, `The chart ${name} as plumbline redraw writes it`, p.after ? `After redraw${p.afterNote ? `: ${p.afterNote}` : ''}` : 'After redraw', p.width, p.height, p.after ? null : p.afterNote)
        : ''
    }</div>`;
  }
  const sorted = [...f.findings].sort((a, b) => SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity] || a.rule.localeCompare(b.rule));
  const findings = sorted.length
    ? `<h3>Findings</h3><ol class="findings">${sorted.map(findingItem).join('')}</ol>`
    : '<h3>Findings</h3><p class="none">No findings.</p>';
  const table = dataTable(f, maxRows);
  return `<section class="file ${worst ?? 'clean'}-file" id="f${i + 1}" aria-labelledby="f${i + 1}-h"><div class="file-head"><h2 id="f${i + 1}-h">${escapeHtml(f.path)}</h2>${badges}</div>${meta}${thumbs}${inkBlock(f)}${findings}${table}</section>`;
}

function overview(files: readonly FileReport[]): string {
  const rows = files
    .map((f, i) => {
      const c = countBySeverity(f.findings);
      const worst = worstSeverity(f);
      const status = !f.ok ? '<span class="error">unreadable</span>' : worst ? `<span class="${worst}">${worst}</span>` : '<span class="clean">clean</span>';
      return `<tr><td><a href="#f${i + 1}">${escapeHtml(f.path)}</a></td><td>${status}</td><td class="hide-narrow">${escapeHtml(
        f.chart ? `${f.chart.kind}${f.chart.threeD ? ' (3D)' : ''}` : '–',
      )}</td><td class="num hide-narrow">${f.ink ? pct(f.ink.data) : '–'}</td><td class="num">${c.error}</td><td class="num">${c.warning}</td><td class="num">${c.note}</td></tr>`;
    })
    .join('');
  return `<div class="scroll"><table class="overview"><thead><tr><th scope="col">File</th><th scope="col">Status</th><th scope="col" class="hide-narrow">Chart</th><th scope="col" class="num hide-narrow">Data ink</th><th scope="col" class="num">Errors</th><th scope="col" class="num">Warnings</th><th scope="col" class="num">Notes</th></tr></thead><tbody>${rows}</tbody></table></div>`;
}

/** The report as one self-contained HTML page. */
export async function formatHtml(report: Report, opts: HtmlOptions = {}): Promise<string> {
  const totals = report.totals ?? totalsOf(report.files);
  const width = opts.thumbnailWidth ?? 560;
  if (!Number.isInteger(width) || width < 16 || width > 4000) throw new RangeError(`thumbnailWidth must be a whole number from 16 to 4000, got ${width}`);
  const maxThumbs = opts.maxThumbnails ?? 300;
  const maxRows = opts.maxTableRows ?? 200;
  const sections: string[] = [];
  for (let i = 0; i < report.files.length; i++) {
    const f = report.files[i]!;
    const p = i < maxThumbs ? await preview(f, opts, width) : null;
    sections.push(fileSection(f, i, p, maxRows));
  }
  const more = report.files.length > maxThumbs ? `<p class="meta">Pictures are shown for the first ${maxThumbs} files.</p>` : '';
  const access = report.files.some((f) => f.findings.some((x) => ACCESSIBILITY_RULE.test(x.rule))) ? `<p>${escapeHtml(ACCESSIBILITY_NOTE)}</p>` : '';
  const title = opts.title ?? 'plumbline report';
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'; base-uri 'none'; form-action 'none'">
<meta name="referrer" content="no-referrer">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
</head>
<body>
<header>
<h1>${escapeHtml(title)}</h1>
<p class="summary">${escapeHtml(summaryText(totals))}.</p>
${report.files.length ? overview(report.files) : ''}
${more}
</header>
<main>
${sections.join('\n')}
</main>
<footer>
${access}<p>plumbline ${escapeHtml(report.plumbline)} · report version ${report.reportVersion}</p>
</footer>
</body>
</html>
`;
}
