import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { deltaE00, parseColor, rebuildRamp, type Rgba } from '../engine/color/index.js';

const c = (s: string) => parseColor(s)!;

/** L* by colorjs.io (lab-d65), an implementation independent of the one under test. */
const lstar = (x: Rgba) => (new Color('srgb', [x.r, x.g, x.b]).to('lab-d65').coords as number[])[0];
const samples = (f: (t: number) => Rgba, n = 100) => Array.from({ length: n }, (_, i) => f(i / (n - 1)));

// source: matplotlib _cm_listed.py _viridis_data entries 0, 64, 128, 192, 255 (8-bit hex)
const VIRIDIS = ['#440154', '#3b528b', '#21918c', '#5ec962', '#fde725'].map(c);
// source: matplotlib _cm.py _jet_data evaluated at x = 0, 0.25, 0.5, 0.75, 1 (8-bit hex)
const JET = ['#00007f', '#004cff', '#29ffce', '#ffc400', '#7f0000'].map(c);
// source: ColorBrewer RdBu 5-class (from memory)
const RDBU = ['#ca0020', '#f4a582', '#f7f7f7', '#92c5de', '#0571b0'].map(c);

function expectInGamut(xs: Rgba[]) {
  for (const x of xs) for (const v of [x.r, x.g, x.b]) expect(v >= 0 && v <= 1).toBe(true);
}

describe('rebuildRamp, sequential', () => {
  it('viridis ends: L* strictly increasing over 100 samples, ends kept', () => {
    const f = rebuildRamp(VIRIDIS);
    const xs = samples(f);
    const L = xs.map(lstar);
    for (let i = 1; i < L.length; i++) expect(L[i]).toBeGreaterThan(L[i - 1]);
    expect(deltaE00(f(0), VIRIDIS[0])).toBeLessThan(0.01);
    expect(deltaE00(f(1), VIRIDIS[4])).toBeLessThan(0.01);
    expectInGamut(xs);
  });

  it('jet: rebuilt between its dark ends, L* spread to the minimum range and monotonic', () => {
    const f = rebuildRamp(JET);
    const L = samples(f).map(lstar);
    for (let i = 1; i < L.length; i++) expect(L[i]).toBeGreaterThan(L[i - 1]);
    expect(L[99] - L[0]).toBeCloseTo(40, 1);
    // Blue end stays bluish, red end reddish (hue kept, lightness moved).
    const lo = f(0);
    const hi = f(1);
    expect(lo.b).toBeGreaterThan(lo.r);
    expect(hi.r).toBeGreaterThan(hi.b);
    expectInGamut(samples(f));
  });

  it('decreasing ramps stay decreasing; minLightnessRange 0 keeps the ends', () => {
    const f = rebuildRamp([...VIRIDIS].reverse());
    const L = samples(f).map(lstar);
    for (let i = 1; i < L.length; i++) expect(L[i]).toBeLessThan(L[i - 1]);
    const g = rebuildRamp(JET, { minLightnessRange: 0 });
    expect(deltaE00(g(0), JET[0])).toBeLessThan(0.01);
    expect(deltaE00(g(1), JET[4])).toBeLessThan(0.01);
  });
});

describe('rebuildRamp, diverging', () => {
  function expectArms(L: number[]) {
    const half = L.length / 2;
    for (let i = 1; i < half; i++) expect(L[i]).toBeGreaterThan(L[i - 1]);
    for (let i = half + 1; i < L.length; i++) expect(L[i]).toBeLessThan(L[i - 1]);
  }

  it('jet as diverging: its light interior stop (cyan) becomes the midpoint', () => {
    const f = rebuildRamp(JET, { diverging: true });
    expectArms(samples(f).map(lstar));
    const mid = f(0.5);
    expect(mid.g).toBeGreaterThan(mid.r);
  });

  it('RdBu: light midpoint, L* rises then falls over 100 samples', () => {
    const f = rebuildRamp(RDBU, { diverging: true });
    const L = samples(f).map(lstar);
    expectArms(L);
    expect(lstar(f(0.5))).toBeGreaterThan(95);
    expect(lstar(f(0))).toBeCloseTo(lstar(f(1)), 6); // balanced ends
    expectInGamut(samples(f));
  });

  it('a ramp with a dark middle gets a light neutral midpoint', () => {
    const f = rebuildRamp([c('#ca0020'), c('#333333'), c('#0571b0')], { diverging: true });
    const L = samples(f).map(lstar);
    expectArms(L);
    const mid = f(0.5);
    expect(Math.max(mid.r, mid.g, mid.b) - Math.min(mid.r, mid.g, mid.b)).toBeLessThan(0.02);
  });

  it('explicit midpoint', () => {
    const f = rebuildRamp(RDBU, { diverging: true, midpoint: c('#ffffbf') });
    expect(deltaE00(f(0.5), c('#ffffbf'))).toBeLessThan(1);
    expectArms(samples(f).map(lstar));
  });
});

describe('rebuildRamp input checks', () => {
  it('rejects too few stops, bad t and bad options clearly', () => {
    expect(() => rebuildRamp([c('red')])).toThrow(/two stops/);
    expect(() => rebuildRamp(VIRIDIS)(NaN)).toThrow(RangeError);
    expect(() => rebuildRamp(VIRIDIS, { minLightnessRange: -1 })).toThrow(RangeError);
    // @ts-expect-error runtime guard
    expect(() => rebuildRamp([c('red'), 'blue'])).toThrow(TypeError);
    expect(rebuildRamp(VIRIDIS)(2)).toEqual(rebuildRamp(VIRIDIS)(1));
  });
});
