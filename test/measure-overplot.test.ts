/**
 * Overplotting measure: overlapping and hidden point marks.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import type { Chart } from '../engine/classify/chart.js';
import { HIDDEN_BELOW, measureOverplot } from '../engine/measure/overplot.js';

function points(circles: string[]): Chart {
  const { chart } = analyzeSvg(`<svg xmlns="http://www.w3.org/2000/svg" width="400" height="400" viewBox="0 0 400 400">${circles.join('')}</svg>`);
  chart.roles = chart.scene.items.map(() => ({ role: 'mark', sub: 'mark/point' }));
  return chart;
}
const dot = (x: number, y: number, r = 3, opacity = 1) => `<circle cx="${x}" cy="${y}" r="${r}" fill="#000" fill-opacity="${opacity}"/>`;

describe('overplotting measure', () => {
  it('finds no overlap on a sparse lattice', () => {
    const list: string[] = [];
    for (let i = 0; i < 10; i++) for (let j = 0; j < 10; j++) list.push(dot(20 + i * 30, 20 + j * 30));
    const m = measureOverplot(points(list));
    expect(m.points).toBe(100);
    expect(m.overlapShare).toBe(0);
    expect(m.hiddenShare).toBe(0);
  });

  it('counts rim overlaps as overlap but not as hidden', () => {
    // computed: centres 5 apart, radii 3: the disks overlap (5 < 6) but neither centre is covered (5 > 3)
    const m = measureOverplot(points([dot(100, 100), dot(105, 100), dot(300, 300)]));
    expect(m.overlapping).toBe(2);
    expect(m.hidden).toBe(0);
  });

  it('hides the points under an opaque point', () => {
    const m = measureOverplot(points([dot(100, 100), dot(100, 100), dot(101, 100)]));
    // The last one painted shows; the two below have their centres covered.
    expect(m.hidden).toBe(2);
    expect(m.overlapShare).toBe(1);
  });

  it('lets translucent points show through until less than a tenth passes', () => {
    // computed: at opacity 0.5, k points over a centre pass 0.5^k: 4 → 0.0625 < 0.1, 3 → 0.125
    expect(HIDDEN_BELOW).toBe(0.1);
    const four = measureOverplot(points(Array.from({ length: 4 }, () => dot(100, 100, 3, 0.5))));
    expect(four.hidden).toBe(0); // the bottom one is under three others: 0.125 passes
    const five = measureOverplot(points(Array.from({ length: 5 }, () => dot(100, 100, 3, 0.5))));
    expect(five.hidden).toBe(1);
    expect(five.meanOpacity).toBeCloseTo(0.5, 12);
  });

  it('ignores items that are not point marks', () => {
    const chart = points([dot(100, 100), dot(100, 100)]);
    chart.roles[0] = { role: 'mark', sub: 'mark/bar' };
    expect(measureOverplot(chart).points).toBe(1);
  });
});
