/**
 * The HTML report in a real browser (Debian's chromium driven by
 * playwright-core): it loads from file:// without console errors, every
 * picture decodes, the page is not blank, it fits a phone's width, chart text
 * cannot inject markup, and no request leaves the page (file: and data: only).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditFile, auditText } from '../engine/audit/audit-file.js';
import { loadSvgFromDisk } from '../engine/report/format.js';
import { formatHtml, escapeHtml } from '../engine/report/format-html.js';
import { redrawPreviewer } from '../engine/report/redraw-preview.js';
import { makeReport } from '../engine/report/totals.js';
import type { FileReport } from '../engine/report/types.js';
import { REAL_CHARTS } from './support/real-charts.js';

const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'];
const CHARTS = ['mpl-bar-truncated-01.svg', 'ec-line-dual-axis-01.svg', 'mpl-heatmap-jet-01.svg', 'vl-pie-many-01.svg', 'gg-bar-truncated-01.svg'];
const HOSTILE = '&lt;img src=x onerror=alert(1)&gt;&lt;script&gt;alert(2)&lt;/script&gt; ](javascript:alert(1)) @octocat';

let dir: string;
let browser: Browser;
let reportUrl: string;
let expectedImages = 0;
let files: FileReport[];

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-html-'));
  files = [];
  const texts = new Map<string, string>();
  for (const name of CHARTS) files.push((await auditFile(join(REAL_CHARTS, name))).report);
  // A chart whose drawn title and root <title> try to inject markup.
  const evil = readFileSync(join(REAL_CHARTS, 'vl-bar-clean-01.svg'), 'utf8')
    .replaceAll('Pastries sold by weekday', HOSTILE)
    .replace(/<svg\b([^>]*)>/, `<svg$1><title>${HOSTILE}</title>`);
  const evilPath = 'charts/<img src=x onerror=alert(3)>.svg';
  texts.set(evilPath, evil);
  files.push(auditText(evil, evilPath).report);
  // A file that cannot be read.
  const brokenPath = join(dir, 'broken.svg');
  writeFileSync(brokenPath, '<svg xmlns="http://www.w3.org/2000/svg"><rect width="10"');
  files.push((await auditFile(brokenPath)).report);

  const redraw = redrawPreviewer();
  const report = makeReport(files);
  const html = await formatHtml(report, {
    loadSvg: async (p) => texts.get(p) ?? loadSvgFromDisk(p),
    redraw: (text, path) => {
      const r = redraw(text, path);
      if (r?.changed) expectedImages++;
      return r;
    },
  });
  // before pictures: every readable file
  expectedImages += files.filter((f) => f.ok).length;
  const out = join(dir, 'report.html');
  writeFileSync(out, html);
  reportUrl = pathToFileURL(out).href;
  browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
});

afterAll(async () => {
  await browser?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function open(width: number): Promise<{ errors: string[]; requests: string[]; page: Awaited<ReturnType<Browser['newPage']>> }> {
  const page = await browser.newPage({ viewport: { width, height: 900 } });
  const errors: string[] = [];
  const requests: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('request', (r) => requests.push(r.url()));
  page.on('dialog', (d) => {
    errors.push(`dialog: ${d.message()}`);
    void d.dismiss();
  });
  await page.goto(reportUrl, { waitUntil: 'load' });
  return { errors, requests, page };
}

describe('HTML report in chromium', () => {
  it('loads without console errors, with every picture decoded and no request but file: and data:', async () => {
    const { errors, requests, page } = await open(1280);
    const images = await page.$$eval('img', (imgs) => imgs.map((i) => ({ ok: (i as HTMLImageElement).complete, w: (i as HTMLImageElement).naturalWidth, src: (i as HTMLImageElement).src.slice(0, 22) })));
    expect(errors).toEqual([]);
    expect(images.length).toBe(expectedImages);
    for (const img of images) {
      expect(img.ok).toBe(true);
      expect(img.w).toBeGreaterThan(0);
      expect(img.src).toBe('data:image/png;base64,');
    }
    expect(requests.length).toBeGreaterThan(0);
    for (const url of requests) expect(url).toMatch(/^(file|data):/);
    expect(await page.$$eval('script', (s) => s.length)).toBe(0);
    await page.close();
  });

  it('shows one section per file, the hostile text as text, and the unreadable file as such', async () => {
    const { page } = await open(1280);
    expect(await page.$$eval('section.file', (s) => s.length)).toBe(files.length);
    const text = await page.textContent('body');
    expect(text).toContain('<img src=x onerror=alert(1)>');
    expect(text).toContain('charts/<img src=x onerror=alert(3)>.svg');
    expect(text).toContain('unreadable');
    // every finding is listed, worst first within its file
    const counts = await page.$$eval('section.file', (secs) => secs.map((s) => s.querySelectorAll('ol.findings > li').length));
    expect(counts).toEqual(files.map((f) => f.findings.length));
    const order = await page.$$eval('section.file', (secs) => secs.map((s) => [...s.querySelectorAll('ol.findings > li')].map((li) => li.className)));
    const rank: Record<string, number> = { error: 3, warning: 2, note: 1 };
    for (const o of order) for (let i = 1; i < o.length; i++) expect(rank[o[i - 1]!]!).toBeGreaterThanOrEqual(rank[o[i]!]!);
    await page.close();
  });

  it('is not blank: the screenshot has many non-white pixels', async () => {
    const { page } = await open(1280);
    const png = PNG.sync.read(await page.screenshot({ fullPage: false }));
    let dark = 0;
    for (let i = 0; i < png.data.length; i += 4) if (png.data[i]! < 235 || png.data[i + 1]! < 235 || png.data[i + 2]! < 235) dark++;
    // common practice, no source: a page with text, tables and chart thumbnails covers well over 2 % of its pixels
    expect(dark / (png.width * png.height)).toBeGreaterThan(0.02);
    await page.close();
  });

  it('fits a phone-width viewport without sideways scrolling of the page', async () => {
    const { page, errors } = await open(390);
    const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
    expect(errors).toEqual([]);
    expect(scroll).toBeLessThanOrEqual(client);
    const widest = await page.$$eval('figure img', (imgs) => Math.max(0, ...imgs.map((i) => i.getBoundingClientRect().right)));
    expect(widest).toBeLessThanOrEqual(390);
    await page.close();
  });
});

describe('escapeHtml', () => {
  it('escapes the five characters HTML gives meaning to', () => {
    // source: HTML Living Standard, 13.1.2.3 and 13.5 (text and attribute values)
    expect(escapeHtml(`<a href="x" title='y'>&</a>`)).toBe('&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;&amp;&lt;/a&gt;');
  });
});
