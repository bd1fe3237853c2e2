/**
 * Flattening of path segments to polylines in world units, for rendering-
 * like consumers (hit tests, overlap, rasterless coverage estimates).
 */
import { affineArc } from './arc.js';
import { cubicAt, quadAt } from './bezier.js';
import { identity, isFiniteMatrix, type Matrix } from './matrix.js';
import type { Segment } from './segments.js';

export interface FlattenResult {
  /** One flat [x0, y0, x1, y1, …] array per subpath. */
  polylines: number[][];
  /** closed[k]: subpath k ended with Z. */
  closed: boolean[];
}

/** Most line pieces one segment is split into, whatever the tolerance. */
export const MAX_PIECES_PER_SEGMENT = 10_000;

function pieceCount(n: number): number {
  if (!(n >= 1)) return 1;
  return n > MAX_PIECES_PER_SEGMENT ? MAX_PIECES_PER_SEGMENT : Math.ceil(n);
}

/**
 * The (transformed) outline as polylines, one flat [x0, y0, x1, y1, …] array
 * per subpath, in world units. Curves are split uniformly into enough pieces
 * that no point of the curve is farther than `tolerance` from the polyline
 * (Wang's bound for Béziers; the chord-height bound for arcs), capped at
 * MAX_PIECES_PER_SEGMENT pieces per segment. A closed subpath ends with its
 * start point repeated and its `closed` entry true. Lines and corners are
 * reproduced exactly. A drawing segment that does not continue from the
 * previous segment's end (possible only in hand-built lists) starts a new
 * polyline.
 *
 * Throws RangeError when tolerance is not a positive number (a programming
 * error, never caused by SVG content). A non-finite matrix gives [].
 */
export function flattenSegments(segments: readonly Segment[], tolerance: number, matrix: Matrix = identity): FlattenResult {
  if (!(tolerance > 0)) throw new RangeError(`flatten: tolerance must be a positive number, got ${tolerance}`);
  const out: number[][] = [];
  const closed: boolean[] = [];
  if (!isFiniteMatrix(matrix)) return { polylines: out, closed };
  const [a, b, c, d, e, f] = matrix;
  let cur: number[] | null = null;
  let startX = 0;
  let startY = 0;
  let lastX = NaN; // untransformed end of the previous segment
  let lastY = NaN;
  for (const s of segments) {
    if (s.type === 'M') {
      startX = a * s.x + c * s.y + e;
      startY = b * s.x + d * s.y + f;
      cur = [startX, startY];
      out.push(cur);
      closed.push(false);
      lastX = s.x;
      lastY = s.y;
      continue;
    }
    const x0 = a * s.x0 + c * s.y0 + e;
    const y0 = b * s.x0 + d * s.y0 + f;
    if (cur === null || s.x0 !== lastX || s.y0 !== lastY) {
      startX = x0;
      startY = y0;
      cur = [x0, y0];
      out.push(cur);
      closed.push(false);
    }
    lastX = s.x;
    lastY = s.y;
    const x3 = a * s.x + c * s.y + e;
    const y3 = b * s.x + d * s.y + f;
    switch (s.type) {
      case 'L':
        cur.push(x3, y3);
        break;
      case 'Z':
        if (cur[cur.length - 2] !== startX || cur[cur.length - 1] !== startY) cur.push(startX, startY);
        closed[closed.length - 1] = true;
        cur = null;
        break;
      case 'Q': {
        const x1 = a * s.x1 + c * s.y1 + e;
        const y1 = b * s.x1 + d * s.y1 + f;
        // Wang: n = √(d(d−1)/8 · max|Δ²P| / tol) with d = 2.
        const dd = Math.hypot(x0 - 2 * x1 + x3, y0 - 2 * y1 + y3);
        const n = pieceCount(Math.sqrt((0.25 * dd) / tolerance));
        for (let k = 1; k < n; k++) {
          const t = k / n;
          cur.push(quadAt(x0, x1, x3, t), quadAt(y0, y1, y3, t));
        }
        cur.push(x3, y3);
        break;
      }
      case 'C': {
        const x1 = a * s.x1 + c * s.y1 + e;
        const y1 = b * s.x1 + d * s.y1 + f;
        const x2 = a * s.x2 + c * s.y2 + e;
        const y2 = b * s.x2 + d * s.y2 + f;
        // Wang: d = 3 gives the factor 3·2/8 = 0.75.
        const dd = Math.max(Math.hypot(x0 - 2 * x1 + x2, y0 - 2 * y1 + y2), Math.hypot(x1 - 2 * x2 + x3, y1 - 2 * y2 + y3));
        const n = pieceCount(Math.sqrt((0.75 * dd) / tolerance));
        for (let k = 1; k < n; k++) {
          const t = k / n;
          cur.push(cubicAt(x0, x1, x2, x3, t), cubicAt(y0, y1, y2, y3, t));
        }
        cur.push(x3, y3);
        break;
      }
      case 'A': {
        const w = affineArc(s.center, a, b, c, d, e, f);
        // |P''(t)| ≤ σmax([U V]) ≤ √(|U|² + |V|²); a chord over Δt deviates by at most Δt²/8·|P''|.
        const sigma = Math.sqrt(w.ux * w.ux + w.uy * w.uy + w.vx * w.vx + w.vy * w.vy);
        const step = Math.min(Math.PI / 2, Math.sqrt((8 * tolerance) / sigma));
        const n = pieceCount(Math.abs(w.dt) / step);
        for (let k = 1; k < n; k++) {
          const t = w.t0 + (w.dt * k) / n;
          const co = Math.cos(t);
          const si = Math.sin(t);
          cur.push(w.cx + w.ux * co + w.vx * si, w.cy + w.uy * co + w.vy * si);
        }
        cur.push(x3, y3);
        break;
      }
    }
  }
  return { polylines: out, closed };
}
