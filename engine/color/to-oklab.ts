import { converter } from 'culori';
import { assertRgba, type Oklab, type Rgba } from './types.js';

const oklab = converter('oklab');

/** sRGB → OKLab via culori. Alpha is ignored. */
export function toOklab(c: Rgba): Oklab {
  assertRgba(c);
  const x = oklab({ mode: 'rgb', r: c.r, g: c.g, b: c.b });
  return { space: 'oklab', l: x.l, a: x.a, b: x.b };
}
