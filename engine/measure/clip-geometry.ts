/**
 * Area and length of flattened outlines inside a clip rectangle: what a
 * clipped shape actually paints. Sutherland–Hodgman polygon clipping for
 * areas, Liang–Barsky segment clipping for lengths.
 */
import type { Box } from '../read/scene.js';

/** Bounds of flat [x0, y0, x1, y1, ...] polylines, or null when empty. */
export function polylineBounds(polylines: readonly number[][]): Box | null {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const p of polylines) {
    for (let i = 0; i + 1 < p.length; i += 2) {
      const x = p[i]!;
      const y = p[i + 1]!;
      if (x < x0) x0 = x;
      if (x > x1) x1 = x;
      if (y < y0) y0 = y;
      if (y > y1) y1 = y;
    }
  }
  return x1 >= x0 && y1 >= y0 ? { x: x0, y: y0, width: x1 - x0, height: y1 - y0 } : null;
}

function signedArea(p: readonly number[]): number {
  const n = p.length / 2;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    s += p[2 * i]! * p[2 * j + 1]! - p[2 * j]! * p[2 * i + 1]!;
  }
  return s / 2;
}

/** Clips one closed polygon against one half-plane given by `inside` and `cut`. */
function clipHalf(p: number[], inside: (x: number, y: number) => boolean, cut: (ax: number, ay: number, bx: number, by: number) => [number, number]): number[] {
  const out: number[] = [];
  const n = p.length / 2;
  for (let i = 0; i < n; i++) {
    const ax = p[2 * i]!;
    const ay = p[2 * i + 1]!;
    const j = i + 1 === n ? 0 : i + 1;
    const bx = p[2 * j]!;
    const by = p[2 * j + 1]!;
    const ain = inside(ax, ay);
    const bin = inside(bx, by);
    if (ain) out.push(ax, ay);
    if (ain !== bin) out.push(...cut(ax, ay, bx, by));
  }
  return out;
}

/** Absolute filled area (subpath signs summed, as the scene measures it) inside the clip. */
export function clippedArea(polylines: readonly number[][], clip: Box): number {
  const xl = clip.x;
  const xr = clip.x + clip.width;
  const yt = clip.y;
  const yb = clip.y + clip.height;
  let total = 0;
  for (const pl of polylines) {
    if (pl.length < 6) continue;
    let p = pl.slice();
    p = clipHalf(p, (x) => x >= xl, (ax, ay, bx, by) => [xl, ay + ((by - ay) * (xl - ax)) / (bx - ax)]);
    p = clipHalf(p, (x) => x <= xr, (ax, ay, bx, by) => [xr, ay + ((by - ay) * (xr - ax)) / (bx - ax)]);
    p = clipHalf(p, (_x, y) => y >= yt, (ax, ay, bx, by) => [ax + ((bx - ax) * (yt - ay)) / (by - ay), yt]);
    p = clipHalf(p, (_x, y) => y <= yb, (ax, ay, bx, by) => [ax + ((bx - ax) * (yb - ay)) / (by - ay), yb]);
    if (p.length >= 6) total += signedArea(p);
  }
  return Math.abs(total);
}

/** Length of one segment inside the clip (Liang–Barsky). */
function segmentInside(ax: number, ay: number, bx: number, by: number, clip: Box): number {
  const dx = bx - ax;
  const dy = by - ay;
  let t0 = 0;
  let t1 = 1;
  const edges: [number, number][] = [
    [-dx, ax - clip.x],
    [dx, clip.x + clip.width - ax],
    [-dy, ay - clip.y],
    [dy, clip.y + clip.height - ay],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return 0;
      continue;
    }
    const r = q / p;
    if (p < 0) {
      if (r > t1) return 0;
      if (r > t0) t0 = r;
    } else {
      if (r < t0) return 0;
      if (r < t1) t1 = r;
    }
  }
  return Math.hypot(dx, dy) * (t1 - t0);
}

/** Outline length inside the clip; closed subpaths include their closing edge. */
export function clippedLength(polylines: readonly number[][], closed: readonly boolean[], clip: Box): number {
  let total = 0;
  polylines.forEach((p, k) => {
    const n = p.length / 2;
    for (let i = 0; i + 1 < n; i++) total += segmentInside(p[2 * i]!, p[2 * i + 1]!, p[2 * i + 2]!, p[2 * i + 3]!, clip);
    if (closed[k] && n > 2) total += segmentInside(p[2 * n - 2]!, p[2 * n - 1]!, p[0]!, p[1]!, clip);
  });
  return total;
}

/**
 * Length of a stroke of width `width` inside the clip: the area of each
 * segment's band (a rectangle `width` wide around it) inside the clip, over
 * the width. A stroke along the clip's edge keeps half its width; joins and
 * caps are left out.
 */
export function clippedStrokeLength(polylines: readonly number[][], closed: readonly boolean[], clip: Box, width: number): number {
  if (!(width > 0)) return clippedLength(polylines, closed, clip);
  const half = width / 2;
  let area = 0;
  const seg = (ax: number, ay: number, bx: number, by: number) => {
    const len = Math.hypot(bx - ax, by - ay);
    if (len === 0 || !Number.isFinite(len)) return;
    const nx = (-(by - ay) / len) * half;
    const ny = ((bx - ax) / len) * half;
    area += clippedArea([[ax + nx, ay + ny, bx + nx, by + ny, bx - nx, by - ny, ax - nx, ay - ny]], clip);
  };
  polylines.forEach((p, k) => {
    const n = p.length / 2;
    for (let i = 0; i + 1 < n; i++) seg(p[2 * i]!, p[2 * i + 1]!, p[2 * i + 2]!, p[2 * i + 3]!);
    if (closed[k] && n > 2) seg(p[2 * n - 2]!, p[2 * n - 1]!, p[0]!, p[1]!);
  });
  return area / width;
}
