/**
 * ink.heavy-grid: gridlines that compete with the data. Two measurable ways:
 * - density and weight together: the grid prints at least half as much ink
 *   as the data (`maxInkRatio`);
 * - contrast: the gridlines stand out from the background at least as much
 *   as the data marks do (median WCAG contrast ratios), and at least 3:1, the
 *   level WCAG asks of graphics that must be seen (SC 1.4.11).
 * Only gridlines that cross the plot (at least half its width or height)
 * count, so short tick marks classified as grid do not.
 */
import type { Rgba } from '../../color/types.js';
import { contrastRatio } from '../../color/wcag-contrast.js';
import type { ShapeItem } from '../../read/scene.js';
import { r4, elementsOf, type Rule } from '../rule.js';
import { crossingGridSegments, lineStyle } from './edge-lines.js';

function median(xs: number[]): number {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Contrast of an item's main paint (fill, else stroke) over a background, opacity included. */
function paintContrast(it: ShapeItem, behind: Rgba, preferStroke: boolean): number | null {
  const stroke = it.stroke.kind !== 'none' && it.stroke.color && it.strokeWidth > 0 ? { c: it.stroke.color, a: it.stroke.opacity } : null;
  const fill = it.fill.kind !== 'none' && it.fill.color && it.area > 0 ? { c: it.fill.color, a: it.fill.opacity } : null;
  const p = preferStroke ? (stroke ?? fill) : (fill ?? stroke);
  if (!p || p.a <= 0) return null;
  return contrastRatio({ ...p.c, alpha: Math.min(1, p.a) }, behind);
}

export const heavyGrid: Rule = {
  id: 'ink.heavy-grid',
  family: 'ink',
  severity: 'warning',
  rationale: 'Gridlines as dark or as plentiful as the data pull the eye away from it; a grid should be read when wanted and ignored otherwise.',
  source: 'Tufte 1983, The Visual Display of Quantitative Information, ch. 6 ("the grid should usually be muted or completely suppressed"); WCAG 2.2 SC 1.4.11 for the 3:1 level',
  thresholds: {
    /** Grid ink over data ink from which the grid competes by its amount (common practice, no source: half the data's ink). */
    maxInkRatio: 0.5,
    /** Grid contrast over the data marks' contrast from which the grid competes by its darkness. */
    maxContrastShare: 1,
    /** Least grid contrast ratio for the darkness test (WCAG 2.x non-text contrast level). */
    minGridContrast: 3,
  },
  fix: 'Lighten and thin the gridlines (a light grey hairline) so they sit behind the data.',
  check({ chart, measures, thresholds }) {
    const gridItems = [...new Set(crossingGridSegments(chart).map((s) => s.item))];
    if (gridItems.length === 0) return [];
    const items = chart.scene.items;
    const behind = chart.background;
    let gridInk = 0;
    const gridContrasts: number[] = [];
    const gridWidths: number[] = [];
    for (const i of gridItems) {
      gridInk += measures.ink.byItem[i]!;
      const it = items[i]!;
      if (it.kind !== 'shape') continue;
      const c = paintContrast(it, behind, true);
      if (c !== null) gridContrasts.push(c);
      const st = lineStyle(it);
      if (st) gridWidths.push(st.width);
    }
    const markContrasts: number[] = [];
    const lineWidths: number[] = [];
    chart.roles.forEach((r, i) => {
      if (r.role !== 'mark') return;
      const it = items[i]!;
      if (it.kind !== 'shape') return;
      const c = paintContrast(it, behind, false);
      if (c !== null) markContrasts.push(c);
      if (it.fill.kind === 'none' && it.strokeWidth > 0) lineWidths.push(it.strokeWidth);
    });
    const dataInk = measures.ink.totals.data;
    const inkRatio = dataInk > 0 ? gridInk / dataInk : Infinity;
    const gridC = median(gridContrasts);
    const markC = median(markContrasts);
    const byInk = inkRatio >= thresholds.maxInkRatio;
    const byContrast = Number.isFinite(gridC) && Number.isFinite(markC) && gridC >= thresholds.minGridContrast && gridC >= thresholds.maxContrastShare * markC;
    if (!byInk && !byContrast) return [];
    const px = chart.scene.pxPerUnit;
    const why: string[] = [];
    if (byInk) why.push(`the grid prints ${r4(inkRatio)}× as much ink as the data`);
    if (byContrast) why.push(`its lines contrast ${r4(gridC)}:1 with the background, as much as the data marks (${r4(markC)}:1)`);
    return [
      {
        message: `Gridlines compete with the data: ${why.join('; ')}.`,
        elements: elementsOf(chart, gridItems),
        measures: {
          gridInkRatio: r4(inkRatio),
          gridContrast: r4(gridC),
          markContrast: r4(markC),
          gridWidthPx: r4(median(gridWidths) * px),
          dataLineWidthPx: lineWidths.length ? r4(median(lineWidths) * px) : null,
          gridLines: gridItems.length,
        },
      },
    ];
  },
};
