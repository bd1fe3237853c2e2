/**
 * The outlines glyphs are recognised against: the characters charts use,
 * taken from the bundled DejaVu faces. Built once per process, on first use.
 */
import { fontFace, loadFace, type FaceId } from './font-files.js';
import { flattenPathData, type Box } from './glyph-outline.js';
import { describeShape, type ShapeDescriptor } from './glyph-shape.js';
import type { OtPathCommand } from './opentype-font.js';

/** Characters with a reference outline: printable ASCII and chart symbols. */
export const REFERENCE_CHARACTERS: readonly string[] = Object.freeze([
  ...Array.from({ length: 126 - 33 + 1 }, (_, i) => String.fromCharCode(33 + i)),
  '\u2212', // − minus sign
  '\u00d7', // × multiplication sign
  '\u00b7', // · middle dot
  '\u00b0', // ° degree sign
  '\u20ac', // € euro sign
  '\u00a3', // £ pound sign
  '\u00b5', // µ micro sign
  '\u00b1', // ± plus-minus sign
  '\u2013', // – en dash (ranges)
  '\u2014', // — em dash
  '\u2264', // ≤
  '\u2265', // ≥
  '\u2070', '\u00b9', '\u00b2', '\u00b3', '\u2074', '\u2075', '\u2076', '\u2077', '\u2078', '\u2079', // ⁰..⁹
  '\u207b', // ⁻ superscript minus
]);

/** Faces whose outlines are references. */
export const REFERENCE_FACES: readonly FaceId[] = Object.freeze([
  'DejaVuSans',
  'DejaVuSans-Bold',
  'DejaVuSans-Oblique',
  'DejaVuSerif',
  'DejaVuSansMono',
] as const);

export interface ReferenceGlyph {
  char: string;
  face: FaceId;
  /** Advance width in em. */
  advance: number;
  /** Ink box in em, y up, relative to the glyph origin on the baseline. */
  box: Box;
  shape: ShapeDescriptor;
}

/** SVG path data of an opentype.js outline (font units, y up). */
export function commandsToPathData(commands: readonly OtPathCommand[]): string {
  const parts: string[] = [];
  for (const c of commands) {
    switch (c.type) {
      case 'M':
      case 'L':
        parts.push(`${c.type}${c.x} ${c.y}`);
        break;
      case 'Q':
        parts.push(`Q${c.x1} ${c.y1} ${c.x} ${c.y}`);
        break;
      case 'C':
        parts.push(`C${c.x1} ${c.y1} ${c.x2} ${c.y2} ${c.x} ${c.y}`);
        break;
      case 'Z':
        parts.push('Z');
        break;
    }
  }
  return parts.join('');
}

/** Reference glyphs of a set of faces, in face order then character order. */
export function buildReferences(faces: readonly FaceId[], characters: readonly string[]): ReferenceGlyph[] {
  const refs: ReferenceGlyph[] = [];
  for (const id of faces) {
    const font = loadFace(fontFace(id));
    const em = font.unitsPerEm;
    for (const char of characters) {
      const index = font.charToGlyphIndex(char);
      if (!index) continue;
      const glyph = font.glyphs.get(index);
      if (glyph === undefined) continue;
      const contours = flattenPathData(commandsToPathData(glyph.path.commands));
      if (contours === null) continue;
      const shape = describeShape(contours);
      if (shape === null) continue;
      refs.push({
        char,
        face: id,
        advance: (glyph.advanceWidth ?? 0) / em,
        box: Object.freeze({ xMin: shape.box.xMin / em, yMin: shape.box.yMin / em, xMax: shape.box.xMax / em, yMax: shape.box.yMax / em }),
        shape,
      });
    }
  }
  return refs;
}

let cached: ReferenceGlyph[] | undefined;

/** The reference set, built on first use. */
export function referenceGlyphs(): readonly ReferenceGlyph[] {
  if (cached === undefined) cached = buildReferences(REFERENCE_FACES, REFERENCE_CHARACTERS);
  return cached;
}

let byFaceAndChar: Map<string, ReferenceGlyph> | undefined;

/** The reference glyph of a character in a face; undefined when the face lacks it. */
export function referenceGlyph(char: string, face: FaceId): ReferenceGlyph | undefined {
  if (byFaceAndChar === undefined) {
    byFaceAndChar = new Map();
    for (const r of referenceGlyphs()) byFaceAndChar.set(`${r.face}|${r.char}`, r);
  }
  return byFaceAndChar.get(`${face}|${char}`);
}

let typical: Map<string, number> | undefined;

/** Median advance (em) of a character over the proportional reference faces. */
export function typicalAdvance(char: string): number | undefined {
  if (typical === undefined) {
    const byChar = new Map<string, number[]>();
    for (const r of referenceGlyphs()) {
      if (fontFace(r.face).generic === 'monospace') continue;
      let list = byChar.get(r.char);
      if (list === undefined) byChar.set(r.char, (list = []));
      list.push(r.advance);
    }
    typical = new Map();
    for (const [char, list] of byChar) {
      list.sort((a, b) => a - b);
      const mid = list.length >> 1;
      typical.set(char, list.length % 2 === 1 ? list[mid]! : (list[mid - 1]! + list[mid]!) / 2);
    }
  }
  return typical.get(char);
}
