import { converter } from 'culori';
import { assertRgba, type Oklch, type Rgba } from './types.js';

const oklch = converter('oklch');

/** sRGB → OKLCh via culori. Greys get hue 0. Alpha is ignored. */
export function toOklch(c: Rgba): Oklch {
  assertRgba(c);
  const x = oklch({ mode: 'rgb', r: c.r, g: c.g, b: c.b });
  const h = x.h === undefined || Number.isNaN(x.h) ? 0 : x.h;
  return { space: 'oklch', l: x.l, c: x.c, h };
}
