/**
 * truth.truncated-baseline on small charts drawn here: bars and areas that
 * start at zero pass; bars drawn from a non-zero baseline are reported with
 * Tufte's lie factor, checked against the cases computed in
 * ../shared/reference/tufte.json.
 */
import { describe, expect, it } from 'vitest';
import { truncatedBaseline } from '../engine/rules/truth/truncated-baseline.js';
import { barChart, check, lineChart, understand } from './support/rules-svg.js';

describe('truth.truncated-baseline', () => {
  it('bars 100 → 110 drawn from 95: lie factor 20', () => {
    // source: tufte.json derivedCheckCases "truncated axis: data 100 -> 110, axis starts at 95" (computed), LF = 20
    const u = understand(barChart({ series: [[100, 104, 110, 107]], colors: ['#4477aa'], lo: 95, hi: 115, ticks: [95, 100, 105, 110, 115] }));
    const f = check(truncatedBaseline, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.lieFactor).toBeCloseTo(20, 2);
    expect(f[0]!.measures.baselineValue).toBeCloseTo(95, 3);
    expect(f[0]!.message).toMatch(/^Bars start at 95, not 0: the tallest bar looks 3× the shortest; the data say 1\.1×/);
    expect(f[0]!.elements.length).toBeGreaterThan(0);
  });

  it('zero-based bars pass (lie factor 1)', () => {
    // source: tufte.json derivedCheckCases "honest bar chart" (computed), LF = 1
    const u = understand(barChart({ series: [[10, 20, 15]], colors: ['#4477aa'], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    expect(u.measures.baseline?.lieFactor).toBeCloseTo(1, 6);
    expect(check(truncatedBaseline, u)).toEqual([]);
  });

  it('horizontal bars from a non-zero baseline are reported the same way', () => {
    const u = understand(barChart({ series: [[100, 104, 110, 107]], colors: ['#4477aa'], lo: 95, hi: 115, ticks: [95, 100, 105, 110, 115], horizontal: true }));
    const f = check(truncatedBaseline, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.lieFactor).toBeCloseTo(20, 2);
  });

  it('stacked bars are measured by their stack totals', () => {
    // Totals 105, 107, 116 from 95: LF = 105 / (105 − 95) = 10.5 (from the definition, computed here).
    const u = understand(barChart({ series: [[100, 104, 110], [5, 3, 6]], colors: ['#0072b2', '#e69f00'], lo: 95, hi: 120, ticks: [95, 100, 105, 110, 115, 120], stacked: true }));
    const f = check(truncatedBaseline, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.shortestValue).toBeCloseTo(105, 3);
    expect(f[0]!.measures.lieFactor).toBeCloseTo(10.5, 2);
    const zero = understand(barChart({ series: [[10, 20, 15], [5, 3, 6]], colors: ['#0072b2', '#e69f00'], lo: 0, hi: 30, ticks: [0, 10, 20, 30], stacked: true }));
    expect(check(truncatedBaseline, zero)).toEqual([]);
  });

  it('an area filled from 95 is reported; one filled from 0 is not', () => {
    const cut = understand(lineChart({ series: [[100, 104, 110, 107, 103]], colors: ['#4477aa'], lo: 95, hi: 115, ticks: [95, 100, 105, 110, 115], area: true }));
    const f = check(truncatedBaseline, cut);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/^The area is filled from 95, not 0/);
    expect(f[0]!.measures.lieFactor).toBeCloseTo(20, 1);
    const whole = understand(lineChart({ series: [[10, 14, 20, 17, 13]], colors: ['#4477aa'], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25], area: true }));
    expect(check(truncatedBaseline, whole)).toEqual([]);
  });

  it('a baseline moved by less than the band is not reported', () => {
    // Values near 1000 on an axis from 20: LF = 1000/980 ≈ 1.02, inside 0.95–1.05.
    const u = understand(barChart({ series: [[1000, 1100, 1200]], colors: ['#4477aa'], lo: 20, hi: 1220, ticks: [20, 320, 620, 920, 1220] }));
    expect(u.measures.baseline?.lieFactor).toBeGreaterThan(1);
    expect(u.measures.baseline?.lieFactor).toBeLessThan(1.05);
    expect(check(truncatedBaseline, u)).toEqual([]);
    // …unless the band is narrowed by configuration.
    expect(check(truncatedBaseline, u, { lieFactorHigh: 1.01 })).toHaveLength(1);
  });

  it('line charts are not bar charts: no baseline, no finding', () => {
    const u = understand(lineChart({ series: [[100, 104, 110, 107]], colors: ['#4477aa'], lo: 95, hi: 115, ticks: [95, 100, 105, 110, 115] }));
    expect(u.measures.baseline).toBeNull();
    expect(check(truncatedBaseline, u)).toEqual([]);
  });
});
