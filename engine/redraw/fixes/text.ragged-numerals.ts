/**
 * text.ragged-numerals: the numeric tick labels of a vertical axis are set
 * flush right on the column's right edge (`text-anchor: end`, x moved to
 * that edge) and asked for tabular figures (`font-variant-numeric:
 * tabular-nums`), so units line up under units. Rotated labels, labels drawn
 * as glyph outlines, and labels whose children position their own glyphs are
 * left as they are.
 */
import { applyToPoint, invert } from '../../read/geometry/matrix.js';
import { walkElements } from '../../read/parse-xml.js';
import type { TextItem } from '../../read/scene.js';
import { setAttribute, type Edit } from '../edit-list.js';
import { emptyOutcome, setItemProperty, svgNumber, type Fix, type FixContext } from '../fix-context.js';

function rightEdge(it: TextItem): number {
  return it.anchor === 'end' ? it.x : it.anchor === 'middle' ? it.x + it.width / 2 : it.x + it.width;
}

/** Whether the label's own element sets its x plainly (one number or none) and no child repositions glyphs. */
function movable(ctx: FixContext, it: TextItem): boolean {
  if (it.fromGlyphs || Math.abs(it.rotation) > 1e-6 || it.element.name !== 'text') return false;
  const x = it.element.attribute('x');
  if (x !== undefined && !/^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?(px)?\s*$/.test(x)) return false;
  for (const e of walkElements(it.element)) {
    if (e === it.element) continue;
    if (e.attribute('x') !== undefined || e.attribute('dx') !== undefined || e.attribute('text-anchor') !== undefined) return false;
    const d = ctx.cascade.declared(e);
    if (d['text-anchor']?.origin === 'inline' || d['text-anchor']?.origin === 'sheet') return false;
  }
  return true;
}

export const fixRaggedNumerals: Fix = (ctx) => {
  const out = emptyOutcome();
  const { scene, doc } = ctx.analysis;
  let skipped = 0;
  for (const col of ctx.measures.text.columns) {
    const aligned = col.alignment === 'right' || col.alignment === 'decimal';
    if (aligned && col.tabular) continue;
    const labels = col.items.map((i) => scene.items[i]).filter((it): it is TextItem => it?.kind === 'text');
    const allowed = new Set(labels.map((l) => l.index));
    const right = Math.max(...labels.map(rightEdge));
    for (const it of labels) {
      if (!movable(ctx, it)) {
        skipped++;
        continue;
      }
      const edits: Edit[] = [];
      if (!aligned) {
        const inv = invert(it.matrix);
        if (!inv) {
          skipped++;
          continue;
        }
        const local = applyToPoint(inv, { x: right, y: it.y });
        const dxAttr = it.element.attribute('dx');
        const dx = dxAttr !== undefined && /^\s*[-+]?(\d+\.?\d*|\.\d+)\s*$/.test(dxAttr) ? Number(dxAttr) : 0;
        if (dxAttr !== undefined && dx === 0 && dxAttr.trim() !== '0') {
          skipped++;
          continue;
        }
        edits.push(setAttribute(doc, it.element, 'x', svgNumber(local.x - dx, 3)));
        const anchor = it.anchor === 'end' ? [] : setItemProperty(ctx, it.index, 'text-anchor', 'end', allowed);
        if (anchor === null) {
          skipped++;
          continue;
        }
        edits.push(...anchor);
      }
      if (!it.tabularNums) {
        const tab = setItemProperty(ctx, it.index, 'font-variant-numeric', 'tabular-nums', allowed);
        if (tab === null) {
          skipped++;
          continue;
        }
        edits.push(...tab);
      }
      if (edits.length === 0) continue;
      out.edits.push(...edits);
      out.count++;
      out.inkHeld.push(it.index);
    }
  }
  if (skipped > 0) out.notes.push(`${skipped} label(s) left as drawn (rotated, glyph outlines, positioned children or shared style)`);
  return out;
};
