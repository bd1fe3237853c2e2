import { wcagLuminance } from 'culori';
import { compositeOver } from './composite.js';
import { assertRgba, type Rgba } from './types.js';

/**
 * Contrast minimums of WCAG 2.x (2.0, 2.1, 2.2). Thresholds are met only by
 * the unrounded ratio: 4.499:1 does not meet 4.5:1.
 *
 * Automated contrast checks do not replace review by people, nor the
 * accessibility requirements of a particular jurisdiction.
 */
export const WCAG_CONTRAST = {
  /** SC 1.4.3 (AA), normal text. */
  text: 4.5,
  /** SC 1.4.3 (AA), large-scale text (≥ 18 pt, or ≥ 14 pt bold). */
  largeText: 3,
  /** SC 1.4.6 (AAA), normal text. */
  textEnhanced: 7,
  /** SC 1.4.6 (AAA), large-scale text. */
  largeTextEnhanced: 4.5,
  /** SC 1.4.11 (AA), parts of graphics required to understand the content. */
  graphics: 3,
} as const;

const WHITE: Rgba = { r: 1, g: 1, b: 1, alpha: 1 };

/**
 * WCAG 2.x relative luminance of an opaque sRGB colour:
 * L = 0.2126 R + 0.7152 G + 0.0722 B over linearised channels
 * (C ≤ 0.04045 ? C/12.92 : ((C + 0.055)/1.055)^2.4). Alpha is ignored.
 * Arithmetic by culori's `wcagLuminance`.
 */
export function relativeLuminance(c: Rgba): number {
  assertRgba(c);
  return wcagLuminance({ mode: 'rgb', r: c.r, g: c.g, b: c.b });
}

/**
 * WCAG 2.x contrast ratio (L1 + 0.05) / (L2 + 0.05), L1 the lighter, in 1..21.
 *
 * Translucent colours are resolved first: `bg` is composited over `backdrop`
 * (default white, the usual page behind an SVG), then `fg` over that. For
 * opaque colours the ratio is symmetric in its arguments. The value is not
 * rounded; compare it with {@link WCAG_CONTRAST} directly.
 */
export function contrastRatio(fg: Rgba, bg: Rgba, backdrop: Rgba = WHITE): number {
  assertRgba(fg, 'contrastRatio fg');
  assertRgba(bg, 'contrastRatio bg');
  assertRgba(backdrop, 'contrastRatio backdrop');
  const base = bg.alpha < 1 ? compositeOver(bg, compositeOver(backdrop, WHITE)) : bg;
  const top = fg.alpha < 1 ? compositeOver(fg, base) : fg;
  return contrastRatioOpaque(top, base);
}

/** Contrast ratio of two colours taken as opaque; no checks, for inner loops. */
export function contrastRatioOpaque(a: Rgba, b: Rgba): number {
  const la = wcagLuminance({ mode: 'rgb', r: a.r, g: a.g, b: a.b });
  const lb = wcagLuminance({ mode: 'rgb', r: b.r, g: b.g, b: b.b });
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}
