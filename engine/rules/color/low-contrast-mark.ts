/**
 * color.low-contrast-mark: data marks whose colour has less than 3:1 contrast
 * against what they are drawn on (WCAG 2.x SC 1.4.11 Non-text Contrast). Many
 * well-made palettes include light colours, so this is a note by default: the
 * criterion also passes when marks are outlined or labelled.
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt } from '../format-number.js';

export const lowContrastMark: Rule = {
  id: 'color.low-contrast-mark',
  family: 'color',
  severity: 'note',
  rationale:
    'Marks that barely stand out from their background are hard to see for people with low vision and on poor screens or in print.',
  source: 'W3C WCAG 2.1/2.2 SC 1.4.11 Non-text Contrast (AA): 3:1 for parts of graphics required to understand the content',
  thresholds: {
    /** Least contrast ratio of a mark (or its outline) against its background. */
    minContrast: 3,
  },
  check({ chart, measures, thresholds }) {
    const low = measures.markContrast.filter(
      (m) => m.ratio < thresholds.minContrast && !(m.outlineRatio !== null && m.outlineRatio >= thresholds.minContrast),
    );
    if (low.length === 0) return [];
    low.sort((a, b) => a.ratio - b.ratio);
    const w = low[0]!;
    const name = w.name ? `"${w.name}" (${w.hex})` : w.hex;
    const more = low.length > 1 ? ` ${low.length - 1} more mark colour${low.length > 2 ? 's' : ''} too.` : '';
    return [
      {
        message:
          `Marks in ${name} have a contrast ratio of ${fmt(w.ratio, 2)}:1 against their background (${w.behindHex}); ` +
          `WCAG 2.x SC 1.4.11 asks ${fmt(thresholds.minContrast)}:1 for graphics needed to understand the content, unless an outline or labels carry them.${more} ` +
          'Automated checks do not replace review by people, nor the accessibility requirements that apply where the figure is published.',
        elements: elementsOf(chart, low.flatMap((m) => m.items.slice(0, 5))),
        measures: {
          marks: low.map((m) => ({ color: m.hex, name: m.name, background: m.behindHex, ratio: r4(m.ratio), outlineRatio: m.outlineRatio === null ? null : r4(m.outlineRatio) })),
        },
      },
    ];
  },
};
