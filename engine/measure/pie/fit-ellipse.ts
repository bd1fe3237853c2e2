/**
 * Direct least-squares ellipse fitting.
 *
 * Method: Fitzgibbon, Pilu & Fisher (1999), "Direct least square fitting of
 * ellipses", IEEE TPAMI 21(5): minimise the algebraic distance ‖D·a‖² of the
 * conic a = (A, B, C, D, E, F), A·x² + B·xy + C·y² + D·x + E·y + F = 0, subject
 * to the ellipse-specific constraint 4AC − B² = 1. The constrained problem is a
 * generalized eigenproblem whose one positive eigenvalue gives the ellipse.
 *
 * It is solved here in the partitioned form of Halíř & Flusser (1998,
 * "Numerically stable direct least squares fitting of ellipses", WSCG), which
 * splits the scatter matrix into its quadratic and linear blocks and leaves an
 * ordinary 3×3 eigenproblem. That 3×3 problem is solved directly (roots of the
 * characteristic cubic, eigenvectors as null vectors refined by inverse
 * iteration), so no linear-algebra package is needed. The points are centred
 * and scaled to unit RMS radius before fitting, and the conic is mapped back.
 */

/** An ellipse in world units. */
export interface Ellipse {
  cx: number;
  cy: number;
  /** Semi-major axis (rx ≥ ry). */
  rx: number;
  /** Semi-minor axis. */
  ry: number;
  /**
   * Direction of the major axis in radians, in (−π/2, π/2], measured from +x
   * towards +y (clockwise on the page, as SVG's y points down).
   */
  angle: number;
}

/** Conic coefficients (A, B, C, D, E, F) of A·x² + B·xy + C·y² + D·x + E·y + F = 0. */
export type Conic = readonly [number, number, number, number, number, number];

export interface EllipseFit extends Ellipse {
  /** The fitted conic, scaled so that its quadratic part has unit norm. */
  conic: Conic;
  /** Root-mean-square of the points' approximate geometric distances (Sampson) to the ellipse, world units. */
  rms: number;
  /** Largest such distance. */
  maxError: number;
}

type Vec3 = [number, number, number];
type Mat3 = [Vec3, Vec3, Vec3];

/**
 * Fits an ellipse to points given as a flat [x0, y0, x1, y1, …] array.
 * Returns null when the points do not determine an ellipse (fewer than five
 * distinct points, all on a line, or a best-fitting conic that is not an
 * ellipse). Throws RangeError for malformed input (odd length, non-finite numbers).
 */
export function fitEllipse(points: readonly number[]): EllipseFit | null {
  if (points.length % 2 !== 0) throw new RangeError(`fitEllipse: expected a flat [x, y, …] array of even length, got length ${points.length}`);
  const n = points.length / 2;
  for (let i = 0; i < points.length; i++) {
    if (!Number.isFinite(points[i]!)) throw new RangeError(`fitEllipse: coordinate ${i} is not a finite number`);
  }
  if (n < 5) return null;

  // Normalise: centre on the mean, scale to unit RMS distance.
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += points[2 * i]!;
    my += points[2 * i + 1]!;
  }
  mx /= n;
  my /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const dx = points[2 * i]! - mx;
    const dy = points[2 * i + 1]! - my;
    ss += dx * dx + dy * dy;
  }
  const s = Math.sqrt(ss / n);
  if (!(s > 0)) return null;

  // Scatter blocks: S1 = D1ᵀD1 (quadratic), S2 = D1ᵀD2, S3 = D2ᵀD2 (linear).
  const S1: Mat3 = zero3();
  const S2: Mat3 = zero3();
  const S3: Mat3 = zero3();
  for (let i = 0; i < n; i++) {
    const x = (points[2 * i]! - mx) / s;
    const y = (points[2 * i + 1]! - my) / s;
    const q: Vec3 = [x * x, x * y, y * y];
    const l: Vec3 = [x, y, 1];
    for (let r = 0; r < 3; r++) {
      for (let c = 0; c < 3; c++) {
        S1[r][c] += q[r] * q[c];
        S2[r][c] += q[r] * l[c];
        S3[r][c] += l[r] * l[c];
      }
    }
  }
  const S3inv = invert3(S3);
  if (!S3inv) return null; // all points on a line
  // T = −S3⁻¹·S2ᵀ; M = S1 + S2·T; then M ← C1⁻¹·M with C1 = [[0,0,2],[0,−1,0],[2,0,0]].
  const T = scale3(mul3(S3inv, transpose3(S2)), -1);
  const Mfull = add3(S1, mul3(S2, T));
  const M: Mat3 = [
    [Mfull[2][0] / 2, Mfull[2][1] / 2, Mfull[2][2] / 2],
    [-Mfull[1][0], -Mfull[1][1], -Mfull[1][2]],
    [Mfull[0][0] / 2, Mfull[0][1] / 2, Mfull[0][2] / 2],
  ];

  let best: Vec3 | null = null;
  let bestScore = 0;
  for (const lambda of realEigenvalues(M)) {
    const v = eigenvector(M, lambda);
    if (!v) continue;
    const cond = 4 * v[0] * v[2] - v[1] * v[1];
    const norm = v[0] * v[0] + v[1] * v[1] + v[2] * v[2];
    const score = cond / norm;
    if (score > bestScore) {
      bestScore = score;
      best = v;
    }
  }
  if (!best || !(bestScore > 1e-12)) return null;
  const a1 = best;
  const a2 = mulVec3(T, a1);
  // Conic in normalised coordinates (u, v) = ((x − mx)/s, (y − my)/s).
  const [A, B, C] = a1;
  const [D, E, F] = a2;
  // Back to world: substitute u = (x − mx)/s, v = (y − my)/s and multiply by s².
  const A2 = A;
  const B2 = B;
  const C2 = C;
  const D2 = -2 * A * mx - B * my + D * s;
  const E2 = -B * mx - 2 * C * my + E * s;
  const F2 = A * mx * mx + B * mx * my + C * my * my - D * s * mx - E * s * my + F * s * s;
  const k = Math.hypot(A2, B2, C2);
  const conic: Conic = [A2 / k, B2 / k, C2 / k, D2 / k, E2 / k, F2 / k];
  const geom = conicToEllipse(conic);
  if (!geom) return null;
  let sum = 0;
  let max = 0;
  for (let i = 0; i < n; i++) {
    const d = sampsonDistance(conic, points[2 * i]!, points[2 * i + 1]!);
    sum += d * d;
    if (d > max) max = d;
  }
  return { ...geom, conic, rms: Math.sqrt(sum / n), maxError: max };
}

/** Centre, semi-axes and major-axis direction of a conic that is a real ellipse; null otherwise. */
export function conicToEllipse(conic: Conic): Ellipse | null {
  const [A, B, C, D, E, F] = conic;
  const det = 4 * A * C - B * B;
  if (!(det > 0)) return null;
  const cx = (B * E - 2 * C * D) / det;
  const cy = (B * D - 2 * A * E) / det;
  // Value of the conic at the centre: the quadratic part equals −F0 on the ellipse.
  const F0 = A * cx * cx + B * cx * cy + C * cy * cy + D * cx + E * cy + F;
  // Eigenvalues of [[A, B/2], [B/2, C]].
  const tr = A + C;
  const diff = Math.hypot(A - C, B);
  const l1 = (tr - diff) / 2;
  const l2 = (tr + diff) / 2;
  // Both eigenvalues share a sign (det > 0); the ellipse is real when −F0 has that sign too.
  const r1sq = -F0 / l1;
  const r2sq = -F0 / l2;
  if (!(r1sq > 0) || !(r2sq > 0)) return null;
  // The smaller |eigenvalue| belongs to the major axis.
  const major = Math.abs(l1) <= Math.abs(l2) ? l1 : l2;
  const rx = Math.sqrt(Math.max(r1sq, r2sq));
  const ry = Math.sqrt(Math.min(r1sq, r2sq));
  // Eigenvector of the major eigenvalue: (B/2, major − A) or (major − C, B/2).
  let ex = B / 2;
  let ey = major - A;
  if (Math.hypot(ex, ey) < 1e-12 * (Math.abs(A) + Math.abs(C))) {
    ex = major - C;
    ey = B / 2;
  }
  let angle = Math.hypot(ex, ey) === 0 ? 0 : Math.atan2(ey, ex);
  if (angle <= -Math.PI / 2) angle += Math.PI;
  if (angle > Math.PI / 2) angle -= Math.PI;
  if (rx - ry <= 1e-12 * rx) angle = 0; // a circle has no major axis
  return { cx, cy, rx, ry, angle };
}

/** Conic coefficients of an ellipse given by centre, semi-axes and rotation. */
export function ellipseToConic(e: Ellipse): Conic {
  const cos = Math.cos(e.angle);
  const sin = Math.sin(e.angle);
  const a2 = e.rx * e.rx;
  const b2 = e.ry * e.ry;
  const A = (cos * cos) / a2 + (sin * sin) / b2;
  const B = 2 * cos * sin * (1 / a2 - 1 / b2);
  const C = (sin * sin) / a2 + (cos * cos) / b2;
  const D = -2 * A * e.cx - B * e.cy;
  const E = -B * e.cx - 2 * C * e.cy;
  const F = A * e.cx * e.cx + B * e.cx * e.cy + C * e.cy * e.cy - 1;
  const k = Math.hypot(A, B, C);
  return [A / k, B / k, C / k, D / k, E / k, F / k];
}

/**
 * First-order (Sampson) approximation of the geometric distance from a point
 * to the conic: |Q(p)| / ‖∇Q(p)‖. Exact to first order near the curve.
 */
export function sampsonDistance(conic: Conic, x: number, y: number): number {
  const [A, B, C, D, E, F] = conic;
  const q = A * x * x + B * x * y + C * y * y + D * x + E * y + F;
  const gx = 2 * A * x + B * y + D;
  const gy = B * x + 2 * C * y + E;
  const g = Math.hypot(gx, gy);
  if (g === 0) return Math.abs(q) === 0 ? 0 : Infinity;
  return Math.abs(q) / g;
}

// ---------------------------------------------------------------------------
// 3×3 helpers

function zero3(): Mat3 {
  return [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
}

function transpose3(m: Mat3): Mat3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}

function mul3(a: Mat3, b: Mat3): Mat3 {
  const out = zero3();
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[r][c] = a[r][0] * b[0][c] + a[r][1] * b[1][c] + a[r][2] * b[2][c];
  return out;
}

function add3(a: Mat3, b: Mat3): Mat3 {
  const out = zero3();
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[r][c] = a[r][c] + b[r][c];
  return out;
}

function scale3(a: Mat3, k: number): Mat3 {
  const out = zero3();
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[r][c] = a[r][c] * k;
  return out;
}

function mulVec3(m: Mat3, v: Vec3): Vec3 {
  return [
    m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2],
    m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2],
    m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2],
  ];
}

function det3(m: Mat3): number {
  return (
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
    m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
    m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
  );
}

function invert3(m: Mat3): Mat3 | null {
  const d = det3(m);
  let scale = 0;
  for (const row of m) for (const v of row) scale = Math.max(scale, Math.abs(v));
  if (!(Math.abs(d) > 1e-14 * scale * scale * scale)) return null;
  const inv: Mat3 = [
    [m[1][1] * m[2][2] - m[1][2] * m[2][1], m[0][2] * m[2][1] - m[0][1] * m[2][2], m[0][1] * m[1][2] - m[0][2] * m[1][1]],
    [m[1][2] * m[2][0] - m[1][0] * m[2][2], m[0][0] * m[2][2] - m[0][2] * m[2][0], m[0][2] * m[1][0] - m[0][0] * m[1][2]],
    [m[1][0] * m[2][1] - m[1][1] * m[2][0], m[0][1] * m[2][0] - m[0][0] * m[2][1], m[0][0] * m[1][1] - m[0][1] * m[1][0]],
  ];
  return scale3(inv, 1 / d);
}

/** Real roots of the characteristic polynomial det(M − λI), polished by Newton steps. */
function realEigenvalues(m: Mat3): number[] {
  // λ³ − c2·λ² + c1·λ − c0 = 0
  const c2 = m[0][0] + m[1][1] + m[2][2];
  const c1 =
    m[0][0] * m[1][1] - m[0][1] * m[1][0] + m[0][0] * m[2][2] - m[0][2] * m[2][0] + m[1][1] * m[2][2] - m[1][2] * m[2][1];
  const c0 = det3(m);
  const roots = cubicRoots(-c2, c1, -c0);
  const p = (x: number): number => ((x - c2) * x + c1) * x - c0;
  const dp = (x: number): number => (3 * x - 2 * c2) * x + c1;
  return roots.map((r) => {
    let x = r;
    for (let k = 0; k < 4; k++) {
      const d = dp(x);
      if (d === 0) break;
      const nx = x - p(x) / d;
      if (!Number.isFinite(nx)) break;
      x = nx;
    }
    return x;
  });
}

/** Real roots of x³ + a·x² + b·x + c. */
function cubicRoots(a: number, b: number, c: number): number[] {
  const q = (a * a - 3 * b) / 9;
  const r = (2 * a * a * a - 9 * a * b + 27 * c) / 54;
  const q3 = q * q * q;
  if (r * r <= q3) {
    // Three real roots (trigonometric form).
    const sq = Math.sqrt(Math.max(q, 0));
    const arg = sq === 0 ? 0 : Math.max(-1, Math.min(1, r / (sq * sq * sq)));
    const t = Math.acos(arg);
    return [
      -2 * sq * Math.cos(t / 3) - a / 3,
      -2 * sq * Math.cos((t + 2 * Math.PI) / 3) - a / 3,
      -2 * sq * Math.cos((t - 2 * Math.PI) / 3) - a / 3,
    ];
  }
  const A = -Math.sign(r) * Math.cbrt(Math.abs(r) + Math.sqrt(r * r - q3));
  const B = A === 0 ? 0 : q / A;
  return [A + B - a / 3];
}

/** A unit eigenvector of M for eigenvalue λ: null vector of M − λI, refined by inverse iteration. */
function eigenvector(m: Mat3, lambda: number): Vec3 | null {
  const a: Mat3 = [
    [m[0][0] - lambda, m[0][1], m[0][2]],
    [m[1][0], m[1][1] - lambda, m[1][2]],
    [m[2][0], m[2][1], m[2][2] - lambda],
  ];
  // The cross product of two rows is orthogonal to both: the null vector when they are independent.
  let best: Vec3 | null = null;
  let bestNorm = 0;
  for (const [i, j] of [
    [0, 1],
    [0, 2],
    [1, 2],
  ] as const) {
    const v = cross(a[i], a[j]);
    const nv = Math.hypot(v[0], v[1], v[2]);
    if (nv > bestNorm) {
      bestNorm = nv;
      best = v;
    }
  }
  if (!best || !(bestNorm > 0)) return null;
  let v: Vec3 = [best[0] / bestNorm, best[1] / bestNorm, best[2] / bestNorm];
  // Two steps of inverse iteration with a tiny shift sharpen the vector.
  let scale = 0;
  for (const row of m) for (const x of row) scale = Math.max(scale, Math.abs(x));
  const shift = lambda + 1e-10 * Math.max(scale, 1e-300);
  const shifted: Mat3 = [
    [m[0][0] - shift, m[0][1], m[0][2]],
    [m[1][0], m[1][1] - shift, m[1][2]],
    [m[2][0], m[2][1], m[2][2] - shift],
  ];
  const inv = invert3(shifted);
  if (inv) {
    for (let k = 0; k < 2; k++) {
      const w = mulVec3(inv, v);
      const nw = Math.hypot(w[0], w[1], w[2]);
      if (!(nw > 0) || !Number.isFinite(nw)) break;
      v = [w[0] / nw, w[1] / nw, w[2] / nw];
    }
  }
  return v;
}

function cross(a: Vec3, b: Vec3): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}
