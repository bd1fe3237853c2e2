/**
 * Text metrics from the bundled DejaVu fonts, and reading text that was
 * exported as glyph outlines.
 */
export {
  type FaceId,
  type FaceMatch,
  type FontFace,
  type FontStyle,
  type GenericClass,
  BOLD_THRESHOLD,
  FONT_FACES,
  FontFileError,
  bundledFontFolder,
  faceFor,
  fontFace,
  fontFilePath,
  matchFontFace,
  normaliseFamilyName,
  parseFontFamilyList,
  parseFontStyle,
  parseFontWeight,
} from './font-files.js';
export {
  type FontSpec,
  type MeasureOptions,
  type TextMetrics,
  MeasureTextError,
  measureText,
} from './measure-text.js';
export { type DigitFeatures, digitAdvances, digitFeatures, hasTabularDigits } from './digit-widths.js';
export { type Box, type Contour, flattenPathData } from './glyph-outline.js';
export { REFERENCE_CHARACTERS, REFERENCE_FACES } from './glyph-references.js';
export {
  type GlyphAnalysis,
  type GlyphCandidate,
  type GlyphMatch,
  type RecognizeOptions,
  MATCH_THRESHOLD,
  analyseGlyph,
  recognizeGlyph,
} from './recognize-glyph.js';
export {
  type GlyphMatrix,
  type GlyphRunReading,
  type PlacedGlyph,
  type ReadGlyphRunOptions,
  type RunGlyph,
  type WorldBox,
  GlyphRunError,
  readGlyphRun,
} from './read-glyph-run.js';
