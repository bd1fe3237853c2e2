/**
 * text.low-contrast: text whose WCAG 2.x contrast ratio against what is
 * behind its centre is below SC 1.4.3: 4.5:1, or 3:1 for large-scale text
 * (≥ 24 CSS px, or ≥ 18.67 px bold).
 */
import { WCAG_CONTRAST } from '../../color/wcag-contrast.js';
import { formatHex } from '../../color/format-hex.js';
import { r4, elementsOf, type Rule } from '../rule.js';

export const textLowContrast: Rule = {
  id: 'text.low-contrast',
  family: 'text',
  severity: 'warning',
  rationale: 'Text that differs too little in luminance from its background is hard or impossible to read for many people with low vision or colour-vision deficiency.',
  source: 'W3C WCAG 2.2, SC 1.4.3 Contrast (Minimum), level AA: 4.5:1, 3:1 for large-scale text (same in WCAG 2.0 and 2.1)',
  thresholds: {
    /** Least contrast ratio for normal text. */
    minRatio: WCAG_CONTRAST.text,
    /** Least contrast ratio for large-scale text. */
    minRatioLarge: WCAG_CONTRAST.largeText,
  },
  fix: 'Darken (or lighten) the text colour until it meets the ratio against its background.',
  check({ chart, measures, thresholds }) {
    const low = measures.text.labels.filter((l) => l.contrast !== null && l.contrast < (l.large ? thresholds.minRatioLarge : thresholds.minRatio));
    if (low.length === 0) return [];
    low.sort((a, b) => a.contrast! - b.contrast!);
    const worst = low[0]!;
    const colors = [...new Set(low.map((l) => `${formatHex({ ...l.color!, alpha: 1 })} on ${formatHex(l.behind!)}`))];
    return [
      {
        message:
          `${low.length} text item${low.length > 1 ? 's are' : ' is'} below the WCAG 2.x SC 1.4.3 contrast minimum ` +
          `(${thresholds.minRatio}:1, large text ${thresholds.minRatioLarge}:1); the lowest, "${worst.content.slice(0, 40)}", has ${r4(worst.contrast!)}:1 ` +
          `(${colors.slice(0, 3).join(', ')}). Automated checks do not replace review by people, nor the accessibility requirements of the place where the figure is published.`,
        elements: elementsOf(chart, low.map((l) => l.item)),
        measures: {
          count: low.length,
          minContrast: r4(worst.contrast!),
          pairs: colors.slice(0, 10),
          large: low.filter((l) => l.large).length,
        },
      },
    ];
  },
};
