/**
 * Digit advances: whether numerals in a face line up in columns (tabular
 * figures, every digit the same advance) or not (proportional figures), and
 * which numeral features the face offers.
 *
 * DejaVu's default digits are tabular in all three families, and DejaVu has
 * no `tnum` / `pnum` features: its digits cannot be switched.
 */
import { faceMetrics, type FaceMetrics } from './face-metrics.js';
import { matchFontFace } from './font-files.js';
import { checkFontSpec, type FontSpec } from './measure-text.js';

function metricsFor(font: FontSpec): FaceMetrics {
  checkFontSpec(font);
  return faceMetrics(matchFontFace(font.family, font.weight, font.style).face.id);
}

/** Advances of the digits 0–9 in the unit of `font.size`. */
export function digitAdvances(font: FontSpec): number[] {
  const m = metricsFor(font);
  const scale = font.size / m.unitsPerEm;
  const out: number[] = [];
  for (let d = 0; d < 10; d++) out.push(m.advance(m.glyphIndex(0x30 + d)) * scale);
  return out;
}

/** True when all ten default digits have the same advance (tabular figures). */
export function hasTabularDigits(font: FontSpec): boolean {
  const m = metricsFor(font);
  const first = m.advance(m.glyphIndex(0x30));
  for (let d = 1; d < 10; d++) if (m.advance(m.glyphIndex(0x30 + d)) !== first) return false;
  return true;
}

/** Numeral features the face's GSUB table lists (OpenType feature tags). */
export interface DigitFeatures {
  /** `tnum`: tabular figures can be switched on. */
  tnum: boolean;
  /** `pnum`: proportional figures can be switched on. */
  pnum: boolean;
  /** `lnum`: lining figures. */
  lnum: boolean;
  /** `onum`: old-style figures. */
  onum: boolean;
}

/** Which numeral features the face offers. */
export function digitFeatures(font: FontSpec): DigitFeatures {
  const m = metricsFor(font);
  const tags = new Set((m.font.tables.gsub?.features ?? []).map((f) => f.tag));
  return { tnum: tags.has('tnum'), pnum: tags.has('pnum'), lnum: tags.has('lnum'), onum: tags.has('onum') };
}
