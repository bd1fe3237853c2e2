/**
 * color.too-many-categories: more category colours than readers can keep
 * apart and match against a legend.
 */
import { elementsOf, type Rule } from '../rule.js';

export const tooManyCategories: Rule = {
  id: 'color.too-many-categories',
  family: 'color',
  severity: 'warning',
  rationale:
    'Beyond about eight to ten hues, category colours start to look alike and matching each to its legend entry becomes slow and error-prone.',
  source:
    'common practice; Healey, Choosing Effective Colours for Data Visualization (IEEE Visualization 1996): about seven colours identified rapidly and accurately — from memory',
  thresholds: {
    /** Most category colours before the chart is reported. */
    maxCategories: 10,
  },
  check({ chart, measures, thresholds }) {
    const n = measures.palette.entries.length;
    if (n <= thresholds.maxCategories) return [];
    const src = measures.palette.entries[0]?.source === 'wedge' ? 'wedges' : 'categories';
    return [
      {
        message:
          `${n} colours tell ${src} apart (more than ${thresholds.maxCategories}); readers cannot reliably keep that many hues apart. ` +
          'Group small categories, label the marks directly, or split the chart into small multiples.',
        elements: elementsOf(chart, measures.palette.entries.map((e) => e.items[0]!).filter((i) => i !== undefined)),
        measures: { colors: n, continuous: measures.palette.continuous },
      },
    ];
  },
};
