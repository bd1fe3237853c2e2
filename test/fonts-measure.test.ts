import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import {
  FONT_FACES,
  MeasureTextError,
  digitAdvances,
  digitFeatures,
  fontFilePath,
  hasTabularDigits,
  matchFontFace,
  measureText,
  parseFontFamilyList,
  parseFontStyle,
  parseFontWeight,
  type FontSpec,
} from '../engine/read/fonts/index.js';

// An independent reading of the same font files, straight through opentype.js.
interface OtGlyph {
  index: number;
  advanceWidth: number;
}
interface OtFont {
  unitsPerEm: number;
  kerningPairs: Record<string, number>;
  charToGlyph(c: string): OtGlyph;
  getAdvanceWidth(text: string, size: number, options?: { kerning?: boolean }): number;
}
const require = createRequire(import.meta.url);
const opentype = require('opentype.js') as { parse(b: ArrayBuffer): OtFont };
const fontDir = path.join(path.dirname(require.resolve('dejavu-fonts-ttf/package.json')), 'ttf');
const fontCache = new Map<string, OtFont>();
function otFont(file: string): OtFont {
  let f = fontCache.get(file);
  if (f === undefined) {
    const b = readFileSync(path.join(fontDir, file));
    f = opentype.parse(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength) as ArrayBuffer);
    fontCache.set(file, f);
  }
  return f;
}

const sans = (size: number, extra: Partial<FontSpec> = {}): FontSpec => ({
  family: ['DejaVu Sans'],
  size,
  weight: 400,
  style: 'normal',
  ...extra,
});

describe('font family matching', () => {
  it('splits CSS family lists, quoted or not', () => {
    expect(parseFontFamilyList(`'DejaVu Sans', Arial, "Helvetica Neue",sans-serif`)).toEqual([
      'DejaVu Sans',
      'Arial',
      'Helvetica Neue',
      'sans-serif',
    ]);
    expect(parseFontFamilyList(`"a, b", c`)).toEqual(['a, b', 'c']);
    expect(parseFontFamilyList('  ,  ')).toEqual([]);
  });

  it('parses weights and styles as CSS defines them', () => {
    // source: CSS Fonts Module Level 4, §2.2 (normal = 400, bold = 700) and §2.4
    expect(parseFontWeight('normal')).toBe(400);
    expect(parseFontWeight('bold')).toBe(700);
    expect(parseFontWeight('600')).toBe(600);
    expect(parseFontWeight('heavy')).toBeNull();
    expect(parseFontWeight(1001)).toBeNull();
    expect(parseFontStyle('oblique 10deg')).toBe('oblique');
    expect(parseFontStyle('slanted')).toBeNull();
  });

  it('resolves lists to a bundled face and says when it substituted', () => {
    const pick = (list: string, weight = 400, style: 'normal' | 'italic' | 'oblique' = 'normal') => {
      const m = matchFontFace(parseFontFamilyList(list), weight, style);
      return [m.face.id, m.substituted];
    };
    expect(pick(`'DejaVu Sans', Arial, Helvetica, sans-serif`)).toEqual(['DejaVuSans', false]);
    expect(pick('Liberation Sans')).toEqual(['DejaVuSans', true]);
    expect(pick('Arial')).toEqual(['DejaVuSans', true]);
    expect(pick('Helvetica, sans-serif')).toEqual(['DejaVuSans', true]);
    expect(pick('Times')).toEqual(['DejaVuSerif', true]);
    expect(pick('"Times New Roman", serif')).toEqual(['DejaVuSerif', true]);
    expect(pick('Courier')).toEqual(['DejaVuSansMono', true]);
    expect(pick('monospace')).toEqual(['DejaVuSansMono', false]);
    expect(pick('serif')).toEqual(['DejaVuSerif', false]);
    expect(pick('sans-serif')).toEqual(['DejaVuSans', false]);
    expect(pick('Some Unknown Grotesk')).toEqual(['DejaVuSans', true]);
    expect(pick('Fancy Mono Pro')).toEqual(['DejaVuSansMono', true]);
    expect(pick('')).toEqual(['DejaVuSans', false]);
  });

  it('chooses bold from weight 600 and slanted faces for italic and oblique', () => {
    // common practice, no source: 600 (semi-bold) and above map to a bold face when only regular and bold exist
    const id = (list: string, weight: number, style: 'normal' | 'italic' | 'oblique') =>
      matchFontFace(parseFontFamilyList(list), weight, style).face.id;
    expect(id('sans-serif', 599, 'normal')).toBe('DejaVuSans');
    expect(id('sans-serif', 600, 'normal')).toBe('DejaVuSans-Bold');
    expect(id('Arial', 700, 'italic')).toBe('DejaVuSans-BoldOblique');
    expect(id('Arial', 400, 'oblique')).toBe('DejaVuSans-Oblique');
    expect(id('Georgia', 400, 'italic')).toBe('DejaVuSerif-Italic');
    expect(id('serif', 800, 'normal')).toBe('DejaVuSerif-Bold');
    expect(id('Consolas', 700, 'normal')).toBe('DejaVuSansMono-Bold');
  });

  it('finds every bundled face in the installed package', () => {
    for (const f of FONT_FACES) expect(readFileSync(fontFilePath(f)).length).toBeGreaterThan(100_000);
  });
});

describe('measureText', () => {
  it('gives digit advances from the hmtx table', () => {
    // source: DejaVu Sans 2.37 hmtx table: every digit advances 1303 units, unitsPerEm 2048
    const m = measureText('0', sans(10));
    expect(m.width).toBeCloseTo(6.362, 3);
    expect(measureText('1234567890', sans(10)).width).toBeCloseTo(63.623, 3);
    expect(m.substituted).toBe(false);
    expect(m.face).toBe('DejaVuSans');
  });

  it('gives ascent and descent from the hhea table', () => {
    // source: DejaVu Sans 2.37 hhea table: ascender 1901, descender −483 (unitsPerEm 2048)
    const m = measureText('x', sans(20));
    expect(m.ascent).toBeCloseTo((1901 / 2048) * 20, 6);
    expect(m.descent).toBeCloseTo((483 / 2048) * 20, 6);
  });

  it('adds kerning between glyphs', () => {
    // source: DejaVu Sans 2.37: A and V advance 1401 units, kern pair A–V −131 units
    expect(measureText('AV', sans(2048)).width).toBeCloseTo(1401 + 1401 - 131, 6);
    expect(measureText('AV', sans(2048), { kerning: false }).width).toBeCloseTo(2802, 6);
    // source: DejaVu Serif 2.37: A and V advance 1479 units, kern pair A–V −102 units
    expect(measureText('AV', { ...sans(2048), family: ['serif'] }).width).toBeCloseTo(1479 * 2 - 102, 6);
  });

  it('agrees with opentype.js advances and the legacy kern table on chart strings', () => {
    // source: the fonts' own hmtx and `kern` tables read by opentype.js (plumbline kerns from GPOS)
    const strings = ['Loaves sold per branch, week 14', 'Average wait (min)', 'Trips per month', 'AVATAR Toyota'];
    const cases: [FontSpec, string][] = [
      [sans(13), 'DejaVuSans.ttf'],
      [{ ...sans(11), weight: 700 }, 'DejaVuSans-Bold.ttf'],
      [{ ...sans(9), family: ['Times'] }, 'DejaVuSerif.ttf'],
      [{ ...sans(12), family: ['monospace'] }, 'DejaVuSansMono.ttf'],
    ];
    for (const [spec, file] of cases) {
      const f = otFont(file);
      for (const s of strings) {
        // opentype.js 2.0.0 cannot shape multi-character DejaVu strings (its ccmp support
        // throws), so advances are summed one character at a time.
        let expected = 0;
        const chars = [...s];
        chars.forEach((c, i) => {
          expected += f.getAdvanceWidth(c, spec.size);
          if (i + 1 < chars.length) {
            const k = f.kerningPairs[`${f.charToGlyph(c).index},${f.charToGlyph(chars[i + 1]!).index}`] ?? 0;
            expected += (k / f.unitsPerEm) * spec.size;
          }
        });
        expect(measureText(s, spec, { ligatures: false }).width).toBeCloseTo(expected, 9);
      }
    }
  });

  it('applies standard ligatures unless letter spacing is set', () => {
    // source: DejaVu Sans 2.37: GSUB liga f+f → uniFB00 (advance 1411); f advances 721
    expect(measureText('ff', sans(2048)).width).toBeCloseTo(1411, 6);
    expect(measureText('ff', sans(2048), { ligatures: false }).width).toBeCloseTo(1442, 6);
    // CSS Text 3 §8.2: letter-spacing is added after every character and turns optional ligatures off
    expect(measureText('ff', sans(2048), { letterSpacing: 10 }).width).toBeCloseTo(1442 + 20, 6);
  });

  it('adds letter spacing per character, counting code points', () => {
    const base = measureText('a😀b', sans(10)).width;
    expect(measureText('a😀b', sans(10), { letterSpacing: 1.5 }).width).toBeCloseTo(base + 4.5, 9);
  });

  it('counts characters the face lacks', () => {
    const m = measureText('a\u4e2db', sans(10));
    expect(m.missingGlyphs).toBe(1);
    expect(m.width).toBeGreaterThan(measureText('ab', sans(10)).width);
  });

  it('scales linearly with size and measures the empty string as zero', () => {
    const s = 'Hillside';
    expect(measureText(s, sans(24)).width).toBeCloseTo(measureText(s, sans(12)).width * 2, 9);
    expect(measureText('', sans(12)).width).toBe(0);
  });

  it('reports substitution for families that are not bundled', () => {
    expect(measureText('x', { ...sans(10), family: ['Arial', 'sans-serif'] }).substituted).toBe(true);
    expect(measureText('x', { ...sans(10), family: ['DejaVu Sans', 'Arial'] }).substituted).toBe(false);
  });

  it('refuses arguments it cannot measure with a clear error', () => {
    expect(() => measureText('x', sans(Number.NaN))).toThrow(MeasureTextError);
    expect(() => measureText('x', sans(-1))).toThrow(/size/);
    expect(() => measureText('x', { ...sans(10), style: 'slanted' as never })).toThrow(/style/);
    expect(() => measureText('x', { ...sans(10), family: 'Arial' as never })).toThrow(/family/);
    expect(() => measureText(42 as never, sans(10))).toThrow(MeasureTextError);
    expect(() => measureText('x', sans(10), { letterSpacing: Infinity })).toThrow(/letterSpacing/);
  });
});

describe('digit widths', () => {
  it('reads DejaVu digits as tabular in all three families', () => {
    // source: DejaVu Sans / Serif 2.37 hmtx: digits 1303 units; DejaVu Sans Mono: every glyph 1233 units
    expect(digitAdvances(sans(10)).map((w) => Number(w.toFixed(3)))).toEqual(new Array(10).fill(6.362));
    expect(digitAdvances({ ...sans(2048), family: ['monospace'] })).toEqual(new Array(10).fill(1233));
    for (const family of ['sans-serif', 'serif', 'monospace']) {
      for (const weight of [400, 700]) expect(hasTabularDigits({ ...sans(10), family: [family], weight })).toBe(true);
    }
  });

  it('lists the numeral features of the face: DejaVu has none', () => {
    // source: DejaVu Sans 2.37 GSUB FeatureList (aalt, case, ccmp, dlig, fina, hlig, init, liga, locl, medi, rlig, salt)
    expect(digitFeatures(sans(10))).toEqual({ tnum: false, pnum: false, lnum: false, onum: false });
  });
});

describe('digit widths input checks', () => {
  it('refuses font descriptions it cannot use', () => {
    expect(() => digitAdvances({ ...sans(10), family: [3 as never] })).toThrow(MeasureTextError);
    expect(() => hasTabularDigits({ ...sans(10), size: Number.NaN })).toThrow(/size/);
  });
});
