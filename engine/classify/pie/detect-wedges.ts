/**
 * Pies, donuts, roses and tilted/extruded pies from their geometry alone.
 *
 * A wedge is a closed filled outline made of an outer circular arc plus two
 * radial edges to the centre (pie slice) or two radial edges and an inner
 * concentric arc (ring segment); a full circle or ring is a wedge of 2π.
 * Each candidate outline is fitted on its own (fit-circle-wedge), the fits are
 * grouped around a common centre with pulled-out wedges and shadow copies
 * recognised (group-wedges), and when no flat pie explains the drawing as well
 * as a tilted one, the rims are fitted with an ellipse and everything is
 * re-examined in the un-projected plane (tilted-wedges).
 *
 * Shares. `angleShare` is a wedge's angle over the total angle drawn in its
 * ring; `areaShare` its sector area over the total. `share` is what a reader
 * needs as the data value:
 * - ordinary pies and donuts (and roses whose angles differ): the angle share;
 * - roses / polar-area charts (every wedge the same angle, radii differ): the
 *   share of radial extent (outer − inner radius). Plotting libraries map the
 *   value linearly onto the radius measured from the inner radius (polar bar
 *   charts, "rose" series), so the radial extent is the data; the angle
 *   carries nothing. What the eye compares in such a chart is area, which
 *   grows with the square of the radius: `areaShare` keeps that, so the
 *   difference between the two can be measured as a distortion.
 * - tilted pies: the angle share after un-projection (the true share).
 */
import type { Rgba } from '../../color/types.js';
import type { ShapeItem, TextItem } from '../../read/scene.js';
import type { PieInfo, Wedge } from '../chart.js';
import { fitCircleWedge } from './fit-circle-wedge.js';
import { groupWedges, type FittedShape, type Member, type PieGroup } from './group-wedges.js';
import { linkLabels, type Leader } from './link-labels.js';
import { ringArea, ringExtent, ringFromPolyline, type Ring } from './outline.js';
import { detectTilted, type Candidate } from './tilted-wedges.js';

/** Radii that differ by more than this (relative) make a rose. */
const RADIUS_VARIES = 0.02;
/** Angles within this (relative) count as equal. */
const ANGLE_EQUAL = 0.02;
/** Starts within this of 2π (radians) are written as (slightly negative) starts near 0. */
const SNAP = 1e-4;

/** Outer ring (largest area) and an optional hole; null when the shape cannot be a wedge. */
function ringsOf(s: ShapeItem): { ring: Ring; hole: Ring | null } | null {
  const size = Math.max(s.bbox.width, s.bbox.height);
  if (!(size > 0) || !Number.isFinite(size)) return null;
  const eps = 1e-7 * size;
  const rings: { ring: Ring; area: number }[] = [];
  for (const poly of s.polylines) {
    const ring = ringFromPolyline(poly, eps);
    if (ring) rings.push({ ring, area: Math.abs(ringArea(ring)) });
  }
  if (rings.length === 0) return null;
  rings.sort((a, b) => b.area - a.area);
  const outer = rings[0]!;
  if (!(outer.area > 0)) return null;
  const rest = rings.slice(1).filter((r) => r.area > 0.01 * outer.area);
  if (rest.length === 0) return { ring: outer.ring, hole: null };
  if (rest.length === 1) return { ring: outer.ring, hole: rest[0]!.ring };
  return null;
}

function isCandidate(s: ShapeItem): boolean {
  return s.kind === 'shape' && s.fill.kind !== 'none' && s.fill.opacity > 0 && s.polylines.length > 0;
}

interface Chosen {
  group: PieGroup;
  tilted: ReturnType<typeof detectTilted>;
}

/**
 * The pie drawn by these shapes, or null when there is none. `shapes` are
 * the scene's shape items that may be wedges (page background and legend
 * swatches may be left in: they do not fit the wedge model); `texts` are
 * searched for wedge labels.
 */
export function detectPie(shapes: ShapeItem[], texts: TextItem[]): PieInfo | null {
  const cands: Candidate[] = [];
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const s of shapes) {
    if (!isCandidate(s)) continue;
    const rings = ringsOf(s);
    if (!rings) continue;
    cands.push({ item: s.index, shape: s, ring: rings.ring, hole: rings.hole });
    x0 = Math.min(x0, s.bbox.x);
    y0 = Math.min(y0, s.bbox.y);
    x1 = Math.max(x1, s.bbox.x + s.bbox.width);
    y1 = Math.max(y1, s.bbox.y + s.bbox.height);
  }
  if (cands.length === 0) return null;
  const extent = Math.max(x1 - x0, y1 - y0);

  // Flat.
  const fitted: FittedShape[] = [];
  for (const c of cands) {
    const f = fitCircleWedge(c.ring, c.hole);
    if (f) fitted.push({ item: c.item, shape: c.shape, fit: f, extent: ringExtent(c.ring) });
  }
  const flat = groupWedges(fitted, extent);
  const flatCovers = flat ? new Set(flat.members.map((m) => m.f.item)) : new Set<number>();

  // Tilted: only worth trying when a flat pie does not already account for the apex wedges.
  const tilted = detectTilted(
    cands.filter((c) => !flatCovers.has(c.item)),
    extent,
  );
  let chosen: Chosen | null = null;
  if (flat) chosen = { group: flat, tilted: null };
  if (tilted) {
    const tiltedArea = tilted.group.members.reduce((s, m) => s + m.f.shape.area, 0);
    const flatArea = flat ? flat.members.reduce((s, m) => s + m.f.shape.area, 0) : 0;
    if (tiltedArea > flatArea * 1.01) chosen = { group: tilted.group, tilted };
  }
  if (!chosen) return null;
  return buildInfo(chosen, texts, leadersOf(shapes));
}

/** Stroked, unfilled open lines: possible leader lines from wedges to labels (end points only). */
function leadersOf(shapes: readonly ShapeItem[]): Leader[] {
  const out: Leader[] = [];
  for (const s of shapes) {
    if (s.kind !== 'shape' || s.stroke.kind === 'none' || (s.fill.kind !== 'none' && s.fill.opacity > 0)) continue;
    if (s.polylines.length !== 1 || s.closed[0]) continue;
    const p = s.polylines[0]!;
    if (p.length < 4) continue;
    const L = { x0: p[0]!, y0: p[1]!, x1: p[p.length - 2]!, y1: p[p.length - 1]! };
    if ([L.x0, L.y0, L.x1, L.y1].every(Number.isFinite)) out.push(L);
  }
  return out;
}

function buildInfo(chosen: Chosen, texts: TextItem[], leaders: Leader[]): PieInfo {
  const { group, tilted } = chosen;
  // A start a hair short of a full turn is a start at 12 o'clock measured with rounding error.
  for (const m of group.members) if (2 * Math.PI - m.start < SNAP) m.start -= 2 * Math.PI;
  const members = [...group.members].sort((a, b) => a.start - b.start);

  // Rings: wedges at the same radii share the angle; roses (one layer, radii differ) share the whole.
  const layerOf = layers(members);
  const angleTotal = new Map<number, number>();
  const areaTotal = new Map<number, number>();
  const extentTotal = new Map<number, number>();
  members.forEach((m, i) => {
    const L = layerOf[i]!;
    angleTotal.set(L, (angleTotal.get(L) ?? 0) + m.sweep);
    areaTotal.set(L, (areaTotal.get(L) ?? 0) + sectorArea(m));
    extentTotal.set(L, (extentTotal.get(L) ?? 0) + (m.R - m.r));
  });
  const outer = members.map((m) => m.R);
  const radiusVaries = members.length >= 2 && Math.max(...outer) > Math.min(...outer) * (1 + RADIUS_VARIES);
  const sweeps = members.map((m) => m.sweep);
  const anglesEqual = members.length >= 2 && Math.max(...sweeps) <= Math.min(...sweeps) * (1 + ANGLE_EQUAL);
  const shareBasis: 'angle' | 'radius' = radiusVaries && anglesEqual ? 'radius' : 'angle';

  const toPlane = tilted ? (x: number, y: number) => tilted.rect.forward(x, y) : undefined;
  const labels = linkLabels(members, texts, toPlane, leaders);
  const textByIndex = new Map(texts.map((t, i) => [i, t] as const));

  const wallsOf = new Map<number, number[]>();
  if (tilted) {
    for (const [wall, wedge] of tilted.walls) {
      const list = wallsOf.get(wedge) ?? [];
      list.push(wall);
      wallsOf.set(wedge, list);
    }
  }

  const wedges: Wedge[] = members.map((m, i) => {
    const L = layerOf[i]!;
    const angleShare = m.sweep / angleTotal.get(L)!;
    const areaShare = sectorArea(m) / areaTotal.get(L)!;
    const radialShare = (m.R - m.r) / extentTotal.get(L)!;
    const t = labels[i] ?? null;
    const text = t !== null ? textByIndex.get(t)! : null;
    return {
      item: m.f.item,
      label: text ? text.content.trim() : null,
      labelItem: text ? text.index : null,
      color: colorOf(m),
      cx: m.cx,
      cy: m.cy,
      innerRadius: m.r,
      outerRadius: m.R,
      start: m.start,
      end: m.start + m.sweep,
      share: shareBasis === 'radius' ? radialShare : angleShare,
      angleShare,
      areaShare,
      offset: m.exploded ? m.offset : 0,
      walls: (wallsOf.get(m.f.item) ?? []).sort((a, b) => a - b),
    };
  });

  const inner = members.map((m) => m.r).sort((a, b) => a - b);
  const ellipse = tilted
    ? {
        cx: tilted.ellipseFit.cx,
        cy: tilted.ellipseFit.cy,
        rx: tilted.ellipseFit.rx,
        ry: tilted.ellipseFit.ry,
        angle: tilted.ellipseFit.angle,
        tilt: tilted.rect.tilt,
      }
    : null;
  return {
    cx: group.cx,
    cy: group.cy,
    radius: Math.max(...outer),
    innerRadius: inner[Math.floor(inner.length / 2)] ?? 0,
    wedges,
    ellipse,
    walls: tilted ? [...tilted.walls.keys()].sort((a, b) => a - b) : [],
    exploded: members.filter((m) => m.exploded).map((m) => m.f.item),
    radiusVaries,
    shadows: group.shadows,
    shareBasis,
  };
}

function sectorArea(m: Member): number {
  return (m.sweep / 2) * (m.R * m.R - m.r * m.r);
}

function colorOf(m: Member): Rgba | null {
  const p = m.f.shape.fill;
  return p.kind === 'none' ? null : p.color;
}

/**
 * Layer index per member. Wedges whose angle ranges overlap (possible only
 * when they are radially apart: nested rings) go to different layers, keyed
 * by inner radius; a single-layer chart (pie, donut, rose) is layer 0.
 */
function layers(members: readonly Member[]): number[] {
  let nested = false;
  for (let i = 0; i < members.length && !nested; i++) {
    for (let j = i + 1; j < members.length; j++) {
      const a = members[i]!;
      const b = members[j]!;
      const d = (((b.start - a.start) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
      const overlap = Math.min(a.sweep, d + b.sweep) - Math.max(0, d) > 1e-3 || Math.min(a.sweep, d - 2 * Math.PI + b.sweep) > 1e-3;
      if (overlap) {
        nested = true;
        break;
      }
    }
  }
  if (!nested) return members.map(() => 0);
  const radii: number[] = [];
  return members.map((m) => {
    const tol = 0.02 * m.R;
    let k = radii.findIndex((r) => Math.abs(r - m.r) <= tol);
    if (k < 0) {
      radii.push(m.r);
      k = radii.length - 1;
    }
    return k;
  });
}
