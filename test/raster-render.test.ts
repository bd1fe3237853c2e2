import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Resvg } from '@resvg/resvg-js';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BUNDLED_FACES, bundledFontDir } from '../engine/raster/fonts.js';
import {
  RasterInputError,
  intrinsicSize,
  prepareSvg,
  renderPng,
  renderSvg,
  renderSvgAsync,
  type PreparedSvg,
  type RgbaImage,
} from '../engine/raster/render.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const realChartsDir = path.resolve(repoRoot, '../shared/real-charts');
const require = createRequire(import.meta.url);

/** Minimal view of opentype.js 2.0.0, which ships no type declarations. */
interface OtGlyph {
  advanceWidth: number;
  getBoundingBox(): { x1: number; y1: number; x2: number; y2: number };
}
interface OtFont {
  unitsPerEm: number;
  names: { windows?: { fontFamily?: { en?: string } }; macintosh?: { fontFamily?: { en?: string } } };
  charToGlyph(ch: string): OtGlyph;
}
const opentype = require('opentype.js') as { parse(buf: ArrayBuffer): OtFont };

function loadFont(file: string): OtFont {
  const buf = readFileSync(path.join(bundledFontDir(), file));
  return opentype.parse(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer);
}

/** Ink bounds of a string laid out glyph by glyph (no kerning) at `size` px, baseline at (x, y). */
function expectedInk(font: OtFont, text: string, x: number, y: number, size: number) {
  const k = size / font.unitsPerEm;
  let pen = x;
  const box = { x1: Infinity, x2: -Infinity, y1: Infinity, y2: -Infinity };
  for (const ch of text) {
    const g = font.charToGlyph(ch);
    const b = g.getBoundingBox();
    box.x1 = Math.min(box.x1, pen + b.x1 * k);
    box.x2 = Math.max(box.x2, pen + b.x2 * k);
    box.y1 = Math.min(box.y1, y - b.y2 * k);
    box.y2 = Math.max(box.y2, y - b.y1 * k);
    pen += g.advanceWidth * k;
  }
  return box;
}

/** Bounds of pixels with non-zero alpha; null when the image is blank. */
function inkBounds(img: RgbaImage) {
  let x1 = Infinity;
  let y1 = Infinity;
  let x2 = -1;
  let y2 = -1;
  for (let y = 0; y < img.height; y++) {
    for (let x = 0; x < img.width; x++) {
      if (img.rgba[(y * img.width + x) * 4 + 3] === 0) continue;
      x1 = Math.min(x1, x);
      y1 = Math.min(y1, y);
      x2 = Math.max(x2, x + 1);
      y2 = Math.max(y2, y + 1);
    }
  }
  return x2 < 0 ? null : { x1, y1, x2, y2 };
}

function countAlpha(img: RgbaImage): number {
  let n = 0;
  for (let i = 3; i < img.rgba.length; i += 4) if (img.rgba[i] !== 0) n++;
  return n;
}

function redPng(): Buffer {
  const png = new PNG({ width: 4, height: 4 });
  for (let i = 0; i < 16; i++) {
    png.data[i * 4] = 255;
    png.data[i * 4 + 3] = 255;
  }
  return PNG.sync.write(png);
}

function textSvg(family: string, text: string, extra = ''): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="240" height="60"><text x="10" y="40" font-size="24" font-family="${family}" ${extra}>${text}</text></svg>`;
}

describe('renderSvg', () => {
  it('renders the same SVG to identical pixels twice', () => {
    const svg = readFileSync(path.join(realChartsDir, 'gg-line-minimal-clean-01.svg'), 'utf8');
    const a = renderSvg(svg);
    const b = renderSvg(svg);
    expect(a.width).toBe(b.width);
    expect(a.height).toBe(b.height);
    expect(Buffer.compare(Buffer.from(a.rgba), Buffer.from(b.rgba))).toBe(0);
  });

  it('sync and thread-pool renders agree byte for byte', async () => {
    const svg = readFileSync(path.join(realChartsDir, 'vl-bar-clean-01.svg'), 'utf8');
    const a = renderSvg(svg, { background: 'white' });
    const b = await renderSvgAsync(svg, { background: 'white' });
    expect(Buffer.compare(Buffer.from(a.rgba), Buffer.from(b.rgba))).toBe(0);
  });

  it('draws text with the bundled fonts although system fonts are off', () => {
    // Expected ink extents come from the font files themselves, read with
    // opentype.js (an independent TrueType parser): glyph bounding boxes and
    // advance widths, scaled to 24 px. A rasterised edge may add up to 1 px.
    const cases: [string, string, string][] = [
      ['sans-serif', 'DejaVuSans.ttf', ''],
      ['monospace', 'DejaVuSansMono.ttf', ''],
      ['serif', 'DejaVuSerif.ttf', ''],
      ['sans-serif', 'DejaVuSans-Bold.ttf', 'font-weight="bold"'],
      ['NoSuchFamily, Arial', 'DejaVuSans.ttf', ''],
    ];
    const widths: number[] = [];
    for (const [family, file, extra] of cases) {
      const img = renderSvg(textSvg(family, 'MMMMMM', extra));
      const ink = inkBounds(img);
      expect(ink, `${family} drew nothing`).not.toBeNull();
      const want = expectedInk(loadFont(file), 'MMMMMM', 10, 40, 24);
      expect(Math.abs(ink!.x1 - want.x1), `${family} left`).toBeLessThanOrEqual(1);
      expect(Math.abs(ink!.x2 - want.x2), `${family} right`).toBeLessThanOrEqual(1);
      expect(Math.abs(ink!.y1 - want.y1), `${family} top`).toBeLessThanOrEqual(1);
      expect(Math.abs(ink!.y2 - want.y2), `${family} bottom`).toBeLessThanOrEqual(1);
      widths.push(want.x2 - want.x1);
    }
    // The check tells the families apart: their expected widths differ by several pixels.
    expect(Math.abs(widths[0] - widths[1])).toBeGreaterThan(10);
    expect(Math.abs(widths[0] - widths[2])).toBeGreaterThan(10);
  });

  it('maps generic families the same way in style attributes and style sheets', () => {
    const viaAttr = renderSvg(textSvg('monospace', 'Ledger 42'));
    const viaStyle = renderSvg(
      `<svg xmlns="http://www.w3.org/2000/svg" width="240" height="60"><style>.t { font-family: "Courier New", monospace; }</style><text class="t" x="10" y="40" font-size="24">Ledger 42</text></svg>`,
    );
    const viaInline = renderSvg(
      `<svg xmlns="http://www.w3.org/2000/svg" width="240" height="60"><text style="font-family: monospace" x="10" y="40" font-size="24">Ledger 42</text></svg>`,
    );
    expect(Buffer.compare(Buffer.from(viaAttr.rgba), Buffer.from(viaStyle.rgba))).toBe(0);
    expect(Buffer.compare(Buffer.from(viaAttr.rgba), Buffer.from(viaInline.rgba))).toBe(0);
  });

  it('the bundled files carry the family names the mapping relies on', () => {
    // source: each font's own name table, read with opentype.js
    for (const face of BUNDLED_FACES) {
      const font = loadFont(face.file);
      const family = font.names.windows?.fontFamily?.en ?? font.names.macintosh?.fontFamily?.en;
      expect(family, face.file).toBe(face.family);
    }
  });

  it('honours width, scale and background', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="50" height="20"><rect x="0" y="0" width="10" height="10" fill="#00f"/></svg>';
    expect(renderSvg(svg)).toMatchObject({ width: 50, height: 20 });
    expect(renderSvg(svg, { width: 100 })).toMatchObject({ width: 100, height: 40 });
    expect(renderSvg(svg, { scale: 0.5 })).toMatchObject({ width: 25, height: 10 });
    const bg = renderSvg(svg, { background: '#ff0000' });
    const last = bg.rgba.length - 4;
    expect([...bg.rgba.subarray(last, last + 4)]).toEqual([255, 0, 0, 255]);
    expect(renderSvg(svg).rgba[last + 3]).toBe(0);
  });

  it('renderPng returns a PNG of the rendered size', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="30" height="12"><circle cx="6" cy="6" r="5"/></svg>';
    const png = PNG.sync.read(renderPng(svg, { width: 60 }));
    expect(png.width).toBe(60);
    expect(png.height).toBe(24);
  });

  it('every real chart renders, non-blank, at its own size', () => {
    const files = readdirSync(realChartsDir).filter((f) => f.endsWith('.svg'));
    expect(files.length).toBeGreaterThanOrEqual(40);
    for (const f of files) {
      const svg = readFileSync(path.join(realChartsDir, f), 'utf8');
      const own = intrinsicSize(svg);
      const img = renderSvg(svg, { scale: 0.5 });
      expect(img.width, f).toBe(Math.ceil(own.width * 0.5));
      expect(countAlpha(img), f).toBeGreaterThan(img.width * img.height * 0.05);
    }
  });

  it('refuses bad input with a clear error', () => {
    const ok = '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"/>';
    expect(() => renderSvg('')).toThrow(RasterInputError);
    expect(() => renderSvg(42 as unknown as string)).toThrow(/must be a string/);
    expect(() => renderSvg('<svg><g></svg>')).toThrow(RasterInputError);
    expect(() => renderSvg('not xml at all')).toThrow(RasterInputError);
    expect(() => renderSvg(ok, { width: 10, scale: 2 })).toThrow(/either width or scale/);
    expect(() => renderSvg(ok, { width: -3 })).toThrow(/positive/);
    expect(() => renderSvg(ok, { scale: Number.NaN })).toThrow(/positive/);
    expect(() => renderSvg('<svg xmlns="http://www.w3.org/2000/svg" width="100000" height="100000"/>')).toThrow(
      /more than the limit/,
    );
    expect(() =>
      renderSvg('<!DOCTYPE svg [<!ENTITY a "b">]><svg xmlns="http://www.w3.org/2000/svg" width="4" height="4"/>'),
    ).toThrow(/entities/);
  });

  it('renders only prepared SVGs that prepareSvg made', async () => {
    const forged = Object.freeze({ width: 10, height: 10 }) as PreparedSvg;
    await expect(renderSvgAsync(forged)).rejects.toThrow(/prepareSvg/);
    const real = prepareSvg('<svg xmlns="http://www.w3.org/2000/svg" width="12" height="8"/>');
    expect(real).toEqual({ width: 12, height: 8 });
    expect(await renderSvgAsync(real, { width: 24 })).toMatchObject({ width: 24, height: 16 });
  });
});

describe('no external resources', () => {
  let dir: string;
  let server: http.Server;
  let port = 0;
  let requests = 0;
  const png = redPng();

  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'plumbline-raster-'));
    writeFileSync(path.join(dir, 'red.png'), png);
    writeFileSync(
      path.join(dir, 'red.svg'),
      '<svg xmlns="http://www.w3.org/2000/svg" width="4" height="4"><rect width="4" height="4" fill="red"/></svg>',
    );
    writeFileSync(path.join(dir, 'red.css'), 'rect { fill: red }');
    server = http.createServer((_req, res) => {
      requests++;
      res.writeHead(200, { 'content-type': 'image/png' });
      res.end(png);
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    port = (server.address() as AddressInfo).port;
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
    rmSync(dir, { recursive: true, force: true });
  });

  const imageSvg = (href: string, element = 'image') =>
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="20" height="20"><${element} x="0" y="0" width="20" height="20" href="${href}"/></svg>`;

  it('resvg-js on its own would draw a local file (the hazard these tests guard against)', () => {
    const raw = new Resvg(imageSvg(path.join(dir, 'red.png')), { font: { loadSystemFonts: false }, logLevel: 'off' });
    const px = raw.render().pixels;
    expect(px[0]).toBe(255);
    expect(px[3]).toBe(255);
  });

  it('never reads files named by image hrefs, in any spelling', () => {
    const abs = path.join(dir, 'red.png');
    const hrefs = [
      'file:///etc/passwd',
      '/etc/passwd',
      abs,
      `file://${abs}`,
      path.relative(process.cwd(), abs),
      path.join(dir, 'red.svg'),
    ];
    for (const href of hrefs) {
      for (const attr of ['href', 'xlink:href']) {
        const svg = imageSvg(href).replace(' href=', ` ${attr}=`);
        const img = renderSvg(svg);
        expect(countAlpha(img), `${attr}=${href}`).toBe(0);
      }
    }
  });

  it('never reads files through a filter image', () => {
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><filter id="f"><feImage href="${path.join(dir, 'red.png')}"/></filter><rect width="20" height="20" fill="#000" filter="url(#f)"/></svg>`;
    const img = renderSvg(svg);
    for (let i = 0; i < img.rgba.length; i += 4) expect(img.rgba[i]).not.toBe(255);
  });

  it('never fetches http hrefs', async () => {
    const img = renderSvg(imageSvg(`http://127.0.0.1:${port}/red.png`));
    const img2 = await renderSvgAsync(imageSvg(`http://127.0.0.1:${port}/red.png`));
    // Give a stray request time to arrive before counting.
    await new Promise((r) => setTimeout(r, 100));
    expect(requests).toBe(0);
    expect(countAlpha(img)).toBe(0);
    expect(countAlpha(img2)).toBe(0);
  });

  it('never loads style sheets', () => {
    const css = path.join(dir, 'red.css');
    const svgs = [
      `<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><style>@import url("${css}");</style><rect width="20" height="20" fill="#000"/></svg>`,
      `<?xml-stylesheet href="${css}" type="text/css"?><svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><rect width="20" height="20" fill="#000"/></svg>`,
    ];
    for (const svg of svgs) {
      const img = renderSvg(svg);
      expect(img.rgba[0]).toBe(0);
      expect(img.rgba[3]).toBe(255);
    }
  });

  const feImageSvg = (href: string) =>
    `<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><filter id="f"><feImage href="${href}"/></filter><rect width="20" height="20" fill="#000" filter="url(#f)"/></svg>`;
  const emptySvgB64 = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="0" height="0"/>').toString('base64');
  const crashingHrefs = [
    'data:,',
    'data:,abc',
    'data:text/plain,abc',
    'data:image/svg+xml,abc',
    `data:image/svg+xml;base64,${emptySvgB64}`,
  ];

  it('resvg-js on its own aborts the process on an feImage with a broken embedded SVG', () => {
    // Run in a child process: the abort would take this test process down.
    const code = `const { Resvg } = require('@resvg/resvg-js');
      new Resvg(${JSON.stringify(feImageSvg('data:,'))}, { font: { loadSystemFonts: false }, logLevel: 'off' }).render();`;
    const child = spawnSync(process.execPath, ['-e', code], { cwd: repoRoot, encoding: 'utf8', timeout: 30_000 });
    expect(child.status === 134 || child.signal === 'SIGABRT').toBe(true);
  });

  it('renders such feImage hrefs as empty instead of aborting', async () => {
    for (const href of crashingHrefs) {
      expect(renderSvg(feImageSvg(href)).width, href).toBe(20);
      expect((await renderSvgAsync(feImageSvg(href))).width, href).toBe(20);
    }
  });

  it('still draws embedded data: images', () => {
    const href = `data:image/png;base64,${png.toString('base64')}`;
    const img = renderSvg(imageSvg(href));
    expect(img.rgba[0]).toBe(255);
    expect(img.rgba[3]).toBe(255);
  });

  it('an embedded SVG image cannot reach files either', () => {
    const inner = `<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><image width="20" height="20" href="${path.join(dir, 'red.png')}"/><rect width="5" height="5" fill="#00f"/></svg>`;
    const href = `data:image/svg+xml;base64,${Buffer.from(inner).toString('base64')}`;
    const img = renderSvg(imageSvg(href));
    let red = 0;
    let blue = 0;
    for (let i = 0; i < img.rgba.length; i += 4) {
      if (img.rgba[i] > 200 && img.rgba[i + 3] > 200) red++;
      if (img.rgba[i + 2] > 200 && img.rgba[i + 3] > 200) blue++;
    }
    expect(blue).toBeGreaterThan(0);
    expect(red).toBe(0);
  });
});
