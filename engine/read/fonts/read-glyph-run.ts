/**
 * Reads a run of glyph outlines (text exported as paths) back into a string.
 *
 * Each glyph comes with the matrix that places its outline in the world
 * (SVG user space, y down); the matrix is expected to map the glyph's own
 * origin, on the baseline at the pen position, as fonts and outline-text
 * exports define it. The run's baseline direction is that of the first
 * glyph's matrix, so rotated text reads as well as horizontal text.
 *
 * 1. Each outline is matched alone (recognize-glyph.ts); candidates close to
 *    the best one are kept as look-alikes.
 * 2. The em size is the one most glyphs agree on (each look-alike proposes
 *    observed height / reference height), so a few glyphs read in the wrong
 *    case cannot pull it.
 * 3. Glyphs are split into lines across the baseline and ordered along it.
 * 4. Among look-alikes the one whose height and place above the baseline fit
 *    the em size best is chosen (l / I, o / O, x / ×, - / −), compared within
 *    the face most glyphs matched; then letters are preferred among letters
 *    and digits among digits of the same word (0 / O, 1 / l).
 * 5. A space is put where the pen step exceeds the first glyph's advance by
 *    a share of the em. Advances are the references', stretched by the
 *    median ratio of the run's steps to them (so narrower or wider faces
 *    than the references work); in a monospaced run the common step is the
 *    advance.
 * 6. Glyphs set smaller and raised above the line become superscript
 *    characters where Unicode has them (digits, minus, plus).
 *
 * When the outlines are already placed in the world (their origin far from
 * their ink), there is no baseline or pen position: the run is read from ink
 * boxes alone, along the first matrix's x axis.
 */
import { analyseGlyph, MATCH_THRESHOLD, type GlyphAnalysis, type GlyphCandidate } from './recognize-glyph.js';
import type { Box } from './glyph-outline.js';
import { referenceGlyph, typicalAdvance } from './glyph-references.js';
import type { FaceId } from './font-files.js';

/** `[a, b, c, d, e, f]` as in SVG `matrix(a b c d e f)`: (x, y) ↦ (a·x + c·y + e, b·x + d·y + f). */
export type GlyphMatrix = readonly [number, number, number, number, number, number];

export interface PlacedGlyph {
  /** Outline path data in the glyph's own units. */
  pathData: string;
  /** From glyph units to world units. */
  matrix: GlyphMatrix;
}

export interface WorldBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface RunGlyph {
  /** Index in the input array. */
  index: number;
  /** The character read, or null when no reference is close enough. */
  char: string | null;
  /** Outline distance of the chosen character (null when unrecognised). */
  distance: number | null;
  confidence: number;
  /** Set smaller and raised: read as a superscript. */
  superscript: boolean;
  /** Ink box in world units. */
  bbox: WorldBox;
}

export interface GlyphRunReading {
  /** The text read; lines joined by "\n"; U+FFFD for glyphs not recognised. */
  text: string;
  /** Mean glyph confidence (0 … 1); 0 for a run without ink. */
  confidence: number;
  /** Ink box of the whole run in world units; null for a run without ink. */
  bbox: WorldBox | null;
  /** Estimated font size (em) in world units; null when no glyph could tell. */
  fontSize: number | null;
  /** Baseline direction in world degrees (0: left to right; −90: bottom to top on screen). */
  angle: number;
  /** Glyphs with ink, in reading order. */
  glyphs: RunGlyph[];
  /** Number of glyphs with ink that were not recognised. */
  unrecognised: number;
}

export interface ReadGlyphRunOptions {
  /** Acceptance threshold of a glyph's outline distance (default MATCH_THRESHOLD). */
  maxDistance?: number;
  /**
   * A space is put where the pen gap exceeds this share of the font size
   * (default 0.15; spaces are 0.25–0.35 em in proportional faces, e.g.
   * 0.318 em in DejaVu Sans).
   */
  spaceGap?: number;
}

/** Thrown for input that is not a list of placed glyphs. */
export class GlyphRunError extends Error {
  override readonly name = 'GlyphRunError';
}

/** Candidates this far (outline distance) behind the best one are look-alikes weighed by size. */
const LOOKALIKE_MARGIN = 0.05;
/** Em proposals within this (natural log) of each other agree. */
const EM_TOLERANCE = 0.05;
/** Penalty for a letter among digits or a digit among letters. */
const W_CONTEXT = 0.02;
/** Characters that may stand between the digits of a number. */
const NUMBER_PUNCTUATION = new Set([':', '.', ',', '-', '\u2212', '+', '%', '/', '\u00d7', '\u00b0', '(', ')']);
/** A run is monospaced when this share of its pen steps lie within MONO_TOLERANCE of their median. */
const MONO_SHARE = 0.7;
const MONO_TOLERANCE = 0.03;
/** Outline distances up to this mean the glyph is from that very reference face. */
const EXACT_FACE_DISTANCE = 0.01;
/** Steps of one letter case needed for a width ratio of its own. */
const MIN_CLASS_STEPS = 3;
/** Steps whose ratio differs from the overall one by more than this share do not count for a case's ratio. */
const CLASS_RATIO_SPREAD = 0.25;
/** Bounds of the run's pen-step to reference-advance ratio. */
const MIN_WIDTH_FACTOR = 0.7;
const MAX_WIDTH_FACTOR = 1.4;
/** Weight of the size / baseline-position error (in em) in choosing among look-alikes. */
const W_FIT = 0.5;
/** Reference glyphs shorter than this (em) do not vote on the font size. */
const MIN_VOTING_HEIGHT = 0.3;
/** Glyphs whose origin lies further than this many glyph sizes from their ink are taken as already placed. */
const ORIGIN_REACH = 4;
/** A space also needs this much clear ink gap (share of the font size) between its neighbours. */
const MIN_INK_GAP = 0.1;
/** Without advances, a space needs an ink gap of this share of the font size. */
const INK_SPACE_GAP = 0.27;
/** Baseline offsets (share of the font size) beyond which glyphs are on another line. */
const LINE_GAP = 0.7;
/** A glyph at most this share of the run's scale, raised at least RAISE em, is a superscript. */
const SUPERSCRIPT_SCALE = 0.85;
const SUPERSCRIPT_RAISE = 0.15;

const SUPERSCRIPTS: Readonly<Record<string, string>> = {
  '0': '\u2070', '1': '\u00b9', '2': '\u00b2', '3': '\u00b3', '4': '\u2074',
  '5': '\u2075', '6': '\u2076', '7': '\u2077', '8': '\u2078', '9': '\u2079',
  '-': '\u207b', '\u2212': '\u207b', '+': '\u207a',
};

interface Work {
  index: number;
  analysis: GlyphAnalysis;
  /** Linear scale of the matrix (world units per glyph unit). */
  scale: number;
  /** Origin position along and across the run's baseline (world units). */
  along: number;
  across: number;
  /** Ink extent along and across the baseline (world units). */
  inkAlong0: number;
  inkAlong1: number;
  inkAcross0: number;
  inkAcross1: number;
  world: WorldBox;
  chosen: GlyphCandidate | null;
  superscript: boolean;
  /** Em size of this glyph in world units. */
  em: number;
}

function checkInput(glyphs: readonly PlacedGlyph[]): void {
  if (!Array.isArray(glyphs)) throw new GlyphRunError('glyphs must be an array of {pathData, matrix}');
  glyphs.forEach((g, i) => {
    if (g === null || typeof g !== 'object') throw new GlyphRunError(`glyph ${i} is not an object`);
    if (typeof g.pathData !== 'string') throw new GlyphRunError(`glyph ${i}: pathData must be a string`);
    const m = g.matrix;
    if (!Array.isArray(m) || m.length !== 6 || !m.every((v) => typeof v === 'number' && Number.isFinite(v))) {
      throw new GlyphRunError(`glyph ${i}: matrix must be six finite numbers`);
    }
  });
}

function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 === 1 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

/** The candidates close enough to the best one to be weighed by size and context. */
function lookalikes(a: GlyphAnalysis, maxDistance: number): GlyphCandidate[] {
  const top = a.candidates[0];
  if (top === undefined || top.distance > maxDistance) return [];
  return a.candidates.filter((c) => c.distance <= top.distance + LOOKALIKE_MARGIN && c.distance <= maxDistance);
}

type LetterCase = 'upper' | 'lower' | 'other';

function caseOf(char: string): LetterCase {
  if (/\p{Lu}/u.test(char)) return 'upper';
  if (/\p{Ll}/u.test(char)) return 'lower';
  return 'other';
}

function kindOf(char: string | undefined): 'letter' | 'digit' | 'other' {
  if (char === undefined) return 'other';
  if (/\p{L}/u.test(char)) return 'letter';
  if (/\p{N}/u.test(char)) return 'digit';
  return 'other';
}

/**
 * The em size most glyphs agree on. Every look-alike of every glyph proposes
 * one (observed height over the reference's height); the proposal supported
 * by the most glyphs within ±EM_TOLERANCE wins, so a glyph read in the wrong
 * case (o for O) cannot pull the estimate. Short references (punctuation)
 * vote only when nothing else can. Null when no glyph was recognised.
 */
function consensusEm(items: { height: number; candidates: GlyphCandidate[] }[]): number | null {
  for (const minHeight of [MIN_VOTING_HEIGHT, 0.05]) {
    const votes: { log: number; item: number; weight: number }[] = [];
    items.forEach((it, i) => {
      it.candidates.forEach((c, rank) => {
        const refH = c.box.yMax - c.box.yMin;
        if (refH < minHeight || !(it.height > 0)) return;
        votes.push({ log: Math.log(it.height / refH), item: i, weight: rank === 0 ? 1 : 0.9 });
      });
    });
    if (votes.length === 0) continue;
    votes.sort((p, q) => p.log - q.log);
    let bestScore = -1;
    let bestLogs: number[] = [];
    for (let a = 0; a < votes.length; a++) {
      const centre = votes[a]!.log;
      const perItem = new Map<number, { weight: number; log: number }>();
      for (let b = a; b >= 0 && centre - votes[b]!.log <= EM_TOLERANCE; b--) keep(perItem, votes[b]!);
      for (let b = a + 1; b < votes.length && votes[b]!.log - centre <= EM_TOLERANCE; b++) keep(perItem, votes[b]!);
      let score = 0;
      for (const v of perItem.values()) score += v.weight;
      if (score > bestScore + 1e-9) {
        bestScore = score;
        bestLogs = [...perItem.values()].map((v) => v.log);
      }
    }
    return Math.exp(median(bestLogs)!);
  }
  return null;
}

function keep(perItem: Map<number, { weight: number; log: number }>, v: { log: number; item: number; weight: number }): void {
  const prev = perItem.get(v.item);
  if (prev === undefined || v.weight > prev.weight) perItem.set(v.item, { weight: v.weight, log: v.log });
}

/** Reads a run of placed glyph outlines as text. */
export function readGlyphRun(glyphs: readonly PlacedGlyph[], options: ReadGlyphRunOptions = {}): GlyphRunReading {
  checkInput(glyphs);
  const maxDistance = options.maxDistance ?? MATCH_THRESHOLD;
  const spaceGap = options.spaceGap ?? 0.15;

  // Direction of the run from the first glyph with an invertible matrix and ink.
  let ux = 1, uy = 0;
  let ox = 0, oy = 0;
  let haveFrame = false;
  const raw: { index: number; g: PlacedGlyph; yUp: boolean }[] = [];
  for (let i = 0; i < glyphs.length; i++) {
    const g = glyphs[i]!;
    const [a, b, c, d] = g.matrix;
    const det = a * d - b * c;
    if (det === 0 || g.pathData.trim() === '') continue;
    raw.push({ index: i, g, yUp: det < 0 });
  }

  // Baseline mode: every glyph's origin lies near its own ink.
  const analysed: { index: number; g: PlacedGlyph; yUp: boolean }[] = [];
  let baselineMode = true;
  for (const r of raw) {
    const a = analyseGlyph(r.g.pathData, { yUp: r.yUp, baselineAtZero: true });
    if (a === null) continue;
    const b = a.bbox;
    const size = Math.max(b.xMax - b.xMin, b.yMax - b.yMin);
    const dx = Math.max(b.xMin, 0, -b.xMax);
    const dy = Math.max(b.yMin, 0, -b.yMax);
    if (Math.hypot(dx, dy) > ORIGIN_REACH * size) baselineMode = false;
    analysed.push(r);
  }

  const work: Work[] = [];
  for (const r of analysed) {
    const analysis = analyseGlyph(r.g.pathData, { yUp: r.yUp, baselineAtZero: baselineMode })!;
    const [a, b, c, d, e, f] = r.g.matrix;
    if (!haveFrame) {
      const len = Math.hypot(a, b);
      ux = a / len;
      uy = b / len;
      ox = e;
      oy = f;
      haveFrame = true;
    }
    // Up on screen, for text running along u in a y-down world.
    const vx = uy, vy = -ux;
    const box = analysis.bbox;
    // analysis boxes are y-up; back to the glyph's own y for y-down input
    const glyphBox: Box = r.yUp ? box : { xMin: box.xMin, xMax: box.xMax, yMin: -box.yMax, yMax: -box.yMin };
    let wx0 = Infinity, wy0 = Infinity, wx1 = -Infinity, wy1 = -Infinity;
    let al0 = Infinity, al1 = -Infinity, ac0 = Infinity, ac1 = -Infinity;
    for (const [gx, gy] of [
      [glyphBox.xMin, glyphBox.yMin], [glyphBox.xMax, glyphBox.yMin],
      [glyphBox.xMin, glyphBox.yMax], [glyphBox.xMax, glyphBox.yMax],
    ] as const) {
      const wx = a * gx + c * gy + e, wy = b * gx + d * gy + f;
      wx0 = Math.min(wx0, wx); wx1 = Math.max(wx1, wx);
      wy0 = Math.min(wy0, wy); wy1 = Math.max(wy1, wy);
      const p = (wx - ox) * ux + (wy - oy) * uy;
      const q = (wx - ox) * vx + (wy - oy) * vy;
      al0 = Math.min(al0, p); al1 = Math.max(al1, p);
      ac0 = Math.min(ac0, q); ac1 = Math.max(ac1, q);
    }
    work.push({
      index: r.index,
      analysis,
      scale: Math.sqrt(Math.abs(a * d - b * c)),
      along: (e - ox) * ux + (f - oy) * uy,
      across: (e - ox) * vx + (f - oy) * vy,
      inkAlong0: al0, inkAlong1: al1, inkAcross0: ac0, inkAcross1: ac1,
      world: { x: wx0, y: wy0, width: wx1 - wx0, height: wy1 - wy0 },
      chosen: null,
      superscript: false,
      em: 0,
    });
  }

  const angle = (Math.atan2(uy, ux) * 180) / Math.PI;
  if (work.length === 0) {
    return { text: '', confidence: 0, bbox: null, fontSize: null, angle, glyphs: [], unrecognised: 0 };
  }

  // Em size: in glyph units in baseline mode (shared by the run's outlines,
  // whatever each glyph's matrix), in world units otherwise.
  const emUnits = consensusEm(
    work.map((w) => ({
      height: (w.analysis.bbox.yMax - w.analysis.bbox.yMin) * (baselineMode ? 1 : w.scale),
      candidates: lookalikes(w.analysis, maxDistance),
    })),
  );
  for (const w of work) w.em = emUnits === null ? 0 : baselineMode ? emUnits * w.scale : emUnits;
  const scaleMedian = median(work.map((w) => w.scale))!;
  const fontSize = emUnits === null ? null : baselineMode ? emUnits * scaleMedian : emUnits;

  // Lines across the baseline, then order along it.
  const em = fontSize ?? median(work.map((w) => w.inkAcross1 - w.inkAcross0))!;
  const level = (w: Work): number => (baselineMode ? w.across : (w.inkAcross0 + w.inkAcross1) / 2);
  const byLevel = [...work].sort((p, q) => level(q) - level(p));
  const lines: Work[][] = [];
  for (const w of byLevel) {
    const line = lines[lines.length - 1];
    if (line !== undefined && level(line[line.length - 1]!) - level(w) <= LINE_GAP * em) line.push(w);
    else lines.push([w]);
  }
  const start = (w: Work): number => (baselineMode ? w.along : w.inkAlong0);
  for (const line of lines) line.sort((p, q) => start(p) - start(q));

  // Choose among look-alikes: by size and height above the baseline, then
  // by the kind of character (letter or digit) of the neighbours.
  let runFace: FaceId | undefined;
  const fitOf = (w: Work, c: GlyphCandidate): number => {
    if (w.em <= 0) return 0;
    // Heights compare within one face: faces differ in x-height and cap height.
    const ref = (runFace === undefined ? undefined : referenceGlyph(c.char, runFace)?.box) ?? c.box;
    const unitsPerEm = w.em / w.scale;
    const bb = w.analysis.bbox;
    const bottom = bb.yMin / unitsPerEm, top = bb.yMax / unitsPerEm;
    return baselineMode
      ? Math.abs(bottom - ref.yMin) + Math.abs(top - ref.yMax)
      : Math.abs(top - bottom - (ref.yMax - ref.yMin));
  };
  // Pass 1: shape and size.
  for (const w of work) {
    let bestScore = Infinity;
    for (const c of lookalikes(w.analysis, maxDistance)) {
      const score = c.distance + W_FIT * fitOf(w, c);
      if (score < bestScore) [w.chosen, bestScore] = [c, score];
    }
  }
  // The face most glyphs matched.
  const faceVotes = new Map<FaceId, number>();
  for (const w of work) if (w.chosen !== null) faceVotes.set(w.chosen.face, (faceVotes.get(w.chosen.face) ?? 0) + 1);
  runFace = [...faceVotes].sort((p, q) => q[1] - p[1])[0]?.[0];

  // Pen steps between neighbours, in em, with the character read first.
  const steps: { char: GlyphCandidate; step: number }[] = [];
  if (baselineMode) {
    for (const line of lines) {
      for (let k = 1; k < line.length; k++) {
        const prev = line[k - 1]!;
        if (prev.chosen !== null && prev.em > 0) steps.push({ char: prev.chosen, step: (line[k]!.along - prev.along) / prev.em });
      }
    }
  }
  // A monospaced run: most steps equal. Its advance is that step, whatever
  // the characters.
  const commonStep = median(steps.map((s) => s.step));
  const monospaced =
    commonStep !== null &&
    steps.length >= 3 &&
    steps.filter((s) => Math.abs(s.step - commonStep) <= MONO_TOLERANCE * commonStep).length >= MONO_SHARE * steps.length;
  // Otherwise each glyph advances by a reference advance: its own face's
  // when the outline matched that face almost exactly, else the median over
  // the proportional reference faces (a near match in another face says
  // little about the advance). That advance is stretched by the median ratio
  // of the run's steps to those advances (a narrower or wider face than the
  // references); steps that hold a space are too few to move the median.
  // Capitals, small letters and the rest each get their own ratio where the
  // run has enough of them, since faces differ in how wide their capitals
  // are next to their small letters (steps far from the overall ratio,
  // mostly those that hold a space, are left out of those).
  const baseAdvance = (c: GlyphCandidate): number =>
    c.distance <= EXACT_FACE_DISTANCE ? c.advance : (typicalAdvance(c.char) ?? c.advance);
  const clamp = (r: number): number => Math.min(MAX_WIDTH_FACTOR, Math.max(MIN_WIDTH_FACTOR, r));
  const wide = steps.filter((s) => baseAdvance(s.char) >= 0.25);
  const overall = clamp(median(wide.map((s) => s.step / baseAdvance(s.char))) ?? 1);
  const classFactor = new Map<LetterCase, number>();
  for (const cls of ['upper', 'lower', 'other'] as const) {
    const r = wide
      .filter((s) => caseOf(s.char.char) === cls)
      .map((s) => s.step / baseAdvance(s.char))
      .filter((ratio) => Math.abs(ratio / overall - 1) <= CLASS_RATIO_SPREAD);
    classFactor.set(cls, r.length >= MIN_CLASS_STEPS ? clamp(median(r)!) : overall);
  }
  /** Expected pen step (em) after a glyph read as c. */
  const advanceOf = (c: GlyphCandidate): number =>
    monospaced ? commonStep! : baseAdvance(c) * classFactor.get(caseOf(c.char))!;

  // Is there a space between two neighbours on a line?
  const spaceBetween = (prev: Work, w: Work): boolean => {
    if (baselineMode && prev.chosen !== null && prev.em > 0) {
      const penGap = w.along - (prev.along + advanceOf(prev.chosen) * prev.em);
      return penGap > spaceGap * em && w.inkAlong0 - prev.inkAlong1 > MIN_INK_GAP * em;
    }
    return w.inkAlong0 - prev.inkAlong1 > INK_SPACE_GAP * em;
  };

  // Pass 2: heights within the run's face, and the kind of character
  // (letter or digit) of the other glyphs of the same word that are not
  // themselves ambiguous. A word made only of ambiguous glyphs and number
  // punctuation (00:00, 10) is read as a number: charts label with numbers
  // far more often than with words like "Ol".
  for (const line of lines) {
    const wordOf: number[] = [];
    line.forEach((w, k) => wordOf.push(k === 0 ? 0 : wordOf[k - 1]! + (spaceBetween(line[k - 1]!, w) ? 1 : 0)));
    const kinds = line.map((w) => {
      const set = new Set(lookalikes(w.analysis, maxDistance).map((c) => kindOf(c.char)));
      if (set.size === 1) return [...set][0]!;
      return set.has('digit') ? 'digit-or-letter' : 'mixed';
    });
    line.forEach((w, k) => {
      let letters = 0, digits = 0;
      let numeric = true;
      for (let j = 0; j < line.length; j++) {
        if (wordOf[j] !== wordOf[k]) continue;
        const kind = kinds[j];
        const char = line[j]!.chosen?.char;
        if (kind === 'mixed' || kind === 'letter' || (kind === 'other' && !NUMBER_PUNCTUATION.has(char ?? ''))) numeric = false;
        if (j === k) continue;
        if (kind === 'letter') letters++;
        else if (kind === 'digit') digits++;
      }
      const context =
        letters > digits ? 'letter' : digits > letters ? 'digit' : letters === 0 && numeric ? 'digit' : null;
      let bestScore = Infinity;
      for (const c of lookalikes(w.analysis, maxDistance)) {
        const kind = kindOf(c.char);
        const clash = context !== null && (kind === 'letter' || kind === 'digit') && kind !== context;
        const score = c.distance + W_FIT * fitOf(w, c) + (clash ? W_CONTEXT : 0);
        if (score < bestScore) [w.chosen, bestScore] = [c, score];
      }
    });
  }

  // Superscripts: smaller and raised above the line's baseline.
  if (baselineMode) {
    for (const line of lines) {
      const base = median(line.map((w) => w.across))!;
      const lineScale = median(line.map((w) => w.scale))!;
      for (const w of line) {
        if (w.scale <= SUPERSCRIPT_SCALE * lineScale && w.across - base >= SUPERSCRIPT_RAISE * em) {
          w.superscript = true;
        }
      }
    }
  }

  let text = '';
  const ordered: RunGlyph[] = [];
  let confidenceSum = 0;
  let unrecognised = 0;
  lines.forEach((line, li) => {
    if (li > 0) text += '\n';
    line.forEach((w, k) => {
      if (k > 0 && spaceBetween(line[k - 1]!, w)) text += ' ';
      let char: string | null = w.chosen?.char ?? null;
      if (char !== null && w.superscript) char = SUPERSCRIPTS[char] ?? char;
      const confidence = w.chosen === null ? 0 : Math.max(0, 1 - w.chosen.distance / maxDistance);
      if (w.chosen === null) unrecognised++;
      confidenceSum += confidence;
      text += char ?? '\uFFFD';
      ordered.push({
        index: w.index,
        char,
        distance: w.chosen?.distance ?? null,
        confidence,
        superscript: w.superscript,
        bbox: w.world,
      });
    });
  });

  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const w of work) {
    x0 = Math.min(x0, w.world.x);
    y0 = Math.min(y0, w.world.y);
    x1 = Math.max(x1, w.world.x + w.world.width);
    y1 = Math.max(y1, w.world.y + w.world.height);
  }
  return {
    text,
    confidence: confidenceSum / work.length,
    bbox: { x: x0, y: y0, width: x1 - x0, height: y1 - y0 },
    fontSize,
    angle,
    glyphs: ordered,
    unrecognised,
  };
}
