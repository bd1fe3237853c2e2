/**
 * form.overplotting: so many point marks lie on top of each other that the
 * density of the data is hidden. Counted are points hidden by the points
 * drawn over them (less than a tenth of the centre shows through); points
 * that merely touch or overlap at their rims do not hide anything.
 */
import { r4, elementsOf, type Rule } from '../rule.js';

const pct = (v: number) => `${Math.round(v * 100)}%`;

export const overplotting: Rule = {
  id: 'form.overplotting',
  family: 'form',
  severity: 'warning',
  rationale: 'Where points pile up, one visible dot may stand for one observation or for hundreds; the picture hides where the data are dense.',
  source: 'Cleveland 1985, The Elements of Graphing Data (overlap and jittering) — from memory; common practice (transparency, binning, jitter)',
  thresholds: {
    /** Share of points hidden under other points from which the chart is overplotted (common practice, no source: a quarter of the data unseen). */
    maxHiddenShare: 0.25,
    /** Fewest point marks for the check. */
    minPoints: 20,
  },
  check({ chart, measures, thresholds }) {
    const o = measures.overplot;
    if (o.points < thresholds.minPoints || o.hiddenShare < thresholds.maxHiddenShare) return [];
    return [
      {
        message:
          `${pct(o.hiddenShare)} of ${o.points} points are hidden under other points (${pct(o.overlapShare)} overlap another point); ` +
          'the density of the data cannot be seen. Translucent or smaller points, jitter, or binning (2-D histogram, hexbin) would show it.',
        elements: elementsOf(chart, o.items),
        measures: {
          points: o.points,
          hiddenShare: r4(o.hiddenShare),
          overlapShare: r4(o.overlapShare),
          meanOpacity: r4(o.meanOpacity),
        },
      },
    ];
  },
};
