/**
 * Un-projection of a tilted pie's top face: the map that turns the drawn
 * ellipse back into the circle it depicts, so that angles measured around the
 * circle's centre are the angles of the data.
 *
 * Orthographic view (the usual "3D pie"): a circle tilted by θ is drawn as an
 * ellipse with minor/major = cos θ and the circle's centre at the ellipse's
 * centre; un-projecting is a stretch by 1/cos θ along the minor axis.
 *
 * Perspective view: the circle's centre is drawn away from the ellipse's
 * centre. If the drawn centre c is known (the apex where the wedges meet), the
 * polar line of c with respect to the ellipse is the image of the line at
 * infinity (the centre of a circle is the pole of the line at infinity, and
 * projective maps keep pole–polar pairs). A homography that sends that line
 * back to infinity and fixes c leaves an ellipse centred on c, and the stretch
 * above finishes the job. Any two maps that send the ellipse to a circle
 * and c to its centre differ by a rotation or reflection about c, so angles
 * (and shares) are determined. When c is the ellipse centre the homography is
 * the identity and the method is the orthographic one.
 */
import { conicToEllipse, ellipseToConic, type Ellipse } from './fit-ellipse.js';

export interface Rectifier {
  /** The drawn ellipse (page coordinates). */
  ellipse: Ellipse;
  /** Centre of the un-projected circle; the drawn centre, which stays where it is. */
  cx: number;
  cy: number;
  /** Radius of the un-projected circle in world units. */
  radius: number;
  /** Tilt from minor/major = cos θ (orthographic projection), radians. */
  tilt: number;
  /** Page point → un-projected point; null beyond the vanishing line. */
  forward(x: number, y: number): [number, number] | null;
  /** Un-projected point → page point; null when it has no finite image. */
  inverse(x: number, y: number): [number, number] | null;
}

type Mat3 = [[number, number, number], [number, number, number], [number, number, number]];

/**
 * The un-projection for an ellipse whose circle's drawn centre is (cx, cy).
 * Returns null when the centre is not inside the ellipse or the ellipse is
 * degenerate.
 */
export function rectifierFor(ellipse: Ellipse, cx: number, cy: number): Rectifier | null {
  if (![ellipse.cx, ellipse.cy, ellipse.rx, ellipse.ry, ellipse.angle, cx, cy].every(Number.isFinite)) return null;
  if (!(ellipse.rx > 0) || !(ellipse.ry > 0)) return null;
  const [A, B, C, D, E, F] = ellipseToConic(ellipse);
  // Conic in coordinates centred on the drawn centre.
  const D1 = 2 * A * cx + B * cy + D;
  const E1 = B * cx + 2 * C * cy + E;
  const F1 = A * cx * cx + B * cx * cy + C * cy * cy + D * cx + E * cy + F;
  // Inside an ellipse written with positive quadratic part the conic is negative.
  if (!(F1 < 0)) return null;
  // Homography H = [[1,0,0],[0,1,0],[g1,g2,1]] sends the polar line (D1/2, E1/2, F1) to infinity.
  const g1 = D1 / (2 * F1);
  const g2 = E1 / (2 * F1);
  const Q: Mat3 = [
    [A, B / 2, D1 / 2],
    [B / 2, C, E1 / 2],
    [D1 / 2, E1 / 2, F1],
  ];
  // Q' = H⁻ᵀ Q H⁻¹ with H⁻¹ = [[1,0,0],[0,1,0],[−g1,−g2,1]].
  const Hinv: Mat3 = [
    [1, 0, 0],
    [0, 1, 0],
    [-g1, -g2, 1],
  ];
  const Qp = mul(transpose(Hinv), mul(Q, Hinv));
  const straight = conicToEllipse([Qp[0][0], 2 * Qp[0][1], Qp[1][1], 2 * Qp[0][2], 2 * Qp[1][2], Qp[2][2]]);
  if (!straight) return null;
  const a = straight.rx;
  const b = straight.ry;
  const cos = Math.cos(straight.angle);
  const sin = Math.sin(straight.angle);
  const k = a / b;
  // Stretch by k along the minor axis (direction (−sin, cos)).
  const stretch = (x: number, y: number, f: number): [number, number] => {
    const u = x * cos + y * sin;
    const v = (-x * sin + y * cos) * f;
    return [u * cos - v * sin, u * sin + v * cos];
  };
  const tilt = Math.acos(Math.min(1, ellipse.ry / ellipse.rx));
  return {
    ellipse,
    cx,
    cy,
    radius: a,
    tilt,
    forward(x, y) {
      const X = x - cx;
      const Y = y - cy;
      const w = 1 + g1 * X + g2 * Y;
      if (!(w > 1e-9)) return null;
      const [u, v] = stretch(X / w, Y / w, k);
      return [cx + u, cy + v];
    },
    inverse(x, y) {
      const [X, Y] = stretch(x - cx, y - cy, 1 / k);
      const den = 1 - g1 * X - g2 * Y;
      if (!(den > 1e-9)) return null;
      return [cx + X / den, cy + Y / den];
    },
  };
}

function transpose(m: Mat3): Mat3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}

function mul(a: Mat3, b: Mat3): Mat3 {
  const out: Mat3 = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) out[r][c] = a[r][0] * b[0][c] + a[r][1] * b[1][c] + a[r][2] * b[2][c];
  return out;
}
