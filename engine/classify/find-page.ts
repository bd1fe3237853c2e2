/** The page background: a filled rectangle under everything that covers (almost) the whole view. */
import type { Rgba } from '../color/types.js';
import type { Box, SceneItem, ShapeItem } from '../read/scene.js';
import { area, intersection } from './boxes.js';

export const WHITE: Rgba = Object.freeze({ r: 1, g: 1, b: 1, alpha: 1 }) as Rgba;

export interface PageBackground {
  items: number[];
  color: Rgba;
}

export function findPage(items: readonly SceneItem[], viewBox: Box): PageBackground {
  const out: number[] = [];
  let color: Rgba = WHITE;
  const full = area(viewBox);
  for (const it of items.slice(0, 12)) {
    if (it.kind !== 'shape') break;
    const s = it as ShapeItem;
    if (!s.rect || s.fill.kind === 'none') continue;
    const cover = intersection(s.rect, viewBox);
    if (!cover || area(cover) < 0.9 * full) continue;
    out.push(s.index);
    if (s.fill.color && s.fill.opacity > 0.5) color = blendOver(s.fill.color, s.fill.opacity, color);
  }
  return { items: out, color };
}

export function blendOver(fg: Rgba, opacity: number, bg: Rgba): Rgba {
  const a = Math.max(0, Math.min(1, opacity));
  return { r: fg.r * a + bg.r * (1 - a), g: fg.g * a + bg.g * (1 - a), b: fg.b * a + bg.b * (1 - a), alpha: 1 };
}
