/**
 * Colour bars (the key of a heatmap): an elongated embedded image, or a strip
 * of many small cells, beside the plot area, with numeric labels along it.
 * Embedded PNG images are decoded (never fetched) and sampled along the long axis.
 */
import { PNG } from 'pngjs';
import type { Rgba } from '../color/types.js';
import type { Box, ImageItem, ShapeItem, TextItem } from '../read/scene.js';
import { bottom, centerX, centerY, containsPoint, right } from './boxes.js';

import type { ColorBar } from './chart.js';
import { parseTickLabel } from './scale/parse-tick-label.js';
import { fitScale } from './scale/fit-scale.js';

const MAX_DATA_URI = 8 * 1024 * 1024;
const SAMPLES = 64;

/** An embedded image colour bar beside the plot area. */
export function findImageColorBar(images: ImageItem[], plot: Box | null, texts: TextItem[]): ColorBar | null {
  if (!plot) return null;
  for (const img of images) {
    const b = img.bbox;
    if (containsPoint(plot, centerX(b), centerY(b))) continue;
    const vertical = b.height >= 3 * b.width;
    const horizontal = b.width >= 3 * b.height;
    if (!vertical && !horizontal) continue;
    const colors = img.embedded ? sampleDataUri(img.href, vertical) : null;
    if (!colors || colors.length < 2) continue;
    const range = labelRange(b, vertical, texts);
    return { items: [img.index], colors, low: range?.low ?? null, high: range?.high ?? null };
  }
  return null;
}

/**
 * A vector colour bar: at least five filled cells of one size in a single
 * column (or row), edge to edge, with five or more colours, and no cells of
 * that size beside them (that would be a grid of data, not a key).
 */
export function findVectorColorBar(shapes: ShapeItem[], texts: TextItem[]): ColorBar | null {
  const outside = shapes.filter((s) => s.fill.kind !== 'none' && s.fill.color && s.rect);
  for (const vertical of [true, false]) {
    const key = (s: ShapeItem): string => (vertical ? `${s.bbox.x.toFixed(1)}|${s.bbox.width.toFixed(1)}` : `${s.bbox.y.toFixed(1)}|${s.bbox.height.toFixed(1)}`);
    const groups = new Map<string, ShapeItem[]>();
    for (const s of outside) {
      const k = key(s);
      groups.set(k, [...(groups.get(k) ?? []), s]);
    }
    for (const g of groups.values()) {
      if (g.length < 5) continue;
      const size = (s: ShapeItem): string => `${s.bbox.width.toFixed(1)}x${s.bbox.height.toFixed(1)}`;
      const sizes = new Set(g.map(size));
      if (sizes.size > 2) continue;
      // Cells of the same size elsewhere in the figure: part of a data grid.
      const sameSize = outside.filter((s) => sizes.has(size(s)) && !g.includes(s)).length;
      if (sameSize > 0) continue;
      const span = vertical ? Math.max(...g.map((s) => bottom(s.bbox))) - Math.min(...g.map((s) => s.bbox.y)) : Math.max(...g.map((s) => right(s.bbox))) - Math.min(...g.map((s) => s.bbox.x));
      const cellSum = g.reduce((n, s) => n + (vertical ? s.bbox.height : s.bbox.width), 0);
      if (cellSum < 0.9 * span) continue;
      const sorted = [...g].sort((p, q) => (vertical ? bottom(q.bbox) - bottom(p.bbox) : p.bbox.x - q.bbox.x));
      const colors = sorted.map((s) => s.fill.color!) as Rgba[];
      if (new Set(colors.map((c) => `${c.r.toFixed(3)},${c.g.toFixed(3)},${c.b.toFixed(3)}`)).size < 5) continue;
      const x0 = Math.min(...g.map((s) => s.bbox.x));
      const y0 = Math.min(...g.map((s) => s.bbox.y));
      const box = { x: x0, y: y0, width: Math.max(...g.map((s) => right(s.bbox))) - x0, height: Math.max(...g.map((s) => bottom(s.bbox))) - y0 };
      const range = labelRange(box, vertical, texts);
      // A stroked outline drawn tightly around the strip belongs to it.
      const frame = shapes.find((s) => s.rect && s.fill.kind === 'none' && s.stroke.kind !== 'none' && Math.abs(s.rect.x - box.x) < 2 && Math.abs(s.rect.y - box.y) < 2 && Math.abs(right(s.rect) - right(box)) < 2 && Math.abs(bottom(s.rect) - bottom(box)) < 2);
      return { items: [...g.map((s) => s.index), ...(frame ? [frame.index] : [])], colors, low: range?.low ?? null, high: range?.high ?? null };
    }
  }
  return null;
}

/** Values at the low and high end of a bar, from numeric labels beside it. */
function labelRange(b: Box, vertical: boolean, texts: TextItem[]): { low: number; high: number } | null {
  const ticks: { value: number; position: number }[] = [];
  for (const t of texts) {
    const fs = t.fontSize;
    const cx = centerX(t.bbox);
    const cy = centerY(t.bbox);
    const near = vertical
      ? cy >= b.y - fs && cy <= bottom(b) + fs && ((t.bbox.x >= right(b) - 1 && t.bbox.x <= right(b) + 3 * fs) || (right(t.bbox) <= b.x + 1 && right(t.bbox) >= b.x - 3 * fs))
      : cx >= b.x - fs && cx <= right(b) + fs && ((t.bbox.y >= bottom(b) - 1 && t.bbox.y <= bottom(b) + 2 * fs) || (bottom(t.bbox) <= b.y + 1 && bottom(t.bbox) >= b.y - 2 * fs));
    if (!near) continue;
    const p = parseTickLabel(t.content);
    if (p?.kind !== 'number') continue;
    ticks.push({ value: p.value, position: vertical ? cy : cx });
  }
  if (ticks.length < 2) return null;
  const fit = fitScale(ticks);
  if (!fit || fit.type !== 'linear') return null;
  const lowPos = vertical ? bottom(b) : b.x;
  const highPos = vertical ? b.y : right(b);
  return { low: fit.invert(lowPos), high: fit.invert(highPos) };
}

/** Colours along the long axis of an embedded PNG, from the low end (bottom or left) to the high end. */
export function sampleDataUri(href: string, vertical: boolean): Rgba[] | null {
  if (href.length > MAX_DATA_URI) return null;
  const m = /^data:image\/png;base64,(.*)$/s.exec(href.trim());
  if (!m) return null;
  try {
    const png = PNG.sync.read(Buffer.from(m[1]!.replace(/\s+/g, ''), 'base64'));
    if (png.width * png.height > 16_000_000) return null;
    const out: Rgba[] = [];
    const n = Math.min(SAMPLES, vertical ? png.height : png.width);
    for (let k = 0; k < n; k++) {
      const t = n === 1 ? 0 : k / (n - 1);
      const x = vertical ? Math.floor(png.width / 2) : Math.round(t * (png.width - 1));
      const y = vertical ? Math.round((1 - t) * (png.height - 1)) : Math.floor(png.height / 2);
      const o = (y * png.width + x) * 4;
      out.push({ r: png.data[o]! / 255, g: png.data[o + 1]! / 255, b: png.data[o + 2]! / 255, alpha: png.data[o + 3]! / 255 });
    }
    return out;
  } catch {
    return null;
  }
}
