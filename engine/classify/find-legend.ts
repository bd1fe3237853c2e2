/**
 * Legend entries: a small swatch (rectangle, short line or marker) just
 * before a text, with the text's vertical centre inside the swatch's span.
 */
import type { SceneItem, ShapeItem, TextItem } from '../read/scene.js';
import type { LegendEntry } from './chart.js';
import { centerY } from './boxes.js';

export function findLegend(items: readonly SceneItem[], exclude: Set<number>): { entries: LegendEntry[]; box: number | null } {
  const texts = items.filter((i): i is TextItem => i.kind === 'text' && Math.abs(i.rotation) < 1 && !exclude.has(i.index));
  const shapes = items.filter((i): i is ShapeItem => i.kind === 'shape' && !exclude.has(i.index));
  const entries: LegendEntry[] = [];
  const used = new Set<number>();
  for (const t of texts) {
    const fs = t.fontSize;
    const cy = centerY(t.bbox);
    let best: ShapeItem | null = null;
    let bestGap = Infinity;
    const near: ShapeItem[] = [];
    for (const s of shapes) {
      if (used.has(s.index)) continue;
      const b = s.bbox;
      if (b.width > 3 * fs || b.height > 2.2 * fs) continue;
      if (Math.max(b.width, b.height) < 0.55 * fs) continue; // tick marks and dots are not swatches
      const gap = t.bbox.x - (b.x + b.width);
      if (gap < -0.2 * fs || gap > 1.6 * fs) continue;
      if (cy < b.y - 0.45 * fs || cy > b.y + b.height + 0.45 * fs) continue;
      if (Math.abs(centerY(b) - cy) > 0.6 * fs) continue;
      const paint = s.fill.kind !== 'none' ? s.fill : s.stroke;
      if (!paint.color) continue;
      near.push(s);
      if (gap < bestGap) {
        bestGap = gap;
        best = s;
      }
    }
    if (!best) continue;
    // A key drawn over a key background: the topmost shape over the nearest one is the swatch.
    const b0 = best.bbox;
    for (const s of near) {
      const b = s.bbox;
      const overlaps = b.x < b0.x + b0.width && b.x + b.width > b0.x && b.y < b0.y + b0.height && b.y + b.height > b0.y;
      if (overlaps && s.index > best.index) best = s;
    }
    used.add(best.index);
    const paint = best.fill.kind !== 'none' ? best.fill : best.stroke;
    entries.push({ swatch: best.index, label: t.index, name: t.content, color: paint.color });
  }
  // A lone swatch+text pair can be anything (e.g. a data label beside a point): keep legends of 2+
  // entries, or a single entry that stands apart from the data region (decided by the caller).
  if (entries.length < 2) return { entries: entries.length === 1 ? entries : [], box: null };
  // The legend box: a shape that encloses all entries and is not much larger.
  let box: number | null = null;
  const xs = entries.flatMap((e) => [items[e.swatch]!.bbox, items[e.label!]!.bbox]);
  const minX = Math.min(...xs.map((b) => b.x));
  const minY = Math.min(...xs.map((b) => b.y));
  const maxX = Math.max(...xs.map((b) => b.x + b.width));
  const maxY = Math.max(...xs.map((b) => b.y + b.height));
  const spanArea = (maxX - minX) * (maxY - minY);
  for (const s of shapes) {
    if (used.has(s.index) || !s.rect) continue;
    const r = s.rect;
    const fs = (items[entries[0]!.label!] as TextItem).fontSize;
    if (r.x <= minX + 0.5 && r.y <= minY + 0.5 && r.x + r.width >= maxX - 0.5 && r.y + r.height >= maxY - 0.5) {
      if (r.width * r.height <= spanArea * 4 + 20 * fs * fs) {
        box = s.index;
        break;
      }
    }
  }
  return { entries, box };
}
