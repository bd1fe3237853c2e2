/**
 * Text measures: for every text item its size in CSS px at the intended
 * display size, its WCAG 2.x contrast against what is behind it, the boxes of
 * its glyph ink and which of those collide; for the numeric tick labels of
 * each axis, how the column is aligned, whether its digits line up (tabular
 * figures) and which decimal precisions it mixes.
 */
import type { AxisName, Chart } from '../classify/chart.js';
import { parseTickLabel } from '../classify/scale/parse-tick-label.js';
import type { Rgba } from '../color/types.js';
import { contrastRatio } from '../color/wcag-contrast.js';
import { hasTabularDigits } from '../read/fonts/digit-widths.js';
import { parseFontStyle } from '../read/fonts/font-files.js';
import { measureText } from '../read/fonts/measure-text.js';
import type { TextItem } from '../read/scene.js';
import { glyphRunInk } from './glyph-ink.js';
import type { SurfaceIndex } from './surfaces.js';

/** Large-scale text in WCAG 2.x: at least 18 pt, or 14 pt bold (1 pt = 4/3 CSS px). */
// source: WCAG 2.2, definition "large scale (text)"; Understanding SC 1.4.3 (18 pt = 24 px, 14 pt ≈ 18.67 px)
export const LARGE_TEXT_PX = 24;
export const LARGE_BOLD_TEXT_PX = (14 * 4) / 3;
/** Weight from which text counts as bold for WCAG's large-text rule (CSS `bold`). */
export const BOLD_WEIGHT = 700;

/** A rectangle turned by the text's rotation: four corners x0, y0, ..., x3, y3 in world units, in order. */
export type Quad = [number, number, number, number, number, number, number, number];

export interface TextLabel {
  /** Scene index of the text item. */
  item: number;
  content: string;
  /** Font size in CSS px at the display size. */
  sizePx: number;
  bold: boolean;
  /** WCAG large-scale text (≥ 24 px, or ≥ 18.67 px bold). */
  large: boolean;
  /** Text colour (with its opacity as alpha) and the opaque colour behind its centre. */
  color: Rgba | null;
  behind: Rgba | null;
  /** Scene index of the topmost filled shape behind the centre (null: the page or paper). */
  behindItem: number | null;
  /** WCAG 2.x contrast ratio of the text over what is behind it (null when the text has no plain colour). */
  contrast: number | null;
  /** Box of the glyph ink in world units (rotated with the text). */
  box: Quad;
}

export interface TextCollision {
  a: number;
  b: number;
  /** Depth of the overlap along the axis that separates the boxes least, CSS px. */
  depthPx: number;
}

export type ColumnAlignment = 'right' | 'decimal' | 'left' | 'ragged';

export interface NumericColumn {
  axis: AxisName;
  /** Scene indices of the labels, top to bottom. */
  items: number[];
  labels: string[];
  alignment: ColumnAlignment;
  /** Spread (max − min) of right edges, decimal marks and left edges, CSS px (edges: of the advance boxes or of the glyph ink, whichever lines up better). */
  rightSpreadPx: number;
  decimalSpreadPx: number;
  leftSpreadPx: number;
  /** Tolerance used to call an edge aligned, CSS px. */
  tolerancePx: number;
  /** Every label's digits have one advance (the face's default figures are tabular, or `tabular-nums` is asked for). */
  tabular: boolean;
  /** Labels whose face has proportional default figures and that do not ask for `tabular-nums`. */
  proportional: number[];
  /** Some label's font was not available and was measured with a bundled stand-in. */
  substituted: boolean;
}

export interface AxisPrecision {
  axis: AxisName;
  items: number[];
  labels: string[];
  /** Digits after the decimal mark, per label. */
  decimals: number[];
  /** The distinct precisions, ascending. */
  precisions: number[];
}

export interface TextMeasure {
  /** CSS px per world unit used for sizes. */
  pxPerUnit: number;
  labels: TextLabel[];
  collisions: TextCollision[];
  columns: NumericColumn[];
  precision: AxisPrecision[];
}

export interface TextMeasureOptions {
  /** Intended display width in CSS px (null: the figure's own size). */
  displayWidth?: number | null;
}

/** CSS px per world unit at the intended display size. */
export function displayScale(chart: Chart, displayWidth: number | null | undefined): number {
  const s = chart.scene;
  if (displayWidth !== null && displayWidth !== undefined) {
    if (!(typeof displayWidth === 'number' && Number.isFinite(displayWidth) && displayWidth > 0)) {
      throw new RangeError(`displayWidth must be a positive number of CSS px, got ${String(displayWidth)}`);
    }
    if (s.viewBox.width > 0) return displayWidth / s.viewBox.width;
  }
  return s.pxPerUnit;
}

/** The glyph-ink box of a text item in world units. */
export function textQuad(it: TextItem): Quad {
  let ink;
  try {
    ink = glyphRunInk(it.content, it.fontFamily, it.fontWeight, it.fontStyle);
  } catch {
    ink = { left: 0, right: it.fontSize > 0 ? it.width / it.fontSize : 0, top: 0.73, bottom: 0, advance: it.fontSize > 0 ? it.width / it.fontSize : 0, area: 0 };
  }
  const fs = it.fontSize;
  const k = ink.advance > 0 ? it.width / ink.advance : fs;
  const r = (it.rotation * Math.PI) / 180;
  const ux = Math.cos(r);
  const uy = Math.sin(r);
  const vx = -uy;
  const vy = ux;
  const offset = it.anchor === 'middle' ? it.width / 2 : it.anchor === 'end' ? it.width : 0;
  const sx = it.x - ux * offset;
  const sy = it.y - uy * offset;
  const a0 = ink.left * k;
  const a1 = ink.right * k;
  const b0 = -ink.top * fs;
  const b1 = -ink.bottom * fs;
  const pt = (a: number, b: number): [number, number] => [sx + ux * a + vx * b, sy + uy * a + vy * b];
  return [...pt(a0, b0), ...pt(a1, b0), ...pt(a1, b1), ...pt(a0, b1)] as Quad;
}

function quadBounds(q: Quad): { x0: number; y0: number; x1: number; y1: number } {
  return {
    x0: Math.min(q[0], q[2], q[4], q[6]),
    y0: Math.min(q[1], q[3], q[5], q[7]),
    x1: Math.max(q[0], q[2], q[4], q[6]),
    y1: Math.max(q[1], q[3], q[5], q[7]),
  };
}

/** Smallest overlap of two convex quads over their edge normals (separating axis test); ≤ 0 when apart. */
export function quadOverlapDepth(p: Quad, q: Quad): number {
  let depth = Infinity;
  for (const quad of [p, q]) {
    for (let i = 0; i < 4; i++) {
      const j = (i + 1) % 4;
      let nx = -(quad[2 * j + 1]! - quad[2 * i + 1]!);
      let ny = quad[2 * j]! - quad[2 * i]!;
      const len = Math.hypot(nx, ny);
      if (len === 0) continue;
      nx /= len;
      ny /= len;
      let pmin = Infinity;
      let pmax = -Infinity;
      let qmin = Infinity;
      let qmax = -Infinity;
      for (let k = 0; k < 4; k++) {
        const a = p[2 * k]! * nx + p[2 * k + 1]! * ny;
        const b = q[2 * k]! * nx + q[2 * k + 1]! * ny;
        pmin = Math.min(pmin, a);
        pmax = Math.max(pmax, a);
        qmin = Math.min(qmin, b);
        qmax = Math.max(qmax, b);
      }
      const d = Math.min(pmax, qmax) - Math.max(pmin, qmin);
      if (d < depth) depth = d;
      if (depth <= 0) return depth;
    }
  }
  return depth === Infinity ? 0 : depth;
}

/**
 * Pairs of text boxes that overlap deeper than `minDepth` (world units).
 * Boxes go into a uniform grid of cells about one median box wide; a pair is
 * tested in the first cell both share, so the work grows with the number of
 * boxes, not its square. The same text drawn twice at the same place (a halo
 * under the letters) is not a collision.
 */
export function findCollisions(items: readonly TextItem[], quads: readonly Quad[], minDepth: number): { a: number; b: number; depth: number }[] {
  const n = quads.length;
  if (n < 2) return [];
  const bounds = quads.map(quadBounds);
  const sizes = bounds.map((b) => Math.max(b.x1 - b.x0, b.y1 - b.y0)).filter((v) => v > 0).sort((a, b) => a - b);
  const cell = Math.max(sizes[Math.floor(sizes.length / 2)] ?? 1, 1e-6);
  const grid = new Map<string, number[]>();
  const MAX_SPAN = 64;
  bounds.forEach((b, i) => {
    if (!Number.isFinite(b.x0 + b.y0 + b.x1 + b.y1)) return;
    const cx0 = Math.floor(b.x0 / cell);
    const cy0 = Math.floor(b.y0 / cell);
    const cx1 = Math.min(Math.floor(b.x1 / cell), cx0 + MAX_SPAN);
    const cy1 = Math.min(Math.floor(b.y1 / cell), cy0 + MAX_SPAN);
    for (let cy = cy0; cy <= cy1; cy++) {
      for (let cx = cx0; cx <= cx1; cx++) {
        const key = `${cx},${cy}`;
        let list = grid.get(key);
        if (!list) grid.set(key, (list = []));
        list.push(i);
      }
    }
  });
  const out: { a: number; b: number; depth: number }[] = [];
  const seen = new Set<number>();
  for (const list of grid.values()) {
    for (let s = 0; s < list.length; s++) {
      for (let t = s + 1; t < list.length; t++) {
        const i = list[s]!;
        const j = list[t]!;
        const key = i < j ? i * n + j : j * n + i;
        if (seen.has(key)) continue;
        const bi = bounds[i]!;
        const bj = bounds[j]!;
        if (bi.x1 < bj.x0 || bj.x1 < bi.x0 || bi.y1 < bj.y0 || bj.y1 < bi.y0) continue;
        seen.add(key);
        const ti = items[i]!;
        const tj = items[j]!;
        const tol = 0.05 * Math.min(ti.fontSize, tj.fontSize);
        if (ti.content === tj.content && Math.abs(ti.x - tj.x) <= tol && Math.abs(ti.y - tj.y) <= tol) continue;
        const d = quadOverlapDepth(quads[i]!, quads[j]!);
        if (d > minDepth) out.push({ a: Math.min(i, j), b: Math.max(i, j), depth: d });
      }
    }
  }
  out.sort((p, q) => p.a - q.a || p.b - q.b);
  return out;
}

// ---------------------------------------------------------------------------
// Numbers in labels

interface NumberParts {
  /** Characters before the decimal mark (or before the end of the integer part). */
  decimalIndex: number;
  decimals: number;
}

/**
 * Where the decimal mark of a numeric label sits and how many digits follow
 * it. `decimalComma`: the column writes decimals with a comma. Null for
 * labels that are not plain numbers (scientific notation included).
 */
export function numberParts(label: string, decimalComma: boolean): NumberParts | null {
  const text = label.trim();
  if (/\d\s*[eE][-+−]?\d|×\s*10|\^/.test(text)) return null;
  const mark = decimalComma ? ',' : '.';
  const re = decimalComma ? /\d[\d. \u00a0\u202f]*(?:,(\d+))?/ : /\d[\d, \u00a0\u202f]*(?:\.(\d+))?/;
  const m = re.exec(text);
  if (!m) return null;
  const frac = m[1] ?? '';
  const start = m.index;
  const whole = m[0];
  const markAt = frac ? whole.lastIndexOf(mark) : whole.replace(/[\s\u00a0\u202f]+$/, '').length;
  return { decimalIndex: start + markAt, decimals: frac.length };
}

function isNumericLabel(text: string): boolean {
  const p = parseTickLabel(text);
  return p !== null && p.kind === 'number';
}

/** Whether a set of labels writes decimals with a comma ("0,5") rather than a point. */
function usesDecimalComma(labels: readonly string[]): boolean {
  const commaDecimal = labels.some((l) => /\d,\d{1,2}(?!\d)/.test(l) || /\d,\d{4,}/.test(l));
  const pointDecimal = labels.some((l) => /\d\.\d/.test(l));
  return commaDecimal && !pointDecimal;
}

function spread(values: readonly number[]): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return values.length > 0 ? hi - lo : 0;
}

function tickLabelItems(chart: Chart, axis: AxisName): TextItem[] {
  const a = chart.axes[axis];
  if (!a) return [];
  const out: TextItem[] = [];
  const seen = new Set<number>();
  for (const t of a.ticks) {
    if (t.label === null || seen.has(t.label)) continue;
    const it = chart.scene.items[t.label];
    if (it?.kind !== 'text') continue;
    seen.add(t.label);
    out.push(it);
  }
  return out;
}

function fontOf(it: TextItem) {
  return { family: it.fontFamily, size: it.fontSize, weight: it.fontWeight, style: parseFontStyle(it.fontStyle) ?? 'normal' } as const;
}

/** Minimum number of labels that make a column worth judging. */
export const MIN_COLUMN_LABELS = 3;

function measureColumn(chart: Chart, axis: AxisName, scale: number): NumericColumn | null {
  const a = chart.axes[axis];
  if (!a || a.direction !== 'vertical' || (a.scale !== 'linear' && a.scale !== 'log')) return null;
  const items = tickLabelItems(chart, axis).filter((it) => Math.abs(it.rotation) < 1 && isNumericLabel(it.content));
  if (items.length < MIN_COLUMN_LABELS) return null;
  items.sort((p, q) => p.y - q.y);
  const comma = usesDecimalComma(items.map((it) => it.content));
  const lefts: number[] = [];
  const rights: number[] = [];
  const inkLefts: number[] = [];
  const inkRights: number[] = [];
  const decimals: number[] = [];
  const proportional: number[] = [];
  let substituted = false;
  let fsMin = Infinity;
  for (const it of items) {
    const font = fontOf(it);
    // Text read back from glyph outlines: its width is the advance sum of the face (the run's own extent is approximate).
    const width = it.fromGlyphs ? measureText(it.content, font).width : it.width;
    const left = it.x - (it.anchor === 'middle' ? width / 2 : it.anchor === 'end' ? width : 0);
    lefts.push(left);
    rights.push(left + width);
    const q = quadBounds(textQuad(it.fromGlyphs ? { ...it, width } : it));
    inkLefts.push(q.x0);
    inkRights.push(q.x1);
    fsMin = Math.min(fsMin, it.fontSize);
    const parts = numberParts(it.content, comma);
    if (parts) {
      const full = measureText(it.content, font).width;
      const prefix = measureText(it.content.slice(0, parts.decimalIndex), font).width;
      const k = full > 0 ? width / full : 1;
      decimals.push(left + prefix * k);
    }
    if (!it.tabularNums && !hasTabularDigits(font)) proportional.push(it.index);
    if (it.fontSubstituted) substituted = true;
  }
  const tolerance = Math.max(0.5 / scale, 0.05 * fsMin);
  // An edge lines up when either the advance boxes or the glyph ink do (some libraries align by ink).
  const r = Math.min(spread(rights), spread(inkRights));
  const d = decimals.length === items.length ? spread(decimals) : Infinity;
  const l = Math.min(spread(lefts), spread(inkLefts));
  const alignment: ColumnAlignment = r <= tolerance ? 'right' : d <= tolerance ? 'decimal' : l <= tolerance ? 'left' : 'ragged';
  return {
    axis,
    items: items.map((it) => it.index),
    labels: items.map((it) => it.content),
    alignment,
    rightSpreadPx: r * scale,
    decimalSpreadPx: Number.isFinite(d) ? d * scale : NaN,
    leftSpreadPx: l * scale,
    tolerancePx: tolerance * scale,
    tabular: proportional.length === 0,
    proportional,
    substituted,
  };
}

function measurePrecision(chart: Chart, axis: AxisName): AxisPrecision | null {
  const a = chart.axes[axis];
  if (!a || a.scale !== 'linear') return null;
  const items = tickLabelItems(chart, axis).filter((it) => isNumericLabel(it.content));
  if (items.length < 2) return null;
  const comma = usesDecimalComma(items.map((it) => it.content));
  const kept: TextItem[] = [];
  const decimals: number[] = [];
  for (const it of items) {
    const p = numberParts(it.content, comma);
    if (!p) continue;
    kept.push(it);
    decimals.push(p.decimals);
  }
  if (kept.length < 2) return null;
  return {
    axis,
    items: kept.map((it) => it.index),
    labels: kept.map((it) => it.content),
    decimals,
    precisions: [...new Set(decimals)].sort((x, y) => x - y),
  };
}

/** Text measures of a chart. `surfaces` tells what is behind each label. */
export function measureTextLabels(chart: Chart, surfaces: SurfaceIndex, options: TextMeasureOptions = {}): TextMeasure {
  const scale = displayScale(chart, options.displayWidth);
  const labels: TextLabel[] = [];
  const texts: TextItem[] = [];
  const quads: Quad[] = [];
  for (const it of chart.scene.items) {
    if (it.kind !== 'text') continue;
    const sizePx = it.fontSize * scale;
    const bold = it.fontWeight >= BOLD_WEIGHT;
    const large = sizePx >= LARGE_TEXT_PX || (bold && sizePx >= LARGE_BOLD_TEXT_PX);
    const box = textQuad(it);
    const b = quadBounds(box);
    const cx = (b.x0 + b.x1) / 2;
    const cy = (b.y0 + b.y1) / 2;
    // A filled shape much smaller than the label (a point marker under its centre) is not its background.
    const minArea = 0.5 * Math.max(0, (b.x1 - b.x0) * (b.y1 - b.y0));
    const behind = surfaces.colorBehind(cx, cy, it.index, { minArea });
    const behindItem = surfaces.topmostBehind(cx, cy, it.index, { minArea });
    let color: Rgba | null = null;
    let contrast: number | null = null;
    if (it.fill.kind === 'color' && it.fill.color) {
      color = { ...it.fill.color, alpha: Math.min(1, Math.max(0, it.fill.opacity)) };
      contrast = contrastRatio(color, behind);
    }
    labels.push({ item: it.index, content: it.content, sizePx, bold, large, color, behind, behindItem, contrast, box });
    texts.push(it);
    quads.push(box);
  }
  const collisions = findCollisions(texts, quads, 1 / scale).map((c) => ({ a: texts[c.a]!.index, b: texts[c.b]!.index, depthPx: c.depth * scale }));
  const columns: NumericColumn[] = [];
  const precision: AxisPrecision[] = [];
  for (const axis of ['x', 'y', 'y2'] as const) {
    const c = measureColumn(chart, axis, scale);
    if (c) columns.push(c);
    const p = measurePrecision(chart, axis);
    if (p) precision.push(p);
  }
  return { pxPerUnit: scale, labels, collisions, columns, precision };
}
