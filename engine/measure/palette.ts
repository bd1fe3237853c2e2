/**
 * The categorical colours of a chart and how far apart they are: one entry
 * per distinct colour that tells categories apart (pie wedges, else series,
 * else legend swatches), with the kind of mark it paints, and CIEDE2000
 * between every pair under normal vision and simulated protan, deutan and
 * tritan vision (Machado, Oliveira & Fernandes 2009, severity 1).
 *
 * Heatmaps are left out: their colours encode a quantity (see ramp.ts).
 */
import type { Chart, SubRole } from '../classify/chart.js';
import { compositeOver } from '../color/composite.js';
import { formatHex } from '../color/format-hex.js';
import { pairwiseConfusion, type PairConfusion } from '../color/pairwise-confusion.js';
import type { Rgba } from '../color/types.js';

/**
 * Mark classes for colour-difference thresholds: large filled marks (bars,
 * areas, wedges, cells) and small marks (lines, points), whose colours must
 * differ more to be told apart (Szafir 2018).
 */
export type MarkClass = 'large' | 'small';

export interface PaletteEntry {
  name: string | null;
  /** The colour as seen: composited over the chart background when translucent. */
  color: Rgba;
  hex: string;
  markClass: MarkClass;
  source: 'wedge' | 'series' | 'legend';
  /** Scene indices of the items painted with it. */
  items: number[];
}

export interface PaletteMeasure {
  entries: PaletteEntry[];
  /** ΔE00 for every pair of entries (i < j), under each vision; empty when `continuous`. */
  pairs: PairConfusion[];
  /**
   * More distinct colours than any categorical palette offers: the colours
   * vary continuously (a gradient or a misread ramp), so pairwise
   * categorical checks do not apply.
   */
  continuous: boolean;
  background: Rgba;
}

/**
 * More colours than this are not a categorical palette: Kelly's (1965) list
 * of colours of maximum contrast has 22.
 */
export const MAX_CATEGORICAL_COLORS = 22;

const NUMERIC = /^[\s+\-−]*[\d.,]+\s*%?\s*$/;

/**
 * The colour with the opacity it is painted with (paint opacity × element and
 * group opacity, as the scene records it) folded into its alpha.
 */
function withPaintOpacity(chart: Chart, c: Rgba, item: number | undefined, stroke: boolean): Rgba {
  const it = item === undefined ? undefined : chart.scene.items[item];
  if (!it || it.kind !== 'shape') return c;
  const paint = stroke || it.fill.kind === 'none' ? it.stroke : it.fill;
  const opacity = Number.isFinite(paint.opacity) ? Math.min(1, Math.max(0, paint.opacity)) : 1;
  return opacity < 1 ? { ...c, alpha: c.alpha * opacity } : c;
}

function legendName(chart: Chart, c: Rgba): string | null {
  const hex = formatHex(c);
  const e = chart.legend.find((l) => l.color && l.name && formatHex(l.color) === hex);
  return e?.name ?? null;
}

export function markClassOf(sub: SubRole): MarkClass {
  return sub === 'mark/line' || sub === 'mark/point' ? 'small' : 'large';
}

/** The categorical colours of a chart and their pairwise distances. */
export function measurePalette(chart: Chart): PaletteMeasure {
  const bg = chart.background;
  const raw: { name: string | null; color: Rgba; markClass: MarkClass; source: PaletteEntry['source']; items: number[] }[] = [];
  if (chart.kind !== 'heatmap') {
    if (chart.pie && chart.pie.wedges.length > 0) {
      for (const w of chart.pie.wedges) {
        if (w.color) raw.push({ name: w.label ?? legendName(chart, w.color), color: withPaintOpacity(chart, w.color, w.item, false), markClass: 'large', source: 'wedge', items: [w.item] });
      }
    } else {
      for (const s of chart.series) {
        if (s.color && s.markType !== 'mark/cell') {
          raw.push({ name: s.name, color: withPaintOpacity(chart, s.color, s.items[0], s.markType === 'mark/line'), markClass: markClassOf(s.markType), source: 'series', items: s.items });
        }
      }
    }
    if (raw.length === 0) {
      for (const e of chart.legend) {
        // Numeric keys label a quantity scale, not categories.
        if (e.color && !(e.name !== null && NUMERIC.test(e.name))) {
          raw.push({ name: e.name, color: e.color, markClass: 'large', source: 'legend', items: [e.swatch] });
        }
      }
    }
  }
  // One entry per colour as seen.
  const byHex = new Map<string, PaletteEntry>();
  for (const r of raw) {
    const seen = r.color.alpha < 1 ? compositeOver(r.color, bg) : r.color;
    const hex = formatHex(seen);
    const have = byHex.get(hex);
    if (have) {
      have.items.push(...r.items);
      if (have.name === null) have.name = r.name;
      if (r.markClass === 'small') have.markClass = 'small';
    } else {
      byHex.set(hex, { name: r.name, color: seen, hex, markClass: r.markClass, source: r.source, items: [...r.items] });
    }
  }
  const entries = [...byHex.values()];
  const continuous = entries.length > MAX_CATEGORICAL_COLORS;
  const pairs = continuous || entries.length < 2 ? [] : pairwiseConfusion(entries.map((e) => e.color)).pairs;
  return { entries, pairs, continuous, background: bg };
}
