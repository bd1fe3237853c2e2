/**
 * The review as Markdown: the pull-request comment (behind a hidden marker)
 * and the job summary. Text from charts and paths goes through
 * `escapeMarkdown`; rule ids come from the catalogue.
 */
import { escapeMarkdown, escapeMarkdownShort } from '../engine/report/escape-md.js';
import { ACCESSIBILITY_NOTE, ACCESSIBILITY_RULE, fileDetails, filesTable, formatNumber, percent, summaryText } from '../engine/report/format-md.js';
import { totalsOf } from '../engine/report/totals.js';
import type { Finding } from '../engine/report/types.js';
import type { Review, ReviewedFile } from './review.js';

export const COMMENT_MARKER = '<!-- plumbline-review -->';
/** GitHub refuses comment bodies longer than 65,536 characters; stay below with room to spare. */
export const MAX_COMMENT_CHARS = 60_000;

export interface CommentContext {
  headSha: string | null;
  version: string;
  /** Where the reports and pictures were written (relative to the workspace). */
  outputDir: string;
  /** Link to the run, when known (server URL, repository and run id). */
  runUrl: string | null;
}

const where = (x: Finding): string => (x.elements[0] ? ` · line ${x.elements[0].line}:${x.elements[0].column}` : '');

function findingLine(x: Finding): string {
  return `  - **${x.severity}** \`${x.rule}\`${where(x)}: ${escapeMarkdownShort(x.message, 300)}`;
}

function valueText(v: number | null): string {
  return v === null ? '–' : formatNumber(v);
}

function inkChange(f: ReviewedFile): string {
  const a = f.delta?.ink.before?.data;
  const b = f.delta?.ink.after?.data;
  if (a === undefined || b === undefined) return '–';
  return `${percent(a)} → ${percent(b)}`;
}

/** The table of changes against the base, one row per file that existed there. */
function deltaTable(files: ReviewedFile[]): string {
  const rows = ['| File | New findings | Resolved | Data ink | Values changed | Pixels changed |', '|---|---:|---:|---|---:|---:|'];
  for (const f of files) {
    const d = f.delta!;
    const px = f.pixels ? `${(f.pixels.changedShare * 100).toFixed(1)} %` : '–';
    rows.push(`| ${escapeMarkdown(f.path)} | ${d.findings.new.length} | ${d.findings.resolved.length} | ${inkChange(f)} | ${d.values.length} | ${px} |`);
  }
  return rows.join('\n');
}

function deltaDetails(f: ReviewedFile): string {
  const d = f.delta!;
  const lines: string[] = [];
  const renamed = f.basePath && f.basePath !== f.path ? ` (was ${escapeMarkdown(f.basePath)})` : '';
  lines.push(`<details>\n<summary><b>${escapeMarkdown(f.path)}</b>${renamed}: ${d.findings.new.length} new, ${d.findings.resolved.length} resolved</summary>\n`);
  if (d.kind.before !== d.kind.after) lines.push(`- Chart kind: ${d.kind.before ?? '–'} → ${d.kind.after ?? '–'}`);
  const m = d.marks;
  if (m.added.length || m.removed.length || m.moved.length) {
    lines.push(`- Marks: ${m.added.length} added, ${m.removed.length} removed, ${m.moved.length} moved or resized, ${m.unchanged} unchanged`);
  }
  if (d.findings.new.length) {
    lines.push('- New findings:');
    for (const x of d.findings.new.slice(0, 20)) lines.push(findingLine(x));
    if (d.findings.new.length > 20) lines.push(`  - … ${d.findings.new.length - 20} more`);
  }
  if (d.findings.resolved.length) {
    lines.push('- Resolved:');
    for (const x of d.findings.resolved.slice(0, 20)) lines.push(`  - ~~${x.severity}~~ \`${x.rule}\``);
    if (d.findings.resolved.length > 20) lines.push(`  - … ${d.findings.resolved.length - 20} more`);
  }
  if (d.series.added.length || d.series.removed.length) {
    const name = (s: string | null): string => (s === null ? '(unnamed)' : `“${escapeMarkdownShort(s, 60)}”`);
    if (d.series.added.length) lines.push(`- Series added: ${d.series.added.map(name).join(', ')}`);
    if (d.series.removed.length) lines.push(`- Series removed: ${d.series.removed.map(name).join(', ')}`);
  }
  if (d.values.length) {
    lines.push('- Data values that changed:', '', '  | Series | x | Before | After |', '  |---|---|---:|---:|');
    for (const v of d.values.slice(0, 15)) {
      const x = v.x === null ? '–' : escapeMarkdownShort(String(v.x), 40) + (v.y !== undefined && v.y !== null ? ` / ${escapeMarkdownShort(String(v.y), 40)}` : '');
      lines.push(`  | ${v.series === null ? '–' : escapeMarkdownShort(v.series, 40)} | ${x} | ${valueText(v.before)} | ${valueText(v.after)} |`);
    }
    if (d.values.length > 15) lines.push('', `  … ${d.values.length - 15} more values changed`);
  }
  if (f.pixels) {
    lines.push(
      `- Pixels: ${(f.pixels.changedShare * 100).toFixed(2)} % changed in ${f.pixels.regions} region${f.pixels.regions === 1 ? '' : 's'}${
        f.pixels.picture ? ` (picture: ${escapeMarkdown(f.pixels.picture)} in the report artifact)` : ''
      }`,
    );
  }
  if (lines.length === 1) lines.push('- Nothing plumbline measures changed.');
  lines.push('', '</details>');
  return lines.join('\n');
}

function redrawSection(files: ReviewedFile[]): string {
  const withRedraw = files.filter((f) => f.redraw && f.redraw.applied.length > 0);
  if (withRedraw.length === 0) return '';
  const lines = ['#### Suggested redraw', '', '`plumbline redraw` keeps every data mark where it is and would apply these fixes:', ''];
  for (const f of withRedraw.slice(0, 30)) {
    const fixes = f.redraw!.applied.map((r) => `\`${r}\``).join(', ');
    lines.push(`- ${escapeMarkdown(f.path)}: ${fixes}${f.redraw!.written ? ` (redrawn copy: ${escapeMarkdown(f.redraw!.written)})` : ''}`);
  }
  if (withRedraw.length > 30) lines.push(`- … ${withRedraw.length - 30} more files`);
  return lines.join('\n');
}

function footer(ctx: CommentContext): string {
  const parts = [`plumbline ${ctx.version.replace(/[^0-9A-Za-z.+-]/g, '')}`];
  if (ctx.headSha) parts.push(`head ${ctx.headSha.slice(0, 7)}`);
  parts.push(`reports in ${escapeMarkdown(ctx.outputDir)}`);
  if (ctx.runUrl) parts.push(`[run](${ctx.runUrl})`);
  return `<sub>${parts.join(' · ')}</sub>`;
}

/**
 * The review as Markdown. `forComment` adds the hidden marker. When the text
 * would pass `maxChars`, the per-file blocks are dropped (worst files kept
 * first) and a line says where the full report is.
 */
export function reviewMarkdown(review: Review, ctx: CommentContext, opts: { forComment: boolean; maxChars?: number }): string {
  const maxChars = opts.maxChars ?? MAX_COMMENT_CHARS;
  const reports = review.files.map((f) => f.report);
  const totals = totalsOf(reports);
  const titles = new Map(review.files.map((f) => [f.path, f.title]));
  const head: string[] = [];
  if (opts.forComment) head.push(COMMENT_MARKER);
  if (review.mode === 'pull_request') {
    const n = review.files.length;
    head.push(`### plumbline: ${n === 0 ? 'no chart' : `${n} chart${n === 1 ? '' : 's'}`} changed in this pull request`, '');
  } else head.push('### plumbline', '');
  if (review.files.length > 0) head.push(`**${summaryText(totals)}.**`, '', filesTable(reports, titles), '');
  if (review.deleted.length) head.push(`Deleted: ${review.deleted.map((p) => escapeMarkdown(p)).join(', ')}`, '');
  for (const note of review.notes) head.push(`> ${escapeMarkdown(note)}`, '');

  const changed = review.files.filter((f) => f.delta);
  const blocks: string[] = [];
  if (changed.length) {
    blocks.push('#### Against the base branch', '', deltaTable(changed), '');
    for (const f of changed) blocks.push(deltaDetails(f), '');
  }
  const withFindings = review.files.filter((f) => f.report.findings.length > 0);
  if (withFindings.length) {
    blocks.push('#### Findings', '');
    for (const f of withFindings) blocks.push(fileDetails(f.report), '');
  }
  const redraw = redrawSection(review.files);
  if (redraw) blocks.push(redraw, '');
  const tail: string[] = [];
  if (reports.some((r) => r.findings.some((x) => ACCESSIBILITY_RULE.test(x.rule)))) tail.push(`<sub>${ACCESSIBILITY_NOTE}</sub>`, '');
  tail.push(footer(ctx));

  const full = [...head, ...blocks, ...tail].join('\n') + '\n';
  if (full.length <= maxChars) return full;
  const cut = `> The full review is longer than a comment allows; the findings of every file are in ${escapeMarkdown(ctx.outputDir)}/report.md and the job summary.`;
  let kept = [...head, cut, ''];
  for (const b of blocks) {
    const next = [...kept, b];
    if ([...next, ...tail].join('\n').length + 1 > maxChars) break;
    kept = next;
  }
  const short = [...kept, ...tail].join('\n') + '\n';
  if (short.length <= maxChars) return short;
  // Even the table is too long: the summary line only.
  return [...head.slice(0, opts.forComment ? 3 : 2), `**${summaryText(totals)}.**`, '', cut, '', ...tail].join('\n') + '\n';
}
