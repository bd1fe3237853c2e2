/**
 * How much of each item stays visible under the items painted after it.
 *
 * The drawing is laid on a grid of square cells (about a million at most).
 * Walking the items from the topmost down, each cell keeps the share of light
 * that still comes through from below: 1 at first, multiplied by (1 − α) for
 * every paint laid over it. An item's visible share is the mean of that value
 * over its own cells (fills: cells whose centre the outline holds, by the
 * non-zero rule; strokes: points sampled every half cell along the outline;
 * text: its centre); its own paint then dims the cells it covers. A
 * translucent item leaves what is under it partly visible, an opaque one
 * hides it; a stroke dims each cell by the share of the cell its band
 * covers. The part of an item's fill under its own stroke is not judged
 * here (the caller knows the geometry).
 */
import type { Box, Scene, SceneItem, ShapeItem } from '../read/scene.js';

export interface Visibility {
  /** Visible share (0..1) of each item's fill, by scene index (1 when it has none). */
  fill: Float64Array;
  /** Visible share of each item's stroke (text: of its glyphs; images: of their box). */
  stroke: Float64Array;
  /** Cell size used, world units. */
  cell: number;
}

export const MAX_VISIBILITY_CELLS = 250_000;

/** The part of segment a→b inside a box (Liang–Barsky), or null when none is. */
function segmentPart(ax: number, ay: number, bx: number, by: number, box: Box): [number, number, number, number] | null {
  const dx = bx - ax;
  const dy = by - ay;
  let t0 = 0;
  let t1 = 1;
  const edges: [number, number][] = [
    [-dx, ax - box.x],
    [dx, box.x + box.width - ax],
    [-dy, ay - box.y],
    [dy, box.y + box.height - ay],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const r = q / p;
    if (p < 0) {
      if (r > t1) return null;
      if (r > t0) t0 = r;
    } else {
      if (r < t0) return null;
      if (r < t1) t1 = r;
    }
  }
  return [ax + dx * t0, ay + dy * t0, ax + dx * t1, ay + dy * t1];
}

export function visibilityOf(scene: Scene, maxCells = MAX_VISIBILITY_CELLS): Visibility {
  const n = scene.items.length;
  const fillVis = new Float64Array(n).fill(1);
  const strokeVis = new Float64Array(n).fill(1);
  const vb = scene.viewBox;
  const x0 = vb.x;
  const y0 = vb.y;
  const W = vb.width;
  const H = vb.height;
  if (!(W > 0 && H > 0) || !Number.isFinite(W * H)) return { fill: fillVis, stroke: strokeVis, cell: 0 };
  const h = Math.sqrt((W * H) / Math.max(1, maxCells));
  const nx = Math.max(1, Math.ceil(W / h));
  const ny = Math.max(1, Math.ceil(H / h));
  const T = new Float32Array(nx * ny).fill(1);

  const cellAt = (x: number, y: number): number => {
    const i = Math.floor((x - x0) / h);
    const j = Math.floor((y - y0) / h);
    if (i < 0 || j < 0 || i >= nx || j >= ny) return -1;
    return j * nx + i;
  };

  /** Cells of a filled outline (centres inside, non-zero rule), restricted to a clip box. */
  /** Cells a fill covers, as inclusive runs [first, last] of cell indices along rows (flat pairs). */
  const fillCells = (it: ShapeItem): number[] => {
    const out: number[] = [];
    const b = it.bbox;
    let j0 = Math.max(0, Math.floor((b.y - y0) / h - 0.5));
    let j1 = Math.min(ny - 1, Math.ceil((b.y + b.height - y0) / h - 0.5));
    const clip: Box | null = it.clip;
    if (clip) {
      j0 = Math.max(j0, Math.floor((clip.y - y0) / h - 0.5));
      j1 = Math.min(j1, Math.ceil((clip.y + clip.height - y0) / h - 0.5));
    }
    if (j1 < j0) return out;
    const rows: { x: number; w: number }[][] = Array.from({ length: j1 - j0 + 1 }, () => []);
    for (const pl of it.polylines) {
      const m = pl.length / 2;
      if (m < 3) continue;
      for (let k = 0; k < m; k++) {
        const ax = pl[2 * k]!;
        const ay = pl[2 * k + 1]!;
        const l = k + 1 === m ? 0 : k + 1;
        const bx = pl[2 * l]!;
        const by = pl[2 * l + 1]!;
        if (ay === by) continue;
        const lo = Math.min(ay, by);
        const hi = Math.max(ay, by);
        // Rows whose centre y lies in [lo, hi).
        const r0 = Math.max(j0, Math.ceil((lo - y0) / h - 0.5));
        const r1 = Math.min(j1, Math.ceil((hi - y0) / h - 0.5) - 1);
        for (let r = r0; r <= r1; r++) {
          const yc = y0 + (r + 0.5) * h;
          rows[r - j0]!.push({ x: ax + ((bx - ax) * (yc - ay)) / (by - ay), w: by > ay ? 1 : -1 });
        }
      }
    }
    const cx0 = clip ? clip.x : -Infinity;
    const cx1 = clip ? clip.x + clip.width : Infinity;
    for (let r = j0; r <= j1; r++) {
      const xs = rows[r - j0]!;
      if (xs.length < 2) continue;
      xs.sort((p, q) => p.x - q.x);
      let wind = 0;
      for (let k = 0; k + 1 < xs.length; k++) {
        wind += xs[k]!.w;
        if (wind === 0) continue;
        const a = Math.max(xs[k]!.x, cx0);
        const c = Math.min(xs[k + 1]!.x, cx1);
        const i0 = Math.max(0, Math.ceil((a - x0) / h - 0.5));
        const i1 = Math.min(nx - 1, Math.ceil((c - x0) / h - 0.5) - 1);
        if (i1 >= i0) out.push(r * nx + i0, r * nx + i1);
      }
    }
    return out;
  };

  /**
   * Samples of a stroke's band: points every half cell along the outline (and
   * across the width when it is wider than half a cell), each standing for
   * the area it samples.
   */
  const strokeSamples = (it: ShapeItem, visit: (cell: number, area: number) => void): void => {
    const sw = it.strokeWidth;
    // Samples across the band: one per half cell, at most as many as the drawing is wide in half cells.
    const k = Math.min(Math.max(1, Math.ceil(sw / (h / 2))), 2 * (nx + ny));
    const clip = it.clip;
    // Only the part of a segment near the drawing is sampled: a huge path costs no more than the grid.
    const reach = { x: x0 - sw, y: y0 - sw, width: W + 2 * sw, height: H + 2 * sw };
    it.polylines.forEach((pl, p) => {
      const m = pl.length / 2;
      const segs = it.closed[p] && m > 2 ? m : m - 1;
      for (let s = 0; s < segs; s++) {
        const e = s + 1 === m ? 0 : s + 1;
        const ax0 = pl[2 * s]!;
        const ay0 = pl[2 * s + 1]!;
        const len0 = Math.hypot(pl[2 * e]! - ax0, pl[2 * e + 1]! - ay0);
        if (!(len0 > 0) || !Number.isFinite(len0)) continue;
        const part = segmentPart(ax0, ay0, pl[2 * e]!, pl[2 * e + 1]!, reach);
        if (part === null) continue;
        const [ax, ay, bx, by] = part;
        const len = Math.hypot(bx - ax, by - ay);
        if (len === 0) continue;
        const steps = Math.max(1, Math.ceil(len / (h / 2)));
        const nxu = -(by - ay) / len;
        const nyu = (bx - ax) / len;
        const area = ((len / steps) * sw) / k;
        for (let t = 0; t < steps; t++) {
          const f = (t + 0.5) / steps;
          const px = ax + (bx - ax) * f;
          const py = ay + (by - ay) * f;
          for (let a = 0; a < k; a++) {
            const o = -sw / 2 + (sw * (a + 0.5)) / k;
            const x = px + nxu * o;
            const y = py + nyu * o;
            if (clip && (x < clip.x || x > clip.x + clip.width || y < clip.y || y > clip.y + clip.height)) continue;
            const c = cellAt(x, y);
            if (c >= 0) visit(c, area);
          }
        }
      }
    });
  };

  // Share of each cell a stroke covers, gathered per item before dimming.
  const cover = new Float32Array(nx * ny);
  const touched: number[] = [];
  const cellArea = h * h;

  for (let idx = n - 1; idx >= 0; idx--) {
    const it: SceneItem = scene.items[idx]!;
    if (it.kind === 'text') {
      const c = cellAt(it.bbox.x + it.bbox.width / 2, it.bbox.y + it.bbox.height / 2);
      strokeVis[idx] = c >= 0 ? T[c]! : 1;
      continue;
    }
    if (it.kind === 'image') {
      const b = it.bbox;
      let sum = 0;
      let count = 0;
      const i0 = Math.max(0, Math.floor((b.x - x0) / h));
      const i1 = Math.min(nx - 1, Math.ceil((b.x + b.width - x0) / h) - 1);
      const j0 = Math.max(0, Math.floor((b.y - y0) / h));
      const j1 = Math.min(ny - 1, Math.ceil((b.y + b.height - y0) / h) - 1);
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) {
        sum += T[j * nx + i]!;
        count++;
      }
      strokeVis[idx] = count > 0 ? sum / count : 1;
      const keep = 1 - Math.min(1, Math.max(0, it.opacity));
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) T[j * nx + i]! *= keep;
      continue;
    }
    const hasStroke = it.stroke.kind !== 'none' && it.strokeWidth > 0 && it.stroke.opacity > 0;
    const hasFill = it.fill.kind !== 'none' && it.fill.opacity > 0 && it.area > 0;
    // Both parts are judged against what lies above the item; the item's
    // stroke over its own fill is left to the caller (it knows the geometry).
    let cells: number[] = [];
    if (hasFill) {
      cells = fillCells(it);
      if (cells.length > 0) {
        let sum = 0;
        let count = 0;
        for (let k = 0; k < cells.length; k += 2) {
          const last = cells[k + 1]!;
          for (let c = cells[k]!; c <= last; c++) sum += T[c]!;
          count += last - cells[k]! + 1;
        }
        fillVis[idx] = sum / count;
      } else {
        const c = cellAt(it.bbox.x + it.bbox.width / 2, it.bbox.y + it.bbox.height / 2);
        fillVis[idx] = c >= 0 ? T[c]! : 1;
      }
    }
    if (hasStroke) {
      let sum = 0;
      let total = 0;
      strokeSamples(it, (c, area) => {
        sum += T[c]! * area;
        total += area;
        if (cover[c] === 0) touched.push(c);
        cover[c]! += area / cellArea;
      });
      strokeVis[idx] = total > 0 ? sum / total : 1;
    }
    if (hasFill) {
      const keep = 1 - Math.min(1, it.fill.opacity);
      for (let k = 0; k < cells.length; k += 2) {
        const last = cells[k + 1]!;
        for (let c = cells[k]!; c <= last; c++) T[c]! *= keep;
      }
    }
    if (hasStroke) {
      const alpha = Math.min(1, it.stroke.opacity) * (it.dashed ? 0.5 : 1);
      for (const c of touched) {
        T[c]! *= 1 - alpha * Math.min(1, cover[c]!);
        cover[c] = 0;
      }
      touched.length = 0;
    }
  }
  return { fill: fillVis, stroke: strokeVis, cell: h };
}
