/**
 * Proof that a redraw kept the data: the output is read again from scratch
 * and compared with the input.
 *
 * - It must parse and build a scene.
 * - Nothing the fixes wrote may read as a new data mark.
 * - Every data mark of the input (role mark/*) must be in the output, found
 *   through the edits' offset map (so elements are matched by where they were
 *   written, not by how they were classified again), with the same world
 *   outline and box (within 1e-6 of the figure's size), still painted. Marks a
 *   fix redraws on purpose (a tilted pie drawn flat) are exempt from that and
 *   must instead show their true shares: each one's area over the redrawn
 *   marks' total area within 0.5 percentage points.
 * - The data-ink share must not fall. The ink of items a fix changes by design
 *   (recoloured marks and keys, rewritten labels) is held at its input amount
 *   for this check, so the check judges what the other changes (removed
 *   backgrounds, frames, ticks, lighter grids) did to the balance.
 * - Re-auditing the output must not report again the rules that were fixed.
 */
import { auditText, type AuditResult } from '../audit/audit-file.js';
import type { Config } from '../config/config.js';
import { bucketOf, type InkBucket } from '../measure/ink.js';
import type { SceneItem, ShapeItem } from '../read/scene.js';
import { mapOffset, type Edit } from './edit-list.js';

export interface VerificationReport {
  /** Data marks of the input compared by geometry. */
  marksChecked: number;
  /** Data marks redrawn on purpose and checked against their true shares. */
  reprojected: number;
  /** Largest difference between a redrawn mark's shown share and its true share, percentage points. */
  worstShareErrorPoints: number;
  /** Largest coordinate difference found on a compared mark, world units. */
  worstCoordinateDifference: number;
  dataInkBefore: number;
  /** The output's data-ink share as re-audited. */
  dataInkAfter: number;
  /** The share the check judges (design-changed buckets held at their input ink). */
  dataInkJudged: number;
  /** Rule ids fixed whose findings the re-audit still reports. */
  remaining: string[];
  violations: string[];
}

export class RedrawVerificationError extends Error {
  readonly violations: string[];
  readonly remaining: string[];
  readonly report: VerificationReport;
  constructor(report: VerificationReport) {
    super(`redraw not verified: ${report.violations.slice(0, 3).join('; ')}${report.violations.length > 3 ? `; and ${report.violations.length - 3} more` : ''}`);
    this.name = 'RedrawVerificationError';
    this.violations = report.violations;
    this.remaining = report.remaining;
    this.report = report;
  }
}

export interface VerifyInput {
  path: string;
  config: Config;
  before: AuditResult;
  /** The edits that made `output` from the input source (sorted, non-overlapping). */
  edits: readonly Edit[];
  output: string;
  /** Marks redrawn on purpose, with the share of the whole each must show. */
  reprojected: readonly { item: number; share: number }[];
  /** Input items whose ink a fix changes by design; held at their input ink for the data-ink check. */
  inkHeld: ReadonlySet<number>;
  /** Rules whose fixes changed the file. */
  fixedRules: ReadonlySet<string>;
}

/** Relative tolerance on coordinates, as a share of the figure's larger side. */
export const GEOMETRY_TOLERANCE = 1e-6;
/** Largest allowed difference between a redrawn wedge's share and its true share. */
export const SHARE_TOLERANCE = 0.005;
/** Paint opacity may move by 8-bit rounding of a written colour's alpha. */
const OPACITY_TOLERANCE = 1 / 255 + 1e-9;
/** Floating-point slack on the data-ink share. */
const INK_SLACK = 1e-9;

function lineStarts(text: string): number[] {
  const out = [0];
  for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) out.push(i + 1);
  return out;
}

function keyOf(ownerStart: number, elementStart: number): string {
  return `${ownerStart}|${elementStart}`;
}

/** Key of an item by where its `<use>` (or element) and its element start in the text read. */
function itemKey(it: SceneItem, starts: number[]): string {
  const owner = starts[it.source.line - 1]! + it.source.column - 1;
  return keyOf(owner, it.element.start);
}

function paintedPresence(it: SceneItem): { fill: boolean; stroke: boolean; opacity: number } {
  if (it.kind === 'shape') {
    return { fill: it.fill.kind !== 'none', stroke: it.stroke.kind !== 'none', opacity: Math.max(it.fill.opacity, it.stroke.opacity) };
  }
  if (it.kind === 'text') return { fill: it.fill.kind !== 'none', stroke: false, opacity: it.fill.opacity };
  return { fill: true, stroke: false, opacity: it.opacity };
}

function worstDifference(a: SceneItem, b: SceneItem): number {
  let worst = Math.max(
    Math.abs(a.bbox.x - b.bbox.x),
    Math.abs(a.bbox.y - b.bbox.y),
    Math.abs(a.bbox.width - b.bbox.width),
    Math.abs(a.bbox.height - b.bbox.height),
  );
  if (a.kind === 'shape' && b.kind === 'shape') {
    const pa = (a as ShapeItem).polylines;
    const pb = (b as ShapeItem).polylines;
    if (pa.length !== pb.length) return Infinity;
    for (let k = 0; k < pa.length; k++) {
      const x = pa[k]!;
      const y = pb[k]!;
      if (x.length !== y.length) return Infinity;
      for (let i = 0; i < x.length; i++) {
        const d = Math.abs(x[i]! - y[i]!);
        if (!(d <= worst)) worst = Number.isNaN(d) ? Infinity : d;
      }
    }
  } else if (a.kind !== b.kind) return Infinity;
  return worst;
}

export function verifyRedraw(input: VerifyInput): { report: VerificationReport; after: AuditResult } {
  const { before, edits, output } = input;
  const violations: string[] = [];
  const analysisBefore = before.analysis!;
  const measuresBefore = before.measures!;
  const report: VerificationReport = {
    marksChecked: 0,
    reprojected: 0,
    worstShareErrorPoints: 0,
    worstCoordinateDifference: 0,
    dataInkBefore: measuresBefore.ink.shares.data,
    dataInkAfter: NaN,
    dataInkJudged: NaN,
    remaining: [],
    violations,
  };
  const after = auditText(output, input.path, input.config);
  if (!after.analysis || !after.measures) {
    const e = after.report.error;
    violations.push(`the output cannot be read: ${e?.message ?? 'unknown error'}${e?.line ? ` (line ${e.line}, column ${e.column})` : ''}`);
    return { report, after };
  }
  const sceneBefore = analysisBefore.scene;
  const sceneAfter = after.analysis.scene;
  const startsBefore = lineStarts(analysisBefore.doc.source);
  const startsAfter = lineStarts(after.analysis.doc.source);

  // Output items by key (several items may share one: keep them in paint order).
  const byKey = new Map<string, SceneItem[]>();
  for (const it of sceneAfter.items) {
    const k = itemKey(it, startsAfter);
    const list = byKey.get(k);
    if (list) list.push(it);
    else byKey.set(k, [it]);
  }
  const taken = new Map<string, number>();
  const find = (it: SceneItem): SceneItem | null => {
    const owner = startsBefore[it.source.line - 1]! + it.source.column - 1;
    const o = mapOffset(edits, owner);
    const e = mapOffset(edits, it.element.start);
    if (o === null || e === null) return null;
    const k = keyOf(o, e);
    const n = taken.get(k) ?? 0;
    taken.set(k, n + 1);
    return byKey.get(k)?.[n] ?? null;
  };
  // Every input item's counterpart, matched in paint order.
  const matched = sceneBefore.items.map(find);
  const counterpart = (it: SceneItem): SceneItem | null => matched[it.index] ?? null;

  const tol = GEOMETRY_TOLERANCE * Math.max(sceneBefore.viewBox.width, sceneBefore.viewBox.height, 1);
  const redrawn = new Map(input.reprojected.map((r) => [r.item, r.share]));
  const redrawnAreas: { item: number; area: number; share: number }[] = [];
  const where = (it: SceneItem): string => `line ${it.source.line}, column ${it.source.column}`;
  for (const it of sceneBefore.items) {
    const role = analysisBefore.chart.roles[it.index];
    if (role?.role !== 'mark') continue;
    const other = counterpart(it);
    if (!other) {
      violations.push(`data mark at ${where(it)} (${role.sub}) is missing from the output`);
      continue;
    }
    const p0 = paintedPresence(it);
    const p1 = paintedPresence(other);
    if (p0.fill !== p1.fill || p0.stroke !== p1.stroke || Math.abs(p0.opacity - p1.opacity) > OPACITY_TOLERANCE) {
      violations.push(`data mark at ${where(it)} (${role.sub}) is painted differently (fill, stroke or opacity)`);
    }
    if (redrawn.has(it.index)) {
      if (other.kind !== 'shape') violations.push(`redrawn mark at ${where(it)} is no longer a shape`);
      else redrawnAreas.push({ item: it.index, area: other.area, share: redrawn.get(it.index)! });
      continue;
    }
    report.marksChecked++;
    const d = worstDifference(it, other);
    report.worstCoordinateDifference = Math.max(report.worstCoordinateDifference, d);
    if (!(d <= tol)) violations.push(`data mark at ${where(it)} (${role.sub}) moved or changed shape (by ${Number.isFinite(d) ? d.toPrecision(3) : 'a different outline'})`);
  }

  // Nothing a fix wrote may read as a data mark: every output mark must be an input item.
  const fromInput = new Set<SceneItem>();
  for (const m of matched) if (m) fromInput.add(m);
  for (const it of sceneAfter.items) {
    const role = after.analysis.chart.roles[it.index];
    if (role?.role === 'mark' && !fromInput.has(it)) violations.push(`new element at line ${it.source.line}, column ${it.source.column} reads as a data mark (${role.sub})`);
  }

  // Redrawn marks: shown shares against true shares.
  if (redrawnAreas.length > 0) {
    const totalArea = redrawnAreas.reduce((s, r) => s + r.area, 0);
    const totalShare = redrawnAreas.reduce((s, r) => s + r.share, 0);
    report.reprojected = redrawnAreas.length;
    for (const r of redrawnAreas) {
      const shown = totalArea > 0 ? r.area / totalArea : NaN;
      const want = totalShare > 0 ? r.share / totalShare : NaN;
      const err = Math.abs(shown - want) * 100;
      report.worstShareErrorPoints = Math.max(report.worstShareErrorPoints, Number.isFinite(err) ? err : Infinity);
      if (!(err <= SHARE_TOLERANCE * 100)) {
        violations.push(`redrawn mark at ${where(sceneBefore.items[r.item]!)} shows ${(shown * 100).toFixed(2)}% instead of its true ${(want * 100).toFixed(2)}%`);
      }
    }
  }

  // Data-ink share.
  const t0 = measuresBefore.ink.totals;
  const t1 = after.measures.ink.totals;
  report.dataInkAfter = after.measures.ink.shares.data;
  const judged: Record<InkBucket, number> = { data: t1.data, guides: t1.guides, labels: t1.labels, decoration: t1.decoration };
  const rolesAfter = after.analysis.chart.roles;
  for (const i of input.inkHeld) {
    const it = sceneBefore.items[i];
    const roleIn = it ? analysisBefore.chart.roles[i] : undefined;
    if (!it || !roleIn) continue;
    const other = counterpart(it);
    if (other) {
      const roleOut = rolesAfter[other.index];
      if (roleOut) judged[bucketOf(roleOut.role)] -= after.measures.ink.byItem[other.index] ?? 0;
    }
    judged[bucketOf(roleIn.role)] += measuresBefore.ink.byItem[i] ?? 0;
  }
  const sum = judged.data + judged.guides + judged.labels + judged.decoration;
  report.dataInkJudged = sum > 0 ? judged.data / sum : 0;
  if (t0.total > 0 && report.dataInkJudged < report.dataInkBefore - INK_SLACK) {
    violations.push(`data-ink share fell from ${report.dataInkBefore.toFixed(4)} to ${report.dataInkJudged.toFixed(4)}`);
  }

  // Fixed rules must not be reported again.
  const again = new Set(after.report.findings.map((f) => f.rule));
  report.remaining = [...input.fixedRules].filter((r) => again.has(r)).sort();
  for (const r of report.remaining) violations.push(`${r} is still reported after its fix`);
  return { report, after };
}
