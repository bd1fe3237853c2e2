/**
 * ink.low-data-share: the data get less than a given share of the ink the
 * figure prints (the data-ink ratio, measured geometrically: see
 * measure/ink.ts). A note: some good figures are mostly labels.
 */
import type { Rule } from '../rule.js';
import { r4 } from '../rule.js';

const pct = (v: number) => `${Math.round(v * 100)}%`;

export const lowDataShare: Rule = {
  id: 'ink.low-data-share',
  family: 'ink',
  severity: 'note',
  rationale: 'When most of the ink goes to grids, frames, backgrounds and labels, the data are a minor part of the picture.',
  source: 'Tufte 1983, The Visual Display of Quantitative Information, p. 93 (data-ink ratio = data-ink / total ink); the 0.3 threshold is common practice, not Tufte’s',
  thresholds: {
    /** Least share of all ink that the data marks should print. */
    minDataShare: 0.3,
  },
  check({ measures, thresholds }) {
    const s = measures.ink.shares;
    if (measures.ink.totals.total <= 0 || s.data >= thresholds.minDataShare) return [];
    const parts = [
      ['guides', s.guides],
      ['labels', s.labels],
      ['decoration', s.decoration],
    ] as const;
    const top = [...parts].sort((a, b) => b[1] - a[1])[0]!;
    return [
      {
        message: `Data marks print ${pct(s.data)} of the ink (data-ink ratio ${r4(s.data)}); ${top[0]} take ${pct(top[1])}.`,
        elements: [],
        measures: { dataShare: r4(s.data), guides: r4(s.guides), labels: r4(s.labels), decoration: r4(s.decoration) },
      },
    ];
  },
};
