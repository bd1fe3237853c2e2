/**
 * Colour value types shared by the colour modules.
 *
 * `Rgba` is the working type everywhere: gamma-encoded sRGB channels in 0..1
 * (the values a CSS `rgb()` or hex colour denotes, divided by 255) and an
 * alpha in 0..1. Lab-like types carry a `space` tag so a CIELAB value and an
 * OKLab value, which have the same field names, cannot be mixed up.
 */

/** Gamma-encoded sRGB with straight (non-premultiplied) alpha, all in 0..1. */
export interface Rgba {
  r: number;
  g: number;
  b: number;
  alpha: number;
}

/** CIELAB with the D65 reference white (CSS Color 4 D65: x 0.3127, y 0.3290). */
export interface Lab {
  space: 'lab65';
  /** L* lightness, 0..100. */
  l: number;
  a: number;
  b: number;
}

/** OKLab (Ottosson 2020). */
export interface Oklab {
  space: 'oklab';
  /** Lightness 0..1. */
  l: number;
  a: number;
  b: number;
}

/** OKLCh, the polar form of OKLab. Hue in degrees 0..360 (0 for greys). */
export interface Oklch {
  space: 'oklch';
  l: number;
  c: number;
  h: number;
}

/** Colour-vision deficiency types of the Machado–Oliveira–Fernandes model. */
export type CvdType = 'protan' | 'deutan' | 'tritan';

/** Normal trichromatic vision or one of the simulated deficiencies. */
export type Vision = 'normal' | CvdType;

export const CVD_TYPES: readonly CvdType[] = ['protan', 'deutan', 'tritan'];
export const VISIONS: readonly Vision[] = ['normal', 'protan', 'deutan', 'tritan'];

/**
 * Throws a TypeError unless `c` is an Rgba with finite numeric channels.
 * `what` names the argument in the message.
 */
export function assertRgba(c: unknown, what = 'colour'): asserts c is Rgba {
  if (c === null || typeof c !== 'object') {
    throw new TypeError(`${what}: expected an {r, g, b, alpha} object, got ${c === null ? 'null' : typeof c}`);
  }
  const o = c as Record<string, unknown>;
  for (const k of ['r', 'g', 'b', 'alpha'] as const) {
    const v = o[k];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new TypeError(`${what}: channel "${k}" must be a finite number, got ${String(v)}`);
    }
  }
}

/** Throws a TypeError unless `list` is an array of valid Rgba values. */
export function assertRgbaList(list: unknown, what = 'colours'): asserts list is Rgba[] {
  if (!Array.isArray(list)) throw new TypeError(`${what}: expected an array of colours`);
  list.forEach((c, i) => assertRgba(c, `${what}[${i}]`));
}
