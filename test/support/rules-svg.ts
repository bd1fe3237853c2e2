/**
 * Small SVG charts written from numbers, for rule tests: each builder draws
 * what a plotting library would (marks, axis lines, ticks and tick labels)
 * so the whole pipeline — read, classify, measure, check — runs on them.
 */
import { analyzeSvg, type Analysis } from '../../engine/audit/analyze.js';
import { runRules } from '../../engine/audit/audit-file.js';
import { DEFAULT_CONFIG } from '../../engine/config/config.js';
import { detectPie } from '../../engine/classify/pie/detect-wedges.js';
import { measureChart, type Measures } from '../../engine/measure/measures.js';
import type { ShapeItem, TextItem } from '../../engine/read/scene.js';
import type { Rule, RuleFinding } from '../../engine/rules/rule.js';
import type { Finding } from '../../engine/report/types.js';

export interface Wrap {
  title?: string;
  desc?: string;
  ariaLabel?: string;
  width?: number;
  height?: number;
}

export function svg(body: string, w: Wrap = {}): string {
  const width = w.width ?? 500;
  const height = w.height ?? 380;
  const aria = w.ariaLabel ? ` aria-label="${w.ariaLabel}"` : '';
  const title = w.title ? `<title>${w.title}</title>` : '';
  const desc = w.desc ? `<desc>${w.desc}</desc>` : '';
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}"${aria}>${title}${desc}<rect width="${width}" height="${height}" fill="#ffffff"/>${body}</svg>`;
}

/** Plot area of the builders: x 60..460, y 40..340. */
const X0 = 60;
const X1 = 460;
const Y0 = 40;
const Y1 = 340;

function valueAxis(lo: number, hi: number, ticks: number[], side: 'left' | 'right' | 'bottom' = 'left'): string {
  const out: string[] = [];
  if (side === 'bottom') {
    const x = (v: number) => X0 + ((v - lo) / (hi - lo)) * (X1 - X0);
    out.push(`<line x1="${X0}" x2="${X1}" y1="${Y1}" y2="${Y1}" stroke="#000000"/>`);
    for (const t of ticks) {
      out.push(`<line x1="${x(t)}" x2="${x(t)}" y1="${Y1}" y2="${Y1 + 5}" stroke="#000000"/>`);
      out.push(`<text x="${x(t)}" y="${Y1 + 18}" text-anchor="middle" font-family="DejaVu Sans" font-size="12">${t}</text>`);
    }
    return out.join('');
  }
  const y = (v: number) => Y1 - ((v - lo) / (hi - lo)) * (Y1 - Y0);
  const ax = side === 'left' ? X0 : X1;
  const dir = side === 'left' ? -1 : 1;
  out.push(`<line x1="${ax}" x2="${ax}" y1="${Y0}" y2="${Y1}" stroke="#000000"/>`);
  for (const t of ticks) {
    out.push(`<line x1="${ax}" x2="${ax + 5 * dir}" y1="${y(t)}" y2="${y(t)}" stroke="#000000"/>`);
    out.push(`<text x="${ax + 8 * dir}" y="${y(t) + 4}" text-anchor="${side === 'left' ? 'end' : 'start'}" font-family="DejaVu Sans" font-size="12">${t}</text>`);
  }
  return out.join('');
}

function categoryAxis(names: string[], side: 'bottom' | 'left'): string {
  const out: string[] = [];
  if (side === 'bottom') {
    out.push(`<line x1="${X0}" x2="${X1}" y1="${Y1}" y2="${Y1}" stroke="#000000"/>`);
    const bw = (X1 - X0) / names.length;
    names.forEach((n, i) => out.push(`<text x="${X0 + i * bw + bw / 2}" y="${Y1 + 18}" text-anchor="middle" font-family="DejaVu Sans" font-size="12">${n}</text>`));
  } else {
    out.push(`<line x1="${X0}" x2="${X0}" y1="${Y0}" y2="${Y1}" stroke="#000000"/>`);
    const bh = (Y1 - Y0) / names.length;
    names.forEach((n, i) => out.push(`<text x="${X0 - 8}" y="${Y0 + i * bh + bh / 2 + 4}" text-anchor="end" font-family="DejaVu Sans" font-size="12">${n}</text>`));
  }
  return out.join('');
}

export interface BarOptions {
  /** One array of values per series (grouped side by side, or stacked). */
  series: number[][];
  colors: string[];
  names?: string[];
  /** Value axis range and ticks. */
  lo: number;
  hi: number;
  ticks: number[];
  /** Value where bars start (default: lo, the bottom of the axis). */
  base?: number;
  horizontal?: boolean;
  stacked?: boolean;
  wrap?: Wrap;
}

/** A bar chart. Bars grow from `base` (default the axis minimum, as a truncating library would draw). */
export function barChart(o: BarOptions): string {
  const n = o.series[0]!.length;
  const cats = Array.from({ length: n }, (_, i) => `C${i + 1}`);
  const base = o.base ?? o.lo;
  const span = o.horizontal ? X1 - X0 : Y1 - Y0;
  const pos = (v: number) => ((v - o.lo) / (o.hi - o.lo)) * span;
  const band = span === 0 ? 0 : (o.horizontal ? Y1 - Y0 : X1 - X0) / n;
  const k = o.stacked ? 1 : o.series.length;
  const bw = (band * 0.8) / k;
  const marks: string[] = [];
  const acc = new Array<number>(n).fill(base);
  o.series.forEach((vals, s) => {
    vals.forEach((v, i) => {
      const from = o.stacked ? acc[i]! : base;
      const to = o.stacked ? acc[i]! + (v - (s === 0 ? base : 0)) : v;
      if (o.stacked) acc[i] = to;
      const a = pos(Math.min(from, to));
      const b = pos(Math.max(from, to));
      const c = band * i + band * 0.1 + (o.stacked ? 0 : s * bw);
      const rect = o.horizontal
        ? `<rect x="${X0 + a}" y="${Y0 + c}" width="${b - a}" height="${bw}" fill="${o.colors[s]}"/>`
        : `<rect x="${X0 + c}" y="${Y1 - b}" width="${bw}" height="${b - a}" fill="${o.colors[s]}"/>`;
      marks.push(rect);
    });
  });
  const axes = o.horizontal ? valueAxis(o.lo, o.hi, o.ticks, 'bottom') + categoryAxis(cats, 'left') : valueAxis(o.lo, o.hi, o.ticks) + categoryAxis(cats, 'bottom');
  return svg(marks.join('') + axes + legend(o.names, o.colors, 'rect'), o.wrap);
}

function legend(names: string[] | undefined, colors: string[], kind: 'rect' | 'line'): string {
  if (!names) return '';
  return names
    .map((n, i) => {
      const y = 50 + i * 18;
      const sw = kind === 'rect' ? `<rect x="472" y="${y - 9}" width="10" height="10" fill="${colors[i]}"/>` : `<line x1="468" x2="484" y1="${y - 4}" y2="${y - 4}" stroke="${colors[i]}" stroke-width="2"/>`;
      return `${sw}<text x="488" y="${y}" font-family="DejaVu Sans" font-size="10">${n}</text>`;
    })
    .join('');
}

export interface LineOptions {
  series: number[][];
  colors: string[];
  names?: string[];
  lo: number;
  hi: number;
  ticks: number[];
  /** Series drawn against a second value axis on the right. */
  right?: { series: number[][]; colors: string[]; lo: number; hi: number; ticks: number[] };
  strokeWidth?: number;
  /** Fill each series down to the bottom of the axis (an area chart). */
  area?: boolean;
  wrap?: Wrap;
}

export function lineChart(o: LineOptions): string {
  const n = o.series[0]!.length;
  const x = (i: number) => X0 + 20 + (i * (X1 - X0 - 40)) / (n - 1);
  const out: string[] = [];
  const draw = (vals: number[], color: string, lo: number, hi: number) => {
    const y = (v: number) => Y1 - ((v - lo) / (hi - lo)) * (Y1 - Y0);
    const pts = vals.map((v, i) => `${x(i)},${y(v)}`);
    if (o.area) out.push(`<path d="M${x(0)},${Y1} L${pts.join(' L')} L${x(n - 1)},${Y1} Z" fill="${color}"/>`);
    else out.push(`<polyline points="${pts.join(' ')}" fill="none" stroke="${color}" stroke-width="${o.strokeWidth ?? 2}"/>`);
  };
  o.series.forEach((s, i) => draw(s, o.colors[i]!, o.lo, o.hi));
  if (o.right) o.right.series.forEach((s, i) => draw(s, o.right!.colors[i]!, o.right!.lo, o.right!.hi));
  const xt = Array.from({ length: n }, (_, i) => `<line x1="${x(i)}" x2="${x(i)}" y1="${Y1}" y2="${Y1 + 5}" stroke="#000000"/><text x="${x(i)}" y="${Y1 + 18}" text-anchor="middle" font-family="DejaVu Sans" font-size="12">${i + 1}</text>`);
  out.push(`<line x1="${X0}" x2="${X1}" y1="${Y1}" y2="${Y1}" stroke="#000000"/>`, ...xt);
  out.push(valueAxis(o.lo, o.hi, o.ticks, 'left'));
  if (o.right) out.push(valueAxis(o.right.lo, o.right.hi, o.right.ticks, 'right'));
  return svg(out.join('') + legend(o.names, o.colors, o.area ? 'rect' : 'line'), { width: 560, ...o.wrap });
}

export interface PieOptions {
  shares: number[];
  colors: string[];
  /** Radius per wedge (a rose); default one radius for all. */
  radii?: number[];
  innerRadius?: number;
  /** Vertical squash of the drawing (cos of the tilt): 1 = flat. */
  squash?: number;
  /** Text drawn at each wedge's middle. */
  labels?: string[];
  wrap?: Wrap;
}

/** A pie (or donut, rose, or squashed "tilted" pie) of wedge paths, clockwise from 12 o'clock. */
export function pieChart(o: PieOptions): string {
  const cx = 250;
  const cy = 190;
  const R = 140;
  const k = o.squash ?? 1;
  const total = o.shares.reduce((s, v) => s + v, 0);
  const pt = (a: number, r: number) => `${(cx + r * Math.sin(a)).toFixed(4)},${(cy - r * Math.cos(a) * k).toFixed(4)}`;
  let a = 0;
  const out: string[] = [];
  o.shares.forEach((v, i) => {
    const sweep = (v / total) * 2 * Math.PI;
    const r = o.radii?.[i] ?? R;
    const ri = o.innerRadius ?? 0;
    const large = sweep > Math.PI ? 1 : 0;
    const outer = `A${r},${r * k} 0 ${large} 1 ${pt(a + sweep, r)}`;
    const d = ri > 0
      ? `M${pt(a, ri)} L${pt(a, r)} ${outer} L${pt(a + sweep, ri)} A${ri},${ri * k} 0 ${large} 0 ${pt(a, ri)} Z`
      : `M${cx},${cy} L${pt(a, r)} ${outer} Z`;
    out.push(`<path d="${d}" fill="${o.colors[i]}" stroke="#ffffff" stroke-width="1"/>`);
    if (o.labels) {
      const mid = a + sweep / 2;
      out.push(`<text x="${(cx + r * 0.6 * Math.sin(mid)).toFixed(2)}" y="${(cy - r * 0.6 * Math.cos(mid) * k + 4).toFixed(2)}" text-anchor="middle" font-family="DejaVu Sans" font-size="11">${o.labels[i]}</text>`);
    }
    a += sweep;
  });
  return svg(out.join(''), o.wrap);
}

/** A heatmap of `rows × cols` cells coloured from `ramp` by value, with a colour bar of the ramp at the right. */
export function heatmap(ramp: string[], values: number[][], lo: number, hi: number): string {
  const rows = values.length;
  const cols = values[0]!.length;
  const cw = 300 / cols;
  const ch = 300 / rows;
  const out: string[] = [];
  const pick = (v: number) => ramp[Math.min(ramp.length - 1, Math.max(0, Math.round(((v - lo) / (hi - lo)) * (ramp.length - 1))))]!;
  values.forEach((row, r) => row.forEach((v, c) => out.push(`<rect x="${X0 + c * cw}" y="${Y0 + r * ch}" width="${cw}" height="${ch}" fill="${pick(v)}"/>`)));
  values.forEach((_, r) => out.push(`<text x="${X0 - 6}" y="${Y0 + r * ch + ch / 2 + 4}" text-anchor="end" font-family="DejaVu Sans" font-size="11">R${r + 1}</text>`));
  values[0]!.forEach((_, c) => out.push(`<text x="${X0 + c * cw + cw / 2}" y="${Y1 + 16}" text-anchor="middle" font-family="DejaVu Sans" font-size="11">K${c + 1}</text>`));
  // Colour bar: one rect per ramp colour, low at the bottom.
  const bh = 300 / ramp.length;
  ramp.forEach((col, i) => out.push(`<rect x="400" y="${Y1 - (i + 1) * bh}" width="20" height="${bh}" fill="${col}"/>`));
  const n = 5;
  for (let t = 0; t < n; t++) {
    const v = lo + ((hi - lo) * t) / (n - 1);
    const y = Y1 - (300 * t) / (n - 1);
    out.push(`<line x1="420" x2="425" y1="${y}" y2="${y}" stroke="#000000"/><text x="428" y="${y + 4}" font-family="DejaVu Sans" font-size="11">${v}</text>`);
  }
  return svg(out.join(''));
}

/** Read, classify and measure. */
export function understand(text: string): { analysis: Analysis; measures: Measures } {
  const analysis = analyzeSvg(text);
  return { analysis, measures: measureChart(analysis.chart) };
}

/**
 * Read and classify, with the pie taken from the pie detector directly (so
 * the pie tests do not depend on how the classifier hands it over), then measure.
 */
export function understandPie(text: string): { analysis: Analysis; measures: Measures } {
  const analysis = analyzeSvg(text);
  if (!analysis.chart.pie) {
    const shapes = analysis.scene.items.filter((i): i is ShapeItem => i.kind === 'shape' && !(i.rect && i.rect.width >= analysis.scene.viewBox.width));
    const texts = analysis.scene.items.filter((i): i is TextItem => i.kind === 'text');
    const pie = detectPie(shapes, texts);
    if (pie) {
      analysis.chart.pie = pie;
      analysis.chart.series = [];
    }
  }
  return { analysis, measures: measureChart(analysis.chart) };
}

/** One rule's findings with its default thresholds (optionally overridden). */
export function check(rule: Rule, u: { analysis: Analysis; measures: Measures }, thresholds: Record<string, number> = {}): RuleFinding[] {
  return rule.check({ chart: u.analysis.chart, measures: u.measures, thresholds: { ...rule.thresholds, ...thresholds }, severity: rule.severity });
}

/** Every rule's findings, as the audit reports them. */
export function audit(u: { analysis: Analysis; measures: Measures }): Finding[] {
  return runRules(u.analysis, u.measures, DEFAULT_CONFIG);
}
