/**
 * text.too-small: text rendered smaller than a threshold at the figure's
 * intended display size (its own width, or the configured display width).
 */
import { r4, elementsOf, type Rule } from '../rule.js';

export const textTooSmall: Rule = {
  id: 'text.too-small',
  family: 'text',
  severity: 'warning',
  rationale: 'Labels too small to read at the size the figure is shown cannot do their job, least of all for readers with low vision.',
  // common practice, no single source: print figure guides commonly ask for text of at least 6–7 pt at final size (from memory); 9 CSS px ≈ 6.75 pt
  source: 'Common practice: figure text of at least 6–7 pt at final size (9 CSS px ≈ 6.75 pt); no WCAG success criterion sets a minimum size',
  thresholds: {
    /** Least font size in CSS px at the display size. */
    minPx: 9,
  },
  fix: 'Set the text at the minimum size or larger (or show the figure larger).',
  check({ chart, measures, thresholds }) {
    const small = measures.text.labels.filter((l) => l.sizePx < thresholds.minPx);
    if (small.length === 0) return [];
    small.sort((a, b) => a.sizePx - b.sizePx);
    const least = small[0]!;
    const width = chart.scene.viewBox.width * measures.text.pxPerUnit;
    const all = measures.text.labels.length;
    return [
      {
        message:
          `${small.length} of ${all} text item${all > 1 ? 's' : ''} render below ${thresholds.minPx} px at a display width of ${r4(width)} px; ` +
          `the smallest ("${least.content.slice(0, 40)}") is ${r4(least.sizePx)} px.`,
        elements: elementsOf(chart, small.map((l) => l.item)),
        measures: { count: small.length, minPx: r4(least.sizePx), thresholdPx: thresholds.minPx, displayWidthPx: r4(width) },
      },
    ];
  },
};
