/**
 * What changed between two versions of a chart, from the understood charts
 * rather than the pixels: data marks added, removed or moved (matched by role
 * and geometry), recovered data values that changed (per series and x),
 * findings that are new or resolved (matched by rule and the elements they
 * point at, the elements recognised by id or by role and geometry, so that
 * line numbers shifting does not count as a change), and the ink shares.
 */
import type { Chart, SubRole } from '../classify/chart.js';
import type { Box } from '../read/scene.js';
import type { AxisValue, ElementRef, FileReport, Finding, InkReport, PointReport, SeriesReport } from './types.js';

/** What the delta needs of one version: its report and, when it could be read, its chart. */
export interface ChartVersion {
  report: FileReport;
  chart: Chart | null;
}

export interface MarkRef {
  role: SubRole;
  box: Box;
  line: number;
  column: number;
  id: string | null;
}

export interface MarkMove {
  role: SubRole;
  before: MarkRef;
  after: MarkRef;
}

export interface ValueChange {
  series: string | null;
  x: AxisValue | null;
  /** Heatmap cells: the row category. */
  y?: AxisValue | null;
  before: number | null;
  after: number | null;
}

export interface ChartDelta {
  kind: { before: string | null; after: string | null };
  marks: { added: MarkRef[]; removed: MarkRef[]; moved: MarkMove[]; unchanged: number };
  series: { added: (string | null)[]; removed: (string | null)[] };
  values: ValueChange[];
  findings: { new: Finding[]; resolved: Finding[]; unchanged: Finding[] };
  ink: { before: InkReport | null; after: InkReport | null };
}

/** Geometry differences below this (world units) count as the same place. */
const SAME_PLACE = 0.05;
/** Above this many candidate pairs per role, unmatched marks are not paired up as moves. */
const MAX_PAIRS = 250_000;

const boxKey = (b: Box): string => `${Math.round(b.x / SAME_PLACE)},${Math.round(b.y / SAME_PLACE)},${Math.round(b.width / SAME_PLACE)},${Math.round(b.height / SAME_PLACE)}`;

function marksOf(chart: Chart | null): MarkRef[] {
  if (!chart) return [];
  const out: MarkRef[] = [];
  chart.scene.items.forEach((it, i) => {
    const r = chart.roles[i];
    if (!r || r.role !== 'mark') return;
    out.push({ role: r.sub, box: it.bbox, line: it.source.line, column: it.source.column, id: it.source.id });
  });
  return out;
}

/** Pairs the same key on both sides; returns the leftovers. */
function matchExact<T>(a: T[], b: T[], key: (t: T) => string): { pairs: [T, T][]; restA: T[]; restB: T[] } {
  const byKey = new Map<string, T[]>();
  for (const t of b) {
    const k = key(t);
    const list = byKey.get(k);
    if (list) list.push(t);
    else byKey.set(k, [t]);
  }
  const pairs: [T, T][] = [];
  const restA: T[] = [];
  for (const t of a) {
    const list = byKey.get(key(t));
    const other = list?.shift();
    if (other !== undefined) pairs.push([t, other]);
    else restA.push(t);
  }
  const restB = [...byKey.values()].flat();
  return { pairs, restA, restB };
}

function gapBetween(p: Box, q: Box): number {
  const dx = Math.max(0, Math.max(p.x, q.x) - Math.min(p.x + p.width, q.x + q.width));
  const dy = Math.max(0, Math.max(p.y, q.y) - Math.min(p.y + p.height, q.y + q.height));
  return Math.hypot(dx, dy);
}

function moveCost(p: Box, q: Box): number {
  return Math.abs(p.x - q.x) + Math.abs(p.y - q.y) + Math.abs(p.width - q.width) + Math.abs(p.height - q.height);
}

/** Marks: exact geometry first; the rest of each role paired greedily when they overlap or sit close. */
export function diffMarks(before: Chart | null, after: Chart | null): ChartDelta['marks'] {
  const a = marksOf(before);
  const b = marksOf(after);
  const exact = matchExact(a, b, (m) => `${m.role}|${boxKey(m.box)}`);
  const moved: MarkMove[] = [];
  const added: MarkRef[] = [];
  const removed: MarkRef[] = [];
  const roles = new Set([...exact.restA, ...exact.restB].map((m) => m.role));
  for (const role of roles) {
    const ra = exact.restA.filter((m) => m.role === role);
    const rb = exact.restB.filter((m) => m.role === role);
    if (ra.length === 0 || rb.length === 0 || ra.length * rb.length > MAX_PAIRS) {
      removed.push(...ra);
      added.push(...rb);
      continue;
    }
    const candidates: { i: number; j: number; cost: number }[] = [];
    for (let i = 0; i < ra.length; i++) {
      for (let j = 0; j < rb.length; j++) {
        const p = ra[i]!.box;
        const q = rb[j]!.box;
        const reach = 2 * Math.max(p.width, p.height, q.width, q.height);
        if (gapBetween(p, q) <= reach) candidates.push({ i, j, cost: moveCost(p, q) });
      }
    }
    candidates.sort((u, v) => u.cost - v.cost || u.i - v.i || u.j - v.j);
    const usedA = new Set<number>();
    const usedB = new Set<number>();
    for (const c of candidates) {
      if (usedA.has(c.i) || usedB.has(c.j)) continue;
      usedA.add(c.i);
      usedB.add(c.j);
      moved.push({ role, before: ra[c.i]!, after: rb[c.j]! });
    }
    ra.forEach((m, i) => usedA.has(i) || removed.push(m));
    rb.forEach((m, j) => usedB.has(j) || added.push(m));
  }
  const byPlace = (p: MarkRef, q: MarkRef): number => p.line - q.line || p.column - q.column;
  moved.sort((p, q) => byPlace(p.after, q.after));
  added.sort(byPlace);
  removed.sort(byPlace);
  return { added, removed, moved, unchanged: exact.pairs.length };
}

type SeriesLike = SeriesReport;

function pointKey(p: PointReport): string {
  const extra = p as { yCategory?: unknown };
  const y = extra.yCategory;
  return `${typeof p.x}:${String(p.x)}${y === undefined || y === null ? '' : `|${typeof y}:${String(y)}`}`;
}

function pointValue(p: PointReport): number | null {
  const extra = p as { value?: unknown; yCategory?: unknown };
  if (extra.yCategory !== undefined && extra.yCategory !== null) return typeof extra.value === 'number' ? extra.value : null;
  return p.y;
}

function differs(a: number | null, b: number | null): boolean {
  if (a === null || b === null) return a !== b;
  return Math.abs(a - b) > 1e-9 + 1e-6 * Math.max(Math.abs(a), Math.abs(b));
}

/** Series matched by name when names are unique on both sides, else by position. */
function pairSeries(a: SeriesLike[], b: SeriesLike[]): { pairs: [SeriesLike, SeriesLike][]; added: SeriesLike[]; removed: SeriesLike[] } {
  const unique = (list: SeriesLike[]): boolean => list.every((s) => s.name !== null) && new Set(list.map((s) => s.name)).size === list.length;
  if (unique(a) && unique(b)) {
    const m = matchExact(a, b, (s) => s.name ?? '');
    return { pairs: m.pairs, added: m.restB, removed: m.restA };
  }
  const n = Math.min(a.length, b.length);
  return {
    pairs: a.slice(0, n).map((s, i) => [s, b[i]!] as [SeriesLike, SeriesLike]),
    added: b.slice(n),
    removed: a.slice(n),
  };
}

/** Recovered values that differ, per series and x (points present on one side only count too). */
export function diffValues(before: FileReport, after: FileReport): { values: ValueChange[]; series: ChartDelta['series'] } {
  const a = before.chart?.series ?? [];
  const b = after.chart?.series ?? [];
  const { pairs, added, removed } = pairSeries(a, b);
  const values: ValueChange[] = [];
  for (const [sa, sb] of pairs) {
    const name = sb.name ?? sa.name;
    const pb = new Map(sb.points.map((p) => [pointKey(p), p]));
    const seen = new Set<string>();
    for (const p of sa.points) {
      const k = pointKey(p);
      if (seen.has(k)) continue;
      seen.add(k);
      const q = pb.get(k);
      const va = pointValue(p);
      const vb = q ? pointValue(q) : null;
      if (!q || differs(va, vb)) values.push(change(name, p, va, q ? vb : null));
    }
    for (const q of sb.points) {
      const k = pointKey(q);
      if (seen.has(k)) continue;
      seen.add(k);
      values.push(change(name, q, null, pointValue(q)));
    }
  }
  return { values, series: { added: added.map((s) => s.name), removed: removed.map((s) => s.name) } };
}

function change(series: string | null, p: PointReport, before: number | null, after: number | null): ValueChange {
  const extra = p as { yCategory?: AxisValue | null };
  const out: ValueChange = { series, x: p.x, before, after };
  if (extra.yCategory !== undefined && extra.yCategory !== null) out.y = extra.yCategory;
  return out;
}

/** A stable name for the element a finding points at: its id, else its role and rounded box, else its position. */
export function elementKey(chart: Chart | null, ref: ElementRef): string {
  if (ref.id) return `#${ref.id}`;
  if (chart) {
    const root = chart.scene.document.root;
    if (root.line === ref.line && root.column === ref.column) return 'svg';
    const i = chart.scene.items.findIndex((it) => it.source.line === ref.line && it.source.column === ref.column);
    if (i >= 0) {
      const it = chart.scene.items[i]!;
      const b = it.bbox;
      return `${chart.roles[i]?.sub ?? it.kind}@${Math.round(b.x)},${Math.round(b.y)},${Math.round(b.width)},${Math.round(b.height)}`;
    }
  }
  return `${ref.line}:${ref.column}`;
}

/** Findings: same rule and same elements, or same rule and at least half the elements shared, count as unchanged. */
export function diffFindings(before: ChartVersion, after: ChartVersion): ChartDelta['findings'] {
  interface Keyed {
    finding: Finding;
    keys: Set<string>;
    all: string;
  }
  const keyed = (v: ChartVersion): Keyed[] =>
    v.report.findings.map((finding) => {
      const keys = new Set(finding.elements.map((e) => elementKey(v.chart, e)));
      return { finding, keys, all: `${finding.rule}|${[...keys].sort().join(' ')}` };
    });
  const exact = matchExact(keyed(before), keyed(after), (k) => k.all);
  const unchanged = exact.pairs.map(([, q]) => q.finding);
  const resolved: Finding[] = [];
  const usedB = new Set<Keyed>();
  for (const p of exact.restA) {
    const q = exact.restB.find((c) => !usedB.has(c) && c.finding.rule === p.finding.rule && overlap(p.keys, c.keys) >= 0.5);
    if (q) {
      usedB.add(q);
      unchanged.push(q.finding);
    } else resolved.push(p.finding);
  }
  const added = exact.restB.filter((q) => !usedB.has(q)).map((q) => q.finding);
  return { new: added, resolved, unchanged };
}

function overlap(a: Set<string>, b: Set<string>): number {
  if (a.size === 0 && b.size === 0) return 1;
  let shared = 0;
  for (const k of a) if (b.has(k)) shared++;
  return shared / Math.max(a.size, b.size);
}

/** Everything that changed between two versions of one chart. */
export function diffCharts(before: ChartVersion, after: ChartVersion): ChartDelta {
  const { values, series } = diffValues(before.report, after.report);
  return {
    kind: { before: before.report.chart?.kind ?? null, after: after.report.chart?.kind ?? null },
    marks: diffMarks(before.chart, after.chart),
    series,
    values,
    findings: diffFindings(before, after),
    ink: { before: before.report.ink ?? null, after: after.report.ink ?? null },
  };
}
