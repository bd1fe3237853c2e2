import { converter } from 'culori';
import { MACHADO_2009_MATRICES, type Matrix3 } from './machado-2009-matrices.js';
import { assertRgba, CVD_TYPES, type CvdType, type Rgba } from './types.js';

const toLinear = converter('lrgb');
const toRgb = converter('rgb');

function checkType(type: unknown): asserts type is CvdType {
  if (!CVD_TYPES.includes(type as CvdType)) {
    throw new RangeError(`CVD type must be one of ${CVD_TYPES.join(', ')}; got ${String(type)}`);
  }
}

function checkSeverity(severity: unknown): asserts severity is number {
  if (typeof severity !== 'number' || !(severity >= 0 && severity <= 1)) {
    throw new RangeError(`CVD severity must be a number in 0..1; got ${String(severity)}`);
  }
}

/**
 * The Machado et al. (2009) matrix for a deficiency type and severity 0..1.
 * Severities between the published 0.1 steps interpolate linearly, element by
 * element, between the two neighbouring matrices.
 */
export function cvdMatrix(type: CvdType, severity = 1): Matrix3 {
  checkType(type);
  checkSeverity(severity);
  const table = MACHADO_2009_MATRICES[type];
  const pos = severity * 10;
  // Snap float noise such as 0.3 * 10 = 3.0000000000000004 onto the grid.
  const near = Math.round(pos);
  if (Math.abs(pos - near) < 1e-9) return table[near];
  const lo = Math.floor(pos);
  const w = pos - lo;
  const A = table[lo];
  const B = table[lo + 1];
  const row = (i: 0 | 1 | 2) =>
    [0, 1, 2].map((j) => A[i][j] * (1 - w) + B[i][j] * w) as unknown as readonly [number, number, number];
  return [row(0), row(1), row(2)];
}

const clamp01 = (v: number) => (v < 0 ? 0 : v > 1 ? 1 : v);

/** Applies a 3x3 matrix in linear RGB; no argument checks, for inner loops. */
export function applyCvdMatrixUnchecked(c: Rgba, m: Matrix3): Rgba {
  const lin = toLinear({ mode: 'rgb', r: c.r, g: c.g, b: c.b });
  const r = m[0][0] * lin.r + m[0][1] * lin.g + m[0][2] * lin.b;
  const g = m[1][0] * lin.r + m[1][1] * lin.g + m[1][2] * lin.b;
  const b = m[2][0] * lin.r + m[2][1] * lin.g + m[2][2] * lin.b;
  const out = toRgb({ mode: 'lrgb', r: clamp01(r), g: clamp01(g), b: clamp01(b) });
  return { r: clamp01(out.r), g: clamp01(out.g), b: clamp01(out.b), alpha: c.alpha };
}

/**
 * Simulates how a colour appears with a colour-vision deficiency, after
 * Machado, Oliveira & Fernandes (2009).
 *
 * Pipeline: decode sRGB to linear light (IEC 61966-2-1, culori `lrgb`),
 * multiply by the model matrix, clamp each channel to 0..1 (the sRGB gamut),
 * re-encode. The matrices act on linear RGB; applying them to gamma-encoded
 * sRGB (as culori's `filterDeficiency*` does) gives different, darker
 * results. `severity` 1 simulates dichromacy (protanopia, deuteranopia,
 * tritanopia); smaller values anomalous trichromacy, interpolated between
 * the published 0.1 steps. Alpha passes through unchanged.
 */
export function simulateCvd(c: Rgba, type: CvdType, severity = 1): Rgba {
  assertRgba(c);
  return applyCvdMatrixUnchecked(c, cvdMatrix(type, severity));
}
