/**
 * Chart understanding on real output of five plotting libraries, scored
 * against the ground truth shipped with the charts (../shared/real-charts/manifest.json).
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import { expectedKind, generatorOf, loadManifest, pieShareError, readChart, scorePoints } from './support/real-charts.js';

const manifest = loadManifest();
const VALUE_KINDS = new Set(['bar', 'grouped-bar', 'stacked-bar', 'line', 'area', 'scatter', 'bar3d']);
const PIE_KINDS = new Set(['pie', 'donut', 'pie3d']);

interface Row {
  file: string;
  gen: string;
  ok: boolean;
  kindOk: boolean;
  got: string;
  points?: { total: number; matched: number };
  pieErr?: number;
}

function evaluate(): Row[] {
  const rows: Row[] = [];
  for (const t of manifest) {
    const want = expectedKind(t);
    try {
      const { chart } = analyzeSvg(readChart(t.file), { file: t.file });
      const row: Row = {
        file: t.file,
        gen: generatorOf(t),
        ok: true,
        kindOk: chart.kind === want.kind && chart.threeD === want.threeD,
        got: `${chart.kind}${chart.threeD ? '+3d' : ''}`,
      };
      if (VALUE_KINDS.has(t.kind)) row.points = scorePoints(t, chart);
      if (PIE_KINDS.has(t.kind)) row.pieErr = pieShareError(t, chart);
      rows.push(row);
    } catch (err) {
      rows.push({ file: t.file, gen: generatorOf(t), ok: false, kindOk: false, got: `error: ${(err as Error).message}` });
    }
  }
  return rows;
}

describe('chart understanding on real charts', () => {
  const rows = evaluate();
  const table = rows
    .map((r) => {
      const pts = r.points ? `${r.points.matched}/${r.points.total}` : '';
      const pie = r.pieErr !== undefined ? `${r.pieErr.toFixed(2)}pp` : '';
      return `${r.file.padEnd(36)} ${r.kindOk ? 'ok ' : 'BAD'} ${r.got.padEnd(14)} ${pts.padEnd(9)} ${pie}`;
    })
    .join('\n');
  const gens = [...new Set(rows.map((r) => r.gen))];
  const perGen = gens
    .map((g) => {
      const rs = rows.filter((r) => r.gen === g);
      const kind = rs.filter((r) => r.kindOk).length;
      const pr = rs.filter((r) => r.points);
      const good = pr.filter((r) => r.points!.matched >= 0.95 * r.points!.total).length;
      return `${g.padEnd(4)} kind ${kind}/${rs.length}  points ${good}/${pr.length}`;
    })
    .join('\n');
  console.log(`\n${table}\n\n${perGen}\n`);

  it('reads every file', () => {
    expect(rows.filter((r) => !r.ok).map((r) => `${r.file}: ${r.got}`)).toEqual([]);
  });

  it('gets the chart kind (and threeD) right on at least 95% of charts', () => {
    const share = rows.filter((r) => r.kindOk).length / rows.length;
    expect(share).toBeGreaterThanOrEqual(0.95);
  });

  it('recovers 95% of points within 1% of the value span on at least 90% of bar/line/area/scatter charts', () => {
    const pr = rows.filter((r) => r.points);
    const good = pr.filter((r) => r.points!.matched >= 0.95 * r.points!.total).length;
    expect(good / pr.length).toBeGreaterThanOrEqual(0.9);
  });

  it('recovers pie and donut shares within 0.5 percentage points on at least 95% of pies', () => {
    const pies = rows.filter((r) => r.pieErr !== undefined);
    const good = pies.filter((r) => r.pieErr! <= 0.5).length;
    expect(good / pies.length).toBeGreaterThanOrEqual(0.95);
  });
});
