/**
 * ink.redundant-ticks: tick marks drawn where gridlines already mark the
 * same values. A tick is a short line across an axis; it repeats a gridline
 * when a gridline of the same direction runs at the same position (within a
 * stroke width or one CSS px) — one of the two is enough.
 */
import { r4, elementsOf, type Rule } from '../rule.js';
import { axisSegments, crossingGridSegments } from './edge-lines.js';

export const redundantTicks: Rule = {
  id: 'ink.redundant-ticks',
  family: 'ink',
  severity: 'note',
  rationale: 'Ticks at the positions of gridlines say the same thing twice; the gridlines already carry the values to the labels.',
  source: 'Tufte 1983, The Visual Display of Quantitative Information, ch. 4 ("erase redundant data-ink") — common practice for non-data ink',
  thresholds: {
    /** Least number of ticks that repeat gridlines for a finding (common practice, no source). */
    minTicks: 2,
    /** Largest distance between tick and gridline, CSS px (besides half the wider stroke). */
    tolerancePx: 1,
  },
  fix: 'Remove the tick marks at gridline positions (or the gridlines, keeping the ticks).',
  check({ chart, thresholds }) {
    const grid = crossingGridSegments(chart);
    if (grid.length === 0) return [];
    const px = chart.scene.pxPerUnit > 0 ? chart.scene.pxPerUnit : 1;
    const redundant: number[] = [];
    let ticks = 0;
    chart.roles.forEach((r, i) => {
      if (r.sub !== 'guide/tick') return;
      const segs = axisSegments(chart, i, Infinity);
      if (segs.length === 0) return;
      ticks++;
      // A tick for the y axis is horizontal; it repeats a horizontal gridline at the same y.
      const dup = segs.every((t) =>
        grid.some((g) => g.orientation === t.orientation && Math.abs(g.at - t.at) <= thresholds.tolerancePx / px + Math.max(g.width, t.width) / 2),
      );
      if (dup) redundant.push(i);
    });
    if (redundant.length < thresholds.minTicks) return [];
    return [
      {
        message: `${redundant.length} of ${ticks} tick marks sit where gridlines already mark the same values.`,
        elements: elementsOf(chart, redundant),
        measures: { redundantTicks: redundant.length, ticks, share: r4(redundant.length / ticks) },
      },
    ];
  },
};
