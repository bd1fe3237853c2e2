/**
 * Tufte's lie factor against the published example and the cases computed
 * from its definition in ../shared/reference/tufte.json.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { LIE_FACTOR_BAND, lieFactor, sizeOfEffect } from '../engine/measure/lie-factor.js';

const tufte = JSON.parse(readFileSync(resolve(import.meta.dirname, '../../shared/reference/tufte.json'), 'utf8')) as {
  lieFactor: {
    acceptableRange: { lower: number; upper: number };
    examples: { id: string; data?: { first: number; last: number }; graphic?: { first: number; last: number }; lieFactor_asPrinted: number; lieFactor_exact?: number; ratioOfRatiosAlternative?: number }[];
  };
};

describe('lie factor', () => {
  it("gives 14.8 on Tufte's fuel-economy example, not the ratio-of-ratios 5.78", () => {
    // source: Tufte 1983/2001 p. 57, via ../shared/reference/tufte.json (verified from three secondary sources)
    const ex = tufte.lieFactor.examples.find((e) => e.id === 'fuel-economy-standards')!;
    const lf = lieFactor({ shown: [ex.graphic!.first, ex.graphic!.last], data: [ex.data!.first, ex.data!.last] });
    expect(lf).toBeCloseTo(ex.lieFactor_exact!, 3);
    expect(Number(lf.toFixed(1))).toBe(ex.lieFactor_asPrinted);
    // The other reading of the definition, which the reference warns about, must not be what we compute.
    const ratioOfRatios = ex.graphic!.last / ex.graphic!.first / (ex.data!.last / ex.data!.first);
    expect(ratioOfRatios).toBeCloseTo(ex.ratioOfRatiosAlternative!, 3);
    expect(Math.abs(lf - ratioOfRatios)).toBeGreaterThan(9);
  });

  it('sizes of effect match the printed 53% and 783%', () => {
    // source: Tufte p. 57 via tufte.json: sizeOfEffectInData 0.5278, sizeOfEffectShown 7.8333
    expect(sizeOfEffect([18, 27.5])).toBeCloseTo(0.5278, 4);
    expect(sizeOfEffect([0.6, 5.3])).toBeCloseTo(7.8333, 4);
  });

  it('truncated axis 100 → 110 drawn from 95 gives 20', () => {
    // source: tufte.json derivedCheckCases (computed from Tufte's definition, not published)
    expect(lieFactor({ shown: [100 - 95, 110 - 95], data: [100, 110] })).toBeCloseTo(20, 10);
  });

  it('an honest zero-based bar chart gives 1', () => {
    // source: tufte.json derivedCheckCases (computed): data 10 → 20, bars 50 → 100 px
    expect(lieFactor({ shown: [50, 100], data: [10, 20] })).toBe(1);
  });

  it('area and volume scaled with a 1-D ratio r give r + 1 and r² + r + 1', () => {
    // source: tufte.json derivedCheckCases (computed): (r² − 1)/(r − 1) and (r³ − 1)/(r − 1)
    for (const r of [1.5, 2, 3.7]) {
      expect(lieFactor({ shown: [1, r * r], data: [1, r] })).toBeCloseTo(r + 1, 10);
      expect(lieFactor({ shown: [1, r ** 3], data: [1, r] })).toBeCloseTo(r * r + r + 1, 10);
    }
  });

  it("uses Tufte's 0.95–1.05 band", () => {
    // source: tufte.json acceptableRange (threshold verified-secondary)
    expect(LIE_FACTOR_BAND.low).toBe(tufte.lieFactor.acceptableRange.lower);
    expect(LIE_FACTOR_BAND.high).toBe(tufte.lieFactor.acceptableRange.upper);
  });

  it('no change in the data: 1 when the drawing does not change either, ∞ when it does', () => {
    expect(lieFactor({ shown: [5, 5], data: [3, 3] })).toBe(1);
    expect(lieFactor({ shown: [5, 6], data: [3, 3] })).toBe(Infinity);
  });

  it('refuses a zero first value and non-numbers with clear errors', () => {
    expect(() => lieFactor({ shown: [0, 5], data: [1, 2] })).toThrow(/first value is 0/);
    expect(() => lieFactor({ shown: [1, NaN], data: [1, 2] })).toThrow(/finite/);
    expect(() => sizeOfEffect([1] as unknown as [number, number])).toThrow(/\[first, second\]/);
    expect(() => lieFactor(null as unknown as { shown: [number, number]; data: [number, number] })).toThrow(TypeError);
  });
});
