import { describe, expect, it } from 'vitest';
import { pathArea, pathBBox, pathLength } from '../engine/read/geometry/measure-path.js';
import { parsePoints } from '../engine/read/geometry/parse-points.js';
import {
  circleToPath,
  ellipseToPath,
  lineToPath,
  polygonToPath,
  polylineToPath,
  rectToPath,
} from '../engine/read/geometry/shape-to-path.js';
import type { Segment } from '../engine/read/geometry/segments.js';

function types(segments: readonly Segment[]): string {
  return segments.map((s) => s.type).join('');
}

describe('rect', () => {
  it('square corners: four lines, area w·h, perimeter 2(w + h)', () => {
    const { segments, issue } = rectToPath({ x: 10, y: 20, width: 100, height: 50 });
    expect(issue).toBeUndefined();
    expect(types(segments)).toBe('MLLLZ');
    expect(pathArea(segments)).toBe(5000);
    expect(pathLength(segments)).toBe(300);
    expect(pathBBox(segments)).toEqual({ minX: 10, minY: 20, maxX: 110, maxY: 70 });
  });

  it('rounded corners with ry taken from rx', () => {
    // source: SVG 1.1 (Second Edition) §9.2: "if a properly specified value is provided for rx
    // but not for ry, then the user agent processes the 'rect' element with the effective value
    // for ry as equal to rx"
    const { segments } = rectToPath({ x: 0, y: 0, width: 100, height: 50, rx: 10 });
    expect(types(segments)).toBe('MLALALALAZ');
    // Rounded rectangle (common practice, no source): area = w·h − (4 − π)·r²,
    // perimeter = 2(w − 2r) + 2(h − 2r) + 2πr.
    expect(pathArea(segments)).toBeCloseTo(5000 - (4 - Math.PI) * 100, 9);
    expect(pathLength(segments)).toBeCloseTo(2 * 80 + 2 * 30 + 2 * Math.PI * 10, 9);
    expect(pathBBox(segments)).toEqual({ minX: 0, minY: 0, maxX: 100, maxY: 50 });
  });

  it('clamps radii to half the sides, after copying the given one', () => {
    // source: SVG 1.1 (Second Edition) §9.2: rx > width/2 → width/2, ry > height/2 → height/2,
    // applied after the rx/ry copy. rx = 80 on 100 × 50: ry = 80 → 25, rx → 50: a full ellipse.
    const { segments } = rectToPath({ x: 0, y: 0, width: 100, height: 50, rx: 80 });
    expect(types(segments)).toBe('MAAAAZ'); // zero-length sides are left out
    expect(pathArea(segments)).toBeCloseTo(Math.PI * 50 * 25, 9);
    // ry only: rx takes ry's value.
    const ryOnly = rectToPath({ width: 100, height: 50, ry: 5 }).segments;
    expect(pathArea(ryOnly)).toBeCloseTo(5000 - (4 - Math.PI) * 25, 9);
  });

  it('treats invalid radii as auto and reports them; zero or negative sizes draw nothing', () => {
    // source: SVG 2 §10.2 (a negative rx is invalid, so the auto value applies)
    const neg = rectToPath({ width: 100, height: 50, rx: -5, ry: 10 });
    expect(neg.issue).toMatch(/rx/);
    expect(pathArea(neg.segments)).toBeCloseTo(5000 - (4 - Math.PI) * 100, 9);
    const nan = rectToPath({ width: 100, height: 50, rx: NaN });
    expect(nan.issue).toBeDefined();
    expect(types(nan.segments)).toBe('MLLLZ');
    // source: SVG 1.1 (Second Edition) §9.2: zero width or height disables rendering; negative is an error
    expect(rectToPath({ width: 0, height: 10 })).toEqual({ segments: [] });
    expect(rectToPath({ width: -1, height: 10 }).issue).toMatch(/negative/);
    expect(rectToPath({ width: Infinity, height: 10 }).segments).toEqual([]);
  });
});

describe('circle and ellipse', () => {
  it('circle: area πr², length 2πr, exact box', () => {
    // source: Euclid / elementary geometry (area πr², circumference 2πr)
    for (const r of [1, 7.5, 1000]) {
      const { segments } = circleToPath({ cx: 3, cy: -4, r });
      expect(types(segments)).toBe('MAAAAZ');
      expect(pathArea(segments)).toBeCloseTo(Math.PI * r * r, 9);
      expect(pathLength(segments)).toBeCloseTo(2 * Math.PI * r, 9);
      expect(pathBBox(segments)).toEqual({ minX: 3 - r, minY: -4 - r, maxX: 3 + r, maxY: -4 + r });
    }
    expect(circleToPath({ r: 0 })).toEqual({ segments: [] });
    expect(circleToPath({ r: -1 }).issue).toMatch(/negative/);
    expect(circleToPath({ r: NaN }).issue).toBeDefined();
  });

  it('ellipse: area πab, perimeter by the Gauss–Kummer series', () => {
    // source: Gauss–Kummer series, P = π(a + b) Σ C(1/2, n)² hⁿ, h = ((a − b)/(a + b))² (from memory)
    const perimeter = (a: number, b: number): number => {
      const h = ((a - b) / (a + b)) ** 2;
      let c = 1;
      let sum = 1;
      for (let n = 1; n < 200; n++) {
        c = (c * (0.5 - (n - 1))) / n;
        sum += c * c * h ** n;
      }
      return Math.PI * (a + b) * sum;
    };
    for (const [a, b] of [
      [20, 10],
      [5, 4],
      [100, 3],
    ]) {
      const { segments } = ellipseToPath({ cx: 0, cy: 0, rx: a, ry: b });
      expect(pathArea(segments)).toBeCloseTo(Math.PI * a * b, 8);
      expect(Math.abs(pathLength(segments) / perimeter(a, b) - 1)).toBeLessThan(1e-9);
    }
  });

  it('ellipse radii: auto copies the other, zero draws nothing', () => {
    // source: SVG 2 §10.4 (rx/ry "auto" uses the other radius)
    expect(pathArea(ellipseToPath({ rx: 10 }).segments)).toBeCloseTo(Math.PI * 100, 9);
    expect(ellipseToPath({})).toEqual({ segments: [] });
    expect(ellipseToPath({ rx: 0, ry: 5 })).toEqual({ segments: [] });
    expect(ellipseToPath({ rx: -1, ry: 5 }).issue).toMatch(/negative/);
  });
});

describe('line, polyline, polygon', () => {
  it('line', () => {
    const { segments } = lineToPath({ x1: 0, y1: 0, x2: 3, y2: 4 });
    expect(pathLength(segments)).toBe(5); // 3-4-5 triangle
    expect(pathArea(segments)).toBe(0);
    expect(lineToPath({ x1: NaN }).issue).toBeDefined();
  });

  it('polygon closes, polyline does not; odd coordinates are dropped', () => {
    // source: SVG 1.1 (Second Edition) §9.6–9.7, points grammar
    const pts = parsePoints('0,0 4,0 4 3');
    expect(pts).toEqual({ points: [0, 0, 4, 0, 4, 3] });
    expect(pathLength(polylineToPath(pts.points).segments)).toBe(7);
    const poly = polygonToPath(pts.points).segments;
    expect(types(poly)).toBe('MLLZ');
    expect(pathLength(poly)).toBe(12); // 4 + 3 + 5
    // Shoelace: ½|0·0 − 4·0 + 4·3 − 4·0 + 4·0 − 0·3| = 6 (vertices run with increasing angle: +6)
    expect(pathArea(poly)).toBe(6);
    const odd = parsePoints('1 2 3 4 5');
    expect(odd.points).toEqual([1, 2, 3, 4]);
    expect(odd.error?.offset).toBe(8);
    expect(polylineToPath([1, 2, 3, 4, 5]).issue).toMatch(/odd/);
    expect(parsePoints('1 2,3 x').points).toEqual([1, 2]);
    expect(parsePoints('1 2,,3 4').error?.offset).toBe(4);
    expect(parsePoints('1e400 0').error?.message).toMatch(/range/);
    expect(polygonToPath([])).toEqual({ segments: [] });
  });
});
