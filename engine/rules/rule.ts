/**
 * A rule: one check, one file. It reads the understood chart and the
 * measures, and returns findings with the numbers that justify them.
 */
import type { Chart } from '../classify/chart.js';
import type { Measures } from '../measure/measures.js';
import type { Finding, Severity } from '../report/types.js';

export type Family = 'ink' | 'truth' | 'color' | 'text' | 'form' | 'access';

export interface RuleInfo {
  /** `family.name`, stable: configs and reports refer to it. */
  id: string;
  family: Family;
  severity: Severity;
  /** One line: why this matters. */
  rationale: string;
  /** The published basis, or "common practice". */
  source: string;
  /** Thresholds with their defaults; a config may override each. */
  thresholds: Record<string, number>;
  /** What redraw does about it, when it can. */
  fix?: string;
}

export interface RuleContext {
  chart: Chart;
  measures: Measures;
  /** Thresholds after configuration. */
  thresholds: Record<string, number>;
  /** Severity after configuration. */
  severity: Severity;
}

/** A finding before the audit stamps it with rule id, severity and fix text. */
export type RuleFinding = Omit<Finding, 'rule' | 'severity' | 'fix'> & { severity?: Severity };

export interface Rule extends RuleInfo {
  check(ctx: RuleContext): RuleFinding[];
}

/** Source references of scene items, for findings. */
export function elementsOf(chart: Chart, indices: readonly number[], limit = 20): Finding['elements'] {
  const out: Finding['elements'] = [];
  const seen = new Set<string>();
  for (const i of indices) {
    const it = chart.scene.items[i];
    if (!it) continue;
    const k = `${it.source.line}:${it.source.column}`;
    if (seen.has(k)) continue;
    seen.add(k);
    out.push({ id: it.source.id, line: it.source.line, column: it.source.column });
    if (out.length >= limit) break;
  }
  return out;
}

/** Rounds a measure for reports: finite numbers to 4 significant digits. */
export function r4(v: number): number {
  return Number.isFinite(v) ? Number(v.toPrecision(4)) : v;
}
