import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { multiply, type Matrix } from '../engine/read/geometry/matrix.js';
import { parseTransform } from '../engine/read/geometry/parse-transform.js';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import type { XmlElement } from '../engine/read/xml-tree.js';
import {
  GlyphRunError,
  REFERENCE_CHARACTERS,
  readGlyphRun,
  recognizeGlyph,
  type PlacedGlyph,
} from '../engine/read/fonts/index.js';

const repoRoot = path.resolve(import.meta.dirname, '..');
const realCharts = path.resolve(repoRoot, '../shared/real-charts');

// ---------------------------------------------------------------------------
// Outlines straight from the font files, through opentype.js.

interface OtCommand {
  type: string;
  x?: number;
  y?: number;
  x1?: number;
  y1?: number;
  x2?: number;
  y2?: number;
}
interface OtGlyph {
  advanceWidth: number;
  path: { commands: OtCommand[] };
  getPath(x: number, y: number, size: number): { toPathData(decimals?: number): string };
}
interface OtFont {
  unitsPerEm: number;
  charToGlyphIndex(c: string): number;
  glyphs: { get(i: number): OtGlyph };
}
const require = createRequire(import.meta.url);
const opentype = require('opentype.js') as { parse(b: ArrayBuffer): OtFont };
const fontDir = path.join(path.dirname(require.resolve('dejavu-fonts-ttf/package.json')), 'ttf');
const fonts = new Map<string, OtFont>();
function font(file: string): OtFont {
  let f = fonts.get(file);
  if (f === undefined) {
    const b = readFileSync(path.join(fontDir, file));
    f = opentype.parse(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength) as ArrayBuffer);
    fonts.set(file, f);
  }
  return f;
}
function glyphOf(f: OtFont, ch: string): OtGlyph | null {
  const i = f.charToGlyphIndex(ch);
  return i ? f.glyphs.get(i) : null;
}
/** Outline in font units, y up, as outline-text exports write it. */
function outline(g: OtGlyph, scale = 1, dx = 0, dy = 0): string {
  const p = (x = 0, y = 0) => `${(x * scale + dx).toFixed(3)} ${(y * scale + dy).toFixed(3)}`;
  return g.path.commands
    .map((c) => {
      if (c.type === 'M' || c.type === 'L') return `${c.type} ${p(c.x, c.y)}`;
      if (c.type === 'Q') return `Q ${p(c.x1, c.y1)} ${p(c.x, c.y)}`;
      if (c.type === 'C') return `C ${p(c.x1, c.y1)} ${p(c.x2, c.y2)} ${p(c.x, c.y)}`;
      return 'Z';
    })
    .join(' ');
}
/** A string laid out with the font's advances, `size` px, baseline at (x, y). */
function layout(f: OtFont, text: string, size: number, x: number, y: number): PlacedGlyph[] {
  const k = size / f.unitsPerEm;
  let pen = 0;
  const out: PlacedGlyph[] = [];
  for (const ch of text) {
    const g = glyphOf(f, ch)!;
    out.push({ pathData: outline(g), matrix: [k, 0, 0, -k, x + pen * k, y] });
    pen += g.advanceWidth;
  }
  return out;
}

// ---------------------------------------------------------------------------
// Glyph runs of the real outline-text charts, with the text their comments state.

interface LabelledRun {
  file: string;
  expected: string;
  glyphs: PlacedGlyph[];
}

const identity: Matrix = [1, 0, 0, 1, 0, 0];
const transformOf = (el: XmlElement): Matrix => {
  const t = el.attribute('transform');
  return t === undefined ? identity : parseTransform(t).matrix;
};
function worldMatrix(el: XmlElement | null): Matrix {
  const chain: XmlElement[] = [];
  for (let e = el; e !== null; e = e.parent) chain.push(e);
  return chain.reverse().reduce<Matrix>((m, e) => multiply(m, transformOf(e)), identity);
}

/**
 * Each comment of these files states the text of the element after it; that
 * element's `<use>` references (outside `<defs>`) are its glyphs.
 */
function labelledRuns(file: string): LabelledRun[] {
  const doc = parseXml(readFileSync(path.join(realCharts, file), 'utf8'));
  const all = [...walkElements(doc.root)];
  const byId = new Map<string, XmlElement>();
  for (const el of all) {
    const id = el.attribute('id');
    if (id !== undefined) byId.set(id, el);
  }
  const inDefs = (el: XmlElement) => {
    for (let e = el.parent; e !== null; e = e.parent) if (e.name === 'defs') return true;
    return false;
  };
  const runs: LabelledRun[] = [];
  for (const span of doc.comments) {
    const expected = doc.source.slice(span.start + 4, span.end - 3).trim();
    const group = all.find((el) => el.start >= span.end);
    if (group === undefined) continue;
    const glyphs: PlacedGlyph[] = [];
    for (const el of walkElements(group)) {
      if (el.name !== 'use' || inDefs(el)) continue;
      const target = byId.get((el.attribute('xlink:href') ?? el.attribute('href') ?? '').replace(/^#/, ''));
      if (target === undefined || target.name !== 'path') continue;
      const x = Number(el.attribute('x') ?? 0);
      const y = Number(el.attribute('y') ?? 0);
      let m = multiply(worldMatrix(el.parent), [1, 0, 0, 1, x, y]);
      m = multiply(multiply(m, transformOf(el)), transformOf(target));
      glyphs.push({ pathData: target.attribute('d') ?? '', matrix: m });
    }
    if (glyphs.length > 0) runs.push({ file, expected, glyphs });
  }
  return runs;
}

const manifest = JSON.parse(readFileSync(path.join(realCharts, 'manifest.json'), 'utf8')) as {
  file: string;
  textAsPaths: boolean;
}[];

describe('readGlyphRun on real outline-text charts', () => {
  const files = manifest.filter((m) => m.textAsPaths).map((m) => m.file);
  const runs = files.flatMap(labelledRuns);

  it('reads at least 95% of the labelled runs exactly', () => {
    // source: ../shared/real-charts/manifest.json (textAsPaths) and the text each file's comments state
    expect(files).toHaveLength(6);
    expect(runs.length).toBeGreaterThan(80);
    const wrong: string[] = [];
    for (const r of runs) {
      const got = readGlyphRun(r.glyphs).text;
      if (got !== r.expected) wrong.push(`${r.file}: ${JSON.stringify(r.expected)} read as ${JSON.stringify(got)}`);
    }
    const accuracy = (runs.length - wrong.length) / runs.length;
    console.log(`glyph runs read exactly: ${runs.length - wrong.length}/${runs.length} (${(accuracy * 100).toFixed(1)}%)`);
    if (wrong.length > 0) console.log(wrong.join('\n'));
    expect(accuracy).toBeGreaterThanOrEqual(0.95);
  });

  it('reads vertical axis titles along their rotated baseline', () => {
    const rotated = runs.filter((r) => r.expected === 'Trips' || r.expected === 'Level (m)');
    expect(rotated).toHaveLength(2);
    for (const r of rotated) {
      const reading = readGlyphRun(r.glyphs);
      expect(reading.text).toBe(r.expected);
      expect(reading.angle).toBeCloseTo(-90, 6);
      expect(reading.bbox!.height).toBeGreaterThan(reading.bbox!.width);
    }
  });

  it('estimates the font size the files set (10 px labels, 12 px titles)', () => {
    // source: matplotlib 3.6.3 defaults: font.size 10, axes.titlesize "large" (×1.2)
    const title = runs.find((r) => r.expected === 'Average wait for a free dock by station')!;
    const tick = runs.find((r) => r.file === 'mpl-barh-path-01.svg' && r.expected === '8')!;
    expect(readGlyphRun(title.glyphs).fontSize).toBeCloseTo(12, 1);
    expect(readGlyphRun(tick.glyphs).fontSize).toBeCloseTo(10, 1);
    const reading = readGlyphRun(title.glyphs);
    expect(reading.unrecognised).toBe(0);
    expect(reading.confidence).toBeGreaterThan(0.5);
  });
});

describe('recognizeGlyph', () => {
  it('recognises every reference character of DejaVu Sans at any scale and offset', () => {
    // source: DejaVu Sans 2.37 cmap (character → outline)
    const f = font('DejaVuSans.ttf');
    for (const ch of REFERENCE_CHARACTERS) {
      const g = glyphOf(f, ch);
      if (g === null) continue;
      // font units × 3.125 as matplotlib writes them, and a tiny scale elsewhere on the page
      expect(recognizeGlyph(outline(g, 3.125))?.char).toBe(ch);
      expect(recognizeGlyph(outline(g, 0.004, 0, 0))?.char).toBe(ch);
    }
  });

  it('reads outlines in y-down user space when told so', () => {
    const f = font('DejaVuSerif.ttf');
    for (const ch of 'Rg7%?') {
      const d = glyphOf(f, ch)!.getPath(0, 0, 40).toPathData(3);
      expect(recognizeGlyph(d, { yUp: false })?.char).toBe(ch);
    }
  });

  it('recognises most characters of faces that are not among the references', () => {
    // source: DejaVu 2.37 cmap of faces outside the reference set (condensed, bold mono, bold oblique)
    for (const [file, floor] of [
      ['DejaVuSansCondensed.ttf', 0.9],
      ['DejaVuSerifCondensed.ttf', 0.9],
      ['DejaVuSansMono-Bold.ttf', 0.9],
      ['DejaVuSans-BoldOblique.ttf', 0.88],
    ] as const) {
      const f = font(file);
      let right = 0;
      let total = 0;
      for (const ch of REFERENCE_CHARACTERS) {
        const g = glyphOf(f, ch);
        if (g === null) continue;
        total++;
        if (recognizeGlyph(outline(g))?.char === ch) right++;
      }
      console.log(`${file}: ${right}/${total} single glyphs right`);
      expect(right / total).toBeGreaterThanOrEqual(floor);
    }
  });

  it('tells hyphen, minus and underscore apart by shape and place relative to the baseline', () => {
    const f = font('DejaVuSans.ttf');
    const hyphen = recognizeGlyph(outline(glyphOf(f, '-')!))!;
    expect(hyphen.char).toBe('-');
    expect(hyphen.bbox.yMin).toBeGreaterThan(0);
    expect(recognizeGlyph(outline(glyphOf(f, '\u2212')!))!.char).toBe('\u2212');
    const under = recognizeGlyph(outline(glyphOf(f, '_')!))!;
    expect(under.char).toBe('_');
    expect(under.bbox.yMax).toBeLessThan(0);
  });

  it('returns null for empty, broken or oversized path data', () => {
    expect(recognizeGlyph('')).toBeNull();
    expect(recognizeGlyph('M 0 0')).toBeNull();
    expect(recognizeGlyph('Z Z q')).toBeNull();
    expect(recognizeGlyph(42 as never)).toBeNull();
    const huge = 'M0 0' + ' L1 1 L2 0'.repeat(4000) + ' Z';
    expect(recognizeGlyph(huge)).toBeNull();
  });
});

describe('readGlyphRun', () => {
  const sansFont = () => font('DejaVuSans.ttf');

  it('reads text set in faces that are not among the references', () => {
    // source: chart labels of ../shared/real-charts/manifest.json, set with the fonts' own advances
    // (these labels were also looked at while the run-level rules were chosen: a regression floor,
    // not an unbiased accuracy estimate)
    const meta = JSON.parse(readFileSync(path.join(realCharts, 'manifest.json'), 'utf8')) as {
      title: string;
      axes: Record<string, { categories?: string[] } | null> | null;
    }[];
    const labels = [...new Set(meta.flatMap((m) => [m.title, ...Object.values(m.axes ?? {}).flatMap((a) => a?.categories ?? [])]))]
      .filter((s) => /^[\x20-\x7e]+$/.test(s));
    expect(labels.length).toBeGreaterThan(100);
    for (const [file, floor] of [
      ['DejaVuSansCondensed.ttf', 0.95],
      ['DejaVuSerifCondensed.ttf', 0.95],
      ['DejaVuSansMono-Bold.ttf', 0.95],
      ['DejaVuSans-BoldOblique.ttf', 0.95],
    ] as const) {
      const f = font(file);
      const right = labels.filter((s) => readGlyphRun(layout(f, s, 11, 30, 200)).text === s).length;
      console.log(`${file}: ${right}/${labels.length} labels read exactly`);
      expect(right / labels.length).toBeGreaterThanOrEqual(floor);
    }
  });

  it('orders glyphs along the baseline whatever the input order, and puts spaces in gaps', () => {
    const glyphs = layout(sansFont(), 'Oven 10 Ill', 10, 5, 50);
    const shuffled = [glyphs[5]!, ...glyphs.slice(6), ...glyphs.slice(0, 5)].reverse();
    const r = readGlyphRun(shuffled);
    expect(r.text).toBe('Oven 10 Ill');
    expect(r.fontSize).toBeCloseTo(10, 6);
    expect(r.glyphs.map((g) => shuffled[g.index])).toEqual(glyphs.filter((g) => g.pathData !== ''));
  });

  it('reads text on a slanted baseline, as rotated tick labels are set', () => {
    const f = sansFont();
    const k = 10 / f.unitsPerEm;
    const c = Math.cos(-Math.PI / 4), s = Math.sin(-Math.PI / 4);
    let pen = 0;
    const glyphs: PlacedGlyph[] = [];
    for (const ch of 'Riverside 2') {
      const g = glyphOf(f, ch)!;
      // translate(100 + pen·cos, 200 + pen·sin) rotate(−45) scale(k, −k)
      glyphs.push({ pathData: outline(g), matrix: [c * k, s * k, s * k, -c * k, 100 + pen * k * c, 200 + pen * k * s] });
      pen += g.advanceWidth;
    }
    const r = readGlyphRun(glyphs.reverse());
    expect(r.text).toBe('Riverside 2');
    expect(r.angle).toBeCloseTo(-45, 6);
  });

  it('lists size look-alikes among the candidates for a caller to weigh', () => {
    const f = sansFont();
    const l = recognizeGlyph(outline(glyphOf(f, 'l')!))!;
    expect(l.char).toBe('l');
    expect(l.candidates.map((c) => c.char)).toContain('I');
    // source: DejaVu Sans 2.37 glyf table: l rises to 1556 units, I to 1493 (unitsPerEm 2048)
    const I = l.candidates.find((c) => c.char === 'I')!;
    expect(l.candidates[0]!.box.yMax).toBeCloseTo(1556 / 2048, 3);
    expect(I.box.yMax).toBeCloseTo(1493 / 2048, 3);
  });

  it('splits lines across the baseline', () => {
    const f = sansFont();
    const r = readGlyphRun([...layout(f, 'Total', 10, 0, 100), ...layout(f, '(kg)', 10, 0, 112)]);
    expect(r.text).toBe('Total\n(kg)');
  });

  it('reads smaller raised glyphs as superscripts', () => {
    // from memory: TeX-like math layout sets superscripts at about 70% size, raised about a third of an em
    const f = sansFont();
    const base = layout(f, '10', 10, 0, 50);
    const k = (10 * 0.7) / f.unitsPerEm;
    const x = (2 * 1303 * 10) / f.unitsPerEm;
    const sup = (ch: string, dx: number): PlacedGlyph => ({ pathData: outline(glyphOf(f, ch)!), matrix: [k, 0, 0, -k, x + dx, 50 - 3.6] });
    expect(readGlyphRun([...base, sup('4', 0)]).text).toBe('10\u2074');
    expect(readGlyphRun([...base, sup('\u2212', 0), sup('3', 5.9)]).text).toBe('10\u207b\u00b3');
  });

  it('reads outlines already placed in the world (no glyph origin) from their ink', () => {
    const f = sansFont();
    const k = 12 / f.unitsPerEm;
    let pen = 300;
    const glyphs: PlacedGlyph[] = [];
    for (const ch of 'Mill Lane') {
      const g = glyphOf(f, ch)!;
      // baked into page coordinates, y down, identity matrix
      const d = g.getPath(pen, 400, 12).toPathData(3);
      if (d !== '') glyphs.push({ pathData: d, matrix: [1, 0, 0, 1, 0, 0] });
      pen += g.advanceWidth * k;
    }
    expect(readGlyphRun(glyphs).text).toBe('Mill Lane');
  });

  it('marks glyphs it cannot read and reads runs without ink as empty', () => {
    const f = sansFont();
    // a row of twelve small squares: no character has that many contours
    const comb = Array.from({ length: 12 }, (_, i) => `M ${i * 200} 0 h 100 v 100 h -100 Z`).join(' ');
    const r = readGlyphRun([...layout(f, 'ab', 10, 0, 50), { pathData: comb, matrix: [0.005, 0, 0, -0.005, 13, 50] }]);
    expect(r.unrecognised).toBe(1);
    expect(r.text).toMatch(/^ab ?\uFFFD$/);
    expect(r.glyphs[2]).toMatchObject({ char: null, distance: null, confidence: 0 });
    const empty = readGlyphRun([{ pathData: '', matrix: [1, 0, 0, 1, 0, 0] }]);
    expect(empty).toMatchObject({ text: '', confidence: 0, bbox: null, fontSize: null, glyphs: [] });
  });

  it('refuses input that is not a list of placed glyphs', () => {
    expect(() => readGlyphRun('abc' as never)).toThrow(GlyphRunError);
    expect(() => readGlyphRun([{ pathData: 'M0 0', matrix: [1, 0, 0, 1, 0] as never }])).toThrow(/matrix/);
    expect(() => readGlyphRun([{ pathData: 'M0 0', matrix: [1, 0, 0, Number.NaN, 0, 0] }])).toThrow(/matrix/);
    expect(() => readGlyphRun([{ pathData: null as never, matrix: [1, 0, 0, 1, 0, 0] }])).toThrow(/pathData/);
  });
});
