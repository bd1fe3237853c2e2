/**
 * Lightness and hue of a fill, for telling shadows (darker copies) and side
 * walls (darker shades of a wedge's colour) from wedges. CIELAB (D65) from
 * gamma-encoded sRGB, computed here to keep this module self-contained.
 */
import type { Rgba } from '../../color/types.js';
import type { Paint } from '../../read/scene.js';

function linear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
}

function f(t: number): number {
  return t > 216 / 24389 ? Math.cbrt(t) : (24389 / 27 * t + 16) / 116;
}

/** CIELAB L*, a*, b* (D65 white) of an sRGB colour. */
export function labOf(c: Rgba): [number, number, number] {
  const r = linear(c.r);
  const g = linear(c.g);
  const b = linear(c.b);
  // sRGB → XYZ (D65), IEC 61966-2-1 matrix.
  const X = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
  const Y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
  const Z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
  const fx = f(X);
  const fy = f(Y);
  const fz = f(Z);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** L* of a paint's colour, or null when it has none. */
export function paintLightness(p: Paint): number | null {
  if (p.kind === 'none' || !p.color) return null;
  return labOf(p.color)[0];
}

/**
 * Whether `shade` could be `base` in shadow: not lighter (beyond a small
 * tolerance) and of a similar hue, or both nearly grey.
 */
export function isShadeOf(shade: Rgba, base: Rgba): boolean {
  const [l1, a1, b1] = labOf(shade);
  const [l0, a0, b0] = labOf(base);
  if (l1 > l0 + 3) return false;
  const c1 = Math.hypot(a1, b1);
  const c0 = Math.hypot(a0, b0);
  if (c0 < 8 || c1 < 5) return c0 < 8 && c1 < 8;
  const h1 = Math.atan2(b1, a1);
  const h0 = Math.atan2(b0, a0);
  let dh = Math.abs(h1 - h0);
  if (dh > Math.PI) dh = 2 * Math.PI - dh;
  return dh <= (35 * Math.PI) / 180;
}
