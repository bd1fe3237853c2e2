/**
 * Redraw: audit a chart, run the fixes of the rules that fired, splice their
 * edits into the original text, and prove the result kept the data (see
 * verify.ts). Only what a fix changes is touched: the rest of the file stays
 * byte-identical.
 */
import { auditText, type AuditResult } from '../audit/audit-file.js';
import { DEFAULT_CONFIG, type Config } from '../config/config.js';
import type { Finding } from '../report/types.js';
import { changeStats, type ChangeStats } from './change-summary.js';
import { EditConflictError, EditList, type Edit } from './edit-list.js';
import { buildFixContext, type FixOutcome } from './fix-context.js';
import { FIXES } from './fixes/index.js';
import { RedrawVerificationError, verifyRedraw, type VerificationReport } from './verify.js';

export { RedrawVerificationError, type VerificationReport } from './verify.js';

export interface RedrawOptions {
  /** Apply only the fixes of these rule ids. */
  only?: readonly string[];
  config?: Config;
}

export interface AppliedFix {
  rule: string;
  /** Scene items changed or removed, or elements written. */
  count: number;
}

export interface RedrawResult {
  output: string;
  applied: AppliedFix[];
  changed: boolean;
  /** What the fixes report about their work (choices, things left as they were). */
  notes: { rule: string; note: string }[];
  /** Fixes that found work but were not applied, with the reason. */
  skipped: { rule: string; reason: string }[];
  /** Findings of the input audit (all rules). */
  findings: Finding[];
  /** null when nothing changed (the output is the input). */
  verification: VerificationReport | null;
  /** Data-ink share of the output as re-audited (the input's when unchanged). */
  dataInk: { before: number; after: number };
  /** The splices made, on the input text without its byte-order mark (sorted, non-overlapping). */
  edits: readonly Edit[];
  /** Size of the textual change. */
  stats: ChangeStats;
}

/** The input could not be read or understood; line and column when known. */
export class RedrawInputError extends Error {
  readonly line: number | null;
  readonly column: number | null;
  constructor(message: string, line: number | null, column: number | null) {
    super(message);
    this.name = 'RedrawInputError';
    this.line = line;
    this.column = column;
  }
}

const BOM = '\ufeff';

function auditOrThrow(src: string, path: string, config: Config): AuditResult & { analysis: NonNullable<AuditResult['analysis']>; measures: NonNullable<AuditResult['measures']> } {
  const audit = auditText(src, path, config);
  if (!audit.analysis || !audit.measures) {
    const e = audit.report.error;
    throw new RedrawInputError(e?.message ?? 'cannot read this file', e?.line ?? null, e?.column ?? null);
  }
  return audit as AuditResult & { analysis: NonNullable<AuditResult['analysis']>; measures: NonNullable<AuditResult['measures']> };
}

/** Audits `text` and redraws it with the fixes of the rules that fired (filtered by `only`). */
export function redrawText(text: string, path: string, opts: RedrawOptions = {}): RedrawResult {
  const config = opts.config ?? DEFAULT_CONFIG;
  const bom = text.startsWith(BOM) ? BOM : '';
  const src = bom ? text.slice(1) : text;
  const audit = auditOrThrow(src, path, config);
  return redrawAudited(bom, audit, audit.report.findings, path, { ...opts, config });
}

/**
 * Redraws `text` with the fixes for the given findings (which need not come
 * from this file's audit: a caller may ask for a fix whose rule did not fire).
 * Verification is the same as for redrawText.
 */
export function redrawWithFindings(text: string, path: string, findings: readonly Finding[], opts: RedrawOptions = {}): RedrawResult {
  const config = opts.config ?? DEFAULT_CONFIG;
  const bom = text.startsWith(BOM) ? BOM : '';
  const src = bom ? text.slice(1) : text;
  const audit = auditOrThrow(src, path, config);
  return redrawAudited(bom, audit, findings, path, { ...opts, config });
}

/** Findings grouped by rule, in fix order, each rule's findings merged into one (fixes work chart-wide). */
function findingsToFix(findings: readonly Finding[], only: readonly string[] | undefined): Finding[] {
  const wanted = only ? new Set(only) : null;
  const byRule = new Map<string, Finding>();
  for (const f of findings) {
    if (!FIXES.has(f.rule) || (wanted && !wanted.has(f.rule))) continue;
    const have = byRule.get(f.rule);
    if (have) byRule.set(f.rule, { ...have, elements: [...have.elements, ...f.elements] });
    else byRule.set(f.rule, f);
  }
  return [...FIXES.keys()].filter((r) => byRule.has(r)).map((r) => byRule.get(r)!);
}

function redrawAudited(
  bom: string,
  audit: AuditResult & { analysis: NonNullable<AuditResult['analysis']>; measures: NonNullable<AuditResult['measures']> },
  findings: readonly Finding[],
  path: string,
  opts: RedrawOptions & { config: Config },
): RedrawResult {
  const src = audit.analysis.doc.source;
  const todo = findingsToFix(findings, opts.only);
  const ctx = buildFixContext(audit.analysis, audit.measures, new Set(todo.map((f) => f.rule)));
  const list = new EditList(src.length);
  const applied: AppliedFix[] = [];
  const notes: RedrawResult['notes'] = [];
  const skipped: RedrawResult['skipped'] = [];
  const reprojected: { item: number; share: number }[] = [];
  const inkHeld = new Set<number>();
  const fixedRules = new Set<string>();
  for (const finding of todo) {
    const fix = FIXES.get(finding.rule)!;
    let outcome: FixOutcome;
    try {
      outcome = fix(ctx, finding);
    } catch (err) {
      skipped.push({ rule: finding.rule, reason: `the fix could not run: ${(err as Error).message}` });
      continue;
    }
    for (const note of outcome.notes) notes.push({ rule: finding.rule, note });
    if (outcome.edits.length === 0) continue;
    const accepted = acceptEdits(list, outcome.edits);
    if (accepted.conflict) {
      skipped.push({ rule: finding.rule, reason: `its edits overlap those of an earlier fix (${accepted.conflict})` });
      continue;
    }
    applied.push({ rule: finding.rule, count: outcome.count });
    fixedRules.add(finding.rule);
    reprojected.push(...outcome.reprojected);
    for (const i of outcome.inkHeld) inkHeld.add(i);
  }
  const before = audit.measures.ink.shares.data;
  if (list.size === 0) {
    return {
      output: bom + src,
      applied: [],
      changed: false,
      notes,
      skipped,
      findings: audit.report.findings,
      verification: null,
      dataInk: { before, after: before },
      edits: [],
      stats: changeStats(src, []),
    };
  }
  const body = list.apply(src);
  const { report } = verifyRedraw({
    path,
    config: opts.config,
    before: audit,
    edits: list.edits,
    output: body,
    reprojected,
    inkHeld,
    fixedRules,
  });
  if (report.violations.length > 0) throw new RedrawVerificationError(report);
  return {
    output: bom + body,
    applied,
    changed: body !== src,
    notes,
    skipped,
    findings: audit.report.findings,
    verification: report,
    dataInk: { before, after: report.dataInkAfter },
    edits: list.edits,
    stats: changeStats(src, list.edits),
  };
}

/**
 * Adds one fix's edits atomically. Edits that fall wholly inside a span an
 * earlier fix removes are dropped (they would change nothing that stays);
 * any other overlap refuses the whole fix.
 */
function acceptEdits(list: EditList, edits: readonly Edit[]): { conflict: string | null } {
  const kept: Edit[] = [];
  for (const e of edits) {
    const c = list.conflictOf(e);
    if (c && c.text === '' && c.start <= e.start && e.end <= c.end && !(e.start === c.start && e.end === c.end)) continue;
    kept.push(e);
  }
  try {
    list.addAll(kept);
    return { conflict: null };
  } catch (err) {
    if (err instanceof EditConflictError) return { conflict: `[${err.a.start}, ${err.a.end}) and [${err.b.start}, ${err.b.end})` };
    throw err;
  }
}
