/**
 * `plumbline audit` on many files through the built CLI (bin/plumbline.js →
 * dist/; `npm test` builds first): shards merged equal one run, --jobs does
 * not change reports, the cache returns the same reports without analysing,
 * progress shows on a terminal only, and broken files never stop a batch.
 */
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Report } from '../engine/report/types.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const bin = path.join(repoRoot, 'bin/plumbline.js');
// Relative, as a user would type it from the repository: reports keep paths as given.
const charts = '../shared/real-charts';
const tmp = mkdtempSync(path.join(os.tmpdir(), 'plumbline-batch-cli-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function cli(args: string[], env: Record<string, string> = {}): SpawnSyncReturns<string> {
  return spawnSync(process.execPath, [bin, ...args], { cwd: repoRoot, encoding: 'utf8', env: { ...process.env, ...env }, maxBuffer: 64 << 20 });
}

function readReport(file: string): Report {
  return JSON.parse(readFileSync(file, 'utf8')) as Report;
}

function batchStats(stderr: string): Record<string, number> {
  const m = /batch: (\d+) files, (\d+) analysed, (\d+) from cache, (\d+) over budget, (\d+) failed, (\d+) workers/.exec(stderr);
  if (!m) throw new Error(`no batch statistics in stderr: ${stderr}`);
  const [files, analysed, fromCache, overBudget, failed, workers] = m.slice(1).map(Number);
  return { files: files!, analysed: analysed!, fromCache: fromCache!, overBudget: overBudget!, failed: failed!, workers: workers! };
}

const chartCount = readdirSync(path.resolve(repoRoot, charts)).filter((f) => f.endsWith('.svg')).length;
// Whole-corpus runs take a while on a busy two-core machine.
const SLOW = 600_000;
const cache = path.join(tmp, 'cache');
let base: Report;
let baseStatus: number | null;

// The reference run: workers, and a cache that starts empty (so every file is analysed now).
beforeAll(() => {
  expect(existsSync(path.join(repoRoot, 'dist/engine/cli/main.js'))).toBe(true);
  const out = path.join(tmp, 'jobs2.json');
  const r = cli(['audit', charts, '--jobs', '2', '--cache', cache, '--format', 'json', '--out', out], { PLUMBLINE_DEBUG: 'batch' });
  expect(r.status, r.stderr).not.toBe(2);
  expect(batchStats(r.stderr)).toMatchObject({ files: chartCount, analysed: chartCount, fromCache: 0, workers: 2, failed: 0, overBudget: 0 });
  base = readReport(out);
  baseStatus = r.status;
}, SLOW);

describe('audit batches through the CLI', () => {
  it('covers every real chart', () => {
    expect(base.files).toHaveLength(chartCount);
    expect(base.files.every((f) => f.ok)).toBe(true);
  });

  it(
    'three shards merged give the same files as one run',
    () => {
      const parts: string[] = [];
      const seen: number[] = [];
      for (const k of [1, 2, 3]) {
        const out = path.join(tmp, `report-${k}.json`);
        const r = cli(['audit', charts, '--shard', `${k}/3`, '--format', 'json', '--out', out]);
        expect(r.status, r.stderr).not.toBe(2);
        seen.push(readReport(out).files.length);
        parts.push(out);
      }
      // Every file lands in exactly one shard.
      expect(seen.reduce((a, b) => a + b, 0)).toBe(chartCount);
      expect(seen.every((n) => n > 0)).toBe(true);
      const merged = path.join(tmp, 'merged.json');
      const m = cli(['merge', ...parts, '--out', merged]);
      expect(m.status, m.stderr).not.toBe(2);
      expect(readReport(merged).files).toEqual(base.files);
    },
    SLOW,
  );

  it(
    '--jobs 1 (calling thread, no cache) gives the same report as --jobs 2 (workers)',
    () => {
      const out = path.join(tmp, 'jobs1.json');
      const r = cli(['audit', charts, '--jobs', '1', '--format', 'json', '--out', out], { PLUMBLINE_DEBUG: 'batch' });
      expect(batchStats(r.stderr)).toMatchObject({ analysed: chartCount, workers: 0 });
      expect(readReport(out).files).toEqual(base.files);
    },
    SLOW,
  );

  it(
    '--cache returns identical reports and analyses nothing the second time',
    () => {
      const entries = readdirSync(cache, { recursive: true }).filter((f) => String(f).endsWith('.json'));
      expect(entries).toHaveLength(chartCount);
      const second = path.join(tmp, 'cache-2.json');
      const r = cli(['audit', charts, '--jobs', '2', '--cache', cache, '--format', 'json', '--out', second], { PLUMBLINE_DEBUG: 'batch' });
      // All from the cache: no file analysed, no worker started.
      expect(batchStats(r.stderr)).toMatchObject({ analysed: 0, fromCache: chartCount, workers: 0 });
      expect(readReport(second).files).toEqual(base.files);
      expect(r.status).toBe(baseStatus);
    },
    SLOW,
  );

  it('shows progress on a terminal, and nothing in a pipe or with --quiet', () => {
    const some = readdirSync(path.resolve(repoRoot, charts))
      .filter((f) => f.endsWith('.svg'))
      .sort()
      .slice(0, 3)
      .map((f) => `${charts}/${f}`);
    const out = path.join(tmp, 'tty.json');
    const command = (extra: string): string =>
      [process.execPath, bin, 'audit', ...some, '--jobs', '2', '--format', 'json', '--out', out, extra].map((a) => `'${a}'`).join(' ');
    // util-linux script(1) runs the command on a pseudo-terminal; its own stdout carries what the terminal showed.
    const tty = spawnSync('script', ['-q', '-e', '-c', command('--fail-on=never'), '/dev/null'], { cwd: repoRoot, encoding: 'utf8' });
    expect(tty.status, tty.stderr).toBe(0);
    expect(tty.stdout).toMatch(/audit .*3\/3 files \| [\d.]+ files\/s \| ETA \S+ \| 0 failed/);

    const quiet = spawnSync('script', ['-q', '-e', '-c', command('--quiet'), '/dev/null'], { cwd: repoRoot, encoding: 'utf8' });
    expect(quiet.stdout).not.toMatch(/files\/s/);

    const piped = cli(['audit', ...some, '--jobs', '2', '--format', 'json', '--out', out]);
    expect(piped.stderr).toBe('');
  }, SLOW);

  it('a folder of good and broken files is processed completely and exits 1', () => {
    const dir = path.join(tmp, 'mixed');
    const good = ['mpl-bar-clean-01.svg', 'vl-line-time-01.svg', 'gg-heatmap-rainbow-01.svg'];
    const broken: Record<string, string | Uint8Array> = {
      'cut-short.svg': readFileSync(path.resolve(repoRoot, charts, 'mpl-bar-clean-01.svg'), 'utf8').slice(0, 2000),
      'empty.svg': '',
      'not-xml.svg': 'this is not an SVG file',
      'bad-utf8.svg': new Uint8Array([0x3c, 0x73, 0x76, 0x67, 0x3e, 0xc3, 0x28, 0x3c, 0x2f, 0x73, 0x76, 0x67, 0x3e]),
    };
    rmSync(dir, { recursive: true, force: true });
    spawnSync('mkdir', ['-p', path.join(dir, 'sub')]);
    for (const f of good) copyFileSync(path.resolve(repoRoot, charts, f), path.join(dir, 'sub', f));
    for (const [name, content] of Object.entries(broken)) writeFileSync(path.join(dir, name), content);
    const out = path.join(tmp, 'mixed.json');
    const r = cli(['audit', dir, '--jobs', '2', '--format', 'json', '--out', out, '--fail-on', 'never'], { PLUMBLINE_DEBUG: 'batch' });
    // --fail-on never: only file errors could make it fail; a second run without it must exit 1.
    expect(r.status, r.stderr).toBe(0);
    const report = readReport(out);
    expect(report.files).toHaveLength(good.length + Object.keys(broken).length);
    for (const f of report.files) {
      const isGood = good.includes(path.basename(f.path));
      expect(f.ok, f.path).toBe(isGood);
      if (!isGood) expect(f.findings.some((x) => x.rule === 'plumbline.unreadable' && x.severity === 'error')).toBe(true);
    }
    expect(report.totals?.unreadable).toBe(Object.keys(broken).length);
    const again = cli(['audit', dir, '--jobs', '2', '--format', 'json', '--out', out]);
    expect(again.status, again.stderr).toBe(1);
  }, SLOW);
});
