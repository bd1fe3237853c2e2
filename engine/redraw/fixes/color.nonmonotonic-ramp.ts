/**
 * color.nonmonotonic-ramp: the quantity ramp is rebuilt with `rebuildRamp`
 * (a straight line in CIELAB between the ramp's own end colours, lightness
 * changing evenly), and every cell and every part of the key moves to the new
 * ramp at the place its colour had on the old one. Vector keys, gradient keys
 * and embedded PNG keys are recoloured; when some part of the key cannot be
 * (an external or non-PNG image), nothing is changed, so cells and key never
 * disagree.
 */
import { formatHex } from '../../color/format-hex.js';
import { rebuildRamp } from '../../color/monotonic-ramp.js';
import { parseColor } from '../../color/parse-color.js';
import type { Rgba } from '../../color/types.js';
import { walkElements } from '../../read/parse-xml.js';
import { setAttribute, type Edit } from '../edit-list.js';
import { emptyOutcome, setItemProperty, useOf, type Fix } from '../fix-context.js';
import { rampMap, recolorPngDataUri } from '../ramp-map.js';
import { setStyleProperty } from '../style-edit.js';

/**
 * Least L* span of the rebuilt ramp. Perceptual sequential ramps span most of
 * the lightness scale (viridis runs from about L* 15 to 92, from memory); the
 * default of rebuildRamp (40) leaves ramps with dark ends, like jet's, too
 * dark to read. Plumbline's choice.
 */
export const RAMP_LIGHTNESS_RANGE = 70;

/** Cells farther than this (ΔE*ab) from every colour of the ramp are not on it (missing-value greys); left alone. */
export const OFF_RAMP_DISTANCE = 12;

export const fixNonmonotonicRamp: Fix = (ctx) => {
  const out = emptyOutcome();
  const { chart, scene, doc } = ctx.analysis;
  const ramp = ctx.measures.ramp;
  if (!ramp || ramp.colors.length < 2) {
    out.notes.push('no ramp found to rebuild');
    return out;
  }
  const rebuilt = rebuildRamp(ramp.colors, { minLightnessRange: RAMP_LIGHTNESS_RANGE });
  const rm = rampMap(ramp.colors, rebuilt);
  const hex = (c: Rgba): string => formatHex({ ...c, alpha: 1 });

  const edits: Edit[] = [];
  const plan: { item: number; value: string }[] = [];
  let offRamp = 0;
  const keyItems = new Set(ramp.items);
  const targets = new Set<number>(keyItems);
  scene.items.forEach((_, i) => {
    if (chart.roles[i]?.sub === 'mark/cell') targets.add(i);
  });

  for (const i of [...targets].sort((a, b) => a - b)) {
    const it = scene.items[i]!;
    const isKey = keyItems.has(i);
    if (it.kind === 'image') {
      const el = useOf(ctx, i) ? null : it.element;
      const attr = el ? (el.attribute('href') !== undefined ? 'href' : 'xlink:href') : null;
      const uri = el && attr ? el.attribute(attr) : undefined;
      const next = uri ? recolorPngDataUri(uri, rm.map) : null;
      if (!el || !attr || !next) {
        out.notes.push(`an image ${isKey ? 'in the key' : 'of cells'} at line ${it.source.line} is not an embedded PNG; ramp left as is`);
        return emptyWithNotes(out);
      }
      edits.push(setAttribute(doc, el, attr, next));
      out.count++;
      out.inkHeld.push(i);
      continue;
    }
    if (it.kind !== 'shape') continue;
    const paint = it.fill.kind !== 'none' ? it.fill : it.stroke;
    const prop = it.fill.kind !== 'none' ? 'fill' : 'stroke';
    if (paint.kind === 'gradient' && paint.ref) {
      // A gradient key: recolour its stops.
      const grad = ctx.byId.get(paint.ref);
      const stops = grad ? [...walkElements(grad)].filter((s) => s.name === 'stop') : [];
      if (stops.length === 0) {
        out.notes.push(`gradient ${paint.ref} has no stops of its own; ramp left as is`);
        return emptyWithNotes(out);
      }
      for (const s of stops) {
        const decl = ctx.cascade.declared(s)['stop-color'];
        const c = decl ? parseColor(decl.text) : parseColor('black');
        if (!c) continue;
        edits.push(...setStyleProperty(doc, ctx.cascade, s, 'stop-color', hex(rm.map(c))));
      }
      out.count++;
      out.inkHeld.push(i);
      continue;
    }
    if (paint.kind !== 'color' || !paint.color) continue;
    const placed = rm.place(paint.color);
    if (!isKey && placed.distance > OFF_RAMP_DISTANCE) {
      offRamp++;
      continue;
    }
    const next = hex(rebuilt(placed.t));
    if (next !== hex(paint.color)) plan.push({ item: i, value: `${prop}\u0000${next}` });
  }
  const groups = new Map<string, Set<number>>();
  for (const p of plan) {
    const g = groups.get(p.value);
    if (g) g.add(p.item);
    else groups.set(p.value, new Set([p.item]));
  }
  let skipped = 0;
  for (const p of plan) {
    const [prop, value] = p.value.split('\u0000') as ['fill' | 'stroke', string];
    const e = setItemProperty(ctx, p.item, prop, value, groups.get(p.value)!);
    if (!e) {
      skipped++;
      continue;
    }
    edits.push(...e);
    out.count++;
    out.inkHeld.push(p.item);
  }
  if (skipped > 0) {
    out.notes.push(`${skipped} cell(s) share their colour declaration with others of different value; ramp left as is`);
    return emptyWithNotes(out);
  }
  if (offRamp > 0) out.notes.push(`${offRamp} cell(s) far from every ramp colour (missing values?) left as drawn`);
  out.edits = edits;
  out.notes.push(`ramp rebuilt from ${hex(ramp.colors[0]!)} to ${hex(ramp.colors[ramp.colors.length - 1]!)} with lightness changing evenly`);
  return out;
};

function emptyWithNotes(o: ReturnType<typeof emptyOutcome>): ReturnType<typeof emptyOutcome> {
  return { ...emptyOutcome(), notes: o.notes };
}
