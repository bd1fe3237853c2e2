/**
 * 2-D affine matrices in SVG order.
 *
 * `[a, b, c, d, e, f]` stands for the 3×3 matrix
 *
 *     | a c e |
 *     | b d f |
 *     | 0 0 1 |
 *
 * and maps a point (x, y) to (a·x + c·y + e, b·x + d·y + f), exactly as the
 * SVG `matrix(a b c d e f)` transform function does.
 */

export type Matrix = readonly [a: number, b: number, c: number, d: number, e: number, f: number];

export interface Point {
  readonly x: number;
  readonly y: number;
}

export const identity: Matrix = Object.freeze([1, 0, 0, 1, 0, 0] as const);

/**
 * The product m1·m2. Applying the result to a point applies **m2 first, then
 * m1**: `applyToPoint(multiply(m1, m2), p) = applyToPoint(m1, applyToPoint(m2, p))`.
 *
 * This is the order of SVG nesting and of transform lists: for
 * `<g transform="A"><path transform="B"/></g>` the path's world matrix is
 * `multiply(A, B)`, and `transform="A B"` is likewise `multiply(A, B)`.
 */
export function multiply(m1: Matrix, m2: Matrix): Matrix {
  const [a1, b1, c1, d1, e1, f1] = m1;
  const [a2, b2, c2, d2, e2, f2] = m2;
  return [
    a1 * a2 + c1 * b2,
    b1 * a2 + d1 * b2,
    a1 * c2 + c1 * d2,
    b1 * c2 + d1 * d2,
    a1 * e2 + c1 * f2 + e1,
    b1 * e2 + d1 * f2 + f1,
  ];
}

/** The image of point p under m. */
export function applyToPoint(m: Matrix, p: Point): Point {
  return { x: m[0] * p.x + m[2] * p.y + m[4], y: m[1] * p.x + m[3] * p.y + m[5] };
}

/** The image of the vector v under the linear part of m (translation ignored). */
export function applyToVector(m: Matrix, v: Point): Point {
  return { x: m[0] * v.x + m[2] * v.y, y: m[1] * v.x + m[3] * v.y };
}

/** a·d − b·c: the factor by which m scales signed areas. */
export function determinant(m: Matrix): number {
  return m[0] * m[3] - m[1] * m[2];
}

/** True when all six entries are finite numbers. */
export function isFiniteMatrix(m: Matrix): boolean {
  return (
    Number.isFinite(m[0]) &&
    Number.isFinite(m[1]) &&
    Number.isFinite(m[2]) &&
    Number.isFinite(m[3]) &&
    Number.isFinite(m[4]) &&
    Number.isFinite(m[5])
  );
}

export function isIdentity(m: Matrix): boolean {
  return m[0] === 1 && m[1] === 0 && m[2] === 0 && m[3] === 1 && m[4] === 0 && m[5] === 0;
}

/**
 * The inverse of m, or null when m is singular (determinant 0), not finite,
 * or so close to singular that the inverse overflows.
 */
export function invert(m: Matrix): Matrix | null {
  const [a, b, c, d, e, f] = m;
  const det = a * d - b * c;
  if (det === 0 || !Number.isFinite(det)) return null;
  const r: Matrix = [
    d / det,
    -b / det,
    -c / det,
    a / det,
    (c * f - d * e) / det,
    (b * e - a * f) / det,
  ];
  return isFiniteMatrix(r) ? r : null;
}

export function translation(tx: number, ty = 0): Matrix {
  return [1, 0, 0, 1, tx, ty];
}

export function scaling(sx: number, sy: number = sx): Matrix {
  return [sx, 0, 0, sy, 0, 0];
}

/**
 * cos and sin of an angle in degrees, exact for multiples of 90° (so that
 * `rotate(90)` gives 0 rather than 6e-17 off-diagonal terms).
 */
export function cosSinDegrees(deg: number): [cos: number, sin: number] {
  const r = deg % 360;
  if (r === 0) return [1, 0];
  if (r === 90 || r === -270) return [0, 1];
  if (r === 180 || r === -180) return [-1, 0];
  if (r === 270 || r === -90) return [0, -1];
  const rad = (r * Math.PI) / 180;
  return [Math.cos(rad), Math.sin(rad)];
}

/**
 * Rotation by `deg` degrees (positive turns the x axis towards the y axis,
 * i.e. clockwise on screen where y points down), optionally about (cx, cy).
 */
export function rotation(deg: number, cx = 0, cy = 0): Matrix {
  const [cos, sin] = cosSinDegrees(deg);
  // translate(cx, cy) · rotate(deg) · translate(−cx, −cy), multiplied out.
  return [cos, sin, -sin, cos, cx - cos * cx + sin * cy, cy - sin * cx - cos * cy];
}

/** skewX(deg): x' = x + tan(deg)·y. */
export function skewingX(deg: number): Matrix {
  return [1, 0, Math.tan((deg * Math.PI) / 180), 1, 0, 0];
}

/** skewY(deg): y' = y + tan(deg)·x. */
export function skewingY(deg: number): Matrix {
  return [1, Math.tan((deg * Math.PI) / 180), 0, 1, 0, 0];
}

export interface Decomposition {
  translateX: number;
  translateY: number;
  /** Radians, positive from +x towards +y (clockwise on screen). */
  rotation: number;
  /** Always ≥ 0. */
  scaleX: number;
  /** Negative when m mirrors (determinant < 0). */
  scaleY: number;
  /** Radians: the skewX angle of the factorisation below. */
  skew: number;
}

/**
 * Splits m into `translate(e f) · rotate(rotation) · skewX(skew) · scale(scaleX scaleY)`
 * (applied right to left to points). The factorisation is unique for a
 * non-singular m with scaleX > 0. For a matrix whose first column is zero,
 * scaleX = 0, skew = 0 and rotation is chosen so that the second column is
 * (0, scaleY) rotated.
 */
export function decompose(m: Matrix): Decomposition {
  const [a, b, c, d, e, f] = m;
  const sx = Math.hypot(a, b);
  if (sx === 0) {
    return { translateX: e, translateY: f, rotation: Math.atan2(-c, d), scaleX: 0, scaleY: Math.hypot(c, d), skew: 0 };
  }
  // First column = sx·(cos θ, sin θ); det = sx·sy; a·c + b·d = sx·sy·tan(skew).
  const det = a * d - b * c;
  const sy = det / sx;
  const rot = Math.atan2(b, a);
  let skew = 0;
  if (det !== 0) {
    skew = Math.atan((a * c + b * d) / det);
  } else {
    // Singular with a non-zero first column: the second column is parallel to
    // the first, which the skew can only reach in the limit; report ±90°.
    const dot = a * c + b * d;
    skew = dot === 0 ? 0 : dot > 0 ? Math.PI / 2 : -Math.PI / 2;
  }
  return { translateX: e, translateY: f, rotation: rot, scaleX: sx, scaleY: sy, skew };
}
