/** Small helpers on world-space boxes and outlines used across the classifier. */
import type { Box, ShapeItem } from '../read/scene.js';

export function area(b: Box): number {
  return Math.max(0, b.width) * Math.max(0, b.height);
}

export function centerX(b: Box): number {
  return b.x + b.width / 2;
}

export function centerY(b: Box): number {
  return b.y + b.height / 2;
}

export function right(b: Box): number {
  return b.x + b.width;
}

export function bottom(b: Box): number {
  return b.y + b.height;
}

export function expand(b: Box, d: number): Box {
  return { x: b.x - d, y: b.y - d, width: b.width + 2 * d, height: b.height + 2 * d };
}

export function containsPoint(b: Box, x: number, y: number, eps = 0): boolean {
  return x >= b.x - eps && x <= b.x + b.width + eps && y >= b.y - eps && y <= b.y + b.height + eps;
}

export function containsBox(outer: Box, inner: Box, eps = 0): boolean {
  return (
    inner.x >= outer.x - eps &&
    inner.y >= outer.y - eps &&
    right(inner) <= right(outer) + eps &&
    bottom(inner) <= bottom(outer) + eps
  );
}

export function intersection(a: Box, b: Box): Box | null {
  const x = Math.max(a.x, b.x);
  const y = Math.max(a.y, b.y);
  const w = Math.min(right(a), right(b)) - x;
  const h = Math.min(bottom(a), bottom(b)) - y;
  return w >= 0 && h >= 0 ? { x, y, width: w, height: h } : null;
}

export function union(a: Box, b: Box): Box {
  const x = Math.min(a.x, b.x);
  const y = Math.min(a.y, b.y);
  return { x, y, width: Math.max(right(a), right(b)) - x, height: Math.max(bottom(a), bottom(b)) - y };
}

export function unionAll(boxes: Iterable<Box>): Box | null {
  let out: Box | null = null;
  for (const b of boxes) out = out ? union(out, b) : b;
  return out;
}

export function overlapShare(a: Box, b: Box): number {
  const i = intersection(a, b);
  const small = Math.min(area(a), area(b));
  return i && small > 0 ? area(i) / small : 0;
}

/** The geometric outline box (without stroke width) of a shape. */
export function outlineBox(s: ShapeItem): Box {
  const pad = s.strokeWidth / 2;
  return { x: s.bbox.x + pad, y: s.bbox.y + pad, width: Math.max(0, s.bbox.width - 2 * pad), height: Math.max(0, s.bbox.height - 2 * pad) };
}

export interface StraightLine {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  orientation: 'horizontal' | 'vertical' | 'oblique';
  length: number;
}

/**
 * A shape that draws one straight stroked segment (a line, a two-point
 * polyline or path, or a hairline rectangle), with its orientation.
 */
export function straightLineOf(s: ShapeItem): StraightLine | null {
  if (s.polylines.length !== 1) return null;
  const p = s.polylines[0]!;
  let pts = p;
  if (s.rect && s.fill.kind !== 'none' && s.stroke.kind === 'none') {
    // A filled hairline rectangle drawn as a rule.
    const r = s.rect;
    if (r.height <= 1.6 && r.width > 8 * Math.max(r.height, 0.1)) return mk(r.x, r.y + r.height / 2, r.x + r.width, r.y + r.height / 2);
    if (r.width <= 1.6 && r.height > 8 * Math.max(r.width, 0.1)) return mk(r.x + r.width / 2, r.y, r.x + r.width / 2, r.y + r.height);
    return null;
  }
  if (s.stroke.kind === 'none') return null;
  if (pts.length > 4) {
    // Collinear multi-point lines (e.g. a line drawn as several pieces).
    const x0 = pts[0]!;
    const y0 = pts[1]!;
    const x1 = pts[pts.length - 2]!;
    const y1 = pts[pts.length - 1]!;
    const len = Math.hypot(x1 - x0, y1 - y0);
    if (len === 0) return null;
    for (let k = 2; k < pts.length - 2; k += 2) {
      const d = Math.abs((x1 - x0) * (y0 - pts[k + 1]!) - (x0 - pts[k]!) * (y1 - y0)) / len;
      if (d > 0.5) return null;
    }
    pts = [x0, y0, x1, y1];
  }
  if (pts.length !== 4) return null;
  if (s.closed[0]) return null;
  return mk(pts[0]!, pts[1]!, pts[2]!, pts[3]!);

  function mk(x0: number, y0: number, x1: number, y1: number): StraightLine {
    const dx = Math.abs(x1 - x0);
    const dy = Math.abs(y1 - y0);
    const length = Math.hypot(dx, dy);
    const orientation = dy <= 0.02 * length + 1e-6 ? 'horizontal' : dx <= 0.02 * length + 1e-6 ? 'vertical' : 'oblique';
    return { x0, y0, x1, y1, orientation, length };
  }
}
