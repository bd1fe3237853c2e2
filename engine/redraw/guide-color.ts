/**
 * Colours for guides that should recede: a neutral grey a small, fixed step
 * of CIELAB lightness away from the background (darker on light backgrounds,
 * lighter on dark ones), and the ink strength measure used to decide whether a
 * guide is already that quiet.
 */
import { converter } from 'culori';
import { formatHex } from '../color/format-hex.js';
import { toLab65 } from '../color/to-lab65.js';
import type { Rgba } from '../color/types.js';
import { inkStrength } from '../measure/ink.js';

const toRgb = converter('rgb');

/**
 * L* step between a receding guide and its background. 10 on white gives
 * #e2e2e2, close to the light greys plotting libraries use for quiet grids
 * (plumbline's choice, no published source).
 */
export const GUIDE_LIGHTNESS_STEP = 10;

/** A neutral grey GUIDE_LIGHTNESS_STEP of L* away from `background`. */
export function recedingGrey(background: Rgba): Rgba {
  const L = toLab65(background).l;
  const target = L >= 50 ? L - GUIDE_LIGHTNESS_STEP : L + GUIDE_LIGHTNESS_STEP * 1.4;
  const rgb = toRgb({ mode: 'lab65', l: Math.max(0, Math.min(100, target)), a: 0, b: 0 });
  const cl = (v: number | undefined): number => Math.min(1, Math.max(0, v ?? 0));
  return { r: cl(rgb.r), g: cl(rgb.g), b: cl(rgb.b), alpha: 1 };
}

export function recedingGreyHex(background: Rgba): string {
  return formatHex(recedingGrey(background));
}

/** How strongly paint of colour `c` at `opacity` shows over `background` (0..1). */
export function shownStrength(c: Rgba | null, opacity: number, background: Rgba): number {
  if (!c) return opacity;
  return inkStrength(c, background) * opacity;
}
