/** Shared reading of palette pairs for the colour-distance rules. */
import type { PairConfusion } from '../../color/pairwise-confusion.js';
import type { CvdType } from '../../color/types.js';
import type { PaletteEntry, PaletteMeasure } from '../../measure/palette.js';

export interface NamedPair {
  a: PaletteEntry;
  b: PaletteEntry;
  pair: PairConfusion;
  /** The threshold that applies to this pair (the stricter of the two marks' classes). */
  threshold: number;
  /** Simulated vision with the smallest ΔE00, and that ΔE00. */
  vision: CvdType;
  simulated: number;
}

/** Every pair with its size-dependent threshold: `small` for lines and points, `large` for filled marks. */
export function namedPairs(palette: PaletteMeasure, large: number, small: number): NamedPair[] {
  return palette.pairs.map((p) => {
    const a = palette.entries[p.i]!;
    const b = palette.entries[p.j]!;
    const threshold = a.markClass === 'small' || b.markClass === 'small' ? small : large;
    let vision: CvdType = 'protan';
    if (p.deutan < p[vision]) vision = 'deutan';
    if (p.tritan < p[vision]) vision = 'tritan';
    return { a, b, pair: p, threshold, vision, simulated: p[vision] };
  });
}

export function label(e: PaletteEntry): string {
  return e.name ? `"${e.name}" (${e.hex})` : e.hex;
}
