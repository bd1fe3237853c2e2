/**
 * The text rules and form.overplotting on small drawings: one that triggers
 * each, ones that do not. Roles and axes are set by hand.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import type { Axis, Chart, ItemRole } from '../engine/classify/chart.js';
import { measureChart, type MeasureOptions } from '../engine/measure/measures.js';
import { overplotting } from '../engine/rules/form/overplotting.js';
import { ruleById } from '../engine/rules/index.js';
import type { Rule, RuleFinding } from '../engine/rules/rule.js';
import { textLowContrast } from '../engine/rules/text/low-contrast.js';
import { mixedPrecision } from '../engine/rules/text/mixed-precision.js';
import { textOverlap } from '../engine/rules/text/overlap.js';
import { raggedNumerals } from '../engine/rules/text/ragged-numerals.js';
import { textTooSmall } from '../engine/rules/text/too-small.js';

function chartOf(body: string, role: (i: number) => ItemRole['sub'] = () => 'label/other'): Chart {
  const { chart } = analyzeSvg(`<svg xmlns="http://www.w3.org/2000/svg" width="400" height="300" viewBox="0 0 400 300">${body}</svg>`);
  chart.roles = chart.scene.items.map((_, i) => {
    const sub = role(i);
    return { role: sub.split('/')[0] as ItemRole['role'], sub };
  });
  return chart;
}

function run(rule: Rule, chart: Chart, options: MeasureOptions = {}): RuleFinding[] {
  return rule.check({ chart, measures: measureChart(chart, options), thresholds: { ...rule.thresholds }, severity: rule.severity });
}

function yAxis(items: number[]): Axis {
  return { name: 'y', direction: 'vertical', scale: 'linear', ticks: items.map((label, k) => ({ value: k, position: k, label })), fit: null, bands: null, domain: [0, 1], line: null };
}

const column = (anchor: string, labels: string[]) => labels.map((l, k) => `<text x="60" y="${40 + k * 30}" font-size="12" text-anchor="${anchor}">${l}</text>`).join('');

describe('rule catalogue', () => {
  it('has the text rules and form.overplotting under their ids', () => {
    for (const id of ['text.too-small', 'text.low-contrast', 'text.overlap', 'text.ragged-numerals', 'text.mixed-precision', 'form.overplotting']) {
      const r = ruleById(id);
      expect(r, id).toBeDefined();
      expect(r!.source.length).toBeGreaterThan(10);
    }
  });
});

describe('text.too-small', () => {
  it('fires for 6 px text and not for 12 px text', () => {
    const f = run(textTooSmall, chartOf('<text x="10" y="50" font-size="6">Tiny</text><text x="10" y="100" font-size="12">Fine</text>'));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.count).toBe(1);
    expect(f[0]!.measures.minPx).toBe(6);
    expect(run(textTooSmall, chartOf('<text x="10" y="100" font-size="12">Fine</text>'))).toEqual([]);
  });

  it('judges at the configured display width', () => {
    // 12 user units on a 400-unit-wide figure shown 200 px wide: 6 px
    const f = run(textTooSmall, chartOf('<text x="10" y="100" font-size="12">Shrunk</text>'), { displayWidth: 200 });
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.minPx).toBe(6);
  });
});

describe('text.low-contrast', () => {
  it('fires below 4.5:1 and says what automated checks cannot do', () => {
    // source: ../shared/reference/wcag.json — #777777 on white is 4.4781:1 (fails 4.5), #767676 is 4.5422:1 (passes)
    const f = run(textLowContrast, chartOf('<text x="10" y="50" fill="#777777">Grey</text><text x="10" y="100" fill="#767676">Darker</text>'));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.count).toBe(1);
    expect(f[0]!.message).toMatch(/do not replace review by people/);
    expect(f[0]!.message).toMatch(/accessibility requirements/);
  });

  it('uses 3:1 for large-scale text', () => {
    // source: WCAG 2.2 SC 1.4.3 — large text 3:1; #949494 on white is 3.0335:1 (wcag.json)
    expect(run(textLowContrast, chartOf('<text x="10" y="50" font-size="24" fill="#949494">Large</text>'))).toEqual([]);
    expect(run(textLowContrast, chartOf('<text x="10" y="50" font-size="23" fill="#949494">Not large</text>'))).toHaveLength(1);
  });

  it('judges text against the bar it sits on', () => {
    const chart = chartOf('<rect x="0" y="0" width="300" height="100" fill="#6baed6"/><text x="20" y="60" fill="#000" font-size="16">On blue</text>', (i) => (i === 0 ? 'mark/bar' : 'label/data'));
    // source: culori 4.0.2 wcagContrast — #000 on #6baed6 ≈ 8.65:1 passes; #555 on #6baed6 ≈ 3.07:1 fails (on white #555 passes at 7.46:1)
    expect(run(textLowContrast, chart)).toEqual([]);
    const dim = chartOf('<rect x="0" y="0" width="300" height="100" fill="#6baed6"/><text x="20" y="60" fill="#555" font-size="16">On blue</text>', (i) => (i === 0 ? 'mark/bar' : 'label/data'));
    expect(run(textLowContrast, dim)).toHaveLength(1);
  });
});

describe('text.overlap', () => {
  it('fires for labels drawn over each other and not for neighbours', () => {
    expect(run(textOverlap, chartOf('<text x="10" y="50" font-size="14">Northern region</text><text x="60" y="55" font-size="14">Southern region</text>'))).toHaveLength(1);
    expect(run(textOverlap, chartOf('<text x="10" y="50" font-size="14">Left</text><text x="120" y="50" font-size="14">Right</text>'))).toEqual([]);
  });
});

describe('text.ragged-numerals', () => {
  it('fires for a left-aligned column of numbers and not for a right-aligned one', () => {
    const left = chartOf(column('start', ['1000', '750', '500', '250', '0']), () => 'label/tick');
    left.axes.y = yAxis([0, 1, 2, 3, 4]);
    const f = run(raggedNumerals, left);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.alignment).toBe('left');
    const right = chartOf(column('end', ['1000', '750', '500', '250', '0']), () => 'label/tick');
    right.axes.y = yAxis([0, 1, 2, 3, 4]);
    expect(run(raggedNumerals, right)).toEqual([]);
  });
});

describe('text.mixed-precision', () => {
  it('fires for 0, 0.5, 1.25 and not for 0.0, 0.5, 1.0', () => {
    const mixed = chartOf(column('end', ['0', '0.5', '1.25']), () => 'label/tick');
    mixed.axes.y = yAxis([0, 1, 2]);
    const f = run(mixedPrecision, mixed);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.precisions).toEqual([0, 1, 2]);
    const even = chartOf(column('end', ['0.0', '0.5', '1.0']), () => 'label/tick');
    even.axes.y = yAxis([0, 1, 2]);
    expect(run(mixedPrecision, even)).toEqual([]);
  });
});

describe('form.overplotting', () => {
  const dot = (x: number, y: number) => `<circle cx="${x}" cy="${y}" r="3" fill="#000"/>`;

  it('fires when most points are hidden under others', () => {
    // 10 clumps of 10 points within 1 unit of each other: 9 of each 10 hidden
    const list: string[] = [];
    for (let c = 0; c < 10; c++) for (let k = 0; k < 10; k++) list.push(dot(30 + c * 35 + (k % 3) * 0.3, 100 + Math.floor(k / 3) * 0.3));
    const f = run(overplotting, chartOf(list.join(''), () => 'mark/point'));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.hiddenShare).toBe(0.9);
  });

  it('stays quiet for spread points and for too few points', () => {
    const spread: string[] = [];
    for (let i = 0; i < 10; i++) for (let j = 0; j < 8; j++) spread.push(dot(20 + i * 35, 20 + j * 35));
    expect(run(overplotting, chartOf(spread.join(''), () => 'mark/point'))).toEqual([]);
    const few = Array.from({ length: 10 }, () => dot(100, 100)).join('');
    expect(run(overplotting, chartOf(few, () => 'mark/point'))).toEqual([]);
  });
});
