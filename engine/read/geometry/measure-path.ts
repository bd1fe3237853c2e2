/**
 * Measurements of path segments, optionally through an affine matrix (the
 * element's world transform): bounding box, length, signed area, and
 * flattening to polylines.
 *
 * Everything is computed on the transformed geometry, not by transforming a
 * result: Bézier curves are mapped exactly (an affine map of a Bézier is the
 * Bézier of the mapped control points), and arcs are mapped to the image
 * ellipse P(t) = C + U·cos t + V·sin t. So
 * - bounding boxes are exact for every segment type (derivative roots for
 *   curves, extremal angles for arcs);
 * - areas are exact for every segment type (Green's theorem: the integrand
 *   is a polynomial that Gauss–Legendre integrates exactly for Béziers, and
 *   has a closed form for arcs);
 * - lengths are exact for lines and circular arcs, and computed by adaptive
 *   Gauss–Legendre quadrature (relative error ≈ 1e-10) for curves and
 *   elliptical arcs.
 *
 * A non-finite matrix gives null / NaN / no polylines. Coordinates so large
 * that the arithmetic overflows give non-finite results.
 */
import { affineArc, type AffineArc } from './arc.js';
import { determinant, identity, isFiniteMatrix, type Matrix } from './matrix.js';
import { cubicAt, cubicCriticalPoints, quadAt } from './bezier.js';
import { flattenSegments } from './flatten.js';
import type { Segment } from './segments.js';

export interface BBox {
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
}

const TWO_PI = 2 * Math.PI;

/** Is angle t on the arc that starts at t0 and turns by dt (either sign)? */
function onArc(t: number, t0: number, dt: number): boolean {
  const start = dt >= 0 ? t0 : t0 + dt;
  let k = (t - start) % TWO_PI;
  if (k < 0) k += TWO_PI;
  return k <= Math.abs(dt);
}

/**
 * The exact bounding box of the (transformed) drawn geometry, or null when
 * there are no segments or the matrix is not finite. A moveto that starts
 * nothing (followed by another moveto or by the end) does not count, since
 * it draws nothing; renderers differ there (resvg counts a trailing one and
 * drops all but the last of consecutive ones). A path with no drawing
 * segment at all gets the box of its moveto points (zero-size for "M10 10").
 */
export function pathBBox(segments: readonly Segment[], matrix: Matrix = identity): BBox | null {
  if (!isFiniteMatrix(matrix)) return null;
  if (segments.length === 0) return null;
  const [a, b, c, d, e, f] = matrix;
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  let moveMinX = Infinity;
  let moveMinY = Infinity;
  let moveMaxX = -Infinity;
  let moveMaxY = -Infinity;
  let drew = false;
  const addX = (x: number): void => {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
  };
  const addY = (y: number): void => {
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  };
  for (const s of segments) {
    if (s.type === 'M') {
      // Only needed when nothing is drawn; a drawing segment's start covers it otherwise.
      const x = a * s.x + c * s.y + e;
      const y = b * s.x + d * s.y + f;
      if (x < moveMinX) moveMinX = x;
      if (x > moveMaxX) moveMaxX = x;
      if (y < moveMinY) moveMinY = y;
      if (y > moveMaxY) moveMaxY = y;
      continue;
    }
    drew = true;
    const x0 = a * s.x0 + c * s.y0 + e;
    const y0 = b * s.x0 + d * s.y0 + f;
    const x3 = a * s.x + c * s.y + e;
    const y3 = b * s.x + d * s.y + f;
    addX(x0);
    addY(y0);
    addX(x3);
    addY(y3);
    switch (s.type) {
      case 'C': {
        const x1 = a * s.x1 + c * s.y1 + e;
        const y1 = b * s.x1 + d * s.y1 + f;
        const x2 = a * s.x2 + c * s.y2 + e;
        const y2 = b * s.x2 + d * s.y2 + f;
        cubicCriticalPoints(x0, x1, x2, x3, (t) => addX(cubicAt(x0, x1, x2, x3, t)));
        cubicCriticalPoints(y0, y1, y2, y3, (t) => addY(cubicAt(y0, y1, y2, y3, t)));
        break;
      }
      case 'Q': {
        const x1 = a * s.x1 + c * s.y1 + e;
        const y1 = b * s.x1 + d * s.y1 + f;
        // B'(t) = 0 at t = (p0 − p1)/(p0 − 2p1 + p2).
        const dx = x0 - 2 * x1 + x3;
        if (dx !== 0) {
          const t = (x0 - x1) / dx;
          if (t > 0 && t < 1) addX(quadAt(x0, x1, x3, t));
        }
        const dy = y0 - 2 * y1 + y3;
        if (dy !== 0) {
          const t = (y0 - y1) / dy;
          if (t > 0 && t < 1) addY(quadAt(y0, y1, y3, t));
        }
        break;
      }
      case 'A': {
        const w = affineArc(s.center, a, b, c, d, e, f);
        // x(t) = cx + ux·cos t + vx·sin t is extremal where tan t = vx/ux.
        const tx = Math.atan2(w.vx, w.ux);
        const hx = Math.hypot(w.ux, w.vx);
        if (onArc(tx, w.t0, w.dt)) addX(w.cx + hx);
        if (onArc(tx + Math.PI, w.t0, w.dt)) addX(w.cx - hx);
        const ty = Math.atan2(w.vy, w.uy);
        const hy = Math.hypot(w.uy, w.vy);
        if (onArc(ty, w.t0, w.dt)) addY(w.cy + hy);
        if (onArc(ty + Math.PI, w.t0, w.dt)) addY(w.cy - hy);
        break;
      }
      default:
        break;
    }
  }
  if (!drew) return { minX: moveMinX, minY: moveMinY, maxX: moveMaxX, maxY: moveMaxY };
  return { minX, minY, maxX, maxY };
}

// ---------------------------------------------------------------- length

// 5-point Gauss–Legendre on [−1, 1].
const GL5_X = [-0.906179845938664, -0.5384693101056831, 0, 0.5384693101056831, 0.906179845938664];
const GL5_W = [0.23692688505618928, 0.4786286704993663, 0.5688888888888887, 0.4786286704993663, 0.23692688505618928];

function gauss5(f: (t: number) => number, lo: number, hi: number): number {
  const h = (hi - lo) / 2;
  const mid = (hi + lo) / 2;
  let sum = 0;
  for (let k = 0; k < 5; k++) sum += GL5_W[k] * f(mid + h * GL5_X[k]);
  return sum * h;
}

const MAX_DEPTH = 16;

/** Adaptive Gauss–Legendre: halves an interval until the two halves agree with the whole. */
function integrate(f: (t: number) => number, lo: number, hi: number, whole: number, tol: number, depth: number): number {
  const mid = (lo + hi) / 2;
  const left = gauss5(f, lo, mid);
  const right = gauss5(f, mid, hi);
  const sum = left + right;
  if (depth >= MAX_DEPTH || Math.abs(sum - whole) <= tol || !Number.isFinite(sum)) return sum;
  return integrate(f, lo, mid, left, tol / 2, depth + 1) + integrate(f, mid, hi, right, tol / 2, depth + 1);
}

function integrateSpeed(f: (t: number) => number, lo: number, hi: number, scale: number): number {
  if (scale === 0) return 0;
  const tol = 1e-10 * scale;
  return integrate(f, lo, hi, gauss5(f, lo, hi), tol, 0);
}

/** Length of a (transformed) arc: exact for circles, quadrature otherwise. */
function arcLength(w: AffineArc): number {
  const uu = w.ux * w.ux + w.uy * w.uy;
  const vv = w.vx * w.vx + w.vy * w.vy;
  const uv = w.ux * w.vx + w.uy * w.vy;
  const scale = Math.max(uu, vv);
  if (Math.abs(uu - vv) <= 1e-14 * scale && Math.abs(uv) <= 1e-14 * scale) {
    return Math.sqrt(uu) * Math.abs(w.dt);
  }
  // |P'(t)| = |−U sin t + V cos t|; integrate in pieces of at most a quarter turn.
  const speed = (t: number): number => {
    const s = Math.sin(t);
    const co = Math.cos(t);
    return Math.hypot(-w.ux * s + w.vx * co, -w.uy * s + w.vy * co);
  };
  const pieces = Math.max(1, Math.ceil(Math.abs(w.dt) / (Math.PI / 2)));
  const step = w.dt / pieces;
  const radius = Math.sqrt(scale);
  let total = 0;
  for (let k = 0; k < pieces; k++) {
    const lo = w.t0 + k * step;
    // Integrating over a decreasing parameter range gives −length: take |…|.
    total += Math.abs(integrateSpeed(speed, lo, lo + step, radius * Math.abs(step)));
  }
  return total;
}

/**
 * Total length of the (transformed) outline, including Z's closing lines.
 * NaN when the matrix is not finite.
 */
export function pathLength(segments: readonly Segment[], matrix: Matrix = identity): number {
  if (!isFiniteMatrix(matrix)) return NaN;
  const [a, b, c, d, e, f] = matrix;
  let total = 0;
  for (const s of segments) {
    switch (s.type) {
      case 'M':
        break;
      case 'L':
      case 'Z': {
        const dx = s.x - s.x0;
        const dy = s.y - s.y0;
        total += Math.hypot(a * dx + c * dy, b * dx + d * dy);
        break;
      }
      case 'Q': {
        // Work with offsets from the start point (translation drops out).
        const x1 = a * (s.x1 - s.x0) + c * (s.y1 - s.y0);
        const y1 = b * (s.x1 - s.x0) + d * (s.y1 - s.y0);
        const x2 = a * (s.x - s.x0) + c * (s.y - s.y0);
        const y2 = b * (s.x - s.x0) + d * (s.y - s.y0);
        // B'(t)/2 = (1 − t)·P1 + t·(P2 − P1) with P0 = 0.
        const speed = (t: number): number => 2 * Math.hypot((1 - t) * x1 + t * (x2 - x1), (1 - t) * y1 + t * (y2 - y1));
        const scale = Math.hypot(x1, y1) + Math.hypot(x2 - x1, y2 - y1);
        total += integrateSpeed(speed, 0, 1, scale);
        break;
      }
      case 'C': {
        const x1 = a * (s.x1 - s.x0) + c * (s.y1 - s.y0);
        const y1 = b * (s.x1 - s.x0) + d * (s.y1 - s.y0);
        const x2 = a * (s.x2 - s.x0) + c * (s.y2 - s.y0);
        const y2 = b * (s.x2 - s.x0) + d * (s.y2 - s.y0);
        const x3 = a * (s.x - s.x0) + c * (s.y - s.y0);
        const y3 = b * (s.x - s.x0) + d * (s.y - s.y0);
        // B'(t)/3 = (1 − t)²·D0 + 2(1 − t)t·D1 + t²·D2, Dk = P(k+1) − Pk, P0 = 0.
        const d1x = x2 - x1;
        const d1y = y2 - y1;
        const d2x = x3 - x2;
        const d2y = y3 - y2;
        const speed = (t: number): number => {
          const mt = 1 - t;
          const k0 = mt * mt;
          const k1 = 2 * mt * t;
          const k2 = t * t;
          return 3 * Math.hypot(k0 * x1 + k1 * d1x + k2 * d2x, k0 * y1 + k1 * d1y + k2 * d2y);
        };
        const scale = Math.hypot(x1, y1) + Math.hypot(d1x, d1y) + Math.hypot(d2x, d2y);
        total += integrateSpeed(speed, 0, 1, scale);
        break;
      }
      case 'A':
        total += arcLength(affineArc(s.center, a, b, c, d, 0, 0));
        break;
    }
  }
  return total;
}

// ---------------------------------------------------------------- area

// Gauss–Legendre nodes on [0, 1]: 2 points are exact for cubic integrands, 3 for quintic.
const GL2_T = [0.5 - 0.5 / Math.sqrt(3), 0.5 + 0.5 / Math.sqrt(3)];
const GL3_T = [0.5 - 0.5 * Math.sqrt(0.6), 0.5, 0.5 + 0.5 * Math.sqrt(0.6)];
const GL3_W = [5 / 18, 8 / 18, 5 / 18];

/**
 * Signed area enclosed by the (transformed) outline, by Green's theorem:
 * A = ½∮(x dy − y dx). Every subpath counts as closed, as for filling. The
 * sign is positive when the outline runs in the direction of increasing
 * angle, i.e. clockwise on screen (y down); the area of a region traversed
 * twice counts twice (this is the nonzero-winding integral, not the painted
 * area of a self-intersecting outline). Exact for all segment types up to
 * rounding. NaN when the matrix is not finite.
 */
export function pathArea(segments: readonly Segment[], matrix: Matrix = identity): number {
  if (!isFiniteMatrix(matrix)) return NaN;
  // Area is computed untransformed, each subpath relative to its own start
  // point (for precision far from the origin; it also makes the implicit
  // closing line contribute exactly 0), then scaled by the determinant.
  let total = 0;
  let ox = 0;
  let oy = 0;
  let curX = NaN;
  let curY = NaN;
  for (const s of segments) {
    if (s.type === 'M') {
      ox = curX = s.x;
      oy = curY = s.y;
      continue;
    }
    if (s.x0 !== curX || s.y0 !== curY) {
      // Not continuing from the current point (no leading M, or segments
      // assembled by hand): a new subpath starts here.
      ox = s.x0;
      oy = s.y0;
    }
    const x0 = s.x0 - ox;
    const y0 = s.y0 - oy;
    const x3 = s.x - ox;
    const y3 = s.y - oy;
    switch (s.type) {
      case 'L':
      case 'Z':
        total += lineTerm(x0, y0, x3, y3);
        break;
      case 'Q': {
        const x1 = s.x1 - ox;
        const y1 = s.y1 - oy;
        let sum = 0;
        for (const t of GL2_T) {
          const mt = 1 - t;
          const x = mt * mt * x0 + 2 * mt * t * x1 + t * t * x3;
          const y = mt * mt * y0 + 2 * mt * t * y1 + t * t * y3;
          const dx = 2 * (mt * (x1 - x0) + t * (x3 - x1));
          const dy = 2 * (mt * (y1 - y0) + t * (y3 - y1));
          sum += 0.5 * (x * dy - y * dx);
        }
        total += 0.5 * sum;
        break;
      }
      case 'C': {
        const x1 = s.x1 - ox;
        const y1 = s.y1 - oy;
        const x2 = s.x2 - ox;
        const y2 = s.y2 - oy;
        let sum = 0;
        for (let k = 0; k < 3; k++) {
          const t = GL3_T[k];
          const mt = 1 - t;
          const x = mt * mt * mt * x0 + 3 * mt * mt * t * x1 + 3 * mt * t * t * x2 + t * t * t * x3;
          const y = mt * mt * mt * y0 + 3 * mt * mt * t * y1 + 3 * mt * t * t * y2 + t * t * t * y3;
          const dx = 3 * (mt * mt * (x1 - x0) + 2 * mt * t * (x2 - x1) + t * t * (x3 - x2));
          const dy = 3 * (mt * mt * (y1 - y0) + 2 * mt * t * (y2 - y1) + t * t * (y3 - y2));
          sum += GL3_W[k] * (x * dy - y * dx);
        }
        total += 0.5 * sum;
        break;
      }
      case 'A': {
        const w = affineArc(s.center, 1, 0, 0, 1, -ox, -oy);
        total += arcAreaTerm(w);
        break;
      }
    }
    curX = s.x;
    curY = s.y;
  }
  return total * determinant(matrix);
}

/** ½(x0·y1 − x1·y0): the line's share of ½∮(x dy − y dx). */
function lineTerm(x0: number, y0: number, x1: number, y1: number): number {
  return 0.5 * (x0 * y1 - x1 * y0);
}

/**
 * ½∫(x y' − y x') dt over the arc. With x = Cx + Ux cos t + Vx sin t (and y
 * alike) the integrand is Cx(−Uy sin t + Vy cos t) − Cy(−Ux sin t + Vx cos t)
 * + (Ux Vy − Uy Vx), which integrates in closed form.
 */
function arcAreaTerm(w: AffineArc): number {
  const t1 = w.t0;
  const t2 = w.t0 + w.dt;
  const dc = Math.cos(t2) - Math.cos(t1);
  const ds = Math.sin(t2) - Math.sin(t1);
  return 0.5 * (w.cx * (w.uy * dc + w.vy * ds) - w.cy * (w.ux * dc + w.vx * ds) + (w.ux * w.vy - w.uy * w.vx) * w.dt);
}

// ---------------------------------------------------------------- flatten

/**
 * The (transformed) outline as polylines, one flat [x0, y0, x1, y1, …] array
 * per subpath, in world units, no point of a curve farther than `tolerance`
 * from its polyline. See flattenSegments (which also reports which subpaths
 * are closed) for the details. Throws RangeError for a tolerance that is not
 * a positive number.
 */
export function flatten(segments: readonly Segment[], tolerance: number, matrix: Matrix = identity): number[][] {
  return flattenSegments(segments, tolerance, matrix).polylines;
}
