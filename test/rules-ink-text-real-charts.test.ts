/**
 * The ink, text and overplotting rules on the real charts of
 * ../shared/real-charts, scored against manifest.json: recall of the planted
 * problems these rules cover, and false alarms on the charts marked clean.
 *
 * Rules whose problem the manifest has no name for (redundant ticks, low
 * data share, label overlap, ragged numerals, mixed precision) are listed
 * for the clean charts but not scored: "clean" there means free of the
 * manifest's problems, not of every problem.
 */
import { describe, expect, it } from 'vitest';
import { auditText } from '../engine/audit/audit-file.js';
import { loadManifest, readChart } from './support/real-charts.js';

/** Planted problem (manifest vocabulary) → the rule that should report it. */
const RULE_FOR: Record<string, string> = {
  'heavy-grid': 'ink.heavy-grid',
  'background-fill': 'ink.background-fill',
  'frame-box': 'ink.frame-box',
  'tiny-text': 'text.too-small',
  'low-contrast-text': 'text.low-contrast',
  overplotting: 'form.overplotting',
  'gradient-fill': 'ink.ornament',
  'drop-shadow': 'ink.ornament',
};
const SCORED = new Set(Object.values(RULE_FOR));
const OTHER = ['ink.redundant-ticks', 'ink.low-data-share', 'text.overlap', 'text.ragged-numerals', 'text.mixed-precision'];

describe('ink, text and overplotting rules on real charts', () => {
  const manifest = loadManifest();
  const fired = new Map<string, Set<string>>();
  for (const t of manifest) {
    const { report } = auditText(readChart(t.file), t.file);
    fired.set(t.file, new Set(report.findings.map((f) => f.rule)));
  }

  it('finds the planted problems (recall ≥ 90%)', () => {
    const rows: string[] = [];
    const byProblem = new Map<string, { hit: number; total: number }>();
    for (const t of manifest) {
      for (const p of t.planted) {
        const rule = RULE_FOR[p];
        if (!rule) continue;
        const hit = fired.get(t.file)!.has(rule);
        const s = byProblem.get(p) ?? { hit: 0, total: 0 };
        s.total++;
        if (hit) s.hit++;
        byProblem.set(p, s);
        rows.push(`${t.file.padEnd(36)} ${p.padEnd(18)} ${rule.padEnd(20)} ${hit ? 'found' : 'MISSED'}`);
      }
    }
    const hits = [...byProblem.values()].reduce((n, s) => n + s.hit, 0);
    const total = [...byProblem.values()].reduce((n, s) => n + s.total, 0);
    const summary = [...byProblem.entries()].map(([p, s]) => `${p.padEnd(18)} ${s.hit}/${s.total}`).join('\n');
    console.log(`planted problems:\n${rows.join('\n')}\n\nby problem:\n${summary}\nrecall ${hits}/${total} = ${((100 * hits) / total).toFixed(1)}%`);
    expect(total).toBeGreaterThan(0);
    expect(hits / total).toBeGreaterThanOrEqual(0.9);
  });

  it('raises few false alarms on clean charts (≤ 10% of them)', () => {
    const clean = manifest.filter((t) => t.clean);
    const rows: string[] = [];
    let alarmed = 0;
    for (const t of clean) {
      const rules = fired.get(t.file)!;
      const scored = [...rules].filter((r) => SCORED.has(r));
      const other = [...rules].filter((r) => OTHER.includes(r));
      if (scored.length > 0) alarmed++;
      rows.push(`${t.file.padEnd(36)} ${scored.length ? `FALSE ALARM: ${scored.join(' ')}` : 'quiet'}${other.length ? `   (not scored: ${other.join(' ')})` : ''}`);
    }
    console.log(`clean charts:\n${rows.join('\n')}\nfalse alarms on ${alarmed}/${clean.length} clean charts`);
    // For information (not scored): scored rules firing on other charts without the planted problem.
    const extra: string[] = [];
    for (const t of manifest.filter((x) => !x.clean)) {
      const expected = new Set(t.planted.map((p) => RULE_FOR[p]).filter(Boolean));
      const more = [...fired.get(t.file)!].filter((r) => SCORED.has(r) && !expected.has(r));
      if (more.length) extra.push(`${t.file.padEnd(36)} ${more.join(' ')}`);
    }
    console.log(`scored rules firing on other charts without that planted problem:\n${extra.join('\n') || '(none)'}`);
    expect(clean.length).toBeGreaterThan(0);
    expect(alarmed / clean.length).toBeLessThanOrEqual(0.1);
  });
});
