/**
 * Colour helpers shared by the ink rules: CIELAB distance (CIE 1976 ΔE*ab,
 * D65) and the just-noticeable difference used as "visibly different".
 */
import { formatHex } from '../../color/format-hex.js';
import { toLab65 } from '../../color/to-lab65.js';
import type { Rgba } from '../../color/types.js';

/** A just-noticeable difference in CIE 1976 ΔE*ab (colour-science JND_CIE1976). */
// source: ../shared/reference/REFERENCES.md §5, "CIE76 JND ≈ 2.3 ΔE*ab" (colour-science constant JND_CIE1976 = 2.3)
export const JND_DELTA_E_AB = 2.3;

/** Euclidean distance of two opaque colours in CIELAB (D65). */
export function deltaEab(a: Rgba, b: Rgba): number {
  const p = toLab65({ ...a, alpha: 1 });
  const q = toLab65({ ...b, alpha: 1 });
  return Math.hypot(p.l - q.l, p.a - q.a, p.b - q.b);
}

export function hex(c: Rgba): string {
  return formatHex({ ...c, alpha: 1 });
}
