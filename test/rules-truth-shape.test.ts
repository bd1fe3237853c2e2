/**
 * truth.3d-projection, truth.dual-axis and truth.radius-encoding on small
 * charts drawn here, with expected numbers derived independently from the
 * drawing's construction (orthographic tilt, wedge radii, face areas).
 */
import { describe, expect, it } from 'vitest';
import { dualAxis } from '../engine/rules/truth/dual-axis.js';
import { radiusEncoding } from '../engine/rules/truth/radius-encoding.js';
import { threeDProjection } from '../engine/rules/truth/three-d-projection.js';
import { measureProjection } from '../engine/measure/projection.js';
import { check, lineChart, pieChart, svg, understand, understandPie } from './support/rules-svg.js';

const OKABE_ITO = ['#0072b2', '#e69f00', '#009e73', '#cc79a7', '#56b4e9', '#d55e00', '#f0e442', '#000000'];

describe('truth.3d-projection: pies', () => {
  it('a pie squashed to half its height (tilted 60°) is reported with the drawn angles of an orthographic view', () => {
    const shares = [30, 25, 45];
    const u = understandPie(pieChart({ shares, colors: OKABE_ITO, squash: 0.5 }));
    expect(u.analysis.chart.pie?.ellipse?.tilt).toBeCloseTo(Math.PI / 3, 2);
    const f = check(threeDProjection, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/tilted 60°/);
    // Orthographic squash by k: a direction θ (clockwise from 12) is drawn at atan2(sin θ, k cos θ).
    const k = 0.5;
    const page = (t: number) => {
      const a = Math.atan2(Math.sin(t), k * Math.cos(t));
      return a < 0 ? a + 2 * Math.PI : a;
    };
    let t = 0;
    const expected = shares.map((s) => {
      const t0 = t;
      t += (s / 100) * 2 * Math.PI;
      const a0 = page(t0);
      let a1 = page(t);
      if (a1 <= a0) a1 += 2 * Math.PI;
      return (a1 - a0) / (2 * Math.PI);
    });
    const wedges = f[0]!.measures.wedges as Record<string, number>[];
    const got = [...wedges].sort((a, b) => a.trueShare - b.trueShare);
    const want = shares.map((s, i) => ({ s: s / 100, d: expected[i]! })).sort((a, b) => a.s - b.s);
    got.forEach((w, i) => {
      expect(w.trueShare).toBeCloseTo(want[i]!.s, 2);
      expect(w.drawnAngleShare).toBeCloseTo(want[i]!.d, 2);
      // An orthographic view keeps area ratios: the apparent (area) share stays the true one.
      expect(w.apparentShare).toBeCloseTo(want[i]!.s, 2);
    });
  });

  it('a flat pie is not reported', () => {
    const u = understandPie(pieChart({ shares: [30, 25, 45], colors: OKABE_ITO }));
    expect(u.analysis.chart.pie).not.toBeNull();
    expect(u.measures.projection.pie).toBeNull();
    expect(check(threeDProjection, u)).toEqual([]);
  });
});

describe('truth.3d-projection: extruded bars', () => {
  // Four bars drawn with a receding side face and a top face (oblique projection, depth d).
  const heights = [120, 200, 160, 90];
  const d = 18;
  const body: string[] = [];
  heights.forEach((h, i) => {
    const x0 = 80 + i * 90;
    const x1 = x0 + 50;
    body.push(`<path d="M${x0},340 L${x1},340 L${x1},${340 - h} L${x0},${340 - h} Z" fill="#4477aa"/>`);
    body.push(`<path d="M${x1},340 L${x1 + d},${340 - d} L${x1 + d},${340 - h - d} L${x1},${340 - h} Z" fill="#2a4a70"/>`);
    body.push(`<path d="M${x0},${340 - h} L${x1},${340 - h} L${x1 + d},${340 - h - d} L${x0 + d},${340 - h - d} Z" fill="#7799cc"/>`);
  });
  const text = svg(body.join(''));

  it('the share of extrusion faces is their area over all bar faces, and is reported as a warning', () => {
    const u = understand(text);
    const chart = u.analysis.chart;
    // The faces are known by construction (items 2, 3 of each bar after the page rect); hand them over
    // as the classifier's `extrusions` contract describes, so the rule is tested on its own.
    const faces: number[] = [];
    const fronts: number[] = [];
    heights.forEach((_, i) => {
      fronts.push(1 + 3 * i);
      faces.push(2 + 3 * i, 3 + 3 * i);
    });
    chart.extrusions = faces;
    for (const i of faces) chart.roles[i] = { role: 'decoration', sub: 'decoration/3d-face' };
    for (const i of fronts) chart.roles[i] = { role: 'mark', sub: 'mark/bar' };
    u.measures.projection = measureProjection(chart);
    // Side face: parallelogram of vertical side h and horizontal offset d → area h·d; top: 50·d; front: 50·h.
    const ext = heights.reduce((s, h) => s + h * d + 50 * d, 0);
    const front = heights.reduce((s, h) => s + 50 * h, 0);
    expect(u.measures.projection.bars?.share).toBeCloseTo(ext / (ext + front), 6);
    const f = check(threeDProjection, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.message).toMatch(/^Bars are drawn with depth: 3\d% of their area/);
  });
});

describe('truth.dual-axis', () => {
  it('two value axes with different scales are reported', () => {
    const u = understand(
      lineChart({
        series: [[10, 40, 30, 50]],
        colors: ['#0072b2'],
        lo: 0,
        hi: 60,
        ticks: [0, 20, 40, 60],
        right: { series: [[0.2, 0.3, 0.1, 0.4]], colors: ['#d55e00'], lo: 0, hi: 0.5, ticks: [0, 0.1, 0.2, 0.3, 0.4, 0.5] },
      }),
    );
    expect(u.analysis.chart.axes.y2).not.toBeNull();
    const f = check(dualAxis, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/^Two value axes with different scales/);
  });

  it('one value axis is not reported', () => {
    const u = understand(lineChart({ series: [[10, 40, 30, 50]], colors: ['#0072b2'], lo: 0, hi: 60, ticks: [0, 20, 40, 60] }));
    expect(check(dualAxis, u)).toEqual([]);
  });

  it('the same scale repeated on the right (mirrored ticks) is not two scales', () => {
    const u = understand(
      lineChart({
        series: [[10, 40, 30, 50]],
        colors: ['#0072b2'],
        lo: 0,
        hi: 60,
        ticks: [0, 20, 40, 60],
        right: { series: [], colors: [], lo: 0, hi: 60, ticks: [0, 20, 40, 60] },
      }),
    );
    expect(check(dualAxis, u)).toEqual([]);
  });
});

describe('truth.radius-encoding', () => {
  it('a rose with radii 40…120 has lie factor r + 1 = 4 between its smallest and largest wedge', () => {
    // source: tufte.json derivedCheckCases "area of a 2-D icon scaled in both dimensions by r": LF = r + 1 (computed)
    const u = understandPie(pieChart({ shares: [1, 1, 1, 1], radii: [40, 80, 120, 60], colors: OKABE_ITO }));
    expect(u.analysis.chart.pie?.radiusVaries).toBe(true);
    const f = check(radiusEncoding, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.lieFactor).toBeCloseTo(4, 1);
    expect(f[0]!.message).toMatch(/looks 9× the smallest by area; the radii say 3×/);
  });

  it('an ordinary pie (one radius) is not reported', () => {
    const u = understandPie(pieChart({ shares: [20, 30, 50], colors: OKABE_ITO }));
    expect(check(radiusEncoding, u)).toEqual([]);
  });
});
