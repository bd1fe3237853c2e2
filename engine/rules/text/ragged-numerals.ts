/**
 * text.ragged-numerals: a column of numbers (the tick labels of a vertical
 * axis) whose digits do not line up: neither the right edges nor the
 * decimal marks are aligned, or the face sets digits at different widths
 * (proportional figures) and the text does not ask for tabular figures.
 */
import { r4, elementsOf, type Rule, type RuleFinding } from '../rule.js';

export const raggedNumerals: Rule = {
  id: 'text.ragged-numerals',
  family: 'text',
  severity: 'note',
  rationale: 'Numbers in a column are compared by the position of their digits; aligned place values (right or decimal alignment, tabular figures) let magnitudes be read at a glance.',
  source: 'Common practice in typography and table design: right- or decimal-aligned numerals in tabular figures (OpenType `tnum`; CSS Fonts 4 `font-variant-numeric: tabular-nums`)',
  thresholds: {},
  fix: 'Align the numbers on their right edge or decimal mark and set them in tabular figures (font-variant-numeric: tabular-nums).',
  check({ chart, measures }) {
    const out: RuleFinding[] = [];
    for (const c of measures.text.columns) {
      const ragged = c.alignment !== 'right' && c.alignment !== 'decimal';
      const proportional = c.proportional.length > 0;
      if (!ragged && !proportional) continue;
      const why: string[] = [];
      if (ragged) why.push(`its labels are ${c.alignment === 'left' ? 'left-aligned' : 'not aligned'}: right edges spread over ${r4(c.rightSpreadPx)} px`);
      if (proportional) why.push(`${c.proportional.length} label${c.proportional.length > 1 ? 's use' : ' uses'} proportional figures without tabular-nums`);
      out.push({
        message: `The ${c.axis} axis numbers (${c.labels.slice(0, 4).join(', ')}${c.labels.length > 4 ? ', …' : ''}) do not line up: ${why.join('; ')}.`,
        elements: elementsOf(chart, c.items),
        measures: {
          axis: c.axis,
          alignment: c.alignment,
          rightSpreadPx: r4(c.rightSpreadPx),
          decimalSpreadPx: Number.isFinite(c.decimalSpreadPx) ? r4(c.decimalSpreadPx) : null,
          proportional: c.proportional.length,
          fontSubstituted: c.substituted,
        },
      });
    }
    return out;
  },
};
