import { clampRgb, converter, parse, toGamut } from 'culori';
import type { Rgba } from './types.js';

const toRgb = converter('rgb');
const mapToSrgb = toGamut('rgb', 'oklch');

/** Longer strings are not colours any plotting library writes; refuse them early. */
const MAX_LENGTH = 256;

/** Modes whose channels are sRGB already (clamping, not gamut mapping, applies). */
const SRGB_MODES = new Set(['rgb', 'hsl', 'hwb', 'hsv']);

/**
 * Parses a CSS colour string into gamma-encoded sRGB with alpha.
 *
 * Accepts what SVG writers emit: hex (#rgb, #rgba, #rrggbb, #rrggbbaa),
 * `rgb()`/`rgba()` with numbers or percentages (comma or space syntax),
 * `hsl()`/`hsla()`, `hwb()`, the CSS named colours (case-insensitive) and
 * `transparent`. Other CSS Color 4 forms (`lab()`, `oklch()`, `color(...)`)
 * are parsed too and mapped into the sRGB gamut (CSS Color 4 gamut mapping in
 * OKLCh). sRGB channels outside 0..1 are clamped, as CSS does for `rgb()`.
 *
 * Returns null for `none`, for keywords that need context (`currentColor`,
 * `inherit`, …), for paint servers (`url(#id)`) and for anything unparseable;
 * callers resolve those themselves.
 */
export function parseColor(css: string): Rgba | null {
  if (typeof css !== 'string') return null;
  const s = css.trim();
  if (s.length === 0 || s.length > MAX_LENGTH) return null;
  if (s.toLowerCase() === 'none') return null;
  const parsed = parse(s);
  if (parsed === undefined) return null;
  const alphaRaw = parsed.alpha;
  const alpha = alphaRaw === undefined || Number.isNaN(alphaRaw) ? 1 : Math.min(1, Math.max(0, alphaRaw));
  const rgb = SRGB_MODES.has(parsed.mode) ? clampRgb(toRgb(parsed)) : mapToSrgb(parsed);
  const channel = (v: number | undefined): number => {
    // A CSS `none` component parses as undefined/NaN; it means 0.
    if (v === undefined || Number.isNaN(v)) return 0;
    return Math.min(1, Math.max(0, v));
  };
  return { r: channel(rgb.r), g: channel(rgb.g), b: channel(rgb.b), alpha };
}
