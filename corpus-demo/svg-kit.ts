/**
 * Small helpers shared by the demo figure builders: a seeded random source,
 * number formatting that is identical on every machine, round axis ticks,
 * linear scales, XML escaping and colour shading.
 */

/** A figure: its file stem and its SVG text. */
export interface Figure {
  name: string;
  svg: string;
}

/** mulberry32: a small 32-bit generator; the same seed gives the same sequence everywhere. */
export function randomSource(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal draws (Box–Muller) from a uniform source. */
export function normalSource(uniform: () => number): () => number {
  return () => {
    const u = Math.max(uniform(), 1e-12);
    const v = uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}

/** A coordinate as written into the SVG: at most `digits` decimals, no trailing zeros, no "-0". */
export function num(n: number, digits = 2): string {
  if (!Number.isFinite(n)) throw new Error(`not a finite coordinate: ${n}`);
  const s = n.toFixed(digits);
  const trimmed = s.includes('.') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
  return trimmed === '-0' ? '0' : trimmed;
}

/** Evenly spaced round values from `min` to `max` inclusive. */
export function ticks(min: number, max: number, step: number): number[] {
  const out: number[] = [];
  const n = Math.round((max - min) / step);
  for (let k = 0; k <= n; k++) out.push(Math.round((min + k * step) * 1e9) / 1e9);
  return out;
}

/** A linear map from the data interval [d0, d1] to the drawing interval [r0, r1]. */
export function linear(d0: number, d1: number, r0: number, r1: number): (v: number) => number {
  return (v) => r0 + ((v - d0) / (d1 - d0)) * (r1 - r0);
}

/** Band centres: `n` equal bands across [r0, r1]. */
export function bands(n: number, r0: number, r1: number): { center: (k: number) => number; width: number } {
  const width = (r1 - r0) / n;
  return { center: (k) => r0 + (k + 0.5) * width, width };
}

/** Escapes text content and attribute values. */
export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** A #rrggbb colour with each channel multiplied by `factor` (below 1 darkens). */
export function shade(hex: string, factor: number): string {
  const m = /^#([0-9a-f]{6})$/i.exec(hex);
  if (!m) throw new Error(`expected #rrggbb, got ${hex}`);
  const v = parseInt(m[1]!, 16);
  const ch = [(v >> 16) & 255, (v >> 8) & 255, v & 255].map((c) => Math.max(0, Math.min(255, Math.round(c * factor))));
  return `#${ch.map((c) => c.toString(16).padStart(2, '0')).join('')}`;
}

/** Thousands separated with commas, e.g. 12480 → "12,480". */
export function grouped(n: number): string {
  const s = String(Math.round(n));
  return s.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}
