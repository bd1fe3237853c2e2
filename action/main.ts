/**
 * The GitHub Action's entry. On pull requests: the charts the pull request
 * changes, audited at the head commit and compared with the base, one sticky
 * comment, annotations, a job summary and report files. On other events:
 * every matching chart in the workspace, summary and report files.
 */
import { isAbsolute, join, resolve } from 'node:path';
import * as core from '@actions/core';
import { ConfigError, findConfig, loadConfig, type Config } from '../engine/config/config.js';
import { formatHtml } from '../engine/report/format-html.js';
import { formatSarif } from '../engine/report/format-sarif.js';
import { loadSvgFromDisk } from '../engine/report/format.js';
import { redrawPreviewer } from '../engine/report/redraw-preview.js';
import { failsAt, makeReport, totalsOf } from '../engine/report/totals.js';
import { writeFileAtomic } from '../engine/report/write-atomic.js';
import { VERSION } from '../engine/version.js';
import { annotate } from './annotate.js';
import { COMMENT_MARKER, reviewMarkdown, type CommentContext } from './comment.js';
import { readContext, type PullRequestContext } from './event.js';
import { findMarkedComment, upsertComment, ApiError, type ApiTarget } from './github-api.js';
import { readInputs, type ActionInputs } from './inputs.js';
import { reviewPullRequest, reviewWorkspace, type Review } from './review.js';

function nodeMajor(): number {
  return Number(process.versions.node.split('.')[0]);
}

function runUrl(env: NodeJS.ProcessEnv): string | null {
  const { GITHUB_SERVER_URL: server, GITHUB_REPOSITORY: repo, GITHUB_RUN_ID: id } = env;
  if (!server || !repo || !id || !/^https?:\/\//.test(server) || !/^\d+$/.test(id) || !/^[\w.-]+\/[\w.-]+$/.test(repo)) return null;
  return `${server.replace(/\/+$/, '')}/${repo}/actions/runs/${id}`;
}

function loadWorkspaceConfig(workspace: string): Config {
  try {
    return loadConfig(findConfig(workspace));
  } catch (err) {
    if (err instanceof ConfigError) throw new Error(`configuration: ${err.message}`);
    throw err;
  }
}

async function writeReports(review: Review, inputs: ActionInputs, workspace: string, summaryMd: string, config: Config): Promise<Record<'json' | 'sarif' | 'md' | 'html', string>> {
  const report = makeReport(review.files.map((f) => f.report));
  const rel = {
    json: join(inputs.outputDir, 'report.json'),
    sarif: join(inputs.outputDir, 'report.sarif'),
    md: join(inputs.outputDir, 'report.md'),
    html: join(inputs.outputDir, 'report.html'),
  };
  const abs = (p: string): string => (isAbsolute(p) ? p : join(workspace, p));
  await writeFileAtomic(abs(rel.json), JSON.stringify(report, null, 2) + '\n');
  await writeFileAtomic(abs(rel.sarif), JSON.stringify(formatSarif(report), null, 2) + '\n');
  await writeFileAtomic(abs(rel.md), summaryMd);
  const texts = new Map(review.files.filter((f) => f.text !== null).map((f) => [f.path, f.text as string]));
  const html = await formatHtml(report, {
    loadSvg: async (p) => texts.get(p) ?? (review.mode === 'files' ? loadSvgFromDisk(join(workspace, p)) : null),
    redraw: inputs.suggestRedraw ? redrawPreviewer(config) : null,
    title: review.mode === 'pull_request' ? 'plumbline review of a pull request' : 'plumbline report',
  });
  await writeFileAtomic(abs(rel.html), html);
  return rel;
}

async function comment(pr: PullRequestContext, inputs: ActionInputs, review: Review, body: string): Promise<void> {
  if (!inputs.token) {
    core.warning('No token: the review is in the job summary and the annotations, not in a comment.');
    return;
  }
  const target: ApiTarget = { apiUrl: process.env.GITHUB_API_URL || 'https://api.github.com', token: inputs.token, owner: pr.owner, repo: pr.repo };
  try {
    if (review.files.length === 0 && review.deleted.length === 0) {
      // Nothing to say: only refresh a comment left by an earlier run.
      const existing = await findMarkedComment(target, pr.number, COMMENT_MARKER);
      if (!existing) {
        core.info('No chart changed; no comment written.');
        return;
      }
    }
    const r = await upsertComment(target, pr.number, COMMENT_MARKER, body);
    if (r.outcome === 'forbidden') {
      core.warning(
        `Cannot write the review comment (${r.message})${pr.fromFork ? '; pull requests from forks get a read-only token' : ''}. The review is in the job summary and the annotations.`,
      );
    } else core.info(`Review comment ${r.outcome}${r.url ? `: ${r.url}` : ''}`);
  } catch (err) {
    const what = err instanceof ApiError ? err.message : (err as Error).message;
    core.warning(`Cannot write the review comment: ${what}. The review is in the job summary and the annotations.`);
  }
}

export async function run(): Promise<void> {
  if (nodeMajor() < 20) throw new Error(`plumbline needs Node.js 20 or later; this is ${process.versions.node}`);
  const inputs = readInputs();
  const workspace = resolve(process.env.GITHUB_WORKSPACE || process.cwd());
  const ctx = readContext();
  const config = loadWorkspaceConfig(workspace);
  const opts = {
    workspace,
    patterns: inputs.files,
    config,
    outputDir: inputs.outputDir,
    redraw: inputs.suggestRedraw ? redrawPreviewer(config) : null,
  };
  const review = ctx.kind === 'pull_request' ? await reviewPullRequest(opts, ctx.baseSha, ctx.headSha) : await reviewWorkspace(opts);
  const files = review.files.map((f) => f.report);
  const totals = totalsOf(files);
  core.info(`plumbline ${VERSION}: ${files.length} chart${files.length === 1 ? '' : 's'}, ${totals.error} errors, ${totals.warning} warnings, ${totals.note} notes`);

  const cctx: CommentContext = { headSha: ctx.kind === 'pull_request' ? ctx.headSha : null, version: VERSION, outputDir: inputs.outputDir, runUrl: runUrl(process.env) };
  // The job summary allows 1 MiB; the comment 65,536 characters.
  const summaryMd = reviewMarkdown(review, cctx, { forComment: false, maxChars: 1_000_000 });
  const paths = await writeReports(review, inputs, workspace, summaryMd, config);

  annotate(files);
  if (process.env.GITHUB_STEP_SUMMARY) {
    try {
      await core.summary.addRaw(summaryMd, true).write();
    } catch (err) {
      core.warning(`Cannot write the job summary: ${(err as Error).message}`);
    }
  }
  core.setOutput('errors', totals.error);
  core.setOutput('warnings', totals.warning);
  core.setOutput('notes', totals.note);
  core.setOutput('report-json', paths.json);
  core.setOutput('report-sarif', paths.sarif);
  core.setOutput('report-md', paths.md);
  core.setOutput('report-html', paths.html);

  if (ctx.kind === 'pull_request' && inputs.comment) {
    await comment(ctx, inputs, review, reviewMarkdown(review, cctx, { forComment: true }));
  }
  if (failsAt(files, inputs.failOn)) {
    const n = inputs.failOn === 'error' ? totals.error : inputs.failOn === 'warning' ? totals.error + totals.warning : totals.error + totals.warning + totals.note;
    core.setFailed(`${n} finding${n === 1 ? '' : 's'} at or above "${inputs.failOn}" (fail-on)`);
  }
}

run().catch((err: unknown) => {
  core.setFailed(err instanceof Error ? err.message : String(err));
});
