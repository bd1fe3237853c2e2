/**
 * Garbage in, no crash out: every parser and measure returns (never throws)
 * on arbitrary text, and keeps its outputs finite.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isFiniteMatrix } from '../engine/read/geometry/matrix.js';
import { flatten, pathArea, pathBBox, pathLength } from '../engine/read/geometry/measure-path.js';
import { parseLength } from '../engine/read/geometry/parse-length.js';
import { parsePath } from '../engine/read/geometry/parse-path.js';
import { parsePoints } from '../engine/read/geometry/parse-points.js';
import { parseTransform } from '../engine/read/geometry/parse-transform.js';
import type { Segment } from '../engine/read/geometry/segments.js';
import { readNumber, scanned } from '../engine/read/geometry/scan.js';
import { parsePreserveAspectRatio, parseViewBox } from '../engine/read/geometry/viewbox.js';

// Text biased towards the grammar's own characters, so that near-valid input is common.
const pathChar = fc.constantFrom(...'MmLlHhVvCcSsQqTtAaZz0123456789.-+eE ,\t\n01xyz(){}#%'.split(''));
const pathText = fc.oneof(
  fc.array(pathChar, { maxLength: 80 }).map((a) => a.join('')),
  fc.array(pathChar, { maxLength: 40 }).map((a) => `M0 0 ${a.join('')}`),
  fc.string({ unit: 'binary', maxLength: 60 }),
  fc.constantFrom('M1e308 1e308 L-1e308 -1e308 C1e308 0 -1e308 0 1e308 1', 'M0 0 A1e308 1e-308 1e308 1 1 1e308 -1e308', 'M0 0 A1e-320 1e-320 0 0 1 1e-320 0'),
);

function segmentsFinite(segments: readonly Segment[]): boolean {
  return segments.every((s) => Object.values(s).every((v) => typeof v !== 'number' || Number.isFinite(v)));
}

describe('robustness', () => {
  it('parsePath never throws, keeps numbers finite and reports an offset inside the text', () => {
    fc.assert(
      fc.property(pathText, (d) => {
        const r = parsePath(d);
        expect(segmentsFinite(r.segments)).toBe(true);
        for (const s of r.segments) if (s.type === 'A') expect(Object.values(s.center).every(Number.isFinite)).toBe(true);
        if (r.error) {
          expect(r.error.offset).toBeGreaterThanOrEqual(0);
          expect(r.error.offset).toBeLessThanOrEqual(d.length);
          expect(r.error.message.length).toBeGreaterThan(0);
        }
        if (r.segments.length > 0) expect(r.segments[0].type).toBe('M');
        // Measures never throw on parsed garbage.
        pathBBox(r.segments);
        pathLength(r.segments);
        pathArea(r.segments);
        flatten(r.segments, 0.5);
      }),
      { numRuns: 3000, seed: 7 },
    );
  });

  it('the other parsers never throw and keep results finite', () => {
    const text = fc.oneof(
      fc.array(fc.constantFrom(...'matrixtranslatescalerotateskewXY()0123456789.-+e ,%pxinm'.split('')), { maxLength: 50 }).map((a) => a.join('')),
      fc.string({ maxLength: 40 }),
    );
    fc.assert(
      fc.property(text, (t) => {
        const tr = parseTransform(t);
        expect(isFiniteMatrix(tr.matrix)).toBe(true);
        const len = parseLength(t);
        if (len.length) expect(Number.isFinite(len.length.value)).toBe(true);
        const vb = parseViewBox(t);
        if (vb.viewBox) expect(vb.viewBox.width > 0 && vb.viewBox.height > 0).toBe(true);
        parsePreserveAspectRatio(t);
        const pts = parsePoints(t);
        expect(pts.points.length % 2).toBe(0);
        expect(pts.points.every(Number.isFinite)).toBe(true);
      }),
      { numRuns: 3000, seed: 11 },
    );
  });

  it('reads numbers exactly as ECMAScript Number() does', () => {
    // source: ECMAScript StringToNumber (correctly rounded decimal conversion)
    const token = fc
      .tuple(
        fc.constantFrom('', '-', '+'),
        fc.stringMatching(/^[0-9]{0,18}$/),
        fc.option(fc.stringMatching(/^[0-9]{0,18}$/)),
        fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '-', '+'), fc.integer({ min: 0, max: 400 }))),
      )
      .map(([sign, int, frac, exp]) => `${sign}${int}${frac === null ? '' : `.${frac}`}${exp === null ? '' : `${exp[0]}${exp[1]}${exp[2]}`}`)
      .filter((t) => /[0-9]/.test(t.replace(/[eE].*$/, '')));
    fc.assert(
      fc.property(token, (t) => {
        expect(readNumber(t, 0)).toBe(t.length);
        expect(Object.is(scanned.value, Number(t))).toBe(true);
      }),
      { numRuns: 5000, seed: 5 },
    );
    for (const t of ['0.1', '0.7', '123456789012345', '.000000000000001', '9007199254740993', '1.7976931348623157e308']) {
      readNumber(t, 0);
      expect(scanned.value).toBe(Number(t));
    }
  });

  it('relative and absolute spellings of one path parse to the same segments', () => {
    // Self-consistency of §8.3 (relative = absolute offset by the current point); common practice.
    const num = fc.integer({ min: -500, max: 500 });
    fc.assert(
      fc.property(fc.array(fc.tuple(num, num, num, num, num, num), { minLength: 1, maxLength: 6 }), (cubics) => {
        let abs = 'M0 0';
        let rel = 'm0 0';
        let cx = 0;
        let cy = 0;
        for (const [a, b, c, d, e, f] of cubics) {
          abs += ` C${a} ${b} ${c} ${d} ${e} ${f}`;
          rel += ` c${a - cx} ${b - cy} ${c - cx} ${d - cy} ${e - cx} ${f - cy}`;
          cx = e;
          cy = f;
        }
        expect(parsePath(rel).segments).toEqual(parsePath(abs).segments);
      }),
      { numRuns: 300, seed: 3 },
    );
  });

  it('reads long path data in linear time without deep recursion', () => {
    const parts: string[] = ['M0 0'];
    for (let k = 0; k < 200_000; k++) parts.push(`l${k % 7} ${(k % 5) - 2}`);
    const r = parsePath(parts.join(''));
    expect(r.error).toBeUndefined();
    expect(r.segments.length).toBe(200_001);
    expect(pathLength(r.segments)).toBeGreaterThan(0);
  });
});
