import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseAxisMultiplier, parseTickLabel } from '../engine/classify/scale/parse-tick-label.js';
import type { ParsedTick } from '../engine/classify/scale/parse-tick-label.js';

function num(text: string): { value: number; decimals: number; unit?: string; suffix?: string; maybeYear?: true } {
  const p = parseTickLabel(text);
  if (!p || p.kind !== 'number') throw new Error(`"${text}" did not parse as a number: ${JSON.stringify(p)}`);
  return p;
}

function date(text: string, options = {}): Extract<ParsedTick, { kind: 'date' }> {
  const p = parseTickLabel(text, options);
  if (!p || p.kind !== 'date') throw new Error(`"${text}" did not parse as a date: ${JSON.stringify(p)}`);
  return p;
}

describe('parseTickLabel: label texts found in ../shared/real-charts', () => {
  // Each row: [text, expected value, expected decimals, file the text comes from].
  const numbers: [string, number, number, string][] = [
    ['1,000', 1000, 0, 'ec-line-dual-axis-01.svg (ECharts)'],
    ['1,200', 1200, 0, 'ec-line-dual-axis-01.svg (ECharts)'],
    ['10,000', 10000, 0, 'gg-scatter-log-bw-01.svg (ggplot2)'],
    ['100,000', 100000, 0, 'gg-scatter-log-bw-01.svg (ggplot2)'],
    ['60,000', 60000, 0, 'vl-stacked-bar-01.svg (Vega-Lite)'],
    ['4.1', 4.1, 1, 'ec-barh-truncated-01.svg (ECharts)'],
    [' 0.5', 0.5, 1, 'gp-points-clean-01.svg (gnuplot writes a leading space)'],
    [' 2.5', 2.5, 1, 'gp-points-clean-01.svg (gnuplot)'],
    [' 180', 180, 0, 'gp-lines-heavy-grid-01.svg (gnuplot)'],
    ['475', 475, 0, 'gg-bar-truncated-01.svg (ggplot2)'],
    ['1500', 1500, 0, 'mpl-grouped-bar-clean-01.svg (matplotlib)'],
  ];
  for (const [text, value, decimals, file] of numbers) {
    it(`reads ${JSON.stringify(text)} from ${file}`, () => {
      // source: the label text as written in ../shared/real-charts/<file>; value by positional decimal notation
      const p = num(text);
      expect(p.value).toBe(value);
      expect(p.decimals).toBe(decimals);
    });
  }

  it('flags bare four-digit integers as possible years, grouped ones not', () => {
    // source: ../shared/real-charts/vl-stacked-bar-01.svg ("2001" … "2017" on a year axis)
    expect(num('2001').maybeYear).toBe(true);
    // source: ../shared/real-charts/mpl-line-ggplot-style-01.svg ("1000" is a count there; still only a flag)
    expect(num('1000').maybeYear).toBe(true);
    // source: ../shared/real-charts/ec-line-dual-axis-01.svg
    expect(num('1,000').maybeYear).toBeUndefined();
    expect(num('250').maybeYear).toBeUndefined();
  });

  it('reads clock times from ECharts and matplotlib axes as time of day', () => {
    // source: ../shared/real-charts/ec-bar-clean-01.svg ("07:00"), mpl-heatmap-jet-01.svg ("22:00")
    const a = date('07:00');
    expect(a.ms).toBe(Date.UTC(1970, 0, 1, 7, 0)); // common practice, no source: a time without a date is read on day 0 of the epoch
    expect(a.granularity).toBe('minute');
    expect(a.parts).toEqual({ hour: 7, minute: 0 });
    expect(date('22:00').parts).toEqual({ hour: 22, minute: 0 });
  });

  it('reads Vega-Lite month labels as months without a year', () => {
    // source: ../shared/real-charts/vl-line-time-01.svg ("April", "July", "October")
    expect(date('April').parts).toEqual({ month: 4 });
    expect(date('October').parts).toEqual({ month: 10 });
    expect(date('October').granularity).toBe('month');
  });

  it('keeps weekday names, quarters and named categories as text', () => {
    // source: ../shared/real-charts/gg-heatmap-rainbow-01.svg, mpl-grouped-bar-clean-01.svg, ec-line-dual-axis-01.svg
    for (const t of ['Sun', 'Mon', 'Q1', 'Day 13', 'Old Town', 'Rating (1-5)', 'North-east']) {
      expect(parseTickLabel(t)).toEqual({ kind: 'category', text: t });
    }
  });
});

describe('parseTickLabel: signs, separators and spacing', () => {
  it('reads the three minus spellings the same', () => {
    // source: Unicode 15.0 code charts — U+2212 MINUS SIGN, U+2013 EN DASH, U+002D HYPHEN-MINUS
    expect(num('\u22125').value).toBe(-5);
    expect(num('\u20135').value).toBe(-5);
    expect(num('-5').value).toBe(-5);
    expect(num('\u22120.25').value).toBe(-0.25);
    expect(num('+20%').value).toBe(20);
  });

  it('reads accounting parentheses as negative', () => {
    // common practice, no source
    expect(num('(1,200)').value).toBe(-1200);
    expect(num('($300)').value).toBe(-300);
  });

  it('reads digit groups separated by commas and by the space characters libraries use', () => {
    // source: Unicode 15.0 — U+00A0 NO-BREAK SPACE, U+2009 THIN SPACE, U+202F NARROW NO-BREAK SPACE
    expect(num('1 000').value).toBe(1000);
    expect(num('1\u00A0000').value).toBe(1000);
    expect(num('1\u2009000').value).toBe(1000);
    expect(num('1\u202F000\u202F000').value).toBe(1_000_000);
    expect(num('12,345,678').value).toBe(12_345_678);
    // common practice, no source (Indian lakh grouping)
    expect(num('1,00,000').value).toBe(100_000);
  });

  it('rejects malformed grouping instead of guessing', () => {
    // common practice, no source: groups after the first always have three digits
    expect(parseTickLabel('1,00')?.kind).toBe('number'); // a decimal comma: 1.00
    expect(num('1,00').value).toBe(1);
    expect(parseTickLabel('10 20')?.kind).toBe('category');
    expect(parseTickLabel('1,000 000')?.kind).toBe('category');
  });

  it('reads decimal commas and dot grouping when the label is unambiguous, or when told', () => {
    // common practice, no source (decimal comma in most of continental Europe)
    expect(num('0,5').value).toBe(0.5);
    expect(num('1.000.000').value).toBe(1_000_000);
    expect(num('1.234,5').value).toBe(1234.5);
    expect(num('1 000,25').value).toBe(1000.25);
    const ambiguous = parseTickLabel('1,000');
    expect(ambiguous?.kind === 'number' && ambiguous.ambiguousSeparator).toBe(true);
    const told = parseTickLabel('1,000', { decimalMark: ',' });
    expect(told?.kind === 'number' && told.value).toBe(1);
    expect(told?.kind === 'number' && told.decimals).toBe(3);
  });

  it('counts decimals as written, trailing zeros included', () => {
    // common practice, no source
    expect(num('0.50').decimals).toBe(2);
    expect(num('.5').decimals).toBe(1);
    expect(num('1.25k').decimals).toBe(2);
    expect(num('3').decimals).toBe(0);
  });
});

describe('parseTickLabel: units, currency, magnitude suffixes', () => {
  it('keeps percent values as written', () => {
    // common practice, no source
    expect(num('45%')).toMatchObject({ value: 45, unit: '%' });
    expect(num('12.5 %')).toMatchObject({ value: 12.5, unit: '%', decimals: 1 });
  });

  it('reads currency before or after the number', () => {
    // common practice, no source
    expect(num('$1.2k')).toMatchObject({ value: 1200, unit: '$', suffix: 'k' });
    expect(num('€30')).toMatchObject({ value: 30, unit: '€' });
    expect(num('£250')).toMatchObject({ value: 250, unit: '£' });
    expect(num('30 €')).toMatchObject({ value: 30, unit: '€' });
    expect(num('-$5')).toMatchObject({ value: -5, unit: '$' });
    expect(num('$-5')).toMatchObject({ value: -5, unit: '$' });
    // source: ISO 4217 currency codes
    expect(num('USD 100')).toMatchObject({ value: 100, unit: 'USD' });
  });

  it('applies SI prefixes as d3-style formats write them', () => {
    // source: SI Brochure, 9th edition (BIPM 2019), SI prefixes table (from memory) — k, M, G, m, µ
    expect(num('5k').value).toBe(5000);
    expect(num('5K').value).toBe(5000);
    expect(num('1.5M').value).toBe(1_500_000);
    expect(num('2G').value).toBe(2e9);
    expect(num('500m').value).toBe(0.5);
    expect(num('200µ').value).toBeCloseTo(2e-4, 15);
    expect(num('1.1k').value).toBe(1100); // exact: no 1.1 × 1000 rounding error
  });

  it('reads B and bn as billions, but kB/MiB as bytes', () => {
    // common practice, no source (financial B/bn)
    expect(num('3B').value).toBe(3e9);
    expect(num('$2.5bn')).toMatchObject({ value: 2.5e9, unit: '$' });
    // source: IEC 80000-13:2008 — kB = 1000 B, KiB = 1024 B, MiB = 1024² B
    expect(num('5 kB')).toMatchObject({ value: 5000, unit: 'B' });
    expect(num('2 MiB')).toMatchObject({ value: 2 * 1024 ** 2, unit: 'B' });
    const bytes = parseTickLabel('512B', { bareB: 'byte' });
    expect(bytes?.kind === 'number' && bytes.value).toBe(512);
  });

  it('reads m as million after a currency sign and as metres after a space', () => {
    // common practice, no source (UK finance writes £5m; an axis unit after a space is a unit word)
    expect(num('£5m').value).toBe(5e6);
    expect(num('5 m')).toMatchObject({ value: 5, unit: 'm' });
    expect(num('20 km')).toMatchObject({ value: 20, unit: 'km' });
    expect(num('20°C')).toMatchObject({ value: 20, unit: '°C' });
  });

  it('does not read ordinals or open-ended bins as numbers', () => {
    // common practice, no source
    expect(parseTickLabel('1st')?.kind).toBe('category');
    expect(parseTickLabel('<10')?.kind).toBe('category');
    expect(parseTickLabel('2019–2020')?.kind).toBe('category');
  });
});

describe('parseTickLabel: scientific notation', () => {
  it('reads E notation, as C printf and R write it', () => {
    // source: ISO/IEC 9899 (C) fprintf %e conversion; R's format() writes "1e+06" (from memory)
    expect(num('1e6').value).toBe(1e6);
    expect(num('1e+06').value).toBe(1e6);
    expect(num('1.5E-3')).toMatchObject({ value: 0.0015, decimals: 1 });
  });

  it('reads ×10 forms with caret, superscript and mathtext exponents', () => {
    // common practice, no source (matplotlib mathtext output, typeset scientific notation)
    expect(num('2×10³').value).toBe(2000);
    expect(num('2 × 10^3').value).toBe(2000);
    expect(num('10^3').value).toBe(1000);
    expect(num('10⁻²').value).toBe(0.01);
    expect(num('\u22121.5×10\u207B\u00B3').value).toBe(-0.0015);
    expect(num('$10^{3}$').value).toBe(1000);
    expect(num('$\\mathdefault{10^{-2}}$').value).toBe(0.01);
    expect(num('$\\mathdefault{2\\times10^{4}}$').value).toBe(20000);
  });

  it('does not take a superscript in a unit as an exponent', () => {
    // common practice, no source
    expect(num('10 m²')).toMatchObject({ value: 10, unit: 'm²' });
    expect(num('5 cm³')).toMatchObject({ value: 5, unit: 'cm³' });
  });
});

describe('parseTickLabel: dates and times', () => {
  it('reads ISO 8601 calendar dates and times as UTC', () => {
    // source: ISO 8601-1:2019 — extended calendar date, time of day, UTC offset (from memory)
    expect(date('2024-03').ms).toBe(Date.UTC(2024, 2, 1));
    expect(date('2024-03').granularity).toBe('month');
    expect(date('2024-03-15').ms).toBe(Date.UTC(2024, 2, 15));
    expect(date('2024-03-15T12:00').ms).toBe(Date.UTC(2024, 2, 15, 12, 0));
    expect(date('2024-03-15 12:00:30Z').ms).toBe(Date.UTC(2024, 2, 15, 12, 0, 30));
    expect(date('2024-03-15T12:00+02:00').ms).toBe(Date.UTC(2024, 2, 15, 10, 0));
    expect(parseTickLabel('2024-02-30')?.kind).toBe('category'); // no 30 February
  });

  it('reads month names, abbreviations and their common combinations', () => {
    // common practice, no source (strftime %b/%B style output, English)
    expect(date('Jan').parts).toEqual({ month: 1 });
    expect(date('January').parts).toEqual({ month: 1 });
    expect(date('Sept.').parts).toEqual({ month: 9 });
    expect(date('Jan 2024').ms).toBe(Date.UTC(2024, 0, 1));
    expect(date('January, 2024').ms).toBe(Date.UTC(2024, 0, 1));
    expect(date('2024 Jan').ms).toBe(Date.UTC(2024, 0, 1));
    expect(date('Mar 15').parts).toEqual({ month: 3, day: 15 });
    expect(date('15 Mar').parts).toEqual({ month: 3, day: 15 });
    expect(date('Mar 15, 2024').ms).toBe(Date.UTC(2024, 2, 15));
    expect(date('15-Mar-2024').ms).toBe(Date.UTC(2024, 2, 15));
    expect(date('15th March 2024').ms).toBe(Date.UTC(2024, 2, 15));
    expect(date('Mon, Mar 15').parts).toEqual({ month: 3, day: 15 });
    expect(date('Fri 03').parts).toEqual({ day: 3 });
  });

  it('expands two-digit years with the POSIX pivot', () => {
    // source: POSIX.1-2017 strptime %y — 69–99 → 1969–1999, 00–68 → 2000–2068
    expect(date("Jan '24").parts.year).toBe(2024);
    expect(date('Jan-24').parts.year).toBe(2024);
    expect(date('Jan-69').parts.year).toBe(1969);
    expect(date('03/15/99').parts.year).toBe(1999);
  });

  it('orders numeric day/month by the number above 12, else by option', () => {
    // common practice, no source (US month-first, most other locales day-first)
    expect(date('15/03/2024').ms).toBe(Date.UTC(2024, 2, 15));
    expect(date('03/15/2024').ms).toBe(Date.UTC(2024, 2, 15));
    expect(date('15.03.2024').ms).toBe(Date.UTC(2024, 2, 15));
    const amb = date('03/04/2024');
    expect(amb.ambiguousOrder).toBe(true);
    expect(amb.ms).toBe(Date.UTC(2024, 2, 4));
    expect(date('03/04/2024', { dayFirst: true }).ms).toBe(Date.UTC(2024, 3, 3));
  });

  it('reads 12-hour clock labels', () => {
    // common practice, no source (12 AM = midnight, 12 PM = noon)
    expect(date('12 AM').parts).toEqual({ hour: 0 });
    expect(date('12 PM').parts).toEqual({ hour: 12 });
    expect(date('03 PM').parts).toEqual({ hour: 15 });
    expect(date('3:15 p.m.').parts).toEqual({ hour: 15, minute: 15 });
    expect(parseTickLabel('13 PM')?.kind).toBe('category');
  });

  it('reads quarters only with a year', () => {
    // common practice, no source
    expect(date('Q3 2024')).toMatchObject({ ms: Date.UTC(2024, 6, 1), granularity: 'quarter' });
    expect(date('2024-Q1').ms).toBe(Date.UTC(2024, 0, 1));
  });
});

describe('parseTickLabel: input handling', () => {
  it('returns null for empty or invisible-only text', () => {
    expect(parseTickLabel('')).toBeNull();
    expect(parseTickLabel(' \u00A0\u200B ')).toBeNull();
  });

  it('throws a clear error for a non-string', () => {
    expect(() => parseTickLabel(42 as unknown as string)).toThrow(/expected a string/);
  });

  it('never throws on arbitrary text, and numbers and dates are finite', () => {
    const alphabet = fc.constantFrom(
      ...'0123456789.,-+ eE$€£%kKMBGmµ×x^⁻³²¹⁰()\u2212\u2013\u00A0\u2009\u202F:/\'JanFebMarQ{}\\'.split(''),
    );
    fc.assert(
      fc.property(fc.oneof(fc.string(), fc.string({ unit: alphabet, maxLength: 24 })), (text) => {
        const p = parseTickLabel(text);
        if (p === null) return;
        if (p.kind === 'number') expect(Number.isFinite(p.value)).toBe(true);
        if (p.kind === 'date') expect(Number.isFinite(p.ms)).toBe(true);
        parseAxisMultiplier(text);
      }),
      { numRuns: 3000 },
    );
  });

  it('keeps very long text as a category without scanning it', () => {
    const long = '1'.repeat(5000);
    expect(parseTickLabel(long)?.kind).toBe('category');
  });
});

describe('parseAxisMultiplier', () => {
  it('reads multipliers in the spellings libraries print near an axis end', () => {
    // common practice, no source (matplotlib offset text; typeset ×10ⁿ factors)
    expect(parseAxisMultiplier('×10³')).toMatchObject({ multiplier: 1000, offset: 0 });
    expect(parseAxisMultiplier('× 10^-2')).toMatchObject({ multiplier: 0.01, offset: 0 });
    expect(parseAxisMultiplier('×10⁻²')).toMatchObject({ multiplier: 0.01, offset: 0 });
    expect(parseAxisMultiplier('x1000')).toMatchObject({ multiplier: 1000, offset: 0 });
    expect(parseAxisMultiplier('1e6')).toMatchObject({ multiplier: 1e6, offset: 0 });
    expect(parseAxisMultiplier('(×10³)')).toMatchObject({ multiplier: 1000, offset: 0 });
    expect(parseAxisMultiplier('$\\times10^{-2}$')).toMatchObject({ multiplier: 0.01, offset: 0 });
  });

  it('reads a signed label as an offset, and multiplier-plus-offset together', () => {
    // common practice, no source (value = label × multiplier + offset)
    expect(parseAxisMultiplier('+1.5e3')).toMatchObject({ multiplier: 1, offset: 1500 });
    expect(parseAxisMultiplier('\u22122e3')).toMatchObject({ multiplier: 1, offset: -2000 });
    expect(parseAxisMultiplier('1e6+1.5e3')).toMatchObject({ multiplier: 1e6, offset: 1500 });
    expect(parseAxisMultiplier('1e-3+1.5')).toMatchObject({ multiplier: 0.001, offset: 1.5 });
    expect(parseAxisMultiplier('$\\times\\mathdefault{10^{3}}\\mathdefault{+1.5}$')).toMatchObject({ multiplier: 1000, offset: 1.5 });
  });

  it('refuses plain numbers and text', () => {
    expect(parseAxisMultiplier('1000')).toBeNull();
    expect(parseAxisMultiplier('Riders (thousands)')).toBeNull();
    expect(parseAxisMultiplier('')).toBeNull();
    expect(parseAxisMultiplier('×0')).toBeNull();
    expect(() => parseAxisMultiplier(null as unknown as string)).toThrow(/expected a string/);
  });
});
