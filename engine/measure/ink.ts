/**
 * Ink by role: how much of what the figure prints is data, guides, labels or
 * decoration (the data-ink ratio of Tufte 1983, p. 93, made measurable).
 *
 * Geometric ink of an item, in world units² of full-strength ink:
 * - shapes: filled area × fill opacity × strength(fill) + stroke length ×
 *   stroke width × stroke opacity × strength(stroke); the inner half of the
 *   stroke of a filled closed shape lies on its own fill and is counted once,
 *   as stroke; dashed strokes count half (the scene keeps only that a stroke
 *   is dashed); gradient fills count their opacity and strength averaged
 *   over the shape (measure/gradient-ink.ts);
 * - text: the area of its glyph outlines (from the bundled face the text was
 *   measured with) × opacity × strength(fill) — exact, not a coverage
 *   constant; `TEXT_INK_COVERAGE` (0.225 of advance × size, measured on
 *   DejaVu Sans) is only the fallback when no face can be read;
 * - images: area × opacity (their colours are not read).
 * Shapes count the area and outline length inside their clip rectangle and
 * the viewBox (a stroke along the edge keeps half its width).
 *
 * Overlaps: each part counts only as far as the items painted after it let
 * it show (measure/visibility.ts): a plot background under bars, a shadow
 * under its wedge, points piled on points, a spine drawn twice are not
 * counted twice. An opaque exact repaint of an item counts once.
 *
 * Strength: paint that equals what is behind it prints nothing. The strength
 * of a colour against the colour behind it is the largest difference of the
 * three gamma-encoded sRGB channels (0..1): black on white 1, any saturated
 * colour on white 1, #e5e5e5 on white 0.1, white on white 0. On white paper
 * it is the largest of the amounts 1 − R, 1 − G, 1 − B. It is linear in
 * coverage under the source-over compositing SVG renderers use, so an
 * antialiased edge pixel counts in proportion to how much of it is covered.
 * What is behind an item is the composite of the earlier filled shapes whose
 * box holds the item's whole box (point marks excepted), over white paper: a
 * white page over white paper is no ink; a grey page is decoration.
 *
 * Buckets: marks are data; guides and legend swatches/boxes are guides;
 * labels (legend text included) are labels; decoration (page, shadows, 3D
 * faces, ornaments) is decoration.
 */
import type { Chart, Role, SubRole } from '../classify/chart.js';
import type { Rgba } from '../color/types.js';
import type { Box, SceneItem, ShapeItem } from '../read/scene.js';
import type { XmlDocument } from '../read/xml-tree.js';
import { clippedArea, clippedStrokeLength, polylineBounds } from './clip-geometry.js';
import { glyphRunInk, TEXT_INK_COVERAGE } from './glyph-ink.js';
import { gradientInk } from './gradient-ink.js';
import { buildSurfaceIndex, type SurfaceIndex } from './surfaces.js';
import { visibilityOf } from './visibility.js';

export type InkBucket = 'data' | 'guides' | 'labels' | 'decoration';

export interface InkShares {
  data: number;
  guides: number;
  labels: number;
  decoration: number;
}

export interface InkMeasure {
  /** Shares of all ink, summing to 1 (all 0 when nothing is inked). */
  shares: InkShares;
  /** Ink per bucket in world units² of full-strength ink, and their sum. */
  totals: InkShares & { total: number };
  /** Ink of each scene item, by scene index. */
  byItem: Float64Array;
  /** Strength (0..1) of each item's main paint against what is behind it; NaN when it paints nothing. */
  strength: Float64Array;
  /** Ink per sub-role. */
  bySub: Partial<Record<SubRole, number>>;
  /** Share (0..1) of each item's fill left visible by what is painted over it. */
  fillShown: Float64Array;
}

/** Fraction of a dashed stroke taken as inked. */
export const DASHED_INK_FRACTION = 0.5;

const BUCKET: Record<Role, InkBucket> = {
  mark: 'data',
  guide: 'guides',
  legend: 'guides',
  label: 'labels',
  decoration: 'decoration',
};

export function bucketOf(role: Role): InkBucket {
  return BUCKET[role];
}

/** Strength of colour `c` painted over `behind`: the largest channel difference, 0..1. */
export function inkStrength(c: Rgba, behind: Rgba): number {
  return Math.max(Math.abs(c.r - behind.r), Math.abs(c.g - behind.g), Math.abs(c.b - behind.b));
}

function clippedBox(bbox: Box, clip: Box | null): Box {
  if (clip === null) return bbox;
  const x0 = Math.max(bbox.x, clip.x);
  const y0 = Math.max(bbox.y, clip.y);
  const x1 = Math.min(bbox.x + bbox.width, clip.x + clip.width);
  const y1 = Math.min(bbox.y + bbox.height, clip.y + clip.height);
  if (x1 < x0 || y1 < y0) return bbox;
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/** Centre and box of an item for asking what is behind it. */
function probeOf(it: SceneItem): { x: number; y: number; box: Box } {
  const b = clippedBox(it.bbox, it.clip);
  return { x: b.x + b.width / 2, y: b.y + b.height / 2, box: b };
}

interface ItemInk {
  ink: number;
  strength: number;
}

/** Area and outline length a shape paints: inside its clip rectangle and the drawing's viewBox. */
function paintedGeometry(it: ShapeItem, viewBox: Box): { area: number; length: number } {
  const c = it.clip ? intersect(it.clip, viewBox) : viewBox;
  const b = polylineBounds(it.polylines);
  const pad = it.strokeWidth / 2;
  if (!c || !b) return { area: 0, length: 0 };
  if (b.x - pad >= c.x && b.y - pad >= c.y && b.x + b.width + pad <= c.x + c.width && b.y + b.height + pad <= c.y + c.height) {
    return { area: it.area, length: it.length };
  }
  return { area: it.area > 0 ? clippedArea(it.polylines, c) : 0, length: clippedStrokeLength(it.polylines, it.closed, c, it.strokeWidth) };
}

function intersect(a: Box, b: Box): Box | null {
  const x0 = Math.max(a.x, b.x);
  const y0 = Math.max(a.y, b.y);
  const x1 = Math.min(a.x + a.width, b.x + b.width);
  const y1 = Math.min(a.y + a.height, b.y + b.height);
  return x1 >= x0 && y1 >= y0 ? { x: x0, y: y0, width: x1 - x0, height: y1 - y0 } : null;
}

function itemInk(doc: XmlDocument, viewBox: Box, it: SceneItem, behind: Rgba, fillShown: number, strokeShown: number): ItemInk {
  switch (it.kind) {
    case 'shape': {
      const { area: paintedArea, length } = paintedGeometry(it, viewBox);
      let ink = 0;
      let strength = NaN;
      const hasStroke = it.stroke.kind !== 'none' && it.strokeWidth > 0 && it.stroke.opacity > 0;
      const strokeStrength = hasStroke ? (it.stroke.color ? inkStrength(it.stroke.color, behind) : 1) : 0;
      if (it.fill.kind !== 'none' && it.fill.opacity > 0 && paintedArea > 0) {
        const s = it.fill.color ? inkStrength(it.fill.color, behind) : 1;
        // The inner half of the item's own stroke lies on its fill: count it once, as stroke.
        let area = paintedArea;
        if (hasStroke && it.closed.some(Boolean)) area = Math.max(0, area - (length * it.strokeWidth) / 2);
        // Gradients: opacity and strength averaged over the shape (the paint's opacity holds the stops' mean alpha).
        const g = it.fill.kind === 'gradient' ? gradientInk(doc, it, it.fill, behind, inkStrength) : null;
        const meanAlpha = it.fill.color && it.fill.color.alpha > 0 ? it.fill.color.alpha : 1;
        ink += g !== null ? area * (it.fill.opacity / meanAlpha) * g * fillShown : area * it.fill.opacity * s * fillShown;
        strength = s;
      }
      if (hasStroke) {
        const dash = it.dashed ? DASHED_INK_FRACTION : 1;
        ink += length * it.strokeWidth * it.stroke.opacity * strokeStrength * dash * strokeShown;
        if (Number.isNaN(strength)) strength = strokeStrength;
      }
      return { ink, strength };
    }
    case 'text': {
      if (it.fill.kind === 'none' || it.fill.opacity <= 0 || it.fontSize <= 0) return { ink: 0, strength: NaN };
      const s = it.fill.color ? inkStrength(it.fill.color, behind) : 1;
      let area: number;
      try {
        area = glyphRunInk(it.content, it.fontFamily, it.fontWeight, it.fontStyle).area * it.fontSize * it.fontSize;
      } catch {
        area = it.width * it.fontSize * TEXT_INK_COVERAGE;
      }
      return { ink: area * it.fill.opacity * s * strokeShown, strength: s };
    }
    case 'image':
      return { ink: it.bbox.width * it.bbox.height * it.opacity * strokeShown, strength: it.opacity > 0 ? 1 : NaN };
  }
}

function colorKey(c: Rgba | null): string {
  return c ? `${c.r.toFixed(3)},${c.g.toFixed(3)},${c.b.toFixed(3)}` : '-';
}

/**
 * A key equal for two items that paint exactly the same pixels the same
 * opaque way (twin axes drawing one spine twice, a label written twice);
 * null for translucent paint, whose repaint does add ink.
 */
function repaintKey(it: SceneItem): string | null {
  const b = it.bbox;
  const box = `${b.x.toFixed(2)},${b.y.toFixed(2)},${b.width.toFixed(2)},${b.height.toFixed(2)}`;
  if (it.kind === 'shape') {
    if (it.fill.kind !== 'none' && it.fill.opacity < 0.999) return null;
    if (it.stroke.kind !== 'none' && it.stroke.opacity < 0.999) return null;
    return `s|${box}|${it.area.toFixed(2)}|${it.length.toFixed(2)}|${it.strokeWidth.toFixed(3)}|${it.fill.kind}:${colorKey(it.fill.color)}|${it.stroke.kind}:${colorKey(it.stroke.color)}|${it.dashed}`;
  }
  if (it.kind === 'text') {
    if (it.fill.opacity < 0.999) return null;
    return `t|${box}|${it.content}|${it.fontSize.toFixed(3)}|${it.fontWeight}|${colorKey(it.fill.color)}`;
  }
  return null;
}

/**
 * Ink of every item of a chart, and shares by role. What later items hide
 * does not count (see `visibilityOf`): a plot background under bars counts
 * only where it shows, overlapping points print their common part once.
 */
export function measureInk(chart: Chart, surfaces: SurfaceIndex = buildSurfaceIndex(chart.scene)): InkMeasure {
  const items = chart.scene.items;
  const n = items.length;
  const byItem = new Float64Array(n);
  const strength = new Float64Array(n).fill(NaN);
  const vis = visibilityOf(chart.scene);
  // Point marks are not the background of other points: their overlaps are counted as hidden area.
  const notSurface = (k: number) => chart.roles[k]?.sub === 'mark/point';
  const seen = new Set<string>();
  for (let i = n - 1; i >= 0; i--) {
    const it = items[i]!;
    if (!chart.roles[i]) continue;
    const key = repaintKey(it);
    if (key !== null) {
      if (seen.has(key)) continue; // an opaque copy painted over this one shows instead of it
      seen.add(key);
    }
    const p = probeOf(it);
    const behind = surfaces.colorBehind(p.x, p.y, i, { containing: p.box, skip: notSurface });
    const r = itemInk(chart.scene.document, chart.scene.viewBox, it, behind, vis.fill[i]!, vis.stroke[i]!);
    byItem[i] = Number.isFinite(r.ink) && r.ink > 0 ? r.ink : 0;
    strength[i] = r.strength;
  }
  const totals = { data: 0, guides: 0, labels: 0, decoration: 0, total: 0 };
  const bySub: Partial<Record<SubRole, number>> = {};
  for (let i = 0; i < n; i++) {
    const role = chart.roles[i];
    if (!role) continue;
    totals[bucketOf(role.role)] += byItem[i]!;
    bySub[role.sub] = (bySub[role.sub] ?? 0) + byItem[i]!;
  }
  totals.total = totals.data + totals.guides + totals.labels + totals.decoration;
  const t = totals.total;
  const shares: InkShares =
    t > 0
      ? { data: totals.data / t, guides: totals.guides / t, labels: totals.labels / t, decoration: totals.decoration / t }
      : { data: 0, guides: 0, labels: 0, decoration: 0 };
  return { shares, totals, byItem, strength, bySub, fillShown: vis.fill };
}
