import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { deltaE00, parseColor, pairwiseConfusion, simulateCvd } from '../engine/color/index.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
interface ManifestChart {
  file: string;
  planted: string[];
  notes: string;
  series?: { color: string | null; points: { color?: string }[] }[];
}
const manifest = JSON.parse(
  fs.readFileSync(path.resolve(repoRoot, '../shared/real-charts/manifest.json'), 'utf8'),
) as ManifestChart[];
const c = (s: string) => parseColor(s)!;

/** Category colours of a chart as its manifest lists them (series colours, else per-point colours). */
function paletteOf(chart: ManifestChart): string[] {
  const series = (chart.series ?? []).map((s) => s.color).filter((x): x is string => typeof x === 'string');
  if (series.length > 1) return series;
  return (chart.series ?? []).flatMap((s) => s.points.map((p) => p.color)).filter((x): x is string => typeof x === 'string');
}

describe('pairwiseConfusion', () => {
  it('lists every pair once, in order, with ΔE00 per vision', () => {
    const cols = ['#1f77b4', '#ff7f0e', '#2ca02c', '#d62728'].map(c);
    const r = pairwiseConfusion(cols);
    expect(r.pairs.map((p) => [p.i, p.j])).toEqual([[0, 1], [0, 2], [0, 3], [1, 2], [1, 3], [2, 3]]);
    for (const p of r.pairs) {
      expect(p.normal).toBeCloseTo(deltaE00(cols[p.i], cols[p.j]), 12);
      expect(p.deutan).toBeCloseTo(deltaE00(simulateCvd(cols[p.i], 'deutan'), simulateCvd(cols[p.j], 'deutan')), 12);
    }
    for (const v of ['normal', 'protan', 'deutan', 'tritan'] as const) {
      expect(r.worst[v]!.deltaE).toBe(Math.min(...r.pairs.map((p) => p[v])));
    }
  });

  it('returns no pairs and null worst entries for fewer than two colours', () => {
    expect(pairwiseConfusion([c('red')])).toEqual({ pairs: [], worst: { normal: null, protan: null, deutan: null, tritan: null } });
    expect(() => pairwiseConfusion([c('red'), { r: 1, g: 0, b: NaN, alpha: 1 }])).toThrow(/colours\[1\]/);
  });

  it('composites translucent colours over a given background', () => {
    const half = { r: 1, g: 0, b: 0, alpha: 0.5 };
    const white = c('#fff');
    const r = pairwiseConfusion([half, white], { background: white });
    expect(r.pairs[0].normal).toBeCloseTo(deltaE00(c('#ff8080'), white), 0);
    expect(r.pairs[0].normal).toBeLessThan(pairwiseConfusion([half, white]).pairs[0].normal);
  });

  it('milder severity separates red/green more than dichromacy', () => {
    const cols = [c('#dd3322'), c('#559922')];
    const full = pairwiseConfusion(cols).pairs[0].deutan;
    const mild = pairwiseConfusion(cols, { severity: 0.3 }).pairs[0].deutan;
    expect(mild).toBeGreaterThan(full);
  });
});

describe('pairwiseConfusion on the real charts with planted CVD confusion', () => {
  const planted = manifest.filter((m) => m.planted.includes('cvd-confusable'));
  it('finds the five planted charts', () => {
    expect(planted.length).toBe(5);
  });
  // source: ../shared/real-charts/manifest.json notes — "Most confusable pair: A vs B (CIEDE2000
  // normal x, protan y, deutan z)", the chart generator's ground truth, printed to 1 dp
  it.each(planted.map((m) => [m.file, m] as const))('%s', (_f, chart) => {
    const m = /Most confusable pair: (#[0-9a-f]{6}) vs (#[0-9a-f]{6}) \(CIEDE2000 normal ([\d.]+), protan ([\d.]+), deutan ([\d.]+)\)/i.exec(chart.notes);
    expect(m).not.toBeNull();
    const [, a, b, normal, protan, deutan] = m!;
    const palette = paletteOf(chart).map((h) => h.toLowerCase());
    expect(palette.length).toBeGreaterThan(1);
    const r = pairwiseConfusion(palette.map(c));
    const ia = palette.indexOf(a.toLowerCase());
    const ib = palette.indexOf(b.toLowerCase());
    const pair = r.pairs.find((p) => (p.i === Math.min(ia, ib) && p.j === Math.max(ia, ib)))!;
    expect(Math.abs(pair.normal - Number(normal))).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(Math.abs(pair.protan - Number(protan))).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(Math.abs(pair.deutan - Number(deutan))).toBeLessThanOrEqual(0.05 + 1e-9);
    // The planted pair is the one deuteranopia confuses most.
    expect([r.worst.deutan!.i, r.worst.deutan!.j]).toEqual([pair.i, pair.j]);
  });

  it('red–green worst pair separates planted from unplanted charts without a threshold', () => {
    // source: ../shared/real-charts/manifest.json 'planted' lists (ground truth)
    const rg = (m: ManifestChart) => {
      const w = pairwiseConfusion(paletteOf(m).map(c)).worst;
      return Math.min(w.protan!.deltaE, w.deutan!.deltaE);
    };
    const multi = manifest.filter((m) => paletteOf(m).length > 1);
    const yes = multi.filter((m) => m.planted.includes('cvd-confusable')).map(rg);
    const no = multi.filter((m) => !m.planted.includes('cvd-confusable')).map(rg);
    expect(yes.length).toBe(5);
    expect(no.length).toBeGreaterThan(15);
    expect(Math.max(...yes)).toBeLessThan(Math.min(...no));
  });
});
