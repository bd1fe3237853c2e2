import { differenceCiede2000 } from 'culori';
import { assertRgba, type Lab, type Rgba } from './types.js';
import { rgbToLab65Unchecked } from './to-lab65.js';

const ciede2000 = differenceCiede2000(1, 1, 1);

function isLab(x: unknown): x is Lab {
  return typeof x === 'object' && x !== null && (x as { space?: unknown }).space === 'lab65';
}

function asLab(x: Rgba | Lab, what: string): Lab {
  if (isLab(x)) {
    if (![x.l, x.a, x.b].every(Number.isFinite)) {
      throw new TypeError(`${what}: Lab components must be finite numbers`);
    }
    return x;
  }
  if (typeof x === 'object' && x !== null && 'space' in x) {
    throw new TypeError(`${what}: expected sRGB or CIELAB D65 ('lab65'), got space "${String((x as { space: unknown }).space)}"`);
  }
  assertRgba(x, what);
  return rgbToLab65Unchecked(x);
}

/**
 * CIEDE2000 colour difference ΔE00 (CIE 142-2001; Sharma, Wu & Dalal 2005)
 * with parametric factors kL = kC = kH = 1.
 *
 * White point: sRGB inputs are converted to CIELAB with the **D65** white
 * (CSS Color 4 D65, no chromatic adaptation; culori `lab65`). Lab inputs must
 * already be D65 CIELAB (`space: 'lab65'`). Libraries that compute ΔE00 from
 * D50 CIELAB (the CSS `lab()` space) give different values for the same
 * sRGB pair, by several units for saturated colours. Alpha is ignored.
 *
 * The arithmetic is culori's `differenceCiede2000`.
 */
export function deltaE00(a: Rgba | Lab, b: Rgba | Lab): number {
  return deltaE00Lab(asLab(a, 'deltaE00 first colour'), asLab(b, 'deltaE00 second colour'));
}

/** ΔE00 between two D65 Lab values without argument checks, for inner loops. */
export function deltaE00Lab(a: Lab, b: Lab): number {
  return ciede2000(asCulori(a), asCulori(b));
}

type CuloriLab65 = { mode: 'lab65'; l: number; a: number; b: number };

/** Lab values made by rgbToLab65Unchecked already carry culori's mode tag; others are copied. */
function asCulori(x: Lab): CuloriLab65 {
  const tagged = x as Lab & { mode?: unknown };
  return tagged.mode === 'lab65' ? (tagged as Lab & CuloriLab65) : { mode: 'lab65', l: x.l, a: x.a, b: x.b };
}
