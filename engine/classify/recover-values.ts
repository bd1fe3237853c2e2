/**
 * Series and values: marks grouped by paint, the chart kind decided from the
 * marks' arrangement, and every mark read back through the fitted scales.
 */
import { formatHex } from '../color/format-hex.js';
import type { Rgba } from '../color/types.js';
import type { Box, Scene, ShapeItem } from '../read/scene.js';
import type { ChartKind } from '../report/types.js';
import { bottom, centerX, centerY, right } from './boxes.js';
import type { Axis, ColorBar, DataPoint, ItemRole, LegendEntry, PieInfo, Series, SubRole } from './chart.js';
import { invertAxis, nearestBand } from './find-axes.js';
import type { ExtrudedBars } from './find-3d-bars.js';

export interface RecoverInput {
  scene: Scene;
  roles: ItemRole[];
  marks: ShapeItem[];
  axes: { x: Axis | null; y: Axis | null; y2: Axis | null };
  plotArea: Box | null;
  legend: LegendEntry[];
  pie: PieInfo | null;
  colorBar: ColorBar | null;
  heat: boolean;
  extrusion: ExtrudedBars | null;
}

export interface Recovered {
  kind: ChartKind;
  orientation: 'vertical' | 'horizontal' | null;
  series: Series[];
}

function paintOf(s: ShapeItem, sub: SubRole): Rgba | null {
  if (sub === 'mark/line') return s.stroke.color ?? s.fill.color;
  return s.fill.kind !== 'none' ? s.fill.color : s.stroke.color;
}

function keyOf(c: Rgba | null): string {
  return c ? formatHex(c) : 'none';
}

export function recoverSeries(input: RecoverInput): Recovered {
  const { marks, roles, axes, legend, pie } = input;
  const nameFor = (c: Rgba | null): string | null => {
    if (!c) return null;
    const hex = keyOf(c);
    const exact = legend.find((e) => e.color && keyOf(e.color) === hex);
    if (exact) return exact.name;
    return null;
  };

  if (pie) {
    const series: Series = {
      name: null,
      color: null,
      colorHex: null,
      axis: 'y',
      markType: 'mark/wedge',
      items: pie.wedges.map((w) => w.item),
      points: pie.wedges.map((w) => ({ x: w.label ?? nameFor(w.color), y: w.share, items: [w.item] })),
    };
    const donut = !pie.radiusVaries && pie.innerRadius > 0.15 * pie.radius;
    return { kind: donut ? 'donut' : 'pie', orientation: null, series: [series] };
  }

  const bySub = (sub: SubRole): ShapeItem[] => marks.filter((m) => roles[m.index]!.sub === sub);
  const bars = bySub('mark/bar');
  const lines = bySub('mark/line');
  const points = bySub('mark/point');
  const areas = bySub('mark/area');
  const cells = bySub('mark/cell');

  if (cells.length > 0) return { kind: 'heatmap', orientation: null, series: heatmapSeries(cells, input) };

  const weight = (xs: ShapeItem[]): number => xs.length;
  const group = (xs: ShapeItem[], sub: SubRole): Map<string, ShapeItem[]> => {
    const m = new Map<string, ShapeItem[]>();
    for (const s of xs) {
      const k = keyOf(paintOf(s, sub));
      const arr = m.get(k) ?? [];
      arr.push(s);
      m.set(k, arr);
    }
    return m;
  };

  // Extruded (3D) bars: drawn through a 3D projection that 2D axes cannot invert. Series are kept
  // (by front-face colour); their values are not recovered rather than guessed.
  if (input.extrusion && bars.length >= 2) {
    const groups = group(bars, 'mark/bar');
    const series = [...groups.values()].map((members) => makeSeries(nameFor(members[0]!.fill.color), members[0]!.fill.color, 'mark/bar', members, []));
    return { kind: 'bar', orientation: 'vertical', series };
  }
  // Bars dominate when present in number; lines beat scattered points of the same colour (markers on lines).
  if (bars.length >= 2 && bars.length >= weight(lines) && bars.length >= 0.5 * weight(points)) {
    return barSeries(bars, group(bars, 'mark/bar'), input, nameFor);
  }
  if (areas.length > 0 && areas.length >= lines.length / 2) {
    return { kind: 'area', orientation: null, series: lineLikeSeries([...areas], 'mark/area', group(areas, 'mark/area'), input, nameFor) };
  }
  if (lines.length > 0 && (points.length < 5 * lines.length || markersOnLines(points, lines) >= 0.7)) {
    return { kind: 'line', orientation: null, series: lineLikeSeries(lines, 'mark/line', group(lines, 'mark/line'), input, nameFor) };
  }
  if (points.length > 0) {
    return { kind: 'scatter', orientation: null, series: pointSeries(group(points, 'mark/point'), input, nameFor) };
  }
  if (bars.length === 1) return barSeries(bars, group(bars, 'mark/bar'), input, nameFor);
  return { kind: 'unknown', orientation: null, series: [] };
}

/** A bar's box: its rectangle, or for extruded bars the front face's bounds. */
function boxOf(s: ShapeItem): Box {
  return s.rect ?? s.bbox;
}

/** Share of point marks centred on a vertex of some line (markers drawn at a line's data points). */
function markersOnLines(points: ShapeItem[], lines: ShapeItem[]): number {
  if (points.length === 0) return 0;
  const cell = 2;
  const grid = new Set<string>();
  for (const l of lines) {
    for (const p of l.polylines) {
      for (let k = 0; k < p.length; k += 2) grid.add(`${Math.round(p[k]! / cell)},${Math.round(p[k + 1]! / cell)}`);
    }
  }
  let on = 0;
  for (const pt of points) {
    const cx = Math.round((pt.circle ? pt.circle.cx : centerX(pt.bbox)) / cell);
    const cy = Math.round((pt.circle ? pt.circle.cy : centerY(pt.bbox)) / cell);
    let hit = false;
    for (let dx = -1; dx <= 1 && !hit; dx++) for (let dy = -1; dy <= 1 && !hit; dy++) if (grid.has(`${cx + dx},${cy + dy}`)) hit = true;
    if (hit) on++;
  }
  return on / points.length;
}

function makeSeries(name: string | null, color: Rgba | null, sub: SubRole, items: ShapeItem[], points: DataPoint[], axis: 'y' | 'y2' = 'y'): Series {
  return { name, color, colorHex: color ? formatHex({ ...color, alpha: 1 }) : null, axis, markType: sub, items: items.map((i) => i.index), points };
}

function barSeries(
  bars: ShapeItem[],
  groups: Map<string, ShapeItem[]>,
  input: RecoverInput,
  nameFor: (c: Rgba | null) => string | null,
): Recovered {
  const { axes, plotArea } = input;
  // Orientation: the category axis is the band one; otherwise bars share widths along the category direction.
  let orientation: 'vertical' | 'horizontal';
  if (axes.x?.scale === 'band' && axes.y?.scale !== 'band') orientation = 'vertical';
  else if (axes.y?.scale === 'band' && axes.x?.scale !== 'band') orientation = 'horizontal';
  else {
    const widths = new Set(bars.map((b) => Math.round(boxOf(b).width * 10)));
    const heights = new Set(bars.map((b) => Math.round(boxOf(b).height * 10)));
    orientation = widths.size <= heights.size ? 'vertical' : 'horizontal';
  }
  if (input.extrusion && input.extrusion.faces.length > 0) orientation = 'vertical';
  const valueAxis = orientation === 'vertical' ? axes.y : axes.x;
  const catAxis = orientation === 'vertical' ? axes.x : axes.y;
  const along = (b: Box): number => (orientation === 'vertical' ? centerX(b) : centerY(b));

  // Baseline: where the value 0 is drawn when visible, else the plot edge the bars grow from.
  const zero = valueAxis?.fit ? valueAxis.fit.b + (valueAxis.scale === 'log' ? NaN : 0) : NaN;
  const lo = orientation === 'vertical' ? (plotArea ? bottom(plotArea) : NaN) : plotArea ? plotArea.x : NaN;
  const hi = orientation === 'vertical' ? (plotArea ? plotArea.y : NaN) : plotArea ? right(plotArea) : NaN;
  const zeroVisible = Number.isFinite(zero) && Number.isFinite(lo) && zero >= Math.min(lo, hi) - 1 && zero <= Math.max(lo, hi) + 1;
  // Without a visible zero, bars grow from their common edge (the most frequent near edge), which is
  // usually but not always the plot edge (axis lines with end ticks enlarge the plot box a little).
  const commonEdge = (): number => {
    const counts = new Map<number, number>();
    for (const b of bars) {
      const r = boxOf(b);
      for (const e of orientation === 'vertical' ? [bottom(r), r.y] : [r.x, right(r)]) counts.set(Math.round(e * 2) / 2, (counts.get(Math.round(e * 2) / 2) ?? 0) + 1);
    }
    const best = [...counts.entries()].sort((a, b) => b[1] - a[1] || Math.abs(a[0] - lo) - Math.abs(b[0] - lo))[0];
    return best && best[1] >= Math.max(2, 0.5 * bars.length) ? best[0] : lo;
  };
  const baseline = zeroVisible ? zero : commonEdge();

  const valueOf = (b: Box): { value: number; stackedOn: boolean } => {
    const [near, far] = orientation === 'vertical' ? [bottom(b), b.y] : [b.x, right(b)];
    // Which end touches the baseline (negative bars hang below it).
    const dNear = Math.abs(near - baseline);
    const dFar = Math.abs(far - baseline);
    const tol = Math.max(1.5, 0.01 * Math.abs((orientation === 'vertical' ? b.height : b.width)));
    if (!valueAxis?.fit) return { value: orientation === 'vertical' ? b.height : b.width, stackedOn: false };
    if (Math.min(dNear, dFar) <= tol || !Number.isFinite(baseline)) {
      const end = dNear <= dFar ? far : near;
      return { value: invertAxis(valueAxis, end) - (zeroVisible ? 0 : 0), stackedOn: false };
    }
    return { value: invertAxis(valueAxis, far) - invertAxis(valueAxis, near), stackedOn: true };
  };

  // Stacked or grouped: bars of different series at one category position.
  // Sorted sweep: bars whose centres are within a quarter of a bar width share a slot (linear after sorting).
  const slots = new Map<number, ShapeItem[]>();
  const byAlong = [...bars].sort((a, b) => along(boxOf(a)) - along(boxOf(b)));
  let slotKey = NaN;
  for (const b of byAlong) {
    const c = along(boxOf(b));
    const size = orientation === 'vertical' ? boxOf(b).width : boxOf(b).height;
    if (!(Math.abs(c - slotKey) <= 0.25 * size)) slotKey = c;
    const arr = slots.get(slotKey) ?? [];
    arr.push(b);
    slots.set(slotKey, arr);
  }
  const multiSeries = groups.size > 1;
  const stacked = multiSeries && [...slots.values()].filter((s) => s.length > 1).length >= Math.max(1, 0.5 * slots.size);
  let kind: ChartKind = 'bar';
  if (multiSeries) kind = stacked ? 'stacked-bar' : 'grouped-bar';

  const series: Series[] = [];
  for (const [, members] of groups) {
    const color = members[0]!.fill.color;
    const pts: DataPoint[] = [];
    const ordered = [...members].sort((a, b) => along(boxOf(a)) - along(boxOf(b)));
    for (const b of ordered) {
      const r = boxOf(b);
      const { value } = stacked ? valueOfStacked(r) : valueOf(r);
      const pos = along(r);
      let x: number | string | null = null;
      if (catAxis?.scale === 'band') {
        x = nearestBand(catAxis, pos);
        if (x === null && multiSeries) x = nearestBand(catAxis, groupCentre(b, bars, orientation));
      } else if (catAxis?.fit) {
        x = invertAxis(catAxis, pos);
      }
      pts.push({ x, y: value, items: [b.index] });
    }
    series.push(makeSeries(nameFor(color), color, 'mark/bar', members, pts));
  }
  return { kind, orientation, series };

  function valueOfStacked(b: Box): { value: number; stackedOn: boolean } {
    if (!valueAxis?.fit) return { value: orientation === 'vertical' ? b.height : b.width, stackedOn: true };
    const [near, far] = orientation === 'vertical' ? [bottom(b), b.y] : [b.x, right(b)];
    return { value: invertAxis(valueAxis, far) - invertAxis(valueAxis, near), stackedOn: true };
  }
}

/** The centre of the cluster of bars (all series) that a bar belongs to: grouped bars sit around their category. */
function groupCentre(b: ShapeItem, bars: ShapeItem[], orientation: 'vertical' | 'horizontal'): number {
  const r = boxOf(b);
  const lo = (x: Box): number => (orientation === 'vertical' ? x.x : x.y);
  const size = (x: Box): number => (orientation === 'vertical' ? x.width : x.height);
  const sorted = [...bars].map((x) => boxOf(x)).sort((p, q) => lo(p) - lo(q));
  // Walk neighbours that touch (gap under a fifth of a bar) to find the cluster.
  let start = lo(r);
  let end = lo(r) + size(r);
  let changed = true;
  while (changed) {
    changed = false;
    for (const x of sorted) {
      const gap = 0.2 * size(x);
      if (lo(x) + size(x) >= start - gap && lo(x) < start) {
        start = lo(x);
        changed = true;
      }
      if (lo(x) <= end + gap && lo(x) + size(x) > end) {
        end = lo(x) + size(x);
        changed = true;
      }
    }
  }
  return (start + end) / 2;
}

function lineLikeSeries(
  shapes: ShapeItem[],
  sub: SubRole,
  groups: Map<string, ShapeItem[]>,
  input: RecoverInput,
  nameFor: (c: Rgba | null) => string | null,
): Series[] {
  const { axes, plotArea } = input;
  const out: Series[] = [];
  for (const [, members] of groups) {
    for (const s of members) {
      const color = paintOf(s, sub);
      const yAxis = pickValueAxis(s, input);
      const pts: DataPoint[] = [];
      if (sub === 'mark/area') {
        out.push(makeSeries(nameFor(color), color, sub, [s], areaPoints(s, yAxis, input), 'y'));
        continue;
      }
      for (const poly of s.polylines) {
        for (let k = 0; k < poly.length; k += 2) {
          const px = poly[k]!;
          const py = poly[k + 1]!;
          const x = axes.x?.scale === 'band' ? nearestBand(axes.x, px) : axes.x?.fit ? invertAxis(axes.x, px) : px;
          const y = yAxis?.fit ? invertAxis(yAxis, py) : py;
          const prev = pts[pts.length - 1];
          if (prev && prev.x === x && Math.abs(prev.y - y) < 1e-9) continue;
          pts.push({ x, y, items: [s.index] });
        }
      }
      out.push(makeSeries(nameFor(color), color, sub, [s], pts, yAxis === axes.y2 && axes.y2 ? 'y2' : 'y'));
    }
  }
  return out;
}

/**
 * An area's outline runs out along its top and back along its bottom. Per
 * vertex column: the value is the top read through the scale, minus the
 * bottom when the bottom is another band's top (stacked areas).
 */
function areaPoints(s: ShapeItem, yAxis: Axis | null, input: RecoverInput): DataPoint[] {
  const { axes, plotArea } = input;
  const cols = new Map<number, { x: number; top: number; bottom: number }>();
  for (const poly of s.polylines) {
    for (let k = 0; k < poly.length; k += 2) {
      const px = poly[k]!;
      const py = poly[k + 1]!;
      const key = Math.round(px * 4);
      const c = cols.get(key);
      if (!c) cols.set(key, { x: px, top: py, bottom: py });
      else {
        c.top = Math.min(c.top, py);
        c.bottom = Math.max(c.bottom, py);
      }
    }
  }
  const zeroPos = yAxis?.fit && yAxis.scale !== 'log' ? yAxis.fit.b : NaN;
  const floor = plotArea ? bottom(plotArea) : Math.max(...[...cols.values()].map((c) => c.bottom));
  const pts: DataPoint[] = [];
  for (const c of [...cols.values()].sort((a, b) => a.x - b.x)) {
    const onBase = Math.abs(c.bottom - floor) < 1 || (Number.isFinite(zeroPos) && Math.abs(c.bottom - zeroPos) < 1) || c.bottom === c.top;
    const topV = yAxis?.fit ? invertAxis(yAxis, c.top) : c.top;
    const y = onBase || !yAxis?.fit ? topV : topV - invertAxis(yAxis, c.bottom);
    const x = axes.x?.scale === 'band' ? nearestBand(axes.x, c.x) : axes.x?.fit ? invertAxis(axes.x, c.x) : c.x;
    pts.push({ x, y, items: [s.index] });
  }
  return pts;
}

/** Lines on a chart with two value axes: the axis whose range the line fits (by legend order it can't be told). */
function pickValueAxis(s: ShapeItem, input: RecoverInput): Axis | null {
  const { axes } = input;
  if (!axes.y2) return axes.y;
  // A line whose colour matches the right axis's tick labels or title belongs to y2.
  const y2Labels = axes.y2.ticks.map((t) => t.label).filter((x): x is number => x !== null);
  const yLabels = axes.y?.ticks.map((t) => t.label).filter((x): x is number => x !== null) ?? [];
  const color = paintOf(s, 'mark/line');
  const items = input.scene.items;
  const labelColor = (ids: number[]): string | null => {
    const t = ids.map((i) => items[i]).find((x) => x && x.kind === 'text');
    return t && t.kind === 'text' && t.fill.color ? formatHex(t.fill.color) : null;
  };
  const c = color ? formatHex(color) : null;
  if (c && labelColor(y2Labels) === c && labelColor(yLabels) !== c) return axes.y2;
  if (c && labelColor(yLabels) === c) return axes.y;
  // Otherwise: the axis titles nearest in colour are not available; later series go to y2.
  const order = input.marks.filter((m) => input.roles[m.index]!.sub === 'mark/line');
  return order.indexOf(s) > 0 ? axes.y2 : axes.y;
}

function pointSeries(groups: Map<string, ShapeItem[]>, input: RecoverInput, nameFor: (c: Rgba | null) => string | null): Series[] {
  const { axes } = input;
  const out: Series[] = [];
  for (const [, members] of groups) {
    const color = paintOf(members[0]!, 'mark/point');
    const pts: DataPoint[] = members.map((s) => {
      const cx = s.circle ? s.circle.cx : centerX(s.bbox);
      const cy = s.circle ? s.circle.cy : centerY(s.bbox);
      const x = axes.x?.scale === 'band' ? nearestBand(axes.x, cx) : axes.x?.fit ? invertAxis(axes.x, cx) : cx;
      const y = axes.y?.scale === 'band' ? NaN : axes.y?.fit ? invertAxis(axes.y, cy) : cy;
      return { x, y, items: [s.index] };
    });
    out.push(makeSeries(nameFor(color), color, 'mark/point', members, pts));
  }
  return out;
}

function heatmapSeries(cells: ShapeItem[], input: RecoverInput): Series[] {
  const { axes, colorBar } = input;
  const pts: DataPoint[] = cells.map((c) => {
    const r = c.rect!;
    const x = axes.x?.scale === 'band' ? nearestBand(axes.x, centerX(r)) : axes.x?.fit ? invertAxis(axes.x, centerX(r)) : centerX(r);
    const yc = axes.y?.scale === 'band' ? nearestBand(axes.y, centerY(r)) : axes.y?.fit ? invertAxis(axes.y, centerY(r)) : centerY(r);
    const value = colorBar && c.fill.color ? valueFromColorBar(c.fill.color, colorBar) : null;
    return { x, y: typeof yc === 'number' ? yc : NaN, yCategory: yc, value, items: [c.index] };
  });
  return [makeSeries(null, null, 'mark/cell', cells, pts)];
}

/** A cell's value: the colour bar position of the nearest colour, mapped to the bar's value range. */
export function valueFromColorBar(color: Rgba, bar: ColorBar): number | null {
  if (bar.low === null || bar.high === null || bar.colors.length < 2) return null;
  let best = 0;
  let bestD = Infinity;
  for (let k = 0; k < bar.colors.length; k++) {
    const c = bar.colors[k]!;
    const d = (c.r - color.r) ** 2 + (c.g - color.g) ** 2 + (c.b - color.b) ** 2;
    if (d < bestD) {
      bestD = d;
      best = k;
    }
  }
  return bar.low + ((bar.high - bar.low) * best) / (bar.colors.length - 1);
}
