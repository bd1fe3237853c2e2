/**
 * A text alternative written from the recovered chart: a short title and a
 * description naming the chart's kind, its axes, its series and the range and
 * extremes of their values. Plain text; the caller escapes it for XML.
 */
import type { Axis, Chart, DataPoint, Series } from '../classify/chart.js';
import type { Rgba } from '../color/types.js';
import type { TextItem } from '../read/scene.js';
import { fmt, percent } from '../rules/format-number.js';

export interface ChartDescription {
  title: string;
  description: string;
}

const KIND_WORD: Record<Chart['kind'], string> = {
  bar: 'Bar chart',
  'grouped-bar': 'Grouped bar chart',
  'stacked-bar': 'Stacked bar chart',
  line: 'Line chart',
  area: 'Area chart',
  scatter: 'Scatter plot',
  pie: 'Pie chart',
  donut: 'Donut chart',
  heatmap: 'Heatmap',
  unknown: 'Chart',
};

/** Longest lists written out in full; longer ones are cut with "and N more". */
const MAX_LISTED = 12;

function list(items: string[], max = MAX_LISTED): string {
  if (items.length === 0) return '';
  if (items.length > max) return `${items.slice(0, max).join(', ')} and ${items.length - max} more`;
  if (items.length === 1) return items[0]!;
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function clean(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

function textsWithRole(chart: Chart, sub: string): TextItem[] {
  const out: TextItem[] = [];
  chart.scene.items.forEach((it, i) => {
    if (it.kind === 'text' && chart.roles[i]?.sub === sub && clean(it.content) !== '') out.push(it);
  });
  return out;
}

const DAY_MS = 86_400_000;

/** Span of a numeric axis's domain (0 when unknown). */
function axisSpan(axis: Axis | null): number {
  const nums = axis?.domain.filter((d): d is number => typeof d === 'number' && Number.isFinite(d)) ?? [];
  return nums.length >= 2 ? Math.max(...nums) - Math.min(...nums) : 0;
}

function valueText(axis: Axis | null, v: number | string | null): string {
  if (v === null) return 'n/a';
  if (typeof v === 'string') return clean(v);
  if (axis?.scale === 'time') {
    // Positions read back from a drawing carry a little noise: days on axes spanning days or more.
    const span = axisSpan(axis);
    const t = span >= 2 * DAY_MS ? Math.round(v / DAY_MS) * DAY_MS : v;
    const d = new Date(t);
    if (Number.isFinite(d.getTime())) {
      const iso = d.toISOString();
      return span >= 2 * DAY_MS || iso.endsWith('T00:00:00.000Z') ? iso.slice(0, 10) : iso.slice(0, 16).replace('T', ' ');
    }
  }
  return fmt(v, 4);
}

/** A domain end rounded to a thousandth of the axis span (fitted ends carry noise: 0.00026 on a 0–180 axis is 0). */
function roundToSpan(v: number, span: number): number {
  if (!(span > 0) || !Number.isFinite(v)) return v;
  const step = 10 ** (Math.floor(Math.log10(span)) - 3);
  const r = Math.round(v / step) * step;
  return Number(r.toPrecision(12));
}

function axisSentence(name: string, axis: Axis | null, title: string | null): string | null {
  if (!axis) return null;
  const t = title ? ` (${title})` : '';
  if (axis.scale === 'band') {
    const cats = (axis.bands?.map((b) => b.name) ?? axis.domain.map(String)).map(clean).filter((s) => s !== '');
    if (cats.length === 0) return null;
    return `${name} axis${t}: ${cats.length} categor${cats.length === 1 ? 'y' : 'ies'}, ${list(cats)}.`;
  }
  const nums = axis.domain.filter((d): d is number => typeof d === 'number' && Number.isFinite(d));
  if (nums.length < 2) return `${name} axis${t}: ${axis.scale} scale.`;
  const lo = roundToSpan(Math.min(...nums), Math.max(...nums) - Math.min(...nums));
  const hi = roundToSpan(Math.max(...nums), Math.max(...nums) - Math.min(...nums));
  const scale = axis.scale === 'log' ? 'logarithmic scale' : axis.scale === 'time' ? 'time' : 'linear scale';
  return `${name} axis${t}: ${scale} from ${valueText(axis, lo)} to ${valueText(axis, hi)}.`;
}

/** Axis titles by position: rotated ones or those left/right of the plot belong to y, the others to x. */
function axisTitles(chart: Chart): { x: string | null; y: string | null } {
  const p = chart.plotArea;
  let x: string | null = null;
  let y: string | null = null;
  for (const t of textsWithRole(chart, 'label/axis-title')) {
    const vertical = Math.abs(Math.abs(t.rotation) - 90) < 10;
    const cx = t.bbox.x + t.bbox.width / 2;
    const beside = p !== null && (cx < p.x || cx > p.x + p.width) && !(t.bbox.y > p.y + p.height);
    if ((vertical || beside) && y === null) y = clean(t.content);
    else if (!vertical && x === null) x = clean(t.content);
  }
  return { x, y };
}

function seriesLabel(s: Series, k: number): string {
  return s.name ? `"${clean(s.name)}"` : s.colorHex ? `Series ${k + 1} (${s.colorHex})` : `Series ${k + 1}`;
}

/** A legend entry's name for a colour, when the legend shows that colour. */
function legendNameFor(chart: Chart, c: Rgba | null): string | null {
  if (!c) return null;
  const same = (a: Rgba, b: Rgba): boolean => Math.max(Math.abs(a.r - b.r), Math.abs(a.g - b.g), Math.abs(a.b - b.b)) <= 1.5 / 255;
  const e = chart.legend.find((l) => l.color && l.name && same(l.color, c));
  return e?.name ? clean(e.name) : null;
}

function pointName(chart: Chart, p: DataPoint, valueAxis: 'x' | 'y'): string {
  const catAxis = valueAxis === 'y' ? chart.axes.x : chart.axes.y;
  return valueText(catAxis, p.x);
}

function seriesSentence(chart: Chart, s0: Series, k: number): string | null {
  const s = s0.name ? s0 : { ...s0, name: legendNameFor(chart, s0.color) };
  const pts = s.points.filter((p) => Number.isFinite(p.y));
  if (pts.length === 0) return null;
  const valueAxisName = chart.orientation === 'horizontal' ? 'x' : 'y';
  const valueAxis = s.axis === 'y2' ? chart.axes.y2 : chart.axes[valueAxisName];
  let min = pts[0]!;
  let max = pts[0]!;
  for (const p of pts) {
    if (p.y < min.y) min = p;
    if (p.y > max.y) max = p;
  }
  const at = (p: DataPoint): string => (p.x === null ? '' : ` at ${pointName(chart, p, valueAxisName)}`);
  const n = `${pts.length} value${pts.length === 1 ? '' : 's'}`;
  if (pts.length === 1) return `${seriesLabel(s, k)}: ${valueText(valueAxis, min.y)}${at(min)}.`;
  return `${seriesLabel(s, k)}: ${n} from ${valueText(valueAxis, min.y)}${at(min)} to ${valueText(valueAxis, max.y)}${at(max)}.`;
}

export function describeChart(chart: Chart): ChartDescription {
  const kind = KIND_WORD[chart.kind] ?? 'Chart';
  const shownTitle = textsWithRole(chart, 'label/title')[0];
  const titleText = shownTitle ? clean(shownTitle.content) : null;
  const names = chart.series.map((s) => (s.name ? clean(s.name) : legendNameFor(chart, s.color))).filter((s): s is string => s !== null && s !== '');
  const titles = axisTitles(chart);
  let title: string;
  if (titleText) title = titleText;
  else if (names.length > 0 && names.length <= 3) title = `${kind} of ${list(names)}`;
  else if (titles.y && titles.x) title = `${kind} of ${titles.y} by ${titles.x}`;
  else title = kind;

  const sentences: string[] = [];
  if (chart.pie && chart.pie.wedges.length > 0) {
    const ws = [...chart.pie.wedges].sort((a, b) => a.start - b.start);
    const basis = chart.pie.shareBasis === 'radius' ? ' (shares of radial length)' : '';
    const nameOf = (w: (typeof ws)[number], i: number): string => (w.label ? clean(w.label) : legendNameFor(chart, w.color) ?? `wedge ${i + 1}`);
    const parts = ws.map((w, i) => `${nameOf(w, i)} ${percent(w.share)}`);
    sentences.push(`${kind} with ${ws.length} wedge${ws.length === 1 ? '' : 's'}${basis}: ${list(parts)}.`);
    const k = ws.reduce((best, w, i) => (w.share > ws[best]!.share ? i : best), 0);
    sentences.push(`Largest: ${nameOf(ws[k]!, k)}, ${percent(ws[k]!.share)}.`);
  } else if (chart.kind === 'heatmap') {
    sentences.push(`${kind}.`);
    for (const [name, axis, t] of [['Horizontal', chart.axes.x, titles.x], ['Vertical', chart.axes.y, titles.y]] as const) {
      const s = axisSentence(name, axis, t);
      if (s) sentences.push(s);
    }
    const values = chart.series.flatMap((s) => s.points.map((p) => p.value)).filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
    if (values.length > 0) {
      sentences.push(`${values.length} cells with values from ${fmt(Math.min(...values), 4)} to ${fmt(Math.max(...values), 4)}.`);
    } else {
      const cells = chart.roles.filter((r) => r.sub === 'mark/cell').length;
      if (cells > 0) sentences.push(`${cells} coloured cells.`);
    }
  } else {
    const orient = chart.orientation === 'horizontal' ? ' with horizontal bars' : '';
    sentences.push(`${kind}${chart.kind.includes('bar') ? orient : ''}${chart.series.length > 1 ? ` with ${chart.series.length} series` : ''}.`);
    const xs = axisSentence('Horizontal', chart.axes.x, titles.x);
    const ys = axisSentence('Vertical', chart.axes.y, titles.y);
    if (xs) sentences.push(xs);
    if (ys) sentences.push(ys);
    const y2 = axisSentence('Right vertical', chart.axes.y2, null);
    if (y2) sentences.push(y2);
    const shown = chart.series.slice(0, MAX_LISTED);
    shown.forEach((s, k) => {
      const t = seriesSentence(chart, s, k);
      if (t) sentences.push(t);
    });
    if (chart.series.length > shown.length) sentences.push(`And ${chart.series.length - shown.length} more series.`);
  }
  return { title, description: sentences.join(' ') };
}
