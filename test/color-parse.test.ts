import { colorsNamed } from 'culori';
import { describe, expect, it } from 'vitest';
import { formatHex, parseColor } from '../engine/color/index.js';

describe('parseColor', () => {
  // Expected channel values follow CSS Color 4 definitions (hex digits / 255,
  // percentages / 100, hsl() conversion); source: CSS Color Module Level 4.
  it.each([
    ['#abc', 0xaa / 255, 0xbb / 255, 0xcc / 255, 1],
    ['#abcd', 0xaa / 255, 0xbb / 255, 0xcc / 255, 0xdd / 255],
    ['#AABBCC', 0xaa / 255, 0xbb / 255, 0xcc / 255, 1],
    ['#aabbcc80', 0xaa / 255, 0xbb / 255, 0xcc / 255, 0x80 / 255],
    ['rgb(255,0,0)', 1, 0, 0, 1],
    ['rgb( 76, 242, 206)', 76 / 255, 242 / 255, 206 / 255, 1],
    ['rgba(255, 0, 0, 0.5)', 1, 0, 0, 0.5],
    ['rgb(100%, 50%, 0%)', 1, 0.5, 0, 1],
    ['rgba(100%,50%,0%,50%)', 1, 0.5, 0, 0.5],
    ['rgb(255 0 0 / 25%)', 1, 0, 0, 0.25],
    ['hsl(120, 100%, 50%)', 0, 1, 0, 1],
    ['hsla(240deg 100% 50% / .3)', 0, 0, 1, 0.3],
    ['steelblue', 70 / 255, 130 / 255, 180 / 255, 1],
    ['RED', 1, 0, 0, 1],
    ['  navy  ', 0, 0, 128 / 255, 1],
    ['transparent', 0, 0, 0, 0],
  ])('%s', (css, r, g, b, alpha) => {
    const c = parseColor(css);
    expect(c).not.toBeNull();
    expect(c!.r).toBeCloseTo(r, 10);
    expect(c!.g).toBeCloseTo(g, 10);
    expect(c!.b).toBeCloseTo(b, 10);
    expect(c!.alpha).toBeCloseTo(alpha, 10);
  });

  it('returns null for none, context keywords, paint servers and junk', () => {
    for (const s of ['none', 'NONE', 'currentColor', 'inherit', 'url(#grad1)', '#ggg', '#12345', '', 'rgb(', 'x'.repeat(5000)]) {
      expect(parseColor(s)).toBeNull();
    }
    // @ts-expect-error runtime guard against non-string input
    expect(parseColor(undefined)).toBeNull();
  });

  it('clamps out-of-range rgb() channels as CSS does', () => {
    // source: CSS Color 4, rgb() values outside 0..255 are clamped
    expect(parseColor('rgb(300, -5, 0)')).toEqual({ r: 1, g: 0, b: 0, alpha: 1 });
  });

  it('maps wide-gamut CSS colours into sRGB', () => {
    const c = parseColor('color(display-p3 0 1 0)')!;
    for (const v of [c.r, c.g, c.b]) {
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThanOrEqual(1);
    }
    expect(c.g).toBeGreaterThan(0.9);
  });

  it('agrees with culori on every CSS named colour', () => {
    // source: culori 4.0.2 named-colour table (npm reference library), 0xRRGGBB integers
    const names = Object.keys(colorsNamed) as (keyof typeof colorsNamed)[];
    expect(names.length).toBeGreaterThan(140);
    for (const n of names) {
      const v = colorsNamed[n];
      const c = parseColor(n)!;
      expect([c.r, c.g, c.b]).toEqual([(v >> 16) / 255, ((v >> 8) & 255) / 255, (v & 255) / 255]);
    }
  });
});

describe('formatHex', () => {
  it('round-trips 8-bit hex', () => {
    for (const h of ['#000000', '#ffffff', '#1f77b4', '#e69f00', '#dd3322']) expect(formatHex(parseColor(h)!)).toBe(h);
  });
  it('writes alpha only when translucent', () => {
    expect(formatHex({ r: 1, g: 0, b: 0, alpha: 0.5 })).toBe('#ff000080');
    expect(formatHex({ r: 1.2, g: -1, b: 0, alpha: 1 })).toBe('#ff0000');
  });
  it('rejects malformed colours with a clear error', () => {
    // @ts-expect-error runtime guard
    expect(() => formatHex({ r: 1, g: 0 })).toThrow(/channel "b"/);
    expect(() => formatHex({ r: NaN, g: 0, b: 0, alpha: 1 })).toThrow(TypeError);
  });
});
