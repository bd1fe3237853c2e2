/**
 * Outlines of flat pie and donut wedges: circular arcs as cubic Béziers
 * (at most 45° each, with the usual 4/3·tan(θ/4) handle length), mapped through
 * an affine transform (affine maps take Béziers to Béziers exactly), written
 * as SVG path data or as polygon points.
 */
import { applyToPoint, type Matrix } from '../read/geometry/matrix.js';

export interface FlatWedge {
  cx: number;
  cy: number;
  outer: number;
  inner: number;
  /** Radians clockwise from 12 o'clock (SVG's y points down). */
  start: number;
  end: number;
}

function at(cx: number, cy: number, r: number, a: number): [number, number] {
  return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
}

/** Cubic pieces of the arc from a0 to a1 (either direction), each as [c1x, c1y, c2x, c2y, x, y]. */
function arcCubics(cx: number, cy: number, r: number, a0: number, a1: number): number[][] {
  const span = a1 - a0;
  const n = Math.max(1, Math.ceil(Math.abs(span) / (Math.PI / 4) - 1e-9));
  const step = span / n;
  const k = (4 / 3) * Math.tan(step / 4);
  const out: number[][] = [];
  for (let i = 0; i < n; i++) {
    const s = a0 + i * step;
    const e = s + step;
    const [x0, y0] = at(cx, cy, r, s);
    const [x3, y3] = at(cx, cy, r, e);
    // Tangent of a clockwise-from-top angle: d/da (sin a, −cos a) = (cos a, sin a).
    out.push([x0 + k * r * Math.cos(s), y0 + k * r * Math.sin(s), x3 - k * r * Math.cos(e), y3 - k * r * Math.sin(e), x3, y3]);
  }
  return out;
}

function num(v: number): string {
  let s = v.toFixed(3);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

/** Path data of a wedge in the coordinates `toLocal` maps world points into. */
export function wedgePathData(w: FlatWedge, toLocal: Matrix): string {
  const p = (x: number, y: number): string => {
    const q = applyToPoint(toLocal, { x, y });
    return `${num(q.x)} ${num(q.y)}`;
  };
  const parts: string[] = [];
  const full = Math.abs(w.end - w.start) >= 2 * Math.PI - 1e-9;
  const [ox, oy] = at(w.cx, w.cy, w.outer, w.start);
  parts.push(`M${p(ox, oy)}`);
  for (const c of arcCubics(w.cx, w.cy, w.outer, w.start, w.end)) parts.push(`C${p(c[0]!, c[1]!)} ${p(c[2]!, c[3]!)} ${p(c[4]!, c[5]!)}`);
  if (w.inner > 0) {
    const [ix, iy] = at(w.cx, w.cy, w.inner, w.end);
    if (full) parts.push(`Z M${p(ix, iy)}`);
    else parts.push(`L${p(ix, iy)}`);
    for (const c of arcCubics(w.cx, w.cy, w.inner, w.end, w.start)) parts.push(`C${p(c[0]!, c[1]!)} ${p(c[2]!, c[3]!)} ${p(c[4]!, c[5]!)}`);
  } else if (!full) {
    parts.push(`L${p(w.cx, w.cy)}`);
  }
  parts.push('Z');
  return parts.join(' ');
}

/** Polygon points of a wedge, arcs flattened in steps of at most `stepRadians`. */
export function wedgePoints(w: FlatWedge, toLocal: Matrix, stepRadians = Math.PI / 360): string {
  const pts: string[] = [];
  const push = (x: number, y: number): void => {
    const q = applyToPoint(toLocal, { x, y });
    pts.push(`${num(q.x)},${num(q.y)}`);
  };
  const arc = (r: number, a0: number, a1: number): void => {
    const n = Math.max(1, Math.ceil(Math.abs(a1 - a0) / stepRadians));
    for (let i = 0; i <= n; i++) {
      const [x, y] = at(w.cx, w.cy, r, a0 + ((a1 - a0) * i) / n);
      push(x, y);
    }
  };
  arc(w.outer, w.start, w.end);
  if (w.inner > 0) arc(w.inner, w.end, w.start);
  else push(w.cx, w.cy);
  return pts.join(' ');
}
