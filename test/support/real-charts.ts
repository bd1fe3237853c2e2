/** The real charts of ../shared/real-charts and their ground truth, with scoring helpers for accuracy tests. */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Chart } from '../../engine/classify/chart.js';
import { parseTickLabel } from '../../engine/classify/scale/parse-tick-label.js';

export const REAL_CHARTS = resolve(import.meta.dirname, '../../../shared/real-charts');

export interface TruthPoint {
  x: string | number | null;
  y: number | string;
  value?: number;
  color?: string;
}
export interface TruthSeries {
  name: string | null;
  color: string | null;
  axis?: string;
  points: TruthPoint[];
}
export interface TruthAxis {
  scale: string;
  min: number | string | null;
  max: number | string | null;
  categories?: string[];
}
export interface Truth {
  file: string;
  generator: string;
  kind: string;
  orientation: 'vertical' | 'horizontal' | null;
  title: string;
  series: TruthSeries[];
  axes: Record<string, TruthAxis | null> | null;
  plotArea: { x: number; y: number; width: number; height: number } | null;
  textAsPaths: boolean;
  planted: string[];
  clean: boolean;
}

export function loadManifest(): Truth[] {
  return JSON.parse(readFileSync(resolve(REAL_CHARTS, 'manifest.json'), 'utf8')) as Truth[];
}

export function readChart(file: string): string {
  return readFileSync(resolve(REAL_CHARTS, file), 'utf8');
}

export function generatorOf(t: Truth): string {
  return t.file.split('-')[0]!;
}

/** Contract kind and threeD expected for a manifest kind. */
export function expectedKind(t: Truth): { kind: string; threeD: boolean } {
  if (t.kind === 'bar3d') return { kind: 'bar', threeD: true };
  if (t.kind === 'pie3d') return { kind: 'pie', threeD: true };
  return { kind: t.kind, threeD: false };
}

function asNumber(v: string | number | null | undefined): number | null {
  if (typeof v === 'number') return v;
  if (typeof v !== 'string') return null;
  if (/^\d{4}-\d{2}(-\d{2})?$/.test(v)) return Date.parse(v.length === 7 ? `${v}-01` : v);
  const p = parseTickLabel(v);
  if (p?.kind === 'number') return p.value;
  if (p?.kind === 'date') return p.ms;
  return null;
}

function sameX(truth: TruthPoint['x'], got: number | string | null, xSpan: number): boolean {
  if (truth === null || got === null) return truth === got;
  if (typeof truth === 'string' && typeof got === 'string') return truth.trim().toLowerCase() === got.trim().toLowerCase();
  const a = asNumber(truth);
  const b = typeof got === 'number' ? got : asNumber(got);
  if (a === null || b === null) return false;
  return Math.abs(a - b) <= Math.max(0.01 * xSpan, 1e-9);
}

export interface PointScore {
  total: number;
  matched: number;
}

/** Share of true points that have a recovered point with the same x and y within 1% of the value-axis span. */
export function scorePoints(t: Truth, chart: Chart): PointScore {
  const axes = t.axes ?? {};
  const valueAxisName = t.orientation === 'horizontal' ? 'x' : 'y';
  const catAxisName = t.orientation === 'horizontal' ? 'y' : 'x';
  let total = 0;
  let matched = 0;
  const recovered = chart.series.flatMap((s) => s.points.map((p) => ({ ...p, axis: s.axis })));
  for (const s of t.series) {
    const vAxis = axes[s.axis === 'y2' ? 'y2' : valueAxisName];
    const vSpan = vAxis && typeof vAxis.max === 'number' && typeof vAxis.min === 'number' ? vAxis.max - vAxis.min : NaN;
    const xAxis = axes[catAxisName];
    let xSpan = 0;
    if (xAxis && xAxis.min !== null && xAxis.max !== null) {
      const lo = asNumber(xAxis.min);
      const hi = asNumber(xAxis.max);
      if (lo !== null && hi !== null) xSpan = xAxis.scale === 'log' ? hi : hi - lo;
    }
    for (const p of s.points) {
      total++;
      const y = typeof p.y === 'number' ? p.y : NaN;
      const tol = 0.01 * vSpan;
      const hit = recovered.some((r) => {
        if (!Number.isFinite(r.y) || !Number.isFinite(y)) return false;
        if (Math.abs(r.y - y) > tol) return false;
        if (xAxis?.scale === 'log' && typeof p.x === 'number' && typeof r.x === 'number') return Math.abs(Math.log10(r.x) - Math.log10(p.x)) <= 0.01 * Math.log10(asNumber(xAxis.max)! / asNumber(xAxis.min)!);
        return sameX(p.x, r.x, xSpan);
      });
      if (hit) matched++;
    }
  }
  return { total, matched };
}

/** Largest difference, in percentage points, between true and recovered pie shares (matched in drawing order or by label). */
export function pieShareError(t: Truth, chart: Chart): number {
  const truth = t.series[0]!.points;
  const sum = truth.reduce((n, p) => n + (p.y as number), 0);
  const trueShares = truth.map((p) => ({ label: String(p.x), share: (p.y as number) / sum, color: p.color?.toLowerCase() ?? null }));
  const got = chart.series[0]?.points ?? [];
  if (got.length !== truth.length) return Infinity;
  // Match by colour of the wedge when available, else by label, else in order.
  let worst = 0;
  const used = new Set<number>();
  for (const ts of trueShares) {
    let k = chart.pie?.wedges.findIndex((w, i) => !used.has(i) && w.color && ts.color && hex(w.color) === ts.color) ?? -1;
    if (k < 0) k = got.findIndex((g, i) => !used.has(i) && typeof g.x === 'string' && g.x.toLowerCase() === ts.label.toLowerCase());
    if (k < 0) k = [...got.keys()].find((i) => !used.has(i)) ?? -1;
    if (k < 0) return Infinity;
    used.add(k);
    worst = Math.max(worst, Math.abs(got[k]!.y - ts.share) * 100);
  }
  return worst;
}

function hex(c: { r: number; g: number; b: number }): string {
  const h = (v: number): string => Math.round(Math.min(1, Math.max(0, v)) * 255).toString(16).padStart(2, '0');
  return `#${h(c.r)}${h(c.g)}${h(c.b)}`;
}
