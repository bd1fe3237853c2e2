import { describe, expect, it } from 'vitest';
import { identity } from '../engine/read/geometry/matrix.js';
import { parseTransform } from '../engine/read/geometry/parse-transform.js';

function close(actual: readonly number[], expected: readonly number[]): void {
  for (let k = 0; k < 6; k++) expect(actual[k]).toBeCloseTo(expected[k], 12);
}

describe('parseTransform', () => {
  it('reads each transform function', () => {
    // source: SVG 1.1 (Second Edition) §7.6, the transform attribute
    expect(parseTransform('matrix(1 2 3 4 5 6)').matrix).toEqual([1, 2, 3, 4, 5, 6]);
    expect(parseTransform('translate(7)').matrix).toEqual([1, 0, 0, 1, 7, 0]); // ty defaults to 0
    expect(parseTransform('translate(7, -8)').matrix).toEqual([1, 0, 0, 1, 7, -8]);
    expect(parseTransform('scale(3)').matrix).toEqual([3, 0, 0, 3, 0, 0]); // sy defaults to sx
    expect(parseTransform('scale(3 4)').matrix).toEqual([3, 0, 0, 4, 0, 0]);
    expect(parseTransform('rotate(90)').matrix).toEqual([0, 1, -1, 0, 0, 0]);
    // skewX(45) = [1 0 tan45 1 0 0], skewY(45) = [1 tan45 0 1 0 0]
    close(parseTransform('skewX(45)').matrix, [1, 0, 1, 1, 0, 0]);
    close(parseTransform('skewY(45)').matrix, [1, 1, 0, 1, 0, 0]);
    // rotate(180 5 5): e = 5 − (−1)·5 + 0·5 = 10, f = 5 − 0·5 − (−1)·5 = 10 → [−1 0 0 −1 10 10]
    expect(parseTransform('rotate(180 5 5)').matrix).toEqual([-1, 0, -0, -1, 10, 10]);
  });

  it('composes left to right', () => {
    // source: SVG 1.1 (Second Edition) §7.6: "the individual transformations are applied
    // … as if they were nested", so "A B C" = A·B·C.
    // translate(10,20) rotate(90) scale(2,3), by hand:
    //   R·S = [0 1 −1 0 0 0]·[2 0 0 3 0 0]:
    //     a = 0·2 + (−1)·0 = 0, b = 1·2 + 0·0 = 2, c = 0·0 + (−1)·3 = −3, d = 1·0 + 0·3 = 0
    //   T·(R·S) adds e = 10, f = 20  →  [0 2 −3 0 10 20]
    //   check on (1, 1): S → (2, 3); R → (−3, 2); T → (7, 22); matrix: 0 − 3 + 10 = 7, 2 + 0 + 20 = 22.
    expect(parseTransform('translate(10,20) rotate(90) scale(2,3)').matrix).toEqual([0, 2, -3, 0, 10, 20]);
    // Order matters: scale(2) translate(5) = [2 0 0 2 10 0]; translate(5) scale(2) = [2 0 0 2 5 0].
    expect(parseTransform('scale(2) translate(5)').matrix).toEqual([2, 0, 0, 2, 10, 0]);
    expect(parseTransform('translate(5) scale(2)').matrix).toEqual([2, 0, 0, 2, 5, 0]);
  });

  it('accepts the separator variants of the grammar', () => {
    // source: SVG 1.1 (Second Edition) §7.6 BNF (comma-wsp between numbers and between transforms)
    const expected = [2, 0, 0, 2, 10, 0];
    for (const text of [
      'scale(2),translate(5)',
      '  scale( 2 ) ,  translate( 5 , 0 )  ',
      'scale(2)translate(5)', // no separator: accepted by SVG 2 and browsers
      '\tscale(2)\n\ntranslate(5 0)',
      'scale (2) translate\t(5)',
      'scale(2),,translate(5)',
      'scale(2e0)translate(.5e1,-0)',
    ]) {
      const r = parseTransform(text);
      expect(r.error, text).toBeUndefined();
      expect(r.matrix, text).toEqual(expected);
    }
    expect(parseTransform('').matrix).toEqual(identity);
    expect(parseTransform('  ').error).toBeUndefined();
    expect(parseTransform('translate(-1-2)').matrix).toEqual([1, 0, 0, 1, -1, -2]);
    // One comma before ')' is tolerated, as Blink and resvg do.
    expect(parseTransform('translate(1,)')).toEqual({ matrix: [1, 0, 0, 1, 1, 0] });
    expect(parseTransform('translate(1,,)').error?.offset).toBe(12);
  });

  it('rejects malformed lists as a whole, with an offset', () => {
    const cases: [string, number][] = [
      ['translate(1', 11],
      ['translate(1 2 3)', 0],
      ['rotate(1 2)', 0],
      ['matrix(1 2 3 4 5)', 0],
      ['scale()', 6],
      ['scale(2) foo(1)', 9],
      ['Scale(2)', 0],
      ['rotate(45deg)', 9],
      ['scale(2),', 8],
      ['translate 1', 10],
    ];
    for (const [text, offset] of cases) {
      const r = parseTransform(text);
      expect(r.error, text).toBeDefined();
      expect(r.error!.offset, text).toBe(offset);
      expect(r.matrix, text).toEqual(identity);
    }
  });

  it('turns non-finite values into an error and the identity', () => {
    expect(parseTransform('scale(1e400)').error?.message).toMatch(/out of range/);
    const overflow = parseTransform('scale(1e200) scale(1e200)');
    expect(overflow.error?.message).toMatch(/not finite/);
    expect(overflow.matrix).toEqual(identity);
    expect(parseTransform('translate(NaN)').error).toBeDefined();
    expect(parseTransform('translate(Infinity)').error).toBeDefined();
    expect(parseTransform('scale(1e308)').error).toBeUndefined();
  });
});
