/**
 * The geometry readers on the shared real charts (matplotlib, ggplot2, gnuplot, Vega-Lite,
 * ECharts output): every geometry attribute those generators wrote must parse cleanly, and
 * path boxes must match an independent renderer's.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { pathBBox } from '../engine/read/geometry/measure-path.js';
import { parseLength } from '../engine/read/geometry/parse-length.js';
import { parsePath } from '../engine/read/geometry/parse-path.js';
import { parsePoints } from '../engine/read/geometry/parse-points.js';
import { parseTransform } from '../engine/read/geometry/parse-transform.js';
import { parsePreserveAspectRatio, parseViewBox } from '../engine/read/geometry/viewbox.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const chartsDir = path.resolve(repoRoot, '../shared/real-charts');
const files = fs.readdirSync(chartsDir).filter((f) => f.endsWith('.svg')).sort();

function decode(v: string): string {
  return v
    .replace(/&#x([0-9a-f]+);/gi, (_, h: string) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&#(\d+);/g, (_, d: string) => String.fromCodePoint(Number(d)))
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&amp;/g, '&');
}

/** Values of one attribute in the file, from the raw text. */
function attributeValues(text: string, name: string): string[] {
  const re = new RegExp(`\\s${name}\\s*=\\s*(?:"([^"]*)"|'([^']*)')`, 'g');
  const out: string[] = [];
  for (let m = re.exec(text); m !== null; m = re.exec(text)) out.push(decode(m[1] ?? m[2] ?? ''));
  return out;
}

describe('real charts', () => {
  it('finds the charts', () => {
    expect(files.length).toBeGreaterThanOrEqual(40);
  });

  it('parses every path, transform, viewBox, points and size attribute without error', () => {
    let paths = 0;
    let transforms = 0;
    for (const file of files) {
      const text = fs.readFileSync(path.join(chartsDir, file), 'utf8');
      for (const d of attributeValues(text, 'd')) {
        const r = parsePath(d);
        expect(r.error, `${file}: d="${d.slice(0, 60)}"`).toBeUndefined();
        paths++;
      }
      for (const t of attributeValues(text, 'transform')) {
        const r = parseTransform(t);
        expect(r.error, `${file}: transform="${t}"`).toBeUndefined();
        transforms++;
      }
      for (const v of attributeValues(text, 'viewBox')) expect(parseViewBox(v).error, `${file}: viewBox="${v}"`).toBeUndefined();
      for (const v of attributeValues(text, 'points')) expect(parsePoints(v).error, `${file}: points`).toBeUndefined();
      for (const v of attributeValues(text, 'preserveAspectRatio')) {
        expect(parsePreserveAspectRatio(v).error, `${file}: preserveAspectRatio="${v}"`).toBeUndefined();
      }
      const root = /<svg\b[^>]*>/.exec(text)?.[0] ?? '';
      for (const name of ['width', 'height']) {
        for (const v of attributeValues(root, name)) expect(parseLength(v).error, `${file}: ${name}="${v}"`).toBeUndefined();
      }
    }
    expect(paths).toBeGreaterThan(1000);
    expect(transforms).toBeGreaterThan(100);
  });

  it('gives the same path boxes as resvg', () => {
    // source: resvg 2.6 getBBox, one path per document. Paths with quadratic segments or with
    // moveto-only subpaths are skipped (resvg's box is not tight there; see geometry-measure tests).
    let compared = 0;
    for (const file of files) {
      const text = fs.readFileSync(path.join(chartsDir, file), 'utf8');
      const ds = attributeValues(text, 'd').filter((d) => !/[QqTtSs]/.test(d));
      const step = Math.max(1, Math.floor(ds.length / 40));
      for (let k = 0; k < ds.length; k += step) {
        const segments = parsePath(ds[k]).segments;
        if (segments.some((s, i) => s.type === 'M' && (i + 1 === segments.length || segments[i + 1].type === 'M'))) continue;
        const mine = pathBBox(segments);
        const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><path d="${ds[k]}"/></svg>`;
        const b = new Resvg(svg, { font: { loadSystemFonts: false } }).getBBox();
        if (!b || b.width === 0 || b.height === 0 || mine === null) continue;
        const extent = Math.max(1, Math.abs(mine.minX), Math.abs(mine.maxX), Math.abs(mine.minY), Math.abs(mine.maxY));
        const hasArc = segments.some((s) => s.type === 'A');
        const tol = 1e-5 * extent + (hasArc ? 4e-4 * extent : 0);
        const where = `${file}: d="${ds[k].slice(0, 60)}"`;
        expect(Math.abs(mine.minX - b.x), where).toBeLessThanOrEqual(tol);
        expect(Math.abs(mine.minY - b.y), where).toBeLessThanOrEqual(tol);
        expect(Math.abs(mine.maxX - (b.x + b.width)), where).toBeLessThanOrEqual(tol);
        expect(Math.abs(mine.maxY - (b.y + b.height)), where).toBeLessThanOrEqual(tol);
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(500);
  });
});
