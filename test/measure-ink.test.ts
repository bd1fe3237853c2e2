/**
 * Ink measure: exact geometry on small drawings, and a cross-check of the
 * geometric shares against pixels counted in renders by resvg on the real
 * charts of ../shared/real-charts.
 *
 * The raster reference: for each bucket (data, guides, labels, decoration)
 * the chart is rendered once with that bucket's elements hidden
 * (`visibility="hidden"`) and once whole, both over white; the bucket's ink
 * is the sum over pixels of the largest channel difference between the two
 * renders — the same strength measure the geometric ink uses, counted where
 * the bucket actually shows.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import type { Chart, ItemRole } from '../engine/classify/chart.js';
import { glyphRunInk, TEXT_INK_COVERAGE } from '../engine/measure/glyph-ink.js';
import { bucketOf, inkStrength, measureInk, type InkBucket } from '../engine/measure/ink.js';
import { renderSvg, renderSvgAsync } from '../engine/raster/index.js';
import { attributeSpan, type XmlDocument, type XmlElement } from '../engine/read/xml-tree.js';
import { loadManifest, readChart } from './support/real-charts.js';

const BUCKETS: InkBucket[] = ['data', 'guides', 'labels', 'decoration'];
const RASTER_SCALE = 2;

/**
 * resvg-js 2.6.2 does not read the CSS `font` shorthand inside `style`
 * (matplotlib writes `font: 10px 'DejaVu Sans', ...`) and draws such text at
 * its 12 px default, which browsers do not. The reference renders spell the
 * shorthand out in longhands so that they show the text browsers show.
 */
function expandFontShorthand(svg: string): string {
  return svg.replace(/font:\s*((?:(?:italic|oblique|normal|bold|bolder|lighter|\d{3})\s+)*)([\d.]+)px\s+([^;"]+)/g, (_m, pre: string, size: string, fam: string) => {
    const parts = pre.trim().split(/\s+/).filter(Boolean);
    const weight = parts.find((p) => /^(bold|bolder|lighter|\d{3})$/.test(p));
    const style = parts.find((p) => /^(italic|oblique)$/.test(p));
    return `font-size:${size}px;font-family:${fam.trim()}` + (weight ? `;font-weight:${weight}` : '') + (style ? `;font-style:${style}` : '');
  });
}

/** Sum over pixels of the largest channel difference (0..1) between two same-sized renders. */
function pixelInk(a: Uint8Array, b: Uint8Array): number {
  let sum = 0;
  for (let p = 0; p < a.length; p += 4) {
    sum += Math.max(Math.abs(a[p]! - b[p]!), Math.abs(a[p + 1]! - b[p + 1]!), Math.abs(a[p + 2]! - b[p + 2]!)) / 255;
  }
  return sum;
}

function walk(el: XmlElement, f: (e: XmlElement) => void): void {
  f(el);
  for (const c of el.children) if (c.type === 'element') walk(c, f);
}

/** The document text with every element whose items all fall in `bucket` hidden. */
function hideBucket(doc: XmlDocument, owner: Map<XmlElement, InkBucket | 'mixed'>, bucket: InkBucket): string {
  const edits: { at: number; end: number; text: string }[] = [];
  for (const [el, b] of owner) {
    if (b !== bucket) continue;
    const span = attributeSpan(doc, el, 'visibility');
    if (span) edits.push({ at: span.value.start, end: span.value.end, text: 'hidden' });
    else {
      let k = el.start + 1;
      while (!/[\s/>]/.test(doc.source[k]!)) k++;
      edits.push({ at: k, end: k, text: ' visibility="hidden"' });
    }
  }
  edits.sort((p, q) => q.at - p.at);
  let s = doc.source;
  for (const e of edits) s = s.slice(0, e.at) + e.text + s.slice(e.end);
  return s;
}

interface RasterRow {
  file: string;
  geometric: Record<InkBucket, number>;
  raster: Record<InkBucket, number>;
  worst: number;
  mixed: number;
}

async function rasterShares(file: string): Promise<RasterRow> {
  const { doc, scene, chart } = analyzeSvg(readChart(file), { file });
  const ink = measureInk(chart);
  const byPos = new Map<string, XmlElement>();
  walk(doc.root, (e) => byPos.set(`${e.line}:${e.column}`, e));
  const owner = new Map<XmlElement, InkBucket | 'mixed'>();
  scene.items.forEach((it, i) => {
    const el = byPos.get(`${it.source.line}:${it.source.column}`);
    if (!el) return;
    const b = bucketOf(chart.roles[i]!.role);
    const prev = owner.get(el);
    owner.set(el, prev === undefined || prev === b ? b : 'mixed');
  });
  const full = await renderSvgAsync(expandFontShorthand(doc.source), { scale: RASTER_SCALE, background: 'white' });
  const raw: Record<string, number> = {};
  await Promise.all(
    BUCKETS.map(async (b) => {
      if (![...owner.values()].includes(b)) {
        raw[b] = 0;
        return;
      }
      const img = await renderSvgAsync(expandFontShorthand(hideBucket(doc, owner, b)), { scale: RASTER_SCALE, background: 'white' });
      raw[b] = pixelInk(full.rgba, img.rgba);
    }),
  );
  const total = BUCKETS.reduce((n, b) => n + raw[b]!, 0);
  const raster = Object.fromEntries(BUCKETS.map((b) => [b, total > 0 ? raw[b]! / total : 0])) as Record<InkBucket, number>;
  const geometric = { ...ink.shares };
  const worst = Math.max(...BUCKETS.map((b) => Math.abs(geometric[b] - raster[b])));
  return { file, geometric, raster, worst, mixed: [...owner.values()].filter((v) => v === 'mixed').length };
}

/** Analyse a drawing and give its items the roles named, in paint order. */
function withRoles(svg: string, roles: ItemRole['sub'][]): Chart {
  const { chart } = analyzeSvg(svg);
  expect(chart.scene.items.length).toBe(roles.length);
  chart.roles = roles.map((sub) => ({ role: sub.split('/')[0] as ItemRole['role'], sub }));
  return chart;
}

/**
 * Ink of a drawing counted by resvg the way the real-chart check counts it:
 * for each bucket, the strength sum of the difference between the whole
 * render and the render without that bucket's elements, in user units².
 */
function rasterInkOf(text: string, roles: ItemRole['sub'][], scale = 4): number {
  const { doc, scene } = analyzeSvg(text);
  const full = renderSvg(text, { scale, background: 'white' });
  const byPos = new Map<string, XmlElement>();
  walk(doc.root, (e) => byPos.set(`${e.line}:${e.column}`, e));
  const owner = new Map<XmlElement, InkBucket | 'mixed'>();
  scene.items.forEach((it, i) => owner.set(byPos.get(`${it.source.line}:${it.source.column}`)!, bucketOf(roles[i]!.split('/')[0] as ItemRole['role'])));
  let sum = 0;
  for (const b of new Set(owner.values())) {
    if (b === 'mixed') continue;
    sum += pixelInk(full.rgba, renderSvg(hideBucket(doc, owner, b), { scale, background: 'white' }).rgba);
  }
  return sum / (scale * scale);
}

const svg = (body: string, w = 300, h = 200) => `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}">${body}</svg>`;

describe('ink strength', () => {
  it('is the largest sRGB channel difference', () => {
    // computed: definition (gamma-encoded channels, 0..1)
    expect(inkStrength({ r: 0, g: 0, b: 0, alpha: 1 }, { r: 1, g: 1, b: 1, alpha: 1 })).toBe(1);
    expect(inkStrength({ r: 1, g: 0, b: 0, alpha: 1 }, { r: 1, g: 1, b: 1, alpha: 1 })).toBe(1);
    expect(inkStrength({ r: 229 / 255, g: 229 / 255, b: 229 / 255, alpha: 1 }, { r: 1, g: 1, b: 1, alpha: 1 })).toBeCloseTo(26 / 255, 12);
  });
});

describe('geometric ink on small drawings', () => {
  // Each case: exact geometry by hand, and resvg's pixel count of the same drawing (source: @resvg/resvg-js 2.6.2 render, 4× zoom).
  const cases: { name: string; body: string; roles: ItemRole['sub'][]; exact: number }[] = [
    { name: 'black rectangle', body: '<rect x="10" y="10" width="100" height="50" fill="#000"/>', roles: ['mark/bar'], exact: 5000 },
    { name: 'grey rectangle', body: '<rect x="10" y="10" width="100" height="50" fill="#808080"/>', roles: ['mark/bar'], exact: 5000 * (1 - 128 / 255) },
    { name: 'white rectangle on white', body: '<rect x="10" y="10" width="100" height="50" fill="#fff"/>', roles: ['guide/background'], exact: 0 },
    { name: 'stroked line', body: '<line x1="20" y1="100" x2="220" y2="100" stroke="#000" stroke-width="2"/>', roles: ['guide/grid'], exact: 400 },
    {
      name: 'filled and stroked rectangle',
      body: '<rect x="50" y="50" width="100" height="50" fill="#000" stroke="#000" stroke-width="4"/>',
      roles: ['mark/bar'],
      // outer box 104 × 54 (mitred corners)
      exact: 104 * 54,
    },
    {
      name: 'bar on a grey plot background',
      body: '<rect x="0" y="0" width="200" height="200" fill="#ccc"/><rect x="50" y="50" width="50" height="100" fill="#000"/>',
      roles: ['guide/background', 'mark/bar'],
      // the background shows around the bar; the black bar differs from the grey behind it by 204/255
      exact: (40000 - 5000) * (1 - 204 / 255) + 5000 * (204 / 255),
    },
    {
      name: 'two opaque circles on one spot',
      body: '<circle cx="100" cy="100" r="20" fill="#000"/><circle cx="100" cy="100" r="20" fill="#000"/>',
      roles: ['mark/point', 'mark/point'],
      exact: Math.PI * 400,
    },
    {
      name: 'two half-transparent circles on one spot',
      body: '<circle cx="100" cy="100" r="20" fill="#000" fill-opacity="0.5"/><circle cx="100" cy="100" r="20" fill="#000" fill-opacity="0.5"/>',
      roles: ['mark/point', 'mark/point'],
      exact: Math.PI * 400 * 0.75,
    },
    {
      name: 'rectangle clipped to its half',
      body: '<defs><clipPath id="c"><rect x="0" y="0" width="60" height="200"/></clipPath></defs><rect x="10" y="10" width="100" height="100" fill="#000" clip-path="url(#c)"/>',
      roles: ['mark/bar'],
      exact: 5000,
    },
    {
      name: 'rectangle half outside the drawing',
      body: '<rect x="250" y="10" width="100" height="50" fill="#000"/>',
      roles: ['mark/bar'],
      exact: 2500,
    },
    {
      name: 'linear gradient from black to transparent',
      body: '<defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#000"/><stop offset="1" stop-color="#000" stop-opacity="0"/></linearGradient></defs><rect x="10" y="10" width="200" height="100" fill="url(#g)"/>',
      roles: ['mark/area'],
      exact: 20000 * 0.5,
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const text = svg(c.body);
      const ink = measureInk(withRoles(text, c.roles));
      const total = ink.totals.total;
      if (c.exact === 0) expect(total).toBe(0);
      else expect(Math.abs(total - c.exact) / c.exact).toBeLessThan(0.02);
      const raster = rasterInkOf(text, c.roles);
      expect(Math.abs(total - raster)).toBeLessThanOrEqual(Math.max(0.03 * raster, 1));
    });
  }

  it('counts a grey page as decoration and a white page as nothing', () => {
    const grey = measureInk(withRoles(svg('<rect width="300" height="200" fill="#f0f0f0"/><rect x="10" y="10" width="20" height="20" fill="#000"/>'), ['decoration/page', 'mark/bar']));
    // computed: visible page area × (1 − 240/255)
    expect(grey.totals.decoration).toBeCloseTo((60000 - 400) * (15 / 255), 0);
    const white = measureInk(withRoles(svg('<rect width="300" height="200" fill="#fff"/><rect x="10" y="10" width="20" height="20" fill="#000"/>'), ['decoration/page', 'mark/bar']));
    expect(white.totals.decoration).toBe(0);
    expect(white.shares.data).toBe(1);
  });

  it('stays finite and quick on paths far outside the drawing', () => {
    const body = '<line x1="-1e6" y1="50" x2="1e6" y2="50" stroke="#000" stroke-width="2"/><line x1="0" y1="100" x2="100" y2="100" stroke="#000" stroke-width="1000"/>';
    const ink = measureInk(withRoles(svg(body), ['guide/grid', 'guide/grid']));
    // computed: the second line, 100 long and 1000 wide with butt caps, covers x 0..100 of the drawing (100 × 200);
    // the first shows 300 × 2 inside the drawing, less the 100 × 2 the second hides
    // visibility is sampled on a grid of at most 250,000 cells: within 1% of the exact figure
    expect(Math.abs(ink.byItem[0]! - 400) / 400).toBeLessThan(0.01);
    expect(ink.byItem[1]).toBeCloseTo(20000, -1);
    // source: resvg render of the same drawing
    expect(Math.abs(ink.totals.total - rasterInkOf(svg(body), ['guide/grid', 'guide/grid'])) / ink.totals.total).toBeLessThan(0.03);
  });

  it('gives shares that sum to 1', () => {
    const ink = measureInk(withRoles(svg('<rect x="10" y="10" width="20" height="20" fill="#000"/><line x1="0" y1="50" x2="100" y2="50" stroke="#999"/><text x="10" y="100" font-size="12">Label</text>'), ['mark/bar', 'guide/grid', 'label/title']));
    const s = ink.shares;
    expect(s.data + s.guides + s.labels + s.decoration).toBeCloseTo(1, 12);
    expect(s.labels).toBeGreaterThan(0);
  });

  it('measures text by its glyph outlines', () => {
    const text = svg('<text x="10" y="40" font-family="DejaVu Sans" font-size="24">Fuel 0123456789</text>', 400, 60);
    const ink = measureInk(withRoles(text, ['label/title']));
    // source: resvg render of the same text with the bundled DejaVu Sans
    const raster = rasterInkOf(text, ['label/title']);
    expect(Math.abs(ink.totals.total - raster) / raster).toBeLessThan(0.02);
  });

  it('documents the fallback text coverage it measures', () => {
    // source: glyph outlines of the bundled DejaVu Sans (npm dejavu-fonts-ttf 2.37.3)
    const g = glyphRunInk('0123456789 abcdefghijklmnopqrstuvwxyz ABCDEFGHIJKLMNOPQRSTUVWXYZ', ['DejaVu Sans'], 400, 'normal');
    expect(g.area / g.advance).toBeCloseTo(TEXT_INK_COVERAGE, 3);
  });
});

describe('ink shares against resvg pixel counts on real charts', () => {
  it('agree within 5 percentage points per bucket', { timeout: 900_000 }, async () => {
    const rows: RasterRow[] = [];
    for (const t of loadManifest()) rows.push(await rasterShares(t.file));
    const pct = (v: number) => (100 * v).toFixed(1).padStart(5);
    const lines = rows.map(
      (r) =>
        `${r.file.padEnd(36)} ` +
        BUCKETS.map((b) => `${b.slice(0, 4)} ${pct(r.geometric[b])}/${pct(r.raster[b])}`).join('  ') +
        `  max ${(100 * r.worst).toFixed(1)}${r.mixed ? `  (${r.mixed} mixed elements)` : ''}`,
    );
    console.log(`ink shares, geometric/raster, %:\n${lines.join('\n')}`);
    const worst = rows.reduce((a, b) => (b.worst > a.worst ? b : a));
    console.log(`largest difference: ${(100 * worst.worst).toFixed(2)} pp (${worst.file}); mean of per-chart maxima ${((100 * rows.reduce((n, r) => n + r.worst, 0)) / rows.length).toFixed(2)} pp`);
    for (const r of rows) expect(r.worst, r.file).toBeLessThanOrEqual(0.05);
  });
});
