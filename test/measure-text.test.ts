/**
 * Text measures: display size, WCAG contrast against what is behind,
 * collisions of glyph boxes, numeric columns and decimal precision.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import type { Axis, Chart, ItemRole } from '../engine/classify/chart.js';
import { measureChart } from '../engine/measure/measures.js';
import { buildSurfaceIndex } from '../engine/measure/surfaces.js';
import { findCollisions, measureTextLabels, numberParts, quadOverlapDepth, textQuad, type Quad } from '../engine/measure/text.js';
import { digitAdvances } from '../engine/read/fonts/digit-widths.js';
import type { TextItem } from '../engine/read/scene.js';

const svg = (body: string, attrs = 'width="400" height="300" viewBox="0 0 400 300"') => `<svg xmlns="http://www.w3.org/2000/svg" ${attrs}>${body}</svg>`;

function chartOf(text: string, role: (i: number) => ItemRole['sub'] = () => 'label/other'): Chart {
  const { chart } = analyzeSvg(text);
  chart.roles = chart.scene.items.map((_, i) => {
    const sub = role(i);
    return { role: sub.split('/')[0] as ItemRole['role'], sub };
  });
  return chart;
}

const labelsOf = (chart: Chart, displayWidth: number | null = null) => measureTextLabels(chart, buildSurfaceIndex(chart.scene), { displayWidth });

/** A vertical numeric axis whose tick labels are the given scene items. */
function yAxis(items: number[], scale: Axis['scale'] = 'linear'): Axis {
  return {
    name: 'y',
    direction: 'vertical',
    scale,
    ticks: items.map((label, k) => ({ value: k, position: k, label })),
    fit: null,
    bands: null,
    domain: [0, items.length - 1],
    line: null,
  };
}

describe('text size at the display size', () => {
  it('scales font sizes by CSS px per user unit', () => {
    const chart = chartOf(svg('<text x="10" y="50" font-size="10">A</text>', 'width="800" height="600" viewBox="0 0 400 300"'));
    expect(labelsOf(chart).labels[0]!.sizePx).toBeCloseTo(20, 9);
    // A configured display width overrides the figure's own size.
    expect(labelsOf(chart, 200).labels[0]!.sizePx).toBeCloseTo(5, 9);
  });

  it('rejects a display width that is not a positive number', () => {
    const chart = chartOf(svg('<text x="10" y="50" font-size="10">A</text>'));
    expect(() => labelsOf(chart, -3)).toThrow(/displayWidth/);
    expect(() => labelsOf(chart, Number.NaN)).toThrow(/displayWidth/);
  });

  it('reaches measureChart through its displayWidth option', () => {
    const chart = chartOf(svg('<text x="10" y="50" font-size="10">A</text>'));
    expect(measureChart(chart, { displayWidth: 800 }).text.labels[0]!.sizePx).toBeCloseTo(20, 9);
  });

  it('marks WCAG large-scale text', () => {
    // source: WCAG 2.2 "large scale (text)": 18 pt (24 CSS px) or 14 pt bold (18.67 CSS px); Understanding SC 1.4.3
    const chart = chartOf(
      svg(
        '<text x="10" y="40" font-size="24">A</text><text x="10" y="80" font-size="23.9">B</text>' +
          '<text x="10" y="120" font-size="19" font-weight="bold">C</text><text x="10" y="160" font-size="18.5" font-weight="bold">D</text>',
      ),
    );
    expect(labelsOf(chart).labels.map((l) => l.large)).toEqual([true, false, true, false]);
  });
});

describe('text contrast against what is behind', () => {
  it('matches WCAG worked values on white', () => {
    const chart = chartOf(svg('<text x="10" y="50" fill="#767676">A</text><text x="10" y="100" fill="#777777">B</text><text x="10" y="150" fill="#949494">C</text>'));
    const c = labelsOf(chart).labels.map((l) => l.contrast!);
    // source: ../shared/reference/wcag.json — #767676/#fff 4.5422 (computed), #777777/#fff 4.4781 (computed), #949494/#fff 3:1 published (3.0335 computed)
    expect(c[0]).toBeCloseTo(4.5422, 3);
    expect(c[1]).toBeCloseTo(4.4781, 3);
    expect(c[2]).toBeCloseTo(3.0335, 3);
  });

  it('uses the topmost filled shape under the label centre', () => {
    const chart = chartOf(svg('<rect x="0" y="0" width="200" height="100" fill="#000"/><text x="20" y="60" fill="#fff" font-size="20">Inside</text>'), (i) => (i === 0 ? 'mark/bar' : 'label/data'));
    const l = labelsOf(chart).labels[0]!;
    // source: WCAG 2.x contrast of #fff on #000 is 21:1 (../shared/reference/wcag.json)
    expect(l.contrast).toBeCloseTo(21, 9);
    expect(l.behindItem).toBe(0);
  });

  it('composites translucent backgrounds and text', () => {
    const chart = chartOf(svg('<rect x="0" y="0" width="400" height="300" fill="#000" fill-opacity="0.5"/><text x="20" y="60" fill="#000" font-size="20">Shade</text>'));
    const l = labelsOf(chart).labels[0]!;
    // computed: black at 50% over white paper is sRGB 0.5 (≈ #808080); WCAG ratio of #000 on it ≈ 5.28
    expect(l.behind!.r).toBeCloseTo(0.5, 9);
    expect(l.contrast).toBeCloseTo(5.28, 1);
  });

  it('ignores a marker much smaller than the label under its centre', () => {
    const chart = chartOf(svg('<circle cx="60" cy="53" r="2" fill="#000"/><text x="20" y="60" fill="#000" font-size="20">Label</text>'), (i) => (i === 0 ? 'mark/point' : 'label/data'));
    expect(labelsOf(chart).labels[0]!.contrast).toBeCloseTo(21, 9);
  });
});

describe('label collisions', () => {
  it('finds overlapping labels and leaves neighbours alone', () => {
    const chart = chartOf(
      svg(
        '<text x="10" y="50" font-size="14">Northern region</text><text x="60" y="55" font-size="14">Southern region</text>' +
          '<text x="10" y="150" font-size="14">Left</text><text x="120" y="150" font-size="14">Right</text>' +
          '<text x="10" y="250" font-size="14">Apart</text><text x="10" y="272" font-size="14">Below</text>',
      ),
    );
    const m = labelsOf(chart);
    expect(m.collisions.map((c) => [c.a, c.b])).toEqual([[0, 1]]);
    expect(m.collisions[0]!.depthPx).toBeGreaterThan(1);
  });

  it('does not count the same text drawn twice in one place (a halo)', () => {
    const chart = chartOf(svg('<text x="10" y="50" font-size="14" stroke="#fff" stroke-width="3">Haloed</text><text x="10" y="50" font-size="14">Haloed</text>'));
    expect(labelsOf(chart).collisions).toEqual([]);
  });

  it('tests rotated boxes by their separating axes', () => {
    const chart = chartOf(svg('<text x="100" y="100" font-size="14" transform="rotate(-45 100 100)">Rotated label text</text><text x="150" y="40" font-size="14">Crossed</text><text x="20" y="40" font-size="14">Clear</text>'));
    const m = labelsOf(chart);
    expect(m.collisions.map((c) => [c.a, c.b])).toEqual([[0, 1]]);
  });

  it('computes overlap depth of squares exactly', () => {
    // computed: two unit squares offset by 0.25 overlap by 0.75 along x
    const a: Quad = [0, 0, 1, 0, 1, 1, 0, 1];
    const b: Quad = [0.25, 0, 1.25, 0, 1.25, 1, 0.25, 1];
    expect(quadOverlapDepth(a, b)).toBeCloseTo(0.75, 12);
    const c: Quad = [2, 0, 3, 0, 3, 1, 2, 1];
    expect(quadOverlapDepth(a, c)).toBeLessThan(0);
  });

  it('pairs each collision once in a crowded grid', () => {
    // 30 × 30 labels on a lattice one box apart: no collisions; the same labels shifted half a box: each touches its right neighbour.
    const body: string[] = [];
    for (let r = 0; r < 30; r++) for (let c = 0; c < 30; c++) body.push(`<text x="${c * 40}" y="${20 + r * 20}" font-size="10">00</text>`);
    const chart = chartOf(svg(body.join(''), 'width="1200" height="620" viewBox="0 0 1200 620"'));
    const items = chart.scene.items as TextItem[];
    const quads = items.map(textQuad);
    expect(findCollisions(items, quads, 0.1)).toEqual([]);
    const tight = items.map((it) => ({ ...it, x: it.x * 0.25 }));
    const found = findCollisions(tight, tight.map(textQuad), 0.1);
    expect(found.length).toBe(30 * 29);
    expect(new Set(found.map((f) => `${f.a},${f.b}`)).size).toBe(found.length);
  });
});

describe('numbers in labels', () => {
  it('finds the decimal mark and counts decimals', () => {
    expect(numberParts('1,250.5', false)).toEqual({ decimalIndex: 5, decimals: 1 });
    expect(numberParts('−2.25', false)).toEqual({ decimalIndex: 2, decimals: 2 });
    expect(numberParts('45%', false)).toEqual({ decimalIndex: 2, decimals: 0 });
    expect(numberParts('$1.5M', false)).toEqual({ decimalIndex: 2, decimals: 1 });
    expect(numberParts('0,75', true)).toEqual({ decimalIndex: 1, decimals: 2 });
    expect(numberParts('1e3', false)).toBeNull();
    expect(numberParts('2×10^3', false)).toBeNull();
    expect(numberParts('none', false)).toBeNull();
  });
});

describe('numeric label columns', () => {
  const column = (anchor: string, labels: string[]) =>
    svg(labels.map((l, k) => `<text x="60" y="${40 + k * 30}" font-family="DejaVu Sans" font-size="12" text-anchor="${anchor}">${l}</text>`).join(''));

  it('calls right-aligned labels right-aligned, with tabular digits in DejaVu Sans', () => {
    const chart = chartOf(column('end', ['1000', '750', '500', '250', '0']), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2, 3, 4]);
    const [c] = labelsOf(chart).columns;
    expect(c!.alignment).toBe('right');
    expect(c!.rightSpreadPx).toBeLessThan(1e-9);
    // source: DejaVu Sans hmtx — all ten digits share one advance (tabular figures by default)
    const adv = digitAdvances({ family: ['DejaVu Sans'], size: 12, weight: 400, style: 'normal' });
    expect(new Set(adv).size).toBe(1);
    expect(c!.tabular).toBe(true);
  });

  it('calls left-aligned numbers of different lengths ragged (left)', () => {
    const chart = chartOf(column('start', ['1000', '750', '500', '250', '0']), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2, 3, 4]);
    const [c] = labelsOf(chart).columns;
    expect(c!.alignment).toBe('left');
    // computed: "1000" vs "0" differ by three DejaVu Sans digit advances (0.63623 em each) at 12 px
    expect(c!.rightSpreadPx).toBeCloseTo(3 * 0.63623046875 * 12, 3);
  });

  it('recognises decimal alignment', () => {
    // Right-aligned by hand so that the decimal marks line up: "10.5" and "2.25" end at different x.
    const body =
      '<text x="60" y="40" font-family="DejaVu Sans" font-size="12" text-anchor="middle">10.5</text>' +
      '<text x="60" y="70" font-family="DejaVu Sans" font-size="12" text-anchor="middle">2.25</text>' +
      '<text x="60" y="100" font-family="DejaVu Sans" font-size="12" text-anchor="middle">1.0</text>';
    const chart = chartOf(svg(body), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2]);
    const [c] = labelsOf(chart).columns;
    expect(c!.alignment).toBe('ragged');
    // Place them with the decimal mark at x = 60 instead.
    const digit = 0.63623046875 * 12;
    const placed =
      `<text x="${60 - 2 * digit}" y="40" font-family="DejaVu Sans" font-size="12">10.5</text>` +
      `<text x="${60 - digit}" y="70" font-family="DejaVu Sans" font-size="12">2.25</text>` +
      `<text x="${60 - digit}" y="100" font-family="DejaVu Sans" font-size="12">1.0</text>`;
    const chart2 = chartOf(svg(placed), () => 'label/tick');
    chart2.axes.y = yAxis([0, 1, 2]);
    expect(labelsOf(chart2).columns[0]!.alignment).toBe('decimal');
  });

  it('leaves band axes and horizontal axes out of columns', () => {
    const chart = chartOf(column('start', ['1000', '750', '500']), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2], 'band');
    expect(labelsOf(chart).columns).toEqual([]);
  });
});

describe('decimal precision per axis', () => {
  it('lists the precisions one linear axis mixes', () => {
    const chart = chartOf(svg(['0', '0.5', '1.25', '2'].map((l, k) => `<text x="60" y="${40 + k * 30}" font-size="12" text-anchor="end">${l}</text>`).join('')), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2, 3]);
    const [p] = labelsOf(chart).precision;
    expect(p!.decimals).toEqual([0, 1, 2, 0]);
    expect(p!.precisions).toEqual([0, 1, 2]);
  });

  it('reads a decimal comma', () => {
    const chart = chartOf(svg(['0,0', '0,5', '1,0'].map((l, k) => `<text x="60" y="${40 + k * 30}" font-size="12" text-anchor="end">${l}</text>`).join('')), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2]);
    expect(labelsOf(chart).precision[0]!.precisions).toEqual([1]);
  });

  it('leaves log axes alone', () => {
    const chart = chartOf(svg(['0.1', '1', '10'].map((l, k) => `<text x="60" y="${40 + k * 30}" font-size="12" text-anchor="end">${l}</text>`).join('')), () => 'label/tick');
    chart.axes.y = yAxis([0, 1, 2], 'log');
    expect(labelsOf(chart).precision).toEqual([]);
  });
});
