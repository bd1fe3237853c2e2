/**
 * Scaling of the spatial measures: label collisions (grid of cells), point
 * overplotting (spatial hash) and ink visibility (cell grid), each timed on
 * n and 4n items; the baseline is the n run of the same measure. Linear
 * work prints a time ratio near 4× (per-item ratio near 1×); quadratic work
 * would print 16×.
 *
 *   node --import tsx bench/measure-scaling.ts
 */
import os from 'node:os';
import { pathToFileURL } from 'node:url';
import { analyzeSvg } from '../engine/audit/analyze.js';
import { measureOverplot } from '../engine/measure/overplot.js';
import { findCollisions, textQuad } from '../engine/measure/text.js';
import { visibilityOf } from '../engine/measure/visibility.js';
import type { TextItem } from '../engine/read/scene.js';
import { median, timeIt } from './timing.js';

/** A deterministic pseudo-random sequence (LCG), so that runs compare. */
function lcg(start: number): () => number {
  let s = start >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function labelsSvg(n: number): string {
  const rnd = lcg(7);
  const side = Math.sqrt(n) * 60;
  const body: string[] = [];
  for (let i = 0; i < n; i++) body.push(`<text x="${(rnd() * side).toFixed(1)}" y="${(rnd() * side).toFixed(1)}" font-size="10">L${i % 1000}</text>`);
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${side}" height="${side}" viewBox="0 0 ${side} ${side}">${body.join('')}</svg>`;
}

function pointsSvg(n: number): string {
  const rnd = lcg(11);
  const side = Math.sqrt(n) * 12;
  const body: string[] = [];
  for (let i = 0; i < n; i++) body.push(`<circle cx="${(rnd() * side).toFixed(2)}" cy="${(rnd() * side).toFixed(2)}" r="3" fill="#1f77b4"/>`);
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${side}" height="${side}" viewBox="0 0 ${side} ${side}">${body.join('')}</svg>`;
}

function timeMedian(fn: () => unknown, runs = 5): number {
  return median(Array.from({ length: runs }, () => timeIt(fn)));
}

export async function run(): Promise<void> {
  const n = 5_000;
  const sizes = [n, 4 * n];
  const rows: { name: string; t: number[] }[] = [];

  const labelScenes = sizes.map((k) => {
    const { chart } = analyzeSvg(labelsSvg(k));
    const items = chart.scene.items.filter((it): it is TextItem => it.kind === 'text');
    return { items, quads: items.map(textQuad) };
  });
  rows.push({ name: 'label collisions', t: labelScenes.map((s) => timeMedian(() => findCollisions(s.items, s.quads, 0.5))) });

  const pointCharts = sizes.map((k) => {
    const { chart } = analyzeSvg(pointsSvg(k));
    chart.roles = chart.scene.items.map(() => ({ role: 'mark' as const, sub: 'mark/point' as const }));
    return chart;
  });
  rows.push({ name: 'overplotting', t: pointCharts.map((c) => timeMedian(() => measureOverplot(c))) });
  rows.push({ name: 'ink visibility', t: pointCharts.map((c) => timeMedian(() => visibilityOf(c.scene), 3)) });

  console.log(`[measure-scaling] load average ${os.loadavg().map((x) => x.toFixed(1)).join(' ')}`);
  for (const r of rows) {
    const ratio = r.t[1]! / r.t[0]!;
    console.log(
      `[measure-scaling] ${r.name}: ${n} items ${r.t[0]!.toFixed(1)} ms, ${4 * n} items ${r.t[1]!.toFixed(1)} ms — ${ratio.toFixed(2)}× time for 4× items (per item ${(ratio / 4).toFixed(2)}×; linear ≈ 1×, quadratic ≈ 4×)`,
    );
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await run();
