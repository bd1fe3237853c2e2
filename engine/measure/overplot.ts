/**
 * Overplotting: how many point marks overlap another point mark, and how many
 * are hidden: less than a tenth of their centre shows through the points
 * painted after them (each passes 1 − opacity of what is under it). Each
 * point is taken as the disk around its painted box (circles: radius plus
 * half the stroke). Points are hashed into square cells one largest
 * diameter wide, so each point is compared only with the points of the 3 × 3
 * cells around it: linear work for points of similar size.
 */
import type { Chart } from '../classify/chart.js';

export interface OverplotMeasure {
  /** Point marks considered. */
  points: number;
  /** Points whose disk overlaps at least one other point's disk. */
  overlapping: number;
  /** overlapping / points (0 without points). */
  overlapShare: number;
  /** Points of which less than `HIDDEN_BELOW` of the centre shows through later points. */
  hidden: number;
  hiddenShare: number;
  /** Mean fill (else stroke) opacity of the points: translucent points show density where they pile up. */
  meanOpacity: number;
  /** Scene indices of overlapping points (first 200). */
  items: number[];
}

interface Disk {
  index: number;
  x: number;
  y: number;
  r: number;
  alpha: number;
}

/** A point is hidden when less than this share of its centre shows through the points over it. */
export const HIDDEN_BELOW = 0.1;

const MAX_LISTED = 200;

export function measureOverplot(chart: Chart): OverplotMeasure {
  const disks: Disk[] = [];
  let opacitySum = 0;
  chart.scene.items.forEach((it, i) => {
    if (chart.roles[i]?.sub !== 'mark/point' || it.kind !== 'shape') return;
    const alpha = Math.min(1, it.fill.kind !== 'none' ? it.fill.opacity : it.stroke.opacity);
    let d: Disk;
    if (it.circle) d = { index: i, x: it.circle.cx, y: it.circle.cy, r: it.circle.r + it.strokeWidth / 2, alpha };
    else d = { index: i, x: it.bbox.x + it.bbox.width / 2, y: it.bbox.y + it.bbox.height / 2, r: Math.max(it.bbox.width, it.bbox.height) / 2, alpha };
    if (!Number.isFinite(d.x + d.y + d.r) || d.r <= 0) return;
    disks.push(d);
    opacitySum += alpha;
  });
  const n = disks.length;
  const empty: OverplotMeasure = { points: n, overlapping: 0, overlapShare: 0, hidden: 0, hiddenShare: 0, meanOpacity: n > 0 ? opacitySum / n : 0, items: [] };
  if (n < 2) return empty;
  let rMax = 0;
  for (const d of disks) rMax = Math.max(rMax, d.r);
  const cell = 2 * rMax;
  let minX = Infinity;
  let minY = Infinity;
  let maxY = -Infinity;
  for (const d of disks) {
    minX = Math.min(minX, d.x);
    minY = Math.min(minY, d.y);
    maxY = Math.max(maxY, d.y);
  }
  // Cells are numbered column by column; one spare row keeps neighbours of the last row apart.
  const rows = Math.floor((maxY - minY) / cell) + 3;
  const cellOf = (x: number, y: number): [number, number] => [Math.floor((x - minX) / cell) + 1, Math.floor((y - minY) / cell) + 1];
  const grid = new Map<number, number[]>();
  disks.forEach((d, k) => {
    const [cx, cy] = cellOf(d.x, d.y);
    const key = cx * rows + cy;
    let list = grid.get(key);
    if (!list) grid.set(key, (list = []));
    list.push(k);
  });
  const overlaps = new Uint8Array(n);
  // Light passing through at each point's centre, from the points painted over it.
  const through = new Float64Array(n).fill(1);
  disks.forEach((d, k) => {
    const [cx, cy] = cellOf(d.x, d.y);
    for (let gy = cy - 1; gy <= cy + 1; gy++) {
      for (let gx = cx - 1; gx <= cx + 1; gx++) {
        const list = grid.get(gx * rows + gy);
        if (!list) continue;
        for (const m of list) {
          if (m <= k) continue;
          const e = disks[m]!;
          const dist = Math.hypot(d.x - e.x, d.y - e.y);
          if (dist < d.r + e.r) {
            overlaps[k] = 1;
            overlaps[m] = 1;
          }
          // The later-painted point over the earlier one's centre dims it.
          const [under, over] = d.index < e.index ? [k, m] : [m, k];
          if (dist < disks[over]!.r) through[under]! *= 1 - disks[over]!.alpha;
        }
      }
    }
  });
  let overlapping = 0;
  let hiddenCount = 0;
  const items: number[] = [];
  for (let k = 0; k < n; k++) {
    if (overlaps[k]) {
      overlapping++;
      if (items.length < MAX_LISTED) items.push(disks[k]!.index);
    }
    if (through[k]! < HIDDEN_BELOW) hiddenCount++;
  }
  return { ...empty, overlapping, overlapShare: overlapping / n, hidden: hiddenCount, hiddenShare: hiddenCount / n, items };
}
