/**
 * color.cvd-confusable: two category colours that are clearly different in
 * normal vision but nearly the same under simulated protan, deutan or tritan
 * vision (Machado, Oliveira & Fernandes 2009, full severity).
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt } from '../format-number.js';
import { label, namedPairs } from './palette-pairs.js';

const VISION_WORD = { protan: 'protan (red-weak)', deutan: 'deutan (green-weak)', tritan: 'tritan (blue-weak)' } as const;

export const cvdConfusable: Rule = {
  id: 'color.cvd-confusable',
  family: 'color',
  severity: 'error',
  rationale:
    'About 8% of men and 0.4% of women of European descent have a red-green colour-vision deficiency; categories told apart only by a colour difference they cannot see are lost to them.',
  source:
    'Machado, Oliveira & Fernandes, IEEE TVCG 15(6) (2009) for the simulation; CIEDE2000 (Sharma, Wu & Dalal 2005) for the distances; Szafir, IEEE TVCG 24(1) (2018) for larger differences needed by small marks; prevalence: Birch, JOSA A 29(3) (2012)',
  thresholds: {
    /**
     * Least ΔE00 for bars, areas, wedges and cells (marks of about 1° and more):
     * near the 50% noticeable difference of Stone, Szafir & Setlur (2014) on b* at 1° (8.2).
     */
    minDeltaELarge: 8,
    /**
     * Least ΔE00 for lines and points: thinner marks need more (Szafir 2018); the
     * same model gives 11–14 on b* at 0.5°–0.33°.
     */
    minDeltaESmall: 12,
  },
  fix: 'repair the palette: recolour the categories so every pair stays apart under protan, deutan and tritan simulation, keeping hues close to the originals',
  check({ chart, measures, thresholds }) {
    const pal = measures.palette;
    if (pal.continuous) return [];
    const hits = namedPairs(pal, thresholds.minDeltaELarge, thresholds.minDeltaESmall)
      .filter((p) => p.pair.normal >= p.threshold && p.simulated < p.threshold)
      .sort((x, y) => x.simulated - y.simulated);
    if (hits.length === 0) return [];
    const w = hits[0]!;
    const more = hits.length > 1 ? ` ${hits.length - 1} more pair${hits.length > 2 ? 's' : ''} too.` : '';
    return [
      {
        message:
          `${label(w.a)} and ${label(w.b)} differ clearly in normal vision (ΔE00 ${fmt(w.pair.normal)}) but look nearly the same to ${VISION_WORD[w.vision]} viewers ` +
          `(ΔE00 ${fmt(w.simulated)}, below ${fmt(w.threshold)} for ${w.threshold === thresholds.minDeltaESmall ? 'lines and points' : 'filled marks'}).${more} ` +
          'Automated checks do not replace review by people with colour-vision deficiencies.',
        elements: elementsOf(chart, [...w.a.items.slice(0, 5), ...w.b.items.slice(0, 5)]),
        measures: {
          pairs: hits.map((p) => ({
            a: p.a.hex,
            b: p.b.hex,
            aName: p.a.name,
            bName: p.b.name,
            vision: p.vision,
            normal: r4(p.pair.normal),
            simulated: r4(p.simulated),
            threshold: p.threshold,
          })),
          colors: pal.entries.length,
        },
      },
    ];
  },
};
