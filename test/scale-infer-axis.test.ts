import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inferAxisScale } from '../engine/classify/scale/infer-axis.js';
import type { AxisLabel } from '../engine/classify/scale/infer-axis.js';

const DAY = 86_400_000;

function evenly(texts: string[], start = 50, step = 40): AxisLabel[] {
  return texts.map((text, i) => ({ text, position: start + i * step }));
}

describe('inferAxisScale: numbers', () => {
  it('fits a plain linear axis and maps the plot edges', () => {
    // Labels as written on ../shared/real-charts/ec-line-dual-axis-01.svg's left axis, at its positions.
    const labels = ['0', '200', '400', '600', '800', '1,000', '1,200'].map((text, i) => ({ text, position: 350 - (i * 280) / 6 }));
    const axis = inferAxisScale(labels, undefined, { range: [350, 70] });
    expect(axis.scale).toBe('linear');
    if (axis.scale !== 'linear') return;
    expect(axis.domain[0]).toBeCloseTo(0, 9);
    expect(axis.domain[1]).toBeCloseTo(1200, 9);
    expect(axis.ticks.map((t) => t.value)).toEqual([1200, 1000, 800, 600, 400, 200, 0]); // by position
  });

  it('applies a multiplier label given separately', () => {
    const axis = inferAxisScale(
      ['0', '1', '2', '3'].map((text, i) => ({ text, position: 300 - i * 50 })),
      '×10³',
    );
    expect(axis.scale).toBe('linear');
    expect(axis.multiplier).toMatchObject({ multiplier: 1000, offset: 0 });
    expect(axis.ticks.map((t) => t.value).sort((a, b) => (a ?? 0) - (b ?? 0))).toEqual([0, 1000, 2000, 3000]);
    if (axis.scale === 'linear') expect(axis.fit.a).toBeCloseTo(-0.05, 12);
  });

  it('finds a ×10ⁿ label mixed in with the tick labels', () => {
    const labels = [...['0.0', '0.5', '1.0', '1.5'].map((text, i) => ({ text, position: 300 - i * 50 })), { text: '×10⁻²', position: 120 }];
    const axis = inferAxisScale(labels);
    expect(axis.scale).toBe('linear');
    expect(axis.ignored.map((l) => l.text)).toEqual(['×10⁻²']);
    expect(axis.ticks.map((t) => t.value)).toEqual([0.015, 0.01, 0.005, 0]);
  });

  it('applies an offset with a multiplier (value = label × multiplier + offset)', () => {
    const axis = inferAxisScale(
      ['0', '2', '4'].map((text, i) => ({ text, position: 10 + i * 100 })),
      '1e-3+1.5',
    );
    expect(axis.ticks.map((t) => t.value)).toEqual([1.5, 1.502, 1.504]);
  });

  it('notes a multiplier it cannot read and does not apply it', () => {
    const axis = inferAxisScale(evenly(['0', '1', '2']), 'in thousands');
    expect(axis.multiplier).toBeUndefined();
    expect(axis.notes.join(' ')).toMatch(/not understood/);
  });

  it('reads decades at even spacing as log', () => {
    const axis = inferAxisScale(evenly(['10⁰', '10¹', '10²', '10³'], 40, 80));
    expect(axis.scale).toBe('log');
    if (axis.scale === 'log') expect(axis.fit.a).toBeCloseTo(80, 9);
  });

  it('keeps evenly spaced years as numbers', () => {
    const axis = inferAxisScale(evenly(['2019', '2020', '2021']));
    expect(axis.scale).toBe('linear');
    expect(axis.ticks.every((t) => t.parsed.kind === 'number' && t.parsed.maybeYear)).toBe(true);
  });

  it('re-reads all labels with a decimal comma when one label shows it', () => {
    const axis = inferAxisScale(evenly(['0', '0,5', '1', '1,5', '2']));
    expect(axis.scale).toBe('linear');
    expect(axis.ticks.map((t) => t.value)).toEqual([0, 0.5, 1, 1.5, 2]);
    // With a comma decimal, "1.000" is one thousand.
    const big = inferAxisScale(evenly(['0', '1.000', '2.000', '2.500,5'], 0, 1)).ticks.map((t) => t.value);
    expect(big).toEqual([0, 1000, 2000, 2500.5]);
  });

  it('reads evenly spaced numbers that fit no scale as ordered categories', () => {
    const axis = inferAxisScale(evenly(['1', '2', '5', '10', '20', '100']));
    expect(axis.scale).toBe('band');
    if (axis.scale === 'band') {
      expect(axis.assessment?.best).toBeNull();
      expect(axis.domain).toEqual(['1', '2', '5', '10', '20', '100']);
    }
  });

  it('reports an irregular axis as unfitted, with the rejected fits', () => {
    // A stretched top: 0..100 with 50 and 100 squeezed together.
    const axis = inferAxisScale([0, 10, 20, 50, 100].map((v, i) => ({ text: String(v), position: [20, 30, 41, 52, 90][i] })));
    expect(axis.scale).toBe('unfitted');
    if (axis.scale === 'unfitted') {
      expect(axis.reason).toMatch(/exceeds/);
      expect(axis.assessment?.linear).not.toBeNull();
      expect(axis.band?.evenlySpaced).toBe(false);
    }
  });

  it('rejects noisy ticks', () => {
    const noise = [0, 0.9, -1.2, 1.4, -0.8, 1.1];
    const axis = inferAxisScale(['0', '20', '40', '60', '80', '100'].map((text, i) => ({ text, position: 300 - i * 45 + noise[i] })));
    expect(axis.scale).toBe('unfitted');
  });
});

describe('inferAxisScale: dates', () => {
  it('completes Vega-Lite style year/month labels and fits time', () => {
    // Label texts from ../shared/real-charts/vl-line-time-01.svg, placed 0.5 px per day.
    const texts = ['2014', 'April', 'July', 'October', '2015', 'April', 'July', 'October'];
    // source: Date.UTC (ECMAScript) for the calendar dates the labels stand for
    const expected = [
      Date.UTC(2014, 0, 1),
      Date.UTC(2014, 3, 1),
      Date.UTC(2014, 6, 1),
      Date.UTC(2014, 9, 1),
      Date.UTC(2015, 0, 1),
      Date.UTC(2015, 3, 1),
      Date.UTC(2015, 6, 1),
      Date.UTC(2015, 9, 1),
    ];
    const labels = texts.map((text, i) => ({ text, position: 92 + ((expected[i] - expected[0]) / DAY) * 0.5 }));
    const axis = inferAxisScale(labels);
    expect(axis.scale).toBe('time');
    if (axis.scale !== 'time') return;
    expect(axis.ticks.map((t) => t.value)).toEqual(expected);
    expect(axis.hasYear).toBe(true);
    expect(axis.fit.maxResidual).toBeLessThan(1e-6);
  });

  it('fills the year backwards for labels before the first year label', () => {
    const expected = [Date.UTC(2013, 9, 1), Date.UTC(2014, 0, 1), Date.UTC(2014, 3, 1)];
    const labels = ['Oct', '2014', 'Apr'].map((text, i) => ({ text, position: 10 + (expected[i] - expected[0]) / DAY }));
    const axis = inferAxisScale(labels);
    expect(axis.scale).toBe('time');
    expect(axis.ticks.map((t) => t.value)).toEqual(expected);
  });

  it('reads hours that wrap past midnight as the next day', () => {
    const axis = inferAxisScale(evenly(['20:00', '22:00', '00:00', '02:00']));
    expect(axis.scale).toBe('time');
    expect(axis.ticks.map((t) => t.value)).toEqual([20, 22, 24, 26].map((h) => h * 3_600_000));
  });

  it('reads ISO dates at positions proportional to time', () => {
    const days = ['2024-02-26', '2024-03-04', '2024-03-11', '2024-03-18'];
    const axis = inferAxisScale(days.map((text, i) => ({ text, position: 100 + i * 70 })));
    expect(axis.scale).toBe('time');
    if (axis.scale === 'time') {
      // source: Date.UTC (ECMAScript); 2024 is a leap year, so 26 Feb + 7 days = 4 Mar
      expect(axis.domain).toEqual([Date.UTC(2024, 1, 26), Date.UTC(2024, 2, 18)]);
      expect(axis.fit.invert(100 + 10)).toBeCloseTo(Date.UTC(2024, 1, 27), -3);
    }
  });

  it('reads day-first numeric dates when one label proves the order', () => {
    const axis = inferAxisScale(evenly(['01/03/2024', '08/03/2024', '15/03/2024']));
    expect(axis.scale).toBe('time');
    expect(axis.ticks.map((t) => t.value)).toEqual([Date.UTC(2024, 2, 1), Date.UTC(2024, 2, 8), Date.UTC(2024, 2, 15)]);
  });

  it('reads month names at equal steps as categories (not proportional to time)', () => {
    const months = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
    const axis = inferAxisScale(evenly(months));
    expect(axis.scale).toBe('band');
    if (axis.scale === 'band') expect(axis.domain).toEqual(months);
  });

  it('reads month names at day-proportional positions as time', () => {
    const months = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun'];
    // source: Date.UTC (ECMAScript); no year stated, so the labels are placed in 1970
    const ms = months.map((_, i) => Date.UTC(1970, i, 1));
    const axis = inferAxisScale(months.map((text, i) => ({ text, position: 5 + ms[i] / DAY })));
    expect(axis.scale).toBe('time');
    if (axis.scale === 'time') expect(axis.hasYear).toBe(false);
  });
});

describe('inferAxisScale: bands and input handling', () => {
  it('reads a mixture of numbers and text as a band', () => {
    const axis = inferAxisScale(evenly(['0', '10', 'n/a', '30']));
    expect(axis.scale).toBe('band');
    expect(axis.notes.join(' ')).toMatch(/mix/);
    expect(axis.ticks.map((t) => t.value)).toEqual([0, 10, null, 30]);
  });

  it('sets aside empty labels', () => {
    const axis = inferAxisScale([...evenly(['0', '5', '10']), { text: '  ', position: 999 }]);
    expect(axis.scale).toBe('linear');
    expect(axis.ignored).toHaveLength(1);
  });

  it('returns unfitted for no labels or a single number', () => {
    expect(inferAxisScale([])).toMatchObject({ scale: 'unfitted', reason: 'no labels' });
    expect(inferAxisScale([{ text: '5', position: 3 }])).toMatchObject({ scale: 'unfitted' });
    expect(inferAxisScale([{ text: 'Only', position: 3 }]).scale).toBe('band');
  });

  it('never throws on well-formed but arbitrary labels', () => {
    const text = fc.oneof(
      fc.string({ maxLength: 12 }),
      fc.integer({ min: -5000, max: 5000 }).map(String),
      fc.constantFrom('Jan', 'April', '2014', '12:00', '00:00', '×10³', '1e6', '45%', '$1.2k', 'Mon', '15 Mar', '2024-03'),
    );
    const label = fc.record({ text, position: fc.double({ min: -1e4, max: 1e4, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(label, { maxLength: 14 }), fc.option(fc.constantFrom('×10³', '+1.5e3', 'junk')), (labels, mult) => {
        const axis = inferAxisScale(labels, mult ?? undefined);
        expect(['linear', 'log', 'time', 'band', 'unfitted']).toContain(axis.scale);
        expect(axis.ticks.length + axis.ignored.length).toBe(labels.length);
      }),
      { numRuns: 1500 },
    );
  });

  it('throws a clear error on malformed input', () => {
    expect(() => inferAxisScale([{ text: '1', position: Number.NaN }])).toThrow(/label 0 \("1"\) has a non-finite position/);
    expect(() => inferAxisScale([{ text: null as unknown as string, position: 1 }])).toThrow(/string text/);
    expect(() => inferAxisScale({} as unknown as AxisLabel[])).toThrow(/expected an array/);
    expect(() => inferAxisScale(evenly(['1', '2']), undefined, { range: [0, Number.NaN] })).toThrow(/range/);
  });
});
