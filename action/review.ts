/**
 * The work of one run: which charts to look at, their reports, and on pull
 * requests what changed against the base (findings, ink, data, pixels).
 */
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import picomatch from 'picomatch';
import { glob } from 'tinyglobby';
import { auditText, unreadable } from '../engine/audit/audit-file.js';
import type { Config } from '../engine/config/config.js';
import { diffSvgTexts } from '../engine/raster/index.js';
import { readSvgText } from '../engine/read/read-file.js';
import { diffCharts, type ChartDelta } from '../engine/report/chart-delta.js';
import type { RedrawPreview } from '../engine/report/format-html.js';
import type { FileReport } from '../engine/report/types.js';
import { writeFileAtomic } from '../engine/report/write-atomic.js';
import { changedFiles, fetchCommits, hasCommit, showFile, type ChangeStatus } from './git.js';

export interface PixelChange {
  changedShare: number;
  regions: number;
  /** The before | after | difference picture, relative to the workspace. */
  picture: string | null;
}

export interface RedrawSuggestion {
  applied: string[];
  /** The redrawn copy, relative to the workspace. */
  written: string | null;
}

export interface ReviewedFile {
  path: string;
  status: ChangeStatus | 'present';
  basePath: string | null;
  report: FileReport;
  title: string | null;
  /** Against the base version (modified, renamed, copied files on pull requests). */
  delta: ChartDelta | null;
  baseReport: FileReport | null;
  pixels: PixelChange | null;
  redraw: RedrawSuggestion | null;
  /** The SVG text that was audited (for the HTML report). */
  text: string | null;
}

export interface Review {
  mode: 'pull_request' | 'files';
  files: ReviewedFile[];
  /** Matching charts deleted by the pull request. */
  deleted: string[];
  /** Things the reader of the summary should know (fallbacks taken). */
  notes: string[];
}

export interface ReviewOptions {
  workspace: string;
  patterns: string[];
  config: Config;
  outputDir: string;
  /** Produces the redrawn version of a chart; null: no redraw suggestions. */
  redraw: ((text: string, path: string) => RedrawPreview | null) | null;
}

/** A matcher for the `files` patterns (`!` excludes) plus the config's ignore list. */
export function fileMatcher(patterns: string[], ignore: string[]): (path: string) => boolean {
  const include = patterns.filter((p) => !p.startsWith('!'));
  const exclude = [...patterns.filter((p) => p.startsWith('!')).map((p) => p.slice(1)), ...ignore];
  const inc = picomatch(include.length ? include : ['**/*.svg'], { dot: true });
  const exc = exclude.length ? picomatch(exclude, { dot: true }) : null;
  return (p) => inc(p) && !(exc && exc(p));
}

function titleOf(result: ReturnType<typeof auditText>): string | null {
  return result.analysis?.chart.title ?? null;
}

async function suggestRedraw(opts: ReviewOptions, path: string, text: string, report: FileReport): Promise<RedrawSuggestion | null> {
  if (!opts.redraw || !report.ok || !report.findings.some((x) => x.fix)) return null;
  let r: RedrawPreview | null;
  try {
    r = opts.redraw(text, path);
  } catch {
    return null;
  }
  if (!r || !r.changed) return null;
  const rel = join(opts.outputDir, 'redrawn', path);
  await writeFileAtomic(join(opts.workspace, rel), r.output);
  return { applied: [...r.applied], written: rel };
}

/** Pull request: the changed charts between the merge base and the head commit. */
export async function reviewPullRequest(opts: ReviewOptions, baseSha: string, headSha: string): Promise<Review> {
  const cwd = opts.workspace;
  const notes: string[] = [];
  const missing = [];
  for (const sha of [baseSha, headSha]) if (!(await hasCommit(sha, cwd))) missing.push(sha);
  if (missing.length > 0) {
    try {
      await fetchCommits(missing, cwd);
    } catch (err) {
      throw new Error(
        `the checkout lacks commit ${missing.join(' and ')} and fetching it failed (${(err as Error).message}); check out with actions/checkout and fetch-depth: 0`,
      );
    }
  }
  const { changes, mergeBase } = await changedFiles(baseSha, headSha, cwd);
  if (!mergeBase) notes.push('The clone has no merge base of the two commits (shallow history), so changes are against the base commit itself; use fetch-depth: 0 to compare against the merge base.');
  const matches = fileMatcher(opts.patterns, opts.config.ignore);
  const files: ReviewedFile[] = [];
  const deleted: string[] = [];
  for (const c of changes) {
    if (!matches(c.path)) continue;
    if (c.status === 'deleted') {
      deleted.push(c.path);
      continue;
    }
    let text: string | null = null;
    let head;
    try {
      text = await showFile(headSha, c.path, cwd);
      head = auditText(text, c.path, opts.config);
    } catch (err) {
      head = { report: unreadable(c.path, err), analysis: null, measures: null };
    }
    const entry: ReviewedFile = {
      path: c.path,
      status: c.status,
      basePath: c.basePath,
      report: head.report,
      title: titleOf(head),
      delta: null,
      baseReport: null,
      pixels: null,
      redraw: null,
      text,
    };
    if (c.basePath && c.status !== 'added' && text !== null) {
      let baseText: string | null = null;
      try {
        baseText = await showFile(baseSha, c.basePath, cwd);
      } catch {
        baseText = null;
      }
      if (baseText !== null) {
        const base = auditText(baseText, c.basePath, opts.config);
        entry.baseReport = base.report;
        entry.delta = diffCharts({ report: base.report, chart: base.analysis?.chart ?? null }, { report: head.report, chart: head.analysis?.chart ?? null });
        entry.pixels = await pixelChange(opts, c.path, baseText, text);
      }
    }
    if (text !== null) entry.redraw = await suggestRedraw(opts, c.path, text, head.report);
    files.push(entry);
  }
  return { mode: 'pull_request', files, deleted, notes };
}

async function pixelChange(opts: ReviewOptions, path: string, before: string, after: string): Promise<PixelChange | null> {
  try {
    const d = await diffSvgTexts(before, after, { composite: true });
    if (d.identical) return { changedShare: 0, regions: 0, picture: null };
    let picture: string | null = null;
    if (d.compositePng && d.changedPixels > 0) {
      picture = join(opts.outputDir, 'diffs', `${path}.png`);
      await writeFileAtomic(join(opts.workspace, picture), d.compositePng);
    }
    return { changedShare: d.changedShare, regions: d.regions.length, picture };
  } catch {
    return null;
  }
}

/** Push and manual runs: every matching chart in the workspace. */
export async function reviewWorkspace(opts: ReviewOptions): Promise<Review> {
  const include = opts.patterns.filter((p) => !p.startsWith('!'));
  const found = await glob(include.length ? include : ['**/*.svg'], {
    cwd: opts.workspace,
    onlyFiles: true,
    dot: false,
    followSymbolicLinks: false,
    expandDirectories: false,
    ignore: ['**/node_modules/**', '**/.git/**', `${opts.outputDir.replace(/\/+$/, '')}/**`],
  });
  const matches = fileMatcher(opts.patterns, opts.config.ignore);
  const paths = found.filter(matches).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const files: ReviewedFile[] = [];
  for (const p of paths) {
    let text: string | null = null;
    let result;
    try {
      text = await readSvgText(join(opts.workspace, p));
      result = auditText(text, p, opts.config);
    } catch (err) {
      result = { report: unreadable(p, err), analysis: null, measures: null };
    }
    files.push({
      path: p,
      status: 'present',
      basePath: null,
      report: result.report,
      title: titleOf(result),
      delta: null,
      baseReport: null,
      pixels: null,
      redraw: text !== null ? await suggestRedraw(opts, p, text, result.report) : null,
      text: null,
    });
  }
  return { mode: 'files', files, deleted: [], notes: [] };
}

export async function ensureDir(path: string): Promise<void> {
  await mkdir(path, { recursive: true });
}
