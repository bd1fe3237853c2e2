/**
 * Outline helpers for wedge detection: closed rings from flattened polylines,
 * Douglas–Peucker simplification, compass angles, circles through points.
 */

/** A closed outline: vertex coordinates, the closing edge implied (no repeated end point). */
export interface Ring {
  x: number[];
  y: number[];
}

/** Most vertices a ring may have to be considered as a wedge outline. */
export const MAX_RING_VERTICES = 20_000;

/**
 * A ring from a flat [x0, y0, x1, y1, …] polyline: non-finite points dropped,
 * consecutive duplicates (closer than `eps`) merged, the closing repeat
 * removed. Null when fewer than three vertices remain or the polyline is too long.
 */
export function ringFromPolyline(poly: readonly number[], eps: number): Ring | null {
  if (poly.length / 2 > MAX_RING_VERTICES) return null;
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i + 1 < poly.length; i += 2) {
    const px = poly[i]!;
    const py = poly[i + 1]!;
    if (!Number.isFinite(px) || !Number.isFinite(py)) continue;
    const n = x.length;
    if (n > 0 && Math.abs(px - x[n - 1]!) <= eps && Math.abs(py - y[n - 1]!) <= eps) continue;
    x.push(px);
    y.push(py);
  }
  while (x.length > 1 && Math.abs(x[0]! - x[x.length - 1]!) <= eps && Math.abs(y[0]! - y[y.length - 1]!) <= eps) {
    x.pop();
    y.pop();
  }
  return x.length >= 3 ? { x, y } : null;
}

/** Signed area (shoelace; positive when clockwise on a y-down page). */
export function ringArea(r: Ring): number {
  let s = 0;
  const n = r.x.length;
  for (let i = 0, j = n - 1; i < n; j = i++) s += r.x[j]! * r.y[i]! - r.x[i]! * r.y[j]!;
  return s / 2;
}

export function ringPerimeter(r: Ring): number {
  let s = 0;
  const n = r.x.length;
  for (let i = 0, j = n - 1; i < n; j = i++) s += Math.hypot(r.x[i]! - r.x[j]!, r.y[i]! - r.y[j]!);
  return s;
}

export function ringExtent(r: Ring): number {
  let x0 = Infinity;
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  for (let i = 0; i < r.x.length; i++) {
    x0 = Math.min(x0, r.x[i]!);
    x1 = Math.max(x1, r.x[i]!);
    y0 = Math.min(y0, r.y[i]!);
    y1 = Math.max(y1, r.y[i]!);
  }
  return Math.max(x1 - x0, y1 - y0);
}

/**
 * Indices of the vertices kept by Douglas–Peucker simplification of the
 * closed ring with tolerance `tol`, in order. The ring is cut at vertex 0 and
 * at the vertex farthest from it, so the result is independent of direction.
 */
export function simplifyRing(r: Ring, tol: number): number[] {
  const n = r.x.length;
  if (n <= 3) return Array.from({ length: n }, (_, i) => i);
  let far = 0;
  let farD = -1;
  for (let i = 1; i < n; i++) {
    const d = Math.hypot(r.x[i]! - r.x[0]!, r.y[i]! - r.y[0]!);
    if (d > farD) {
      farD = d;
      far = i;
    }
  }
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[far] = 1;
  const stack: [number, number][] = [
    [0, far],
    [far, n],
  ];
  while (stack.length > 0) {
    const [a, b] = stack.pop()!;
    if (b - a < 2) continue;
    const ax = r.x[a]!;
    const ay = r.y[a]!;
    const bx = r.x[b % n]!;
    const by = r.y[b % n]!;
    const len = Math.hypot(bx - ax, by - ay);
    let worst = -1;
    let worstD = tol;
    for (let i = a + 1; i < b; i++) {
      const px = r.x[i]! - ax;
      const py = r.y[i]! - ay;
      const d = len > 0 ? Math.abs(px * (by - ay) - py * (bx - ax)) / len : Math.hypot(px, py);
      if (d > worstD) {
        worstD = d;
        worst = i;
      }
    }
    if (worst >= 0) {
      keep[worst] = 1;
      stack.push([a, worst], [worst, b]);
    }
  }
  const out: number[] = [];
  for (let i = 0; i < n; i++) if (keep[i]) out.push(i);
  return out;
}

/** Compass angle of the direction (dx, dy): radians clockwise from 12 o'clock on a y-down page, in [0, 2π). */
export function compass(dx: number, dy: number): number {
  const a = Math.atan2(dx, -dy);
  return a < 0 ? a + 2 * Math.PI : a;
}

/** Signed compass-angle change from direction a to direction b, in (−π, π]. */
export function angleStep(ax: number, ay: number, bx: number, by: number): number {
  // Clockwise on a y-down page is a positive cross product (ax·by − ay·bx).
  return Math.atan2(ax * by - ay * bx, ax * bx + ay * by);
}

/** Reduces an angle to [0, 2π). */
export function normAngle(a: number): number {
  const t = 2 * Math.PI;
  const r = a % t;
  return r < 0 ? r + t : r;
}

/** Circle through three points; null when they are (nearly) collinear. */
export function circleThrough(
  x1: number,
  y1: number,
  x2: number,
  y2: number,
  x3: number,
  y3: number,
): { cx: number; cy: number; r: number } | null {
  const bx = x2 - x1;
  const by = y2 - y1;
  const cx = x3 - x1;
  const cy = y3 - y1;
  const d = 2 * (bx * cy - by * cx);
  const scale = Math.max(Math.abs(bx), Math.abs(by), Math.abs(cx), Math.abs(cy));
  if (!(Math.abs(d) > 1e-9 * scale * scale)) return null;
  const b2 = bx * bx + by * by;
  const c2 = cx * cx + cy * cy;
  const ux = (cy * b2 - by * c2) / d;
  const uy = (bx * c2 - cx * b2) / d;
  return { cx: x1 + ux, cy: y1 + uy, r: Math.hypot(ux, uy) };
}

/**
 * Solves the symmetric positive (semi-)definite system A·x = b in place by
 * Gaussian elimination with partial pivoting; null when singular.
 */
export function solveLinear(A: number[][], b: number[]): number[] | null {
  const n = b.length;
  const M = A.map((row, i) => [...row, b[i]!]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[p]![c]!)) p = r;
    if (!(Math.abs(M[p]![c]!) > 1e-300)) return null;
    if (p !== c) [M[p], M[c]] = [M[c]!, M[p]!];
    const piv = M[c]![c]!;
    for (let r = c + 1; r < n; r++) {
      const f = M[r]![c]! / piv;
      if (f === 0) continue;
      for (let k = c; k <= n; k++) M[r][k] -= f * M[c][k];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r]![n]!;
    for (let k = r + 1; k < n; k++) s -= M[r]![k]! * x[k]!;
    x[r] = s / M[r]![r]!;
  }
  return x.every(Number.isFinite) ? x : null;
}
