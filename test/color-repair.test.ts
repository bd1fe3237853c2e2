import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { contrastRatio, deltaE00, pairwiseConfusion, parseColor, repairPalette, toOklch, type Rgba } from '../engine/color/index.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const c = (s: string) => parseColor(s)!;
const WHITE = c('#ffffff');

/** Smallest ΔE00 over all pairs under simulated protan, deutan and tritan vision (severity 1). */
function worstSimulated(colors: Rgba[]): number {
  const w = pairwiseConfusion(colors).worst;
  return Math.min(w.protan!.deltaE, w.deutan!.deltaE, w.tritan!.deltaE);
}

function hueShift(a: Rgba, b: Rgba): number {
  const d = Math.abs(toOklch(a).h - toOklch(b).h) % 360;
  return Math.min(d, 360 - d);
}

// source: Okabe, M. & Ito, K. (2002), "Color Universal Design (CUD): How to make figures and
// presentations that are friendly to colorblind people" — hex values from memory:
const OKABE_ITO = ['#E69F00', '#56B4E9', '#009E73', '#F0E442', '#0072B2', '#D55E00', '#CC79A7', '#000000'].map(c);

// A deliberately confusable red/green-heavy palette, constructed here (no source): the first two
// are the red and green of ../shared/real-charts/mpl-grouped-bar-redgreen-01.svg, the rest are
// reds, oranges and greens of similar lightness.
const RED_GREEN = ['#dd3322', '#559922', '#cc6600', '#669900', '#aa4444', '#338833', '#ee8844', '#99bb33'].map(c);

describe('repairPalette benchmark against Okabe & Ito', () => {
  for (let n = 3; n <= 8; n++) {
    it(`n = ${n}: repaired worst simulated pair ≥ Okabe–Ito's first ${n}, contrast ≥ 3:1 on white`, () => {
      const before = RED_GREEN.slice(0, n);
      const after = repairPalette(before, WHITE);
      expect(after).toHaveLength(n);
      const target = worstSimulated(OKABE_ITO.slice(0, n));
      expect(worstSimulated(before)).toBeLessThan(target); // the start really is confusable
      expect(worstSimulated(after)).toBeGreaterThanOrEqual(target);
      // source: WCAG 2.x SC 1.4.11, 3:1 for graphical objects
      for (const x of after) expect(contrastRatio(x, WHITE)).toBeGreaterThanOrEqual(3);
      for (const x of after) for (const v of [x.r, x.g, x.b]) expect(v >= 0 && v <= 1).toBe(true);
    });
  }
});

describe('repairPalette behaviour', () => {
  it('is deterministic for a given random state', () => {
    const a = repairPalette(RED_GREEN.slice(0, 4), WHITE);
    const b = repairPalette(RED_GREEN.slice(0, 4), WHITE);
    expect(a).toEqual(b);
    expect(repairPalette(RED_GREEN.slice(0, 4), WHITE, { randomState: 7 })).not.toEqual(a);
  });

  it('keeps a palette that is already well separated and legible', () => {
    // Okabe–Ito blue, vermillion, black: all above 3:1 on white and far apart in every simulation.
    const good = [c('#0072B2'), c('#D55E00'), c('#000000')];
    const out = repairPalette(good, WHITE);
    out.forEach((x, k) => expect(deltaE00(x, good[k])).toBeLessThan(1));
  });

  it('red vs green: separates them for deuteranopia while keeping red red and green green', () => {
    const before = [c('#dd3322'), c('#559922')];
    const after = repairPalette(before, WHITE);
    expect(pairwiseConfusion(before).worst.deutan!.deltaE).toBeLessThan(3);
    expect(pairwiseConfusion(after).worst.deutan!.deltaE).toBeGreaterThan(12);
    // Within 30° of OKLCh hue each stays in its hue family (plumbline's tolerance, no source).
    after.forEach((x, k) => expect(hueShift(x, before[k])).toBeLessThan(30));
  });

  it('keeps alpha and order; leaves one colour alone; validates input', () => {
    const out = repairPalette([{ ...c('#dd3322'), alpha: 0.6 }, c('#559922')], WHITE);
    expect(out[0].alpha).toBe(0.6);
    expect(out[1].alpha).toBe(1);
    expect(repairPalette([c('#dd3322')], WHITE)).toEqual([c('#dd3322')]);
    expect(() => repairPalette(Array.from({ length: 30 }, () => c('#dd3322')), WHITE)).toThrow(/at most 24/);
    expect(() => repairPalette(RED_GREEN, WHITE, { iterations: -1 })).toThrow(RangeError);
    expect(() => repairPalette(RED_GREEN, WHITE, { severity: 2 })).toThrow(RangeError);
    // @ts-expect-error runtime guard
    expect(() => repairPalette(RED_GREEN, 'white')).toThrow(TypeError);
  });

  it('keeps contrast on a dark background too', () => {
    const black = c('#000000');
    const out = repairPalette(RED_GREEN.slice(0, 5), black);
    for (const x of out) expect(contrastRatio(x, black)).toBeGreaterThanOrEqual(3);
    expect(worstSimulated(out)).toBeGreaterThan(worstSimulated(RED_GREEN.slice(0, 5)));
  });
});

describe('repairPalette on the real charts with planted CVD confusion', () => {
  interface Chart { file: string; planted: string[]; series?: { color: string | null; points: { color?: string }[] }[] }
  const manifest = JSON.parse(
    fs.readFileSync(path.resolve(repoRoot, '../shared/real-charts/manifest.json'), 'utf8'),
  ) as Chart[];
  const palette = (m: Chart) => {
    const s = (m.series ?? []).map((x) => x.color).filter((x): x is string => typeof x === 'string');
    return (s.length > 1 ? s : (m.series ?? []).flatMap((x) => x.points.map((p) => p.color)).filter((x): x is string => !!x)).map(c);
  };
  // source: manifest.json 'planted: cvd-confusable' (ground truth); target = Okabe–Ito's worst simulated
  // pair for 8 colours, the benchmark above
  const target = worstSimulated(OKABE_ITO);
  it.each(manifest.filter((m) => m.planted.includes('cvd-confusable')).map((m) => [m.file, m] as const))(
    '%s: repaired palette reaches the Okabe–Ito level',
    (_f, chart) => {
      // ggplot2's theme_gray draws on a #EBEBEB panel; the others on white.
      const bg = chart.planted.includes('background-fill') ? c('#EBEBEB') : WHITE;
      const before = palette(chart);
      const after = repairPalette(before, bg);
      expect(worstSimulated(before)).toBeLessThan(target);
      expect(worstSimulated(after)).toBeGreaterThanOrEqual(target);
      for (const x of after) expect(contrastRatio(x, bg)).toBeGreaterThanOrEqual(3);
    },
  );
});
