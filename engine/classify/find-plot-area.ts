/**
 * The plot area: the rectangle the data are drawn in. Evidence, strongest
 * first: a filled background rectangle behind the data, a frame (stroked
 * rectangle or four lines), the clip rectangle most shapes share, the common
 * extent of long horizontal and vertical rules, and finally the marks.
 */
import type { Box, ShapeItem } from '../read/scene.js';
import { area, centerX, centerY, containsPoint, straightLineOf, unionAll } from './boxes.js';

export interface PlotAreaEvidence {
  box: Box;
  source: 'background' | 'frame' | 'frame-lines' | 'clip' | 'rules' | 'marks';
  /** Items that draw the background or frame. */
  items: number[];
}

export function findPlotArea(shapes: readonly ShapeItem[], viewBox: Box): PlotAreaEvidence | null {
  const full = area(viewBox);
  // Short rules (tick marks, often drawn outward across the frame) say nothing about where the data are.
  const tickLength = 0.03 * Math.min(viewBox.width, viewBox.height);
  const substantial = shapes.filter((o) => {
    const l = straightLineOf(o);
    return !(l && l.length <= tickLength);
  });
  const others = (s: ShapeItem): ShapeItem[] => substantial.filter((o) => o !== s);
  const holdsMost = (b: Box, pool: ShapeItem[]): boolean => {
    if (pool.length === 0) return false;
    const eps = 0.5;
    const inside = pool.filter((o) => containsPoint(b, centerX(o.bbox), centerY(o.bbox), eps)).length;
    return inside >= Math.max(2, 0.6 * pool.length);
  };

  // 1. A filled background rectangle drawn before the data.
  for (const s of shapes) {
    if (!s.rect || s.fill.kind === 'none') continue;
    const a = area(s.rect);
    if (a < 0.1 * full || a > 0.985 * full) continue;
    const later = others(s).filter((o) => o.index > s.index);
    if (holdsMost(s.rect, later)) return { box: s.rect, source: 'background', items: [s.index] };
  }
  // 2. A stroked, unfilled rectangle around the data.
  for (const s of shapes) {
    if (!s.rect || s.fill.kind !== 'none' || s.stroke.kind === 'none') continue;
    const a = area(s.rect);
    if (a < 0.1 * full || a > 0.985 * full) continue;
    if (holdsMost(s.rect, others(s))) return { box: s.rect, source: 'frame', items: [s.index] };
  }
  // 3. Four lines forming a box (possibly one path with four sides).
  const lines = shapes.map((s) => ({ s, l: straightLineOf(s) })).filter((x) => x.l !== null);
  const hs = lines.filter((x) => x.l!.orientation === 'horizontal' && x.l!.length > 0.2 * viewBox.width);
  const vs = lines.filter((x) => x.l!.orientation === 'vertical' && x.l!.length > 0.2 * viewBox.height);
  const eps = Math.max(1.5, 0.004 * Math.max(viewBox.width, viewBox.height));
  const box4 = boxFromLines(hs.map((x) => ({ i: x.s.index, ...x.l! })), vs.map((x) => ({ i: x.s.index, ...x.l! })), eps);
  if (box4 && area(box4.box) > 0.1 * full && holdsMost(box4.box, substantial.filter((s) => !box4.items.includes(s.index)))) {
    return { box: box4.box, source: 'frame-lines', items: box4.items };
  }
  // 4. The clip rectangle shared by most shapes.
  const clipCounts = new Map<string, { box: Box; n: number }>();
  for (const s of shapes) {
    if (!s.clip) continue;
    const k = `${s.clip.x.toFixed(2)},${s.clip.y.toFixed(2)},${s.clip.width.toFixed(2)},${s.clip.height.toFixed(2)}`;
    const e = clipCounts.get(k) ?? { box: s.clip, n: 0 };
    e.n++;
    clipCounts.set(k, e);
  }
  const clips = [...clipCounts.values()].filter((c) => area(c.box) >= 0.1 * full && area(c.box) < 0.97 * full).sort((a, b) => b.n - a.n);
  if (clips[0] && clips[0].n >= 2) return { box: clips[0].box, source: 'clip', items: [] };
  // 5. Long rules: gridlines and axis lines share extents.
  const hx = commonExtent(hs.map((x) => [Math.min(x.l!.x0, x.l!.x1), Math.max(x.l!.x0, x.l!.x1)]), eps);
  const vy = commonExtent(vs.map((x) => [Math.min(x.l!.y0, x.l!.y1), Math.max(x.l!.y0, x.l!.y1)]), eps);
  if (hx && vy) return { box: { x: hx[0], y: vy[0], width: hx[1] - hx[0], height: vy[1] - vy[0] }, source: 'rules', items: [] };
  if (hx || vy) {
    const ys = hs.map((x) => x.l!.y0);
    const xs = vs.map((x) => x.l!.x0);
    const marks = unionAll(shapes.filter((s) => !straightLineOf(s)).map((s) => s.bbox));
    const x0 = hx ? hx[0] : Math.min(...xs, marks?.x ?? Infinity);
    const x1 = hx ? hx[1] : Math.max(...xs, marks ? marks.x + marks.width : -Infinity);
    const y0 = vy ? vy[0] : Math.min(...ys, marks?.y ?? Infinity);
    const y1 = vy ? vy[1] : Math.max(...ys, marks ? marks.y + marks.height : -Infinity);
    if ([x0, x1, y0, y1].every(Number.isFinite) && x1 > x0 && y1 > y0) {
      return { box: { x: x0, y: y0, width: x1 - x0, height: y1 - y0 }, source: 'rules', items: [] };
    }
  }
  // 6. The marks themselves.
  const marks = unionAll(shapes.map((s) => s.bbox));
  return marks ? { box: marks, source: 'marks', items: [] } : null;
}

interface Rule {
  i: number;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

function boxFromLines(hs: Rule[], vs: Rule[], eps: number): { box: Box; items: number[] } | null {
  let best: { box: Box; items: number[] } | null = null;
  for (const top of hs) {
    for (const bot of hs) {
      if (bot.y0 <= top.y0 + 10 * eps) continue;
      const tx0 = Math.min(top.x0, top.x1);
      const tx1 = Math.max(top.x0, top.x1);
      const bx0 = Math.min(bot.x0, bot.x1);
      const bx1 = Math.max(bot.x0, bot.x1);
      if (Math.abs(tx0 - bx0) > eps || Math.abs(tx1 - bx1) > eps) continue;
      const left = vs.find((v) => Math.abs(v.x0 - tx0) <= eps && spans(v, top.y0, bot.y0, eps));
      const right = vs.find((v) => Math.abs(v.x0 - tx1) <= eps && spans(v, top.y0, bot.y0, eps));
      if (!left || !right) continue;
      const box = { x: tx0, y: top.y0, width: tx1 - tx0, height: bot.y0 - top.y0 };
      // A frame encloses the other rules: none pokes out of it.
      const outside =
        hs.some((h) => h.y0 < box.y - eps || h.y0 > box.y + box.height + eps || Math.min(h.x0, h.x1) < box.x - eps || Math.max(h.x0, h.x1) > box.x + box.width + eps) ||
        vs.some((v) => v.x0 < box.x - eps || v.x0 > box.x + box.width + eps || Math.min(v.y0, v.y1) < box.y - eps || Math.max(v.y0, v.y1) > box.y + box.height + eps);
      if (outside) continue;
      if (!best || area(box) > area(best.box)) best = { box, items: [...new Set([top.i, bot.i, left.i, right.i])] };
    }
  }
  return best;
}

function spans(v: Rule, y0: number, y1: number, eps: number): boolean {
  const a = Math.min(v.y0, v.y1);
  const b = Math.max(v.y0, v.y1);
  return a <= y0 + eps && b >= y1 - eps;
}

/** The [min, max] extent most rules share (within eps), when at least two agree. */
function commonExtent(extents: number[][], eps: number): [number, number] | null {
  const groups: { lo: number; hi: number; n: number }[] = [];
  for (const [lo, hi] of extents) {
    const g = groups.find((x) => Math.abs(x.lo - lo!) <= eps && Math.abs(x.hi - hi!) <= eps);
    if (g) g.n++;
    else groups.push({ lo: lo!, hi: hi!, n: 1 });
  }
  groups.sort((a, b) => b.n - a.n || b.hi - b.lo - (a.hi - a.lo));
  const g = groups[0];
  return g && g.n >= 2 ? [g.lo, g.hi] : null;
}
