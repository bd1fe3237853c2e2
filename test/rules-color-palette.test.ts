/**
 * color.cvd-confusable, color.too-close, color.too-many-categories and
 * color.low-contrast-mark on small charts drawn here.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { deltaE00, parseColor } from '../engine/color/index.js';
import { cvdConfusable } from '../engine/rules/color/cvd-confusable.js';
import { lowContrastMark } from '../engine/rules/color/low-contrast-mark.js';
import { tooClose } from '../engine/rules/color/too-close.js';
import { tooManyCategories } from '../engine/rules/color/too-many-categories.js';
import { barChart, check, lineChart, pieChart, understand, understandPie } from './support/rules-svg.js';

const wcag = JSON.parse(readFileSync(resolve(import.meta.dirname, '../../shared/reference/wcag.json'), 'utf8')) as {
  workedPairs: { published: { fg: string; bg: string; computed: number }[] };
};
/** The computed ratio of a worked pair of the reference (fg on white). */
function referenceRatio(fg: string): number {
  const p = wcag.workedPairs.published.find((x) => x.fg.toLowerCase() === fg.toLowerCase() && x.bg.toLowerCase() === '#ffffff');
  if (!p) throw new Error(`no worked pair ${fg} on #ffffff in wcag.json`);
  return p.computed;
}

// source: Okabe & Ito, Color Universal Design (2008), the eight-colour palette — from memory
const OKABE_ITO = ['#e69f00', '#56b4e9', '#009e73', '#f0e442', '#0072b2', '#d55e00', '#cc79a7', '#000000'];
// source: ColorBrewer "Paired", 12 classes (Brewer, colorbrewer2.org) — from memory
const PAIRED_12 = ['#a6cee3', '#1f78b4', '#b2df8a', '#33a02c', '#fb9a99', '#e31a1c', '#fdbf6f', '#ff7f00', '#cab2d6', '#6a3d9a', '#ffff99', '#b15928'];

const groups = (n: number) => Array.from({ length: n }, (_, i) => [10 + i, 14 + ((i * 3) % 7)]);

describe('color.cvd-confusable', () => {
  it('a red and a green series are reported for deutan vision, with both ΔE00 values', () => {
    // Red-green pairs collapse under protan/deutan simulation (Machado et al. 2009); prevalence Birch 2012.
    const u = understand(barChart({ series: [[10, 20, 15], [12, 18, 11]], colors: ['#dd3322', '#559922'], names: ['Planned', 'Delivered'], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    const f = check(cvdConfusable, u);
    expect(f).toHaveLength(1);
    const pair = (f[0]!.measures.pairs as Record<string, number | string>[])[0]!;
    expect(pair.vision === 'deutan' || pair.vision === 'protan').toBe(true);
    expect(pair.normal as number).toBeGreaterThan(20);
    expect(pair.simulated as number).toBeLessThan(8);
    expect(f[0]!.message).toMatch(/"Planned" \(#dd3322\) and "Delivered" \(#559922\) differ clearly in normal vision \(ΔE00 \d+/);
    expect(f[0]!.message).toMatch(/Automated checks do not replace/);
  });

  it('the Okabe–Ito palette on bars is not reported', () => {
    const series = OKABE_ITO.map((_, s) => [10 + s, 12 + s]);
    const u = understand(barChart({ series, colors: OKABE_ITO, lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    expect(u.measures.palette.entries).toHaveLength(8);
    expect(check(cvdConfusable, u)).toEqual([]);
    expect(check(tooClose, u)).toEqual([]);
    expect(check(tooManyCategories, u)).toEqual([]);
  });

  it('translucent colours are compared as seen over the background', () => {
    // source: Porter & Duff (1984) "over" compositing: 0.3 × #ff0000 over white = (255, 178.5, 178.5) → #ffb3b3
    const u = understand(barChart({ series: [[10, 20, 15], [12, 18, 11]], colors: ['rgba(255,0,0,0.3)', 'rgba(0,128,0,0.3)'], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    expect(u.measures.palette.entries.map((e) => e.hex)).toEqual(['#ffb3b3', '#b3d9b3']);
  });

  it('pie wedge colours are checked too', () => {
    const u = understandPie(pieChart({ shares: [30, 30, 40], colors: ['#dd3322', '#559922', '#0072b2'] }));
    expect(u.measures.palette.entries.every((e) => e.source === 'wedge')).toBe(true);
    expect(check(cvdConfusable, u)).toHaveLength(1);
  });
});

describe('color.too-close and the mark-size effect', () => {
  it('two nearly equal blues are too close in normal vision (and not a CVD finding)', () => {
    const u = understand(barChart({ series: [[10, 20, 15], [12, 18, 11]], colors: ['#1f77b4', '#2a7fb8'], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    const f = check(tooClose, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/differ by only ΔE00 3\.\d/);
    expect(check(cvdConfusable, u)).toEqual([]);
  });

  it('a difference enough for bars is not enough for thin lines', () => {
    // source: Szafir 2018 (IEEE TVCG 24(1)): discriminability falls with mark size; thin marks need larger differences.
    const a = '#1f77b4';
    const b = '#4a90d0';
    const d = deltaE00(parseColor(a)!, parseColor(b)!);
    expect(d).toBeGreaterThan(8);
    expect(d).toBeLessThan(12);
    const bars = understand(barChart({ series: [[10, 20, 15], [12, 18, 11]], colors: [a, b], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    expect(check(tooClose, bars)).toEqual([]);
    const lines = understand(lineChart({ series: [[1, 4, 3, 5], [2, 3, 4, 2]], colors: [a, b], lo: 0, hi: 6, ticks: [0, 2, 4, 6], strokeWidth: 1.5 }));
    expect(lines.measures.palette.entries.every((e) => e.markClass === 'small')).toBe(true);
    expect(check(tooClose, lines)).toHaveLength(1);
  });
});

describe('color.too-many-categories', () => {
  it('twelve category colours are reported, eight are not', () => {
    const twelve = understandPie(pieChart({ shares: PAIRED_12.map((_, i) => 5 + i), colors: PAIRED_12 }));
    const f = check(tooManyCategories, twelve);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.colors).toBe(12);
    const eight = understand(barChart({ series: OKABE_ITO.map((_, s) => [10 + s, 12 + s]), colors: OKABE_ITO, lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }));
    expect(check(tooManyCategories, eight)).toEqual([]);
  });
});

describe('color.low-contrast-mark (WCAG 2.x SC 1.4.11)', () => {
  const bars = (color: string, stroke = '') =>
    understand(barChart({ series: [[10, 20, 15]], colors: [color], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25] }).replace(/fill="(#[0-9a-fA-F]{6})"\/>/g, (m, c: string) => (c.toLowerCase() === color.toLowerCase() && stroke ? `fill="${c}" ${stroke}/>` : m)));

  it('yellow #FFF000 bars on white are reported at 1.19:1', () => {
    // source: WCAG Understanding SC 1.4.11 / wcag.json worked pair #FFF000 on #fff: published 1.2:1, computed 1.1854
    const f = check(lowContrastMark, bars('#fff000'));
    expect(f).toHaveLength(1);
    expect(f[0]!.severity ?? lowContrastMark.severity).toBe('note');
    const m = (f[0]!.measures.marks as Record<string, number | string>[])[0]!;
    expect(m.ratio as number).toBeCloseTo(referenceRatio('#fff000'), 3);
    expect(f[0]!.message).toMatch(/Automated checks do not replace/);
  });

  it('#949494 passes at 3.03:1 and #9D9D9D fails at 2.71:1 (thresholds are not rounded)', () => {
    // source: wcag.json worked pairs: #949494/#fff published 3:1, computed 3.0335; #9D9D9D/#fff published 2.7:1, computed 2.7120
    expect(bars('#949494').measures.markContrast[0]!.ratio).toBeCloseTo(referenceRatio('#949494'), 3);
    expect(check(lowContrastMark, bars('#949494'))).toEqual([]);
    const f = check(lowContrastMark, bars('#9d9d9d'));
    expect(f).toHaveLength(1);
    expect((f[0]!.measures.marks as Record<string, number>[])[0]!.ratio).toBeCloseTo(referenceRatio('#9d9d9d'), 3);
  });

  it('a light bar with a dark outline passes by its outline', () => {
    const u = bars('#fff000', 'stroke="#000000" stroke-width="1.5"');
    expect(u.measures.markContrast[0]?.outlineRatio).toBeGreaterThan(3);
    expect(check(lowContrastMark, u)).toEqual([]);
  });
});
