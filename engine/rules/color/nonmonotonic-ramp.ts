/**
 * color.nonmonotonic-ramp: a colour ramp that encodes a quantity but whose
 * lightness goes up and down (rainbow and jet-like ramps), so equal steps in
 * value do not look like equal steps, false boundaries appear where the
 * lightness turns, and the order is lost in greyscale and to many CVD viewers.
 * Diverging ramps (two monotonic arms meeting at a light, near-neutral middle)
 * pass.
 */
import { elementsOf, r4, type Rule } from '../rule.js';
import { fmt, percent } from '../format-number.js';
import { formatHex } from '../../color/format-hex.js';
import { describe } from '../../measure/color-ramp.js';

export const nonmonotonicRamp: Rule = {
  id: 'color.nonmonotonic-ramp',
  family: 'color',
  severity: 'warning',
  rationale:
    'Readers order colours by lightness; a ramp whose lightness rises and falls makes equal value steps look unequal, draws false boundaries and loses its order in greyscale.',
  source:
    'Borland & Taylor, Rainbow Color Map (Still) Considered Harmful, IEEE CG&A 27(2) (2007) — from memory; lightness tolerance from Stone, Szafir & Setlur (CIC 2014), ND(50%) of L* ≈ 5 for large marks',
  thresholds: {
    /** L* reversals up to this size are not seen as a step back. */
    lightnessTolerance: 5,
  },
  fix: 'rebuild the ramp in a perceptual space: same end colours, lightness changing evenly from one end to the other (or from a light middle to both ends for a diverging ramp)',
  check({ chart, measures, thresholds }) {
    if (!measures.ramp) return [];
    // Judged again with the configured tolerance.
    const m = measures.ramp;
    const ramp = describe(m.source, m.items, m.colors, thresholds.lightnessTolerance);
    if (ramp.shape !== 'irregular') return [];
    const L = ramp.lightness;
    const where = ramp.reversalAt === null ? '' : ` around ${percent(ramp.reversalAt, 2)} of the way along`;
    const from = ramp.source === 'colorbar' ? 'The colour bar' : 'The colour key';
    return [
      {
        message:
          `${from}'s lightness is not monotonic: L* runs ${fmt(L[0]!, 2)} → ${fmt(Math.max(...L), 2)} (max) / ${fmt(Math.min(...L), 2)} (min) → ${fmt(L[L.length - 1]!, 2)}, ` +
          `stepping back by up to ${fmt(ramp.largestReversal, 2)}${where}. Equal value steps will not look equal, and the order is lost in greyscale.`,
        elements: elementsOf(chart, ramp.items),
        measures: {
          source: ramp.source,
          shape: ramp.shape,
          largestReversal: r4(ramp.largestReversal),
          reversalAt: ramp.reversalAt === null ? null : r4(ramp.reversalAt),
          lightness: sample(L, 11).map((v) => r4(v)),
          colors: sample(ramp.colors, 11).map((c) => formatHex(c)),
        },
      },
    ];
  },
};

function sample<T>(xs: T[], n: number): T[] {
  if (xs.length <= n) return xs;
  return Array.from({ length: n }, (_, k) => xs[Math.round((k * (xs.length - 1)) / (n - 1))]!);
}
