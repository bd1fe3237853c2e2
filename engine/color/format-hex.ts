import { assertRgba, type Rgba } from './types.js';

function byte(v: number): string {
  const n = Math.round(Math.min(1, Math.max(0, v)) * 255);
  return n.toString(16).padStart(2, '0');
}

/**
 * Formats a colour as lowercase hex: `#rrggbb` when opaque, `#rrggbbaa` when
 * alpha < 1. Channels are clamped to 0..1 and rounded to 8 bits.
 */
export function formatHex(c: Rgba): string {
  assertRgba(c);
  const base = `#${byte(c.r)}${byte(c.g)}${byte(c.b)}`;
  return c.alpha < 1 ? base + byte(c.alpha) : base;
}
