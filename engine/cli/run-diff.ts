/**
 * `plumbline diff before.svg after.svg`: what changed between two versions of
 * a chart. Pixels: both rendered at one width with the bundled fonts and
 * compared (share changed, regions), optionally as a before | after |
 * difference picture. Structure: marks added, removed or moved, data values
 * changed, findings new or resolved. Identical files return at once.
 *
 * Exit status: 0 when the comparison was shown; 2 for a usage error or a file
 * that cannot be read as SVG.
 */
import { createHash } from 'node:crypto';
import { auditText } from '../audit/audit-file.js';
import { diffSvgTexts, type DiffRegion } from '../raster/index.js';
import { readSvgText } from '../read/read-file.js';
import { diffCharts, type ChartDelta, type MarkRef } from '../report/chart-delta.js';
import { formatNumber } from '../report/format-md.js';
import type { Finding, InkReport } from '../report/types.js';
import { writeFileAtomic } from '../report/write-atomic.js';

export interface DiffCommandOptions {
  out?: string;
  format?: 'text' | 'json';
}

export interface PixelSummary {
  width: number;
  height: number;
  changedPixels: number;
  changedShare: number;
  regions: DiffRegion[];
}

/** The `--format json` document. */
export interface ChartDiff {
  before: string;
  after: string;
  /** Same content (SHA-256 of the texts): nothing else was computed. */
  identical: boolean;
  pixels: PixelSummary | null;
  /** Why there is no pixel comparison, when there is none although the texts differ. */
  pixelError: string | null;
  kind: ChartDelta['kind'];
  marks: { added: MarkRef[]; removed: MarkRef[]; moved: ChartDelta['marks']['moved']; unchanged: number };
  series: ChartDelta['series'];
  values: ChartDelta['values'];
  findings: { new: Finding[]; resolved: Finding[]; unchanged: number };
  ink: { before: InkReport | null; after: InkReport | null };
  /** Where the picture was written. */
  picture: string | null;
}

export class UnreadableSvgError extends Error {
  override readonly name = 'UnreadableSvgError';
}

const sha256 = (s: string): string => createHash('sha256').update(s, 'utf8').digest('hex');

/**
 * Compares two SVG texts. Throws UnreadableSvgError when either cannot be
 * read as a chart; a render failure only leaves `pixels` empty.
 */
export async function compareSvgs(
  beforeText: string,
  afterText: string,
  names: { before: string; after: string },
  opts: { picture?: boolean } = {},
): Promise<{ diff: ChartDiff; png: Buffer | null }> {
  const empty: ChartDiff = {
    before: names.before,
    after: names.after,
    identical: true,
    pixels: null,
    pixelError: null,
    kind: { before: null, after: null },
    marks: { added: [], removed: [], moved: [], unchanged: 0 },
    series: { added: [], removed: [] },
    values: [],
    findings: { new: [], resolved: [], unchanged: 0 },
    ink: { before: null, after: null },
    picture: null,
  };
  if (sha256(beforeText) === sha256(afterText)) return { diff: empty, png: null };
  const a = auditText(beforeText, names.before);
  if (!a.report.ok) throw new UnreadableSvgError(`${names.before}: ${a.report.error?.message ?? 'cannot be read'}`);
  const b = auditText(afterText, names.after);
  if (!b.report.ok) throw new UnreadableSvgError(`${names.after}: ${b.report.error?.message ?? 'cannot be read'}`);
  let pixels: PixelSummary | null = null;
  let pixelError: string | null = null;
  let png: Buffer | null = null;
  try {
    const d = await diffSvgTexts(beforeText, afterText, { composite: opts.picture === true });
    if (!d.identical) {
      pixels = { width: d.width, height: d.height, changedPixels: d.changedPixels, changedShare: d.changedShare, regions: d.regions };
      png = d.compositePng ?? null;
    } else {
      pixels = { width: 0, height: 0, changedPixels: 0, changedShare: 0, regions: [] };
    }
  } catch (err) {
    pixelError = err instanceof Error ? err.message : String(err);
  }
  const delta = diffCharts({ report: a.report, chart: a.analysis?.chart ?? null }, { report: b.report, chart: b.analysis?.chart ?? null });
  return {
    diff: {
      ...empty,
      identical: false,
      pixels,
      pixelError,
      kind: delta.kind,
      marks: delta.marks,
      series: delta.series,
      values: delta.values,
      findings: { new: delta.findings.new, resolved: delta.findings.resolved, unchanged: delta.findings.unchanged.length },
      ink: delta.ink,
    },
    png,
  };
}

const LIST_LIMIT = 20;

function limited<T>(items: readonly T[], show: (t: T) => string, indent = '  '): string[] {
  const out = items.slice(0, LIST_LIMIT).map((t) => `${indent}${show(t)}`);
  if (items.length > LIST_LIMIT) out.push(`${indent}… ${items.length - LIST_LIMIT} more`);
  return out;
}

const n = (v: number): string => formatNumber(Math.round(v * 100) / 100);
const pct = (v: number): string => `${(v * 100).toFixed(v < 0.001 && v > 0 ? 3 : 1)} %`;
const boxText = (m: MarkRef): string => `${m.role.replace(/^mark\//, '')} at ${n(m.box.x)},${n(m.box.y)} ${n(m.box.width)}×${n(m.box.height)} (line ${m.line})`;

function moveText(m: ChartDelta['marks']['moved'][number]): string {
  const parts: string[] = [];
  const p = m.before.box;
  const q = m.after.box;
  if (Math.abs(p.x - q.x) > 0.005) parts.push(`x ${n(p.x)} → ${n(q.x)}`);
  if (Math.abs(p.y - q.y) > 0.005) parts.push(`y ${n(p.y)} → ${n(q.y)}`);
  if (Math.abs(p.width - q.width) > 0.005) parts.push(`width ${n(p.width)} → ${n(q.width)}`);
  if (Math.abs(p.height - q.height) > 0.005) parts.push(`height ${n(p.height)} → ${n(q.height)}`);
  return `${m.role.replace(/^mark\//, '')} (line ${m.after.line}): ${parts.join(', ') || 'moved by less than 0.01'}`;
}

const valueText = (v: number | null): string => (v === null ? '–' : formatNumber(v));
const where = (x: Finding): string => (x.elements[0] ? ` (line ${x.elements[0].line}:${x.elements[0].column})` : '');

/** The comparison for a terminal. */
export function formatDiffText(d: ChartDiff): string {
  const lines = [`${d.before} → ${d.after}`];
  if (d.identical) {
    lines.push('identical: same content, nothing to compare');
    return lines.join('\n') + '\n';
  }
  if (d.pixels) {
    const p = d.pixels;
    const regions = p.regions.slice(0, 5).map((r) => `${r.width}×${r.height} at ${r.x},${r.y}`);
    lines.push(
      `pixels    ${pct(p.changedShare)} changed (${p.changedPixels} of ${p.width * p.height} px at ${p.width}×${p.height})` +
        (p.regions.length ? ` in ${p.regions.length} region${p.regions.length === 1 ? '' : 's'}: ${regions.join('; ')}${p.regions.length > 5 ? '; …' : ''}` : ''),
    );
  } else lines.push(`pixels    not compared: ${d.pixelError ?? 'unknown reason'}`);
  lines.push(`chart     ${d.kind.before ?? '–'}${d.kind.before === d.kind.after ? '' : ` → ${d.kind.after ?? '–'}`}`);
  const m = d.marks;
  lines.push(`marks     ${m.unchanged} unchanged, ${m.moved.length} moved or resized, ${m.added.length} added, ${m.removed.length} removed`);
  lines.push(...limited(m.moved, moveText, '  moved   '));
  lines.push(...limited(m.added, boxText, '  added   '));
  lines.push(...limited(m.removed, boxText, '  removed '));
  for (const s of d.series.added) lines.push(`series    added ${s === null ? '(unnamed)' : JSON.stringify(s)}`);
  for (const s of d.series.removed) lines.push(`series    removed ${s === null ? '(unnamed)' : JSON.stringify(s)}`);
  lines.push(`data      ${d.values.length === 0 ? 'no recovered value changed' : `${d.values.length} value${d.values.length === 1 ? '' : 's'} changed`}`);
  lines.push(
    ...limited(
      d.values,
      (v) => `${v.series === null ? '' : `${JSON.stringify(v.series)} `}${v.x === null ? '–' : String(v.x)}${v.y !== undefined && v.y !== null ? ` / ${String(v.y)}` : ''}: ${valueText(v.before)} → ${valueText(v.after)}`,
    ),
  );
  lines.push(`findings  ${d.findings.new.length} new, ${d.findings.resolved.length} resolved, ${d.findings.unchanged} unchanged`);
  lines.push(...limited(d.findings.new, (x) => `new       ${x.severity} ${x.rule}${where(x)}: ${x.message}`, '  '));
  lines.push(...limited(d.findings.resolved, (x) => `resolved  ${x.severity} ${x.rule}${where(x)}`, '  '));
  if (d.ink.before && d.ink.after) {
    lines.push(`ink       data ${pct(d.ink.before.data)} → ${pct(d.ink.after.data)}`);
  }
  if (d.picture) lines.push(`picture   ${d.picture}`);
  return lines.join('\n') + '\n';
}

async function readInput(path: string): Promise<string> {
  try {
    return await readSvgText(path);
  } catch (err) {
    throw new UnreadableSvgError(`${path}: ${err instanceof Error ? err.message : String(err)}`);
  }
}

/** The command. Writes the result to stdout, problems to stderr; returns the exit status. */
export async function runDiff(before: string, after: string, opts: DiffCommandOptions): Promise<number> {
  const format = opts.format ?? 'text';
  if (format !== 'text' && format !== 'json') {
    process.stderr.write(`plumbline: --format must be text or json, got ${String(format)}\n`);
    return 2;
  }
  let result: { diff: ChartDiff; png: Buffer | null };
  try {
    const [a, b] = await Promise.all([readInput(before), readInput(after)]);
    result = await compareSvgs(a, b, { before, after }, { picture: Boolean(opts.out) });
  } catch (err) {
    if (err instanceof UnreadableSvgError) {
      process.stderr.write(`plumbline: cannot read ${err.message}\n`);
      return 2;
    }
    throw err;
  }
  const { diff, png } = result;
  let status = 0;
  if (opts.out) {
    if (png) {
      await writeFileAtomic(opts.out, png);
      diff.picture = opts.out;
    } else if (diff.identical) {
      process.stderr.write('plumbline: the files are identical; no picture written\n');
    } else {
      process.stderr.write(`plumbline: no picture written: ${diff.pixelError ?? 'the renders could not be compared'}\n`);
      status = 2;
    }
  }
  process.stdout.write(format === 'json' ? JSON.stringify(diff, null, 2) + '\n' : formatDiffText(diff));
  return status;
}
