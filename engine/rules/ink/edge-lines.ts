/**
 * Straight horizontal and vertical strokes of guide items, for the rules
 * that look at the edges of the plot area (frame) and at tick marks.
 */
import type { Chart } from '../../classify/chart.js';
import type { Rgba } from '../../color/types.js';
import type { ShapeItem } from '../../read/scene.js';

export interface AxisSegment {
  item: number;
  orientation: 'h' | 'v';
  /** The fixed coordinate (y for horizontal, x for vertical). */
  at: number;
  from: number;
  to: number;
  width: number;
  color: Rgba;
}

/** The painted colour and width of a shape's line-like part: its stroke, or the fill of a thin rectangle. */
export function lineStyle(it: ShapeItem): { color: Rgba; width: number } | null {
  if (it.stroke.kind !== 'none' && it.stroke.color && it.strokeWidth > 0 && it.stroke.opacity > 0) return { color: it.stroke.color, width: it.strokeWidth };
  if (it.fill.kind !== 'none' && it.fill.color && it.fill.opacity > 0 && it.rect) return { color: it.fill.color, width: Math.min(it.rect.width, it.rect.height) };
  return null;
}

/**
 * Axis-aligned segments an item draws: the straight edges of its outline
 * when stroked (closing edges included), or the centre line of a filled
 * rectangle at most `thinMax` thick.
 */
export function axisSegments(chart: Chart, index: number, thinMax: number): AxisSegment[] {
  const it = chart.scene.items[index];
  if (!it || it.kind !== 'shape') return [];
  const out: AxisSegment[] = [];
  const stroked = it.stroke.kind !== 'none' && it.stroke.color && it.strokeWidth > 0 && it.stroke.opacity > 0;
  if (stroked) {
    const color = it.stroke.color!;
    it.polylines.forEach((pl, k) => {
      const m = pl.length / 2;
      const segs = it.closed[k] && m > 2 ? m : m - 1;
      for (let s = 0; s < segs; s++) {
        const e = s + 1 === m ? 0 : s + 1;
        const ax = pl[2 * s]!;
        const ay = pl[2 * s + 1]!;
        const bx = pl[2 * e]!;
        const by = pl[2 * e + 1]!;
        const dx = Math.abs(bx - ax);
        const dy = Math.abs(by - ay);
        if (dx === 0 && dy === 0) continue;
        if (dy <= 0.01 * dx) out.push({ item: index, orientation: 'h', at: (ay + by) / 2, from: Math.min(ax, bx), to: Math.max(ax, bx), width: it.strokeWidth, color });
        else if (dx <= 0.01 * dy) out.push({ item: index, orientation: 'v', at: (ax + bx) / 2, from: Math.min(ay, by), to: Math.max(ay, by), width: it.strokeWidth, color });
      }
    });
  } else if (it.fill.kind !== 'none' && it.fill.color && it.fill.opacity > 0 && it.rect) {
    const r = it.rect;
    if (r.height <= thinMax && r.width > r.height) out.push({ item: index, orientation: 'h', at: r.y + r.height / 2, from: r.x, to: r.x + r.width, width: r.height, color: it.fill.color });
    else if (r.width <= thinMax && r.height > r.width) out.push({ item: index, orientation: 'v', at: r.x + r.width / 2, from: r.y, to: r.y + r.height, width: r.width, color: it.fill.color });
  }
  return out;
}

/** Length of the union of intervals, clipped to [lo, hi]. */
export function coveredLength(intervals: readonly [number, number][], lo: number, hi: number): number {
  const xs = intervals
    .map(([a, b]) => [Math.max(lo, Math.min(a, b)), Math.min(hi, Math.max(a, b))] as [number, number])
    .filter(([a, b]) => b > a)
    .sort((p, q) => p[0] - q[0]);
  let total = 0;
  let curA = -Infinity;
  let curB = -Infinity;
  for (const [a, b] of xs) {
    if (a > curB) {
      if (curB > curA) total += curB - curA;
      curA = a;
      curB = b;
    } else curB = Math.max(curB, b);
  }
  if (curB > curA) total += curB - curA;
  return total;
}

/**
 * Gridlines that cross the plot: guide/grid items with a straight segment at
 * least half as long as the plot area is wide (horizontal) or tall (vertical).
 */
export function crossingGridSegments(chart: Chart): AxisSegment[] {
  const pa = chart.plotArea;
  const out: AxisSegment[] = [];
  chart.roles.forEach((r, i) => {
    if (r.sub !== 'guide/grid') return;
    for (const s of axisSegments(chart, i, Infinity)) {
      const span = s.orientation === 'h' ? (pa?.width ?? 0) : (pa?.height ?? 0);
      if (s.to - s.from >= 0.5 * span) out.push(s);
    }
  });
  return out;
}
