/**
 * Pixel diff, three-panel picture and SVG diff.
 *
 * Golden images: test/fixtures/raster/*.diff.png are the expected three-panel
 * pictures for pairs of fixtures. Regenerate them after an intended change of
 * the picture with
 *
 *     PLUMBLINE_UPDATE_GOLDEN=1 npx vitest run test/raster-diff.test.ts
 *
 * and look at the new files before committing them.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pixelmatch from 'pixelmatch';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { compositeRgba } from '../engine/raster/composite.js';
import { DEFAULT_HIGHLIGHT, diffImages, findRegions } from '../engine/raster/diff-pixels.js';
import { diffSvgTexts } from '../engine/raster/diff-svgs.js';
import { RasterInputError } from '../engine/raster/errors.js';
import { renderSvg, type RgbaImage } from '../engine/raster/render.js';

const here = path.dirname(fileURLToPath(import.meta.url));
const repoRoot = path.resolve(here, '..');
const fixtures = path.join(here, 'fixtures', 'raster');
const realChartsDir = path.resolve(repoRoot, '../shared/real-charts');
const updateGolden = process.env.PLUMBLINE_UPDATE_GOLDEN === '1';

const fixture = (name: string) => readFileSync(path.join(fixtures, name), 'utf8');
const realChart = (name: string) => readFileSync(path.join(realChartsDir, name), 'utf8');

function solid(width: number, height: number, rgba: [number, number, number, number]): RgbaImage {
  const data = new Uint8Array(width * height * 4);
  for (let i = 0; i < width * height; i++) data.set(rgba, i * 4);
  return { width, height, rgba: data };
}

function paint(img: RgbaImage, x0: number, y0: number, w: number, h: number, rgba: [number, number, number, number]): void {
  for (let y = y0; y < y0 + h; y++) for (let x = x0; x < x0 + w; x++) img.rgba.set(rgba, (y * img.width + x) * 4);
}

describe('diffImages', () => {
  it('finds nothing between identical images', () => {
    const a = solid(20, 10, [255, 255, 255, 255]);
    const d = diffImages(a, solid(20, 10, [255, 255, 255, 255]));
    expect(d).toMatchObject({ width: 20, height: 10, changedPixels: 0, changedShare: 0, regions: [] });
  });

  it('reports each separate change as its own tight region', () => {
    // Expected values follow from the blocks painted here.
    const a = solid(100, 60, [255, 255, 255, 255]);
    const b = solid(100, 60, [255, 255, 255, 255]);
    paint(b, 10, 10, 5, 4, [0, 0, 0, 255]);
    paint(b, 70, 40, 8, 8, [0, 0, 0, 255]);
    const d = diffImages(a, b, { includeAntialiasing: true });
    expect(d.changedPixels).toBe(5 * 4 + 8 * 8);
    expect(d.changedShare).toBeCloseTo(84 / 6000, 10);
    expect(d.regions).toEqual([
      { x: 70, y: 40, width: 8, height: 8, changedPixels: 64 },
      { x: 10, y: 10, width: 5, height: 4, changedPixels: 20 },
    ]);
  });

  it('joins changes closer than the region gap', () => {
    const a = solid(100, 60, [255, 255, 255, 255]);
    const b = solid(100, 60, [255, 255, 255, 255]);
    paint(b, 10, 10, 4, 4, [0, 0, 0, 255]);
    paint(b, 18, 10, 4, 4, [0, 0, 0, 255]); // 4 px apart: below the default gap of 8
    const d = diffImages(a, b, { includeAntialiasing: true });
    expect(d.regions).toEqual([{ x: 10, y: 10, width: 12, height: 4, changedPixels: 32 }]);
    const apart = diffImages(a, b, { includeAntialiasing: true, regionGap: 2 });
    expect(apart.regions.length).toBe(2);
  });

  it('pads different sizes and counts the uncovered part as changed', () => {
    // 10×10 vs 12×10: the two extra columns are covered by one image only.
    const white = diffImages(solid(10, 10, [255, 255, 255, 255]), solid(12, 10, [255, 255, 255, 255]));
    expect(white).toMatchObject({ width: 12, height: 10, changedPixels: 20 });
    expect(white.regions).toEqual([{ x: 10, y: 0, width: 2, height: 10, changedPixels: 20 }]);
    // Dark pixels too (pixelmatch alone blends transparency with a dark backdrop).
    const black = diffImages(solid(10, 12, [0, 0, 0, 255]), solid(10, 10, [0, 0, 0, 255]));
    expect(black).toMatchObject({ width: 10, height: 12, changedPixels: 20 });
    // Fully transparent pixels next to padding are not a change.
    const clear = diffImages(solid(10, 10, [0, 0, 0, 0]), solid(12, 10, [0, 0, 0, 0]));
    expect(clear.changedPixels).toBe(0);
  });

  it('follows pixelmatch threshold semantics', () => {
    // source: pixelmatch README — threshold 0..1 on the YIQ colour distance, default 0.1
    const a = solid(10, 10, [0x44, 0x77, 0xaa, 255]);
    expect(diffImages(a, solid(10, 10, [0x44, 0x77, 0xab, 255])).changedPixels).toBe(0);
    expect(diffImages(a, solid(10, 10, [0x44, 0x77, 0xab, 255]), { threshold: 0 }).changedPixels).toBe(100);
    expect(diffImages(a, solid(10, 10, [0xee, 0x66, 0x77, 255])).changedPixels).toBe(100);
  });

  it('marks changed pixels in diffRgba with the highlight colour', () => {
    const a = solid(4, 4, [255, 255, 255, 255]);
    const b = solid(4, 4, [255, 255, 255, 255]);
    paint(b, 1, 1, 1, 1, [0, 0, 0, 255]);
    const d = diffImages(a, b, { includeAntialiasing: true });
    const at = (x: number, y: number) => [...d.diffRgba.subarray((y * 4 + x) * 4, (y * 4 + x) * 4 + 4)];
    expect(at(1, 1)).toEqual([...DEFAULT_HIGHLIGHT, 255]);
    expect(at(0, 0)).toEqual([0, 0, 0, 0]);
  });

  it('refuses malformed images and options', () => {
    const ok = solid(2, 2, [0, 0, 0, 255]);
    expect(() => diffImages({ width: 2, height: 2, rgba: new Uint8Array(3) }, ok)).toThrow(RasterInputError);
    expect(() => diffImages({ width: 0, height: 2, rgba: new Uint8Array(0) }, ok)).toThrow(/invalid size/);
    expect(() => diffImages(ok, ok, { threshold: 2 })).toThrow(/threshold/);
    expect(() => diffImages(ok, ok, { regionGap: 0 })).toThrow(/regionGap/);
    expect(() => findRegions(new Uint8Array(5), 2, 2, 8)).toThrow(RasterInputError);
  });

  it('groups a large noisy mask in linear time without exhausting the stack', () => {
    const w = 1500;
    const h = 1000;
    const mask = new Uint8Array(w * h * 4);
    for (let i = 0; i < w * h; i += 3) mask[i * 4 + 3] = 255; // every third pixel
    const regions = findRegions(mask, w, h, 1);
    const total = regions.reduce((s, r) => s + r.changedPixels, 0);
    expect(total).toBe(Math.ceil((w * h) / 3));
  });
});

describe('compositeRgba', () => {
  it('lays out before | after | difference with a gutter', () => {
    const before = solid(10, 6, [10, 20, 30, 255]);
    const after = solid(10, 6, [10, 20, 30, 255]);
    paint(after, 2, 2, 2, 2, [200, 0, 0, 255]);
    const d = diffImages(before, after, { includeAntialiasing: true });
    const c = compositeRgba(before, after, d, { gutter: 3, frameMargin: -1 });
    expect(c.width).toBe(3 * 10 + 2 * 3);
    expect(c.height).toBe(6);
    const px = (x: number, y: number) => [...c.rgba.subarray((y * c.width + x) * 4, (y * c.width + x) * 4 + 4)];
    expect(px(0, 0)).toEqual([10, 20, 30, 255]); // before
    expect(px(13 + 2, 2)).toEqual([200, 0, 0, 255]); // after, changed block
    expect(px(10, 0)).toEqual([208, 208, 208, 255]); // gutter
    expect(px(26 + 2, 2)).toEqual([...DEFAULT_HIGHLIGHT, 255]); // difference: changed pixel
    const faded = px(26, 0);
    expect(faded[0]).toBe(faded[1]); // grey
    expect(faded[0]).toBeGreaterThan(150); // lighter than the dark original
  });
});

describe('golden three-panel pictures', () => {
  const pairs: [string, string][] = [
    ['bars.svg', 'bars-taller.svg'],
    ['bars.svg', 'bars-recoloured.svg'],
  ];
  for (const [beforeName, afterName] of pairs) {
    it(`${beforeName} → ${afterName}`, async () => {
      const goldenPath = path.join(fixtures, `${beforeName.replace('.svg', '')}--${afterName.replace('.svg', '')}.diff.png`);
      const result = await diffSvgTexts(fixture(beforeName), fixture(afterName), { composite: true });
      expect(result.identical).toBe(false);
      if (result.identical) return;
      const png = result.compositePng!;
      if (updateGolden) {
        writeFileSync(goldenPath, png);
        return;
      }
      expect(existsSync(goldenPath), `missing ${goldenPath}; run with PLUMBLINE_UPDATE_GOLDEN=1`).toBe(true);
      const want = PNG.sync.read(readFileSync(goldenPath));
      const got = PNG.sync.read(png);
      expect([got.width, got.height]).toEqual([want.width, want.height]);
      const mismatched = pixelmatch(got.data, want.data, undefined, got.width, got.height, { threshold: 0.1 });
      // Tolerance: at most 0.1 % of pixels may differ (rasteriser edge noise across CPUs).
      expect(mismatched / (got.width * got.height)).toBeLessThanOrEqual(0.001);
    });
  }

  it('a taller bar is found where the fixture grew it', async () => {
    // Expected from the fixtures' coordinates: bar 2 (x 70..100) grows from y = 60 to y = 30.
    const r = await diffSvgTexts(fixture('bars.svg'), fixture('bars-taller.svg'));
    expect(r.identical).toBe(false);
    expect(r.width).toBe(200);
    expect(r.height).toBe(130);
    expect(r.changedPixels).toBe(30 * 30);
    expect(r.regions).toEqual([{ x: 70, y: 30, width: 30, height: 30, changedPixels: 900 }]);
  });

  it('a recoloured bar changes exactly its area', async () => {
    // Expected from the fixtures' coordinates: bar 3 covers x 110..140, y 40..110.
    const r = await diffSvgTexts(fixture('bars.svg'), fixture('bars-recoloured.svg'));
    expect(r.changedPixels).toBe(30 * 70);
    expect(r.changedShare).toBeCloseTo(2100 / (200 * 130), 10);
    expect(r.regions).toEqual([{ x: 110, y: 40, width: 30, height: 70, changedPixels: 2100 }]);
  });

  it('a colour nudge below the threshold changes nothing', async () => {
    // source: pixelmatch README, threshold semantics (default 0.1)
    const r = await diffSvgTexts(fixture('bars.svg'), fixture('bars-nudged-colour.svg'));
    expect(r.identical).toBe(false);
    expect(r.changedPixels).toBe(0);
    expect(r.regions).toEqual([]);
  });
});

describe('diffSvgTexts', () => {
  it('returns at once for identical texts, without parsing them', async () => {
    // Not even valid SVG: a render would throw, so no render happened.
    const r = await diffSvgTexts('not svg at all', 'not svg at all', { composite: true });
    expect(r).toEqual({ identical: true, width: null, height: null, changedPixels: 0, changedShare: 0, regions: [] });
  });

  it('diffs two different real charts', async () => {
    const r = await diffSvgTexts(realChart('mpl-bar-clean-01.svg'), realChart('mpl-bar-truncated-01.svg'), {
      composite: true,
    });
    expect(r.identical).toBe(false);
    if (r.identical) return;
    expect(r.changedShare).toBeGreaterThan(0);
    expect(r.changedShare).toBeLessThanOrEqual(1);
    expect(r.regions.length).toBeGreaterThan(0);
    for (const g of r.regions) {
      expect(g.x).toBeGreaterThanOrEqual(0);
      expect(g.y).toBeGreaterThanOrEqual(0);
      expect(g.x + g.width).toBeLessThanOrEqual(r.width);
      expect(g.y + g.height).toBeLessThanOrEqual(r.height);
    }
    const sum = r.regions.reduce((s, g) => s + g.changedPixels, 0);
    expect(sum).toBe(r.changedPixels);
    const png = PNG.sync.read(r.compositePng!);
    expect(png.height).toBe(r.height);
    expect(png.width).toBe(3 * r.width + 2 * 6);
  });

  it('localises a one-attribute change in a real chart', async () => {
    const before = realChart('vl-bar-clean-01.svg');
    // The first data bar's fill changes; everything else stays.
    const after = before.replace(/(<path[^>]*aria-roledescription="bar"[^>]*fill=")([^"]+)(")/, '$1#d62728$3');
    expect(after).not.toBe(before);
    const r = await diffSvgTexts(before, after);
    if (r.identical) throw new Error('expected a difference');
    expect(r.changedShare).toBeGreaterThan(0);
    expect(r.changedShare).toBeLessThan(0.1);
    expect(r.regions.length).toBe(1);
  });

  it('renders both at the requested width, padding the shorter one', async () => {
    const wide = '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><rect width="40" height="20" fill="#888"/></svg>';
    const tall = '<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><rect width="20" height="20" fill="#888"/></svg>';
    const r = await diffSvgTexts(wide, tall, { width: 80 });
    if (r.identical) throw new Error('expected a difference');
    expect([r.width, r.height]).toEqual([80, 80]);
    // Rows 40..79 exist only in the second render.
    expect(r.changedPixels).toBe(80 * 40);
  });

  it('refuses bad input with a clear error', async () => {
    await expect(diffSvgTexts(1 as unknown as string, 'x')).rejects.toThrow(RasterInputError);
    await expect(diffSvgTexts('<svg', '<svg/>')).rejects.toThrow(RasterInputError);
    const ok = '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"/>';
    await expect(diffSvgTexts(ok, ok.replace('10"/', '11"/'), { width: 0 })).rejects.toThrow(/width/);
  });
});

// Keep the fixtures honest: they render as described in the comments above.
describe('fixtures', () => {
  it('render at their own size of 200 × 130', () => {
    for (const f of ['bars.svg', 'bars-taller.svg', 'bars-recoloured.svg', 'bars-nudged-colour.svg']) {
      expect(renderSvg(fixture(f))).toMatchObject({ width: 200, height: 130 });
    }
  });
});
