/**
 * Scene → Chart. Geometry and paint decide; ids and classes never do.
 *
 * Order: page background → legend → pie → plot area → axes → guides → marks
 * → series and kind → recovered values.
 */
import { formatHex } from '../color/format-hex.js';
import type { Rgba } from '../color/types.js';
import type { Box, ImageItem, Scene, SceneItem, ShapeItem, TextItem } from '../read/scene.js';
import type { ChartKind } from '../report/types.js';
import { area, bottom, centerX, centerY, containsPoint, expand, right, straightLineOf, unionAll } from './boxes.js';
import type { Axis, Chart, ColorBar, ItemRole, LegendEntry, Series, SubRole } from './chart.js';
import { axisAsBands, chooseAxes, fillThinnedBands, findLabelGroups, shareOnTicks, toAxis, type LabelGroup } from './find-axes.js';
import { findLegend } from './find-legend.js';
import { blendOver, findPage } from './find-page.js';
import { findPlotArea } from './find-plot-area.js';
import { findImageColorBar, findVectorColorBar } from './find-color-bar.js';
import { detectPie } from './pie/detect-wedges.js';
import { recoverSeries } from './recover-values.js';
import { detectExtrudedBars } from './find-3d-bars.js';

const role = (sub: SubRole): ItemRole => ({ role: sub.slice(0, sub.indexOf('/')) as ItemRole['role'], sub });

export function classifyChart(scene: Scene): Chart {
  const items = scene.items;
  const roles: ItemRole[] = items.map((it) => role(it.kind === 'text' ? 'label/other' : 'decoration/other'));
  const set = (i: number, sub: SubRole): void => {
    roles[i] = role(sub);
  };
  const shapes = items.filter((i): i is ShapeItem => i.kind === 'shape');
  const texts = items.filter((i): i is TextItem => i.kind === 'text');
  const images = items.filter((i): i is ImageItem => i.kind === 'image');

  // Page.
  const page = findPage(items, scene.viewBox);
  for (const i of page.items) set(i, 'decoration/page');
  const pageSet = new Set(page.items);

  // Legend.
  const legendFound = findLegend(items, pageSet);
  let legend: LegendEntry[] = legendFound.entries;

  // Pie.
  // Wedges are never tiny next to the drawing: markers of a scatter plot are not tried as wedges.
  const minWedge = 0.04 * Math.min(scene.viewBox.width, scene.viewBox.height);
  const swatches = new Set(legend.map((e) => e.swatch));
  const pieShapes = shapes.filter((s) => !pageSet.has(s.index) && !swatches.has(s.index) && Math.max(s.bbox.width, s.bbox.height) >= minWedge);
  const pie = detectPie(pieShapes, texts);

  // Plot area (not for pies).
  const legendItems = new Set<number>(legend.flatMap((e) => [e.swatch, ...(e.label !== null ? [e.label] : [])]));
  if (legendFound.box !== null) legendItems.add(legendFound.box);
  const pool0 = shapes.filter((s) => !pageSet.has(s.index) && !legendItems.has(s.index));
  const vectorBar = pie ? null : findVectorColorBar(shapes.filter((s) => !pageSet.has(s.index)), texts);
  const barItems = new Set(vectorBar?.items ?? []);
  if (vectorBar) {
    // Tick marks and labels along a colour bar are its scale, not legend entries.
    const barBox = unionAll(vectorBar.items.map((i) => items[i]!.bbox))!;
    const reach = expand(barBox, 2 * Math.max(...texts.map((t) => t.fontSize), 8));
    const keep = legend.filter((e) => {
      const b = items[e.swatch]!.bbox;
      return !(b.x < reach.x + reach.width && b.x + b.width > reach.x && b.y < reach.y + reach.height && b.y + b.height > reach.y);
    });
    if (keep.length !== legend.length) {
      for (const e of legend) {
        if (keep.includes(e)) continue;
        legendItems.delete(e.swatch);
        if (e.label !== null) legendItems.delete(e.label);
      }
      legend = keep.length >= 2 ? keep : [];
      if (legend.length === 0) legendItems.clear();
    }
  }
  // The colour bar's own tick marks sit just beside it.
  const barReach = vectorBar ? expand(unionAll(vectorBar.items.map((i) => items[i]!.bbox))!, 8) : null;
  for (const s of pool0) {
    if (barReach && !barItems.has(s.index) && straightLineOf(s) && s.bbox.x >= barReach.x && right(s.bbox) <= right(barReach) && s.bbox.y >= barReach.y && bottom(s.bbox) <= bottom(barReach)) barItems.add(s.index);
  }
  const plotPool = pool0.filter((s) => !barItems.has(s.index));
  const plotEvidence = pie ? null : findPlotArea(plotPool, scene.viewBox);
  let plotArea: Box | null = plotEvidence?.box ?? null;
  let background: Rgba = page.color;
  if (plotEvidence?.source === 'background') {
    const bg = items[plotEvidence.items[0]!] as ShapeItem;
    if (bg.fill.color) background = blendOver(bg.fill.color, bg.fill.opacity, page.color);
  }

  // A single "legend entry" inside the plot area is more likely a data label beside a mark.
  if (legend.length === 1 && plotArea && containsPoint(plotArea, centerX(items[legend[0]!.swatch]!.bbox), centerY(items[legend[0]!.swatch]!.bbox))) {
    legend = [];
    legendItems.clear();
  }
  for (const e of legend) {
    set(e.swatch, 'legend/swatch');
    if (e.label !== null) set(e.label, 'label/legend');
  }
  if (legendFound.box !== null && legend.length > 0) set(legendFound.box, 'legend/box');

  // Axes.
  const excludedTexts = new Set<number>(legend.map((e) => e.label).filter((x): x is number => x !== null));
  const shapeBox = plotArea ?? unionAll(plotPool.map((s) => s.bbox));
  const groups = pie ? [] : findLabelGroups(texts, excludedTexts);
  const chosen = pie ? { x: null, y: null, y2: null } : chooseAxes(groups, shapeBox);

  // Plot-area fallback from the axes when no drawn evidence was found.
  if (!pie && plotEvidence?.source === 'marks' && chosen.x && chosen.y) {
    const xs = chosen.x.scale.ticks.map((t) => t.position);
    const ys = chosen.y.scale.ticks.map((t) => t.position);
    const marks = plotArea!;
    const x0 = Math.min(...xs, marks.x);
    const x1 = Math.max(...xs, right(marks));
    const y0 = Math.min(...ys, marks.y);
    const y1 = Math.max(...ys, bottom(marks));
    plotArea = { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
  }

  // Guides.
  const eps = plotArea ? Math.max(1.5, 0.006 * Math.max(plotArea.width, plotArea.height)) : 1.5;
  const tickX: number[] = [];
  const tickY: number[] = [];
  const frameSides = { top: [] as number[], bottom: [] as number[], left: [] as number[], right: [] as number[] };
  if (plotEvidence && plotEvidence.source !== 'marks' && plotEvidence.source !== 'clip' && plotEvidence.source !== 'rules') {
    for (const i of plotEvidence.items) set(i, plotEvidence.source === 'background' ? 'guide/background' : 'guide/frame');
  }
  const candidates: ShapeItem[] = [];
  for (const s of shapes) {
    if (pageSet.has(s.index) || legendItems.has(s.index) || barItems.has(s.index) || roles[s.index]!.role === 'guide') continue;
    if (pie) {
      candidates.push(s);
      continue;
    }
    const sub = plotArea ? guideRole(s, plotArea, eps) : null;
    if (sub) {
      set(s.index, sub.sub);
      if (sub.sub === 'guide/tick') (sub.along === 'x' ? tickX : tickY).push(sub.at);
      if (sub.edge) frameSides[sub.edge].push(s.index);
      continue;
    }
    candidates.push(s);
  }
  if (plotEvidence?.source === 'frame' || plotEvidence?.source === 'frame-lines') {
    frameSides.top.push(...plotEvidence.items);
  }

  // Axes with tick marks snapped.
  let axes: Chart['axes'] = { x: null, y: null, y2: null };
  if (!pie) {
    const multiplierNear = (g: LabelGroup | null): TextItem | null => findMultiplier(texts, g, plotArea);
    const mk = (name: 'x' | 'y' | 'y2', g: LabelGroup | null): Axis | null => {
      if (!g) return null;
      const range: [number, number] | null = plotArea
        ? g.direction === 'horizontal'
          ? [plotArea.x, right(plotArea)]
          : [plotArea.y, bottom(plotArea)]
        : null;
      try {
        return toAxis(name, g, g.direction === 'horizontal' ? tickX : tickY, range, multiplierNear(g));
      } catch {
        return null;
      }
    };
    axes = { x: mk('x', chosen.x), y: mk('y', chosen.y), y2: mk('y2', chosen.y2) };
    for (const a of [axes.x, axes.y, axes.y2]) {
      if (!a) continue;
      for (const t of a.ticks) if (t.label !== null) set(t.label, 'label/tick');
    }
  }

  // Colour bar (heatmaps): an image or a strip of cells outside the plot area.
  const colorBar: ColorBar | null = pie ? null : vectorBar ?? findImageColorBar(images, plotArea, texts);
  if (colorBar) {
    for (const i of colorBar.items) set(i, 'guide/colorbar');
    // Labels of the colour bar are its scale, not a second value axis.
    const barBox = unionAll(colorBar.items.map((i) => items[i]!.bbox));
    if (axes.y2 && barBox && Math.abs(axes.y2.ticks[0]!.position - centerY(barBox)) < barBox.height) {
      const near = axes.y2.ticks.every((t) => t.label === null || Math.abs(items[t.label]!.bbox.x - right(barBox)) < 4 * (items[t.label] as TextItem).fontSize);
      if (near) axes = { ...axes, y2: null };
    }
  }

  // Marks.
  const markPool = candidates.filter((s) => roles[s.index]!.role !== 'guide');
  const extrusion = pie ? null : detectExtrudedBars(markPool);
  const extrusions: number[] = extrusion?.faces ?? [];
  for (const i of extrusions) set(i, 'decoration/3d-face');

  const marks: ShapeItem[] = [];
  if (pie) {
    for (const w of pie.wedges) {
      set(w.item, 'mark/wedge');
      marks.push(items[w.item] as ShapeItem);
    }
    for (const i of pie.walls) set(i, 'decoration/3d-face');
    for (const i of pie.shadows) set(i, 'decoration/shadow');
  } else {
    const region = plotArea ? expand(plotArea, eps) : null;
    for (const s of markPool) {
      if (extrusions.includes(s.index)) continue;
      if (extrusion?.fronts.includes(s.index)) {
        set(s.index, 'mark/bar');
        marks.push(s);
        continue;
      }
      if (s.filter) {
        // Items drawn through a filter that sit under a same-shaped item are shadows.
        if (isShadow(s, markPool)) {
          set(s.index, 'decoration/shadow');
          continue;
        }
      }
      if (region && !containsPoint(region, centerX(s.bbox), centerY(s.bbox))) continue;
      const sub = markRole(s, plotArea);
      if (sub) {
        set(s.index, sub);
        marks.push(s);
      }
    }
    if (extrusion) for (const i of extrusion.fronts) if (!marks.some((m) => m.index === i)) {
      set(i, 'mark/bar');
      marks.push(items[i] as ShapeItem);
    }
  }

  // Heatmap cells: many same-size rectangles on a grid with many colours.
  const heat = !pie && !extrusion && isHeatmap(marks.filter((m) => roles[m.index]!.sub === 'mark/bar' && m.rect !== null));
  if (heat) for (const m of marks) if (roles[m.index]!.sub === 'mark/bar') set(m.index, 'mark/cell');

  // Category axes drawn with numeric-looking labels: bars centred on every tick, or clock-time
  // labels without dates under lines, are categories.
  if (!pie && !heat) {
    const labelOf = (i: number): string | null => (items[i]?.kind === 'text' ? (items[i] as TextItem).content : null);
    const barMarks = marks.filter((m) => roles[m.index]!.sub === 'mark/bar');
    const lineMarks = marks.filter((m) => roles[m.index]!.sub === 'mark/line' || roles[m.index]!.sub === 'mark/area');
    for (const name of ['x', 'y'] as const) {
      const a = axes[name];
      if (!a || a.scale === 'band' || a.ticks.length < 2) continue;
      const along = (b: Box): number => (a.direction === 'horizontal' ? centerX(b) : centerY(b));
      const barPos = barMarks.map((m) => along(m.rect ?? m.bbox));
      const barsAcross = barMarks.length > 0 && barMarks.every((m) => (a.direction === 'horizontal' ? (m.rect ?? m.bbox).width < (m.rect ?? m.bbox).height * 4 : true));
      const clock = a.ticks.every((t) => t.label !== null && /^\s*\d{1,2}:\d{2}\s*$/.test(labelOf(t.label) ?? ''));
      if ((barPos.length >= 2 && barsAcross && shareOnTicks(a, barPos) >= 0.8 && isCategoryDirection(name, barMarks)) || (clock && lineMarks.length > 0)) {
        axes = { ...axes, [name]: axisAsBands(a, texts, labelOf) };
      }
    }
    // Thinned band labels: fill in the skipped category names where marks sit between labels.
    for (const name of ['x', 'y'] as const) {
      const a = axes[name];
      if (!a || a.scale !== 'band') continue;
      const pos = marks.flatMap((m) => {
        const sub = roles[m.index]!.sub;
        if (sub === 'mark/line' || sub === 'mark/area') return m.polylines.flatMap((p) => p.filter((_, k) => k % 2 === (a.direction === 'horizontal' ? 0 : 1)));
        return [a.direction === 'horizontal' ? centerX(m.bbox) : centerY(m.bbox)];
      });
      axes = { ...axes, [name]: fillThinnedBands(a, pos) };
    }
  }

  // Text roles beyond ticks and legend.
  assignTextRoles(texts, roles, plotArea, scene, axes, pie !== null);

  // Series, kind, values.
  const recovered = recoverSeries({ scene, roles, marks, axes, plotArea, legend, pie, colorBar, heat, extrusion });
  const kind: ChartKind = recovered.kind;
  const threeD = (pie?.ellipse != null && (pie.walls.length > 0 || (pie.ellipse.tilt ?? 0) > 0.1)) || (extrusion !== null && extrusion.faces.length > 0);

  const chart: Chart = {
    scene,
    kind,
    threeD,
    orientation: recovered.orientation,
    plotArea: pie ? pieBox(pie) : plotArea,
    background,
    page: page.color,
    roles,
    axes,
    series: recovered.series,
    legend,
    pie,
    colorBar,
    extrusions,
    title: titleText(texts, roles) ?? scene.title,
  };
  return chart;
}

/** Bars' category direction: vertical bars spread along x, horizontal bars along y. */
function isCategoryDirection(axis: 'x' | 'y', bars: ShapeItem[]): boolean {
  const r = (m: ShapeItem): Box => m.rect ?? m.bbox;
  const widths = new Set(bars.map((b) => Math.round(r(b).width * 10)));
  const heights = new Set(bars.map((b) => Math.round(r(b).height * 10)));
  const vertical = widths.size <= heights.size;
  return axis === 'x' ? vertical : !vertical;
}

function pieBox(pie: NonNullable<Chart['pie']>): Box {
  if (pie.ellipse) {
    const e = pie.ellipse;
    // The axis-aligned box of the (possibly rotated) top-face ellipse.
    const hw = Math.hypot(e.rx * Math.cos(e.angle), e.ry * Math.sin(e.angle));
    const hh = Math.hypot(e.rx * Math.sin(e.angle), e.ry * Math.cos(e.angle));
    return { x: e.cx - hw, y: e.cy - hh, width: 2 * hw, height: 2 * hh };
  }
  return { x: pie.cx - pie.radius, y: pie.cy - pie.radius, width: 2 * pie.radius, height: 2 * pie.radius };
}

interface GuideRole {
  sub: SubRole;
  along?: 'x' | 'y';
  at: number;
  edge?: 'top' | 'bottom' | 'left' | 'right';
}

/** Rules, ticks and frames relative to the plot area. */
function guideRole(s: ShapeItem, p: Box, eps: number): GuideRole | null {
  const l = straightLineOf(s);
  if (l) {
    const tickLen = Math.max(12, 0.04 * Math.min(p.width, p.height));
    if (l.orientation === 'horizontal') {
      const y = (l.y0 + l.y1) / 2;
      const x0 = Math.min(l.x0, l.x1);
      const x1 = Math.max(l.x0, l.x1);
      if (l.length <= tickLen && (Math.abs(x0 - p.x) <= tickLen || Math.abs(x1 - right(p)) <= tickLen) && (x1 <= p.x + tickLen || x0 >= right(p) - tickLen)) {
        if (y >= p.y - eps && y <= bottom(p) + eps) return { sub: 'guide/tick', along: 'y', at: y };
      }
      if (l.length >= 0.6 * p.width && y >= p.y - eps && y <= bottom(p) + eps && x0 <= p.x + 0.2 * p.width) {
        if (Math.abs(y - p.y) <= eps) return { sub: 'guide/axis', at: y, edge: 'top' };
        if (Math.abs(y - bottom(p)) <= eps) return { sub: 'guide/axis', at: y, edge: 'bottom' };
        return { sub: 'guide/grid', at: y };
      }
    } else if (l.orientation === 'vertical') {
      const x = (l.x0 + l.x1) / 2;
      const y0 = Math.min(l.y0, l.y1);
      const y1 = Math.max(l.y0, l.y1);
      if (l.length <= tickLen && (Math.abs(y1 - bottom(p)) <= tickLen || Math.abs(y0 - p.y) <= tickLen) && (y0 >= bottom(p) - tickLen || y1 <= p.y + tickLen)) {
        if (x >= p.x - eps && x <= right(p) + eps) return { sub: 'guide/tick', along: 'x', at: x };
      }
      if (l.length >= 0.6 * p.height && x >= p.x - eps && x <= right(p) + eps && y0 <= p.y + 0.2 * p.height) {
        if (Math.abs(x - p.x) <= eps) return { sub: 'guide/axis', at: x, edge: 'left' };
        if (Math.abs(x - right(p)) <= eps) return { sub: 'guide/axis', at: x, edge: 'right' };
        return { sub: 'guide/grid', at: x };
      }
    }
    return null;
  }
  // A path of several straight rules (grids and tick sets drawn as one path).
  if (s.polylines.length >= 2 && s.stroke.kind !== 'none' && s.fill.kind === 'none') {
    let h = 0;
    let v = 0;
    for (const poly of s.polylines) {
      if (poly.length !== 4) return null;
      const dx = Math.abs(poly[2]! - poly[0]!);
      const dy = Math.abs(poly[3]! - poly[1]!);
      if (dy <= 0.02 * dx) h++;
      else if (dx <= 0.02 * dy) v++;
      else return null;
    }
    const spanX = s.bbox.width >= 0.6 * p.width;
    const spanY = s.bbox.height >= 0.6 * p.height;
    if (h > 0 && v === 0 && spanX) return { sub: 'guide/grid', at: centerY(s.bbox) };
    if (v > 0 && h === 0 && spanY) return { sub: 'guide/grid', at: centerX(s.bbox) };
    if (h > 0 && v > 0 && spanX && spanY) return { sub: 'guide/grid', at: centerX(s.bbox) };
    return { sub: 'guide/tick', at: centerX(s.bbox) };
  }
  // A stroked rectangle matching the plot area is its frame.
  if (s.rect && s.fill.kind === 'none' && Math.abs(s.rect.x - p.x) <= eps && Math.abs(right(s.rect) - right(p)) <= eps && Math.abs(s.rect.y - p.y) <= eps && Math.abs(bottom(s.rect) - bottom(p)) <= eps) {
    return { sub: 'guide/frame', at: 0 };
  }
  // A filled rectangle exactly covering the plot area, drawn under the data, is a background.
  if (s.rect && s.fill.kind !== 'none' && area(s.rect) >= 0.97 * area(p) && area(s.rect) <= 1.03 * area(p)) {
    return { sub: 'guide/background', at: 0 };
  }
  return null;
}

function markRole(s: ShapeItem, p: Box | null): SubRole | null {
  const size = p ? Math.min(p.width, p.height) : 100;
  if (s.rect && s.fill.kind !== 'none') {
    if (s.rect.width < 0.5 && s.rect.height < 0.5) return null;
    // Small squares are markers, not bars.
    const w = s.rect.width;
    const h = s.rect.height;
    if (Math.max(w, h) <= 0.025 * size && Math.abs(w - h) <= 0.1 * Math.max(w, h)) return 'mark/point';
    return 'mark/bar';
  }
  const small = Math.max(s.bbox.width, s.bbox.height) <= 0.06 * size;
  const closedAll = s.closed.every(Boolean);
  if (s.circle || (small && closedAll && s.polylines.length === 1)) return 'mark/point';
  if (small && s.polylines.length === 1 && (s.polylines[0]!.length <= 8)) return 'mark/point'; // crosses, plus signs
  const open = s.closed.some((c) => !c);
  const vertices = s.polylines.reduce((n, p2) => n + p2.length / 2, 0);
  if (open && s.stroke.kind !== 'none' && vertices >= 3) return 'mark/line';
  if (closedAll && s.fill.kind !== 'none' && vertices >= 4) return p && s.bbox.width >= 0.25 * p.width ? 'mark/area' : 'mark/other';
  if (open && s.stroke.kind !== 'none' && vertices === 2) {
    const l = straightLineOf(s);
    if (l && l.orientation === 'oblique') return 'mark/line';
    return null;
  }
  return 'mark/other';
}

function isShadow(s: ShapeItem, pool: ShapeItem[]): boolean {
  return pool.some(
    (o) =>
      o !== s &&
      o.index > s.index &&
      !o.filter &&
      Math.abs(o.bbox.width - s.bbox.width) <= 0.05 * Math.max(o.bbox.width, 1) &&
      Math.abs(o.bbox.height - s.bbox.height) <= 0.05 * Math.max(o.bbox.height, 1) &&
      Math.abs(o.bbox.x - s.bbox.x) <= 0.1 * Math.max(o.bbox.width, 1) &&
      Math.abs(o.bbox.y - s.bbox.y) <= 0.1 * Math.max(o.bbox.height, 1),
  );
}

function isHeatmap(all: ShapeItem[]): boolean {
  // The cells of a heatmap share one size; take the largest same-size group.
  const bySize = new Map<string, ShapeItem[]>();
  for (const r of all) {
    const k = `${Math.round(r.rect!.width)}x${Math.round(r.rect!.height)}`;
    bySize.set(k, [...(bySize.get(k) ?? []), r]);
  }
  const rects = [...bySize.values()].sort((a, b) => b.length - a.length)[0] ?? [];
  if (rects.length < 12 || rects.length < 0.8 * all.length) return false;
  const colors = new Map<string, number>();
  for (const r of rects) {
    const k = r.fill.color ? formatHex(r.fill.color) : 'none';
    colors.set(k, (colors.get(k) ?? 0) + 1);
  }
  if (colors.size < 5) return false;
  const maxShare = Math.max(...colors.values()) / rects.length;
  if (maxShare > 0.5) return false;
  const xs = new Set(rects.map((r) => Math.round(r.rect!.x * 2)));
  const ys = new Set(rects.map((r) => Math.round(r.rect!.y * 2)));
  if (xs.size < 2 || ys.size < 2) return false;
  return rects.length >= 0.6 * xs.size * ys.size;
}

function findMultiplier(texts: TextItem[], g: LabelGroup | null, p: Box | null): TextItem | null {
  if (!g || !p) return null;
  for (const t of texts) {
    if (g.texts.includes(t)) continue;
    if (!/^\s*(?:[×x]\s*10|1e[+\-−]?\d|[+\-−]\s*\d.*e[+\-−]?\d)/i.test(t.content)) continue;
    if (g.direction === 'vertical' && t.bbox.y + t.bbox.height <= p.y + 2 && Math.abs(t.bbox.x - g.across) < 6 * t.fontSize) return t;
    if (g.direction === 'horizontal' && t.bbox.x >= right(p) - 6 * t.fontSize && Math.abs(t.y - g.across) < 3 * t.fontSize) return t;
  }
  return null;
}

/** Titles, axis titles and data labels among the remaining texts. */
function assignTextRoles(texts: TextItem[], roles: ItemRole[], p: Box | null, scene: Scene, axes: Chart['axes'], isPie: boolean): void {
  const rest = texts.filter((t) => roles[t.index]!.sub === 'label/other');
  if (rest.length === 0) return;
  const maxSize = Math.max(...texts.map((t) => t.fontSize));
  // The chart title: the largest text in the top band of the figure, or the topmost text above the plot.
  const top = [...rest].sort((a, b) => a.bbox.y - b.bbox.y)[0]!;
  const titleCand = rest.filter((t) => Math.abs(t.rotation) < 1 && t.fontSize >= maxSize - 0.01 && (!p || bottom(t.bbox) <= p.y + 2));
  const title = titleCand[0] ?? (top && (!p || bottom(top.bbox) <= p.y + 2) && Math.abs(top.rotation) < 1 ? top : null);
  if (title) roles[title.index] = { role: 'label', sub: 'label/title' };
  for (const t of rest) {
    if (t === title) continue;
    if (p && !isPie) {
      const cx = centerX(t.bbox);
      const cy = centerY(t.bbox);
      const inside = containsPoint(p, cx, cy);
      if (inside) {
        roles[t.index] = { role: 'label', sub: 'label/data' };
        continue;
      }
      const rotated = Math.abs(Math.abs(t.rotation) - 90) < 5;
      const belowX = cy > bottom(p) && cx >= p.x - 5 && cx <= right(p) + 5;
      const leftY = cx < p.x && cy >= p.y - 5 && cy <= bottom(p) + 5;
      const rightY = cx > right(p) && cy >= p.y - 5 && cy <= bottom(p) + 5;
      if ((belowX && !rotated && axes.x) || ((leftY || rightY) && (rotated || axes.y))) {
        roles[t.index] = { role: 'label', sub: 'label/axis-title' };
        continue;
      }
    } else if (isPie) {
      roles[t.index] = { role: 'label', sub: 'label/data' };
    }
  }
  void scene;
}

function titleText(texts: TextItem[], roles: ItemRole[]): string | null {
  const t = texts.find((x) => roles[x.index]!.sub === 'label/title');
  return t ? t.content : null;
}

export type { SceneItem, Series };
