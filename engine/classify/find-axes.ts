/**
 * Axes from tick labels: texts that line up (a row under or over the plot, a
 * column beside it) and whose values fit a scale against their positions.
 */
import type { Box, TextItem } from '../read/scene.js';
import type { Axis, AxisName } from './chart.js';
import { centerX, centerY } from './boxes.js';
import { inferAxisScale, type AxisScale } from './scale/infer-axis.js';
import { parseAxisMultiplier } from './scale/parse-tick-label.js';

export interface LabelGroup {
  direction: 'horizontal' | 'vertical';
  texts: TextItem[];
  /** Where the labels sit across the axis (y of a row, x of a column). */
  across: number;
  scale: AxisScale;
}

const isUpright = (t: TextItem): boolean => Math.abs(t.rotation) < 1;

/** Clusters numbers into runs whose neighbours are within `tol`. */
function clusterBy<T>(items: T[], key: (t: T) => number, tol: (t: T) => number): T[][] {
  const sorted = [...items].sort((a, b) => key(a) - key(b));
  const out: T[][] = [];
  let cur: T[] = [];
  let last = -Infinity;
  for (const t of sorted) {
    const k = key(t);
    if (cur.length > 0 && k - last > tol(t)) {
      out.push(cur);
      cur = [];
    }
    cur.push(t);
    last = k;
  }
  if (cur.length > 0) out.push(cur);
  return out;
}

/** Candidate label rows and columns with a fitted scale each. */
export function findLabelGroups(texts: TextItem[], excluded: Set<number>): LabelGroup[] {
  const usable = texts.filter((t) => !excluded.has(t.index) && t.content.length <= 40);
  const groups: LabelGroup[] = [];

  // Rows: same anchor y (baseline for upright text; anchor point for rotated tick labels).
  for (const rotatedRow of [false, true]) {
    const pool = usable.filter((t) => isUpright(t) !== rotatedRow);
    for (const row of clusterBy(pool, (t) => t.y, (t) => Math.max(1, 0.3 * t.fontSize))) {
      const distinct = dedupeByPosition(row, (t) => (rotatedRow ? t.x : centerX(t.bbox)));
      if (distinct.length < 2) continue;
      if (!rotatedRow && !isSpreadAlong(distinct, 'horizontal')) continue;
      const posOf = (t: TextItem): number => (rotatedRow ? t.x : centerX(t.bbox));
      let members = distinct;
      let scale = safeInfer(members.map((t) => ({ text: t.content, position: posOf(t) })));
      if ((!scale || scale.scale === 'band') && distinct.length >= 4) {
        // Some libraries pull the end labels inward (anchored start / end) so they stay inside the figure.
        const majority = mostCommon(distinct.map((t) => t.anchor));
        const trimmed = distinct.filter((t, k) => !((k === 0 || k === distinct.length - 1) && t.anchor !== majority));
        if (trimmed.length < distinct.length && trimmed.length >= 2) {
          const retry = safeInfer(trimmed.map((t) => ({ text: t.content, position: posOf(t) })));
          if (retry && retry.scale !== 'band') {
            scale = retry;
            members = trimmed;
          }
        }
      }
      if (scale) groups.push({ direction: 'horizontal', texts: members, across: median(members.map((t) => t.y)), scale });
    }
  }

  // Columns: upright texts sharing an anchor x, per anchor kind.
  for (const anchor of ['start', 'middle', 'end'] as const) {
    const pool = usable.filter((t) => isUpright(t) && t.anchor === anchor);
    for (const col of clusterBy(pool, (t) => t.x, (t) => Math.max(1, 0.25 * t.fontSize))) {
      const distinct = dedupeByPosition(col, (t) => centerY(t.bbox));
      if (distinct.length < 2) continue;
      const labels = distinct.map((t) => ({ text: t.content, position: centerY(t.bbox) }));
      const scale = safeInfer(labels);
      if (scale) groups.push({ direction: 'vertical', texts: distinct, across: median(distinct.map((t) => t.x)), scale });
    }
  }
  // Right-aligned columns written with start anchors at varying x (some exporters) are
  // caught by the right edges of their boxes.
  const startPool = usable.filter((t) => isUpright(t) && t.anchor !== 'end');
  for (const col of clusterBy(startPool, (t) => t.bbox.x + t.bbox.width, (t) => Math.max(0.8, 0.15 * t.fontSize))) {
    const distinct = dedupeByPosition(col, (t) => centerY(t.bbox));
    if (distinct.length < 3) continue;
    if (new Set(distinct.map((t) => Math.round(t.x))).size === 1) continue; // already a column above
    const labels = distinct.map((t) => ({ text: t.content, position: centerY(t.bbox) }));
    const scale = safeInfer(labels);
    if (scale && (scale.scale !== 'band' || distinct.every((t) => t.fromGlyphs))) {
      groups.push({ direction: 'vertical', texts: distinct, across: median(distinct.map((t) => t.bbox.x + t.bbox.width)), scale });
    }
  }
  return groups;
}

function safeInfer(labels: { text: string; position: number }[]): AxisScale | null {
  try {
    const s = inferAxisScale(labels);
    if (s.scale === 'unfitted') return null;
    if (s.scale === 'band' && !s.band.evenlySpaced && s.band.categories.length > 2) {
      // Category labels of a band axis are evenly spaced; allow rounding of a pixel or two.
      const step = s.band.step ?? 0;
      if (!(step > 0 && s.band.maxDeviation <= 0.12 * step)) return null;
    }
    return s;
  } catch {
    return null;
  }
}

function dedupeByPosition(texts: TextItem[], pos: (t: TextItem) => number): TextItem[] {
  const sorted = [...texts].sort((a, b) => pos(a) - pos(b));
  const out: TextItem[] = [];
  for (const t of sorted) {
    const prev = out[out.length - 1];
    if (prev && Math.abs(pos(prev) - pos(t)) < 0.5 && prev.content === t.content) continue;
    out.push(t);
  }
  return out;
}

/** Row labels must not overlap each other (titles split into words do not form an axis). */
function isSpreadAlong(texts: TextItem[], _dir: 'horizontal'): boolean {
  const sorted = [...texts].sort((a, b) => a.bbox.x - b.bbox.x);
  let gaps = 0;
  for (let k = 1; k < sorted.length; k++) {
    const gap = sorted[k]!.bbox.x - (sorted[k - 1]!.bbox.x + sorted[k - 1]!.bbox.width);
    if (gap > 0.15 * sorted[k]!.fontSize) gaps++;
  }
  return gaps >= sorted.length - 1 - Math.floor((sorted.length - 1) / 4);
}

function mostCommon<T>(xs: T[]): T | undefined {
  const counts = new Map<T, number>();
  for (const x of xs) counts.set(x, (counts.get(x) ?? 0) + 1);
  return [...counts.entries()].sort((a, b) => b[1] - a[1])[0]?.[0];
}

export function median(xs: number[]): number {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

export interface ChosenAxes {
  x: LabelGroup | null;
  y: LabelGroup | null;
  y2: LabelGroup | null;
}

function groupScore(g: LabelGroup): number {
  const n = g.scale.ticks.length;
  const numeric = g.scale.scale !== 'band' ? 1.5 : 1;
  return n * numeric;
}

/**
 * Picks the x axis (a row) and the y axes (columns) around the region where
 * the non-text shapes are drawn.
 */
export function chooseAxes(groups: LabelGroup[], shapeBox: Box | null): ChosenAxes {
  const rows = groups.filter((g) => g.direction === 'horizontal');
  const cols = groups.filter((g) => g.direction === 'vertical');
  const cx = shapeBox ? shapeBox.x + shapeBox.width / 2 : 0;
  const cy = shapeBox ? shapeBox.y + shapeBox.height / 2 : 0;

  const rowOk = (g: LabelGroup): boolean => {
    if (!shapeBox) return true;
    // Labels of an x axis sit outside the band of the data, below or above it.
    const inside = g.across > shapeBox.y + 0.08 * shapeBox.height && g.across < shapeBox.y + shapeBox.height - 0.02 * shapeBox.height;
    return !inside || g.scale.ticks.length >= 4;
  };
  const x = pickBest(rows.filter(rowOk), (g) => groupScore(g) + (shapeBox && g.across > cy ? 0.5 : 0));
  const left = cols.filter((g) => !shapeBox || g.across <= cx);
  const rightCols = cols.filter((g) => shapeBox && g.across > cx && g.scale.scale !== 'band');
  const y = pickBest(left, (g) => groupScore(g) - (shapeBox ? Math.abs(g.across - shapeBox.x) / Math.max(shapeBox.width, 1) : 0))
    ?? pickBest(rightCols, groupScore);
  const y2 = y && y.across <= cx ? pickBest(rightCols.filter((g) => g.scale.ticks.length >= 3), groupScore) : null;
  return { x, y, y2: y2 && y2 !== y ? y2 : null };
}

function pickBest<T>(xs: T[], score: (t: T) => number): T | null {
  let best: T | null = null;
  let bestScore = -Infinity;
  for (const t of xs) {
    const s = score(t);
    if (s > bestScore) {
      best = t;
      bestScore = s;
    }
  }
  return best;
}

/** Turns a label group into an Axis, with tick positions optionally snapped to drawn tick marks. */
export function toAxis(name: AxisName, g: LabelGroup, tickMarks: number[] | null, range: [number, number] | null, multiplier?: TextItem | null): Axis {
  let labels = g.scale.ticks.map((t) => ({ text: t.text, position: t.position }));
  if (tickMarks && tickMarks.length >= 2) {
    const spacing = Math.abs(labels.length > 1 ? (labels[labels.length - 1]!.position - labels[0]!.position) / (labels.length - 1) : 10);
    labels = labels.map((l) => {
      let best = l.position;
      let bestD = 0.3 * spacing;
      for (const m of tickMarks) {
        const d = Math.abs(m - l.position);
        if (d < bestD) {
          bestD = d;
          best = m;
        }
      }
      return { text: l.text, position: best };
    });
  }
  let scale = g.scale;
  try {
    const multText = multiplier && parseAxisMultiplier(multiplier.content) ? multiplier.content : undefined;
    scale = inferAxisScale(labels, multText, range ? { range } : {});
    if (scale.scale === 'unfitted') scale = g.scale;
  } catch {
    scale = g.scale;
  }
  const byText = new Map(g.texts.map((t) => [t.content, t.index]));
  const direction = g.direction;
  if (scale.scale === 'band') {
    const bands = scale.band.categories.map((c) => ({ name: c.text, position: c.position }));
    return {
      name,
      direction,
      scale: 'band',
      ticks: bands.map((b) => ({ value: b.name, position: b.position, label: byText.get(b.name) ?? null })),
      fit: null,
      bands: direction === 'vertical' ? [...bands].reverse() : bands,
      domain: (direction === 'vertical' ? [...bands].reverse() : bands).map((b) => b.name),
      line: null,
    };
  }
  if (scale.scale === 'unfitted') throw new Error('unfitted axis');
  const fit = scale.fit;
  return {
    name,
    direction,
    scale: scale.scale === 'time' ? 'time' : scale.scale,
    ticks: scale.ticks.map((t) => ({ value: t.value ?? NaN, position: t.position, label: byText.get(t.text) ?? null })),
    fit: { a: fit.a, b: fit.b, residual: fit.residual },
    bands: null,
    domain: [...scale.domain].sort((p, q) => p - q),
    line: null,
  };
}

/** Position → data value through an axis's fitted scale. */
export function invertAxis(axis: Axis, position: number): number {
  if (!axis.fit) return NaN;
  const v = (position - axis.fit.b) / axis.fit.a;
  return axis.scale === 'log' ? 10 ** v : v;
}

/** Data value → position. */
export function forwardAxis(axis: Axis, value: number): number {
  if (!axis.fit) return NaN;
  const v = axis.scale === 'log' ? Math.log10(value) : value;
  return axis.fit.a * v + axis.fit.b;
}

/** The band category nearest a position (null when the axis has none within a band's width). */
export function nearestBand(axis: Axis, position: number): string | null {
  if (!axis.bands || axis.bands.length === 0) return null;
  let best: string | null = null;
  let bestD = Infinity;
  for (const b of axis.bands) {
    const d = Math.abs(b.position - position);
    if (d < bestD) {
      bestD = d;
      best = b.name;
    }
  }
  const step = axis.bands.length > 1 ? Math.abs(axis.bands[1]!.position - axis.bands[0]!.position) : Infinity;
  return bestD <= 0.75 * step ? best : null;
}

/** A numeric or time axis read as categories: its tick labels become the bands. */
export function axisAsBands(axis: Axis, texts: readonly { content: string }[], labelOf: (i: number) => string | null): Axis {
  void texts;
  const bands = axis.ticks
    .map((t) => ({ name: (t.label !== null ? labelOf(t.label) : null) ?? String(t.value), position: t.position }))
    .sort((a, b) => a.position - b.position);
  const ordered = axis.direction === 'vertical' ? [...bands].reverse() : bands;
  return { ...axis, scale: 'band', fit: null, bands: ordered, domain: ordered.map((b) => b.name), ticks: axis.ticks.map((t) => ({ ...t, value: (t.label !== null ? labelOf(t.label) : null) ?? String(t.value) })) };
}

/** Share of positions within a fifth of a tick step of some tick. */
export function shareOnTicks(axis: Axis, positions: number[]): number {
  if (positions.length === 0 || axis.ticks.length < 2) return 0;
  const ps = axis.ticks.map((t) => t.position).sort((a, b) => a - b);
  const step = (ps[ps.length - 1]! - ps[0]!) / (ps.length - 1);
  let on = 0;
  for (const p of positions) if (ps.some((t) => Math.abs(t - p) <= 0.2 * step)) on++;
  return on / positions.length;
}

/**
 * Band labels thinned by the plotting library ("Day 1", "Day 3", ...) while
 * marks sit on every category: when the labels count in a constant step and
 * marks fall between them, the skipped names are filled in.
 */
export function fillThinnedBands(axis: Axis, positions: number[]): Axis {
  if (axis.scale !== 'band' || !axis.bands || axis.bands.length < 2) return axis;
  const byPos = [...axis.bands].sort((a, b) => a.position - b.position);
  // Either clock times (HH:MM, counted in minutes) or a fixed text around a counting number.
  const clock = byPos.map((b) => /^(\d{1,2}):(\d{2})$/.exec(b.name.trim()));
  let nums: number[];
  let nameOf: (v: number) => string;
  if (clock.every((m) => m)) {
    nums = clock.map((m) => Number(m![1]) * 60 + Number(m![2]));
    const pad = clock[0]![1]!.length === 2;
    nameOf = (v) => `${String(Math.floor(v / 60) % 24).padStart(pad ? 2 : 1, '0')}:${String(v % 60).padStart(2, '0')}`;
  } else {
    const parts = byPos.map((b) => /^(.*?)(\d+)(\D*)$/.exec(b.name));
    if (parts.some((m) => !m)) return axis;
    const prefix = parts[0]![1]!;
    const suffix = parts[0]![3]!;
    if (parts.some((m) => m![1] !== prefix || m![3] !== suffix)) return axis;
    nums = parts.map((m) => Number(m![2]));
    nameOf = (v) => `${prefix}${v}${suffix}`;
  }
  const d = nums[1]! - nums[0]!;
  if (Math.abs(d) < 2 || !nums.every((v, k) => k === 0 || v - nums[k - 1]! === d)) return axis;
  // The finest step that puts marks on categories: try the divisors of d, largest gap first.
  const step0 = (byPos[byPos.length - 1]!.position - byPos[0]!.position) / (byPos.length - 1);
  let parts = 0;
  for (const n of [2, 3, 4, 5, 6, 10, 12, 15, 20, 30, 60].filter((n) => Math.abs(d) % n === 0 && n <= Math.abs(d))) {
    const sub0 = step0 / n;
    const onGrid = positions.filter((p) => {
      const k = (p - byPos[0]!.position) / sub0;
      return Math.abs(k - Math.round(k)) < 0.15;
    }).length;
    if (onGrid >= 0.9 * positions.length) {
      parts = n;
      break;
    }
  }
  if (parts === 0) return axis;
  const step = step0;
  const sub = step / parts;
  const unit = d / parts;
  const between = positions.filter((p) => byPos.every((b) => Math.abs(b.position - p) > 0.25 * step)).length;
  if (between < 0.25 * positions.length) return axis;
  const filled: { name: string; position: number }[] = [];
  const lo = Math.min(...positions, byPos[0]!.position);
  const hi = Math.max(...positions, byPos[byPos.length - 1]!.position);
  const first = Math.floor((lo - byPos[0]!.position) / sub - 0.25);
  const last = Math.ceil((hi - byPos[0]!.position) / sub + 0.25);
  for (let k = first; k <= last; k++) {
    const value = nums[0]! + k * unit;
    if (value < 0) continue;
    filled.push({ name: nameOf(value), position: byPos[0]!.position + k * sub });
  }
  const ordered = axis.direction === 'vertical' ? [...filled].reverse() : filled;
  return { ...axis, bands: ordered, domain: ordered.map((b) => b.name) };
}
