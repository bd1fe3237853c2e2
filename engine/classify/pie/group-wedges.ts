/**
 * From individually fitted wedges to one pie: shadow copies set aside, a
 * common centre chosen (a cluster of wedge centres, or where the bisectors of
 * pulled-out wedges meet), members gathered (in place, or pulled out along
 * their own bisector), overlaps resolved, and the centre refitted by least
 * squares over all in-place wedges' arcs and radial edges.
 */
import type { ShapeItem } from '../../read/scene.js';
import { fitCentre, type CentreFitSet, type CircleWedgeFit } from './fit-circle-wedge.js';
import { compass, normAngle } from './outline.js';
import { paintLightness } from './paint-tone.js';

export interface FittedShape {
  item: number;
  shape: ShapeItem;
  fit: CircleWedgeFit;
  /** Extent of the outline the fit came from (world units of the plane the fit lives in). */
  extent: number;
}

export interface Member {
  f: FittedShape;
  /** The wedge's own centre (for pulled-out wedges: where it is drawn). */
  cx: number;
  cy: number;
  R: number;
  r: number;
  start: number;
  sweep: number;
  full: boolean;
  exploded: boolean;
  /** Distance the wedge is pulled out from the common centre. */
  offset: number;
}

export interface PieGroup {
  cx: number;
  cy: number;
  members: Member[];
  /** Items that are offset copies of members drawn as shadows. */
  shadows: number[];
  /** Summed area of the members (for comparing candidate pies). */
  score: number;
}

/** Largest pull-out, relative to the wedge's radius. */
const MAX_EXPLODE = 0.6;
/** Largest angle between a pull-out offset and the wedge's bisector. */
const EXPLODE_ANGLE = (12 * Math.PI) / 180;
/** Largest offset of a shadow copy, relative to the radius. */
const MAX_SHADOW_OFFSET = 0.2;
/** At most this many wedges take part in pairwise bisector searches. */
const MAX_PAIRWISE = 60;

function centreTol(R: number, extent: number): number {
  return Math.max(0.01 * R, 1e-3 * extent, 1e-9);
}

function angleDiff(a: number, b: number): number {
  const d = normAngle(a - b);
  return Math.min(d, 2 * Math.PI - d);
}

/** Length of the intersection of two angular intervals on the circle. */
export function angularOverlap(s1: number, w1: number, s2: number, w2: number): number {
  if (w1 >= 2 * Math.PI - 1e-9) return Math.min(w2, 2 * Math.PI);
  if (w2 >= 2 * Math.PI - 1e-9) return Math.min(w1, 2 * Math.PI);
  const d = normAngle(s2 - s1);
  const seg = (a0: number, a1: number, b0: number, b1: number): number => Math.max(0, Math.min(a1, b1) - Math.max(a0, b0));
  return seg(0, w1, d, d + w2) + seg(0, w1, d - 2 * Math.PI, d - 2 * Math.PI + w2);
}

/** Same shape, same size, small offset: one is a copy of the other. */
function sameShape(a: CircleWedgeFit, b: CircleWedgeFit): boolean {
  const R = Math.max(a.R, b.R);
  const tol = 0.01 * R + 1e-9;
  if (Math.abs(a.R - b.R) > tol || Math.abs(a.r - b.r) > tol) return false;
  if (a.full !== b.full) return false;
  const off = Math.hypot(a.cx - b.cx, a.cy - b.cy);
  if (off > MAX_SHADOW_OFFSET * R) return false;
  if (a.full) return true;
  const tolA = (0.5 * Math.PI) / 180;
  return angleDiff(a.start, b.start) <= tolA && Math.abs(a.sweep - b.sweep) <= tolA;
}

/** a looks like a shadow of b: drawn through a filter b lacks, more transparent, or darker. */
function shadowLike(a: ShapeItem, b: ShapeItem): boolean {
  if (a.filter !== null && b.filter === null) return true;
  if (a.fill.opacity < b.fill.opacity - 0.05) return true;
  const la = paintLightness(a.fill);
  const lb = paintLightness(b.fill);
  return la !== null && lb !== null && la < lb - 8;
}

function bisector(m: { start: number; sweep: number }): [number, number] {
  const a = m.start + m.sweep / 2;
  return [Math.sin(a), -Math.cos(a)];
}

/** The fit as a member relative to centre (cx, cy), or null when it does not belong to that pie. */
function asMember(f: FittedShape, cx: number, cy: number, tol: number): Member | null {
  const w = f.fit;
  const ox = w.cx - cx;
  const oy = w.cy - cy;
  const off = Math.hypot(ox, oy);
  const base: Member = { f, cx: w.cx, cy: w.cy, R: w.R, r: w.r, start: w.start, sweep: w.sweep, full: w.full, exploded: false, offset: 0 };
  if (off <= tol) return base;
  if (w.full || off > MAX_EXPLODE * w.R) return null;
  const [ux, uy] = bisector(w);
  const along = ox * ux + oy * uy;
  if (!(along > 0)) return null;
  const across = Math.abs(ox * uy - oy * ux);
  if (across > Math.max(tol, Math.tan(EXPLODE_ANGLE) * along)) return null;
  return { ...base, exploded: true, offset: off };
}

function overlaps(a: Member, b: Member): boolean {
  const ang = angularOverlap(a.start, a.sweep, b.start, b.sweep);
  const tolA = Math.max((0.5 * Math.PI) / 180, 0.02 * Math.min(a.sweep, b.sweep));
  if (ang <= tolA) return false;
  const rad = Math.min(a.R, b.R) - Math.max(a.r, b.r);
  return rad > 0.1 * Math.min(a.R - a.r, b.R - b.r);
}

/** Least-squares point nearest to all lines through (px, py) with direction (ux, uy). */
function linesMeet(lines: { px: number; py: number; ux: number; uy: number }[]): [number, number] | null {
  let a11 = 0;
  let a12 = 0;
  let a22 = 0;
  let b1 = 0;
  let b2 = 0;
  for (const l of lines) {
    // Projector onto the line's normal: I − u·uᵀ.
    const n11 = 1 - l.ux * l.ux;
    const n12 = -l.ux * l.uy;
    const n22 = 1 - l.uy * l.uy;
    a11 += n11;
    a12 += n12;
    a22 += n22;
    b1 += n11 * l.px + n12 * l.py;
    b2 += n12 * l.px + n22 * l.py;
  }
  const det = a11 * a22 - a12 * a12;
  if (!(Math.abs(det) > 1e-9 * Math.max(1, a11 * a22))) return null;
  return [(a22 * b1 - a12 * b2) / det, (a11 * b2 - a12 * b1) / det];
}

interface Gathered {
  cx: number;
  cy: number;
  members: Member[];
  score: number;
  order: number;
}

function gather(fits: readonly FittedShape[], cx: number, cy: number, extent: number): Gathered {
  const cands: Member[] = [];
  for (const f of fits) {
    const m = asMember(f, cx, cy, centreTol(f.fit.R, extent));
    if (m) cands.push(m);
  }
  // In-place wedges first, then larger ones, then the ones drawn on top.
  cands.sort((a, b) => Number(a.exploded) - Number(b.exploded) || b.f.fit.area - a.f.fit.area || b.f.item - a.f.item);
  const members: Member[] = [];
  for (const c of cands) if (!members.some((m) => overlaps(m, c))) members.push(c);
  const score = members.reduce((s, m) => s + m.f.fit.area, 0);
  const order = members.reduce((s, m) => Math.max(s, m.f.item), -1);
  return { cx, cy, members, score, order };
}

/**
 * Chooses the pie among fitted wedges; null when no set of wedges forms one
 * (at least two wedges around a common centre, or a single full circle or
 * ring that is the one large circle of the drawing).
 */
export function groupWedges(all: readonly FittedShape[], extent: number): PieGroup | null {
  if (all.length === 0) return null;
  // 1. Shadow copies that look like shadows (filtered, more transparent, darker). Only fits of
  //    nearly the same radius and nearby centres are compared: a sweep over x within radius bands.
  const shadowOf = new Map<number, number>();
  const byR = [...all].sort((a, b) => a.fit.R - b.fit.R);
  for (let i = 0; i < byR.length; ) {
    let j = i;
    while (j < byR.length && byR[j]!.fit.R <= byR[i]!.fit.R * 1.02 + 1e-9) j++;
    // Band [i, j) plus the next band's start overlaps enough for a 1 % radius tolerance.
    let k = j;
    while (k < byR.length && byR[k]!.fit.R <= byR[j - 1]!.fit.R * 1.01 + 1e-9) k++;
    const band = byR.slice(i, k).sort((a, b) => a.fit.cx - b.fit.cx);
    for (let p = 0; p < band.length; p++) {
      const a = band[p]!;
      const reach = MAX_SHADOW_OFFSET * a.fit.R * 1.02;
      for (let q = p + 1; q < band.length && band[q]!.fit.cx - a.fit.cx <= reach; q++) {
        const b = band[q]!;
        if (!sameShape(a.fit, b.fit)) continue;
        if (shadowLike(a.shape, b.shape)) shadowOf.set(a.item, b.item);
        else if (shadowLike(b.shape, a.shape)) shadowOf.set(b.item, a.item);
      }
    }
    i = j;
  }
  const fits = all.filter((f) => !shadowOf.has(f.item));
  if (fits.length === 0) return null;

  // 2. Candidate centres: clusters of wedge centres (a grid hash keeps this linear)…
  const centres: [number, number][] = [];
  const clusters: FittedShape[][] = [];
  const cell = Math.max(...fits.map((f) => centreTol(f.fit.R, extent)));
  const grid = new Map<string, FittedShape[][]>();
  const key = (gx: number, gy: number): string => `${gx},${gy}`;
  for (const f of [...fits].sort((a, b) => b.fit.area - a.fit.area)) {
    const tol = centreTol(f.fit.R, extent);
    const gx = Math.floor(f.fit.cx / cell);
    const gy = Math.floor(f.fit.cy / cell);
    let found: FittedShape[] | null = null;
    for (let dx = -1; dx <= 1 && !found; dx++) {
      for (let dy = -1; dy <= 1 && !found; dy++) {
        for (const cl of grid.get(key(gx + dx, gy + dy)) ?? []) {
          if (Math.hypot(cl[0]!.fit.cx - f.fit.cx, cl[0]!.fit.cy - f.fit.cy) <= tol) {
            found = cl;
            break;
          }
        }
      }
    }
    if (found) {
      found.push(f);
      continue;
    }
    const cl = [f];
    clusters.push(cl);
    const k = key(gx, gy);
    const list = grid.get(k);
    if (list) list.push(cl);
    else grid.set(k, [cl]);
  }
  clusters.sort((a, b) => b.length - a.length || b[0]!.fit.area - a[0]!.fit.area);
  for (const cl of clusters.slice(0, 24)) {
    let sx = 0;
    let sy = 0;
    for (const f of cl) {
      sx += f.fit.cx;
      sy += f.fit.cy;
    }
    centres.push([sx / cl.length, sy / cl.length]);
  }
  // …and where the bisectors of pairs of partial wedges meet (every wedge pulled out).
  const partial = fits.filter((f) => !f.fit.full).sort((a, b) => b.fit.area - a.fit.area).slice(0, MAX_PAIRWISE);
  for (let i = 0; i < partial.length; i++) {
    for (let j = i + 1; j < partial.length; j++) {
      const a = partial[i]!.fit;
      const b = partial[j]!.fit;
      if (Math.abs(a.R - b.R) > 0.05 * Math.max(a.R, b.R)) continue;
      const [ux, uy] = bisector(a);
      const [vx, vy] = bisector(b);
      const p = linesMeet([
        { px: a.cx, py: a.cy, ux, uy },
        { px: b.cx, py: b.cy, ux: vx, uy: vy },
      ]);
      if (!p) continue;
      const da = Math.hypot(a.cx - p[0], a.cy - p[1]);
      const db = Math.hypot(b.cx - p[0], b.cy - p[1]);
      if (da > MAX_EXPLODE * a.R || db > MAX_EXPLODE * b.R) continue;
      if (da < centreTol(a.R, extent) && db < centreTol(b.R, extent)) continue; // already a cluster
      centres.push(p);
    }
  }

  // 3. Best centre by member area (ties: drawn later).
  let best: Gathered | null = null;
  for (const [cx, cy] of centres) {
    const g = gather(fits, cx, cy, extent);
    if (g.members.length === 0) continue;
    if (!best || g.score > best.score * 1.01 || (g.score >= best.score * 0.99 && g.order > best.order)) best = g;
  }
  if (!best) return null;

  // 4. Acceptance.
  if (best.members.length === 1) {
    const only = best.members[0]!;
    if (!only.full) return null;
    if (only.R < 0.1 * extent) return null;
    const rival = fits.some((f) => f.item !== only.f.item && f.fit.full && f.fit.R >= 0.5 * only.R);
    if (rival) return null;
  }

  // 5. Refit the common centre over the in-place wedges (and refine the bisector meeting point otherwise).
  const inPlace = best.members.filter((m) => !m.exploded);
  let cx = best.cx;
  let cy = best.cy;
  if (inPlace.length > 0) {
    const sets: CentreFitSet[] = [];
    const radii: number[] = [];
    const lines: [number, number, number, number][] = [];
    for (const m of inPlace) {
      sets.push({ points: m.f.fit.outerPts, radius: radii.length });
      radii.push(m.R);
      if (m.r > 0 && m.f.fit.innerPts.length > 0) {
        sets.push({ points: m.f.fit.innerPts, radius: radii.length });
        radii.push(m.r);
      }
      lines.push(...m.f.fit.radial);
    }
    const res = fitCentre(sets, lines, { cx, cy, radii });
    const drift = Math.hypot(res.cx - cx, res.cy - cy);
    if (Number.isFinite(res.cx) && Number.isFinite(res.cy) && drift <= centreTol(inPlace[0]!.R, extent) * 3) {
      cx = res.cx;
      cy = res.cy;
      let k = 0;
      for (const m of inPlace) {
        const R = res.radii[k++]!;
        let r = m.r;
        if (m.r > 0 && m.f.fit.innerPts.length > 0) r = res.radii[k++]!;
        const angles = anglesAround(m, cx, cy);
        Object.assign(m, { cx, cy, R, r, ...angles });
      }
    }
  } else {
    const p = linesMeet(best.members.map((m) => {
      const [ux, uy] = bisector(m);
      return { px: m.cx, py: m.cy, ux, uy };
    }));
    if (p) [cx, cy] = p;
  }
  for (const m of best.members) if (m.exploded) m.offset = Math.hypot(m.cx - cx, m.cy - cy);

  // 6. Shadows: copies of members set aside in step 1, plus same-shape copies drawn underneath a member.
  const memberItems = new Set(best.members.map((m) => m.f.item));
  const shadows = new Set<number>();
  for (const [s, of] of shadowOf) if (memberItems.has(of) || shadowOf.has(of)) shadows.add(s);
  for (const f of fits) {
    if (memberItems.has(f.item)) continue;
    const under = best.members.find((m) => m.f.item > f.item && sameShape(f.fit, m.f.fit));
    if (under) shadows.add(f.item);
  }
  return { cx, cy, members: best.members, shadows: [...shadows].sort((a, b) => a - b), score: best.score };
}

/** Start and sweep of an in-place wedge measured around a refitted centre, from its arc end points. */
function anglesAround(m: Member, cx: number, cy: number): { start: number; sweep: number } {
  const w = m.f.fit;
  if (w.full || !w.startPt || !w.endPt) return { start: m.start, sweep: m.sweep };
  const start = compass(w.startPt[0] - cx, w.startPt[1] - cy);
  const end = compass(w.endPt[0] - cx, w.endPt[1] - cy);
  let sweep = normAngle(end - start);
  // Keep the branch nearest the fitted sweep (matters only next to 0 or 2π).
  if (Math.abs(sweep + 2 * Math.PI - w.sweep) < Math.abs(sweep - w.sweep)) sweep += 2 * Math.PI;
  if (Math.abs(sweep - 2 * Math.PI - w.sweep) < Math.abs(sweep - w.sweep)) sweep -= 2 * Math.PI;
  return { start, sweep };
}
