/**
 * ink.redundant-ticks: tick marks standing where a gridline of the same
 * direction already marks the same value are removed.
 */
import type { Box } from '../../read/scene.js';
import { emptyOutcome, removeItem, type Fix } from '../fix-context.js';

interface Stroke {
  vertical: boolean;
  /** x of a vertical mark, y of a horizontal one. */
  at: number;
}

function strokeOf(b: Box): Stroke {
  const vertical = b.height >= b.width;
  return { vertical, at: vertical ? b.x + b.width / 2 : b.y + b.height / 2 };
}

/** Ticks within this many CSS px of a gridline count as the same position (plumbline's choice). */
export const SAME_POSITION_PX = 0.75;

export const fixRedundantTicks: Fix = (ctx) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const tol = SAME_POSITION_PX / scene.pxPerUnit;
  const grid = { v: [] as number[], h: [] as number[] };
  scene.items.forEach((it, i) => {
    if (chart.roles[i]?.sub !== 'guide/grid' || it.kind !== 'shape') return;
    const s = strokeOf(it.bbox);
    (s.vertical ? grid.v : grid.h).push(s.at);
  });
  const doomed: number[] = [];
  scene.items.forEach((it, i) => {
    if (chart.roles[i]?.sub !== 'guide/tick' || it.kind !== 'shape') return;
    const s = strokeOf(it.bbox);
    const lines = s.vertical ? grid.v : grid.h;
    if (lines.some((g) => Math.abs(g - s.at) <= tol)) doomed.push(i);
  });
  const allowed = new Set(doomed);
  let kept = 0;
  for (const i of doomed) {
    const e = removeItem(ctx, i, allowed);
    if (!e) {
      kept++;
      continue;
    }
    out.edits.push(e);
    out.count++;
  }
  if (kept > 0) out.notes.push(`${kept} duplicated tick(s) kept: their element also draws something else or is referenced`);
  return out;
};
