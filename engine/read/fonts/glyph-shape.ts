/**
 * Scale-free descriptions of glyph outlines and distances between them.
 *
 * An outline (y axis up) is reduced to
 * - its bounding box, and the box normalised by its larger side (so the
 *   aspect ratio is kept and, when the input's y = 0 is the baseline, so is
 *   the box's position relative to the baseline);
 * - `SAMPLES` points spread evenly along all contours by arc length, in the
 *   normalised box, joined contour by contour into closed polygons;
 * - a coarse coverage grid of the filled shape (even-odd), for a fast first
 *   cut among references;
 * - its contour count.
 */
import { contoursBox, type Box, type Contour } from './glyph-outline.js';

export const SAMPLES = 64;
export const GRID = 16;
const SUPERSAMPLE = 2;

export interface ShapeDescriptor {
  /** Bounding box in the input units, y up. */
  box: Box;
  /** Larger side of the box (input units); > 0. */
  size: number;
  /** Width over height, with a floor on both of 1/1000 of `size`. */
  aspect: number;
  /** Box bottom and top over `size`: where the baseline sits, scale-free. */
  bottom: number;
  top: number;
  contours: number;
  /** SAMPLES points (x, y interleaved) in the normalised box. */
  points: Float64Array;
  /**
   * Undirected tangent orientation at each point, as (cos 2θ, sin 2θ)
   * interleaved, so outlines drawn clockwise or counter-clockwise compare alike.
   */
  tangents: Float64Array;
  /** For each point, the index of the next point on its contour (wrapping round). */
  next: Int32Array;
  /** GRID × GRID coverage fractions, row 0 at the bottom. */
  grid: Float32Array;
}

function contourLength(c: Contour): number {
  let len = 0;
  const n = c.length;
  for (let i = 0; i < n; i += 2) {
    const j = (i + 2) % n;
    len += Math.hypot(c[j]! - c[i]!, c[j + 1]! - c[i + 1]!);
  }
  return len;
}

/** Evenly spaced points along each closed contour, shares by length, with their tangents. */
function resample(
  contours: readonly Contour[],
  total: number,
): { points: Float64Array; tangents: Float64Array; next: Int32Array } {
  const lengths = contours.map(contourLength);
  const sum = lengths.reduce((a, b) => a + b, 0);
  const counts = lengths.map((l) => Math.max(3, Math.round((sum > 0 ? l / sum : 1 / contours.length) * total)));
  // trim or pad to exactly `total`, taking from / giving to the longest contours
  let diff = counts.reduce((a, b) => a + b, 0) - total;
  const order = lengths.map((_, i) => i).sort((a, b) => lengths[b]! - lengths[a]!);
  for (let k = 0; diff !== 0 && k < 10 * total; k++) {
    const i = order[k % order.length]!;
    if (diff > 0 && counts[i]! > 3) { counts[i]!--; diff--; }
    else if (diff < 0) { counts[i]!++; diff++; }
  }
  const out: number[] = [];
  const tan: number[] = [];
  const next: number[] = [];
  contours.forEach((c, ci) => {
    const count = counts[ci]!;
    const first = out.length / 2;
    for (let k = 0; k < count; k++) next.push(first + ((k + 1) % count));
    const len = lengths[ci]!;
    const n = c.length;
    if (len === 0) {
      for (let k = 0; k < count; k++) out.push(c[0]!, c[1]!), tan.push(1, 0);
      return;
    }
    const step = len / count;
    let seg = 0;
    let segStart = 0; // arc length at the start of segment `seg`
    for (let k = 0; k < count; k++) {
      const target = k * step;
      let i = seg * 2;
      let j = (i + 2) % n;
      let segLen = Math.hypot(c[j]! - c[i]!, c[j + 1]! - c[i + 1]!);
      while (segStart + segLen < target && seg < n / 2 - 1) {
        segStart += segLen;
        seg++;
        i = seg * 2;
        j = (i + 2) % n;
        segLen = Math.hypot(c[j]! - c[i]!, c[j + 1]! - c[i + 1]!);
      }
      const t = segLen > 0 ? Math.min(1, (target - segStart) / segLen) : 0;
      const dx = c[j]! - c[i]!, dy = c[j + 1]! - c[i + 1]!;
      out.push(c[i]! + dx * t, c[i + 1]! + dy * t);
      const theta = Math.atan2(dy, dx);
      tan.push(Math.cos(2 * theta), Math.sin(2 * theta));
    }
  });
  return { points: Float64Array.from(out), tangents: Float64Array.from(tan), next: Int32Array.from(next) };
}

/** Coverage of the normalised unit square by the filled outline (even-odd). */
function coverage(contours: readonly Contour[], box: Box, size: number): Float32Array {
  const cells = GRID * SUPERSAMPLE;
  const grid = new Float32Array(GRID * GRID);
  const xs: number[] = [];
  const weight = 1 / (SUPERSAMPLE * SUPERSAMPLE);
  for (let row = 0; row < cells; row++) {
    const y = box.yMin + ((row + 0.5) / cells) * size;
    xs.length = 0;
    for (const c of contours) {
      const n = c.length;
      for (let i = 0; i < n; i += 2) {
        const j = (i + 2) % n;
        const y0 = c[i + 1]!, y1 = c[j + 1]!;
        if ((y0 <= y && y1 > y) || (y1 <= y && y0 > y)) {
          const x0 = c[i]!, x1 = c[j]!;
          xs.push(x0 + ((y - y0) / (y1 - y0)) * (x1 - x0));
        }
      }
    }
    if (xs.length < 2) continue;
    xs.sort((a, b) => a - b);
    const gRow = Math.floor(row / SUPERSAMPLE);
    for (let col = 0; col < cells; col++) {
      const x = box.xMin + ((col + 0.5) / cells) * size;
      let inside = false;
      for (let k = 0; k < xs.length && xs[k]! <= x; k++) inside = !inside;
      if (inside) grid[gRow * GRID + Math.floor(col / SUPERSAMPLE)]! += weight;
    }
  }
  return grid;
}

/** Describes contours whose y axis points up; null when they have no extent. */
export function describeShape(contours: readonly Contour[]): ShapeDescriptor | null {
  if (contours.length === 0) return null;
  const box = contoursBox(contours);
  const w = box.xMax - box.xMin;
  const h = box.yMax - box.yMin;
  const size = Math.max(w, h);
  if (!(size > 0) || !Number.isFinite(size)) return null;
  const floor = size / 1000;
  const { points: raw, tangents, next } = resample(contours, SAMPLES);
  const points = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i += 2) {
    points[i] = (raw[i]! - box.xMin) / size;
    points[i + 1] = (raw[i + 1]! - box.yMin) / size;
  }
  return {
    box,
    size,
    aspect: Math.max(w, floor) / Math.max(h, floor),
    bottom: box.yMin / size,
    top: box.yMax / size,
    contours: contours.length,
    points,
    tangents,
    next,
    grid: coverage(contours, box, size),
  };
}

/** Mean absolute difference of two coverage grids (0 … 1). */
export function gridDistance(a: Float32Array, b: Float32Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += Math.abs(a[i]! - b[i]!);
  return s / a.length;
}

/** Weight of the tangent difference against the position difference. */
export const TANGENT_WEIGHT = 0.3;

/**
 * Mean distance from the points of one outline to the polygon sides of
 * another; the orientation compared is that of the outline at the side's
 * nearer end.
 */
function meanToOutline(from: ShapeDescriptor, to: ShapeDescriptor): number {
  const fp = from.points, ft = from.tangents, tp = to.points, tt = to.tangents, next = to.next;
  const w2 = (TANGENT_WEIGHT * TANGENT_WEIGHT) / 4;
  const sides = next.length;
  let sum = 0;
  for (let i = 0; i < fp.length; i += 2) {
    const x = fp[i]!, y = fp[i + 1]!, c = ft[i]!, s = ft[i + 1]!;
    let best = Infinity;
    for (let k = 0; k < sides; k++) {
      const ax = tp[2 * k]!, ay = tp[2 * k + 1]!;
      const j = next[k]!;
      const bx = tp[2 * j]! - ax, by = tp[2 * j + 1]! - ay;
      const px = x - ax, py = y - ay;
      const len2 = bx * bx + by * by;
      let t = len2 > 0 ? (px * bx + py * by) / len2 : 0;
      if (t < 0) t = 0;
      else if (t > 1) t = 1;
      const dx = px - t * bx, dy = py - t * by;
      let d = dx * dx + dy * dy;
      if (d >= best) continue;
      const end = t < 0.5 ? k : j;
      const dc = tt[2 * end]! - c, ds = tt[2 * end + 1]! - s;
      d += w2 * (dc * dc + ds * ds);
      if (d < best) best = d;
    }
    sum += Math.sqrt(best);
  }
  return sum / (fp.length / 2);
}

/**
 * Symmetric mean distance between two resampled outlines (normalised
 * units): each outline's points to the other's polygon, compared by
 * position and, more weakly, by the orientation of the outline there.
 * Measuring to sides rather than to points makes the result independent of
 * where along a contour the sampling happened to start.
 */
export function chamferDistance(a: ShapeDescriptor, b: ShapeDescriptor): number {
  return (meanToOutline(a, b) + meanToOutline(b, a)) / 2;
}
