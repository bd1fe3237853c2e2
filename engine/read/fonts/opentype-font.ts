/**
 * The part of opentype.js that the font modules use, with types.
 *
 * opentype.js ships no type declarations, so it is loaded through
 * `createRequire` and given the narrow interfaces below. Nothing here leaks
 * opentype.js objects into the public API: the other modules wrap them.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

export interface OtPathCommand {
  type: 'M' | 'L' | 'Q' | 'C' | 'Z';
  x?: number;
  y?: number;
  x1?: number;
  y1?: number;
  x2?: number;
  y2?: number;
}

export interface OtGlyph {
  index: number;
  name: string | null;
  unicode: number | undefined;
  advanceWidth: number | undefined;
  /** Outline in font units, y axis up (as stored in the font). */
  path: { commands: OtPathCommand[] };
  getBoundingBox(): { x1: number; y1: number; x2: number; y2: number };
}

export interface OtValueRecord {
  xAdvance?: number;
}

export interface OtPairSubtable {
  posFormat: 1 | 2;
  coverage: unknown;
  pairSets?: { secondGlyph: number; value1?: OtValueRecord }[][];
  classDef1?: unknown;
  classDef2?: unknown;
  classRecords?: { value1?: OtValueRecord }[][];
}

export interface OtLookup {
  lookupType: number;
  subtables: OtPairSubtable[];
}

export interface OtLayoutFeature {
  tag: string;
}

export interface OtLayoutTable {
  scripts: { tag: string }[];
  features: OtLayoutFeature[];
}

export interface OtLigature {
  sub: number[];
  by: number;
}

export interface OtFont {
  unitsPerEm: number;
  ascender: number;
  descender: number;
  numGlyphs: number;
  names: { windows?: { fontFamily?: { en?: string }; version?: { en?: string } } };
  tables: {
    gsub?: OtLayoutTable;
    gpos?: OtLayoutTable;
    hhea?: { ascender: number; descender: number };
  };
  /** Pairs from the legacy `kern` table, keyed "left,right" by glyph index. */
  kerningPairs: Record<string, number>;
  glyphs: { get(index: number): OtGlyph | undefined; length: number };
  charToGlyphIndex(s: string): number;
  charToGlyph(s: string): OtGlyph;
  getAdvanceWidth(text: string, fontSize: number, options?: { kerning?: boolean }): number;
  position: {
    getKerningTables(script: string, language?: string): OtLookup[] | undefined;
    getCoverageIndex(coverage: unknown, glyphIndex: number): number;
    getGlyphClass(classDef: unknown, glyphIndex: number): number;
  };
  substitution: {
    getLigatures(feature: string, script?: string, language?: string): OtLigature[];
  };
}

interface OpentypeModule {
  parse(buffer: ArrayBuffer, options?: { lowMemory?: boolean }): OtFont;
}

let moduleCache: OpentypeModule | undefined;

function opentype(): OpentypeModule {
  if (moduleCache === undefined) {
    const require = createRequire(import.meta.url);
    moduleCache = require('opentype.js') as OpentypeModule;
  }
  return moduleCache;
}

/** Thrown when a bundled font cannot be found or read. */
export class FontFileError extends Error {
  override readonly name = 'FontFileError';
}

/** Reads and parses one font file (no caching: callers cache). */
export function parseFontFile(file: string): OtFont {
  let bytes: Buffer;
  try {
    bytes = readFileSync(file);
  } catch (err) {
    throw new FontFileError(`Cannot read font file ${file}: ${(err as Error).message}`);
  }
  const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  try {
    return opentype().parse(buffer, { lowMemory: true });
  } catch (err) {
    throw new FontFileError(`Cannot parse font file ${file}: ${(err as Error).message}`);
  }
}
