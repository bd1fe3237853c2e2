/**
 * truth.truncated-baseline: bars (or filled areas) that grow from a baseline
 * other than zero, so their lengths are not proportional to their values.
 * Measured by Tufte's lie factor between the shortest and the tallest bar.
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt, times } from '../format-number.js';

export const truncatedBaseline: Rule = {
  id: 'truth.truncated-baseline',
  family: 'truth',
  severity: 'error',
  rationale:
    'A bar or filled area is read by its length from the baseline; when the baseline is not zero, lengths stop being proportional to values and differences look larger (or smaller) than they are.',
  source:
    'Tufte, The Visual Display of Quantitative Information (1983; 2nd ed. 2001), p. 57: lie factor = size of effect shown / size of effect in data, with values outside 0.95–1.05 a substantial distortion',
  thresholds: {
    /** Lie factors inside [lieFactorLow, lieFactorHigh] pass. */
    lieFactorLow: 0.95,
    lieFactorHigh: 1.05,
    /** The baseline must be at least this far (CSS px) from where 0 is drawn to count as moved. */
    minOffsetPx: 1,
  },
  check({ chart, measures, thresholds }) {
    const m = measures.baseline;
    if (!m) return [];
    if (m.offsetPx < thresholds.minOffsetPx) return [];
    const lf = m.lieFactor;
    if (Number.isNaN(lf)) return [];
    if (lf >= thresholds.lieFactorLow && lf <= thresholds.lieFactorHigh) return [];
    const start = m.marks === 'bar' ? 'Bars start' : 'The area is filled';
    const where = m.scale === 'log' ? `${start} from ${fmt(m.value)} on a log scale, where 0 cannot be drawn` : `${start} ${m.marks === 'bar' ? 'at' : 'from'} ${fmt(m.value)}, not 0`;
    const big = m.marks === 'bar' ? 'the tallest bar' : 'the highest point';
    const small = m.marks === 'bar' ? 'the shortest' : 'the lowest';
    const message =
      `${where}: ${big} looks ${times(m.shownRatio)} ${small}; the data say ${times(m.dataRatio)} (lie factor ${fmt(lf)}). ` +
      (m.scale === 'log'
        ? 'Lengths on a log scale do not show ratios of values; use points or a line instead of bars.'
        : 'Extend the value axis to 0 by hand (redrawing cannot do it without moving every bar), or show the values as points or a line, which need no zero baseline.');
    return [
      {
        message,
        elements: elementsOf(chart, [...m.shortest.items, ...m.tallest.items]),
        measures: {
          baselineValue: r4(m.value),
          baselinePosition: r4(m.position),
          zeroPosition: m.zeroPosition === null ? null : r4(m.zeroPosition),
          offsetPx: Number.isFinite(m.offsetPx) ? r4(m.offsetPx) : null,
          scale: m.scale,
          shortestValue: r4(m.shortest.value),
          shortestLength: r4(m.shortest.length),
          tallestValue: r4(m.tallest.value),
          tallestLength: r4(m.tallest.length),
          shownRatio: r4(m.shownRatio),
          dataRatio: r4(m.dataRatio),
          lieFactor: Number.isFinite(lf) ? r4(lf) : null,
          bars: m.count,
        },
      },
    ];
  },
};
