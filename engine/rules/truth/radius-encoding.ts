/**
 * truth.radius-encoding: values drawn as the radius of a shape that is read
 * by its area — rose (polar-area) charts whose wedges share one angle and
 * differ in radius. Area grows with the square of the radius, so the largest
 * wedge looks far larger than the data say.
 *
 * Bubbles whose radius grows with a value are the same fault, but the chart
 * model carries no size values for points yet, so they are not checked.
 */
import { lieFactor } from '../../measure/lie-factor.js';
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt, times } from '../format-number.js';
import { wedgeName } from '../wedge-name.js';

export const radiusEncoding: Rule = {
  id: 'truth.radius-encoding',
  family: 'truth',
  severity: 'warning',
  rationale:
    'A one-dimensional value drawn as the radius of a wedge or circle is seen as its area, which grows with the square of the radius, so large values are exaggerated.',
  source:
    'Tufte, The Visual Display of Quantitative Information (1983), p. 69: area used for one-dimensional data (lie factor 2.8 in the example shown); Cleveland & McGill, JASA 79(387) (1984): area is judged less accurately than length',
  thresholds: {
    /** Lie factors (area shown against radial extent) inside [lieFactorLow, lieFactorHigh] pass. */
    lieFactorLow: 0.95,
    lieFactorHigh: 1.05,
  },
  check({ chart, thresholds }) {
    const pie = chart.pie;
    if (!pie || !pie.radiusVaries || pie.shareBasis !== 'radius' || pie.wedges.length < 2) return [];
    const ws = pie.wedges.filter((w) => w.share > 0 && w.areaShare > 0);
    if (ws.length < 2) return [];
    let small = ws[0]!;
    let large = ws[0]!;
    for (const w of ws) {
      if (w.share < small.share) small = w;
      if (w.share > large.share) large = w;
    }
    if (large.share === small.share) return [];
    const lf = lieFactor({ shown: [small.areaShare, large.areaShare], data: [small.share, large.share] });
    if (lf >= thresholds.lieFactorLow && lf <= thresholds.lieFactorHigh) return [];
    const name = (w: typeof small) => {
      const n = wedgeName(chart, w);
      return n ? `"${n}"` : null;
    };
    const pair = name(large) && name(small) ? ` (${name(large)} against ${name(small)})` : '';
    return [
      {
        message:
          `Values are drawn as wedge radii, but wedges are seen by their area: the largest wedge looks ${times(large.areaShare / small.areaShare)} the smallest by area; ` +
          `the radii say ${times(large.share / small.share)}${pair} (lie factor ${fmt(lf)}). A bar chart shows the same values by length; in a polar chart, make the area, not the radius, proportional to the value.`,
        elements: elementsOf(chart, pie.wedges.map((w) => w.item)),
        measures: {
          wedges: pie.wedges.length,
          lieFactor: r4(lf),
          smallestShare: r4(small.share),
          largestShare: r4(large.share),
          smallestAreaShare: r4(small.areaShare),
          largestAreaShare: r4(large.areaShare),
          innerRadius: r4(pie.innerRadius),
        },
      },
    ];
  },
};
