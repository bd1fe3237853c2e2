import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { hueCycling, isMonotonicLightness, lightnessProfile, parseColor, toLab65, type Rgba } from '../engine/color/index.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const chartsDir = path.resolve(repoRoot, '../shared/real-charts');
const c = (s: string) => parseColor(s)!;

// source: matplotlib lib/matplotlib/_cm_listed.py, _viridis_data entries 0, 32, 64, …, 224, 255
// (256-entry table), as 8-bit hex
const VIRIDIS = ['#440154', '#472d7b', '#3b528b', '#2c728e', '#21918c', '#28ae80', '#5ec962', '#addc30', '#fde725'].map(c);

// source: matplotlib lib/matplotlib/_cm.py, _jet_data segment tables (x, y0, y1) per channel
const JET_DATA = {
  r: [[0, 0], [0.35, 0], [0.66, 1], [0.89, 1], [1, 0.5]],
  g: [[0, 0], [0.125, 0], [0.375, 1], [0.64, 1], [0.91, 0], [1, 0]],
  b: [[0, 0.5], [0.11, 1], [0.34, 1], [0.65, 0], [1, 0]],
};
function jet(x: number): Rgba {
  const seg = (pts: number[][]) => {
    for (let k = 0; k + 1 < pts.length; k++) {
      const [x0, y0] = pts[k];
      const [x1, y1] = pts[k + 1];
      if (x >= x0 && x <= x1) return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
    }
    return pts[pts.length - 1][1];
  };
  return { r: seg(JET_DATA.r), g: seg(JET_DATA.g), b: seg(JET_DATA.b), alpha: 1 };
}
const JET = Array.from({ length: 9 }, (_, i) => jet(i / 8));

describe('lightnessProfile', () => {
  it('is CIELAB L*', () => {
    // source: CSS Color 4 sample values in ../shared/reference/srgb-cielab.json (L* of #808080 = 53.5850)
    expect(lightnessProfile([c('#808080'), c('#000'), c('#fff')]).map((x) => +x.toFixed(4))).toEqual([53.585, 0, 100]);
  });
});

describe('isMonotonicLightness', () => {
  it('viridis stops rise monotonically', () => {
    const r = isMonotonicLightness(VIRIDIS, 0);
    expect(r.monotonic).toBe(true);
    expect(r.direction).toBe('increasing');
    expect(r.largestReversal).toBe(0);
    expect(r.reversalAt).toBeNull();
    expect(isMonotonicLightness([...VIRIDIS].reverse()).direction).toBe('decreasing');
  });

  it('jet rises then falls: not monotonic, with a large reversal after the yellow', () => {
    const r = isMonotonicLightness(JET, 1);
    expect(r.monotonic).toBe(false);
    // The L* peak is the yellow near x = 0.6; everything after it falls back.
    const peak = Math.max(...r.lightness);
    expect(r.largestReversal).toBeCloseTo(peak - r.lightness[r.reversalAt!], 10);
    expect(r.reversalAt).toBe(8);
    expect(r.largestReversal).toBeGreaterThan(50);
  });

  it('handles flat sequences, short input and bad tolerance', () => {
    const greys = [c('#777'), c('#888'), c('#777')];
    const r = isMonotonicLightness(greys, 0.5);
    expect(r.direction).toBe('flat');
    expect(r.monotonic).toBe(false);
    expect(r.reversalAt).toBe(1);
    expect(isMonotonicLightness([c('#777')]).monotonic).toBe(true);
    expect(() => isMonotonicLightness(VIRIDIS, -1)).toThrow(RangeError);
  });
});

describe('hueCycling', () => {
  it('rainbow (hsl hue 0→300) and jet cycle hue; viridis, greys and one-hue ramps do not', () => {
    const rainbow = Array.from({ length: 7 }, (_, i) => c(`hsl(${i * 50} 100% 50%)`));
    expect(hueCycling(rainbow).cyclesHue).toBe(true);
    expect(hueCycling(rainbow).hueTravel).toBeGreaterThan(250);
    expect(hueCycling(JET).cyclesHue).toBe(true);
    expect(hueCycling(VIRIDIS).cyclesHue).toBe(false);
    expect(hueCycling([c('#000'), c('#777'), c('#fff')]).hueTravel).toBe(0);
    // source: ColorBrewer "Blues" 5-class (from memory): a single-hue ramp
    const blues = ['#eff3ff', '#bdd7e7', '#6baed6', '#3182bd', '#08519c'].map(c);
    expect(hueCycling(blues).cyclesHue).toBe(false);
    expect(hueCycling(blues).hueTravel).toBeLessThan(30);
  });
});

// ---------------------------------------------------------------------------
// Real heatmaps: cell colours ordered by the data value they encode.

interface Axis { scale: string; min: number | null; max: number | null; categories?: (string | number)[] }
interface Heatmap {
  file: string;
  kind: string;
  planted: string[];
  plotArea: { x: number; y: number; width: number; height: number };
  axes: { x: Axis; y: Axis };
  series: { points: { x: string | number; y: string | number; value: number }[] }[];
}

/** Axis-aligned filled cells written as <rect>, closed 4-corner <path> or <polygon>. */
function cells(svg: string): { x0: number; y0: number; x1: number; y1: number; fill: Rgba }[] {
  const out: { x0: number; y0: number; x1: number; y1: number; fill: Rgba }[] = [];
  const fillOf = (tag: string) => {
    const m = /fill\s*[:=]\s*['"]?\s*(#[0-9a-fA-F]{3,8}|rgb\([^)]*\))/.exec(tag);
    return m ? parseColor(m[1]) : null;
  };
  for (const m of svg.matchAll(/<rect\b[^>]*>/g)) {
    const t = m[0];
    const num = (k: string) => Number(new RegExp(`\\b${k}\\s*=\\s*['"]([\\d.]+)`).exec(t)?.[1]);
    const f = fillOf(t);
    if (f && [num('x'), num('y'), num('width'), num('height')].every(Number.isFinite)) {
      out.push({ x0: num('x'), y0: num('y'), x1: num('x') + num('width'), y1: num('y') + num('height'), fill: f });
    }
  }
  const box = (nums: number[], f: Rgba | null) => {
    if (!f || nums.length < 8) return;
    const xs = nums.filter((_, i) => i % 2 === 0);
    const ys = nums.filter((_, i) => i % 2 === 1);
    out.push({ x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys), fill: f });
  };
  for (const m of svg.matchAll(/<path\b[^>]*\bd="(M[\d.\sLz-]+)"[^>]*>/g)) {
    const nums = m[1].match(/-?[\d.]+/g)!.map(Number);
    if (nums.length === 10) box(nums, fillOf(m[0]));
  }
  for (const m of svg.matchAll(/<polygon\b[^>]*>/g)) {
    const pts = /points\s*=\s*'([^']*)'/.exec(m[0]);
    if (pts) box(pts[1].match(/-?[\d.]+/g)!.map(Number), fillOf(m[0]));
  }
  return out;
}

/** Number of cells along an axis, and the data key of cell index k. */
function axisCells(a: Axis, topDown: boolean): { n: number; key: (k: number) => string | number } {
  if (a.categories) {
    const cats = a.categories;
    return { n: cats.length, key: (k) => cats[k] };
  }
  const n = Math.round(a.max! - a.min!);
  return { n, key: (k) => (topDown ? n - 1 - k : k) + Math.round(a.min! + 0.5) };
}

function colourByValue(chart: Heatmap): Rgba[] {
  const svg = fs.readFileSync(path.resolve(chartsDir, chart.file), 'utf8');
  const pa = chart.plotArea;
  const nx = axisCells(chart.axes.x, false);
  // Linear y axes put index 0 at the bottom; band axes list their first category at the top.
  const ny = axisCells(chart.axes.y, !chart.axes.y.categories);
  const cw = pa.width / nx.n;
  const ch = pa.height / ny.n;
  const values = new Map(chart.series[0].points.map((p) => [`${p.x}|${p.y}`, p.value]));
  const found: { value: number; fill: Rgba }[] = [];
  for (const cell of cells(svg)) {
    const w = cell.x1 - cell.x0;
    const h = cell.y1 - cell.y0;
    if (Math.abs(w - cw) > 0.05 * cw || Math.abs(h - ch) > 0.05 * ch) continue;
    const col = Math.floor((cell.x0 + w / 2 - pa.x) / cw);
    const row = Math.floor((cell.y0 + h / 2 - pa.y) / ch);
    if (col < 0 || row < 0 || col >= nx.n || row >= ny.n) continue;
    const v = values.get(`${nx.key(col)}|${ny.key(row)}`);
    if (v !== undefined) found.push({ value: v, fill: cell.fill });
  }
  expect(found.length).toBe(chart.series[0].points.length);
  found.sort((p, q) => p.value - q.value);
  return found.map((f) => f.fill);
}

describe('real heatmaps from ../shared/real-charts', () => {
  const manifest = JSON.parse(fs.readFileSync(path.resolve(chartsDir, 'manifest.json'), 'utf8')) as Heatmap[];
  const heatmaps = manifest.filter((m) => m.kind === 'heatmap');
  it('has four heatmaps, three with a planted rainbow ramp', () => {
    expect(heatmaps).toHaveLength(4);
    expect(heatmaps.filter((h) => h.planted.includes('rainbow-ramp'))).toHaveLength(3);
  });
  // source: manifest.json 'planted' (rainbow-ramp) and 'colormap' fields — ground truth of the chart generator
  it.each(heatmaps.map((h) => [h.file, h] as const))('%s', (_f, chart) => {
    const ordered = colourByValue(chart);
    const mono = isMonotonicLightness(ordered, 1);
    const hue = hueCycling(ordered);
    const rainbow = chart.planted.includes('rainbow-ramp');
    expect(!mono.monotonic).toBe(rainbow);
    expect(hue.cyclesHue).toBe(rainbow);
    if (!rainbow) expect(toLab65(ordered[ordered.length - 1]).l).toBeGreaterThan(toLab65(ordered[0]).l);
  });
});
