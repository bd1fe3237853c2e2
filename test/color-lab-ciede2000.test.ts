import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { deltaE00, parseColor, toLab65, toOklab, type Lab, type Rgba } from '../engine/color/index.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const reference = (name: string) =>
  JSON.parse(fs.readFileSync(path.resolve(repoRoot, '../shared/reference', name), 'utf8'));

function random(state: number): () => number {
  let a = state >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const lab = (l: number, a: number, b: number): Lab => ({ space: 'lab65', l, a, b });

describe('deltaE00 against Sharma, Wu & Dalal (2005)', () => {
  interface SharmaPair { pair: number; L1: number; a1: number; b1: number; L2: number; a2: number; b2: number; dE00: number }
  const table = reference('ciede2000-sharma2005.json') as { pairs: SharmaPair[] };

  it('has all 34 pairs', () => {
    expect(table.pairs).toHaveLength(34);
  });

  // source: Sharma, Wu & Dalal 2005, Table 1 (34 pairs, kL = kC = kH = 1), via ../shared/reference
  it.each(table.pairs.map((p) => [p.pair, p] as const))('pair %i within 1e-4, both orders', (_n, p) => {
    const x = lab(p.L1, p.a1, p.b1);
    const y = lab(p.L2, p.a2, p.b2);
    expect(Math.abs(deltaE00(x, y) - p.dE00)).toBeLessThan(1e-4);
    expect(Math.abs(deltaE00(y, x) - p.dE00)).toBeLessThan(1e-4);
  });
});

describe('toLab65 against CSS Color 4 sample values', () => {
  interface Row { hex: string; labD65: [number, number, number] }
  const rows = (reference('srgb-cielab.json') as { values: Row[] }).values;
  // source: CSS Color 4 conversions.js worked values (D65 column), ../shared/reference/srgb-cielab.json
  it.each(rows.map((r) => [r.hex, r] as const))('%s', (_h, r) => {
    const c = toLab65(parseColor(r.hex)!);
    expect(c.l).toBeCloseTo(r.labD65[0], 3);
    expect(c.a).toBeCloseTo(r.labD65[1], 3);
    expect(c.b).toBeCloseTo(r.labD65[2], 3);
  });
});

describe('cross-check with colorjs.io on random colours', () => {
  const rand = random(20240611);
  const colours: Rgba[] = Array.from({ length: 300 }, () => ({ r: rand(), g: rand(), b: rand(), alpha: 1 }));

  it('Lab D65 matches colorjs.io lab-d65', () => {
    // source: colorjs.io 0.7.1 'lab-d65' space (npm reference library)
    let worst = 0;
    for (const c of colours) {
      const ours = toLab65(c);
      const ref = new Color('srgb', [c.r, c.g, c.b]).to('lab-d65').coords as number[];
      worst = Math.max(worst, Math.abs(ours.l - ref[0]), Math.abs(ours.a - ref[1]), Math.abs(ours.b - ref[2]));
    }
    expect(worst).toBeLessThan(1e-6);
  });

  it('OKLab matches colorjs.io oklab', () => {
    // source: colorjs.io 0.7.1 'oklab' space (npm reference library)
    let worst = 0;
    for (const c of colours) {
      const ours = toOklab(c);
      const ref = new Color('srgb', [c.r, c.g, c.b]).to('oklab').coords as number[];
      worst = Math.max(worst, Math.abs(ours.l - ref[0]), Math.abs(ours.a - ref[1]), Math.abs(ours.b - ref[2]));
    }
    expect(worst).toBeLessThan(1e-6);
  });

  it('ΔE00 matches colorjs.io when colorjs is given the same D65 Lab coordinates', () => {
    // source: colorjs.io 0.7.1 deltaE2000 (npm reference library). colorjs.io computes
    // ΔE2000 in its 'lab' space (D50); feeding it our D65 Lab numbers as coordinates
    // compares the formula alone, like with like.
    let worst = 0;
    for (let k = 0; k + 1 < colours.length; k += 2) {
      const p = toLab65(colours[k]);
      const q = toLab65(colours[k + 1]);
      const ref = new Color('lab', [p.l, p.a, p.b]).deltaE2000(new Color('lab', [q.l, q.a, q.b]));
      worst = Math.max(worst, Math.abs(deltaE00(colours[k], colours[k + 1]) - ref));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('documents that colorjs.io ΔE2000 on sRGB colours uses D50 Lab and differs', () => {
    // source: ../shared/reference/REFERENCES.md §1 — #e41a1c vs #377eb8 is 48.98 in D65 Lab
    // (culori) and 52.54 in D50 Lab (colorjs.io).
    const a = parseColor('#e41a1c')!;
    const b = parseColor('#377eb8')!;
    expect(deltaE00(a, b)).toBeCloseTo(48.98, 2);
    expect(new Color('#e41a1c').deltaE2000(new Color('#377eb8'))).toBeCloseTo(52.54, 2);
  });
});

describe('deltaE00 input checks', () => {
  it('rejects OKLab values and malformed input clearly', () => {
    const ok = toOklab(parseColor('red')!);
    // @ts-expect-error OKLab is not accepted
    expect(() => deltaE00(ok, parseColor('blue')!)).toThrow(/lab65/);
    expect(() => deltaE00(lab(NaN, 0, 0), lab(50, 0, 0))).toThrow(TypeError);
    // @ts-expect-error runtime guard
    expect(() => deltaE00(null, lab(50, 0, 0))).toThrow(TypeError);
  });
  it('is zero for identical colours and symmetric', () => {
    const a = parseColor('#1f77b4')!;
    const b = parseColor('#ff7f0e')!;
    expect(deltaE00(a, a)).toBe(0);
    expect(deltaE00(a, b)).toBeCloseTo(deltaE00(b, a), 12);
  });
});
