/**
 * text.mixed-precision: the numeric tick labels of an axis are written with
 * one precision, the most decimals any of them has ("4", "4.1" → "4.0",
 * "4.1"). Only zeros are added, so every label keeps its value exactly.
 * Labels drawn as glyph outlines, or split over several text nodes, are left.
 */
import { numberParts } from '../../measure/text.js';
import { emptyOutcome, type Fix } from '../fix-context.js';
import { soleTextNode } from './text-node.js';

export const fixMixedPrecision: Fix = (ctx) => {
  const out = emptyOutcome();
  const { scene, doc } = ctx.analysis;
  let skipped = 0;
  for (const axis of ctx.measures.text.precision) {
    if (axis.precisions.length < 2) continue;
    const want = Math.max(...axis.precisions);
    const comma = axis.labels.some((l) => /\d,\d{1,2}(?!\d)/.test(l)) && !axis.labels.some((l) => /\d\.\d/.test(l));
    const mark = comma ? ',' : '.';
    axis.items.forEach((i, k) => {
      const have = axis.decimals[k]!;
      if (have >= want) return;
      const it = scene.items[i];
      if (!it || it.kind !== 'text' || it.fromGlyphs) {
        skipped++;
        return;
      }
      const node = soleTextNode(doc, it.element);
      if (!node) {
        skipped++;
        return;
      }
      const raw = node.value;
      const parts = numberParts(raw, comma);
      if (!parts) {
        skipped++;
        return;
      }
      // End of the number: after the decimals, or after the last digit of the integer part.
      const lead = raw.length - raw.trimStart().length;
      // numberParts reads the trimmed label: its indices are into that string.
      const at = lead + parts.decimalIndex + (parts.decimals > 0 ? 1 + parts.decimals : 0);
      const zeros = '0'.repeat(want - have);
      const text = parts.decimals > 0 ? zeros : mark + zeros;
      out.edits.push({ start: node.span.start + at, end: node.span.start + at, text });
      out.count++;
      out.inkHeld.push(i);
    });
  }
  if (skipped > 0) out.notes.push(`${skipped} label(s) not rewritten (glyph outlines, split text or not a plain number)`);
  return out;
};

