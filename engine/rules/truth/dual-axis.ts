/**
 * truth.dual-axis: two value axes with different scales in one plot. Where
 * the series cross, and how steep each looks against the other, depends only
 * on the two scales someone chose.
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt } from '../format-number.js';

export const dualAxis: Rule = {
  id: 'truth.dual-axis',
  family: 'truth',
  severity: 'warning',
  rationale:
    'With two value axes the relative height, slope and crossings of the series are set by the choice of the two scales, not by the data, and readers compare them anyway.',
  source: 'Few, Dual-Scaled Axes in Graphs: Are They Ever the Best Solution? (Visual Business Intelligence Newsletter, 2008) — from memory; common practice',
  thresholds: {
    /** Scales whose units per world unit differ by less than this relative amount are one scale. */
    sameScaleTolerance: 0.01,
  },
  check({ chart, thresholds }) {
    const y = chart.axes.y;
    const y2 = chart.axes.y2;
    if (!y || !y2) return [];
    const numeric = (s: string) => s === 'linear' || s === 'log' || s === 'time';
    if (!numeric(y.scale) || !numeric(y2.scale)) return [];
    if (y.fit && y2.fit && y.scale === y2.scale) {
      // Same slope and offset: one scale drawn twice (mirrored ticks), not two scales.
      const sameA = Math.abs(y.fit.a - y2.fit.a) <= thresholds.sameScaleTolerance * Math.abs(y.fit.a);
      const span = Math.abs(y.fit.a) * Math.max(1e-9, Math.abs(Number(y.domain[1]) - Number(y.domain[0])));
      const sameB = Math.abs(y.fit.b - y2.fit.b) <= thresholds.sameScaleTolerance * span;
      if (sameA && sameB) return [];
    }
    const range = (d: (number | string)[]) => (d.length >= 2 ? `${fmt(Number(d[0]))}–${fmt(Number(d[d.length - 1]))}` : '?');
    const left = chart.series.filter((s) => s.axis === 'y').map((s) => s.name).filter(Boolean);
    const right = chart.series.filter((s) => s.axis === 'y2').map((s) => s.name).filter(Boolean);
    const names = left.length && right.length ? ` (${left.join(', ')} against ${right.join(', ')})` : '';
    const items = [y.line, y2.line, ...y.ticks.map((t) => t.label), ...y2.ticks.map((t) => t.label)].filter((i): i is number => i !== null);
    return [
      {
        message:
          `Two value axes with different scales${names}: ${range(y.domain)} on one side, ${range(y2.domain)} on the other. ` +
          'Where the series cross and how steep each looks are set by those two scales. Consider two charts one above the other sharing the x axis, or index both series to a common start.',
        elements: elementsOf(chart, items),
        measures: {
          yDomain: y.domain.map((v) => r4(Number(v))),
          y2Domain: y2.domain.map((v) => r4(Number(v))),
          yScale: y.scale,
          y2Scale: y2.scale,
        },
      },
    ];
  },
};
