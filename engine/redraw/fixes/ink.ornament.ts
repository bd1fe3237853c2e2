/**
 * ink.ornament: gradient paint on marks, legend keys and plot backgrounds is
 * replaced by its flat CIELAB-mean colour (the colour the reader already
 * averages); filters (drop shadows, glows, bevels) are taken off data marks;
 * shadow copies of shapes are removed. Patterns are kept: they may tell
 * categories apart. Colour bars keep their gradients: there the gradient is
 * the data key.
 */
import { formatHex } from '../../color/format-hex.js';
import type { SubRole } from '../../classify/chart.js';
import { clearDeclaration, emptyOutcome, removeItem, setItemProperty, type Fix } from '../fix-context.js';

const FLATTEN: ReadonlySet<SubRole> = new Set<SubRole>([
  'mark/bar',
  'mark/line',
  'mark/area',
  'mark/point',
  'mark/wedge',
  'mark/other',
  'legend/swatch',
  'legend/box',
  'guide/background',
  'decoration/page',
  'decoration/other',
]);

export const fixOrnament: Fix = (ctx) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const sub = (i: number): SubRole | undefined => chart.roles[i]?.sub;
  const skipped: string[] = [];

  // Gradients → flat colours.
  const graded = scene.items.filter(
    (it, i) => it.kind === 'shape' && FLATTEN.has(sub(i)!) && (it.fill.kind === 'gradient' || it.stroke.kind === 'gradient'),
  );
  const gradedSet = new Set(graded.map((g) => g.index));
  for (const it of graded) {
    if (it.kind !== 'shape') continue;
    let changed = false;
    for (const prop of ['fill', 'stroke'] as const) {
      const paint = it[prop];
      if (paint.kind !== 'gradient' || !paint.color) continue;
      const edits = setItemProperty(ctx, it.index, prop, formatHex(paint.color), gradedSet);
      if (!edits) {
        skipped.push(`gradient ${prop} at line ${it.source.line}`);
        continue;
      }
      out.edits.push(...edits);
      changed = true;
    }
    if (changed) {
      out.count++;
      out.inkHeld.push(it.index);
    }
  }

  // Filters on data marks and legend keys.
  const filtered = scene.items.filter((it, i) => it.filter !== null && (chart.roles[i]?.role === 'mark' || chart.roles[i]?.role === 'legend'));
  const filterAllowed = new Set<number>();
  scene.items.forEach((_, i) => {
    const r = chart.roles[i]?.role;
    if (r === 'mark' || r === 'legend' || r === 'decoration') filterAllowed.add(i);
  });
  for (const it of filtered) {
    const edits = clearDeclaration(ctx, it.index, 'filter', 'none', filterAllowed);
    if (edits === null) {
      skipped.push(`filter at line ${it.source.line} (its group also holds labels or guides)`);
      continue;
    }
    if (edits.length === 0) continue;
    out.edits.push(...edits);
    out.count++;
  }

  // Shadow copies.
  const shadows = scene.items.filter((_, i) => sub(i) === 'decoration/shadow').map((it) => it.index);
  const shadowSet = new Set(shadows);
  for (const i of shadows) {
    const e = removeItem(ctx, i, shadowSet);
    const edits = e ? [e] : setItemProperty(ctx, i, 'display', 'none', shadowSet);
    if (!edits) {
      skipped.push(`shadow at line ${scene.items[i]!.source.line}`);
      continue;
    }
    out.edits.push(...edits);
    out.count++;
  }
  if (skipped.length > 0) out.notes.push(`left as is (shared with other elements): ${skipped.slice(0, 5).join('; ')}${skipped.length > 5 ? ` and ${skipped.length - 5} more` : ''}`);
  return out;
};
