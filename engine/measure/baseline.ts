/**
 * Where bars and filled areas grow from, and what that does to the picture:
 * the baseline's position and value on the value axis, the shortest and
 * tallest drawn lengths measured from it, and Tufte's lie factor between the
 * two (drawn lengths against the data values they stand for).
 *
 * Everything is read from the drawing: bars are the items classified as
 * `mark/bar` (areas: `mark/area`), cut to their clip rectangle; values are
 * read back through the value axis's fitted scale. A bar chart whose bars
 * start at zero has lengths proportional to values and a lie factor of 1.
 */
import type { Axis, Chart } from '../classify/chart.js';
import { intersection } from '../classify/boxes.js';
import { forwardAxis, invertAxis } from '../classify/find-axes.js';
import type { Box, ShapeItem } from '../read/scene.js';
import { lieFactor } from './lie-factor.js';

export interface BaselineBar {
  /** Scene indices of the items that make this bar (a stack: all its segments). */
  items: number[];
  /** Data value at the bar's far end, read through the axis. */
  value: number;
  /** Drawn length from the baseline, world units. */
  length: number;
}

export interface BaselineMeasure {
  marks: 'bar' | 'area';
  /** The value axis. */
  axis: 'x' | 'y';
  scale: 'linear' | 'log';
  /** Baseline position along the value axis, world units. */
  position: number;
  /** Data value at the baseline. */
  value: number;
  /** Position of the value 0 on the axis (null on log scales, where 0 has none). */
  zeroPosition: number | null;
  /** Distance between the baseline and the position of 0, in CSS px (Infinity on log scales). */
  offsetPx: number;
  /** Bars (or area outline vertices) compared: the shortest and the tallest drawn. */
  shortest: BaselineBar;
  tallest: BaselineBar;
  /** Drawn length ratio tallest/shortest, and the same ratio of the data values. */
  shownRatio: number;
  dataRatio: number;
  /** Lie factor between the shortest and the tallest (NaN when undefined: values of both signs or a zero value). */
  lieFactor: number;
  /** Number of bars (or area vertices) measured. */
  count: number;
}

interface Span {
  lo: number;
  hi: number;
  /** Cross-axis interval. */
  c0: number;
  c1: number;
  item: number;
}

function valueAxisOf(chart: Chart): Axis | null {
  if (chart.kind === 'area') return chart.orientation === 'horizontal' ? chart.axes.x : chart.axes.y;
  if (chart.orientation === 'vertical') return chart.axes.y;
  if (chart.orientation === 'horizontal') return chart.axes.x;
  return null;
}

/**
 * The baseline measure of a bar or area chart, or null when the chart has
 * no such marks, is drawn in 3D, has no numeric value axis with a fitted
 * scale, or fewer than two measurable bars.
 */
export function measureBaseline(chart: Chart): BaselineMeasure | null {
  const isBar = chart.kind === 'bar' || chart.kind === 'grouped-bar' || chart.kind === 'stacked-bar';
  const isArea = chart.kind === 'area';
  if (!isBar && !isArea) return null;
  // Drawn in perspective, page lengths are not the bars' lengths: nothing to measure on the page.
  if (chart.threeD) return null;
  const axis = valueAxisOf(chart);
  if (!axis || !axis.fit || !(Math.abs(axis.fit.a) > 0) || (axis.scale !== 'linear' && axis.scale !== 'log')) return null;
  const scale = axis.scale;
  const vertical = axis.direction === 'vertical';
  const sub = isBar ? 'mark/bar' : 'mark/area';
  const shapes: ShapeItem[] = [];
  chart.roles.forEach((r, i) => {
    const it = chart.scene.items[i];
    if (r.sub === sub && it && it.kind === 'shape') shapes.push(it);
  });
  const pxPerUnit = chart.scene.pxPerUnit > 0 ? chart.scene.pxPerUnit : 1;
  // Positions closer than half a CSS px (or 0.2% of the axis span drawn) are one edge.
  const axisSpan = Math.abs(axis.fit.a) * spanOfDomain(axis);
  const tol = Math.max(0.5 / pxPerUnit, 0.002 * (Number.isFinite(axisSpan) ? axisSpan : 0));
  const spans: Span[] = [];
  for (const s of shapes) {
    const b = s.clip ? intersection(s.bbox, s.clip) : s.bbox;
    if (!b) continue;
    // Strokes widen the box by half the stroke width on each side.
    const half = s.stroke.kind !== 'none' && s.stroke.opacity > 0 ? s.strokeWidth / 2 : 0;
    const lo = (vertical ? b.y : b.x) + half;
    const hi = (vertical ? b.y + b.height : b.x + b.width) - half;
    const c0 = vertical ? b.x : b.y;
    const c1 = vertical ? b.x + b.width : b.y + b.height;
    if (!(hi >= lo)) continue;
    spans.push({ lo, hi, c0, c1, item: s.index });
  }
  if (spans.length === 0) return null;
  const value = (pos: number): number => invertAxis(axis, pos);
  const zeroPosition = scale === 'linear' ? forwardAxis(axis, 0) : null;

  let base: number | null;
  let bars: BaselineBar[];
  if (isBar) {
    base = barBaseline(spans, tol, zeroPosition);
    if (base === null) return null;
    bars = barColumns(spans, base, tol, value);
  } else {
    base = areaBaseline(spans, value);
    if (base === null) return null;
    bars = areaHeights(chart, spans, base, tol, value, vertical);
  }
  bars = bars.filter((b) => b.length > tol && Number.isFinite(b.value));
  if (bars.length < 2) return null;
  let shortest = bars[0]!;
  let tallest = bars[0]!;
  for (const b of bars) {
    if (b.length < shortest.length) shortest = b;
    if (b.length > tallest.length) tallest = b;
  }
  let lf = NaN;
  const sameSign = shortest.value !== 0 && Math.sign(shortest.value) === Math.sign(tallest.value);
  if (sameSign && tallest.length > shortest.length) {
    lf = lieFactor({ shown: [shortest.length, tallest.length], data: [Math.abs(shortest.value), Math.abs(tallest.value)] });
  } else if (sameSign) {
    lf = 1;
  }
  const baseValue = value(base);
  return {
    marks: isBar ? 'bar' : 'area',
    axis: vertical ? 'y' : 'x',
    scale,
    position: base,
    value: baseValue,
    zeroPosition,
    offsetPx: zeroPosition === null ? Infinity : Math.abs(base - zeroPosition) * pxPerUnit,
    shortest,
    tallest,
    shownRatio: tallest.length / shortest.length,
    dataRatio: shortest.value !== 0 ? tallest.value / shortest.value : NaN,
    lieFactor: lf,
    count: bars.length,
  };
}

function spanOfDomain(axis: Axis): number {
  const nums = axis.domain.filter((d): d is number => typeof d === 'number' && Number.isFinite(d));
  if (nums.length < 2) return NaN;
  const lo = Math.min(...nums);
  const hi = Math.max(...nums);
  return axis.scale === 'log' ? (lo > 0 ? Math.log10(hi) - Math.log10(lo) : NaN) : hi - lo;
}

/**
 * The edge shared by the most bars. Ties (every bar the same length) go to
 * the edge nearer the position of 0. Sorted ends and a sliding window of
 * ±tol: O(n log n).
 */
function barBaseline(spans: Span[], tol: number, zeroPosition: number | null): number | null {
  const ends: { p: number; k: number }[] = [];
  spans.forEach((s, k) => ends.push({ p: s.lo, k }, { p: s.hi, k }));
  ends.sort((a, b) => a.p - b.p);
  const inWindow = new Map<number, number>();
  let lo = 0;
  let hi = 0;
  let sum = 0;
  let best: number | null = null;
  let bestCount = 0;
  for (let i = 0; i < ends.length; i++) {
    const e = ends[i]!.p;
    while (hi < ends.length && ends[hi]!.p <= e + tol) {
      const k = ends[hi]!.k;
      inWindow.set(k, (inWindow.get(k) ?? 0) + 1);
      sum += ends[hi]!.p;
      hi++;
    }
    while (ends[lo]!.p < e - tol) {
      const k = ends[lo]!.k;
      const c = inWindow.get(k)! - 1;
      if (c === 0) inWindow.delete(k);
      else inWindow.set(k, c);
      sum -= ends[lo]!.p;
      lo++;
    }
    const count = inWindow.size;
    const at = sum / (hi - lo);
    if (count > bestCount) {
      best = at;
      bestCount = count;
    } else if (count === bestCount && best !== null && zeroPosition !== null && Math.abs(at - zeroPosition) < Math.abs(best - zeroPosition) - tol) {
      best = at;
    }
  }
  return bestCount >= 2 ? best : null;
}

/**
 * Bars standing on the baseline, each with its stack (bars over the same
 * cross-axis interval on the same side): length to the stack's far end.
 */
function barColumns(spans: Span[], base: number, tol: number, value: (p: number) => number): BaselineBar[] {
  const byC0 = [...spans].sort((a, b) => a.c0 - b.c0);
  const maxWidth = spans.reduce((m, s) => Math.max(m, s.c1 - s.c0), 0);
  const firstAtOrAfter = (x: number): number => {
    let a = 0;
    let b = byC0.length;
    while (a < b) {
      const m = (a + b) >> 1;
      if (byC0[m]!.c0 < x) a = m + 1;
      else b = m;
    }
    return a;
  };
  const out: BaselineBar[] = [];
  for (const s of spans) {
    const atLo = Math.abs(s.lo - base) <= tol;
    const atHi = Math.abs(s.hi - base) <= tol;
    if (!atLo && !atHi) continue;
    if (atLo && atHi) continue; // zero-length bar
    const side = atLo ? 1 : -1;
    const width = s.c1 - s.c0;
    const column: Span[] = [];
    for (let i = firstAtOrAfter(s.c0 - maxWidth); i < byC0.length && byC0[i]!.c0 < s.c1; i++) {
      const t = byC0[i]!;
      const overlap = Math.min(s.c1, t.c1) - Math.max(s.c0, t.c0);
      if (overlap < 0.5 * Math.min(width, t.c1 - t.c0)) continue;
      if (side > 0 ? t.lo >= base - tol : t.hi <= base + tol) column.push(t);
    }
    // A column is reported once, by its bar on the baseline painted first.
    const onBase = column.filter((t) => Math.abs((side > 0 ? t.lo : t.hi) - base) <= tol);
    if (onBase.some((t) => t.item < s.item)) continue;
    const far = side > 0 ? Math.max(...column.map((t) => t.hi)) : Math.min(...column.map((t) => t.lo));
    out.push({ items: column.map((t) => t.item).sort((a, b) => a - b), value: value(far), length: Math.abs(far - base) });
  }
  return out;
}

/** Areas are filled from the edge of their common extent with the lower value. */
function areaBaseline(spans: Span[], value: (p: number) => number): number | null {
  const lo = spans.reduce((m, s) => Math.min(m, s.lo), Infinity);
  const hi = spans.reduce((m, s) => Math.max(m, s.hi), -Infinity);
  const vl = value(lo);
  const vh = value(hi);
  if (!Number.isFinite(vl) || !Number.isFinite(vh)) return null;
  return vl <= vh ? lo : hi;
}

/**
 * Heights of the areas that reach the baseline: every outline vertex off the
 * baseline, measured from it (the top edge of the lowest layer of a stack).
 */
function areaHeights(chart: Chart, spans: Span[], base: number, tol: number, value: (p: number) => number, vertical: boolean): BaselineBar[] {
  const out: BaselineBar[] = [];
  for (const s of spans) {
    if (Math.abs(s.lo - base) > tol && Math.abs(s.hi - base) > tol) continue;
    const it = chart.scene.items[s.item];
    if (!it || it.kind !== 'shape') continue;
    for (const pl of it.polylines) {
      for (let k = 0; k + 1 < pl.length; k += 2) {
        const x = pl[k]!;
        const y = pl[k + 1]!;
        if (it.clip && (x < it.clip.x || x > it.clip.x + it.clip.width || y < it.clip.y || y > it.clip.y + it.clip.height)) continue;
        const p = vertical ? y : x;
        if (Math.abs(p - base) <= tol) continue;
        out.push({ items: [s.item], value: value(p), length: Math.abs(p - base) });
      }
    }
  }
  return out;
}
