/**
 * Fits one closed outline to the wedge model: an outer circular arc, and
 * either two radial edges meeting at the arc's centre (a pie slice), or two
 * radial edges and an inner concentric arc (a ring segment), or nothing else
 * (a full circle / full ring).
 *
 * The outline arrives flattened: SVG arcs, Béziers and polygon
 * approximations all look alike here, and edges may be subdivided anywhere.
 * Method (hypothesise and verify): candidate circles come from circles through
 * consecutive vertices of a Douglas–Peucker simplification and from "centre
 * at a vertex" hypotheses (which catch slivers whose arc is a single chord);
 * each candidate is checked against the whole outline, edge by edge, and the
 * first one that explains ≥ 97 % of the perimeter is refined by least squares
 * (Gauss–Newton over the arc vertices' radial residuals and the radial edges'
 * distances to the centre).
 */
import {
  angleStep,
  circleThrough,
  compass,
  ringArea,
  ringExtent,
  simplifyRing,
  solveLinear,
  type Ring,
} from './outline.js';

const OUTER = 1;
const INNER = 2;
const RADIAL = 3;
const TINY = 4;

/** Share of the perimeter the wedge model must explain. */
const MIN_EXPLAINED = 0.97;
/** Largest allowed chord height of an arc edge, relative to the outer radius. */
const MAX_SAGITTA = 0.025;
/** At most this many distinct candidate circles are verified per outline. */
const MAX_CANDIDATES = 8;
/** On outlines with more simplified vertices than this, only as many sharpest corners are tried as centres. */
const MAX_APEX_TRIALS = 24;
/** Only the best supported few candidates are also refitted to their supporting vertices. */
const MAX_REFITS = 3;
/** At most about this many circles through simplified vertices are tried. */
const MAX_ARC_TRIALS = 48;

export interface CircleWedgeFit {
  cx: number;
  cy: number;
  /** Outer radius. */
  R: number;
  /** Inner radius (0 for a pie slice). */
  r: number;
  /** Compass angle (radians clockwise from 12 o'clock) where the arc begins, clockwise order. */
  start: number;
  /** Angle the outer arc covers, in (0, 2π]. */
  sweep: number;
  full: boolean;
  /** Arc end points in clockwise order (null for a full circle). */
  startPt: [number, number] | null;
  endPt: [number, number] | null;
  /** Vertices on the outer and inner arc (flat x, y arrays) and the radial edges, for joint refits. */
  outerPts: number[];
  innerPts: number[];
  radial: [number, number, number, number][];
  /** RMS of the residuals of the final fit, world units. */
  rms: number;
  /** Absolute area of the outline (holes subtracted). */
  area: number;
}

interface Classified {
  kinds: Uint8Array;
  r: number;
  explained: number;
}

/** Tolerances for an outline of extent S and a circle of radius R. */
function tolerance(R: number, S: number): number {
  return Math.max(0.004 * R, 6e-4 * S, 1e-9);
}

function classifyEdges(ring: Ring, cx: number, cy: number, R: number, tau: number): Classified | null {
  const n = ring.x.length;
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) d[i] = Math.hypot(ring.x[i]! - cx, ring.y[i]! - cy);
  const kinds = new Uint8Array(n);
  const lens = new Float64Array(n);
  const sagTol = Math.max(MAX_SAGITTA * R, 2 * tau);
  const innerCand: number[] = [];
  let perim = 0;
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const ex = ring.x[j]! - ring.x[i]!;
    const ey = ring.y[j]! - ring.y[i]!;
    const len = Math.hypot(ex, ey);
    lens[i] = len;
    perim += len;
    if (len <= tau) {
      kinds[i] = TINY;
      continue;
    }
    const di = d[i]!;
    const dj = d[j]!;
    if (Math.abs(di - R) <= tau && Math.abs(dj - R) <= tau && sagitta(R, len) <= sagTol) {
      kinds[i] = OUTER;
      continue;
    }
    const dist = Math.abs((cx - ring.x[i]!) * ey - (cy - ring.y[i]!) * ex) / len;
    if (dist <= tau) {
      kinds[i] = RADIAL;
      continue;
    }
    const rm = (di + dj) / 2;
    if (Math.abs(di - dj) <= tau && rm < R - tau && sagitta(rm, len) <= sagTol) innerCand.push(i);
  }
  let r = 0;
  if (innerCand.length > 0) {
    // Length-weighted median radius of the inner candidates.
    const items = innerCand.map((i) => ({ rad: (d[i]! + d[i + 1 === n ? 0 : i + 1]!) / 2, w: lens[i]! }));
    items.sort((a, b) => a.rad - b.rad);
    const total = items.reduce((s, it) => s + it.w, 0);
    let acc = 0;
    for (const it of items) {
      acc += it.w;
      if (acc >= total / 2) {
        r = it.rad;
        break;
      }
    }
    for (const i of innerCand) {
      const rm = (d[i]! + d[i + 1 === n ? 0 : i + 1]!) / 2;
      if (Math.abs(rm - r) <= tau) kinds[i] = INNER;
    }
  }
  let explainedLen = 0;
  for (let i = 0; i < n; i++) if (kinds[i] !== 0) explainedLen += lens[i]!;
  if (!(perim > 0)) return null;
  return { kinds, r, explained: explainedLen / perim };
}

function sagitta(R: number, chord: number): number {
  const h = chord / 2;
  if (h >= R) return R;
  return R - Math.sqrt(R * R - h * h);
}

interface Span {
  start: number;
  sweep: number;
  full: boolean;
  startPt: [number, number] | null;
  endPt: [number, number] | null;
}

/** The outer arc's angular span from the edge classification. */
function arcSpan(ring: Ring, cx: number, cy: number, kinds: Uint8Array): Span | null {
  const n = ring.x.length;
  const lens = (i: number): number => {
    const j = i + 1 === n ? 0 : i + 1;
    return Math.hypot(ring.x[j]! - ring.x[i]!, ring.y[j]! - ring.y[i]!);
  };
  const step = (i: number): number => {
    const j = i + 1 === n ? 0 : i + 1;
    return angleStep(ring.x[i]! - cx, ring.y[i]! - cy, ring.x[j]! - cx, ring.y[j]! - cy);
  };
  let anyGap = false;
  for (let i = 0; i < n; i++) if (kinds[i] !== OUTER && kinds[i] !== TINY) anyGap = true;
  if (!anyGap) {
    let s = 0;
    for (let i = 0; i < n; i++) s += step(i);
    if (Math.abs(Math.abs(s) - 2 * Math.PI) > 0.05) return null;
    return { start: 0, sweep: 2 * Math.PI, full: true, startPt: null, endPt: null };
  }
  // Longest cyclic run of non-outer edges (by length): the part that is not the outer arc.
  let bestLen = -1;
  let bestEnd = -1; // index of the last edge of the gap
  let runLen = 0;
  // Start scanning just after an outer edge so runs do not wrap.
  let first = -1;
  for (let i = 0; i < n; i++) if (kinds[i] === OUTER) first = i;
  if (first < 0) return null;
  for (let k = 1; k <= n; k++) {
    const i = (first + k) % n;
    if (kinds[i] === OUTER) {
      runLen = 0;
      continue;
    }
    runLen += lens(i);
    if (runLen > bestLen) {
      bestLen = runLen;
      bestEnd = i;
    }
  }
  // Window: from the edge after the gap to the last outer edge before the gap begins again.
  const winStart = (bestEnd + 1) % n;
  let last = winStart;
  let winLen = 0;
  let strayLen = 0;
  for (let k = 0; k < n; k++) {
    const i = (winStart + k) % n;
    if (kinds[i] === OUTER) last = i;
  }
  let s = 0;
  for (let i = winStart; ; i = (i + 1) % n) {
    s += step(i);
    winLen += lens(i);
    if (kinds[i] !== OUTER && kinds[i] !== TINY) strayLen += lens(i);
    if (i === last) break;
  }
  if (strayLen > 0.1 * winLen) return null;
  const a = winStart;
  const b = (last + 1) % n;
  const A: [number, number] = [ring.x[a]!, ring.y[a]!];
  const B: [number, number] = [ring.x[b]!, ring.y[b]!];
  const sweep = Math.abs(s);
  if (!(sweep > 0)) return null;
  if (sweep >= 2 * Math.PI - 1e-3) return { start: 0, sweep: 2 * Math.PI, full: true, startPt: null, endPt: null };
  const [sp, ep] = s > 0 ? [A, B] : [B, A];
  return { start: compass(sp[0] - cx, sp[1] - cy), sweep, full: false, startPt: sp, endPt: ep };
}

function angleClose(a: number, b: number, tol: number): boolean {
  const d = Math.abs(((a - b) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  return Math.min(d, 2 * Math.PI - d) <= tol;
}

/**
 * Verifies the wedge model for a given circle and returns the fit (not
 * refined), or null when the outline is not such a wedge.
 */
export function verifyWedge(ring: Ring, cx: number, cy: number, R: number, tau: number): CircleWedgeFit | null {
  if (!(R > 0) || !Number.isFinite(cx) || !Number.isFinite(cy)) return null;
  const cls = classifyEdges(ring, cx, cy, R, tau);
  if (!cls || cls.explained < MIN_EXPLAINED) return null;
  const { kinds, r } = cls;
  const n = ring.x.length;
  let outerLen = 0;
  let hasInner = false;
  let hasRadial = false;
  for (let i = 0; i < n; i++) {
    if (kinds[i] === OUTER) outerLen += 1;
    if (kinds[i] === INNER) hasInner = true;
    if (kinds[i] === RADIAL) hasRadial = true;
  }
  if (outerLen === 0) return null;
  const span = arcSpan(ring, cx, cy, kinds);
  if (!span) return null;
  let minD = Infinity;
  for (let i = 0; i < n; i++) minD = Math.min(minD, Math.hypot(ring.x[i]! - cx, ring.y[i]! - cy));
  if (!span.full) {
    // A slice reaches the centre; a ring segment has an inner arc.
    if (!hasInner && minD > 3 * tau) return null;
    if (!hasRadial) return null;
    // Every radial edge lies on the ray of the arc's start or end.
    const tolA = Math.max((2 * tau) / R, (0.75 * Math.PI) / 180);
    const end = span.start + span.sweep;
    for (let i = 0; i < n; i++) {
      if (kinds[i] !== RADIAL) continue;
      const j = i + 1 === n ? 0 : i + 1;
      for (const k of [i, j]) {
        const dx = ring.x[k]! - cx;
        const dy = ring.y[k]! - cy;
        if (Math.hypot(dx, dy) <= 3 * tau) continue;
        const a = compass(dx, dy);
        if (!angleClose(a, span.start, tolA) && !angleClose(a, end, tolA)) return null;
      }
    }
  } else if (hasRadial && !hasInner) {
    return null;
  }
  const outerPts: number[] = [];
  const innerPts: number[] = [];
  const radial: [number, number, number, number][] = [];
  const seenOuter = new Uint8Array(n);
  const seenInner = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    if (kinds[i] === OUTER) {
      for (const k of [i, j]) if (!seenOuter[k]) (seenOuter[k] = 1), outerPts.push(ring.x[k]!, ring.y[k]!);
    } else if (kinds[i] === INNER) {
      for (const k of [i, j]) if (!seenInner[k]) (seenInner[k] = 1), innerPts.push(ring.x[k]!, ring.y[k]!);
    } else if (kinds[i] === RADIAL) {
      radial.push([ring.x[i]!, ring.y[i]!, ring.x[j]!, ring.y[j]!]);
    }
  }
  return {
    cx,
    cy,
    R,
    r: hasInner ? r : 0,
    start: span.start,
    sweep: span.sweep,
    full: span.full,
    startPt: span.startPt,
    endPt: span.endPt,
    outerPts,
    innerPts,
    radial,
    rms: 0,
    area: Math.abs(ringArea(ring)),
  };
}

export interface CentreFitSet {
  /** Points on a circle of radius `radii[radius]`. */
  points: number[];
  radius: number;
}

/**
 * Least-squares centre and radii: minimises Σ (|p − c| − ρ_k)² over the point
 * sets plus Σ dist(c, line)² over the lines, by Gauss–Newton from the given start.
 */
export function fitCentre(
  sets: readonly CentreFitSet[],
  lines: readonly (readonly [number, number, number, number])[],
  start: { cx: number; cy: number; radii: number[] },
): { cx: number; cy: number; radii: number[]; rms: number } {
  const k = start.radii.length;
  let cx = start.cx;
  let cy = start.cy;
  const radii = [...start.radii];
  const np = 2 + k;
  let rms = 0;
  for (let iter = 0; iter < 12; iter++) {
    const JtJ: number[][] = Array.from({ length: np }, () => new Array<number>(np).fill(0));
    const Jtr = new Array<number>(np).fill(0);
    let ss = 0;
    let count = 0;
    const add = (jx: number, jy: number, jr: number, ri: number, res: number): void => {
      const idx = [0, 1, ri >= 0 ? 2 + ri : -1];
      const val = [jx, jy, jr];
      for (let a = 0; a < 3; a++) {
        if (idx[a]! < 0) continue;
        Jtr[idx[a]!] += val[a]! * res;
        for (let b = 0; b < 3; b++) if (idx[b]! >= 0) JtJ[idx[a]!]![idx[b]!] += val[a]! * val[b]!;
      }
      ss += res * res;
      count++;
    };
    for (const set of sets) {
      const rho = radii[set.radius]!;
      for (let i = 0; i + 1 < set.points.length; i += 2) {
        const dx = set.points[i]! - cx;
        const dy = set.points[i + 1]! - cy;
        const dist = Math.hypot(dx, dy);
        if (!(dist > 0)) continue;
        add(-dx / dist, -dy / dist, -1, set.radius, dist - rho);
      }
    }
    for (const [x0, y0, x1, y1] of lines) {
      const len = Math.hypot(x1 - x0, y1 - y0);
      if (!(len > 0)) continue;
      const nx = -(y1 - y0) / len;
      const ny = (x1 - x0) / len;
      add(nx, ny, 0, -1, nx * (cx - x0) + ny * (cy - y0));
    }
    rms = count > 0 ? Math.sqrt(ss / count) : 0;
    // Tiny ridge keeps unconstrained radii (sets without points) solvable.
    for (let a = 0; a < np; a++) JtJ[a]![a] += 1e-12 * (1 + JtJ[a]![a]!);
    const delta = solveLinear(JtJ, Jtr.map((v) => -v));
    if (!delta) break;
    cx += delta[0]!;
    cy += delta[1]!;
    for (let j = 0; j < k; j++) radii[j] += delta[2 + j]!;
    const size = Math.max(1e-12, ...radii.map(Math.abs));
    if (Math.hypot(delta[0]!, delta[1]!) < 1e-10 * size) break;
  }
  return { cx, cy, radii, rms };
}

/** Refines a verified fit by least squares and re-verifies it around the refined circle. */
function refine(ring: Ring, fit: CircleWedgeFit, S: number): CircleWedgeFit {
  let current = fit;
  for (let round = 0; round < 2; round++) {
    const sets: CentreFitSet[] = [{ points: current.outerPts, radius: 0 }];
    const radii = [current.R];
    if (current.r > 0 && current.innerPts.length > 0) {
      sets.push({ points: current.innerPts, radius: 1 });
      radii.push(current.r);
    }
    const lines = current.radial;
    const res = fitCentre(sets, lines, { cx: current.cx, cy: current.cy, radii });
    if (!Number.isFinite(res.cx) || !Number.isFinite(res.cy) || !(res.radii[0]! > 0)) return current;
    const again = verifyWedge(ring, res.cx, res.cy, res.radii[0]!, tolerance(res.radii[0]!, S));
    if (!again) return { ...current, rms: res.rms };
    current = { ...again, r: again.r > 0 && res.radii[1] !== undefined ? res.radii[1] : again.r, rms: res.rms };
  }
  return current;
}

/** Length of the outline's edges whose both ends lie on the circle. */
function support(ring: Ring, cx: number, cy: number, R: number, tau: number): number {
  const n = ring.x.length;
  let total = 0;
  let prevOn = Math.abs(Math.hypot(ring.x[n - 1]! - cx, ring.y[n - 1]! - cy) - R) <= tau;
  for (let i = 0; i < n; i++) {
    const on = Math.abs(Math.hypot(ring.x[i]! - cx, ring.y[i]! - cy) - R) <= tau;
    if (on && prevOn) {
      const j = i === 0 ? n - 1 : i - 1;
      total += Math.hypot(ring.x[i]! - ring.x[j]!, ring.y[i]! - ring.y[j]!);
    }
    prevOn = on;
  }
  return total;
}

/** Least-squares circle through the vertices lying within tau of the candidate circle. */
function refitSupport(ring: Ring, c: Candidate, tau: number): Candidate | null {
  const pts: number[] = [];
  for (let i = 0; i < ring.x.length; i++) {
    if (Math.abs(Math.hypot(ring.x[i]! - c.cx, ring.y[i]! - c.cy) - c.R) <= tau) pts.push(ring.x[i]!, ring.y[i]!);
  }
  if (pts.length < 6) return null;
  const res = fitCentre([{ points: pts, radius: 0 }], [], { cx: c.cx, cy: c.cy, radii: [c.R] });
  if (!Number.isFinite(res.cx) || !Number.isFinite(res.cy) || !(res.radii[0]! > 0)) return null;
  return { cx: res.cx, cy: res.cy, R: res.radii[0]!, weight: c.weight };
}

interface Candidate {
  cx: number;
  cy: number;
  R: number;
  weight: number;
}

/**
 * Fits the outline (optionally with a hole ring) to the wedge model; null
 * when it is not a wedge, a ring segment, a full circle or a full ring.
 */
export function fitCircleWedge(ring: Ring, hole: Ring | null = null): CircleWedgeFit | null {
  const S = ringExtent(ring);
  if (!(S > 0)) return null;
  const eta = 2e-4 * S;
  const keep = simplifyRing(ring, eta);
  const m = keep.length;
  const n = ring.x.length;
  const cands: Candidate[] = [];
  const pushCand = (c: { cx: number; cy: number; r: number } | null): void => {
    if (!c || !(c.r > S / 40) || !(c.r < 5 * S)) return;
    cands.push({ cx: c.cx, cy: c.cy, R: c.r, weight: 0 });
  };
  const stride = Math.max(1, Math.ceil(m / MAX_ARC_TRIALS));
  // Circles through consecutive simplified vertices.
  if (m >= 3) {
    for (let k = 0; k < m; k += stride) {
      const a = keep[k]!;
      const b = keep[(k + 1) % m]!;
      const c = keep[(k + 2) % m]!;
      pushCand(circleThrough(ring.x[a]!, ring.y[a]!, ring.x[b]!, ring.y[b]!, ring.x[c]!, ring.y[c]!));
    }
  }
  // Shallow arcs merged into one simplified segment: circle through its ends and a middle vertex.
  for (let k = 0; k < m; k += stride) {
    const a = keep[k]!;
    const bRaw = k + 1 < m ? keep[k + 1]! : keep[0]! + n;
    if (bRaw - a < 2) continue;
    const mid = Math.floor((a + bRaw) / 2) % n;
    const b = bRaw % n;
    pushCand(circleThrough(ring.x[a]!, ring.y[a]!, ring.x[mid]!, ring.y[mid]!, ring.x[b]!, ring.y[b]!));
  }
  // Centre at a vertex (pie apex); radius to the farthest vertex. On long outlines only the sharpest corners.
  let apexes = keep;
  if (m > MAX_APEX_TRIALS) {
    const turn = (k: number): number => {
      const a = keep[(k + m - 1) % m]!;
      const b = keep[k]!;
      const c = keep[(k + 1) % m]!;
      return Math.abs(angleStep(ring.x[b]! - ring.x[a]!, ring.y[b]! - ring.y[a]!, ring.x[c]! - ring.x[b]!, ring.y[c]! - ring.y[b]!));
    };
    apexes = keep
      .map((v, k) => ({ v, t: turn(k) }))
      .sort((a, b) => b.t - a.t)
      .slice(0, MAX_APEX_TRIALS)
      .map((e) => e.v);
  }
  for (const v of apexes) {
    let far = 0;
    for (let i = 0; i < n; i++) far = Math.max(far, Math.hypot(ring.x[i]! - ring.x[v]!, ring.y[i]! - ring.y[v]!));
    if (far > 0) cands.push({ cx: ring.x[v]!, cy: ring.y[v]!, R: far, weight: 0 });
  }
  // Rank by support (outline length lying on the circle); verify the best first, each as given and
  // as refitted to the vertices that support it.
  for (const c of cands) c.weight = support(ring, c.cx, c.cy, c.R, tolerance(c.R, S));
  cands.sort((a, b) => b.weight - a.weight);
  const tried: Candidate[] = [];
  let fit: CircleWedgeFit | null = null;
  for (const c of cands) {
    if (tried.length >= MAX_CANDIDATES || !(c.weight > 0)) break;
    const tol = 0.25 * tolerance(c.R, S);
    if (tried.some((q) => Math.abs(q.cx - c.cx) <= tol && Math.abs(q.cy - c.cy) <= tol && Math.abs(q.R - c.R) <= tol)) continue;
    tried.push(c);
    fit = verifyWedge(ring, c.cx, c.cy, c.R, tolerance(c.R, S));
    if (fit) break;
    const again = tried.length <= MAX_REFITS ? refitSupport(ring, c, tolerance(c.R, S)) : null;
    if (again) fit = verifyWedge(ring, again.cx, again.cy, again.R, tolerance(again.R, S));
    if (fit) break;
  }
  if (!fit) return null;
  fit = refine(ring, fit, S);
  if (hole) {
    // A full ring: outer circle with a concentric circular hole.
    if (!fit.full) return null;
    const inner = fitCircleWedge(hole, null);
    if (!inner || !inner.full) return null;
    const tau = tolerance(fit.R, S);
    if (Math.hypot(inner.cx - fit.cx, inner.cy - fit.cy) > 2 * tau || !(inner.R < fit.R - tau)) return null;
    return { ...fit, r: inner.R, innerPts: inner.outerPts, area: fit.area - inner.area };
  }
  return fit;
}

/** Exposed for the grouping step: the verification tolerance for a circle of radius R in an outline of extent S. */
export function wedgeTolerance(R: number, S: number): number {
  return tolerance(R, S);
}
