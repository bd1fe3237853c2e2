/**
 * form.pie-many-slices and form.angle-judgment on pies drawn here; the pie
 * is found by the pie detector.
 */
import { describe, expect, it } from 'vitest';
import { angleJudgment } from '../engine/rules/form/angle-judgment.js';
import { pieManySlices } from '../engine/rules/form/pie-many-slices.js';
import { check, pieChart, understandPie } from './support/rules-svg.js';

const OKABE_ITO = ['#0072b2', '#e69f00', '#009e73', '#cc79a7', '#56b4e9', '#d55e00', '#f0e442', '#000000'];

describe('form.pie-many-slices', () => {
  it('eight slices are reported, six are not', () => {
    const many = understandPie(pieChart({ shares: [3, 8, 10, 12, 14, 15, 18, 20], colors: OKABE_ITO }));
    expect(many.analysis.chart.pie?.wedges).toHaveLength(8);
    const f = check(pieManySlices, many);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.slices).toBe(8);
    expect(f[0]!.message).toMatch(/^This pie has 8 slices \(more than 6\), 1 of them under 5% of the whole/);
    const six = understandPie(pieChart({ shares: [8, 12, 15, 18, 20, 27], colors: OKABE_ITO }));
    expect(check(pieManySlices, six)).toEqual([]);
  });

  it('donuts count their slices the same way', () => {
    const u = understandPie(pieChart({ shares: [3, 8, 10, 12, 14, 15, 18, 20], colors: OKABE_ITO, innerRadius: 70 }));
    expect(check(pieManySlices, u)[0]?.message).toMatch(/^This donut has 8 slices/);
  });
});

describe('form.angle-judgment', () => {
  it('wedges 1 percentage point apart are noted', () => {
    const u = understandPie(pieChart({ shares: [30, 29, 41], colors: OKABE_ITO }));
    const f = check(angleJudgment, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.severity ?? angleJudgment.severity).toBe('note');
    expect(f[0]!.message).toMatch(/\(30%\) and .*\(29%\) differ by 1 percentage point,/);
  });

  it('wedges well apart are not noted', () => {
    const u = understandPie(pieChart({ shares: [20, 30, 50], colors: OKABE_ITO }));
    expect(check(angleJudgment, u)).toEqual([]);
  });

  it('close wedges whose values are printed on them are not noted', () => {
    const u = understandPie(pieChart({ shares: [30, 29, 41], colors: OKABE_ITO, labels: ['30%', '29%', '41%'] }));
    const pie = u.analysis.chart.pie!;
    expect(pie.wedges.every((w) => w.labelItem !== null)).toBe(true);
    expect(check(angleJudgment, u)).toEqual([]);
  });

  it('roses are not judged by angle', () => {
    const u = understandPie(pieChart({ shares: [1, 1, 1, 1], radii: [40, 80, 120, 60], colors: OKABE_ITO }));
    expect(check(angleJudgment, u)).toEqual([]);
  });
});
