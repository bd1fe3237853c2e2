/**
 * Elliptical arcs: conversion from the endpoint parameterisation used in path
 * data to the centre parameterisation used for measuring (SVG 1.1 Second
 * Edition, Appendix F.6.5), with the corrections for out-of-range parameters
 * of Appendix F.6.6.
 */
import { cosSinDegrees } from './matrix.js';
import type { ArcSegment, LineSegment } from './segments.js';

/**
 * Points on the arc are (cx, cy) + R(phi)·(rx·cos t, ry·sin t) for t running
 * from theta1 to theta1 + dtheta. Angles are radians; dtheta > 0 for
 * sweep-flag 1 (increasing angle: clockwise on screen, where y points down).
 * rx and ry are the radii after the F.6.6 scale-up, so they may exceed the
 * radii written in the path data.
 */
export interface ArcCenter {
  readonly cx: number;
  readonly cy: number;
  readonly rx: number;
  readonly ry: number;
  /** x-axis rotation in radians. */
  readonly phi: number;
  readonly theta1: number;
  /** In (−2π, 2π); never 0 for a drawn arc. */
  readonly dtheta: number;
}

const TWO_PI = 2 * Math.PI;

/**
 * Centre parameterisation of the arc from (x1, y1) to (x2, y2).
 *
 * Returns:
 * - `'omit'` when the endpoints coincide (F.6.2: the segment is left out);
 * - `'line'` when rx or ry is 0 (F.6.2: a straight line), or when the
 *   numbers are so extreme that no finite centre exists;
 * - the centre parameterisation otherwise. Negative radii are taken as their
 *   absolute values and radii too small to reach the endpoint are scaled up
 *   uniformly (F.6.6).
 *
 * The arithmetic is arranged to avoid squaring the inputs, so coordinates
 * up to ~1e307 do not overflow.
 */
export function arcCenter(
  x1: number,
  y1: number,
  rxIn: number,
  ryIn: number,
  xAxisRotationDeg: number,
  largeArc: boolean,
  sweep: boolean,
  x2: number,
  y2: number,
): ArcCenter | 'omit' | 'line' {
  if (x1 === x2 && y1 === y2) return 'omit';
  let rx = Math.abs(rxIn);
  let ry = Math.abs(ryIn);
  if (rx === 0 || ry === 0 || !Number.isFinite(rx) || !Number.isFinite(ry)) return 'line';
  const [cos, sin] = cosSinDegrees(xAxisRotationDeg);
  const phi = Number.isFinite(xAxisRotationDeg) ? ((xAxisRotationDeg % 360) * Math.PI) / 180 : 0;
  // Step 1 (F.6.5.1): (x1', y1') = R(−phi)·((x1 − x2)/2, (y1 − y2)/2).
  const hx = x1 / 2 - x2 / 2;
  const hy = y1 / 2 - y2 / 2;
  const x1p = cos * hx + sin * hy;
  const y1p = -sin * hx + cos * hy;
  // F.6.6.2: Λ = x1'²/rx² + y1'²/ry²; if Λ > 1 scale the radii by √Λ.
  const qx = x1p / rx;
  const qy = y1p / ry;
  const lambda = qx * qx + qy * qy;
  if (!(lambda > 0) || !Number.isFinite(lambda)) return 'line';
  let coef = 0;
  if (lambda > 1) {
    const s = Math.sqrt(lambda);
    rx *= s;
    ry *= s;
  } else {
    // Step 2 (F.6.5.2): the radicand (rx²ry² − rx²y1'² − ry²x1'²)/(rx²y1'² + ry²x1'²)
    // divided through by rx²ry² is (1 − Λ)/Λ.
    coef = Math.sqrt(Math.max(0, (1 - lambda) / lambda));
    if (largeArc === sweep) coef = -coef;
  }
  const cxp = coef * ((rx * y1p) / ry);
  const cyp = coef * (-(ry * x1p) / rx);
  // Step 3 (F.6.5.3): (cx, cy) = R(phi)·(cx', cy') + midpoint.
  const cx = cos * cxp - sin * cyp + (x1 / 2 + x2 / 2);
  const cy = sin * cxp + cos * cyp + (y1 / 2 + y2 / 2);
  // Step 4 (F.6.5.4–6): angles of u = ((x1' − cx')/rx, (y1' − cy')/ry) and
  // v = ((−x1' − cx')/rx, (−y1' − cy')/ry).
  const ux = (x1p - cxp) / rx;
  const uy = (y1p - cyp) / ry;
  const vx = (-x1p - cxp) / rx;
  const vy = (-y1p - cyp) / ry;
  const theta1 = Math.atan2(uy, ux);
  let dtheta = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  if (!sweep && dtheta > 0) dtheta -= TWO_PI;
  else if (sweep && dtheta < 0) dtheta += TWO_PI;
  if (
    !Number.isFinite(cx) ||
    !Number.isFinite(cy) ||
    !Number.isFinite(rx) ||
    !Number.isFinite(ry) ||
    !Number.isFinite(theta1) ||
    !Number.isFinite(dtheta) ||
    dtheta === 0
  ) {
    return 'line';
  }
  return { cx, cy, rx, ry, phi, theta1, dtheta };
}

/**
 * The segment an arc command produces: an ArcSegment, a LineSegment when
 * the arc degenerates to a line, or null when it is omitted.
 */
export function arcSegment(
  x0: number,
  y0: number,
  rx: number,
  ry: number,
  xAxisRotation: number,
  largeArc: boolean,
  sweep: boolean,
  x: number,
  y: number,
): ArcSegment | LineSegment | null {
  const center = arcCenter(x0, y0, rx, ry, xAxisRotation, largeArc, sweep, x, y);
  if (center === 'omit') return null;
  if (center === 'line') return { type: 'L', x0, y0, x, y };
  return {
    type: 'A',
    x0,
    y0,
    rx: Math.abs(rx),
    ry: Math.abs(ry),
    xAxisRotation,
    largeArc,
    sweep,
    x,
    y,
    center,
  };
}

/** The point of the arc at parameter angle t (radians). */
export function arcPointAt(c: ArcCenter, t: number): { x: number; y: number } {
  const cp = Math.cos(c.phi);
  const sp = Math.sin(c.phi);
  const ex = c.rx * Math.cos(t);
  const ey = c.ry * Math.sin(t);
  return { x: c.cx + cp * ex - sp * ey, y: c.cy + sp * ex + cp * ey };
}

/**
 * An arc under an affine map, as P(t) = (cx, cy) + (ux, uy)·cos t + (vx, vy)·sin t
 * for t from t0 to t0 + dt. U and V are the images of the ellipse's semi-axis
 * vectors (conjugate semi-diameters of the image ellipse).
 */
export interface AffineArc {
  cx: number;
  cy: number;
  ux: number;
  uy: number;
  vx: number;
  vy: number;
  t0: number;
  dt: number;
}

/** The image of an arc's centre parameterisation under the matrix [a b c d e f]. */
export function affineArc(c: ArcCenter, a: number, b: number, cc: number, d: number, e: number, f: number): AffineArc {
  const cp = Math.cos(c.phi);
  const sp = Math.sin(c.phi);
  // Semi-axis vectors before the map: U = rx·(cos φ, sin φ), V = ry·(−sin φ, cos φ).
  const ux0 = c.rx * cp;
  const uy0 = c.rx * sp;
  const vx0 = -c.ry * sp;
  const vy0 = c.ry * cp;
  return {
    cx: a * c.cx + cc * c.cy + e,
    cy: b * c.cx + d * c.cy + f,
    ux: a * ux0 + cc * uy0,
    uy: b * ux0 + d * uy0,
    vx: a * vx0 + cc * vy0,
    vy: b * vx0 + d * vy0,
    t0: c.theta1,
    dt: c.dtheta,
  };
}
