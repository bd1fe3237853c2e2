import { assertRgba, type Rgba } from './types.js';

/**
 * Porter–Duff "source over" of `fg` on `bg`, with straight alpha, in
 * gamma-encoded sRGB: the compositing SVG renderers and browsers perform by
 * default (CSS Compositing and Blending, simple alpha compositing).
 *
 * αo = αf + αb(1 − αf); Co = (Cf·αf + Cb·αb·(1 − αf)) / αo.
 * Two fully transparent inputs give transparent black.
 */
export function compositeOver(fg: Rgba, bg: Rgba): Rgba {
  assertRgba(fg, 'compositeOver fg');
  assertRgba(bg, 'compositeOver bg');
  const af = Math.min(1, Math.max(0, fg.alpha));
  const ab = Math.min(1, Math.max(0, bg.alpha));
  const ao = af + ab * (1 - af);
  if (ao === 0) return { r: 0, g: 0, b: 0, alpha: 0 };
  const mix = (cf: number, cb: number) => (cf * af + cb * ab * (1 - af)) / ao;
  return { r: mix(fg.r, bg.r), g: mix(fg.g, bg.g), b: mix(fg.b, bg.b), alpha: ao };
}
