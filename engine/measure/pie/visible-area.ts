/**
 * Visible area of overlapping filled outlines drawn in paint order (later
 * ones cover earlier ones): what a viewer actually sees of each.
 *
 * Scanline method: the layers' common bounding box is cut into `rows`
 * horizontal rows; on each row's centre line every outline's inside is an
 * exact set of x intervals (even–odd rule), and each elementary x span
 * belongs to the topmost layer covering it. Area = Σ visible length × row
 * height, so the only approximation is the vertical sampling.
 */

export interface PaintedOutline {
  /** Flat [x0, y0, x1, y1, …] arrays, one per subpath, implicitly closed. */
  polylines: readonly (readonly number[])[];
  /** Who the visible area is credited to. */
  owner: number;
}

interface Edge {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/**
 * Visible area per owner (a Map owner → area, world units²) of the layers
 * given bottom-first. `rows` (default 1000, at most 100 000) sets the vertical
 * sampling. Throws RangeError for a bad `rows`.
 */
export function visibleAreas(layers: readonly PaintedOutline[], rows = 1000): Map<number, number> {
  if (!Number.isInteger(rows) || rows < 1 || rows > 100_000) throw new RangeError(`visibleAreas: rows must be an integer in 1..100000, got ${rows}`);
  const out = new Map<number, number>();
  const edgeLists: { edges: Edge[]; y0: number; y1: number; owner: number }[] = [];
  let ymin = Infinity;
  let ymax = -Infinity;
  for (const layer of layers) {
    if (!out.has(layer.owner)) out.set(layer.owner, 0);
    const edges: Edge[] = [];
    let ly0 = Infinity;
    let ly1 = -Infinity;
    for (const poly of layer.polylines) {
      const n = Math.floor(poly.length / 2);
      if (n < 3) continue;
      for (let i = 0; i < n; i++) {
        const j = (i + 1) % n;
        const e = { x0: poly[2 * i]!, y0: poly[2 * i + 1]!, x1: poly[2 * j]!, y1: poly[2 * j + 1]! };
        if (![e.x0, e.y0, e.x1, e.y1].every(Number.isFinite)) continue;
        if (e.y0 === e.y1) continue;
        edges.push(e);
        ly0 = Math.min(ly0, e.y0, e.y1);
        ly1 = Math.max(ly1, e.y0, e.y1);
      }
    }
    if (edges.length === 0) continue;
    edgeLists.push({ edges, y0: ly0, y1: ly1, owner: layer.owner });
    ymin = Math.min(ymin, ly0);
    ymax = Math.max(ymax, ly1);
  }
  if (edgeLists.length === 0 || !(ymax > ymin)) return out;
  const h = (ymax - ymin) / rows;
  for (let r = 0; r < rows; r++) {
    const y = ymin + (r + 0.5) * h;
    // Intervals of each layer on this row, in paint order.
    const intervals: { a: number; b: number; z: number; owner: number }[] = [];
    edgeLists.forEach((L, z) => {
      if (y < L.y0 || y > L.y1) return;
      const xs: number[] = [];
      for (const e of L.edges) {
        if ((e.y0 <= y && e.y1 > y) || (e.y1 <= y && e.y0 > y)) xs.push(e.x0 + ((y - e.y0) / (e.y1 - e.y0)) * (e.x1 - e.x0));
      }
      xs.sort((p, q) => p - q);
      for (let k = 0; k + 1 < xs.length; k += 2) if (xs[k + 1]! > xs[k]!) intervals.push({ a: xs[k]!, b: xs[k + 1]!, z, owner: L.owner });
    });
    if (intervals.length === 0) continue;
    const cuts = [...new Set(intervals.flatMap((iv) => [iv.a, iv.b]))].sort((p, q) => p - q);
    for (let k = 0; k + 1 < cuts.length; k++) {
      const a = cuts[k]!;
      const b = cuts[k + 1]!;
      const mid = (a + b) / 2;
      let top: { z: number; owner: number } | null = null;
      for (const iv of intervals) if (iv.a <= mid && iv.b >= mid && (!top || iv.z > top.z)) top = iv;
      if (top) out.set(top.owner, out.get(top.owner)! + (b - a) * h);
    }
  }
  return out;
}
