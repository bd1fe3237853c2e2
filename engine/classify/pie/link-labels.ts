/**
 * Links texts to wedges: a label sits inside its wedge, or just outside the
 * rim near the wedge's bisector (with or without a leader line). Category
 * names win over numbers; each text labels at most one wedge and each wedge
 * gets at most one label.
 */
import type { TextItem } from '../../read/scene.js';
import { compass, normAngle } from './outline.js';

export interface LabelTarget {
  cx: number;
  cy: number;
  R: number;
  r: number;
  start: number;
  sweep: number;
}

/** A stroked open line (in page coordinates) that may lead from a wedge to its label. */
export interface Leader {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/** Text box [x0, y0, x1, y1] from anchor, advance width and font size. */
function textBox(t: TextItem): [number, number, number, number] {
  const width = t.width > 0 ? t.width : 0.55 * t.fontSize * t.content.length;
  const x0 = t.anchor === 'start' ? t.x : t.anchor === 'end' ? t.x - width : t.x - width / 2;
  return [x0, t.y - 0.8 * t.fontSize, x0 + width, t.y + 0.2 * t.fontSize];
}

/** How far outside the rim a label's nearest point may be, relative to the radius. */
const OUTSIDE = 1.45;
/** Texts this much larger than the typical text are titles, not labels. */
const TITLE_RATIO = 1.25;

const NUMERIC = /^[\s(+\-−]*[$€£¥]?\s*\d[\d\s.,\u2009\u202f]*\s*(%|‰|[kKMB]|pp)?\s*\)?$/;

/**
 * Texts that form a legend-like list: three or more with the same anchor at
 * the same x, stacked at a regular spacing (a legend's labels), or three or
 * more on one baseline at a regular spacing (a horizontal legend).
 */
function legendColumns(texts: readonly TextItem[]): Set<number> {
  const out = new Set<number>();
  const scan = (key: (t: TextItem) => number, along: (t: TextItem) => number): void => {
    const idx = texts.map((_, i) => i).filter((i) => Number.isFinite(key(texts[i]!)) && Number.isFinite(along(texts[i]!)));
    const used = new Set<number>();
    for (const i of idx) {
      if (used.has(i)) continue;
      const t = texts[i]!;
      const tol = Math.max(0.5, 0.05 * t.fontSize);
      const col = idx.filter((j) => texts[j]!.anchor === t.anchor && Math.abs(key(texts[j]!) - key(t)) <= tol);
      for (const j of col) used.add(j);
      if (col.length < 3) continue;
      const pos = col.map((j) => along(texts[j]!)).sort((a, b) => a - b);
      const gaps = pos.slice(1).map((p, k) => p - pos[k]!);
      const g = median(gaps);
      if (!(g > 0) || g > 4 * t.fontSize) continue;
      if (gaps.every((q) => Math.abs(q - g) <= 0.25 * g)) for (const j of col) out.add(j);
    }
  };
  scan((t) => t.x, (t) => t.y);
  scan((t) => t.y, (t) => t.x);
  return out;
}

function median(xs: number[]): number {
  if (xs.length === 0) return 0;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

/**
 * For each wedge, the index (into `texts`) of its label, or null. `toPlane`
 * maps page points into the plane the wedges live in (the un-projected plane
 * of a tilted pie); identity when omitted.
 */
export function linkLabels(
  wedges: readonly LabelTarget[],
  texts: readonly TextItem[],
  toPlane: (x: number, y: number) => [number, number] | null = (x, y) => [x, y],
  leaders: readonly Leader[] = [],
): (number | null)[] {
  const out: (number | null)[] = wedges.map(() => null);
  if (wedges.length === 0 || texts.length === 0) return out;
  const legendLike = legendColumns(texts);
  const typical = median(texts.filter((t) => t.content.trim().length > 0 && t.fontSize > 0).map((t) => t.fontSize));
  const usable = texts
    .map((t, i) => ({ t, i }))
    .filter(({ t, i }) => !legendLike.has(i) && t.content.trim().length > 0 && Number.isFinite(t.x) && Number.isFinite(t.y));
  // Roses: a short wedge's label sits beyond its own rim, within reach of the longest wedge.
  const Rmax = Math.max(...wedges.map((g) => g.R));
  const reach = OUTSIDE * Rmax;
  const pairs: { w: number; t: number; cost: number }[] = [];
  for (const { t, i } of usable) {
    if (typical > 0 && t.fontSize > TITLE_RATIO * typical) continue;
    const [x0, y0, x1, y1] = textBox(t);
    // A leader line from a wedge's rim ending at this text links the two before anything else.
    for (const L of leaders) {
      for (const [px, py, qx, qy] of [
        [L.x0, L.y0, L.x1, L.y1],
        [L.x1, L.y1, L.x0, L.y0],
      ] as const) {
        const gap = Math.hypot(qx - Math.min(Math.max(qx, x0), x1), qy - Math.min(Math.max(qy, y0), y1));
        if (gap > Math.max(1, t.fontSize)) continue;
        const p = toPlane(px, py);
        if (!p) continue;
        for (let w = 0; w < wedges.length; w++) {
          const g = wedges[w]!;
          const rho = Math.hypot(p[0] - g.cx, p[1] - g.cy);
          if (rho < g.r || rho > 1.2 * g.R) continue;
          const rel = normAngle(compass(p[0] - g.cx, p[1] - g.cy) - g.start);
          const slack = (2 * Math.PI) / 180;
          if (rel > g.sweep + slack && rel < 2 * Math.PI - slack) continue;
          pairs.push({ w, t: i, cost: -1 + gap / (100 * Math.max(1, t.fontSize)) });
        }
      }
    }
    const centre = toPlane((x0 + x1) / 2, (y0 + y1) / 2);
    if (!centre) continue;
    const numeric = NUMERIC.test(t.content);
    for (let w = 0; w < wedges.length; w++) {
      const g = wedges[w]!;
      // Nearest point of the text box to the wedge's centre, in the wedge's plane.
      const nx = Math.min(Math.max(g.cx, x0), x1);
      const ny = Math.min(Math.max(g.cy, y0), y1);
      const near = toPlane(nx, ny);
      if (!near) continue;
      const dNear = Math.hypot(near[0] - g.cx, near[1] - g.cy);
      const dx = centre[0] - g.cx;
      const dy = centre[1] - g.cy;
      const rho = Math.hypot(dx, dy);
      if (dNear > reach) continue;
      const phi = compass(dx, dy);
      const mid = g.start + g.sweep / 2;
      let dev = normAngle(phi - mid);
      if (dev > Math.PI) dev = 2 * Math.PI - dev;
      const half = g.sweep / 2;
      let cost: number;
      if (rho <= g.R && rho >= g.r) {
        if (dev > half) continue; // inside the pie but in another wedge
        cost = dev / Math.PI;
      } else if (rho > g.R) {
        const window = Math.max(half + (15 * Math.PI) / 180, (20 * Math.PI) / 180);
        if (dev > window) continue;
        cost = dev / Math.PI + 0.15 * ((rho - g.R) / Rmax);
      } else {
        continue; // in the hole of a donut
      }
      if (numeric) cost += 1;
      pairs.push({ w, t: i, cost });
    }
  }
  pairs.sort((a, b) => a.cost - b.cost);
  const usedT = new Set<number>();
  for (const p of pairs) {
    if (out[p.w] !== null || usedT.has(p.t)) continue;
    out[p.w] = p.t;
    usedT.add(p.t);
  }
  return out;
}
