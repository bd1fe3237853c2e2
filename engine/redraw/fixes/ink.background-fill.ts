/**
 * ink.background-fill: the plot background goes (or loses its fill when it
 * also draws the frame); a page named by the finding turns white. Gridlines
 * that were drawn in the background's colour family (white on grey) would
 * vanish on the page, so they turn a receding grey unless the heavy-grid fix
 * recolours them anyway.
 */
import type { Rgba } from '../../color/types.js';
import type { Edit } from '../edit-list.js';
import { emptyOutcome, itemsOfFinding, removeItem, setItemProperty, type Fix, type FixContext } from '../fix-context.js';
import { recedingGreyHex, shownStrength } from '../guide-color.js';

const WHITE: Rgba = { r: 1, g: 1, b: 1, alpha: 1 };
/** Gridlines weaker than this against the new background are recoloured (plumbline's choice). */
const VANISHING_STRENGTH = 0.04;

/** Items of the plot background this fix removes or empties. */
export function backgroundTargets(ctx: FixContext): number[] {
  const { chart, scene } = ctx.analysis;
  const out: number[] = [];
  scene.items.forEach((it, i) => {
    if (chart.roles[i]?.sub === 'guide/background' && it.kind === 'shape' && it.fill.kind !== 'none') out.push(i);
  });
  return out;
}

/** The colour behind the data once this fix has run. */
export function backgroundAfter(ctx: FixContext): Rgba {
  return ctx.analysis.chart.page ?? WHITE;
}

export const fixBackgroundFill: Fix = (ctx, finding) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const targets = backgroundTargets(ctx);
  const flagged = new Set(itemsOfFinding(ctx, finding));
  const pages = [...flagged].filter((i) => chart.roles[i]?.sub === 'decoration/page');
  const allowed = new Set([...targets, ...pages]);
  for (const i of targets) {
    const it = scene.items[i]!;
    if (it.kind !== 'shape') continue;
    const stroked = it.stroke.kind !== 'none' && it.strokeWidth > 0;
    let edits: Edit[] | null = null;
    if (!stroked) {
      const rm = removeItem(ctx, i, allowed);
      edits = rm ? [rm] : null;
    }
    edits ??= setItemProperty(ctx, i, 'fill', 'none', allowed);
    if (!edits) {
      out.notes.push(`background at line ${it.source.line} shares its fill with other elements; left as is`);
      continue;
    }
    out.edits.push(...edits);
    out.count++;
  }
  let pageWhite = false;
  for (const i of pages) {
    const it = scene.items[i]!;
    if (it.kind !== 'shape' || it.fill.kind === 'none') continue;
    if (shownStrength(it.fill.color, it.fill.opacity, WHITE) === 0) continue;
    const edits = setItemProperty(ctx, i, 'fill', '#ffffff', allowed);
    if (!edits) {
      out.notes.push(`page at line ${it.source.line} shares its fill with other elements; left as is`);
      continue;
    }
    out.edits.push(...edits);
    out.count++;
    pageWhite = true;
  }
  if (out.count === 0) return out;
  // Gridlines that would vanish against what is now behind them.
  if (!ctx.applying.has('ink.heavy-grid')) {
    const behind = pageWhite ? WHITE : backgroundAfter(ctx);
    const grid = scene.items.filter((it, i) => chart.roles[i]?.sub === 'guide/grid' && it.kind === 'shape' && it.stroke.kind !== 'none');
    const gridSet = new Set(grid.map((g) => g.index));
    const grey = recedingGreyHex(behind);
    for (const g of grid) {
      if (g.kind !== 'shape') continue;
      if (shownStrength(g.stroke.color, 1, behind) >= VANISHING_STRENGTH) continue;
      const edits = setItemProperty(ctx, g.index, 'stroke', grey, gridSet);
      if (edits) {
        out.edits.push(...edits);
        out.count++;
      }
    }
  }
  return out;
};
