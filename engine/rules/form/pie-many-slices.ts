/**
 * form.pie-many-slices: a pie (or donut, or rose) cut into more slices than
 * readers can compare and match to their labels.
 */
import { elementsOf, type Rule } from '../rule.js';

export const pieManySlices: Rule = {
  id: 'form.pie-many-slices',
  family: 'form',
  severity: 'warning',
  rationale:
    'Each extra slice is a thinner angle to judge against its neighbours and one more colour to match against a legend; past a handful of slices a sorted bar chart shows the same shares by length on a common scale.',
  source:
    'common practice (style guides commonly cap pies at five to seven slices); Cleveland & McGill, JASA 79(387) (1984): angle is judged less accurately than position and length',
  thresholds: {
    /** Most slices before the pie is reported. */
    maxSlices: 6,
  },
  check({ chart, thresholds }) {
    const pie = chart.pie;
    if (!pie) return [];
    const n = pie.wedges.length;
    if (n <= thresholds.maxSlices) return [];
    const shares = pie.wedges.map((w) => w.share).sort((a, b) => a - b);
    const small = shares.filter((s) => s < 0.05).length;
    const what = pie.radiusVaries ? 'This rose chart has' : pie.innerRadius > 0 ? 'This donut has' : 'This pie has';
    return [
      {
        message:
          `${what} ${n} slices (more than ${thresholds.maxSlices})${small > 0 ? `, ${small} of them under 5% of the whole` : ''}. ` +
          'Use a bar chart sorted by value, or group the smallest slices into one.',
        elements: elementsOf(chart, pie.wedges.map((w) => w.item)),
        measures: { slices: n, under5Percent: small, smallestShare: Number(shares[0]!.toPrecision(4)) },
      },
    ];
  },
};
