import { describe, expect, it } from 'vitest';
import { arcCenter, arcPointAt, type ArcCenter } from '../engine/read/geometry/arc.js';
import { parsePath } from '../engine/read/geometry/parse-path.js';
import type { Segment } from '../engine/read/geometry/segments.js';

const DEG = Math.PI / 180;

function center(...args: Parameters<typeof arcCenter>): ArcCenter {
  const c = arcCenter(...args);
  if (typeof c === 'string') throw new Error(`expected an arc, got ${c}`);
  return c;
}

function types(segments: readonly Segment[]): string {
  return segments.map((s) => s.type).join('');
}

describe('arc endpoint → centre conversion', () => {
  it('half circle from (0,0) to (10,0), r = 5', () => {
    // source: SVG 1.1 (Second Edition), Appendix F.6.5, by hand:
    //   (F.6.5.1) x1' = (0 − 10)/2 = −5, y1' = 0
    //   (F.6.5.2) radicand = (25·25 − 25·0 − 25·25)/(25·0 + 25·25) = 0 → (cx', cy') = (0, 0)
    //   (F.6.5.3) (cx, cy) = (0, 0) + ((0 + 10)/2, 0) = (5, 0)
    //   (F.6.5.5) θ1 = angle((1,0), ((−5 − 0)/5, 0)) = angle to (−1, 0) = 180°
    //   (F.6.5.6) Δθ = angle((−1,0), (1,0)) = ±180°: +180° for fS = 1, −180° for fS = 0
    const s1 = center(0, 0, 5, 5, 0, false, true, 10, 0);
    expect(s1.cx).toBeCloseTo(5, 12);
    expect(s1.cy).toBeCloseTo(0, 12);
    expect(s1.rx).toBe(5);
    expect(Math.abs(s1.theta1)).toBeCloseTo(180 * DEG, 12);
    expect(s1.dtheta).toBeCloseTo(180 * DEG, 12);
    const s0 = center(0, 0, 5, 5, 0, false, false, 10, 0);
    expect(s0.cx).toBeCloseTo(5, 12);
    expect(s0.dtheta).toBeCloseTo(-180 * DEG, 12);
    // Sweep 1 (increasing angle) passes through θ = 270°: (5, −5), above the chord on screen.
    expect(arcPointAt(s1, s1.theta1 + s1.dtheta / 2).y).toBeCloseTo(-5, 12);
    expect(arcPointAt(s0, s0.theta1 + s0.dtheta / 2).y).toBeCloseTo(5, 12);
  });

  it('quarter and three-quarter circle from (0,0) to (10,10), r = 10', () => {
    // source: SVG 1.1 (Second Edition), Appendix F.6.5, by hand:
    //   x1' = (0 − 10)/2 = −5, y1' = (0 − 10)/2 = −5
    //   radicand = (10⁴ − 100·25 − 100·25)/(100·25 + 100·25) = 5000/5000 = 1
    //   fA = 0, fS = 1: fA ≠ fS so sign +: (cx', cy') = +1·(10·(−5)/10, −10·(−5)/10) = (−5, 5)
    //   (cx, cy) = (−5 + 5, 5 + 5) = (0, 10)
    //   u = ((−5 + 5)/10, (−5 − 5)/10) = (0, −1) → θ1 = −90°
    //   v = ((5 + 5)/10, (5 − 5)/10) = (1, 0) → Δθ = angle(u, v) = +90°
    const q = center(0, 0, 10, 10, 0, false, true, 10, 10);
    expect(q.cx).toBeCloseTo(0, 12);
    expect(q.cy).toBeCloseTo(10, 12);
    expect(q.theta1).toBeCloseTo(-90 * DEG, 12);
    expect(q.dtheta).toBeCloseTo(90 * DEG, 12);
    //   fA = 1, fS = 1: sign −: (cx', cy') = (5, −5), centre (10, 0)
    //   u = ((−5 − 5)/10, (−5 + 5)/10) = (−1, 0) → θ1 = 180°
    //   v = ((5 − 5)/10, (5 + 5)/10) = (0, 1); angle(u, v) = −90°, fS = 1 adds 360° → 270°
    const big = center(0, 0, 10, 10, 0, true, true, 10, 10);
    expect(big.cx).toBeCloseTo(10, 12);
    expect(big.cy).toBeCloseTo(0, 12);
    expect(big.theta1).toBeCloseTo(180 * DEG, 12);
    expect(big.dtheta).toBeCloseTo(270 * DEG, 12);
  });

  it('scales up out-of-range radii', () => {
    // source: SVG 1.1 (Second Edition), Appendix F.6.6, by hand:
    //   (0,0) → (10,0), rx = 2, ry = 1: x1' = −5, y1' = 0; Λ = 25/4 + 0 = 6.25 > 1
    //   rx = √6.25·2 = 5, ry = √6.25·1 = 2.5; then the radicand is 0 and the centre is the midpoint (5, 0).
    const c = center(0, 0, 2, 1, 0, false, true, 10, 0);
    expect(c.rx).toBeCloseTo(5, 12);
    expect(c.ry).toBeCloseTo(2.5, 12);
    expect(c.cx).toBeCloseTo(5, 12);
    expect(c.cy).toBeCloseTo(0, 12);
    expect(Math.abs(c.dtheta)).toBeCloseTo(Math.PI, 12);
    // Rotated 90°, (0,0) → (0,10), rx = 1, ry = 3: x1' = cos90·0 + sin90·(−5) = −5, y1' = 0;
    // Λ = 25/1 = 25 → rx = 5, ry = 15; centre (0, 5).
    const r = center(0, 0, 1, 3, 90, false, false, 0, 10);
    expect(r.rx).toBeCloseTo(5, 12);
    expect(r.ry).toBeCloseTo(15, 12);
    expect(r.cx).toBeCloseTo(0, 12);
    expect(r.cy).toBeCloseTo(5, 12);
  });

  it('takes negative radii as absolute values, zero radius as a line, equal endpoints as nothing', () => {
    // source: SVG 1.1 (Second Edition), Appendix F.6.2 and F.6.6 step 1
    const neg = center(0, 0, -5, -5, 0, false, true, 10, 0);
    expect(neg.rx).toBe(5);
    expect(neg.cx).toBeCloseTo(5, 12);
    expect(arcCenter(0, 0, 0, 5, 0, false, true, 10, 0)).toBe('line');
    expect(arcCenter(3, 4, 5, 5, 0, false, true, 3, 4)).toBe('omit');
    expect(types(parsePath('M0 0 A0 5 0 0 1 10 0').segments)).toBe('ML');
    expect(types(parsePath('M3 4 A5 5 0 0 1 3 4 L5 5').segments)).toBe('ML');
  });

  it('reproduces both endpoints from the centre parameterisation', () => {
    // The F.6.5 result must satisfy the F.6.4 parametric form at θ1 and θ1 + Δθ.
    const cases: [number, number, number, number, number, boolean, boolean, number, number][] = [
      [10, 20, 30, 15, 25, false, true, 40, 35],
      [10, 20, 30, 15, 25, true, false, 40, 35],
      [-3, 7, 2, 9, -60, true, true, 5, -4],
      [0, 0, 1, 1, 0, false, false, 100, 1], // radii far too small
      [1e6, 1e6, 5e5, 2e5, 33, false, true, 1e6 + 3e5, 1e6 - 1e5],
    ];
    for (const args of cases) {
      const c = center(...args);
      const p0 = arcPointAt(c, c.theta1);
      const p1 = arcPointAt(c, c.theta1 + c.dtheta);
      const tol = 1e-9 * Math.max(1, Math.abs(args[0]), Math.abs(args[7]));
      expect(Math.abs(p0.x - args[0])).toBeLessThan(tol);
      expect(Math.abs(p0.y - args[1])).toBeLessThan(tol);
      expect(Math.abs(p1.x - args[7])).toBeLessThan(tol);
      expect(Math.abs(p1.y - args[8])).toBeLessThan(tol);
      // F.6.5.6: Δθ > 0 exactly when fS = 1, and |Δθ| > 180° exactly when fA = 1 (unless scaled up).
      expect(c.dtheta > 0).toBe(args[6]);
    }
  });
});

describe('parsePath', () => {
  it('makes relative commands absolute and H/V into L', () => {
    // source: SVG 1.1 (Second Edition) §8.3.2–8.3.4
    const { segments, error } = parsePath('M10 20 h5 v5 H0 V0 l1 1 m2 2 l1 0 z');
    expect(error).toBeUndefined();
    expect(segments).toEqual([
      { type: 'M', x: 10, y: 20 },
      { type: 'L', x0: 10, y0: 20, x: 15, y: 20 },
      { type: 'L', x0: 15, y0: 20, x: 15, y: 25 },
      { type: 'L', x0: 15, y0: 25, x: 0, y: 25 },
      { type: 'L', x0: 0, y0: 25, x: 0, y: 0 },
      { type: 'L', x0: 0, y0: 0, x: 1, y: 1 },
      { type: 'M', x: 3, y: 3 },
      { type: 'L', x0: 3, y0: 3, x: 4, y: 3 },
      { type: 'Z', x0: 4, y0: 3, x: 3, y: 3 },
    ]);
  });

  it('repeats commands implicitly, and extra M pairs are lines', () => {
    // source: SVG 1.1 (Second Edition) §8.3.2: "If a moveto is followed by multiple pairs of
    // coordinates, the subsequent pairs are treated as implicit lineto commands" (relative for m)
    const { segments } = parsePath('m1 1 2 2 3 3');
    expect(segments).toEqual([
      { type: 'M', x: 1, y: 1 },
      { type: 'L', x0: 1, y0: 1, x: 3, y: 3 },
      { type: 'L', x0: 3, y0: 3, x: 6, y: 6 },
    ]);
    expect(types(parsePath('M0 0 L1 1 2 2 3 3 C1 1 2 2 3 3 4 4 5 5 6 6').segments)).toBe('MLLLCC');
  });

  it('reads numbers that run together and packed arc flags', () => {
    // source: SVG 1.1 (Second Edition) §8.3.9 BNF: numbers end where the next cannot
    // continue them; flags are single characters "0" or "1"
    const a = parsePath('M1.5.5-2e1-.5E+1');
    expect(a.error).toBeUndefined();
    expect(a.segments).toEqual([
      { type: 'M', x: 1.5, y: 0.5 },
      { type: 'L', x0: 1.5, y0: 0.5, x: -20, y: -5 },
    ]);
    const arc = parsePath('M0 0a1 1 0 00.5.5');
    expect(arc.error).toBeUndefined();
    const s = arc.segments[1];
    expect(s.type).toBe('A');
    if (s.type === 'A') {
      expect([s.rx, s.ry, s.xAxisRotation, s.largeArc, s.sweep, s.x, s.y]).toEqual([1, 1, 0, false, false, 0.5, 0.5]);
    }
    const arc2 = parsePath('M0,0A5,5,0,1,1,10,0a5 5 0 1110 0');
    expect(arc2.error).toBeUndefined();
    expect(types(arc2.segments)).toBe('MAA');
    expect(parsePath('M1e-3 1E2').segments[0]).toEqual({ type: 'M', x: 0.001, y: 100 });
  });

  it('reflects control points for S and T', () => {
    // source: SVG 1.1 (Second Edition) §8.3.6–8.3.7: the first control point is the reflection
    // of the previous command's second control point about the current point, when the
    // previous command was C/S (for S) or Q/T (for T); otherwise the current point.
    // S: 2·(30,10) − (20,10) = (40,10)
    const s = parsePath('M0 0 C10 0 20 10 30 10 S50 20 60 20').segments[2];
    expect(s).toEqual({ type: 'C', x0: 30, y0: 10, x1: 40, y1: 10, x2: 50, y2: 20, x: 60, y: 20 });
    // T: 2·(20,0) − (10,10) = (30,−10); next T: 2·(40,0) − (30,−10) = (50,10)
    const t = parsePath('M0 0 Q10 10 20 0 T40 0 t20 0').segments;
    expect(t[2]).toEqual({ type: 'Q', x0: 20, y0: 0, x1: 30, y1: -10, x: 40, y: 0 });
    expect(t[3]).toEqual({ type: 'Q', x0: 40, y0: 0, x1: 50, y1: 10, x: 60, y: 0 });
    // S after a line, T after a cubic: control point = current point.
    expect(parsePath('M0 0 L5 5 S10 0 20 0').segments[2]).toMatchObject({ x1: 5, y1: 5 });
    expect(parsePath('M0 0 C1 1 2 2 3 3 T10 0').segments[2]).toMatchObject({ type: 'Q', x1: 3, y1: 3 });
  });

  it('starts a new subpath at the old start after Z', () => {
    // source: SVG 1.1 (Second Edition) §8.3.3: after closepath the current point is the
    // subpath's initial point, and a following command other than moveto starts there
    const { segments } = parsePath('M10 10 L20 10 Z l5 5');
    expect(segments).toEqual([
      { type: 'M', x: 10, y: 10 },
      { type: 'L', x0: 10, y0: 10, x: 20, y: 10 },
      { type: 'Z', x0: 20, y0: 10, x: 10, y: 10 },
      { type: 'M', x: 10, y: 10 },
      { type: 'L', x0: 10, y0: 10, x: 15, y: 15 },
    ]);
  });

  it('keeps everything before the first error and reports where it is', () => {
    // source: SVG 1.1 (Second Edition), Appendix F.2: render up to and including the last
    // correctly defined segment, then report the error
    const cases: [string, string, number][] = [
      ['M0 0 L10 10 20', 'ML', 14],
      ['M0 0 L10 10 X 5', 'ML', 12],
      ['L10 10', '', 0],
      ['  10 10', '', 2],
      ['M0 0 L10,', 'M', 9],
      ['M0 0 L10 10,,L5 5', 'ML', 12],
      ['M0 0 A5 5 0 2 0 10 0', 'M', 12],
      ['M0 0 A5 5 0 0 1 10 0 A5 5 0 0', 'MA', 29],
      ['M0 0 Z 5 5', 'MZ', 7],
      ['M0 0 L1e400 0', 'M', 6],
      ['M0 0 L1e 0', 'M', 7],
      ['M0 0 L 1 1 L .', 'ML', 13],
      ['M0 0 L NaN 0', 'M', 7],
      ['M1e308 0 l1e308 0', 'M', 10],
    ];
    for (const [d, expectTypes, offset] of cases) {
      const r = parsePath(d);
      expect(types(r.segments), d).toBe(expectTypes);
      expect(r.error, d).toBeDefined();
      expect(r.error!.offset, d).toBe(offset);
    }
    expect(parsePath('')).toEqual({ segments: [] });
    expect(parsePath(' \n\t')).toEqual({ segments: [] });
  });

  it('accepts white space and commas where the grammar allows', () => {
    const r = parsePath('\nM 1 , 2\tL\r\n3,4 ,5 6 z');
    expect(r.error).toBeUndefined();
    expect(types(r.segments)).toBe('MLLZ');
    expect(parsePath('M1+2').segments[0]).toEqual({ type: 'M', x: 1, y: 2 });
    // One comma after a command's last number is tolerated (Blink and resvg accept it).
    expect(parsePath('M0 0 L10 10, L5 5')).toEqual(parsePath('M0 0 L10 10 L5 5'));
    expect(parsePath('M0 0 L10 10,').error).toBeUndefined();
  });
});
