/**
 * How much a run of text inks, and where: the filled area of its glyph
 * outlines and the box around them, read from the bundled face that stands in
 * for the requested font (the same face the scene measured the text with).
 * Results are in em units (multiply lengths by the font size, areas by its
 * square); x runs along the baseline from the pen start, y points up.
 */
import { faceMetrics, type FaceMetrics } from '../read/fonts/face-metrics.js';
import { matchFontFace, parseFontStyle } from '../read/fonts/font-files.js';
import type { OtPathCommand } from '../read/fonts/opentype-font.js';

export interface GlyphRunInk {
  /** Filled area of the glyph outlines, em². */
  area: number;
  /** Box around the outlines, em, relative to the pen start on the baseline (y up). */
  left: number;
  right: number;
  bottom: number;
  top: number;
  /** Sum of advances, em (no kerning). */
  advance: number;
}

interface GlyphInk {
  area: number;
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  advance: number;
  empty: boolean;
}

/**
 * Ink of a DejaVu Sans Book sample of chart text (digits, lower and upper
 * case) over the box advance × 1 em: measured with {@link glyphRunInk} on
 * "0123456789 abcdefghijklmnopqrstuvwxyz ABCDEFGHIJKLMNOPQRSTUVWXYZ" (0.225;
 * the bold face gives 0.348). About half of the 0.5 one might guess: glyphs
 * leave most of their em box empty.
 * Used only when a face cannot be read; the test suite re-measures it.
 */
export const TEXT_INK_COVERAGE = 0.225;

const CURVE_STEPS = 8;

/** Signed area (y up: counter-clockwise positive) of outline commands, font units², by Green's theorem over flattened curves. */
export function outlineArea(commands: readonly OtPathCommand[]): number {
  let sum = 0;
  let sx = 0;
  let sy = 0;
  let px = 0;
  let py = 0;
  const edge = (x: number, y: number) => {
    sum += px * y - x * py;
    px = x;
    py = y;
  };
  for (const c of commands) {
    switch (c.type) {
      case 'M':
        if (px !== sx || py !== sy) edge(sx, sy);
        sx = px = c.x ?? 0;
        sy = py = c.y ?? 0;
        break;
      case 'L':
        edge(c.x ?? 0, c.y ?? 0);
        break;
      case 'Q': {
        const x0 = px;
        const y0 = py;
        for (let k = 1; k <= CURVE_STEPS; k++) {
          const t = k / CURVE_STEPS;
          const u = 1 - t;
          edge(u * u * x0 + 2 * u * t * (c.x1 ?? 0) + t * t * (c.x ?? 0), u * u * y0 + 2 * u * t * (c.y1 ?? 0) + t * t * (c.y ?? 0));
        }
        break;
      }
      case 'C': {
        const x0 = px;
        const y0 = py;
        for (let k = 1; k <= CURVE_STEPS; k++) {
          const t = k / CURVE_STEPS;
          const u = 1 - t;
          const a = u * u * u;
          const b = 3 * u * u * t;
          const d = 3 * u * t * t;
          const e = t * t * t;
          edge(a * x0 + b * (c.x1 ?? 0) + d * (c.x2 ?? 0) + e * (c.x ?? 0), a * y0 + b * (c.y1 ?? 0) + d * (c.y2 ?? 0) + e * (c.y ?? 0));
        }
        break;
      }
      case 'Z':
        edge(sx, sy);
        break;
    }
  }
  if (px !== sx || py !== sy) edge(sx, sy);
  return sum / 2;
}

const glyphCache = new Map<string, GlyphInk>();

function glyphInk(m: FaceMetrics, codePoint: number): GlyphInk {
  const key = `${m.id}:${codePoint}`;
  let g = glyphCache.get(key);
  if (g === undefined) {
    const index = m.glyphIndex(codePoint);
    const glyph = m.font.glyphs.get(index);
    const commands = glyph?.path.commands ?? [];
    const advance = m.advance(index);
    if (commands.length === 0 || glyph === undefined) {
      g = { area: 0, x1: 0, y1: 0, x2: advance, y2: 0, advance, empty: true };
    } else {
      const bb = glyph.getBoundingBox();
      g = { area: Math.abs(outlineArea(commands)), x1: bb.x1, y1: bb.y1, x2: bb.x2, y2: bb.y2, advance, empty: false };
    }
    glyphCache.set(key, g);
  }
  return g;
}

/**
 * Glyph ink of `text` set in the bundled face for a family list, weight and
 * style. Throws only if the bundled fonts cannot be read.
 */
export function glyphRunInk(text: string, family: readonly string[], weight: number, style: string): GlyphRunInk {
  const face = matchFontFace(family, weight, parseFontStyle(style) ?? 'normal').face;
  const m = faceMetrics(face.id);
  const upm = m.unitsPerEm;
  let pen = 0;
  let area = 0;
  let left = Infinity;
  let right = -Infinity;
  let bottom = Infinity;
  let top = -Infinity;
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    const g = glyphInk(m, cp);
    area += g.area;
    if (!g.empty) {
      left = Math.min(left, pen + g.x1);
      right = Math.max(right, pen + g.x2);
      bottom = Math.min(bottom, g.y1);
      top = Math.max(top, g.y2);
    }
    pen += g.advance;
  }
  if (!(right > left)) {
    left = 0;
    right = 0;
    bottom = 0;
    top = 0;
  }
  return { area: area / (upm * upm), left: left / upm, right: right / upm, bottom: bottom / upm, top: top / upm, advance: pen / upm };
}
