/**
 * Extruded (3D) bars: many filled quadrilaterals that are not axis-aligned
 * rectangles, the faces of projected boxes. Faces with two vertical edges face
 * the viewer (one per bar is kept as the mark); the rest (tops, sides) are
 * the extrusion.
 */
import type { ShapeItem } from '../read/scene.js';

export interface ExtrudedBars {
  /** Faces that are decoration (tops and receding sides). */
  faces: number[];
  /** One front face per bar. */
  fronts: number[];
}

function quad(s: ShapeItem): number[] | null {
  if (s.polylines.length !== 1 || s.fill.kind === 'none' || s.rect) return null;
  let p = s.polylines[0]!;
  if (p.length >= 10 && Math.abs(p[0]! - p[p.length - 2]!) < 1e-6 && Math.abs(p[1]! - p[p.length - 1]!) < 1e-6) p = p.slice(0, -2);
  return p.length === 8 ? p : null;
}

function verticalEdges(p: number[]): number {
  let n = 0;
  for (let k = 0; k < 8; k += 2) {
    const dx = Math.abs(p[(k + 2) % 8]! - p[k]!);
    const dy = Math.abs(p[(k + 3) % 8]! - p[k + 1]!);
    if (dx <= 0.15 * dy && dy > 0) n++;
  }
  return n;
}

export function detectExtrudedBars(shapes: ShapeItem[]): ExtrudedBars | null {
  const quads = shapes.map((s) => ({ s, p: quad(s) })).filter((x): x is { s: ShapeItem; p: number[] } => x.p !== null);
  const filled = shapes.filter((s) => s.fill.kind !== 'none');
  if (quads.length < 9 || quads.length < 0.5 * filled.length) return null;
  const withVertical = quads.filter((q) => verticalEdges(q.p) === 2);
  if (withVertical.length < 0.3 * quads.length) return null;
  // Pair side faces per bar: faces sharing a vertical edge belong to one bar; keep the left one as its front.
  const fronts: number[] = [];
  const used = new Set<number>();
  const sorted = [...withVertical].sort((a, b) => a.s.index - b.s.index);
  for (const q of sorted) {
    if (used.has(q.s.index)) continue;
    const xs = [q.p[0]!, q.p[2]!, q.p[4]!, q.p[6]!];
    const partner = sorted.find((o) => o !== q && !used.has(o.s.index) && [o.p[0]!, o.p[2]!, o.p[4]!, o.p[6]!].some((x) => xs.some((y) => Math.abs(x - y) < 0.05)) && Math.abs(o.s.bbox.y + o.s.bbox.height - (q.s.bbox.y + q.s.bbox.height)) < 0.3 * q.s.bbox.height);
    used.add(q.s.index);
    if (partner) used.add(partner.s.index);
    const front = partner && partner.s.bbox.x < q.s.bbox.x ? partner : q;
    fronts.push(front.s.index);
  }
  const faces = quads.map((q) => q.s.index).filter((i) => !fronts.includes(i));
  return { faces, fronts };
}
