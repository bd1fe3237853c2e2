/**
 * The truth, colour, pie-form and access rules on the real charts of
 * ../shared/real-charts: recall on the problems planted in each chart
 * (manifest.json `planted`) and false alarms on the charts marked `clean`.
 * Prints a table; thresholds are the rules' defaults, not fitted to these files.
 */
import { describe, expect, it } from 'vitest';
import { parseSync } from 'svgson';
import { auditText } from '../engine/audit/audit-file.js';
import type { Finding } from '../engine/report/types.js';
import type { Measures } from '../engine/measure/measures.js';
import type { Chart } from '../engine/classify/chart.js';
import { loadManifest, readChart } from './support/real-charts.js';

/** Planted problem → the rule that should report it, and what the chart model must hold for the rule to see it. */
const TAGS: Record<string, { rule: string; needs: (c: Chart, m: Measures) => boolean; need: string }> = {
  'truncated-baseline': { rule: 'truth.truncated-baseline', needs: (_c, m) => m.baseline !== null, need: 'bars or areas on a fitted value axis' },
  '3d-tilt': { rule: 'truth.3d-projection', needs: (_c, m) => m.projection.pie !== null || m.projection.bars !== null, need: 'a tilted pie or extruded bars' },
  'dual-axis': { rule: 'truth.dual-axis', needs: (c) => c.axes.y2 !== null, need: 'a second value axis' },
  'cvd-confusable': { rule: 'color.cvd-confusable', needs: (_c, m) => m.palette.entries.length >= 2 && !m.palette.continuous, need: 'two or more category colours' },
  'rainbow-ramp': { rule: 'color.nonmonotonic-ramp', needs: (_c, m) => m.ramp !== null, need: 'a colour bar or numeric colour key' },
  'many-slices': { rule: 'form.pie-many-slices', needs: (c) => c.pie !== null, need: 'a pie' },
};
const MINE = /^(truth\.|color\.|form\.pie-many-slices|form\.angle-judgment|access\.)/;
const loud = (f: Finding) => f.severity === 'error' || f.severity === 'warning';

interface Row {
  file: string;
  planted: string[];
  clean: boolean;
  findings: Finding[];
  chart: Chart | null;
  measures: Measures | null;
  rootHasText: boolean;
}

function run(): Row[] {
  return loadManifest().map((t) => {
    const text = readChart(t.file);
    const res = auditText(text, t.file);
    // Independent reading of the root with an npm SVG parser: a text alternative of its own?
    const root = parseSync(text);
    const rootHasText = Boolean(root.attributes['aria-label']?.trim()) || Boolean(root.attributes['aria-labelledby']) || root.children.some((c) => c.name === 'title' || c.name === 'desc');
    return {
      file: t.file,
      planted: t.planted,
      clean: t.clean,
      findings: res.report.findings.filter((f) => MINE.test(f.rule)),
      chart: res.analysis?.chart ?? null,
      measures: res.measures,
      rootHasText,
    };
  });
}

describe('truth/colour/pie/access rules on the real charts', () => {
  const rows = run();

  it('recall on planted problems, false alarms on clean charts (table)', () => {
    const lines: string[] = [];
    const pad = (s: string, n: number) => (s.length >= n ? s : s + ' '.repeat(n - s.length));
    lines.push(`${pad('planted problem', 20)}${pad('rule', 26)}planted  found  recall  model-has-it  found-of-those  false-alarms-elsewhere`);
    let plantedAll = 0;
    let foundAll = 0;
    const missedWithModel: string[] = [];
    for (const [tag, spec] of Object.entries(TAGS)) {
      const planted = rows.filter((r) => r.planted.includes(tag));
      const found = planted.filter((r) => r.findings.some((f) => f.rule === spec.rule && loud(f)));
      const withModel = planted.filter((r) => r.chart && r.measures && spec.needs(r.chart, r.measures));
      const foundWithModel = withModel.filter((r) => found.includes(r));
      for (const r of withModel) if (!found.includes(r)) missedWithModel.push(`${r.file} (${tag})`);
      const elsewhere = rows.filter((r) => !r.planted.includes(tag) && r.findings.some((f) => f.rule === spec.rule && loud(f)));
      plantedAll += planted.length;
      foundAll += found.length;
      lines.push(
        `${pad(tag, 20)}${pad(spec.rule, 26)}${pad(String(planted.length), 9)}${pad(String(found.length), 7)}${pad(`${Math.round((100 * found.length) / Math.max(1, planted.length))}%`, 8)}${pad(String(withModel.length), 14)}${pad(String(foundWithModel.length), 16)}${elsewhere.map((r) => r.file).join(', ') || '-'}`,
      );
      for (const r of planted.filter((p) => !found.includes(p))) {
        lines.push(`    missed ${r.file}: ${withModel.includes(r) ? 'the chart model has it' : `chart model lacks ${spec.need} (kind ${r.chart?.kind ?? 'unread'})`}`);
      }
    }
    const clean = rows.filter((r) => r.clean);
    const alarms = clean.filter((r) => r.findings.some((f) => loud(f) && f.rule !== 'access.missing-description'));
    lines.push(`overall recall ${foundAll}/${plantedAll} = ${Math.round((100 * foundAll) / plantedAll)}%`);
    lines.push(`clean charts with a warning or error from these rules (access aside): ${alarms.length}/${clean.length}${alarms.length ? ' — ' + alarms.map((r) => `${r.file}: ${r.findings.filter(loud).map((f) => f.rule).join(', ')}`).join('; ') : ''}`);
    const notes = clean.map((r) => r.findings.filter((f) => f.severity === 'note').map((f) => f.rule)).flat();
    const byRule = new Map<string, number>();
    for (const n of notes) byRule.set(n, (byRule.get(n) ?? 0) + 1);
    lines.push(`notes on clean charts (not alarms): ${[...byRule].map(([k, v]) => `${k} ×${v}`).join(', ') || 'none'}`);
    console.log(lines.join('\n'));

    // Every planted problem the chart model represents is reported.
    expect(missedWithModel).toEqual([]);
    // At most 10% of the clean charts raise a warning or an error.
    expect(alarms.length).toBeLessThanOrEqual(Math.floor(0.1 * clean.length));
  });

  it('access.missing-description fires exactly on files whose root has no title, desc or aria-label', () => {
    // Reference: the root's attributes and children as read by the svgson parser (npm), not by plumbline.
    const wrong = rows.filter((r) => r.findings.some((f) => f.rule === 'access.missing-description' && loud(f)) === r.rootHasText).map((r) => r.file);
    expect(wrong).toEqual([]);
    expect(rows.filter((r) => !r.rootHasText).length).toBeGreaterThan(0);
  });
});
