/**
 * How much a pie's drawing departs from its data, per wedge:
 *
 * - true share: the data share (tilted pies: the un-projected angle share);
 * - drawn angle share: the wedge's angle as measured on the page around the
 *   drawn centre (the ellipse centre for tilted pies), over the full turn
 *   drawn — what a reader judging angles sees;
 * - apparent share: the wedge's visible top-face area plus the visible area
 *   of its side walls, over the total visible area — what a reader judging
 *   areas sees (walls nearer the viewer are visible, farther ones hidden).
 *
 * The worst ratio is the apparent/true ratio farthest from 1 (in log terms).
 * For a flat pie drawn in place both ratios are 1 up to measurement error;
 * for roses the apparent share follows r² while the data follow r.
 */
import type { PieInfo } from '../../classify/chart.js';
import type { ShapeItem } from '../../read/scene.js';
import { rectifierFor, type Rectifier } from './rectify-ellipse.js';
import { visibleAreas, type PaintedOutline } from './visible-area.js';

export interface WedgeDistortion {
  item: number;
  trueShare: number;
  drawnAngleShare: number;
  apparentShare: number;
  /** apparentShare / trueShare (Infinity when the true share is 0 and the wedge is visible). */
  ratio: number;
  /** drawnAngleShare / trueShare. */
  angleRatio: number;
}

export interface ProjectionDistortion {
  wedges: WedgeDistortion[];
  /** Apparent/true ratio farthest from 1 (log scale), and the wedge it belongs to. */
  worstRatio: number;
  worstItem: number | null;
  /** Drawn-angle/true ratio farthest from 1. */
  worstAngleRatio: number;
  maxRatio: number;
  minRatio: number;
}

export interface DistortionOptions {
  /** Rows of the scanline area measurement (default 1000). */
  rows?: number;
}

function compass(dx: number, dy: number): number {
  const a = Math.atan2(dx, -dy);
  return a < 0 ? a + 2 * Math.PI : a;
}

/** The page angle a wedge covers around (ex, ey), from its un-projected end points. */
function drawnAngle(rect: Rectifier, start: number, end: number, ex: number, ey: number): number {
  const sweep = end - start;
  if (sweep >= 2 * Math.PI - 1e-9) return 2 * Math.PI;
  // Walk the un-projected arc in small steps and add up the page angle swept around (ex, ey).
  const steps = Math.max(8, Math.ceil(sweep / (Math.PI / 90)));
  let total = 0;
  let prev: [number, number] | null = null;
  for (let k = 0; k <= steps; k++) {
    const t = start + (sweep * k) / steps;
    const p = rect.inverse(rect.cx + rect.radius * Math.sin(t), rect.cy - rect.radius * Math.cos(t));
    if (!p) return NaN;
    if (prev) {
      const ax = prev[0] - ex;
      const ay = prev[1] - ey;
      const bx = p[0] - ex;
      const by = p[1] - ey;
      total += Math.atan2(ax * by - ay * bx, ax * bx + ay * by);
    }
    prev = p;
  }
  return Math.abs(total);
}

/**
 * Per-wedge true, drawn-angle and apparent shares of a detected pie. `shapes`
 * must include the wedge and wall items (looked up by scene index). Throws
 * Error when an item of the pie is missing from `shapes`.
 */
export function measureProjectionDistortion(pie: PieInfo, shapes: readonly ShapeItem[], options: DistortionOptions = {}): ProjectionDistortion {
  const byIndex = new Map(shapes.map((s) => [s.index, s] as const));
  const need = (i: number): ShapeItem => {
    const s = byIndex.get(i);
    if (!s) throw new Error(`measureProjectionDistortion: item ${i} of the pie is not among the shapes given`);
    return s;
  };
  const n = pie.wedges.length;
  if (n === 0) return { wedges: [], worstRatio: 1, worstItem: null, worstAngleRatio: 1, maxRatio: 1, minRatio: 1 };

  // Drawn angles.
  let rect: Rectifier | null = null;
  if (pie.ellipse) {
    const e = pie.ellipse;
    rect = rectifierFor({ cx: e.cx, cy: e.cy, rx: e.rx, ry: e.ry, angle: e.angle }, pie.cx, pie.cy);
  }
  const drawn = pie.wedges.map((w) => {
    if (!rect || !pie.ellipse) return w.end - w.start;
    const a = drawnAngle(rect, w.start, w.end, pie.ellipse.cx, pie.ellipse.cy);
    return Number.isFinite(a) ? a : w.end - w.start;
  });
  const drawnTotal = drawn.reduce((s, a) => s + a, 0);

  // Visible areas: wedges and walls in paint order.
  const owner = new Map<number, number>();
  pie.wedges.forEach((w, k) => {
    owner.set(w.item, k);
    for (const wall of w.walls) owner.set(wall, k);
  });
  const items = [...owner.keys()].sort((a, b) => a - b);
  const layers: PaintedOutline[] = items.map((i) => ({ polylines: need(i).polylines, owner: owner.get(i)! }));
  const areas = visibleAreas(layers, options.rows ?? 1000);
  let areaTotal = 0;
  for (let k = 0; k < n; k++) areaTotal += areas.get(k) ?? 0;

  const wedges: WedgeDistortion[] = pie.wedges.map((w, k) => {
    const trueShare = w.share;
    const drawnAngleShare = drawnTotal > 0 ? drawn[k]! / drawnTotal : 0;
    const apparentShare = areaTotal > 0 ? (areas.get(k) ?? 0) / areaTotal : 0;
    return {
      item: w.item,
      trueShare,
      drawnAngleShare,
      apparentShare,
      ratio: ratioOf(apparentShare, trueShare),
      angleRatio: ratioOf(drawnAngleShare, trueShare),
    };
  });
  const worst = farthest(wedges.map((w) => w.ratio));
  const worstAngle = farthest(wedges.map((w) => w.angleRatio));
  const finite = wedges.map((w) => w.ratio).filter((r) => Number.isFinite(r));
  return {
    wedges,
    worstRatio: worst.value,
    worstItem: worst.index >= 0 ? wedges[worst.index]!.item : null,
    worstAngleRatio: worstAngle.value,
    maxRatio: finite.length ? Math.max(...finite) : 1,
    minRatio: finite.length ? Math.min(...finite) : 1,
  };
}

function ratioOf(a: number, b: number): number {
  if (b > 0) return a / b;
  return a > 0 ? Infinity : 1;
}

function farthest(ratios: number[]): { value: number; index: number } {
  let index = -1;
  let dev = -1;
  ratios.forEach((r, i) => {
    const d = r > 0 ? Math.abs(Math.log(r)) : Infinity;
    if (d > dev) {
      dev = d;
      index = i;
    }
  });
  return { value: index >= 0 ? ratios[index]! : 1, index };
}
