/**
 * Tilted and extruded pies: the top face's wedges meet at an apex and their
 * rims lie on an ellipse. The rim points of all apex wedges are fitted with
 * a direct least-squares ellipse; the ellipse and the apex give the
 * un-projection (see measure/pie/rectify-ellipse); every candidate outline is
 * then mapped into the un-projected plane, where the flat wedge model applies
 * unchanged. Side walls are filled faces hanging below the rim.
 */
import { fitEllipse, sampsonDistance, type EllipseFit } from '../../measure/pie/fit-ellipse.js';
import { rectifierFor, type Rectifier } from '../../measure/pie/rectify-ellipse.js';
import type { ShapeItem } from '../../read/scene.js';
import { fitCircleWedge } from './fit-circle-wedge.js';
import { groupWedges, type FittedShape, type PieGroup } from './group-wedges.js';
import { angleStep, compass, ringExtent, simplifyRing, type Ring } from './outline.js';
import { isShadeOf } from './paint-tone.js';

export interface Candidate {
  item: number;
  shape: ShapeItem;
  ring: Ring;
  hole: Ring | null;
}

interface ApexWedge {
  c: Candidate;
  ax: number;
  ay: number;
  /** Rim vertices, flat. */
  rim: number[];
  /** Direction from the apex to the rim's middle vertex. */
  mx: number;
  my: number;
}

export interface TiltedPie {
  rect: Rectifier;
  ellipseFit: EllipseFit;
  group: PieGroup;
  /** Wall item → wedge item. */
  walls: Map<number, number>;
}

/** Largest turn between consecutive simplified rim edges. */
const MAX_RIM_TURN = (35 * Math.PI) / 180;

/** The apex and rim of an outline made of two straight edges from one vertex and a smooth convex curve. */
function apexWedge(c: Candidate): ApexWedge | null {
  const ring = c.ring;
  const n = ring.x.length;
  const S = ringExtent(ring);
  if (!(S > 0)) return null;
  const keep = simplifyRing(ring, 2e-4 * S);
  const m = keep.length;
  if (m < 4) return null;
  let best: ApexWedge | null = null;
  let bestCount = 0;
  for (let k = 0; k < m; k++) {
    const a = keep[k]!;
    const next = keep[(k + 1) % m]!;
    const prev = keep[(k + m - 1) % m]!;
    const ax = ring.x[a]!;
    const ay = ring.y[a]!;
    const l1 = Math.hypot(ring.x[next]! - ax, ring.y[next]! - ay);
    const l2 = Math.hypot(ring.x[prev]! - ax, ring.y[prev]! - ay);
    if (l1 < 0.08 * S || l2 < 0.08 * S) continue;
    // Rim: original vertices from `next` forward to `prev`.
    const rimIdx: number[] = [];
    for (let i = next; ; i = (i + 1) % n) {
      rimIdx.push(i);
      if (i === prev) break;
      if (rimIdx.length > n) return null;
    }
    if (rimIdx.length < 3 || rimIdx.length <= bestCount) continue;
    let maxD = 0;
    for (const i of rimIdx) maxD = Math.max(maxD, Math.hypot(ring.x[i]! - ax, ring.y[i]! - ay));
    if (l1 < 0.2 * maxD || l2 < 0.2 * maxD) continue;
    // The rim sweeps monotonically around the apex…
    let sweep = 0;
    let sign = 0;
    let ok = true;
    for (let t = 0; t + 1 < rimIdx.length; t++) {
      const i = rimIdx[t]!;
      const j = rimIdx[t + 1]!;
      const s = angleStep(ring.x[i]! - ax, ring.y[i]! - ay, ring.x[j]! - ax, ring.y[j]! - ay);
      if (s === 0) continue;
      if (sign === 0) sign = Math.sign(s);
      else if (Math.sign(s) !== sign) {
        ok = false;
        break;
      }
      sweep += s;
    }
    if (!ok || sign === 0 || Math.abs(sweep) >= 2 * Math.PI) continue;
    // …and turns smoothly, always the same way, at its simplified vertices.
    const rimKeep: number[] = [];
    for (let t = 1; t < m; t++) rimKeep.push(keep[(k + t) % m]!);
    if (rimKeep.length < 3) continue;
    let turnSign = 0;
    for (let t = 1; t + 1 < rimKeep.length; t++) {
      const p = rimKeep[t - 1]!;
      const q = rimKeep[t]!;
      const r = rimKeep[t + 1]!;
      const turn = angleStep(ring.x[q]! - ring.x[p]!, ring.y[q]! - ring.y[p]!, ring.x[r]! - ring.x[q]!, ring.y[r]! - ring.y[q]!);
      if (Math.abs(turn) > MAX_RIM_TURN) {
        ok = false;
        break;
      }
      if (turn !== 0) {
        if (turnSign === 0) turnSign = Math.sign(turn);
        else if (Math.sign(turn) !== turnSign) {
          ok = false;
          break;
        }
      }
    }
    // The rim bulges away from the apex: it turns the way it sweeps.
    if (!ok || turnSign !== sign) continue;
    const rim: number[] = [];
    for (const i of rimIdx) rim.push(ring.x[i]!, ring.y[i]!);
    const mid = rimIdx[Math.floor(rimIdx.length / 2)]!;
    const mx = ring.x[mid]! - ax;
    const my = ring.y[mid]! - ay;
    best = { c, ax, ay, rim, mx, my };
    bestCount = rimIdx.length;
  }
  return best;
}

function mapRing(ring: Ring, f: (x: number, y: number) => [number, number] | null): Ring | null {
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < ring.x.length; i++) {
    const p = f(ring.x[i]!, ring.y[i]!);
    if (!p || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) return null;
    x.push(p[0]);
    y.push(p[1]);
  }
  return { x, y };
}

/**
 * Looks for a tilted pie among the candidates; null when the apex wedges do
 * not share an elliptical rim (or there are fewer than two of them).
 */
export function detectTilted(cands: readonly Candidate[], extent: number): TiltedPie | null {
  const apexes: ApexWedge[] = [];
  for (const c of cands) {
    const a = apexWedge(c);
    if (a) apexes.push(a);
  }
  if (apexes.length < 2) return null;
  // Group by apex position.
  const groups: ApexWedge[][] = [];
  for (const a of apexes) {
    const S = ringExtent(a.c.ring);
    const g = groups.find((q) => Math.hypot(q[0]!.ax - a.ax, q[0]!.ay - a.ay) <= Math.max(2e-3 * extent, 4e-3 * S));
    if (g) g.push(a);
    else groups.push([a]);
  }
  const scored = groups
    .filter((g) => g.length >= 2)
    .map((g) => ({ g, area: g.reduce((s, a) => s + a.c.shape.area, 0), ay: g.reduce((s, a) => s + a.ay, 0) / g.length }));
  if (scored.length === 0) return null;
  scored.sort((a, b) => b.area - a.area);
  // Of groups of nearly equal area (a top face and a bottom face), the top face is the higher one.
  const top = scored.filter((s) => s.area >= 0.95 * scored[0]!.area).sort((a, b) => a.ay - b.ay)[0]!;
  const members = top.g;
  let ax = 0;
  let ay = 0;
  for (const a of members) {
    ax += a.ax;
    ay += a.ay;
  }
  ax /= members.length;
  ay /= members.length;
  // Pulled-out apex wedges: apex offset along their own middle direction; shift their rims back.
  const rimPts: number[] = [];
  for (const a of members) rimPts.push(...a.rim);
  for (const a of apexes) {
    if (members.includes(a)) continue;
    const ox = a.ax - ax;
    const oy = a.ay - ay;
    const off = Math.hypot(ox, oy);
    const ml = Math.hypot(a.mx, a.my);
    if (!(off > 0) || !(ml > 0) || off > 0.6 * ml) continue;
    const cos = (ox * a.mx + oy * a.my) / (off * ml);
    if (cos < Math.cos((20 * Math.PI) / 180)) continue;
    for (let i = 0; i < a.rim.length; i += 2) rimPts.push(a.rim[i]! - ox, a.rim[i + 1]! - oy);
  }
  const fit = fitEllipse(rimPts);
  if (!fit) return null;
  if (fit.maxError > Math.max(0.01 * fit.rx, 1e-3 * extent)) return null;
  const rect = rectifierFor(fit, ax, ay);
  if (!rect) return null;

  // Every candidate in the un-projected plane.
  const fitted: FittedShape[] = [];
  for (const c of cands) {
    const ring = mapRing(c.ring, rect.forward);
    if (!ring) continue;
    const hole = c.hole ? mapRing(c.hole, rect.forward) : null;
    if (c.hole && !hole) continue;
    const f = fitCircleWedge(ring, hole);
    if (f) fitted.push({ item: c.item, shape: c.shape, fit: f, extent: ringExtent(ring) });
  }
  const group = groupWedges(fitted, extent / Math.max(rect.ellipse.ry / rect.ellipse.rx, 1e-6));
  if (!group || group.members.length < 1) return null;
  // The group must be the pie whose rim was fitted.
  if (Math.hypot(group.cx - rect.cx, group.cy - rect.cy) > 0.02 * rect.radius) return null;

  const walls = findWalls(cands, group, rect, fit);
  return { rect, ellipseFit: fit, group, walls };
}

/**
 * Side walls: outlines hanging below the rim (every vertex between the top
 * face's rim and the rim lowered by at most the major semi-axis), touching
 * the rim with at least two vertices, in a shade of the wedge they belong to.
 * The wedge is the one whose (un-projected) angle range holds the wall's rim vertices.
 */
function findWalls(cands: readonly Candidate[], group: PieGroup, rect: Rectifier, fit: EllipseFit): Map<number, number> {
  const walls = new Map<number, number>();
  const memberItems = new Set(group.members.map((m) => m.f.item));
  const shadowItems = new Set(group.shadows);
  const { cx, cy, rx: a, ry: b, angle } = fit;
  const cos = Math.cos(angle);
  const sin = Math.sin(angle);
  // Minor-axis direction pointing down the page.
  let vx = -sin;
  let vy = cos;
  if (vy < 0) {
    vx = -vx;
    vy = -vy;
  }
  const ux = vy;
  const uy = -vx;
  const tol = Math.max(0.006 * a, 1e-9);
  const depthMax = a;
  for (const c of cands) {
    if (memberItems.has(c.item) || shadowItems.has(c.item)) continue;
    const ring = c.ring;
    let inZone = true;
    let below = false;
    const rimAngles: number[] = [];
    for (let i = 0; i < ring.x.length; i++) {
      const px = ring.x[i]! - cx;
      const py = ring.y[i]! - cy;
      const u = px * ux + py * uy;
      const w = px * vx + py * vy;
      if (Math.abs(u) > a + tol) {
        inZone = false;
        break;
      }
      const h = b * Math.sqrt(Math.max(0, 1 - (u * u) / (a * a)));
      if (w < -h - tol || w > h + depthMax + tol) {
        inZone = false;
        break;
      }
      if (sampsonDistance(fit.conic, ring.x[i]!, ring.y[i]!) <= tol) {
        const q = rect.forward(ring.x[i]!, ring.y[i]!);
        if (q) rimAngles.push(compass(q[0] - rect.cx, q[1] - rect.cy));
      } else if (w > -h + tol) {
        below = true;
      }
    }
    if (!inZone || !below || rimAngles.length < 2) continue;
    // Circular mean of the rim vertices' angles.
    let sx = 0;
    let sy = 0;
    for (const t of rimAngles) {
      sx += Math.sin(t);
      sy += Math.cos(t);
    }
    const mean = compass(sx, -sy);
    const owner = group.members.find((m) => {
      const d = (((mean - m.start) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
      return d <= m.sweep;
    });
    if (!owner) continue;
    const wallColor = c.shape.fill.color;
    const wedgeColor = owner.f.shape.fill.color;
    if (wallColor && wedgeColor && !isShadeOf(wallColor, wedgeColor)) continue;
    walls.set(c.item, owner.f.item);
  }
  return walls;
}
