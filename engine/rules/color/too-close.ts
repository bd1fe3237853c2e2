/**
 * color.too-close: two category colours too close to tell apart even in
 * normal colour vision, for the size of mark they paint.
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt } from '../format-number.js';
import { label, namedPairs } from './palette-pairs.js';

export const tooClose: Rule = {
  id: 'color.too-close',
  family: 'color',
  severity: 'warning',
  rationale: 'Categories whose colours differ by less than a reliably visible step are read as one, and small marks need larger steps than large ones.',
  source:
    'CIEDE2000 (Sharma, Wu & Dalal 2005); Szafir, Modeling Color Difference for Visualization Design, IEEE TVCG 24(1) (2018): discriminability falls with mark size and differs by mark type; magnitudes after Stone, Szafir & Setlur (CIC 2014)',
  thresholds: {
    /** Least ΔE00 between colours of bars, areas, wedges and cells. */
    minDeltaELarge: 8,
    /** Least ΔE00 between colours of lines and points. */
    minDeltaESmall: 12,
  },
  fix: 'repair the palette: move the close colours apart (in lightness first), keeping hues close to the originals',
  check({ chart, measures, thresholds }) {
    const pal = measures.palette;
    if (pal.continuous) return [];
    const hits = namedPairs(pal, thresholds.minDeltaELarge, thresholds.minDeltaESmall)
      .filter((p) => p.pair.normal < p.threshold)
      .sort((x, y) => x.pair.normal - y.pair.normal);
    if (hits.length === 0) return [];
    const w = hits[0]!;
    const more = hits.length > 1 ? ` ${hits.length - 1} more pair${hits.length > 2 ? 's' : ''} too.` : '';
    return [
      {
        message:
          `${label(w.a)} and ${label(w.b)} differ by only ΔE00 ${fmt(w.pair.normal)} in normal vision; ` +
          `${w.threshold === thresholds.minDeltaESmall ? 'lines and points' : 'filled marks'} need about ${fmt(w.threshold)} to be told apart reliably.${more}`,
        elements: elementsOf(chart, [...w.a.items.slice(0, 5), ...w.b.items.slice(0, 5)]),
        measures: {
          pairs: hits.map((p) => ({ a: p.a.hex, b: p.b.hex, aName: p.a.name, bName: p.b.name, normal: r4(p.pair.normal), threshold: p.threshold })),
          colors: pal.entries.length,
        },
      },
    ];
  },
};
