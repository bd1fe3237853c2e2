/**
 * Visual diff speed: plumbline's diffSvgTexts against a baseline pipeline that
 * screenshots both SVGs in headless Chromium and compares the screenshots with
 * pixelmatch (same threshold). Pairs: every chart in ../shared/real-charts/
 * against a copy in which one colour attribute of one element is changed.
 *
 *   node --import tsx bench/diff.ts [--cold N] [--pairs N]
 *
 * warm: the browser is already running and one page is reused; plumbline's
 *       module and native renderer are loaded.
 * cold: each measurement runs in a fresh node process and covers everything
 *       after node itself has started: for the baseline importing
 *       playwright-core, launching Chromium, opening a page, both screenshots,
 *       the comparison and closing the browser; for plumbline importing its
 *       raster modules (transpiled from TypeScript on the fly, which a
 *       published build would not need) and the diff.
 *
 * Needs Chromium at /usr/bin/chromium (Debian: apt-get install chromium).
 * Also prints what loading the bundled fonts costs per render.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import pixelmatch from 'pixelmatch';
import { PNG } from 'pngjs';

const here = path.dirname(fileURLToPath(import.meta.url));
const repoRoot = path.resolve(here, '..');
const realChartsDir = path.resolve(repoRoot, '../shared/real-charts');
const CHROMIUM = '/usr/bin/chromium';
const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];
const THRESHOLD = 0.1;

export interface Pair {
  name: string;
  before: string;
  after: string;
}

// A colour value of a fill, stroke or color property, as attribute or CSS.
const COLOUR_USE =
  /((?:fill|stroke|color)\s*(?:=\s*["']|:\s*))(#[0-9a-fA-F]{6}\b|#[0-9a-fA-F]{3}\b|rgb\(\s*\d+\s*,\s*\d+\s*,\s*\d+\s*\))/g;

function parseColour(c: string): [number, number, number] {
  if (c.startsWith('rgb')) {
    const [r, g, b] = c.match(/\d+/g)!.map(Number);
    return [r, g, b];
  }
  const hex = c.length === 4 ? [...c.slice(1)].map((h) => h + h).join('') : c.slice(1);
  return [0, 2, 4].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];
}

/** Spans of `<defs>` sections: colours there may only show through a `<use>` that overrides them. */
function defsSpans(svg: string): [number, number][] {
  const spans: [number, number][] = [];
  for (const m of svg.matchAll(/<defs\b[\s\S]*?<\/defs>/g)) spans.push([m.index!, m.index! + m[0].length]);
  return spans;
}

/**
 * The chart with one colour attribute changed: among the chromatic
 * fill/stroke/color values outside `<defs>` (fills preferred), the middle one
 * is set to a clearly different colour.
 */
export function changeOneColour(svg: string): string | null {
  const defs = defsSpans(svg);
  const uses = [...svg.matchAll(COLOUR_USE)].filter((m) => {
    if (defs.some(([a, b]) => m.index! >= a && m.index! < b)) return false;
    const [r, g, b] = parseColour(m[2]);
    return Math.max(r, g, b) - Math.min(r, g, b) >= 40;
  });
  const fills = uses.filter((m) => m[1].startsWith('fill'));
  const pool = fills.length > 0 ? fills : uses;
  if (pool.length === 0) return null;
  const m = pool[Math.floor(pool.length / 2)];
  const [r, g, b] = parseColour(m[2]);
  const replacement = r > g && r > b ? '#1f9e3a' : '#d62728';
  const start = m.index! + m[1].length;
  return svg.slice(0, start) + replacement + svg.slice(start + m[2].length);
}

export function loadPairs(limit = Infinity): Pair[] {
  const files = readdirSync(realChartsDir)
    .filter((f) => f.endsWith('.svg'))
    .sort();
  const pairs: Pair[] = [];
  for (const f of files) {
    const before = readFileSync(path.join(realChartsDir, f), 'utf8');
    const after = changeOneColour(before);
    if (after !== null) pairs.push({ name: f, before, after });
    if (pairs.length >= limit) break;
  }
  return pairs;
}

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

// ---------------------------------------------------------------- baseline

interface BrowserPage {
  goto(url: string): Promise<unknown>;
  locator(selector: string): { first(): { screenshot(o: { type: 'png' }): Promise<Buffer> } };
}

async function screenshot(page: BrowserPage, svg: string): Promise<PNG> {
  await page.goto(`data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`);
  const png = await page.locator(':root').first().screenshot({ type: 'png' });
  return PNG.sync.read(png);
}

/** Screenshot both, compare with pixelmatch; returns the changed pixel count. */
async function baselineDiff(page: BrowserPage, pair: Pair): Promise<number> {
  const a = await screenshot(page, pair.before);
  const b = await screenshot(page, pair.after);
  if (a.width !== b.width || a.height !== b.height) throw new Error(`${pair.name}: screenshot sizes differ`);
  const out = new Uint8Array(a.data.length);
  return pixelmatch(a.data, b.data, out, a.width, a.height, { threshold: THRESHOLD, diffMask: true });
}

async function launchBrowser() {
  const { chromium } = await import('playwright-core');
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  const page = await browser.newPage({ viewport: { width: 1200, height: 1000 }, deviceScaleFactor: 1 });
  return { browser, page };
}

// ---------------------------------------------------------------- child runs (cold)

async function child(kind: string, index: number): Promise<void> {
  const pair = loadPairs(index + 1)[index];
  const t0 = performance.now();
  let changed: number;
  if (kind === 'chromium') {
    const { browser, page } = await launchBrowser();
    changed = await baselineDiff(page, pair);
    await browser.close();
  } else {
    const { diffSvgTexts } = await import('../engine/raster/diff-svgs.js');
    const r = await diffSvgTexts(pair.before, pair.after, { threshold: THRESHOLD });
    changed = r.changedPixels;
  }
  process.stdout.write(JSON.stringify({ ms: performance.now() - t0, changed }) + '\n');
}

function spawnChild(kind: string, index: number): { ms: number; changed: number } {
  const res = spawnSync(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url), '--child', kind, String(index)], {
    cwd: repoRoot,
    encoding: 'utf8',
    timeout: 120_000,
  });
  if (res.status !== 0) throw new Error(`cold ${kind} #${index} failed: ${res.stderr}`);
  return JSON.parse(res.stdout.trim().split('\n').pop()!) as { ms: number; changed: number };
}

// ---------------------------------------------------------------- main

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(name);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

export async function run(opts: { pairs?: number; cold?: number; reps?: number } = {}): Promise<{
  warmRatio: number;
  coldRatio: number;
}> {
  if (!existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} not found: apt-get install -y chromium`);
  const { diffSvgTexts } = await import('../engine/raster/diff-svgs.js');
  const { Resvg } = await import('@resvg/resvg-js');
  const { bundledFontFiles } = await import('../engine/raster/fonts.js');
  const pairs = loadPairs(opts.pairs ?? Infinity);
  const reps = opts.reps ?? 3;
  const coldN = Math.min(opts.cold ?? 8, pairs.length);
  console.log(`pairs: ${pairs.length} real charts, each vs a copy with one colour attribute changed`);

  // Fonts: cost of building the font database, which resvg-js does on every render.
  const empty = '<svg xmlns="http://www.w3.org/2000/svg" width="4" height="4"/>';
  const fontFiles = bundledFontFiles();
  const timeIt = (fn: () => void, n: number) => {
    const t = performance.now();
    for (let i = 0; i < n; i++) fn();
    return (performance.now() - t) / n;
  };
  timeIt(() => new Resvg(empty, { font: { loadSystemFonts: false, fontFiles } }).render(), 20);
  const withFonts = timeIt(() => new Resvg(empty, { font: { loadSystemFonts: false, fontFiles } }).render(), 200);
  const noFonts = timeIt(() => new Resvg(empty, { font: { loadSystemFonts: false } }).render(), 200);
  const fontLoadMs = withFonts - noFonts;

  // Warm.
  const { browser, page } = await launchBrowser();
  for (const p of pairs.slice(0, 3)) {
    await baselineDiff(page, p);
    await diffSvgTexts(p.before, p.after, { threshold: THRESHOLD });
  }
  const rows: { name: string; ours: number; base: number; oursChanged: number; baseChanged: number; withComposite: number }[] = [];
  for (const p of pairs) {
    const ours: number[] = [];
    const withComposite: number[] = [];
    const base: number[] = [];
    let oursChanged = 0;
    let baseChanged = 0;
    for (let r = 0; r < reps; r++) {
      let t = performance.now();
      const d = await diffSvgTexts(p.before, p.after, { threshold: THRESHOLD });
      ours.push(performance.now() - t);
      oursChanged = d.changedPixels;
      t = performance.now();
      await diffSvgTexts(p.before, p.after, { threshold: THRESHOLD, composite: true });
      withComposite.push(performance.now() - t);
      t = performance.now();
      baseChanged = await baselineDiff(page, p);
      base.push(performance.now() - t);
    }
    rows.push({ name: p.name, ours: median(ours), base: median(base), oursChanged, baseChanged, withComposite: median(withComposite) });
  }
  await browser.close();

  // Identical texts (no render at all).
  const same = pairs[0].before;
  const identicalMs = timeIt(() => void diffSvgTexts(same, same), 50);

  // Cold.
  const cold: { ours: number; base: number }[] = [];
  for (let i = 0; i < coldN; i++) {
    const idx = Math.floor((i * pairs.length) / coldN);
    const b = spawnChild('chromium', idx);
    const o = spawnChild('plumbline', idx);
    cold.push({ ours: o.ms, base: b.ms });
  }

  console.log('\nper pair (warm, median of %d): chart, plumbline ms, chromium+pixelmatch ms, ratio, changed px plumbline/chromium', reps);
  for (const r of rows) {
    console.log(
      `  ${r.name.padEnd(36)} ${r.ours.toFixed(1).padStart(7)} ${r.base.toFixed(1).padStart(8)} ${(r.base / r.ours).toFixed(1).padStart(6)}x  ${r.oursChanged}/${r.baseChanged}`,
    );
  }
  const warmRatio = median(rows.map((r) => r.base / r.ours));
  const warmCompositeRatio = median(rows.map((r) => r.base / r.withComposite));
  const coldRatio = median(cold.map((c) => c.base / c.ours));
  const missed = rows.filter((r) => r.oursChanged === 0 && r.baseChanged > 0).map((r) => r.name);
  console.log('\nfonts: building the font database from %d bundled files costs %s ms per render (resvg-js 2.6.2 has no in-memory font option)', fontFiles.length, fontLoadMs.toFixed(2));
  console.log('       = %s%% of the median plumbline diff of one pair (two renders)', ((2 * fontLoadMs * 100) / median(rows.map((r) => r.ours))).toFixed(1));
  console.log('identical texts: %s ms per diff (hash comparison, no render)', identicalMs.toFixed(3));
  console.log('\nwarm: median plumbline %s ms, chromium+pixelmatch %s ms', median(rows.map((r) => r.ours)).toFixed(1), median(rows.map((r) => r.base)).toFixed(1));
  console.log('warm: median ratio %sx (goal >= 4x)', warmRatio.toFixed(1));
  console.log('warm, plumbline also writing the three-panel PNG: median ratio %sx', warmCompositeRatio.toFixed(1));
  console.log('cold (%d pairs, fresh process each): median plumbline %s ms, chromium+pixelmatch %s ms', coldN, median(cold.map((c) => c.ours)).toFixed(0), median(cold.map((c) => c.base)).toFixed(0));
  console.log('cold: median ratio %sx (goal >= 10x)', coldRatio.toFixed(1));
  if (missed.length > 0) console.log('WARNING: plumbline found no change where chromium did:', missed.join(', '));
  return { warmRatio, coldRatio };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const ci = process.argv.indexOf('--child');
  if (ci >= 0) {
    await child(process.argv[ci + 1], Number(process.argv[ci + 2]));
  } else {
    await run({ pairs: arg('--pairs', Infinity), cold: arg('--cold', 8) });
  }
}
