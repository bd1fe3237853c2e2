import { describe, expect, it } from 'vitest';
import {
  applyToPoint,
  decompose,
  determinant,
  identity,
  invert,
  isFiniteMatrix,
  multiply,
  rotation,
  scaling,
  skewingX,
  translation,
  type Matrix,
} from '../engine/read/geometry/matrix.js';

function expectMatrix(actual: Matrix | null, expected: readonly number[], digits = 12): void {
  expect(actual).not.toBeNull();
  for (let k = 0; k < 6; k++) expect(actual![k]).toBeCloseTo(expected[k], digits);
}

describe('matrix', () => {
  it('multiplies in SVG order: multiply(m1, m2) applies m2 first', () => {
    // source: SVG 1.1 (Second Edition) §7.4–7.5: [a b c d e f] is the 3×3 matrix
    // |a c e; b d f; 0 0 1| and nested transforms multiply parent · child.
    // Hand computation, m1 = translate(10 20) = [1 0 0 1 10 20], m2 = scale(2 3) = [2 0 0 3 0 0]:
    //   a = 1·2 + 0·0 = 2, b = 0·2 + 1·0 = 0, c = 1·0 + 0·3 = 0, d = 0·0 + 1·3 = 3,
    //   e = 1·0 + 0·0 + 10 = 10, f = 0·0 + 1·0 + 20 = 20  →  [2 0 0 3 10 20]
    expectMatrix(multiply(translation(10, 20), scaling(2, 3)), [2, 0, 0, 3, 10, 20]);
    // Reverse order: scale(2 3)·translate(10 20): e = 2·10 = 20, f = 3·20 = 60 → [2 0 0 3 20 60]
    expectMatrix(multiply(scaling(2, 3), translation(10, 20)), [2, 0, 0, 3, 20, 60]);
    // The point (1, 1): scale first gives (2, 3), then translate gives (12, 23).
    const p = applyToPoint(multiply(translation(10, 20), scaling(2, 3)), { x: 1, y: 1 });
    expect(p).toEqual({ x: 12, y: 23 });
  });

  it('composes a general pair entry by entry', () => {
    // Hand computation with m1 = [1 2 3 4 5 6], m2 = [7 8 9 10 11 12]:
    //   a = 1·7 + 3·8 = 31          b = 2·7 + 4·8 = 46
    //   c = 1·9 + 3·10 = 39         d = 2·9 + 4·10 = 58
    //   e = 1·11 + 3·12 + 5 = 52    f = 2·11 + 4·12 + 6 = 76
    expect(multiply([1, 2, 3, 4, 5, 6], [7, 8, 9, 10, 11, 12])).toEqual([31, 46, 39, 58, 52, 76]);
  });

  it('rotates exactly at right angles and about a centre', () => {
    // source: SVG 1.1 (Second Edition) §7.6: rotate(a) = [cos a, sin a, −sin a, cos a, 0, 0];
    // rotate(a cx cy) = translate(cx cy) rotate(a) translate(−cx −cy).
    expect(rotation(90)).toEqual([0, 1, -1, 0, 0, 0]);
    expect(rotation(-90)).toEqual([0, -1, 1, 0, 0, 0]);
    // rotate(90 10 0): (10, 0) is fixed; (20, 0) → (10, 10).
    const m = rotation(90, 10, 0);
    expect(applyToPoint(m, { x: 10, y: 0 })).toEqual({ x: 10, y: 0 });
    expect(applyToPoint(m, { x: 20, y: 0 })).toEqual({ x: 10, y: 10 });
    // 30°: cos = √3/2, sin = 1/2.
    expectMatrix(rotation(30), [Math.sqrt(3) / 2, 0.5, -0.5, Math.sqrt(3) / 2, 0, 0]);
  });

  it('inverts and detects singular matrices', () => {
    // [2 0 0 4 10 20]⁻¹: x = (x' − 10)/2, y = (y' − 20)/4 → [0.5 0 0 0.25 −5 −5]
    expectMatrix(invert([2, 0, 0, 4, 10, 20]), [0.5, 0, 0, 0.25, -5, -5]);
    const m: Matrix = [1, 2, 3, 4, 5, 6];
    expectMatrix(multiply(m, invert(m)!), identity);
    expect(invert([1, 2, 2, 4, 0, 0])).toBeNull(); // det = 1·4 − 2·2 = 0
    expect(invert([0, 0, 0, 0, 1, 1])).toBeNull();
    expect(invert([1e-320, 0, 0, 1e-320, 0, 0])).toBeNull(); // inverse overflows
    expect(invert([NaN, 0, 0, 1, 0, 0])).toBeNull();
  });

  it('decomposes into translate · rotate · skewX · scale', () => {
    // Build translate(5 6) rotate(30) skewX(20) scale(2 3) and recover the parts.
    const m = multiply(multiply(multiply(translation(5, 6), rotation(30)), skewingX(20)), scaling(2, 3));
    const dec = decompose(m);
    expect(dec.translateX).toBeCloseTo(5, 12);
    expect(dec.translateY).toBeCloseTo(6, 12);
    expect(dec.rotation).toBeCloseTo(Math.PI / 6, 12);
    expect(dec.skew).toBeCloseTo((20 * Math.PI) / 180, 12);
    expect(dec.scaleX).toBeCloseTo(2, 12);
    expect(dec.scaleY).toBeCloseTo(3, 12);
    // A mirror: scale(1 −1) gives scaleY −1, det −1.
    const mirror = decompose([1, 0, 0, -1, 0, 0]);
    expect(mirror.scaleY).toBe(-1);
    expect(determinant([1, 0, 0, -1, 0, 0])).toBe(-1);
    // Degenerate first column.
    const d0 = decompose([0, 0, 0, 2, 0, 0]);
    expect(d0.scaleX).toBe(0);
    expect(d0.scaleY).toBe(2);
  });

  it('reports finiteness', () => {
    expect(isFiniteMatrix(identity)).toBe(true);
    expect(isFiniteMatrix([1, 0, 0, 1, Infinity, 0])).toBe(false);
    expect(isFiniteMatrix([1, 0, 0, NaN, 0, 0])).toBe(false);
    expect(isFiniteMatrix([1e308, 0, 0, 1e308, 0, 0])).toBe(true);
  });
});
