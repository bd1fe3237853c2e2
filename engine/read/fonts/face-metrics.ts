/**
 * Per-face metric tables read lazily from a bundled font: glyph index per
 * code point, advance per glyph, kerning per glyph pair (from the font's GPOS
 * `kern` lookups, else its legacy `kern` table) and standard ligatures.
 * Everything is cached, so measuring many labels costs a few map look-ups
 * per character.
 *
 * Text shaping through opentype.js itself is not used: its 2.0.0 release
 * applies DejaVu's `ccmp` feature to every string longer than one character
 * and throws on the chained-context lookup format DejaVu uses, and its
 * default kerning looks only at the `DFLT` script, where DejaVu has no Latin
 * pairs.
 */
import { fontFace, loadFace, type FaceId } from './font-files.js';
import type { OtFont, OtLookup } from './opentype-font.js';

interface Ligature {
  /** Glyphs after the first one. */
  rest: number[];
  by: number;
}

/** Script tags for kerning, chosen from the first letter of a string. */
export type KerningScript = 'latn' | 'grek' | 'cyrl' | 'DFLT';

export class FaceMetrics {
  readonly id: FaceId;
  readonly unitsPerEm: number;
  /** hhea ascender, font units (positive up). */
  readonly ascender: number;
  /** hhea descender, font units (negative below the baseline). */
  readonly descender: number;
  readonly font: OtFont;
  private readonly glyphOf = new Map<number, number>();
  private readonly advances: Float64Array;
  private readonly kernCache = new Map<number, number>();
  private readonly kernLookups = new Map<KerningScript, OtLookup[]>();
  private ligatureTable: Map<number, Ligature[]> | undefined;
  private readonly numGlyphs: number;

  constructor(id: FaceId) {
    this.id = id;
    this.font = loadFace(fontFace(id));
    this.unitsPerEm = this.font.unitsPerEm;
    const hhea = this.font.tables.hhea;
    this.ascender = hhea?.ascender ?? this.font.ascender;
    this.descender = hhea?.descender ?? this.font.descender;
    this.numGlyphs = Math.max(this.font.numGlyphs, 1);
    this.advances = new Float64Array(this.numGlyphs).fill(-1);
  }

  /** Glyph index for a code point; 0 (.notdef) when the font lacks it. */
  glyphIndex(codePoint: number): number {
    let g = this.glyphOf.get(codePoint);
    if (g === undefined) {
      g = this.font.charToGlyphIndex(String.fromCodePoint(codePoint)) || 0;
      this.glyphOf.set(codePoint, g);
    }
    return g;
  }

  /** Advance width of a glyph, font units (hmtx). */
  advance(glyph: number): number {
    if (glyph < 0 || glyph >= this.numGlyphs) return 0;
    let a = this.advances[glyph]!;
    if (a < 0) {
      a = this.font.glyphs.get(glyph)?.advanceWidth ?? 0;
      this.advances[glyph] = a;
    }
    return a;
  }

  private lookupsFor(script: KerningScript): OtLookup[] {
    let list = this.kernLookups.get(script);
    if (list === undefined) {
      list = [];
      if (this.font.tables.gpos !== undefined) {
        try {
          list = this.font.position.getKerningTables(script) ?? [];
          if (list.length === 0 && script !== 'DFLT') list = this.font.position.getKerningTables('DFLT') ?? [];
        } catch {
          list = [];
        }
      }
      this.kernLookups.set(script, list);
    }
    return list;
  }

  /** Horizontal kerning between two glyphs, font units. */
  kerning(left: number, right: number, script: KerningScript): number {
    const key = (left * this.numGlyphs + right) * 4 + SCRIPT_SLOT[script];
    let k = this.kernCache.get(key);
    if (k === undefined) {
      k = this.computeKerning(left, right, script);
      this.kernCache.set(key, k);
    }
    return k;
  }

  private computeKerning(left: number, right: number, script: KerningScript): number {
    const lookups = this.lookupsFor(script);
    if (lookups.length === 0) return this.font.kerningPairs[`${left},${right}`] ?? 0;
    const pos = this.font.position;
    let sum = 0;
    // Each pair-adjustment lookup applies once; within a lookup the first
    // subtable that covers the left glyph decides (OpenType GPOS, LookupType 2).
    for (const lookup of lookups) {
      for (const sub of lookup.subtables) {
        const cov = pos.getCoverageIndex(sub.coverage, left);
        if (cov < 0) continue;
        if (sub.posFormat === 1) {
          const set = sub.pairSets?.[cov];
          const pair = set?.find((p) => p.secondGlyph === right);
          if (pair === undefined) continue;
          sum += pair.value1?.xAdvance ?? 0;
          break;
        }
        const c1 = pos.getGlyphClass(sub.classDef1, left);
        const c2 = pos.getGlyphClass(sub.classDef2, right);
        sum += sub.classRecords?.[c1]?.[c2]?.value1?.xAdvance ?? 0;
        break;
      }
    }
    return sum;
  }

  /** Standard ligatures (`liga`, Latin) starting with this glyph, longest first. */
  ligaturesFrom(first: number): readonly Ligature[] | undefined {
    if (this.ligatureTable === undefined) {
      const table = new Map<number, Ligature[]>();
      let list: { sub: number[]; by: number }[] = [];
      try {
        if (this.font.tables.gsub !== undefined) list = this.font.substitution.getLigatures('liga', 'latn');
      } catch {
        list = [];
      }
      for (const l of list) {
        if (l.sub.length < 2) continue;
        const head = l.sub[0]!;
        let arr = table.get(head);
        if (arr === undefined) table.set(head, (arr = []));
        arr.push({ rest: l.sub.slice(1), by: l.by });
      }
      for (const arr of table.values()) arr.sort((a, b) => b.rest.length - a.rest.length);
      this.ligatureTable = table;
    }
    return this.ligatureTable.get(first);
  }
}

const SCRIPT_SLOT: Readonly<Record<KerningScript, number>> = { latn: 0, grek: 1, cyrl: 2, DFLT: 3 };

/**
 * The script whose kerning a string uses: that of its first Latin, Greek or
 * Cyrillic letter; Latin when it has none (digits and punctuation take the
 * script of the text around them, and chart text is mostly Latin).
 */
export function kerningScriptOf(text: string): KerningScript {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if ((c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a) || (c >= 0xc0 && c <= 0x24f)) return 'latn';
    if (c >= 0x370 && c <= 0x3ff) return 'grek';
    if (c >= 0x400 && c <= 0x52f) return 'cyrl';
  }
  return 'latn';
}

const metricsCache = new Map<FaceId, FaceMetrics>();

/** The metric tables of a face, built on first use and kept for the process. */
export function faceMetrics(id: FaceId): FaceMetrics {
  let m = metricsCache.get(id);
  if (m === undefined) {
    m = new FaceMetrics(id);
    metricsCache.set(id, m);
  }
  return m;
}
