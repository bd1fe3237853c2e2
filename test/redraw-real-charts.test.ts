/**
 * Redraw on every chart of ../shared/real-charts, in memory, with the fixes
 * of the rules that fire (checks in redraw-real-charts-check.ts), and a
 * tilted pie redrawn flat against the manifest's true shares. Prints
 * per-chart fixes, verification numbers and textual diff sizes.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import { parseColor } from '../engine/color/parse-color.js';
import { redrawText } from '../engine/redraw/redraw.js';
import { check, rows } from './redraw-real-charts-check.js';
import { loadManifest, readChart } from './support/real-charts.js';

const manifest = loadManifest();

afterAll(() => {
  rows.sort();
  console.log(rows.join('\n'));
});

describe('redraw on the real charts', () => {
  for (const t of manifest) {
    it(`${t.file}: fixes of the rules that fire keep the data`, () => {
      const text = readChart(t.file);
      check(t.file, text, redrawText(text, t.file), 'fired');
    });
  }

  it('a tilted pie redrawn flat shows the true shares of the manifest', () => {
    const t = manifest.find((m) => m.kind === 'pie3d')!;
    const text = readChart(t.file);
    const r = redrawText(text, t.file, { only: ['truth.3d-projection'] });
    expect(r.applied.map((a) => a.rule)).toEqual(['truth.3d-projection']);
    const after = analyzeSvg(r.output);
    // source: manifest.json ground truth (the data the pie was drawn from), wedges matched by their colour
    const points = t.series[0]!.points;
    const total = points.reduce((s, p) => s + (p.y as number), 0);
    const areas = points.map((p) => {
      const c = parseColor(p.color!)!;
      const same = after.scene.items.filter(
        (it) => it.kind === 'shape' && it.fill.color && Math.max(Math.abs(it.fill.color.r - c.r), Math.abs(it.fill.color.g - c.g), Math.abs(it.fill.color.b - c.b)) < 2 / 255,
      );
      return Math.max(0, ...same.map((it) => (it.kind === 'shape' ? it.area : 0)));
    });
    const sum = areas.reduce((s, a) => s + a, 0);
    const worst = Math.max(...points.map((p, k) => Math.abs(areas[k]! / sum - (p.y as number) / total) * 100));
    expect(worst).toBeLessThanOrEqual(0.5);
    // The drawn pie before: its visible areas were off by more than that.
    const before = analyzeSvg(text);
    const wedgeAreas = before.chart.pie!.wedges.map((w) => (before.scene.items[w.item] as { area: number }).area);
    const sumBefore = wedgeAreas.reduce((s, a) => s + a, 0);
    const shares = points.map((p) => (p.y as number) / total).sort((a, b) => a - b);
    const drawn = wedgeAreas.map((a) => a / sumBefore).sort((a, b) => a - b);
    expect(Math.max(...shares.map((s, k) => Math.abs(s - drawn[k]!) * 100))).toBeGreaterThan(0.5);
  });
});
