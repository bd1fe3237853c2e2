/**
 * Moving colours from an old ramp to a rebuilt one: a colour's place on the
 * old ramp is the nearest point of the polyline through the ramp's colours in
 * CIELAB (D65); the new colour is the rebuilt ramp at that place. Embedded PNG
 * images (raster colour bars and cells) are recoloured pixel by pixel the same
 * way, keeping each pixel's alpha.
 */
import { PNG } from 'pngjs';
import { rgbToLab65Unchecked } from '../color/to-lab65.js';
import type { Lab, Rgba } from '../color/types.js';

export interface RampMap {
  /** Position 0..1 of a colour on the old ramp, and its distance (ΔE*ab) from it. */
  place(c: Rgba): { t: number; distance: number };
  /** The rebuilt ramp's colour for a colour of the old one (alpha kept). */
  map(c: Rgba): Rgba;
}

export function rampMap(oldColors: readonly Rgba[], rebuilt: (t: number) => Rgba): RampMap {
  const labs: Lab[] = oldColors.map((c) => rgbToLab65Unchecked(c));
  const n = labs.length;
  const cache = new Map<number, { t: number; distance: number }>();
  const place = (c: Rgba): { t: number; distance: number } => {
    const key = (Math.round(c.r * 255) << 16) | (Math.round(c.g * 255) << 8) | Math.round(c.b * 255);
    const hit = cache.get(key);
    if (hit) return hit;
    const p = rgbToLab65Unchecked(c);
    let best = { t: 0, distance: Infinity };
    if (n === 1) best = { t: 0, distance: Math.hypot(p.l - labs[0]!.l, p.a - labs[0]!.a, p.b - labs[0]!.b) };
    for (let k = 0; k < n - 1; k++) {
      const a = labs[k]!;
      const b = labs[k + 1]!;
      const dl = b.l - a.l;
      const da = b.a - a.a;
      const db = b.b - a.b;
      const len2 = dl * dl + da * da + db * db;
      let u = len2 > 0 ? ((p.l - a.l) * dl + (p.a - a.a) * da + (p.b - a.b) * db) / len2 : 0;
      u = Math.min(1, Math.max(0, u));
      const d = Math.hypot(p.l - (a.l + u * dl), p.a - (a.a + u * da), p.b - (a.b + u * db));
      if (d < best.distance) best = { t: (k + u) / (n - 1), distance: d };
    }
    cache.set(key, best);
    return best;
  };
  return {
    place,
    map: (c) => ({ ...rebuilt(place(c).t), alpha: c.alpha }),
  };
}

/** A `data:image/png;base64,` URI → its pixels recoloured through `map`, as a new data URI; null when it is not a readable PNG. */
export function recolorPngDataUri(uri: string, map: (c: Rgba) => Rgba): string | null {
  const m = /^\s*data:image\/png;base64,([\s\S]*)$/i.exec(uri);
  if (!m) return null;
  let png: PNG;
  try {
    png = PNG.sync.read(Buffer.from(m[1]!.replace(/\s+/g, ''), 'base64'));
  } catch {
    return null;
  }
  const d = png.data;
  const memo = new Map<number, [number, number, number]>();
  for (let i = 0; i < d.length; i += 4) {
    const key = (d[i]! << 16) | (d[i + 1]! << 8) | d[i + 2]!;
    let rgb = memo.get(key);
    if (!rgb) {
      const c = map({ r: d[i]! / 255, g: d[i + 1]! / 255, b: d[i + 2]! / 255, alpha: 1 });
      rgb = [Math.round(c.r * 255), Math.round(c.g * 255), Math.round(c.b * 255)];
      memo.set(key, rgb);
    }
    d[i] = rgb[0];
    d[i + 1] = rgb[1];
    d[i + 2] = rgb[2];
  }
  const out = PNG.sync.write(png, { colorType: 6 });
  return `data:image/png;base64,${out.toString('base64')}`;
}
