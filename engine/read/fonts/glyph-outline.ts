/**
 * Glyph outlines as flattened closed contours.
 *
 * Path data is read by the shared path parser (engine/read/geometry), which
 * keeps everything up to the first error as SVG renderers do, and flattened
 * with a tolerance of 1/400 of the outline's size. Subpaths are closed, as
 * fill closes them. Outlines with more segments than any glyph has are
 * refused (null) so that a stray chart path cannot make recognition slow.
 */
import { flattenSegments } from '../geometry/flatten.js';
import { pathBBox } from '../geometry/measure-path.js';
import { parsePath } from '../geometry/parse-path.js';
import type { Matrix } from '../geometry/matrix.js';

/** One closed contour: x0, y0, x1, y1, ... */
export type Contour = Float64Array;

export interface Box {
  xMin: number;
  yMin: number;
  xMax: number;
  yMax: number;
}

/** Most path segments accepted in one glyph outline. */
export const MAX_GLYPH_SEGMENTS = 5000;
/** Longest path data accepted as a glyph outline (characters). */
export const MAX_GLYPH_PATH_LENGTH = 200_000;

const IDENTITY: Matrix = [1, 0, 0, 1, 0, 0];
const FLIP_Y: Matrix = [1, 0, 0, -1, 0, 0];

/**
 * Flattened contours of path data, y negated when `flipY` is set; null when
 * the data draws nothing or is too large for a glyph. Contours with fewer
 * than 3 distinct points are dropped.
 */
export function flattenPathData(d: string, flipY = false): Contour[] | null {
  if (typeof d !== 'string' || d.length === 0 || d.length > MAX_GLYPH_PATH_LENGTH) return null;
  const { segments } = parsePath(d);
  if (segments.length === 0 || segments.length > MAX_GLYPH_SEGMENTS) return null;
  const matrix = flipY ? FLIP_Y : IDENTITY;
  const box = pathBBox(segments, matrix);
  if (box === null) return null;
  const size = Math.max(box.maxX - box.minX, box.maxY - box.minY);
  if (!(size > 0) || !Number.isFinite(size)) return null;
  const { polylines } = flattenSegments(segments, size / 400, matrix);
  const contours: Contour[] = [];
  for (const line of polylines) {
    const pts: number[] = [];
    for (let i = 0; i + 1 < line.length; i += 2) {
      const x = line[i]!, y = line[i + 1]!;
      const n = pts.length;
      if (n === 0 || pts[n - 2] !== x || pts[n - 1] !== y) pts.push(x, y);
    }
    const n = pts.length;
    if (n >= 4 && pts[n - 2] === pts[0] && pts[n - 1] === pts[1]) pts.length = n - 2;
    if (pts.length >= 6) contours.push(Float64Array.from(pts));
  }
  return contours.length > 0 ? contours : null;
}

/** Bounding box of contours. */
export function contoursBox(contours: readonly Contour[]): Box {
  let xMin = Infinity, yMin = Infinity, xMax = -Infinity, yMax = -Infinity;
  for (const c of contours) {
    for (let i = 0; i < c.length; i += 2) {
      const x = c[i]!, y = c[i + 1]!;
      if (x < xMin) xMin = x;
      if (x > xMax) xMax = x;
      if (y < yMin) yMin = y;
      if (y > yMax) yMax = y;
    }
  }
  return { xMin, yMin, xMax, yMax };
}
