/**
 * The action's parts on their own: git's name-status output, file patterns,
 * the event file, the comment's size limit, and the comment calls against a
 * local stand-in server (errors, endless pagination).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { micromark } from 'micromark';
import { gfm, gfmHtml } from 'micromark-extension-gfm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMMENT_MARKER, MAX_COMMENT_CHARS, reviewMarkdown } from '../action/comment.js';
import { EventError, readContext } from '../action/event.js';
import { parseNameStatus } from '../action/git.js';
import { ApiError, findMarkedComment, upsertComment } from '../action/github-api.js';
import { fileMatcher, type Review, type ReviewedFile } from '../action/review.js';
import type { FileReport, Finding } from '../engine/report/types.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-action-units-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('parseNameStatus', () => {
  it('reads additions, changes, deletions, renames and copies with awkward names', () => {
    // source: git-diff(1), --name-status with -z: status, NUL, path(s), NUL; R and C carry a score and two paths
    const out = ['A', 'new chart.svg', 'M', 'dir/ü.svg', 'D', 'gone.svg', 'R087', 'old/a.svg', 'new/a.svg', 'C100', 'src.svg', 'copy.svg', 'T', 'link.svg', ''].join('\0');
    expect(parseNameStatus(out)).toEqual([
      { status: 'added', path: 'new chart.svg', basePath: null },
      { status: 'modified', path: 'dir/ü.svg', basePath: 'dir/ü.svg' },
      { status: 'deleted', path: 'gone.svg', basePath: 'gone.svg' },
      { status: 'renamed', path: 'new/a.svg', basePath: 'old/a.svg' },
      { status: 'copied', path: 'copy.svg', basePath: 'src.svg' },
      { status: 'type-changed', path: 'link.svg', basePath: 'link.svg' },
    ]);
    expect(parseNameStatus('')).toEqual([]);
    expect(() => parseNameStatus('X\0a\0')).toThrow(/unexpected status/);
    expect(() => parseNameStatus('R100\0only-one')).toThrow(/truncated/);
  });
});

describe('fileMatcher', () => {
  it('takes globs, exclusions with ! and the config ignore list', () => {
    const m = fileMatcher(['**/*.svg', '!vendor/**'], ['build/**']);
    expect(m('charts/a.svg')).toBe(true);
    expect(m('a.svg')).toBe(true);
    expect(m('vendor/x/a.svg')).toBe(false);
    expect(m('build/a.svg')).toBe(false);
    expect(m('charts/a.png')).toBe(false);
    expect(fileMatcher(['figures/*.svg'], [])('figures/sub/a.svg')).toBe(false);
  });
});

describe('readContext', () => {
  const sha = (c: string): string => c.repeat(40);
  function event(payload: unknown): string {
    const p = join(dir, `event-${Math.random().toString(36).slice(2)}.json`);
    writeFileSync(p, JSON.stringify(payload));
    return p;
  }

  it('reads a pull request and notices forks', () => {
    const path = event({ pull_request: { number: 3, base: { sha: sha('a'), repo: { full_name: 'o/r' } }, head: { sha: sha('b'), repo: { full_name: 'someone/r' } } } });
    expect(readContext({ GITHUB_EVENT_NAME: 'pull_request', GITHUB_EVENT_PATH: path, GITHUB_REPOSITORY: 'o/r' })).toEqual({
      kind: 'pull_request',
      owner: 'o',
      repo: 'r',
      number: 3,
      baseSha: sha('a'),
      headSha: sha('b'),
      fromFork: true,
    });
  });

  it('treats other events as workspace runs', () => {
    expect(readContext({ GITHUB_EVENT_NAME: 'push', GITHUB_REPOSITORY: 'o/r' })).toEqual({ kind: 'other', eventName: 'push', owner: 'o', repo: 'r' });
  });

  it('refuses a pull request event it cannot read, with a reason', () => {
    expect(() => readContext({ GITHUB_EVENT_NAME: 'pull_request', GITHUB_REPOSITORY: 'o/r' })).toThrow(EventError);
    expect(() => readContext({ GITHUB_EVENT_NAME: 'pull_request', GITHUB_EVENT_PATH: join(dir, 'missing.json'), GITHUB_REPOSITORY: 'o/r' })).toThrow(/cannot read the event file/);
    const bad = event({ pull_request: { number: 3, base: { sha: 'main' }, head: { sha: sha('b') } } });
    expect(() => readContext({ GITHUB_EVENT_NAME: 'pull_request', GITHUB_EVENT_PATH: bad, GITHUB_REPOSITORY: 'o/r' })).toThrow(/base commit/);
    const noRepo = event({ pull_request: { number: 3, base: { sha: sha('a') }, head: { sha: sha('b') } } });
    expect(() => readContext({ GITHUB_EVENT_NAME: 'pull_request', GITHUB_EVENT_PATH: noRepo })).toThrow(/GITHUB_REPOSITORY/);
  });
});

function finding(i: number): Finding {
  return {
    rule: 'truth.truncated-baseline',
    severity: i % 3 === 0 ? 'error' : i % 3 === 1 ? 'warning' : 'note',
    message: `Bars start at ${i}, not 0 — a long message that repeats itself to fill the comment with text. `.repeat(3),
    elements: [{ id: null, line: i + 1, column: 5 }],
    measures: { lieFactor: i, baseline: i },
  };
}

function file(i: number): ReviewedFile {
  const report: FileReport = { path: `charts/figure-${i}.svg`, ok: true, error: null, findings: Array.from({ length: 12 }, (_, k) => finding(k)) };
  return { path: report.path, status: 'added', basePath: null, report, title: `Figure ${i}`, delta: null, baseReport: null, pixels: null, redraw: null, text: null };
}

describe('reviewMarkdown', () => {
  const ctx = { headSha: 'c'.repeat(40), version: '0.1.0', outputDir: 'plumbline-report', runUrl: null };

  it('stays within the comment limit and keeps the marker, the summary and balanced blocks', () => {
    const review: Review = { mode: 'pull_request', files: Array.from({ length: 300 }, (_, i) => file(i)), deleted: [], notes: [] };
    const md = reviewMarkdown(review, ctx, { forComment: true });
    // source: GitHub REST API, issue comment body limit of 65,536 characters (from memory)
    expect(md.length).toBeLessThanOrEqual(MAX_COMMENT_CHARS);
    expect(md.startsWith(`${COMMENT_MARKER}\n`)).toBe(true);
    expect(md).toContain('300 files checked');
    expect(md).toContain('plumbline-report/report.md');
    const html = micromark(md, { allowDangerousHtml: true, extensions: [gfm()], htmlExtensions: [gfmHtml()] });
    expect(html.match(/<details>/g)?.length ?? 0).toBe(html.match(/<\/details>/g)?.length ?? 0);
  });

  it('writes everything when it fits', () => {
    const review: Review = { mode: 'pull_request', files: [file(1)], deleted: ['charts/gone.svg'], notes: [] };
    const md = reviewMarkdown(review, ctx, { forComment: false });
    expect(md).not.toContain(COMMENT_MARKER);
    expect(md.match(/<details>/g)).toHaveLength(1);
    expect(md).toContain('Deleted: charts/gone.svg');
  });
});

describe('comment calls', () => {
  let server: Server;
  let url: string;
  let mode: 'error' | 'endless' | 'unauthorised' = 'error';
  let hits = 0;

  beforeAll(async () => {
    server = createServer((req, res) => {
      hits++;
      if (mode === 'unauthorised') {
        res.writeHead(401, { 'content-type': 'application/json' });
        res.end('{"message":"Bad credentials"}');
      } else if (mode === 'endless') {
        // Every page is full and says there is another.
        res.writeHead(200, { 'content-type': 'application/json', link: '<http://x/next>; rel="next"' });
        res.end(JSON.stringify(Array.from({ length: 100 }, (_, i) => ({ id: i + 1, body: 'not ours' }))));
      } else {
        res.writeHead(500, { 'content-type': 'application/json' });
        res.end('{"message":"boom"}');
      }
    });
    await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
    url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });
  afterAll(() => new Promise<void>((ok) => server.close(() => ok())));

  const target = (): { apiUrl: string; token: string; owner: string; repo: string } => ({ apiUrl: url, token: 't', owner: 'o', repo: 'r' });

  it('reports a bad token as forbidden, not as a crash', async () => {
    mode = 'unauthorised';
    const r = await upsertComment(target(), 1, COMMENT_MARKER, `${COMMENT_MARKER}\nbody`);
    expect(r.outcome).toBe('forbidden');
  });

  it('throws a server error with its status', async () => {
    mode = 'error';
    await expect(upsertComment(target(), 1, COMMENT_MARKER, `${COMMENT_MARKER}\nbody`)).rejects.toThrow(ApiError);
  });

  it('stops after a bounded number of pages', async () => {
    mode = 'endless';
    hits = 0;
    expect(await findMarkedComment(target(), 1, COMMENT_MARKER)).toBeNull();
    expect(hits).toBe(100);
  });

  it('refuses a body without its marker', async () => {
    await expect(upsertComment(target(), 1, COMMENT_MARKER, 'no marker')).rejects.toThrow(/marker/);
  });
});
