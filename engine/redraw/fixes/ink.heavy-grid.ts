/**
 * ink.heavy-grid: gridlines turn a receding grey (a fixed L* step from what
 * is behind them) and no heavier than 1 CSS px at the figure's size, nor than
 * half the thinnest data line. Gridlines already that quiet are left alone.
 */
import type { Rgba } from '../../color/types.js';
import { svgNumber, emptyOutcome, itemScale, setItemProperty, type Fix } from '../fix-context.js';
import { recedingGrey, recedingGreyHex, shownStrength } from '../guide-color.js';
import { backgroundAfter, backgroundTargets } from './ink.background-fill.js';

/** Widest a gridline is drawn, in CSS px at the figure's display size (plumbline's choice). */
export const GRID_MAX_PX = 1;

export const fixHeavyGrid: Fix = (ctx) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const removingBackground = ctx.applying.has('ink.background-fill') && backgroundTargets(ctx).length > 0;
  const behind: Rgba = removingBackground ? backgroundAfter(ctx) : chart.background;
  const grey = recedingGrey(behind);
  const greyHex = recedingGreyHex(behind);
  const quiet = shownStrength(grey, 1, behind);
  // Thinnest data line, world units.
  let thinnest = Infinity;
  scene.items.forEach((it, i) => {
    if (it.kind === 'shape' && chart.roles[i]?.sub === 'mark/line' && it.strokeWidth > 0) thinnest = Math.min(thinnest, it.strokeWidth);
  });
  const maxWidth = Math.min(GRID_MAX_PX / scene.pxPerUnit, Number.isFinite(thinnest) ? thinnest / 2 : Infinity);
  const grid = scene.items.filter((it, i) => it.kind === 'shape' && chart.roles[i]?.sub === 'guide/grid');
  const allowed = new Set(grid.map((g) => g.index));
  let skipped = 0;
  for (const g of grid) {
    if (g.kind !== 'shape') continue;
    const stroked = g.stroke.kind !== 'none' && g.strokeWidth > 0;
    const paint = stroked ? g.stroke : g.fill;
    const prop = stroked ? 'stroke' : 'fill';
    let changed = false;
    if (shownStrength(paint.color, paint.opacity, behind) > quiet + 1e-9 || removingBackground) {
      const edits = setItemProperty(ctx, g.index, prop, greyHex, allowed);
      if (edits) {
        out.edits.push(...edits);
        changed = true;
      } else skipped++;
    }
    if (stroked && g.strokeWidth > maxWidth * (1 + 1e-6)) {
      const local = maxWidth / (itemScale(g) || 1);
      const edits = setItemProperty(ctx, g.index, 'stroke-width', svgNumber(local, 3), allowed);
      if (edits) {
        out.edits.push(...edits);
        changed = true;
      } else skipped++;
    }
    if (changed) out.count++;
  }
  if (skipped > 0) out.notes.push(`${skipped} gridline change(s) skipped: their style is shared with other elements`);
  return out;
};
