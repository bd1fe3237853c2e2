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

/** How far outside the rim a label's nearest point may be, relative to the radius. */
const OUTSIDE = 1.45;
/** Texts this much larger than the typical text are titles, not labels. */
const TITLE_RATIO = 1.25;

const NUMERIC = /^[\s(+\-−]*[$€£¥]?\s*\d[\d\s.,\u2009\u202f]*\s*(%|‰|[kKMB]|pp)?\s*\)?$/;

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
): (number | null)[] {
  const out: (number | null)[] = wedges.map(() => null);
  if (wedges.length === 0 || texts.length === 0) return out;
  const usable = texts.map((t, i) => ({ t, i })).filter(({ t }) => t.content.trim().length > 0 && Number.isFinite(t.x) && Number.isFinite(t.y));
  const typical = median(usable.map(({ t }) => t.fontSize).filter((s) => s > 0));
  const pairs: { w: number; t: number; cost: number }[] = [];
  for (const { t, i } of usable) {
    if (typical > 0 && t.fontSize > TITLE_RATIO * typical) continue;
    const width = t.width > 0 ? t.width : 0.55 * t.fontSize * t.content.length;
    const x0 = t.anchor === 'start' ? t.x : t.anchor === 'end' ? t.x - width : t.x - width / 2;
    const x1 = x0 + width;
    const y1 = t.y + 0.2 * t.fontSize;
    const y0 = t.y - 0.8 * t.fontSize;
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
      if (dNear > OUTSIDE * g.R) continue;
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
        cost = dev / Math.PI + 0.3 * ((rho - g.R) / g.R);
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
