/**
 * Which character a glyph outline draws, from its geometry alone.
 *
 * Plotting libraries that export text as outlines give each glyph as path
 * data, usually in font units with the baseline at y = 0. The outline is
 * flattened, described scale-free (see glyph-shape.ts) and compared with the
 * outlines of the bundled DejaVu faces (glyph-references.ts): a coverage-grid
 * cut keeps the closest references, then a symmetric mean distance between
 * the evenly resampled contours (each outline's points to the other's
 * polygon, with the outline's direction there weighed in), plus penalties
 * for a different contour count, aspect ratio and (when y = 0 is the
 * baseline) position relative to the baseline, ranks them. Ids, class names and comments of the
 * source are never looked at.
 *
 * Look-alikes whose outlines differ mainly in size (l / I, o / O, x / ×) stay
 * close in distance; `candidates` lists them with their reference boxes and
 * advances so that a caller who knows the font size (readGlyphRun does) can
 * choose among them.
 */
import { flattenPathData, type Box } from './glyph-outline.js';
import { chamferDistance, describeShape, gridDistance, type ShapeDescriptor } from './glyph-shape.js';
import { referenceGlyphs, type ReferenceGlyph } from './glyph-references.js';
import type { FaceId } from './font-files.js';

/** Distances above this are no match (normalised units: the glyph's larger side is 1). */
export const MATCH_THRESHOLD = 0.13;

/** Penalty weights of the final distance. */
const W_CONTOURS = 0.02;
const W_ASPECT = 0.03;
const W_BASELINE = 0.06;
/** References kept after the coverage-grid cut. */
const SHORTLIST = 16;
/** Distinct characters reported per glyph. */
const MAX_CANDIDATES = 8;
const CACHE_LIMIT = 20_000;

export interface RecognizeOptions {
  /**
   * The outline's y axis points up, as in font files and in the `<defs>` of
   * outline-text SVG exports (default true). Pass false for outlines in SVG
   * user space (y down).
   */
  yUp?: boolean;
  /** y = 0 of the outline is the baseline (default true). */
  baselineAtZero?: boolean;
  /** Largest accepted distance (default MATCH_THRESHOLD). */
  maxDistance?: number;
}

export interface GlyphCandidate {
  char: string;
  /** The reference face whose outline matched best. */
  face: FaceId;
  distance: number;
  /** The reference glyph's advance, in em. */
  advance: number;
  /** The reference glyph's ink box, in em, y up, relative to its origin on the baseline. */
  box: Box;
}

export interface GlyphMatch {
  char: string;
  distance: number;
  /** 1 for an exact outline, falling to 0 at the acceptance threshold. */
  confidence: number;
  face: FaceId;
  /**
   * Ink box in the input's units, y up (for y-down input, y values are
   * negated), so with font-unit input it is relative to the baseline.
   */
  bbox: Box;
  contours: number;
  /** Closest characters, best first (the match itself included), one per character. */
  candidates: GlyphCandidate[];
}

/** What a glyph outline is, before any acceptance threshold. */
/** Shared and cached: frozen, do not modify. */
export interface GlyphAnalysis {
  readonly bbox: Readonly<Box>;
  readonly contours: number;
  readonly candidates: readonly Readonly<GlyphCandidate>[];
}

interface ShortEntry {
  ref: number;
  chamfer: number;
}

/** Per option combination, analyses keyed by the path data itself (no copy of the string). */
const analysisCache = new Map<string, Map<string, GlyphAnalysis | null>>();
let analysisCount = 0;
const shapeCache = new Map<string, ShortEntry[]>();

function remember<V>(map: Map<string, V>, key: string, value: V): V {
  if (map.size >= CACHE_LIMIT) map.clear();
  map.set(key, value);
  return value;
}

function shapeKey(shape: ShapeDescriptor): string {
  let key = `${shape.contours}:`;
  for (let i = 0; i < shape.points.length; i++) key += `${Math.round(shape.points[i]! * 2048)},`;
  return key;
}

function penalties(q: ShapeDescriptor, r: ShapeDescriptor, baseline: boolean): number {
  let p = W_CONTOURS * Math.abs(q.contours - r.contours) + W_ASPECT * Math.abs(Math.log(q.aspect / r.aspect));
  if (baseline) p += W_BASELINE * (Math.abs(q.bottom - r.bottom) + Math.abs(q.top - r.top));
  return p;
}

/** The references closest in shape, with their contour distances (translation- and scale-free, cached). */
function shortlist(q: ShapeDescriptor, refs: readonly ReferenceGlyph[], baseline: boolean): ShortEntry[] {
  const key = `${baseline ? 'b' : 'f'}|${shapeKey(q)}`;
  const hit = shapeCache.get(key);
  if (hit !== undefined) return hit;
  const rough: { ref: number; score: number }[] = [];
  for (let i = 0; i < refs.length; i++) {
    const r = refs[i]!.shape;
    rough.push({ ref: i, score: gridDistance(q.grid, r.grid) + penalties(q, r, baseline) });
  }
  rough.sort((a, b) => a.score - b.score);
  const list = rough
    .slice(0, SHORTLIST)
    .map((e) => ({ ref: e.ref, chamfer: chamferDistance(q, refs[e.ref]!.shape) }));
  return remember(shapeCache, key, list);
}

/**
 * Outline box and closest characters of a glyph outline; null when the path
 * draws nothing (a space) or is too large to be a glyph. Cached by path data.
 */
export function analyseGlyph(pathData: string, options: RecognizeOptions = {}): GlyphAnalysis | null {
  if (typeof pathData !== 'string') return null;
  const yUp = options.yUp ?? true;
  const baseline = options.baselineAtZero ?? true;
  const optionKey = `${yUp ? 'u' : 'd'}${baseline ? 'b' : 'f'}`;
  let cache = analysisCache.get(optionKey);
  if (cache === undefined) analysisCache.set(optionKey, (cache = new Map()));
  const hit = cache.get(pathData);
  if (hit !== undefined) return hit;
  if (analysisCount >= CACHE_LIMIT) {
    for (const m of analysisCache.values()) m.clear();
    analysisCount = 0;
  }
  analysisCount++;

  const contours = flattenPathData(pathData, !yUp);
  const shape = contours === null ? null : describeShape(contours);
  if (shape === null) {
    cache.set(pathData, null);
    return null;
  }

  const refs = referenceGlyphs();
  const best = new Map<string, GlyphCandidate>();
  for (const e of shortlist(shape, refs, baseline)) {
    const r = refs[e.ref]!;
    const distance = e.chamfer + penalties(shape, r.shape, baseline);
    const prev = best.get(r.char);
    if (prev === undefined || distance < prev.distance) {
      best.set(r.char, { char: r.char, face: r.face, distance, advance: r.advance, box: r.box });
    }
  }
  const candidates = [...best.values()].sort((a, b) => a.distance - b.distance).slice(0, MAX_CANDIDATES);
  for (const c of candidates) Object.freeze(c);
  const result: GlyphAnalysis = Object.freeze({
    bbox: Object.freeze({ ...shape.box }),
    contours: shape.contours,
    candidates: Object.freeze(candidates),
  });
  cache.set(pathData, result);
  return result;
}

/**
 * The character a glyph outline draws, or null when the path draws nothing
 * or nothing is close enough. See the module comment for the method.
 */
export function recognizeGlyph(pathData: string, options: RecognizeOptions = {}): GlyphMatch | null {
  const maxDistance = options.maxDistance ?? MATCH_THRESHOLD;
  const a = analyseGlyph(pathData, options);
  const top = a?.candidates[0];
  if (a === null || top === undefined || !(top.distance <= maxDistance)) return null;
  return {
    char: top.char,
    distance: top.distance,
    confidence: maxDistance > 0 ? Math.max(0, 1 - top.distance / maxDistance) : 1,
    face: top.face,
    bbox: { ...a.bbox },
    contours: a.contours,
    candidates: a.candidates.map((c) => ({ ...c, box: { ...c.box } })),
  };
}
