/**
 * ink.frame-box: a closed box around the plot area — a stroked rectangle, or
 * lines on all four of its edges. The two axes that carry scales are enough;
 * the other two sides repeat them. Lines styled exactly like the gridlines
 * are taken as the grid's outermost lines, not as a frame.
 */
import { r4, elementsOf, type Rule } from '../rule.js';
import { deltaEab, JND_DELTA_E_AB } from './color-distance.js';
import { axisSegments, coveredLength, crossingGridSegments, type AxisSegment } from './edge-lines.js';

const FRAME_SUBS = new Set(['guide/axis', 'guide/frame', 'guide/background', 'guide/other']);

export const frameBox: Rule = {
  id: 'ink.frame-box',
  family: 'ink',
  severity: 'note',
  rationale: 'A box on all four sides of the plot repeats the two axes that carry scales; its extra sides are ink that shows no data and boxes the data in.',
  source: 'Tufte 1983, The Visual Display of Quantitative Information, ch. 6 (redesign of the frame: range-frames and erasing non-data-ink)',
  thresholds: {
    /** Least share of each edge's length the lines must cover for that side to count as drawn (common practice, no source). */
    minEdgeCover: 0.8,
    /** Largest distance of a line from the edge, CSS px (besides 1% of the plot's size). */
    edgeTolerancePx: 2,
  },
  fix: 'Open the box: keep the two axis lines that carry scales (usually left and bottom) and remove the other two sides.',
  check({ chart, thresholds }) {
    const pa = chart.plotArea;
    if (!pa || !(pa.width > 0 && pa.height > 0)) return [];
    const px = chart.scene.pxPerUnit > 0 ? chart.scene.pxPerUnit : 1;
    const grid = crossingGridSegments(chart);
    const gridLike = (s: AxisSegment) => grid.some((g) => deltaEab(g.color, s.color) < JND_DELTA_E_AB && Math.abs(g.width - s.width) <= 0.1 * Math.max(g.width, s.width));
    const segs: AxisSegment[] = [];
    chart.roles.forEach((r, i) => {
      if (!FRAME_SUBS.has(r.sub)) return;
      for (const s of axisSegments(chart, i, Math.max(3 / px, 0.01 * Math.min(pa.width, pa.height)))) {
        // Seen as a line only where it differs from both sides: the page outside and the plot inside.
        if (deltaEab(s.color, chart.page) >= JND_DELTA_E_AB && deltaEab(s.color, chart.background) >= JND_DELTA_E_AB) segs.push(s);
      }
    });
    const tolX = Math.max(thresholds.edgeTolerancePx / px, 0.01 * pa.width);
    const tolY = Math.max(thresholds.edgeTolerancePx / px, 0.01 * pa.height);
    const edges = [
      { name: 'top', o: 'h' as const, at: pa.y, lo: pa.x, hi: pa.x + pa.width, tol: tolY },
      { name: 'bottom', o: 'h' as const, at: pa.y + pa.height, lo: pa.x, hi: pa.x + pa.width, tol: tolY },
      { name: 'left', o: 'v' as const, at: pa.x, lo: pa.y, hi: pa.y + pa.height, tol: tolX },
      { name: 'right', o: 'v' as const, at: pa.x + pa.width, lo: pa.y, hi: pa.y + pa.height, tol: tolX },
    ];
    const coverOf = (list: AxisSegment[]) => {
      const cover: Record<string, number> = {};
      const used = new Set<number>();
      for (const e of edges) {
        const on = list.filter((s) => s.orientation === e.o && Math.abs(s.at - e.at) <= e.tol + s.width / 2);
        cover[e.name] = coveredLength(on.map((s) => [s.from, s.to]), e.lo, e.hi) / (e.hi - e.lo);
        if (cover[e.name]! >= thresholds.minEdgeCover) for (const s of on) used.add(s.item);
      }
      const closed = edges.every((e) => cover[e.name]! >= thresholds.minEdgeCover);
      return { cover, used, closed };
    };
    // One outline drawing all four sides is a frame whatever its style; separate
    // lines styled like the gridlines are the grid's outermost lines.
    const byItem = new Map<number, AxisSegment[]>();
    for (const s of segs) byItem.set(s.item, [...(byItem.get(s.item) ?? []), s]);
    let result = [...byItem.values()].map(coverOf).find((c) => c.closed);
    if (!result) result = coverOf(segs.filter((s) => !gridLike(s)));
    if (!result.closed) return [];
    const { cover, used } = result;
    return [
      {
        message: 'The plot area is boxed in on all four sides; the top and right sides repeat the axes and carry no data.',
        elements: elementsOf(chart, [...used]),
        measures: { top: r4(cover.top!), bottom: r4(cover.bottom!), left: r4(cover.left!), right: r4(cover.right!) },
      },
    ];
  },
};
