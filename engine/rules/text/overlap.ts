/**
 * text.overlap: pairs of text items whose glyph boxes overlap (deeper than
 * one CSS px, so boxes that merely touch do not count).
 */
import type { TextItem } from '../../read/scene.js';
import { r4, elementsOf, type Rule } from '../rule.js';

export const textOverlap: Rule = {
  id: 'text.overlap',
  family: 'text',
  severity: 'warning',
  rationale: 'Labels drawn over each other cannot be read, and a reader cannot tell which value each belongs to.',
  source: 'Common practice (label placement avoids overlaps; e.g. Imhof 1975, "Positioning names on maps" — from memory)',
  thresholds: {
    /** Least overlap depth, CSS px, for a pair to count. */
    minDepthPx: 1,
  },
  check({ chart, measures, thresholds }) {
    const pairs = measures.text.collisions.filter((c) => c.depthPx >= thresholds.minDepthPx);
    if (pairs.length === 0) return [];
    const text = (i: number) => {
      const it = chart.scene.items[i] as TextItem | undefined;
      return it?.kind === 'text' ? `"${it.content.slice(0, 30)}"` : '?';
    };
    const shown = pairs.slice(0, 3).map((p) => `${text(p.a)} and ${text(p.b)}`);
    return [
      {
        message: `${pairs.length} pair${pairs.length > 1 ? 's' : ''} of labels overlap: ${shown.join('; ')}${pairs.length > 3 ? '; …' : ''}. Move, rotate, thin out or shorten them.`,
        elements: elementsOf(chart, pairs.flatMap((p) => [p.a, p.b])),
        measures: { pairs: pairs.length, maxDepthPx: r4(Math.max(...pairs.map((p) => p.depthPx))) },
      },
    ];
  },
};
