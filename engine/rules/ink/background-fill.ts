/**
 * ink.background-fill: a filled background behind the data that carries no
 * data — a plot area painted unlike the page, or a page that is not white.
 * A white page is paper, not ink, and is no finding.
 */
import type { Rgba } from '../../color/types.js';
import { r4, elementsOf, type Rule, type RuleFinding } from '../rule.js';
import { deltaEab, hex, JND_DELTA_E_AB } from './color-distance.js';

const WHITE: Rgba = { r: 1, g: 1, b: 1, alpha: 1 };

export const backgroundFill: Rule = {
  id: 'ink.background-fill',
  family: 'ink',
  severity: 'warning',
  rationale: 'A tinted plot or page background is ink that shows no data; it lowers the contrast of everything drawn on it.',
  source: 'Tufte 1983, The Visual Display of Quantitative Information, ch. 4–5 (data-ink ratio; erase non-data-ink)',
  thresholds: {
    /** Least CIELAB distance (ΔE*ab) from the colour behind for a fill to count as visible; 2.3 is one just-noticeable difference. */
    minDeltaE: JND_DELTA_E_AB,
    /** Least share of the background's area that must be left visible by what is drawn on it (common practice, no source). */
    minShown: 0.05,
  },
  fix: 'Remove the background fill so the page shows through (and leave the page white).',
  check({ chart, measures, thresholds }) {
    const out: RuleFinding[] = [];
    const items = chart.scene.items;
    for (let i = 0; i < items.length; i++) {
      const sub = chart.roles[i]?.sub;
      if (sub !== 'guide/background' && sub !== 'decoration/page') continue;
      const it = items[i]!;
      if (it.kind !== 'shape' || it.fill.kind === 'none' || !it.fill.color || it.fill.opacity <= 0) continue;
      if (measures.ink.fillShown[i]! < thresholds.minShown) continue;
      // What the fill is seen against: the page for a plot background, paper for the page.
      const against = sub === 'decoration/page' ? WHITE : chart.page;
      const c = it.fill.color;
      const shown: Rgba = {
        r: c.r * it.fill.opacity + against.r * (1 - it.fill.opacity),
        g: c.g * it.fill.opacity + against.g * (1 - it.fill.opacity),
        b: c.b * it.fill.opacity + against.b * (1 - it.fill.opacity),
        alpha: 1,
      };
      const d = deltaEab(shown, against);
      if (d < thresholds.minDeltaE) continue;
      const what = sub === 'decoration/page' ? `The whole figure sits on a ${hex(shown)} page` : `The plot area is filled with ${hex(shown)}, unlike the page (${hex(against)})`;
      out.push({
        message: `${what}: a background that carries no data (ΔE*ab ${r4(d)} from ${sub === 'decoration/page' ? 'white paper' : 'the page'}).`,
        elements: elementsOf(chart, [i]),
        measures: { fill: hex(shown), against: hex(against), deltaE: r4(d), shown: r4(measures.ink.fillShown[i]!), part: sub === 'decoration/page' ? 'page' : 'plot' },
      });
    }
    return out;
  },
};
