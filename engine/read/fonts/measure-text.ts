/**
 * Width, ascent and descent of a string set in a bundled font.
 *
 * Widths are sums of hmtx advances, plus GPOS kerning between neighbouring
 * glyphs, with the font's standard ligatures applied (as browsers and resvg
 * do by default), plus letter spacing. No outlines are built. Results are in
 * the unit of `font.size` (px in SVG user space).
 */
import { faceMetrics, kerningScriptOf, type FaceMetrics } from './face-metrics.js';
import { BOLD_THRESHOLD, matchFontFace, type FaceId, type FaceMatch, type FontStyle } from './font-files.js';

/** A font as CSS describes it. */
export interface FontSpec {
  /** The `font-family` list, one family per entry (see `parseFontFamilyList`). */
  family: readonly string[];
  /** Font size (em box height), in the caller's unit, usually px. */
  size: number;
  /** Numeric weight, 1..1000; from 600 up the bold face is used. */
  weight: number;
  style: FontStyle;
}

export interface MeasureOptions {
  /**
   * Extra space after every character (CSS `letter-spacing`), in the unit of
   * `size`. A non-zero value also turns ligatures off, as CSS asks.
   */
  letterSpacing?: number;
  /** Apply the font's kerning (default true, as `font-kerning: auto` does). */
  kerning?: boolean;
  /** Apply standard ligatures (default true). */
  ligatures?: boolean;
}

export interface TextMetrics {
  /** Advance width of the whole string. */
  width: number;
  /** Distance from the baseline up to the font's ascender line (hhea). */
  ascent: number;
  /** Distance from the baseline down to the descender line, positive. */
  descent: number;
  /** True when the family list asked first for a font that is not bundled. */
  substituted: boolean;
  /** The bundled face measured with. */
  face: FaceId;
  /** Characters the face has no glyph for (measured with its .notdef glyph). */
  missingGlyphs: number;
}

/** Thrown for arguments that cannot be measured. */
export class MeasureTextError extends Error {
  override readonly name = 'MeasureTextError';
}

interface RunWidth {
  /** Kerned advance sum, font units, without letter spacing. */
  units: number;
  /** Characters (code points), for letter spacing. */
  chars: number;
  missing: number;
}

const STRING_CACHE_LIMIT = 20_000;
const stringCache = new Map<string, RunWidth>();
const matchCache = new Map<string, FaceMatch>();

/** matchFontFace, remembered per family list, boldness and style. */
function cachedMatch(font: FontSpec): FaceMatch {
  const key = `${font.weight >= BOLD_THRESHOLD ? 'b' : 'r'}${font.style}|${font.family.join('\u0000')}`;
  let m = matchCache.get(key);
  if (m === undefined) {
    m = matchFontFace(font.family, font.weight, font.style);
    if (matchCache.size >= STRING_CACHE_LIMIT) matchCache.clear();
    matchCache.set(key, m);
  }
  return m;
}

function measureUnits(m: FaceMetrics, text: string, kerning: boolean, ligatures: boolean): RunWidth {
  const key = `${m.id}|${kerning ? 1 : 0}${ligatures ? 1 : 0}|${text}`;
  const hit = stringCache.get(key);
  if (hit !== undefined) return hit;

  const glyphs: number[] = [];
  let chars = 0;
  let missing = 0;
  for (const ch of text) {
    const g = m.glyphIndex(ch.codePointAt(0)!);
    if (g === 0) missing++;
    glyphs.push(g);
    chars++;
  }
  if (ligatures) {
    for (let i = 0; i < glyphs.length; i++) {
      const ligs = m.ligaturesFrom(glyphs[i]!);
      if (ligs === undefined) continue;
      for (const lig of ligs) {
        let ok = i + lig.rest.length < glyphs.length;
        for (let k = 0; ok && k < lig.rest.length; k++) ok = glyphs[i + 1 + k] === lig.rest[k];
        if (ok) {
          glyphs.splice(i, lig.rest.length + 1, lig.by);
          break;
        }
      }
    }
  }
  const script = kerningScriptOf(text);
  let units = 0;
  for (let i = 0; i < glyphs.length; i++) {
    const g = glyphs[i]!;
    units += m.advance(g);
    if (kerning && i + 1 < glyphs.length) units += m.kerning(g, glyphs[i + 1]!, script);
  }
  const result: RunWidth = { units, chars, missing };
  if (stringCache.size >= STRING_CACHE_LIMIT) stringCache.clear();
  stringCache.set(key, result);
  return result;
}

/** Throws MeasureTextError unless `font` is a usable FontSpec. */
export function checkFontSpec(font: FontSpec): void {
  if (font === null || typeof font !== 'object') throw new MeasureTextError('font must be an object');
  if (!Array.isArray(font.family) || !font.family.every((f) => typeof f === 'string')) {
    throw new MeasureTextError('font.family must be an array of family names');
  }
  if (typeof font.size !== 'number' || !Number.isFinite(font.size) || font.size < 0) {
    throw new MeasureTextError(`font.size must be a finite number ≥ 0, got ${String(font.size)}`);
  }
  if (typeof font.weight !== 'number' || !Number.isFinite(font.weight)) {
    throw new MeasureTextError(`font.weight must be a finite number, got ${String(font.weight)}`);
  }
  if (font.style !== 'normal' && font.style !== 'italic' && font.style !== 'oblique') {
    throw new MeasureTextError(`font.style must be normal, italic or oblique, got ${String(font.style)}`);
  }
}

/** Measures a string set in the bundled face that stands in for `font`. */
export function measureText(text: string, font: FontSpec, options: MeasureOptions = {}): TextMetrics {
  if (typeof text !== 'string') throw new MeasureTextError('text must be a string');
  checkFontSpec(font);
  const letterSpacing = options.letterSpacing ?? 0;
  if (!Number.isFinite(letterSpacing)) throw new MeasureTextError('letterSpacing must be a finite number');
  const match = cachedMatch(font);
  const m = faceMetrics(match.face.id);
  const kerning = options.kerning ?? true;
  const ligatures = (options.ligatures ?? true) && letterSpacing === 0;
  const run = measureUnits(m, text, kerning, ligatures);
  const scale = font.size / m.unitsPerEm;
  return {
    width: run.units * scale + letterSpacing * run.chars,
    ascent: m.ascender * scale,
    descent: -m.descender * scale,
    substituted: match.substituted,
    face: match.face.id,
    missingGlyphs: run.missing,
  };
}
