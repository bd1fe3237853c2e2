/**
 * color.nonmonotonic-ramp: the lightness shape of well-known colour maps,
 * and the rule on small heatmaps drawn here with a colour bar.
 */
import { describe, expect, it } from 'vitest';
import { formatHex } from '../engine/color/format-hex.js';
import { parseColor } from '../engine/color/parse-color.js';
import { describe as describeRamp } from '../engine/measure/color-ramp.js';
import { nonmonotonicRamp } from '../engine/rules/color/nonmonotonic-ramp.js';
import { check, heatmap, understand } from './support/rules-svg.js';

/** matplotlib's "jet" from its piecewise-linear segment data — from memory. */
function jet(n: number): string[] {
  const seg = {
    r: [[0, 0], [0.35, 0], [0.66, 1], [0.89, 1], [1, 0.5]],
    g: [[0, 0], [0.125, 0], [0.375, 1], [0.64, 1], [0.91, 0], [1, 0]],
    b: [[0, 0.5], [0.11, 1], [0.34, 1], [0.65, 0], [1, 0]],
  };
  const at = (pts: number[][], t: number) => {
    for (let k = 1; k < pts.length; k++) {
      const [t0, v0] = pts[k - 1]!;
      const [t1, v1] = pts[k]!;
      if (t <= t1!) return v0! + ((v1! - v0!) * (t - t0!)) / (t1! - t0!);
    }
    return pts[pts.length - 1]![1]!;
  };
  return Array.from({ length: n }, (_, i) => {
    const t = i / (n - 1);
    return formatHex({ r: at(seg.r, t), g: at(seg.g, t), b: at(seg.b, t), alpha: 1 });
  });
}
// source: matplotlib "viridis" sampled at 10 steps — from memory
const VIRIDIS = ['#440154', '#482878', '#3e4989', '#31688e', '#26828e', '#1f9e89', '#35b779', '#6ece58', '#b5de2b', '#fde725'];
// source: ColorBrewer "RdBu", 11 classes (diverging) — from memory
const RDBU = ['#67001f', '#b2182b', '#d6604d', '#f4a582', '#fddbc7', '#f7f7f7', '#d1e5f0', '#92c5de', '#4393c3', '#2166ac', '#053061'];
// source: ColorBrewer "Greys", 9 classes (sequential) — from memory
const GREYS = ['#ffffff', '#f0f0f0', '#d9d9d9', '#bdbdbd', '#969696', '#737373', '#525252', '#252525', '#000000'];

const rgba = (list: string[]) => list.map((c) => parseColor(c)!);
const values = [
  [1, 2, 3, 4, 5],
  [2, 3, 4, 5, 6],
  [3, 4, 5, 6, 7],
];

describe('ramp lightness shape', () => {
  it('jet is irregular; viridis and greys are sequential; RdBu is diverging', () => {
    // Rainbow/jet maps are not lightness-monotonic (Borland & Taylor 2007, from memory); viridis was designed to be.
    expect(describeRamp('colorbar', [], rgba(jet(64)), 5).shape).toBe('irregular');
    expect(describeRamp('colorbar', [], rgba(VIRIDIS), 5).shape).toBe('sequential');
    expect(describeRamp('colorbar', [], rgba(GREYS), 5).shape).toBe('sequential');
    const d = describeRamp('colorbar', [], rgba(RDBU), 5);
    expect(d.shape).toBe('diverging');
    expect(d.turningPoint).toBe(5);
  });

  it('a ramp whose lightness dips by less than the tolerance stays sequential', () => {
    // L* of these greys is about 90, 71, 72.5 (a step back of about 2), 40, 20: within a tolerance of 5, not of 1.
    const dip = ['#e2e2e2', '#ababab', '#b0b0b0', '#5e5e5e', '#303030'];
    expect(describeRamp('colorbar', [], rgba(dip), 5).shape).toBe('sequential');
    expect(describeRamp('colorbar', [], rgba(dip), 1).shape).toBe('irregular');
  });
});

describe('color.nonmonotonic-ramp', () => {
  it('a heatmap coloured with jet is reported', () => {
    const u = understand(heatmap(jet(16), values, 0, 8));
    expect(u.measures.ramp?.source).toBe('colorbar');
    const f = check(nonmonotonicRamp, u);
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/lightness is not monotonic/);
    expect(f[0]!.measures.largestReversal as number).toBeGreaterThan(30);
  });

  it('heatmaps coloured with viridis or RdBu are not reported', () => {
    for (const ramp of [VIRIDIS, RDBU]) {
      const u = understand(heatmap(ramp, values, 0, 8));
      expect(u.measures.ramp).not.toBeNull();
      expect(check(nonmonotonicRamp, u)).toEqual([]);
    }
  });
});
