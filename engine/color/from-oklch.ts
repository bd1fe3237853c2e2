import { converter } from 'culori';
import type { Oklch, Rgba } from './types.js';

const rgb = converter('rgb');

/** Channel slack allowed for float round-off when deciding gamut membership. */
const GAMUT_EPS = 1e-7;

/**
 * OKLCh → sRGB. Returns null when the colour lies outside the sRGB gamut
 * (any channel outside 0..1 beyond round-off); in-gamut results are clamped
 * to 0..1 to remove the round-off.
 */
export function fromOklch(c: Oklch, alpha = 1): Rgba | null {
  if (![c.l, c.c, c.h, alpha].every(Number.isFinite)) {
    throw new TypeError('fromOklch: l, c, h and alpha must be finite numbers');
  }
  const x = rgb({ mode: 'oklch', l: c.l, c: c.c, h: c.h });
  const chans = [x.r, x.g, x.b];
  if (chans.some((v) => v < -GAMUT_EPS || v > 1 + GAMUT_EPS)) return null;
  const cl = (v: number) => Math.min(1, Math.max(0, v));
  return { r: cl(x.r), g: cl(x.g), b: cl(x.b), alpha };
}
