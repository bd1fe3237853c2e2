/**
 * Redraw's proof can fail: edits that move or drop a data mark, that add ink
 * that is not data, or that leave a fixed rule firing are each caught. And
 * the flat wedges a tilted pie is redrawn with have the sector areas of their
 * angles.
 */
import { describe, expect, it } from 'vitest';
import { auditText } from '../engine/audit/audit-file.js';
import { DEFAULT_CONFIG } from '../engine/config/config.js';
import { parsePath } from '../engine/read/geometry/parse-path.js';
import { pathArea } from '../engine/read/geometry/measure-path.js';
import { identity, type Matrix } from '../engine/read/geometry/matrix.js';
import { applyEdits, insertAfter, removeElement, setAttribute, type Edit } from '../engine/redraw/edit-list.js';
import { verifyRedraw } from '../engine/redraw/verify.js';
import { wedgePathData } from '../engine/redraw/wedge-path.js';
import { readChart } from './support/real-charts.js';

const FILE = 'vl-bar-clean-01.svg';

function verify(edits: Edit[], fixedRules: string[] = []) {
  const text = readChart(FILE);
  const before = auditText(text, FILE);
  const sorted = [...edits].sort((a, b) => a.start - b.start);
  const output = applyEdits(text, sorted);
  return verifyRedraw({ path: FILE, config: DEFAULT_CONFIG, before, edits: sorted, output, reprojected: [], inkHeld: new Set(), fixedRules: new Set(fixedRules) }).report;
}

function firstBar() {
  const text = readChart(FILE);
  const a = auditText(text, FILE).analysis!;
  const bar = a.scene.items.find((_, i) => a.chart.roles[i]?.sub === 'mark/bar')!;
  return { a, bar };
}

describe('redraw verification', () => {
  it('passes edits that leave the data alone', () => {
    const { a } = firstBar();
    const r = verify([setAttribute(a.doc, a.doc.root, 'data-note', 'x')]);
    expect(r.violations).toEqual([]);
    expect(r.marksChecked).toBeGreaterThan(0);
  });

  it('catches a data mark moved by a fraction of a unit', () => {
    const { a, bar } = firstBar();
    const d = bar.element.attribute('d')!;
    const m = /^M([-\d.]+),([-\d.]+)/.exec(d)!;
    const moved = d.replace(m[0], `M${m[1]},${Number(m[2]) + 0.01}`);
    const r = verify([setAttribute(a.doc, bar.element, 'd', moved)]);
    expect(r.violations.some((v) => v.includes('moved or changed shape'))).toBe(true);
  });

  it('catches a data mark removed', () => {
    const { a, bar } = firstBar();
    const r = verify([removeElement(a.doc, bar.element)]);
    expect(r.violations.some((v) => v.includes('missing from the output'))).toBe(true);
  });

  it('catches a data mark painted fainter', () => {
    const { a, bar } = firstBar();
    const r = verify([setAttribute(a.doc, bar.element, 'fill-opacity', '0.5')]);
    expect(r.violations.some((v) => v.includes('painted differently'))).toBe(true);
  });

  it('catches a new element that reads as a data mark', () => {
    const { a } = firstBar();
    const first = a.doc.root.children.find((c) => c.type === 'element')!;
    if (first.type !== 'element') throw new Error('no child');
    const r = verify([insertAfter(first, '<rect x="60" y="40" width="60" height="200" fill="#4c78a8"/>')]);
    expect(r.violations.some((v) => v.includes('reads as a data mark'))).toBe(true);
  });

  it('catches ink added that is not data', () => {
    const { a } = firstBar();
    const first = a.doc.root.children.find((c) => c.type === 'element')!;
    if (first.type !== 'element') throw new Error('no child');
    // source: Tufte, The Visual Display of Quantitative Information (1983), p. 93 — data-ink ratio; a heavy frame adds non-data ink
    const r = verify([insertAfter(first, '<rect x="2" y="2" width="552" height="360" fill="none" stroke="#000000" stroke-width="4"/>')]);
    expect(r.violations.some((v) => v.includes('data-ink share fell'))).toBe(true);
  });

  it('reports a fixed rule that still fires', () => {
    const r = verify([], ['access.missing-description']);
    expect(r.remaining).toEqual(['access.missing-description']);
  });
});

describe('flat wedges', () => {
  it('enclose the sector area of their angle, in any transform', () => {
    // source: sector area = θr²/2 (elementary geometry); the outline is cubic Béziers, so allow 1e-4 relative
    const cases: { start: number; end: number; inner: number; m: Matrix }[] = [
      { start: 0, end: Math.PI / 3, inner: 0, m: identity },
      { start: 1, end: 1 + 2.5, inner: 0, m: [2, 0, 0, 2, -10, 5] },
      { start: -0.4, end: 0.9, inner: 20, m: [1, 0.2, -0.3, 1.1, 3, 4] },
      { start: 0, end: 2 * Math.PI, inner: 30, m: identity },
    ];
    for (const c of cases) {
      const r = 80;
      const det = c.m[0] * c.m[3] - c.m[1] * c.m[2];
      const inv: Matrix = [c.m[3] / det, -c.m[1] / det, -c.m[2] / det, c.m[0] / det, (c.m[2] * c.m[5] - c.m[3] * c.m[4]) / det, (c.m[1] * c.m[4] - c.m[0] * c.m[5]) / det];
      const d = wedgePathData({ cx: 100, cy: 120, outer: r, inner: c.inner, start: c.start, end: c.end }, inv);
      const area = Math.abs(pathArea(parsePath(d).segments, c.m));
      const want = ((c.end - c.start) / 2) * (r * r - c.inner * c.inner);
      expect(Math.abs(area - want) / want).toBeLessThan(1e-4);
    }
  });
});
