/**
 * The GitHub Action end to end, without network: a real git repository with a
 * base and a head commit changing real charts, a pull_request event file, the
 * variables a runner sets, and a local HTTP server standing in for the REST
 * API. The bundled entry runs as a child process, as the runner would run it.
 *
 * Every request the action sends is checked against GitHub's OpenAPI
 * description of its REST API (@octokit/openapi).
 */
import { execFileSync, spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { micromark } from 'micromark';
import { gfm, gfmHtml } from 'micromark-extension-gfm';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMMENT_MARKER } from '../action/comment.js';
import { openApiProblems, operationOf } from './support/action-openapi.js';
import { REAL_CHARTS } from './support/real-charts.js';
import { sarifSchemaErrors } from './support/report-sarif-schema.js';

const repoRoot = resolve(import.meta.dirname, '..');
/** The bundle is built inside node_modules so that node resolves the runtime packages (the native renderer) as in the action's folder. */
const bundle = join(repoRoot, 'node_modules', '.cache', 'plumbline-action-test', 'index.js');

const OWNER = 'acme';
const REPO = 'charts';
const PR = 7;
const TOKEN = 'test-token-not-a-secret';
const HOSTILE = '&lt;img src=x onerror=alert(1)&gt; ](javascript:alert(1)) @octocat';

interface Recorded {
  method: string;
  url: string;
  auth: string | undefined;
  accept: string | undefined;
  body: string;
}

interface Comment {
  id: number;
  body: string;
  html_url: string;
  user: { login: string; type: string };
}

/** The stand-in for the REST API: issue comments with pagination. */
class FakeGitHub {
  requests: Recorded[] = [];
  comments: Comment[] = [];
  forbid = false;
  private nextId = 5000;
  private server: Server | null = null;

  constructor(existing: number) {
    for (let i = 1; i <= existing; i++) {
      this.comments.push({ id: i, body: i === 42 ? `quoting an old review:\n> ${COMMENT_MARKER} old` : `comment ${i}`, html_url: `https://example.invalid/c/${i}`, user: { login: `user${i}`, type: 'User' } });
    }
  }

  async start(): Promise<string> {
    this.server = createServer((req, res) => void this.handle(req, res));
    await new Promise<void>((ok) => this.server!.listen(0, '127.0.0.1', ok));
    return `http://127.0.0.1:${(this.server.address() as AddressInfo).port}`;
  }

  async stop(): Promise<void> {
    await new Promise<void>((ok) => (this.server ? this.server.close(() => ok()) : ok()));
  }

  private async handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    let body = '';
    for await (const chunk of req) body += String(chunk);
    this.requests.push({ method: req.method!, url: req.url!, auth: req.headers.authorization, accept: req.headers.accept, body });
    const send = (status: number, json: unknown, headers: Record<string, string> = {}): void => {
      res.writeHead(status, { 'content-type': 'application/json', ...headers });
      res.end(JSON.stringify(json));
    };
    if (req.headers.authorization !== `Bearer ${TOKEN}`) return send(401, { message: 'Bad credentials' });
    if (this.forbid) return send(403, { message: 'Resource not accessible by integration' });
    const u = new URL(req.url!, 'http://x');
    const list = `/repos/${OWNER}/${REPO}/issues/${PR}/comments`;
    if (req.method === 'GET' && u.pathname === list) {
      const perPage = Number(u.searchParams.get('per_page') ?? 30);
      const page = Number(u.searchParams.get('page') ?? 1);
      const items = this.comments.slice((page - 1) * perPage, page * perPage);
      const last = Math.max(1, Math.ceil(this.comments.length / perPage));
      const link = page < last ? `<http://x${list}?per_page=${perPage}&page=${page + 1}>; rel="next", <http://x${list}?per_page=${perPage}&page=${last}>; rel="last"` : '';
      return send(200, items, link ? { link } : {});
    }
    if (req.method === 'POST' && u.pathname === list) {
      const c: Comment = { id: this.nextId++, body: (JSON.parse(body) as { body: string }).body, html_url: `https://example.invalid/c/new`, user: { login: 'github-actions[bot]', type: 'Bot' } };
      this.comments.push(c);
      return send(201, c);
    }
    const m = /^\/repos\/acme\/charts\/issues\/comments\/(\d+)$/.exec(u.pathname);
    if (req.method === 'PATCH' && m) {
      const c = this.comments.find((x) => x.id === Number(m[1]));
      if (!c) return send(404, { message: 'Not Found' });
      c.body = (JSON.parse(body) as { body: string }).body;
      return send(200, c);
    }
    return send(404, { message: 'Not Found' });
  }
}

let work: string;
let repo: string;
let baseSha: string;
let headSha: string;
let api: FakeGitHub;
let apiUrl: string;

function git(args: string[]): string {
  return execFileSync('git', ['-c', 'user.name=Test', '-c', 'user.email=test@example.invalid', '-c', 'commit.gpgsign=false', '-c', 'init.defaultBranch=main', ...args], {
    cwd: repo,
    encoding: 'utf8',
    env: { PATH: process.env.PATH, HOME: work, GIT_CONFIG_NOSYSTEM: '1' },
  }).trim();
}

function put(path: string, text: string): void {
  const p = join(repo, path);
  mkdirSync(dirname(p), { recursive: true });
  writeFileSync(p, text);
}

const real = (name: string): string => readFileSync(join(REAL_CHARTS, name), 'utf8');

beforeAll(async () => {
  execFileSync(process.execPath, [join(repoRoot, 'action', 'build.mjs'), '--outfile', bundle], { cwd: repoRoot, stdio: 'pipe' });
  work = mkdtempSync(join(tmpdir(), 'plumbline-action-'));
  repo = join(work, 'repo');
  mkdirSync(repo);
  git(['init', '-q']);
  // Base commit.
  put('README.md', 'charts\n');
  put('charts/uptime.svg', real('mpl-bar-truncated-01.svg'));
  put('charts/old.svg', real('mpl-pie-clean-01.svg'));
  put('charts/keep.svg', real('vl-bar-clean-01.svg'));
  git(['add', '-A']);
  git(['commit', '-q', '-m', 'base']);
  baseSha = git(['rev-parse', 'HEAD']);
  // Head commit on a branch: one chart modified (a bar value and a root title), two added
  // (one with a hostile title), one deleted, and one in an excluded folder.
  git(['checkout', '-q', '-b', 'feature']);
  put('charts/uptime.svg', real('mpl-bar-truncated-01.svg').replaceAll('136.95555', '110.5').replace(/<svg\b([^>]*)>/, '<svg$1><title>Oven uptime by branch</title>'));
  put('charts/rentals.svg', real('ec-line-dual-axis-01.svg'));
  put(
    'charts/evil.svg',
    real('vl-bar-clean-01.svg').replaceAll('Pastries sold by weekday', HOSTILE).replace(/<svg\b([^>]*)>/, `<svg$1><title>${HOSTILE}</title>`),
  );
  put('vendor/lib.svg', real('gg-bar-truncated-01.svg'));
  unlinkSync(join(repo, 'charts/old.svg'));
  git(['add', '-A']);
  git(['commit', '-q', '-m', 'head']);
  headSha = git(['rev-parse', 'HEAD']);

  api = new FakeGitHub(130);
  apiUrl = await api.start();
});

afterAll(async () => {
  await api?.stop();
  if (work) rmSync(work, { recursive: true, force: true });
});

interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
  outputs: Record<string, string>;
  summary: string;
}

/** Runs the action as the runner would: a fresh process with the runner's variables. */
async function runAction(event: 'pull_request' | 'workflow_dispatch', inputs: Record<string, string>): Promise<RunResult> {
  const eventPath = join(work, `event-${event}.json`);
  const payload =
    event === 'pull_request'
      ? {
          action: 'synchronize',
          number: PR,
          pull_request: {
            number: PR,
            base: { sha: baseSha, ref: 'main', repo: { full_name: `${OWNER}/${REPO}` } },
            head: { sha: headSha, ref: 'feature', repo: { full_name: `${OWNER}/${REPO}` } },
          },
          repository: { full_name: `${OWNER}/${REPO}` },
        }
      : { inputs: {}, ref: 'refs/heads/main' };
  writeFileSync(eventPath, JSON.stringify(payload));
  const outputFile = join(work, 'github-output.txt');
  const summaryFile = join(work, 'step-summary.md');
  writeFileSync(outputFile, '');
  writeFileSync(summaryFile, '');
  const env: NodeJS.ProcessEnv = {
    PATH: process.env.PATH,
    HOME: work,
    CI: 'true',
    GITHUB_ACTIONS: 'true',
    GITHUB_EVENT_NAME: event,
    GITHUB_EVENT_PATH: eventPath,
    GITHUB_REPOSITORY: `${OWNER}/${REPO}`,
    GITHUB_WORKSPACE: repo,
    GITHUB_STEP_SUMMARY: summaryFile,
    GITHUB_OUTPUT: outputFile,
    GITHUB_API_URL: apiUrl,
    GITHUB_SERVER_URL: 'https://github.invalid',
    GITHUB_RUN_ID: '1234',
    GITHUB_SHA: headSha,
    // As a JavaScript action receives inputs: INPUT_ plus the name upper-cased, hyphens kept.
    'INPUT_FILES': '**/*.svg\n!vendor/**',
    'INPUT_FAIL-ON': 'error',
    'INPUT_COMMENT': 'true',
    'INPUT_SUGGEST-REDRAW': 'true',
    'INPUT_TOKEN': TOKEN,
    'INPUT_OUTPUT-DIR': 'plumbline-report',
    ...Object.fromEntries(Object.entries(inputs).map(([k, v]) => [`INPUT_${k.toUpperCase()}`, v])),
  };
  const child = spawn(process.execPath, [bundle], { cwd: repo, env, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
  child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
  const code = await new Promise<number>((ok, fail) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      fail(new Error(`the action did not finish in time\n${stdout}\n${stderr}`));
    }, 240_000);
    child.on('close', (c) => {
      clearTimeout(timer);
      ok(c ?? -1);
    });
  });
  return { code, stdout, stderr, outputs: parseOutputs(readFileSync(outputFile, 'utf8')), summary: readFileSync(summaryFile, 'utf8') };
}

/** GITHUB_OUTPUT holds `name<<DELIMITER`, the value, then the delimiter. */
function parseOutputs(text: string): Record<string, string> {
  const out: Record<string, string> = {};
  const lines = text.split('\n');
  for (let i = 0; i < lines.length; i++) {
    const m = /^([^<]+)<<(.+)$/.exec(lines[i]!);
    if (!m) continue;
    const value: string[] = [];
    for (i++; i < lines.length && lines[i] !== m[2]; i++) value.push(lines[i]!);
    out[m[1]!] = value.join('\n');
  }
  return out;
}

const render = (md: string): string => micromark(md, { allowDangerousHtml: true, extensions: [gfm()], htmlExtensions: [gfmHtml()] });

describe('GitHub Action on a pull request', () => {
  let first: RunResult;
  let second: RunResult;
  let firstRequests: Recorded[];
  let secondRequests: Recorded[];

  beforeAll(async () => {
    first = await runAction('pull_request', {});
    firstRequests = api.requests.splice(0);
    second = await runAction('pull_request', {});
    secondRequests = api.requests.splice(0);
  });

  it('creates one comment, after reading every page of existing comments', () => {
    expect(first.stderr).toBe('');
    expect(firstRequests.map((r) => `${r.method} ${r.url}`)).toEqual([
      `GET /repos/acme/charts/issues/7/comments?per_page=100&page=1`,
      `GET /repos/acme/charts/issues/7/comments?per_page=100&page=2`,
      `POST /repos/acme/charts/issues/7/comments`,
    ]);
    for (const r of firstRequests) {
      expect(r.auth).toBe(`Bearer ${TOKEN}`);
      expect(r.accept).toBe('application/vnd.github+json');
    }
  });

  it('updates that comment on the next run instead of adding another', () => {
    const created = api.comments.filter((c) => c.body.startsWith(COMMENT_MARKER));
    expect(created).toHaveLength(1);
    expect(api.comments).toHaveLength(131);
    expect(secondRequests.map((r) => `${r.method} ${r.url}`)).toEqual([
      `GET /repos/acme/charts/issues/7/comments?per_page=100&page=1`,
      `GET /repos/acme/charts/issues/7/comments?per_page=100&page=2`,
      `PATCH /repos/acme/charts/issues/comments/${created[0]!.id}`,
    ]);
    // the comment that only quotes the marker was left alone
    expect(api.comments.find((c) => c.id === 42)!.body).toContain('quoting an old review');
  });

  it('sends only requests that GitHub REST API description allows', () => {
    const all = [...firstRequests, ...secondRequests];
    expect(all.map((r) => operationOf(r.method, r.url))).toEqual(['issues/list-comments', 'issues/list-comments', 'issues/create-comment', 'issues/list-comments', 'issues/list-comments', 'issues/update-comment']);
    // source: GitHub REST API OpenAPI description, @octokit/openapi generated/api.github.com.json
    for (const r of all) expect(openApiProblems(r.method, r.url, r.body || null)).toEqual([]);
  });

  it('writes a comment with summary, tables, the changes against the base and escaped chart text', () => {
    const body = api.comments.find((c) => c.body.startsWith(COMMENT_MARKER))!.body;
    // eslint-disable-next-line no-console
    console.log(`\n----- sample comment body -----\n${body}\n----- end of sample -----\n`);
    expect(body.startsWith(`${COMMENT_MARKER}\n### plumbline: 3 charts changed in this pull request`)).toBe(true);
    expect(body).toMatch(/\*\*3 files checked: \d+ errors?, \d+ warnings?, \d+ notes?\.\*\*/);
    expect(body).toContain('| File | Status | Chart | Data ink | Errors | Warnings | Notes |');
    expect(body).toContain('Deleted: charts/old.svg');
    expect(body).not.toContain('vendor/lib.svg');
    expect(body).toContain('#### Against the base branch');
    expect(body).toMatch(/\| charts\/uptime\.svg \| \d+ \| \d+ \| \d+ % → \d+ % \| 1 \| \d+\.\d %/);
    expect(body).toContain('Harbour');
    expect(body).toMatch(/~~warning~~ `access\.missing-description`/);
    // the hostile title appears, escaped
    expect(body).toContain('&lt;img src=x onerror=alert&#40;1&#41;&gt;');
    expect(body).not.toMatch(/<img|\]\(javascript|@octocat/);
    const html = render(body);
    expect(html).not.toMatch(/<img|<a\s+href="javascript|<script/i);
    expect(body.length).toBeLessThan(65_536);
  });

  it('prints annotations on the changed files and fails on errors', () => {
    expect(first.code).toBe(1);
    expect(first.stdout).toMatch(/^::error title=plumbline truth\.truncated-baseline,file=charts\/uptime\.svg,line=\d+,col=\d+::Bars start at 90/m);
    expect(first.stdout).toMatch(/^::warning title=plumbline truth\.dual-axis,file=charts\/rentals\.svg,line=\d+,col=\d+::/m);
    expect(first.stdout).toMatch(/^::error::1 finding at or above "error" \(fail-on\)/m);
    // the token appears only in the runner's masking command
    expect(first.stdout.split('\n').filter((l) => l.includes(TOKEN))).toEqual([`::add-mask::${TOKEN}`]);
  });

  it('writes the job summary, the outputs and the report files', () => {
    expect(first.summary).toContain('### plumbline: 3 charts changed in this pull request');
    expect(first.summary).not.toContain(COMMENT_MARKER);
    expect(first.outputs.errors).toBe('1');
    expect(Number(first.outputs.warnings)).toBeGreaterThan(0);
    expect(first.outputs['report-sarif']).toBe('plumbline-report/report.sarif');
    for (const key of ['report-json', 'report-sarif', 'report-md']) expect(existsSync(join(repo, first.outputs[key]!))).toBe(true);
    const report = JSON.parse(readFileSync(join(repo, first.outputs['report-json']!), 'utf8')) as { files: { path: string }[] };
    expect(report.files.map((f) => f.path).sort()).toEqual(['charts/evil.svg', 'charts/rentals.svg', 'charts/uptime.svg']);
    const sarif = JSON.parse(readFileSync(join(repo, first.outputs['report-sarif']!), 'utf8')) as unknown;
    // source: OASIS SARIF 2.1.0 JSON schema (2.1.0-rtm.5) from @microsoft/jest-sarif
    expect(sarifSchemaErrors(sarif)).toEqual([]);
    const picture = PNG.sync.read(readFileSync(join(repo, 'plumbline-report/diffs/charts/uptime.svg.png')));
    expect(picture.width).toBeGreaterThan(picture.height);
    expect(existsSync(join(repo, 'plumbline-report/report.html'))).toBe(true);
  });
});

describe('GitHub Action without write access', () => {
  it('warns and keeps going when commenting is forbidden (fork pull requests)', async () => {
    api.forbid = true;
    try {
      const r = await runAction('pull_request', { 'fail-on': 'never' });
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/^::warning::Cannot write the review comment \(.*403 Resource not accessible by integration\)/m);
      expect(r.stdout).toMatch(/^::error title=plumbline truth\.truncated-baseline,file=charts\/uptime\.svg/m);
      expect(r.summary).toContain('### plumbline');
      for (const q of api.requests.splice(0)) expect(openApiProblems(q.method, q.url, q.body || null)).toEqual([]);
    } finally {
      api.forbid = false;
    }
  });
});

describe('GitHub Action on other events', () => {
  it('audits every matching chart of the workspace, writes summary and SARIF, and comments nowhere', async () => {
    const r = await runAction('workflow_dispatch', { 'fail-on': 'warning' });
    expect(api.requests.splice(0)).toEqual([]);
    expect(r.code).toBe(1);
    const report = JSON.parse(readFileSync(join(repo, 'plumbline-report/report.json'), 'utf8')) as { files: { path: string }[] };
    expect(report.files.map((f) => f.path)).toEqual(['charts/evil.svg', 'charts/keep.svg', 'charts/rentals.svg', 'charts/uptime.svg']);
    expect(r.summary).toContain('### plumbline');
    expect(r.summary).toContain('charts/keep.svg');
    expect(sarifSchemaErrors(JSON.parse(readFileSync(join(repo, 'plumbline-report/report.sarif'), 'utf8')))).toEqual([]);
  });

  it('refuses a bad input with a clear failure', async () => {
    const r = await runAction('workflow_dispatch', { 'fail-on': 'sometimes' });
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/^::error::input "fail-on" must be error, warning, note or never, got "sometimes"/m);
  });
});
