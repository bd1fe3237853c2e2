/**
 * Segments mapped through an affine matrix, staying exact: lines and Bézier
 * curves map control point by control point, and an elliptical arc maps to
 * the arc of the image ellipse, whose radii and rotation are the singular
 * values and left singular direction of the 2×2 matrix [U V] formed by the
 * mapped semi-axis vectors. A mirroring matrix (determinant < 0) reverses
 * the sweep direction.
 */
import { affineArc, arcSegment } from './arc.js';
import { isFiniteMatrix, isIdentity, type Matrix } from './matrix.js';
import type { Segment } from './segments.js';

/**
 * Radii and rotation of the ellipse that A = [[a, b], [c, d]] makes of the
 * unit circle: A = R(phi)·diag(s1, s2)·R(theta) with s1 ≥ |s2|.
 */
export function ellipseOfMatrix(a: number, b: number, c: number, d: number): { r1: number; r2: number; phi: number } {
  const e = (a + d) / 2;
  const f = (a - d) / 2;
  const g = (c + b) / 2;
  const h = (c - b) / 2;
  const q = Math.hypot(e, h);
  const r = Math.hypot(f, g);
  const a1 = Math.atan2(g, f);
  const a2 = Math.atan2(h, e);
  return { r1: q + r, r2: Math.abs(q - r), phi: (a2 + a1) / 2 };
}

/**
 * The segments in the matrix's output coordinates. Returns null when the
 * matrix is not finite. An arc under a singular matrix (which squashes it
 * to a line) becomes a line between its mapped endpoints.
 */
export function transformSegments(segments: readonly Segment[], m: Matrix): Segment[] | null {
  if (!isFiniteMatrix(m)) return null;
  if (isIdentity(m)) return segments.slice();
  const [a, b, c, d, e, f] = m;
  const det = a * d - b * c;
  const out: Segment[] = [];
  for (const s of segments) {
    if (s.type === 'M') {
      out.push({ type: 'M', x: a * s.x + c * s.y + e, y: b * s.x + d * s.y + f });
      continue;
    }
    const x0 = a * s.x0 + c * s.y0 + e;
    const y0 = b * s.x0 + d * s.y0 + f;
    const x = a * s.x + c * s.y + e;
    const y = b * s.x + d * s.y + f;
    switch (s.type) {
      case 'L':
      case 'Z':
        out.push({ type: s.type, x0, y0, x, y });
        break;
      case 'Q':
        out.push({ type: 'Q', x0, y0, x1: a * s.x1 + c * s.y1 + e, y1: b * s.x1 + d * s.y1 + f, x, y });
        break;
      case 'C':
        out.push({
          type: 'C',
          x0,
          y0,
          x1: a * s.x1 + c * s.y1 + e,
          y1: b * s.x1 + d * s.y1 + f,
          x2: a * s.x2 + c * s.y2 + e,
          y2: b * s.x2 + d * s.y2 + f,
          x,
          y,
        });
        break;
      case 'A': {
        const w = affineArc(s.center, a, b, c, d, e, f);
        const el = ellipseOfMatrix(w.ux, w.vx, w.uy, w.vy);
        const deg = (el.phi * 180) / Math.PI;
        // The large-arc flag follows the arc actually drawn (after any F.6.6 scale-up).
        const large = Math.abs(s.center.dtheta) > Math.PI;
        const seg = arcSegment(x0, y0, el.r1, el.r2, deg, large, det < 0 ? !s.sweep : s.sweep, x, y);
        if (seg !== null) out.push(seg);
        break;
      }
    }
  }
  return out;
}
