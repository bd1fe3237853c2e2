/**
 * form.angle-judgment: pie wedges so close in size that a reader comparing
 * their angles cannot tell which is larger. Pairs whose values are printed
 * on the chart (numeric wedge labels) are left out: the reader can read them.
 */
import type { Wedge } from '../../classify/chart.js';
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt, percent } from '../format-number.js';
import { wedgeName } from '../wedge-name.js';

const DIGIT = /\d/;

export const angleJudgment: Rule = {
  id: 'form.angle-judgment',
  family: 'form',
  severity: 'note',
  rationale:
    'Angles and arcs are judged less accurately than positions and lengths, so wedges a few percent apart cannot be ranked by eye; a bar chart on a common scale shows the difference.',
  source:
    'Cleveland & McGill, Graphical Perception, JASA 79(387) (1984): position along a common scale ranks above length, and length above angle and area; Skau & Kosara, Computer Graphics Forum 35(3) (2016)',
  thresholds: {
    /** Wedges whose shares differ by less than this fraction of the whole are reported. */
    maxShareGap: 0.02,
  },
  check({ chart, thresholds }) {
    const pie = chart.pie;
    if (!pie || pie.shareBasis !== 'angle' || pie.wedges.length < 2) return [];
    const printed = (w: Wedge): boolean => {
      if (w.labelItem === null) return false;
      const it = chart.scene.items[w.labelItem];
      return it !== undefined && it.kind === 'text' && DIGIT.test(it.content);
    };
    const close: { a: Wedge; b: Wedge; gap: number }[] = [];
    const ws = pie.wedges.filter((w) => w.share > 0);
    for (let i = 0; i < ws.length; i++) {
      for (let j = i + 1; j < ws.length; j++) {
        const a = ws[i]!;
        const b = ws[j]!;
        const gap = Math.abs(a.share - b.share);
        if (gap < thresholds.maxShareGap && !(printed(a) && printed(b))) close.push({ a, b, gap });
      }
    }
    if (close.length === 0) return [];
    close.sort((x, y) => x.gap - y.gap);
    const w = close[0]!;
    const name = (x: Wedge) => {
      const n = wedgeName(chart, x);
      return n ? `"${n}"` : 'a wedge';
    };
    const more = close.length > 1 ? ` ${close.length - 1} more pair${close.length > 2 ? 's are' : ' is'} as close.` : '';
    return [
      {
        message:
          `${name(w.a)} (${percent(w.a.share)}) and ${name(w.b)} (${percent(w.b.share)}) differ by ${fmt(w.gap * 100, 2)} percentage point${fmt(w.gap * 100, 2) === '1' ? '' : 's'}, ` +
          `too little to rank by angle.${more} Print the values, or use a bar chart where the difference shows as length.`,
        elements: elementsOf(chart, close.flatMap((c) => [c.a.item, c.b.item])),
        measures: {
          pairs: close.map((c) => ({ a: wedgeName(chart, c.a), b: wedgeName(chart, c.b), aShare: r4(c.a.share), bShare: r4(c.b.share), gap: r4(c.gap) })),
        },
      },
    ];
  },
};
