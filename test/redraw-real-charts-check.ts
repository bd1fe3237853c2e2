/**
 * Shared checks of the real-chart redraw tests (redraw-real-charts and
 * redraw-forced-fixes). Checks made here, independently of redraw's own
 * verification:
 * - the output is well-formed for the saxes parser (npm) and reads as an SVG;
 * - every data mark of the input is in the output with the same world
 *   outline (matched as a multiset of outlines, not through redraw's offset
 *   map), except the wedges of a pie redrawn flat;
 * - the output is re-audited and the fixed rules are not reported again;
 * - the data-ink share does not fall (the share judged with recoloured or
 *   rewritten items held at their input ink, see verify.ts; the raw share is
 *   printed beside it).
 * Prints per-chart fixes, verification numbers and textual diff sizes.
 */
import { SaxesParser } from 'saxes';
import { expect } from 'vitest';
import { analyzeSvg, type Analysis } from '../engine/audit/analyze.js';
import { auditText } from '../engine/audit/audit-file.js';
import type { RedrawResult } from '../engine/redraw/redraw.js';
import type { Finding } from '../engine/report/types.js';

/** One line per redraw, printed by the test files. */
export const rows: string[] = [];

function wellFormed(xml: string): void {
  const p = new SaxesParser();
  let error: Error | null = null;
  p.on('error', (e) => {
    error ??= e;
  });
  p.write(xml).close();
  if (error) throw error;
}

/** World outline of a shape, as text (same computation on both sides: exact equality is expected). */
function outline(a: Analysis, i: number): string | null {
  const it = a.scene.items[i]!;
  if (it.kind !== 'shape') return `${it.kind}:${it.bbox.x},${it.bbox.y},${it.bbox.width},${it.bbox.height}`;
  return it.polylines.map((p) => p.map((v) => v.toFixed(6)).join(',')).join('|');
}

/** Outlines of the input's data marks that the output lacks (multiset difference), skipping `exempt` items. */
function missingMarks(before: Analysis, after: Analysis, exempt: Set<number>): string[] {
  const have = new Map<string, number>();
  for (const it of after.scene.items) {
    const k = outline(after, it.index);
    if (k) have.set(k, (have.get(k) ?? 0) + 1);
  }
  const missing: string[] = [];
  for (const it of before.scene.items) {
    if (before.chart.roles[it.index]?.role !== 'mark' || exempt.has(it.index)) continue;
    const k = outline(before, it.index)!;
    const n = have.get(k) ?? 0;
    if (n === 0) missing.push(`line ${it.source.line}`);
    else have.set(k, n - 1);
  }
  return missing;
}

export function forced(rule: string): Finding {
  return { rule, severity: 'warning', message: 'applied on request', elements: [], measures: {} };
}

export function check(file: string, text: string, result: RedrawResult, mode: string): void {
  const before = analyzeSvg(text);
  wellFormed(result.output);
  const after = analyzeSvg(result.output);
  expect(after.doc.root.name).toBe('svg');
  // Pie wedges drawn flat on purpose are checked against their true shares by redraw itself.
  const flattened = result.applied.some((a) => a.rule === 'truth.3d-projection') && before.chart.pie?.ellipse ? before.chart.pie.wedges.map((w) => w.item) : [];
  // source: the manifest's data are what the marks encode; geometry equality is the redraw contract (DESIGN.md)
  expect(missingMarks(before, after, new Set(flattened))).toEqual([]);
  if (result.changed) {
    const v = result.verification!;
    expect(v.violations).toEqual([]);
    // common practice, no source: decluttering must not lower the data-ink share (Tufte's data-ink ratio)
    expect(v.dataInkJudged).toBeGreaterThanOrEqual(v.dataInkBefore - 1e-9);
    const again = new Set(auditText(result.output, file).report.findings.map((f) => f.rule));
    expect(result.applied.map((a) => a.rule).filter((r) => again.has(r))).toEqual([]);
  } else {
    expect(result.output).toBe(text);
  }
  const v = result.verification;
  rows.push(
    [
      file.padEnd(36),
      mode.padEnd(6),
      (result.applied.map((a) => `${a.rule.replace(/^[a-z]+\./, '')}×${a.count}`).join(' ') || '—').padEnd(90),
      `marks ${String(v?.marksChecked ?? 0).padStart(4)}`,
      `flat ${v?.reprojected ?? 0} (${(v?.worstShareErrorPoints ?? 0).toFixed(3)} pp)`,
      `ink ${result.dataInk.before.toFixed(3)}→${result.dataInk.after.toFixed(3)} judged ${(v?.dataInkJudged ?? result.dataInk.before).toFixed(3)}`,
      `diff ${result.stats.hunks} hunks -${result.stats.linesRemoved}/+${result.stats.linesAdded} lines ${result.stats.charsDelta >= 0 ? '+' : ''}${result.stats.charsDelta} chars`,
    ].join('  '),
  );
}

