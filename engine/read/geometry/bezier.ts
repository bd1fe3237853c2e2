/** One-dimensional Bézier evaluation and critical points (apply per coordinate). */

/**
 * Roots in (0, 1) of the derivative of the 1-D cubic Bézier p0..p3, passed to `visit`.
 * B'(t)/3 = a·t² + b·t + c with a = −p0 + 3p1 − 3p2 + p3, b = 2(p0 − 2p1 + p2), c = p1 − p0.
 */
export function cubicCriticalPoints(p0: number, p1: number, p2: number, p3: number, visit: (t: number) => void): void {
  const a = -p0 + 3 * p1 - 3 * p2 + p3;
  const b = 2 * (p0 - 2 * p1 + p2);
  const c = p1 - p0;
  if (a === 0) {
    if (b !== 0) {
      const t = -c / b;
      if (t > 0 && t < 1) visit(t);
    }
    return;
  }
  const disc = b * b - 4 * a * c;
  if (disc < 0) return;
  const sq = Math.sqrt(disc);
  // Numerically stable pair of roots.
  const q = -0.5 * (b + (b >= 0 ? sq : -sq));
  if (q === 0) {
    const t = -b / (2 * a);
    if (t > 0 && t < 1) visit(t);
    return;
  }
  const t1 = q / a;
  const t2 = c / q;
  if (t1 > 0 && t1 < 1) visit(t1);
  if (t2 > 0 && t2 < 1) visit(t2);
}

export function cubicAt(p0: number, p1: number, p2: number, p3: number, t: number): number {
  const mt = 1 - t;
  return mt * mt * mt * p0 + 3 * mt * mt * t * p1 + 3 * mt * t * t * p2 + t * t * t * p3;
}

export function quadAt(p0: number, p1: number, p2: number, t: number): number {
  const mt = 1 - t;
  return mt * mt * p0 + 2 * mt * t * p1 + t * t * p2;
}
