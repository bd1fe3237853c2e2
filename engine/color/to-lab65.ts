import { converter } from 'culori';
import { assertRgba, type Lab, type Rgba } from './types.js';

const lab65 = converter('lab65');

/**
 * sRGB → CIELAB with the D65 white (no chromatic adaptation), using culori's
 * `lab65` mode (CSS Color 4 matrices and white point). Alpha is ignored:
 * composite translucent colours over their backdrop first.
 */
export function toLab65(c: Rgba): Lab {
  assertRgba(c);
  const x = rgbToLab65Unchecked(c);
  return { space: 'lab65', l: x.l, a: x.a, b: x.b };
}

/**
 * Same conversion without argument checks, for inner loops. The result also
 * carries culori's `mode: 'lab65'` tag so it can go to culori without copying.
 */
export function rgbToLab65Unchecked(c: Rgba): Lab & { mode: 'lab65' } {
  const x = lab65({ mode: 'rgb', r: c.r, g: c.g, b: c.b }) as { mode: 'lab65'; l: number; a: number; b: number };
  return Object.assign(x, { space: 'lab65' as const });
}
