/**
 * WCAG 2.x contrast of each categorical mark colour against what is drawn
 * behind the marks (the plot background, the page, or whatever surface they
 * sit on), for SC 1.4.11 Non-text Contrast. A mark outlined by a stroke that
 * itself has enough contrast counts by its outline.
 */
import { intersection } from '../classify/boxes.js';
import type { Chart } from '../classify/chart.js';
import { compositeOver } from '../color/composite.js';
import { formatHex } from '../color/format-hex.js';
import type { Rgba } from '../color/types.js';
import { contrastRatioOpaque } from '../color/wcag-contrast.js';
import type { Box, ShapeItem } from '../read/scene.js';
import type { PaletteEntry } from './palette.js';
import { buildSurfaceIndex, type SurfaceIndex } from './surfaces.js';

export interface MarkContrast {
  name: string | null;
  hex: string;
  /** Colour behind the marks (median over the sampled items by luminance contrast). */
  behindHex: string;
  /** Contrast ratio of the mark colour against what is behind it. */
  ratio: number;
  /** Contrast of the marks' outline stroke, when they have one of another colour (else null). */
  outlineRatio: number | null;
  items: number[];
}

/** Items sampled per colour. */
const SAMPLE = 7;

function clippedBox(it: ShapeItem): Box {
  return (it.clip && intersection(it.bbox, it.clip)) || it.bbox;
}

function medianBy<T>(xs: T[], key: (t: T) => number): T {
  const s = [...xs].sort((a, b) => key(a) - key(b));
  return s[(s.length - 1) >> 1]!;
}

/**
 * Contrast of each palette entry against its backdrop. `surfaces` may be
 * passed in when already built for the scene.
 */
export function measureMarkContrast(chart: Chart, entries: readonly PaletteEntry[], surfaces?: SurfaceIndex): MarkContrast[] {
  if (entries.length === 0) return [];
  const index = surfaces ?? buildSurfaceIndex(chart.scene);
  const out: MarkContrast[] = [];
  for (const e of entries) {
    const shapes = e.items
      .map((i) => chart.scene.items[i])
      .filter((it): it is ShapeItem => it !== undefined && it.kind === 'shape')
      .slice(0, SAMPLE);
    if (shapes.length === 0) continue;
    const samples = shapes.map((it) => {
      const box = clippedBox(it);
      // The surface the mark sits on: the filled shapes under it that hold its whole box
      // (so neighbouring marks of about the same size do not count as its background).
      const behind = index.colorBehind(box.x + box.width / 2, box.y + box.height / 2, it.index, { containing: box });
      const mark = e.color.alpha < 1 ? compositeOver(e.color, behind) : e.color;
      const ratio = contrastRatioOpaque(mark, behind);
      let outline: number | null = null;
      const fillShown = it.fill.kind !== 'none' && it.fill.opacity > 0;
      if (fillShown && it.stroke.kind === 'color' && it.stroke.color && it.stroke.opacity > 0 && it.strokeWidth * chart.scene.pxPerUnit >= 1) {
        const s = it.stroke.color.alpha < 1 || it.stroke.opacity < 1
          ? compositeOver({ ...it.stroke.color, alpha: it.stroke.color.alpha * it.stroke.opacity }, behind)
          : it.stroke.color;
        if (formatHex(s) !== formatHex(mark)) outline = contrastRatioOpaque(s, behind);
      }
      return { behind, ratio, outline };
    });
    const mid = medianBy(samples, (s) => s.ratio);
    const outlines = samples.map((s) => s.outline).filter((v): v is number => v !== null);
    out.push({
      name: e.name,
      hex: e.hex,
      behindHex: formatHex(mid.behind as Rgba),
      ratio: mid.ratio,
      outlineRatio: outlines.length === samples.length ? Math.min(...outlines) : null,
      items: e.items,
    });
  }
  return out;
}
