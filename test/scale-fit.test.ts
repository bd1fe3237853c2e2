import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  assessScale,
  fitBand,
  fitLinear,
  fitLog,
  fitScale,
  medianTickSpacing,
  scaleTolerance,
} from '../engine/classify/scale/fit-scale.js';

describe('fitScale: linear', () => {
  it('recovers an exact mapping with zero residual', () => {
    // Ticks 0..500 step 100 placed by position = -0.5·value + 300 (an SVG y axis).
    const ticks = [0, 100, 200, 300, 400, 500].map((value) => ({ value, position: -0.5 * value + 300 }));
    const fit = fitScale(ticks);
    expect(fit?.type).toBe('linear');
    expect(fit?.a).toBeCloseTo(-0.5, 12);
    expect(fit?.b).toBeCloseTo(300, 9);
    expect(fit?.residual).toBeLessThan(1e-9);
    expect(fit?.maxResidual).toBeLessThan(1e-9);
    expect(fit?.r2).toBeCloseTo(1, 12);
    expect(fit?.invert(150)).toBeCloseTo(300, 9);
    expect(fit?.forward(250)).toBeCloseTo(175, 9);
  });

  it('recovers any exact linear mapping (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 1000, noNaN: true }),
        fc.boolean(),
        fc.double({ min: -1000, max: 1000, noNaN: true }),
        fc.integer({ min: 2, max: 15 }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e5, noNaN: true }),
        (slope, flip, b, n, start, step) => {
          const a = flip ? -slope : slope;
          const ticks = Array.from({ length: n }, (_, i) => ({ value: start + i * step, position: a * (start + i * step) + b }));
          // Skip cases where the pixel span is below a pixel: not an axis.
          fc.pre(Math.abs(a * step) > 1);
          const fit = fitScale(ticks);
          expect(fit).not.toBeNull();
          expect(fit!.type).toBe('linear');
          expect(Math.abs(fit!.a / a - 1)).toBeLessThan(1e-6);
          for (const t of ticks) expect(Math.abs(fit!.invert(t.position) - t.value)).toBeLessThan(1e-6 * Math.max(1, Math.abs(step)));
        },
      ),
    );
  });

  it('rejects ticks that are off their line by more than the tolerance', () => {
    // 0..100 step 20 at 50 px per tick, one tick 3 px out (6 % of a tick step).
    const ticks = [0, 20, 40, 60, 80, 100].map((value, i) => ({ value, position: 40 + i * 50 + (i === 3 ? 3 : 0) }));
    const report = assessScale(ticks);
    expect(report.best).toBeNull();
    expect(report.tolerance).toBeCloseTo(1, 12); // 2 % of the 50 px spacing
    expect(report.linear?.maxResidual).toBeGreaterThan(1);
    expect(report.reason).toMatch(/exceeds/);
  });

  it('accepts sub-pixel rounding of positions', () => {
    // Positions rounded to whole pixels, as some renderers write them.
    const ticks = [0, 1, 2, 3, 4, 5, 6, 7].map((value) => ({ value, position: Math.round(33.3 + value * 41.37) }));
    const fit = fitScale(ticks);
    expect(fit?.type).toBe('linear');
    expect(fit!.maxResidual).toBeLessThanOrEqual(0.75);
  });

  it('honours the tolerance options', () => {
    const ticks = [0, 1, 2, 3].map((value, i) => ({ value, position: value * 100 + (i === 1 ? 1.5 : 0) }));
    expect(fitScale(ticks)).not.toBeNull(); // default: 2 % of 100 px = 2 px
    expect(fitScale(ticks, { relativeTolerance: 0.005 })).toBeNull();
    expect(scaleTolerance(ticks, { minTolerancePx: 5 })).toBe(5);
  });

  it('returns null with fewer than two distinct values', () => {
    expect(fitScale([])).toBeNull();
    expect(fitScale([{ value: 5, position: 10 }])).toBeNull();
    expect(fitScale([{ value: 5, position: 10 }, { value: 5, position: 60 }])).toBeNull();
    expect(assessScale([{ value: 5, position: 10 }]).reason).toMatch(/fewer than 2 distinct/);
  });

  it('returns null when all ticks share one position', () => {
    expect(fitLinear([{ value: 1, position: 10 }, { value: 2, position: 10 }])).toBeNull();
  });

  it('throws a clear error on non-finite input', () => {
    expect(() => fitScale([{ value: Number.NaN, position: 1 }, { value: 2, position: 3 }])).toThrow(/tick 0 has a non-finite value/);
    expect(() => fitScale([{ value: 1, position: Infinity }, { value: 2, position: 3 }])).toThrow(/non-finite position/);
    expect(() => fitScale('nope' as unknown as [])).toThrow(/expected an array/);
  });

  it('fits epoch-millisecond values without loss of precision', () => {
    // Month starts of 2024 placed proportionally to time, 0.5 px per day.
    const dayMs = 86_400_000;
    const t0 = Date.UTC(2024, 0, 1);
    const ticks = Array.from({ length: 12 }, (_, m) => {
      const ms = Date.UTC(2024, m, 1);
      return { value: ms, position: 20 + ((ms - t0) / dayMs) * 0.5 };
    });
    const fit = fitScale(ticks);
    expect(fit?.type).toBe('linear');
    expect(fit!.maxResidual).toBeLessThan(1e-6);
    expect(fit!.invert(20 + 0.5 * 10)).toBeCloseTo(t0 + 10 * dayMs, -1);
  });
});

describe('fitScale: log', () => {
  it('fits decades at even spacing as log with the exact slope', () => {
    // 1, 10, 100, 1000 every 80 px: position = 80·log10(value) + 40.
    const ticks = [1, 10, 100, 1000].map((value, i) => ({ value, position: 40 + i * 80 }));
    const fit = fitScale(ticks);
    expect(fit?.type).toBe('log');
    expect(fit!.a).toBeCloseTo(80, 10);
    expect(fit!.b).toBeCloseTo(40, 10);
    expect(fit!.maxResidual).toBeLessThan(1e-9);
    expect(fit!.invert(40 + 120)).toBeCloseTo(10 ** 1.5, 9);
    expect(fit!.forward(0)).toBeNaN();
    // The linear fit was tried and rejected.
    const report = assessScale(ticks);
    expect(report.linear!.maxResidual).toBeGreaterThan(report.tolerance);
  });

  it('fits a log axis with 1-2-5 ticks', () => {
    const values = [1, 2, 5, 10, 20, 50, 100];
    const ticks = values.map((value) => ({ value, position: 300 - 100 * Math.log10(value) }));
    const fit = fitScale(ticks);
    expect(fit?.type).toBe('log');
    expect(fit!.a).toBeCloseTo(-100, 9);
  });

  it('prefers linear when both fit (two ticks)', () => {
    expect(fitScale([{ value: 1, position: 0 }, { value: 10, position: 100 }])?.type).toBe('linear');
    expect(fitLog([{ value: 1, position: 0 }, { value: 10, position: 100 }])).toBeNull();
  });

  it('does not try log on zero or negative values', () => {
    expect(fitLog([0, 1, 10].map((value, i) => ({ value, position: i * 10 })))).toBeNull();
    const report = assessScale([-1, 1, 10].map((value, i) => ({ value, position: i * 50 })));
    expect(report.log).toBeNull();
    expect(report.best).toBeNull();
  });

  it('rejects a geometric series that is neither linear nor log in position', () => {
    const ticks = [1, 10, 100, 1000].map((value, i) => ({ value, position: [0, 80, 170, 240][i] }));
    expect(fitScale(ticks)).toBeNull();
  });
});

describe('medianTickSpacing', () => {
  it('uses the median gap in value order, duplicates merged', () => {
    const ticks = [
      { value: 0, position: 0 },
      { value: 10, position: 50 },
      { value: 10, position: 50 },
      { value: 20, position: 100 },
      { value: 30, position: 160 },
    ];
    expect(medianTickSpacing(ticks)).toBe(50);
  });
});

describe('fitBand', () => {
  it('orders categories by position and reports the step', () => {
    const band = fitBand([
      { text: 'Tue', position: 158.1 },
      { text: 'Mon', position: 86.7 },
      { text: 'Wed', position: 229.55 },
    ]);
    expect(band?.categories.map((c) => c.text)).toEqual(['Mon', 'Tue', 'Wed']);
    expect(band?.categories.map((c) => c.index)).toEqual([0, 1, 2]);
    expect(band?.step).toBeCloseTo(71.425, 3);
    expect(band?.evenlySpaced).toBe(true);
  });

  it('flags uneven spacing', () => {
    const band = fitBand(['a', 'b', 'c', 'd'].map((text, i) => ({ text, position: [0, 50, 100, 170][i] })));
    expect(band?.evenlySpaced).toBe(false);
    expect(band!.maxDeviation).toBeGreaterThan(band!.tolerance);
  });

  it('handles one category, no categories, and stacked labels', () => {
    expect(fitBand([])).toBeNull();
    const one = fitBand([{ text: 'only', position: 12 }]);
    expect(one).toMatchObject({ step: null, evenlySpaced: true });
    const stacked = fitBand([
      { text: 'a', position: 5 },
      { text: 'b', position: 5 },
    ]);
    expect(stacked?.evenlySpaced).toBe(false);
  });

  it('throws a clear error on bad input', () => {
    expect(() => fitBand([{ text: 'a', position: Number.NaN }])).toThrow(/non-finite position/);
    expect(() => fitBand([{ text: 3 as unknown as string, position: 1 }])).toThrow(/string text/);
  });
});
