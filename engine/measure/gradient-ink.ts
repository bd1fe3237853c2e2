/**
 * The mean ink of a gradient fill over the shape it fills: sample points of
 * the shape (a 32 × 32 grid over its box, kept where the outline holds them),
 * the gradient's colour and opacity at each (stops interpolated in sRGB, as
 * SVG's default `color-interpolation` does; `pad` spread), and the strength
 * of that colour against what is behind. A gradient fading out over the part
 * of its box the shape barely fills inks less than the mean of its stops.
 *
 * Linear and radial gradients in `objectBoundingBox` or `userSpaceOnUse`
 * units without `gradientTransform`, on shapes whose transform keeps axes
 * (no rotation or skew), are integrated; anything else returns null and the
 * caller falls back to the mean stop colour.
 */
import type { Rgba } from '../color/types.js';
import { applyToPoint, type Matrix } from '../read/geometry/matrix.js';
import type { GradientStop, Paint, ShapeItem } from '../read/scene.js';
import type { XmlDocument, XmlElement } from '../read/xml-tree.js';
import { polylineBounds } from './clip-geometry.js';
import { insideOutline } from './surfaces.js';

const SAMPLES = 32;

function findById(doc: XmlDocument, id: string): XmlElement | null {
  const stack: XmlElement[] = [doc.root];
  while (stack.length > 0) {
    const el = stack.pop()!;
    if (el.attributes.id === id) return el;
    for (const c of el.children) if (c.type === 'element') stack.push(c);
  }
  return null;
}

/** A coordinate attribute: number or percentage (as a fraction), with a default. */
function coord(el: XmlElement, name: string, fallback: number): number | null {
  const raw = el.attributes[name];
  if (raw === undefined) return fallback;
  const t = raw.trim();
  const v = t.endsWith('%') ? parseFloat(t) / 100 : parseFloat(t);
  return Number.isFinite(v) ? v : null;
}

function colorAt(stops: readonly GradientStop[], t: number): Rgba {
  if (t <= stops[0]!.offset) return stops[0]!.color;
  for (let k = 0; k + 1 < stops.length; k++) {
    const a = stops[k]!;
    const b = stops[k + 1]!;
    if (t <= b.offset) {
      const f = b.offset > a.offset ? (t - a.offset) / (b.offset - a.offset) : 1;
      return {
        r: a.color.r + (b.color.r - a.color.r) * f,
        g: a.color.g + (b.color.g - a.color.g) * f,
        b: a.color.b + (b.color.b - a.color.b) * f,
        alpha: a.color.alpha + (b.color.alpha - a.color.alpha) * f,
      };
    }
  }
  return stops[stops.length - 1]!.color;
}

function axisAligned(m: Matrix): boolean {
  return Math.abs(m[1]) < 1e-9 && Math.abs(m[2]) < 1e-9;
}

/**
 * Mean of (stop opacity × strength against `behind`) over the shape, for a
 * gradient paint; the paint's other opacity (element, group, fill-opacity)
 * is not included. Null when the gradient cannot be integrated here.
 */
export function gradientInk(
  doc: XmlDocument,
  it: ShapeItem,
  paint: Paint,
  behind: Rgba,
  strength: (c: Rgba, behind: Rgba) => number,
): number | null {
  if (paint.kind !== 'gradient' || !paint.ref || !paint.stops || paint.stops.length === 0) return null;
  const el = findById(doc, paint.ref);
  if (!el || (el.name !== 'linearGradient' && el.name !== 'radialGradient')) return null;
  if (el.attributes.gradientTransform !== undefined) return null;
  if (!axisAligned(it.matrix)) return null;
  const box = polylineBounds(it.polylines);
  if (!box || !(box.width > 0 && box.height > 0)) return null;
  const userSpace = el.attributes.gradientUnits === 'userSpaceOnUse';
  // Gradient coordinates → world.
  const toWorld = (x: number, y: number) => (userSpace ? applyToPoint(it.matrix, { x, y }) : { x: box.x + x * box.width, y: box.y + y * box.height });
  let tAt: (x: number, y: number) => number;
  if (el.name === 'linearGradient') {
    const x1 = coord(el, 'x1', 0);
    const y1 = coord(el, 'y1', 0);
    const x2 = coord(el, 'x2', 1);
    const y2 = coord(el, 'y2', 0);
    if (x1 === null || y1 === null || x2 === null || y2 === null) return null;
    const p = toWorld(x1, y1);
    const q = toWorld(x2, y2);
    const dx = q.x - p.x;
    const dy = q.y - p.y;
    const len2 = dx * dx + dy * dy;
    if (len2 === 0) return null;
    tAt = (x, y) => ((x - p.x) * dx + (y - p.y) * dy) / len2;
  } else {
    const cx = coord(el, 'cx', 0.5);
    const cy = coord(el, 'cy', 0.5);
    const r = coord(el, 'r', 0.5);
    if (cx === null || cy === null || r === null || r <= 0) return null;
    const c = toWorld(cx, cy);
    const e = toWorld(cx + r, cy + r);
    const rx = Math.abs(e.x - c.x);
    const ry = Math.abs(e.y - c.y);
    if (rx === 0 || ry === 0) return null;
    tAt = (x, y) => Math.hypot((x - c.x) / rx, (y - c.y) / ry);
  }
  let sum = 0;
  let count = 0;
  for (let j = 0; j < SAMPLES; j++) {
    const y = box.y + ((j + 0.5) / SAMPLES) * box.height;
    for (let i = 0; i < SAMPLES; i++) {
      const x = box.x + ((i + 0.5) / SAMPLES) * box.width;
      if (!insideOutline(it.polylines, x, y)) continue;
      const c = colorAt(paint.stops, Math.min(1, Math.max(0, tAt(x, y))));
      sum += c.alpha * strength(c, behind);
      count++;
    }
  }
  return count > 0 ? sum / count : null;
}
