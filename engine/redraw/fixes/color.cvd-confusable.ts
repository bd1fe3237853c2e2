/**
 * color.cvd-confusable: the categorical palette is repaired (`repairPalette`:
 * every pair kept apart under simulated protan, deutan and tritan vision,
 * hues kept close) and the new colours are applied to every data mark and
 * legend key (and unclassified decoration, where legend sample lines end up)
 * that showed an old colour, fill and stroke alike, so marks and legend stay
 * matched. Translucent paint keeps its opacity; its colour is
 * chosen so that, composited over the background, it shows the repaired colour.
 */
import { compositeOver } from '../../color/composite.js';
import { formatHex } from '../../color/format-hex.js';
import { repairPalette } from '../../color/repair-palette.js';
import type { Rgba } from '../../color/types.js';
import type { Paint } from '../../read/scene.js';
import { emptyOutcome, setItemProperty, type Fix } from '../fix-context.js';

const rgbHex = (c: Rgba): string => formatHex({ ...c, alpha: 1 });

/** The colour to paint at `opacity` over `bg` so that it shows `seen` (clamped to sRGB). */
export function unComposite(seen: Rgba, opacity: number, bg: Rgba): Rgba {
  if (opacity >= 1) return { ...seen, alpha: 1 };
  const a = Math.max(opacity, 1e-6);
  const ch = (s: number, b: number): number => Math.min(1, Math.max(0, (s - (1 - a) * b) / a));
  return { r: ch(seen.r, bg.r), g: ch(seen.g, bg.g), b: ch(seen.b, bg.b), alpha: 1 };
}

export const fixCvdConfusable: Fix = (ctx) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const pal = ctx.measures.palette;
  if (pal.continuous || pal.entries.length < 2) {
    out.notes.push('no categorical palette to repair');
    return out;
  }
  const bg = pal.background;
  let repaired: Rgba[];
  try {
    repaired = repairPalette(pal.entries.map((e) => e.color), bg);
  } catch (err) {
    out.notes.push(`palette not repaired: ${(err as Error).message}`);
    return out;
  }
  const byHex = new Map<string, Rgba>();
  pal.entries.forEach((e, k) => {
    if (rgbHex(repaired[k]!) !== e.hex) byHex.set(e.hex, repaired[k]!);
  });
  if (byHex.size === 0) return out;

  // Which paint of which item gets which colour.
  const plan: { item: number; prop: 'fill' | 'stroke'; value: string }[] = [];
  const newFor = (p: Paint): string | null => {
    if (p.kind !== 'color' || !p.color) return null;
    const literal = byHex.get(rgbHex(p.color));
    if (literal && p.opacity >= 1) return rgbHex(literal);
    const seenHex = rgbHex(p.opacity < 1 ? compositeOver({ ...p.color, alpha: p.opacity }, bg) : p.color);
    const seen = byHex.get(seenHex);
    if (seen) return rgbHex(unComposite(seen, p.opacity, bg));
    if (literal) return rgbHex(literal);
    return null;
  };
  // Every item painted in an old colour may share a declaration with the marks (a legend's
  // marker drawn from the marks' definition): editing that declaration recolours them alike.
  const groups = new Map<string, Set<number>>();
  scene.items.forEach((it, i) => {
    if (it.kind !== 'shape') return;
    const role = chart.roles[i];
    // Legend keys are sometimes read as unclassified decoration (a sample line beside a legend label).
    const target = role !== undefined && (role.role === 'mark' || role.role === 'legend' || role.sub === 'decoration/other');
    for (const prop of ['fill', 'stroke'] as const) {
      const v = newFor(it[prop]);
      if (!v) continue;
      const k = `${prop}\u0000${v}`;
      const g = groups.get(k);
      if (g) g.add(i);
      else groups.set(k, new Set([i]));
      if (target) plan.push({ item: i, prop, value: v });
    }
  });
  const changed = new Set<number>();
  let skipped = 0;
  for (const p of plan) {
    const edits = setItemProperty(ctx, p.item, p.prop, p.value, groups.get(`${p.prop}\u0000${p.value}`)!);
    if (!edits) {
      skipped++;
      continue;
    }
    out.edits.push(...edits);
    changed.add(p.item);
  }
  out.count = changed.size;
  // Items sharing an edited declaration change with the marks: hold them all.
  for (const g of groups.values()) out.inkHeld.push(...g);
  if (skipped > 0) out.notes.push(`${skipped} paint(s) not recoloured: their declaration is shared with elements of other colours`);
  const pairs = pal.entries.filter((e) => byHex.has(e.hex)).map((e) => `${e.hex} → ${rgbHex(byHex.get(e.hex)!)}`);
  out.notes.push(`palette: ${pairs.join(', ')}`);
  out.notes.push('automated colour checks do not replace review by people with colour-vision deficiencies');
  return out;
};
