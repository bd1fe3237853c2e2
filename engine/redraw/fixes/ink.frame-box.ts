/**
 * ink.frame-box: the closed box around the plot opens to the sides that carry
 * a scale (where the axes' tick labels are; left and bottom when none are
 * found). Frame and axis lines lying on the other sides are removed; a shape
 * that draws several sides at once (a stroked rectangle, a closed path) loses
 * its stroke and new straight lines draw only the kept sides, in the same
 * coordinates, colour and width.
 */
import type { Axis } from '../../classify/chart.js';
import { formatHex } from '../../color/format-hex.js';
import { applyToPoint, invert } from '../../read/geometry/matrix.js';
import type { Box, ShapeItem } from '../../read/scene.js';
import { escapeAttribute, insertAfter, lineIndentation, namePrefix, quoteOf, type Edit } from '../edit-list.js';
import { emptyOutcome, itemScale, itemsOfFinding, removeItem, setItemProperty, svgNumber, useOf, type Fix, type FixContext } from '../fix-context.js';

export type Side = 'left' | 'right' | 'top' | 'bottom';

/** Segments closer than this to a side of the box (CSS px, and at least 0.5% of the box) lie on it (plumbline's choice). */
const ON_SIDE_PX = 1.5;

function labelSide(ctx: FixContext, axis: Axis | null, box: Box): Side | null {
  if (!axis) return null;
  const items = ctx.analysis.scene.items;
  const labels = axis.ticks.map((t) => (t.label === null ? null : items[t.label])).filter((t) => t != null);
  if (labels.length === 0) return null;
  if (axis.direction === 'horizontal') {
    const y = labels.reduce((s, t) => s + t.bbox.y + t.bbox.height / 2, 0) / labels.length;
    return y >= box.y + box.height / 2 ? 'bottom' : 'top';
  }
  const x = labels.reduce((s, t) => s + t.bbox.x + t.bbox.width / 2, 0) / labels.length;
  return x <= box.x + box.width / 2 ? 'left' : 'right';
}

/** The sides that carry scales. */
export function scaleSides(ctx: FixContext, box: Box): Set<Side> {
  const { axes } = ctx.analysis.chart;
  const sides = new Set<Side>();
  const x = labelSide(ctx, axes.x, box);
  const y = labelSide(ctx, axes.y, box);
  const y2 = labelSide(ctx, axes.y2, box);
  sides.add(x ?? 'bottom');
  sides.add(y ?? (y2 === 'left' ? 'right' : 'left'));
  if (y2) sides.add(y2);
  return sides;
}

interface Seg {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  side: Side | null;
}

function segmentsOf(it: ShapeItem, box: Box, tol: number): Seg[][] {
  const out: Seg[][] = [];
  it.polylines.forEach((p, k) => {
    const segs: Seg[] = [];
    const n = p.length / 2;
    const closed = it.closed[k] ?? false;
    const count = closed ? n : n - 1;
    for (let i = 0; i < count; i++) {
      const j = (i + 1) % n;
      const x0 = p[2 * i]!;
      const y0 = p[2 * i + 1]!;
      const x1 = p[2 * j]!;
      const y1 = p[2 * j + 1]!;
      if (Math.hypot(x1 - x0, y1 - y0) <= 1e-9) continue;
      segs.push({ x0, y0, x1, y1, side: sideOf(x0, y0, x1, y1, box, tol) });
    }
    out.push(segs);
  });
  return out;
}

function sideOf(x0: number, y0: number, x1: number, y1: number, b: Box, tol: number): Side | null {
  const horizontal = Math.abs(y1 - y0) <= tol;
  const vertical = Math.abs(x1 - x0) <= tol;
  const within = (v: number, lo: number, hi: number): boolean => v >= lo - tol && v <= hi + tol;
  if (horizontal && within(x0, b.x, b.x + b.width) && within(x1, b.x, b.x + b.width)) {
    if (Math.abs(y0 - b.y) <= tol) return 'top';
    if (Math.abs(y0 - (b.y + b.height)) <= tol) return 'bottom';
  }
  if (vertical && within(y0, b.y, b.y + b.height) && within(y1, b.y, b.y + b.height)) {
    if (Math.abs(x0 - b.x) <= tol) return 'left';
    if (Math.abs(x0 - (b.x + b.width)) <= tol) return 'right';
  }
  return null;
}

/**
 * Path data for the kept sides, one straight line each (consecutive pieces of
 * one side joined): a lone straight line along a plot edge reads as an axis
 * line, where one bent outline could read as a data line.
 */
function sidePathData(runs: Seg[][], toLocal: (x: number, y: number) => { x: number; y: number }): string[] {
  const out: string[] = [];
  const write = (s: Seg): void => {
    const a = toLocal(s.x0, s.y0);
    const b = toLocal(s.x1, s.y1);
    out.push(`M${svgNumber(a.x)} ${svgNumber(a.y)} L${svgNumber(b.x)} ${svgNumber(b.y)}`);
  };
  for (const run of runs) {
    let cur: Seg | null = null;
    for (const s of run) {
      if (cur !== null && cur.side !== null && cur.side === s.side && Math.hypot(cur.x1 - s.x0, cur.y1 - s.y0) <= 1e-9) {
        cur = { x0: cur.x0, y0: cur.y0, x1: s.x1, y1: s.y1, side: cur.side };
        continue;
      }
      if (cur !== null) write(cur);
      cur = s;
    }
    if (cur !== null) write(cur);
  }
  return out;
}

/** Kept segments of one subpath as runs of neighbours (a closed outline is rotated to start after a dropped side). */
function keptRuns(segs: Seg[], keep: (s: Seg) => boolean, closed: boolean): Seg[][] {
  let order = segs;
  if (closed) {
    const firstDropped = segs.findIndex((s) => !keep(s));
    if (firstDropped > 0) order = [...segs.slice(firstDropped), ...segs.slice(0, firstDropped)];
  }
  const runs: Seg[][] = [];
  let cur: Seg[] = [];
  for (const s of order) {
    if (keep(s)) cur.push(s);
    else if (cur.length > 0) {
      runs.push(cur);
      cur = [];
    }
  }
  if (cur.length > 0) runs.push(cur);
  return runs;
}

/** Whether only spaces and tabs stand between the start of its line and `at`. */
function ownsLine(src: string, at: number): boolean {
  let i = at;
  while (i > 0 && (src[i - 1] === ' ' || src[i - 1] === '\t')) i--;
  return i > 0 && src[i - 1] === '\n';
}

export const fixFrameBox: Fix = (ctx, finding) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const flagged = new Set(itemsOfFinding(ctx, finding));
  const candidates = scene.items.filter((it, i) => {
    const sub = chart.roles[i]?.sub;
    return it.kind === 'shape' && it.stroke.kind !== 'none' && it.strokeWidth > 0 && (sub === 'guide/frame' || sub === 'guide/axis' || flagged.has(i));
  }) as ShapeItem[];
  if (candidates.length === 0) return out;
  let box: Box | null = chart.plotArea;
  if (!box) {
    const frames = candidates.filter((c) => chart.roles[c.index]?.sub === 'guide/frame');
    if (frames.length === 0) return out;
    const xs = frames.flatMap((f) => [f.bbox.x + f.strokeWidth / 2, f.bbox.x + f.bbox.width - f.strokeWidth / 2]);
    const ys = frames.flatMap((f) => [f.bbox.y + f.strokeWidth / 2, f.bbox.y + f.bbox.height - f.strokeWidth / 2]);
    box = { x: Math.min(...xs), y: Math.min(...ys), width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) };
  }
  const tol = Math.max(ON_SIDE_PX / scene.pxPerUnit, 0.005 * Math.max(box.width, box.height));
  const keepSides = scaleSides(ctx, box);
  const keep = (s: Seg): boolean => s.side === null || keepSides.has(s.side);
  const allowed = new Set(candidates.map((c) => c.index));
  const doc = ctx.analysis.doc;
  for (const it of candidates) {
    const subpaths = segmentsOf(it, box, tol);
    const all = subpaths.flat();
    if (all.length === 0 || all.every(keep)) continue;
    // Axis lines drawn apart from the frame: only touch those lying wholly on a side.
    if (chart.roles[it.index]?.sub === 'guide/axis' && all.some((s) => s.side === null)) continue;
    const filled = it.fill.kind !== 'none';
    const anyKept = all.some(keep);
    if (!anyKept && !filled) {
      const e = removeItem(ctx, it.index, allowed) ?? null;
      const edits = e ? [e] : setItemProperty(ctx, it.index, 'stroke', 'none', allowed);
      if (!edits) {
        out.notes.push(`frame side at line ${it.source.line} shares its style with other elements; left as is`);
        continue;
      }
      out.edits.push(...edits);
      out.count++;
      continue;
    }
    // Several sides in one shape: take its stroke off and draw the kept sides anew.
    if (useOf(ctx, it.index)) {
      out.notes.push(`frame at line ${it.source.line} is drawn through <use>; left as is`);
      continue;
    }
    const inv = invert(it.matrix);
    if (!inv || !it.stroke.color) {
      out.notes.push(`frame at line ${it.source.line} has no invertible transform or plain stroke colour; left as is`);
      continue;
    }
    let edits: Edit[] | null = null;
    if (!filled) {
      const e = removeItem(ctx, it.index, allowed);
      edits = e ? [e] : null;
    }
    edits ??= setItemProperty(ctx, it.index, 'stroke', 'none', allowed);
    if (!edits) {
      out.notes.push(`frame at line ${it.source.line} shares its style with other elements; left as is`);
      continue;
    }
    if (anyKept) {
      const runs = subpaths.flatMap((segs, k) => keptRuns(segs, keep, it.closed[k] ?? false));
      const sides = sidePathData(runs, (x, y) => applyToPoint(inv, { x, y }));
      const el = it.element;
      const q = quoteOf(doc, el);
      const width = it.strokeWidth / (itemScale(it) || 1);
      const own = ctx.cascade.declared(el);
      const style = [
        'fill: none',
        `stroke: ${formatHex({ ...it.stroke.color, alpha: 1 })}`,
        `stroke-width: ${svgNumber(width)}`,
        ...(own['stroke-opacity'] ? [`stroke-opacity: ${own['stroke-opacity'].text}`] : []),
        ...(own.opacity ? [`opacity: ${own.opacity.text}`] : []),
        'stroke-linejoin: miter',
        'stroke-linecap: square',
      ].join('; ');
      const shared: string[] = [];
      const t = el.attribute('transform');
      if (t !== undefined) shared.push(`transform=${q}${escapeAttribute(t, q)}${q}`);
      const clip = el.attribute('clip-path');
      if (clip !== undefined) shared.push(`clip-path=${q}${escapeAttribute(clip, q)}${q}`);
      shared.push(`style=${q}${escapeAttribute(style, q)}${q}`);
      const prefix = ownsLine(doc.source, el.start) ? `\n${lineIndentation(doc.source, el.start)}` : '';
      const path = sides.map((d) => `${prefix}<${namePrefix(doc, el)}path d=${q}${escapeAttribute(d, q)}${q} ${shared.join(' ')}/>`).join('');
      const removed = edits.length === 1 && edits[0]!.start <= el.start && edits[0]!.end >= el.end;
      edits.push(removed ? { start: edits[0]!.end, end: edits[0]!.end, text: path } : insertAfter(el, path));
    }
    out.edits.push(...edits);
    out.count++;
  }
  return out;
};
