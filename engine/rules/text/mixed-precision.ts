/**
 * text.mixed-precision: the numeric tick labels of one linear axis are
 * written with different numbers of decimals (e.g. 0, 0.5, 1.25). Log axes
 * are left alone: 0.1, 1, 10 is their natural spelling.
 */
import { elementsOf, type Rule, type RuleFinding } from '../rule.js';

export const mixedPrecision: Rule = {
  id: 'text.mixed-precision',
  family: 'text',
  severity: 'note',
  rationale: 'Labels of one scale with different numbers of decimals look like values of different precision and break the alignment of place values.',
  source: 'Common practice in table and axis design: one number format (and precision) per scale',
  thresholds: {},
  fix: 'Write every label of the axis with the same number of decimals.',
  check({ chart, measures }) {
    const out: RuleFinding[] = [];
    for (const p of measures.text.precision) {
      if (p.precisions.length < 2) continue;
      const max = p.precisions[p.precisions.length - 1]!;
      out.push({
        message: `The ${p.axis} axis mixes ${p.precisions.join(', ')} decimals (${p.labels.slice(0, 5).join(', ')}${p.labels.length > 5 ? ', …' : ''}).`,
        elements: elementsOf(chart, p.items),
        measures: { axis: p.axis, precisions: p.precisions, labels: p.labels.slice(0, 20), suggestedDecimals: max },
      });
    }
    return out;
  },
};
