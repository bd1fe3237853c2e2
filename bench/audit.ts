/**
 * Audit benchmarks, each against a baseline measured in the same run:
 *
 * P1  per-chart audit (read → scene → chart → measures → rules) vs one resvg
 *     render of the same chart, median ratio over ../shared/real-charts (goal ≤ 0.5×);
 * P3  the 50,000-point scatter: audit vs its resvg render (goal ≤ 1.0×), and
 *     peak RSS of a child process auditing it with the built CLI (goal ≤ 400 MB);
 * P5  a 500-file batch through the built CLI, --jobs 2 vs --jobs 1:
 *     throughput ratio (goal ≥ 1.7×).
 *
 * P3's RSS and P5 run bin/plumbline.js, so they need `npm run build` first.
 * Wall-clock figures depend on what else the machine runs: the load average
 * is printed with them.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { auditText } from '../engine/audit/audit-file.js';
import { renderSvg } from '../engine/raster/index.js';
import { makeLargeScatter } from './make-scatter.js';
import { median, timeIt } from './timing.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const realCharts = path.resolve(repoRoot, '../shared/real-charts');
const bin = path.join(repoRoot, 'bin/plumbline.js');

function load(): string {
  return os.loadavg().map((x) => x.toFixed(1)).join(' ');
}

function requireBuild(): void {
  if (!existsSync(path.join(repoRoot, 'dist/engine/cli/main.js'))) {
    throw new Error('bench/audit.ts: the built CLI is missing; run `npm run build` first');
  }
}

export interface ChartTiming {
  file: string;
  auditMs: number;
  renderMs: number;
  ratio: number;
}

/** P1: each chart audited and rendered `rounds` times after one warm-up, interleaved; medians per chart. */
export function benchPerChart(rounds = 3): { charts: ChartTiming[]; medianRatio: number } {
  const charts: ChartTiming[] = [];
  for (const file of readdirSync(realCharts).filter((f) => f.endsWith('.svg')).sort()) {
    const text = readFileSync(path.join(realCharts, file), 'utf8');
    auditText(text, file);
    renderSvg(text);
    const a: number[] = [];
    const r: number[] = [];
    for (let k = 0; k < rounds; k++) {
      a.push(timeIt(() => auditText(text, file)));
      r.push(timeIt(() => renderSvg(text)));
    }
    const auditMs = median(a);
    const renderMs = median(r);
    charts.push({ file, auditMs, renderMs, ratio: auditMs / renderMs });
  }
  return { charts, medianRatio: median(charts.map((c) => c.ratio)) };
}

/** P3: the large scatter, audit vs render (medians of `rounds` after a warm-up). */
export function benchScatter(svg: string, rounds = 3): { auditMs: number; renderMs: number; ratio: number } {
  auditText(svg, 'scatter.svg');
  renderSvg(svg);
  const a: number[] = [];
  const r: number[] = [];
  for (let k = 0; k < rounds; k++) {
    a.push(timeIt(() => auditText(svg, 'scatter.svg')));
    r.push(timeIt(() => renderSvg(svg)));
  }
  const auditMs = median(a);
  const renderMs = median(r);
  return { auditMs, renderMs, ratio: auditMs / renderMs };
}

/** P3: peak resident memory (MB) of one `plumbline audit --jobs 1` process on the file. */
export function peakRssMb(file: string, outDir: string): { mb: number; how: string } {
  requireBuild();
  const args = [bin, 'audit', file, '--jobs', '1', '--quiet', '--format', 'json', '--out', path.join(outDir, 'rss.json'), '--fail-on', 'never'];
  if (existsSync('/usr/bin/time')) {
    const r = spawnSync('/usr/bin/time', ['-v', process.execPath, ...args], { encoding: 'utf8' });
    const m = /Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr);
    if (r.status !== 0 || !m) throw new Error(`RSS run failed: ${r.stderr.slice(-500)}`);
    return { mb: Number(m[1]) / 1024, how: '/usr/bin/time -v' };
  }
  const mainUrl = new URL(`file://${path.join(repoRoot, 'dist/engine/cli/main.js')}`).href;
  const script = `import { main } from ${JSON.stringify(mainUrl)};
const code = await main(${JSON.stringify(args.slice(1))});
process.stderr.write('maxrss ' + process.resourceUsage().maxRSS + '\\n'); process.exitCode = code;`;
  const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8' });
  const m = /maxrss (\d+)/.exec(r.stderr);
  if (r.status !== 0 || !m) throw new Error(`RSS run failed: ${r.stderr.slice(-500)}`);
  return { mb: Number(m[1]) / 1024, how: 'process.resourceUsage().maxRSS' };
}

/**
 * P5's input: the real charts copied `copies` times, each copy edited a little
 * (a comment naming the copy; on odd copies one hex colour nudged by one step),
 * so no two files have the same bytes. The first `count` files are kept.
 */
export function makeBatch(dir: string, count = 500, copies = 12): string[] {
  const sources = readdirSync(realCharts).filter((f) => f.endsWith('.svg')).sort();
  const out: string[] = [];
  for (let k = 0; k < copies && out.length < count; k++) {
    const sub = path.join(dir, `copy-${String(k).padStart(2, '0')}`);
    mkdirSync(sub, { recursive: true });
    for (const f of sources) {
      if (out.length >= count) break;
      let text = readFileSync(path.join(realCharts, f), 'utf8');
      if (k % 2 === 1) {
        text = text.replace(/#([0-9a-fA-F]{5})([0-9a-fA-F])\b/, (_, head: string, last: string) => `#${head}${((parseInt(last, 16) + 1) % 16).toString(16)}`);
      }
      text = `${text.trimEnd()}\n<!-- copy ${k} of ${f} -->\n`;
      const to = path.join(sub, f);
      writeFileSync(to, text);
      out.push(to);
    }
  }
  return out;
}

/** P5: wall time of the built CLI over the batch folder with --jobs 1 and --jobs 2. */
export function benchBatch(dir: string, files: number, outDir: string): { jobs1Ms: number; jobs2Ms: number; ratio: number } {
  requireBuild();
  const once = (jobs: number): number => {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [bin, 'audit', dir, '--jobs', String(jobs), '--quiet', '--format', 'json', '--out', path.join(outDir, `batch-${jobs}.json`), '--fail-on', 'never'], {
      encoding: 'utf8',
    });
    const ms = performance.now() - t0;
    if (r.status !== 0) throw new Error(`batch run --jobs ${jobs} failed: ${r.stderr.slice(-500)}`);
    const n = (JSON.parse(readFileSync(path.join(outDir, `batch-${jobs}.json`), 'utf8')) as { files: unknown[] }).files.length;
    if (n !== files) throw new Error(`batch run --jobs ${jobs} reported ${n} files, expected ${files}`);
    return ms;
  };
  const jobs2Ms = once(2);
  const jobs1Ms = once(1);
  return { jobs1Ms, jobs2Ms, ratio: jobs1Ms / jobs2Ms };
}

/** Wall time (ms) of a fixed CPU-bound loop on a worker thread. */
function spin(iterations: number): Promise<number> {
  const code = `const { parentPort, workerData } = require('node:worker_threads');
const t0 = performance.now(); let x = 0;
for (let i = 0; i < workerData; i++) x = (x + i * 7) % 1000003;
parentPort.postMessage([performance.now() - t0, x]);`;
  return new Promise((resolve, reject) => {
    const w = new Worker(code, { eval: true, workerData: iterations });
    w.once('message', (m: [number, number]) => resolve(m[0]));
    w.once('error', reject);
  });
}

/**
 * How much two CPU-bound threads get done compared with one, on this machine
 * right now (2.0 on two idle cores; less when other work holds the cores).
 * P5 cannot beat this figure, so it is printed beside it.
 */
export async function parallelCapacity(iterations = 4e8): Promise<number> {
  await spin(iterations / 10);
  const one = await spin(iterations);
  const both = await Promise.all([spin(iterations), spin(iterations)]);
  return (2 * one) / Math.max(...both);
}

export async function run(): Promise<void> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'plumbline-bench-audit-'));
  try {
    const p1 = benchPerChart();
    const worst = [...p1.charts].sort((a, b) => b.ratio - a.ratio).slice(0, 5);
    console.log(
      `[audit P1] audit vs one resvg render, median over ${p1.charts.length} real charts: ${p1.medianRatio.toFixed(2)}x (goal <= 0.5x); ` +
        `slowest: ${worst.map((c) => `${c.file} ${c.auditMs.toFixed(0)}/${c.renderMs.toFixed(0)} ms`).join(', ')} [load ${load()}]`,
    );

    const svg = makeLargeScatter();
    const p3 = benchScatter(svg);
    console.log(`[audit P3] 50k-point scatter: audit ${p3.auditMs.toFixed(0)} ms vs resvg render ${p3.renderMs.toFixed(0)} ms: ${p3.ratio.toFixed(2)}x (goal <= 1.0x) [load ${load()}]`);
    const scatterFile = path.join(tmp, 'scatter-50k.svg');
    writeFileSync(scatterFile, svg);
    const rss = peakRssMb(scatterFile, tmp);
    console.log(`[audit P3] peak RSS of \`plumbline audit --jobs 1\` on it: ${rss.mb.toFixed(0)} MB (goal <= 400 MB; ${rss.how})`);

    const batchDir = path.join(tmp, 'batch');
    const files = makeBatch(batchDir);
    const capacityBefore = await parallelCapacity();
    const p5 = benchBatch(batchDir, files.length, tmp);
    const capacityAfter = await parallelCapacity();
    console.log(
      `[audit P5] ${files.length}-file batch: --jobs 1 ${(p5.jobs1Ms / 1000).toFixed(1)} s, --jobs 2 ${(p5.jobs2Ms / 1000).toFixed(1)} s: ` +
        `${p5.ratio.toFixed(2)}x throughput (goal >= 1.7x; ${os.availableParallelism()} cores) [load ${load()}]`,
    );
    console.log(
      `[audit P5] baseline: two CPU-bound threads vs one on this machine in the same run: ${capacityBefore.toFixed(2)}x before, ${capacityAfter.toFixed(2)}x after ` +
        `(2.0x on two idle cores); P5 divided by it: ${(p5.ratio / ((capacityBefore + capacityAfter) / 2)).toFixed(2)}`,
    );
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  run().catch((err: unknown) => {
    console.error(err);
    process.exitCode = 1;
  });
}
