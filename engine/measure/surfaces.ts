/**
 * What is behind a point of the drawing: the colour made by compositing, in
 * paint order, every earlier filled shape that covers the point, over white
 * paper. Shapes are found through a uniform grid over their bounding boxes,
 * so a query costs the few shapes of one cell.
 */
import { compositeOver } from '../color/composite.js';
import type { Rgba } from '../color/types.js';
import type { Box, Scene, ShapeItem } from '../read/scene.js';

export const PAPER: Rgba = Object.freeze({ r: 1, g: 1, b: 1, alpha: 1 }) as Rgba;

/** Cells per side of the grid (at most). */
const GRID = 48;

export interface BehindOptions {
  /**
   * Only shapes whose bounding box contains this whole box count (the thing
   * asked about lies entirely on them). Without it, covering the point is enough.
   */
  containing?: Box;
  /** Skip shapes with a smaller filled area than this (world units²). */
  minArea?: number;
  /** Skip the shapes for which this is true (by scene index). */
  skip?: (index: number) => boolean;
}

export interface SurfaceIndex {
  /** Colour behind (x, y) for an item painted at `before` in paint order (opaque, over paper). */
  colorBehind(x: number, y: number, before: number, options?: BehindOptions): Rgba;
  /** Scene index of the topmost filled shape under (x, y) painted before `before`, or null. */
  topmostBehind(x: number, y: number, before: number, options?: BehindOptions): number | null;
}

/** A shape that paints a surface: filled with a known colour and some opacity. */
function isSurface(it: ShapeItem): boolean {
  if (it.fill.kind !== 'color' && it.fill.kind !== 'gradient' && it.fill.kind !== 'pattern') return false;
  if (it.fill.color === null || it.fill.opacity <= 0) return false;
  return it.area > 0 && it.polylines.length > 0;
}

function boxContainsPoint(b: Box, x: number, y: number): boolean {
  return x >= b.x && x <= b.x + b.width && y >= b.y && y <= b.y + b.height;
}

function boxContainsBox(outer: Box, inner: Box, tol: number): boolean {
  return (
    inner.x >= outer.x - tol &&
    inner.y >= outer.y - tol &&
    inner.x + inner.width <= outer.x + outer.width + tol &&
    inner.y + inner.height <= outer.y + outer.height + tol
  );
}

/** Non-zero winding test over all subpaths (each taken as closed, as filling does). */
export function insideOutline(polylines: readonly number[][], x: number, y: number): boolean {
  let winding = 0;
  for (const pl of polylines) {
    const n = pl.length / 2;
    if (n < 3) continue;
    for (let i = 0; i < n; i++) {
      const x0 = pl[2 * i]!;
      const y0 = pl[2 * i + 1]!;
      const j = i + 1 === n ? 0 : i + 1;
      const x1 = pl[2 * j]!;
      const y1 = pl[2 * j + 1]!;
      if (y0 <= y) {
        if (y1 > y && (x1 - x0) * (y - y0) - (x - x0) * (y1 - y0) > 0) winding++;
      } else if (y1 <= y && (x1 - x0) * (y - y0) - (x - x0) * (y1 - y0) < 0) winding--;
    }
  }
  return winding !== 0;
}

/** Builds the index of filled shapes of a scene. */
export function buildSurfaceIndex(scene: Scene): SurfaceIndex {
  const shapes: ShapeItem[] = [];
  for (const it of scene.items) if (it.kind === 'shape' && isSurface(it)) shapes.push(it);
  let x0 = scene.viewBox.x;
  let y0 = scene.viewBox.y;
  let x1 = x0 + scene.viewBox.width;
  let y1 = y0 + scene.viewBox.height;
  for (const s of shapes) {
    x0 = Math.min(x0, s.bbox.x);
    y0 = Math.min(y0, s.bbox.y);
    x1 = Math.max(x1, s.bbox.x + s.bbox.width);
    y1 = Math.max(y1, s.bbox.y + s.bbox.height);
  }
  const w = Math.max(x1 - x0, 1e-9);
  const h = Math.max(y1 - y0, 1e-9);
  const cw = w / GRID;
  const ch = h / GRID;
  const cells: number[][] = Array.from({ length: GRID * GRID }, () => []);
  const cellX = (x: number) => Math.min(GRID - 1, Math.max(0, Math.floor((x - x0) / cw)));
  const cellY = (y: number) => Math.min(GRID - 1, Math.max(0, Math.floor((y - y0) / ch)));
  shapes.forEach((s, k) => {
    const b = s.bbox;
    if (!Number.isFinite(b.x + b.y + b.width + b.height)) return;
    const ix0 = cellX(b.x);
    const ix1 = cellX(b.x + b.width);
    const iy0 = cellY(b.y);
    const iy1 = cellY(b.y + b.height);
    for (let iy = iy0; iy <= iy1; iy++) for (let ix = ix0; ix <= ix1; ix++) cells[iy * GRID + ix]!.push(k);
  });

  /** Shapes under (x, y) before `before`, in paint order (cells hold them in paint order already). */
  function under(x: number, y: number, before: number, o: BehindOptions | undefined): ShapeItem[] {
    if (!Number.isFinite(x) || !Number.isFinite(y)) return [];
    if (x < x0 || x > x1 || y < y0 || y > y1) return [];
    const list = cells[cellY(y) * GRID + cellX(x)]!;
    const out: ShapeItem[] = [];
    const tol = 1e-6 * Math.max(w, h);
    for (const k of list) {
      const s = shapes[k]!;
      if (s.index >= before) break;
      if (!boxContainsPoint(s.bbox, x, y)) continue;
      if (s.clip && !boxContainsPoint(s.clip, x, y)) continue;
      if (o?.minArea !== undefined && s.area < o.minArea) continue;
      if (o?.skip?.(s.index)) continue;
      if (o?.containing && !boxContainsBox(s.bbox, o.containing, tol)) continue;
      if (s.rect === null && !insideOutline(s.polylines, x, y)) continue;
      out.push(s);
    }
    return out;
  }

  return {
    colorBehind(x, y, before, options) {
      let c: Rgba = PAPER;
      for (const s of under(x, y, before, options)) {
        const f = s.fill.color!;
        c = compositeOver({ r: f.r, g: f.g, b: f.b, alpha: Math.min(1, Math.max(0, s.fill.opacity)) }, c);
      }
      return c;
    },
    topmostBehind(x, y, before, options) {
      const list = under(x, y, before, options);
      return list.length > 0 ? list[list.length - 1]!.index : null;
    },
  };
}
