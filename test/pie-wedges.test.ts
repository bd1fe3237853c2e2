import { describe, expect, it } from 'vitest';
import { detectPie } from '../engine/classify/pie/detect-wedges.js';
import { measureProjectionDistortion } from '../engine/measure/pie/projection-distortion.js';
import { parseXml } from '../engine/read/parse-xml.js';
import { shapeFromPath, takeIndex } from './support/pie-shapes.js';
import type { Paint, ShapeItem, TextItem } from '../engine/read/scene.js';

// ---------------------------------------------------------------------------
// Building scene items from path data (parsed and flattened by the reader's geometry code).

const element = parseXml('<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0"/></svg>').root;

function hexColor(hex: string): { r: number; g: number; b: number; alpha: number } {
  const v = parseInt(hex.slice(1), 16);
  return { r: ((v >> 16) & 255) / 255, g: ((v >> 8) & 255) / 255, b: (v & 255) / 255, alpha: 1 };
}

function paint(hex: string | null, opacity = 1): Paint {
  if (hex === null) return { kind: 'none', color: null, opacity: 0, ref: null, stops: null };
  return { kind: 'color', color: hexColor(hex), opacity, ref: null, stops: null };
}

interface ShapeOpts {
  stroke?: string;
  strokeWidth?: number;
  opacity?: number;
  filter?: string;
}

function shape(d: string, fill: string | null, opts: ShapeOpts = {}): ShapeItem {
  return shapeFromPath(d, { fill: paint(fill, opts.opacity ?? 1), stroke: paint(opts.stroke ?? null), strokeWidth: opts.strokeWidth ?? 0, filter: opts.filter ?? null });
}

function text(content: string, x: number, y: number, anchor: 'start' | 'middle' | 'end' = 'middle', fontSize = 10): TextItem {
  return {
    kind: 'text',
    index: takeIndex(),
    element,
    source: { id: null, line: 1, column: 1 },
    matrix: [1, 0, 0, 1, 0, 0],
    bbox: { x, y: y - fontSize, width: 0.6 * fontSize * content.length, height: fontSize },
    clip: null,
    filter: null,
    hints: [],
    ignore: [],
    content,
    x,
    y,
    anchor,
    rotation: 0,
    fontSize,
    fontFamily: ['sans-serif'],
    fontWeight: 400,
    fontStyle: 'normal',
    tabularNums: false,
    fill: paint('#000000'),
    fromGlyphs: false,
    fontSubstituted: false,
    width: 0.6 * fontSize * content.length,
  };
}

// ---------------------------------------------------------------------------
// Pie geometry: compass angles (clockwise from 12 o'clock, y down).

const f = (v: number): string => v.toFixed(4);
function at(cx: number, cy: number, r: number, a: number): [number, number] {
  return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
}

/** Wedge boundaries (compass radians) from shares, beginning at `start`. */
function bounds(shares: number[], start = 0): [number, number][] {
  const out: [number, number][] = [];
  let a = start;
  for (const s of shares) {
    out.push([a, a + s * 2 * Math.PI]);
    a += s * 2 * Math.PI;
  }
  return out;
}

/** Outer arc from a0 to a1 (clockwise) as SVG arc commands (split so no piece exceeds 180°). */
function arcCmds(cx: number, cy: number, r: number, a0: number, a1: number, reverse = false): string {
  const pieces = Math.ceil((a1 - a0) / Math.PI - 1e-9) || 1;
  let s = '';
  for (let k = 1; k <= pieces; k++) {
    const t = reverse ? a1 - ((a1 - a0) * k) / pieces : a0 + ((a1 - a0) * k) / pieces;
    const [x, y] = at(cx, cy, r, t);
    s += ` A ${f(r)} ${f(r)} 0 0 ${reverse ? 0 : 1} ${f(x)} ${f(y)}`;
  }
  return s;
}

/** The same arc as cubic Béziers, at most 90° per piece. */
function bezierCmds(cx: number, cy: number, r: number, a0: number, a1: number, reverse = false): string {
  const pieces = Math.max(1, Math.ceil((a1 - a0) / (Math.PI / 2) - 1e-9));
  const step = (a1 - a0) / pieces;
  const k = (4 / 3) * Math.tan(step / 4);
  let s = '';
  for (let i = 0; i < pieces; i++) {
    const t0 = reverse ? a1 - i * step : a0 + i * step;
    const t1 = reverse ? t0 - step : t0 + step;
    const sign = reverse ? -1 : 1;
    const [x0, y0] = at(cx, cy, r, t0);
    const [x3, y3] = at(cx, cy, r, t1);
    // Tangent of the compass parameterisation: d/dt (sin t, −cos t) = (cos t, sin t).
    const c1 = [x0 + sign * k * r * Math.cos(t0), y0 + sign * k * r * Math.sin(t0)];
    const c2 = [x3 - sign * k * r * Math.cos(t1), y3 - sign * k * r * Math.sin(t1)];
    s += ` C ${f(c1[0]!)} ${f(c1[1]!)} ${f(c2[0]!)} ${f(c2[1]!)} ${f(x3)} ${f(y3)}`;
  }
  return s;
}

/** Polygon points every `stepDeg` along the arc, rounded to 2 decimals (as some generators write them). */
function polygonArc(cx: number, cy: number, r: number, a0: number, a1: number, stepDeg = 2): [number, number][] {
  const n = Math.max(1, Math.ceil((a1 - a0) / ((stepDeg * Math.PI) / 180)));
  const pts: [number, number][] = [];
  for (let i = 0; i <= n; i++) pts.push(at(cx, cy, r, a0 + ((a1 - a0) * i) / n));
  return pts;
}

function wedgePath(kind: 'arc' | 'bezier', cx: number, cy: number, r: number, a0: number, a1: number, inner = 0): string {
  const cmds = kind === 'arc' ? arcCmds : bezierCmds;
  const [sx, sy] = at(cx, cy, r, a0);
  if (inner <= 0) return `M ${f(cx)} ${f(cy)} L ${f(sx)} ${f(sy)}${cmds(cx, cy, r, a0, a1)} Z`;
  const [ix, iy] = at(cx, cy, inner, a1);
  return `M ${f(sx)} ${f(sy)}${cmds(cx, cy, r, a0, a1)} L ${f(ix)} ${f(iy)}${cmds(cx, cy, inner, a0, a1, true)} Z`;
}

function polygonWedgePath(cx: number, cy: number, r: number, a0: number, a1: number): string {
  // Radial edges subdivided into 30 points, arc every 2°, coordinates rounded to 0.01.
  const pts: [number, number][] = [];
  for (let i = 0; i < 30; i++) pts.push(at(cx, cy, (r * i) / 30, a0));
  pts.push(...polygonArc(cx, cy, r, a0, a1));
  for (let i = 29; i >= 1; i--) pts.push(at(cx, cy, (r * i) / 30, a1));
  return 'M ' + pts.map(([x, y]) => `${x.toFixed(2)} ${y.toFixed(2)}`).join(' L ') + ' Z';
}

const COLORS = ['#0072b2', '#e69f00', '#009e73', '#cc79a7', '#56b4e9', '#d55e00', '#f0e442', '#999999'];

function sharesOf(pie: ReturnType<typeof detectPie>, items: ShapeItem[]): number[] {
  expect(pie).not.toBeNull();
  return items.map((s) => {
    const w = pie!.wedges.find((q) => q.item === s.index);
    expect(w, `wedge for item ${s.index}`).toBeDefined();
    return w!.share;
  });
}

function expectShares(got: number[], want: number[], tolPp: number): void {
  expect(got.length).toBe(want.length);
  for (let i = 0; i < want.length; i++) expect(Math.abs(got[i]! - want[i]!) * 100, `wedge ${i}: ${got[i]} vs ${want[i]}`).toBeLessThanOrEqual(tolPp);
}

// ---------------------------------------------------------------------------

describe('detectPie: flat pies', () => {
  const shares = [0.3, 0.25, 0.2, 0.15, 0.1];

  it('recovers shares of a pie drawn with SVG arc commands, separated by white strokes', () => {
    const wedges = bounds(shares).map(([a0, a1], i) =>
      shape(wedgePath('arc', 200, 150, 100, a0, a1), COLORS[i]!, { stroke: '#ffffff', strokeWidth: 2 }),
    );
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), shares, 0.05);
    expect(pie!.cx).toBeCloseTo(200, 2);
    expect(pie!.cy).toBeCloseTo(150, 2);
    expect(pie!.radius).toBeCloseTo(100, 1);
    expect(pie!.innerRadius).toBe(0);
    expect(pie!.exploded).toEqual([]);
    expect(pie!.radiusVaries).toBe(false);
    expect(pie!.shareBasis).toBe('angle');
    // The first wedge begins at 12 o'clock and runs clockwise.
    const first = pie!.wedges.find((w) => w.item === wedges[0]!.index)!;
    expect(first.start).toBeCloseTo(0, 3);
    expect(first.end).toBeCloseTo(0.3 * 2 * Math.PI, 3);
  });

  it('recovers shares of a pie drawn with cubic Béziers, counter-clockwise from 3 o\'clock', () => {
    // Counter-clockwise order: wedge i spans [b_{i+1}, b_i] going back from 90°.
    const start = Math.PI / 2;
    const wedges: ShapeItem[] = [];
    let a = start;
    for (let i = 0; i < shares.length; i++) {
      const a1 = a;
      const a0 = a - shares[i]! * 2 * Math.PI;
      wedges.push(shape(wedgePath('bezier', 300, 200, 120, a0, a1), COLORS[i]!));
      a = a0;
    }
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), shares, 0.1);
  });

  it('recovers shares of a polygon-approximated pie with subdivided radial edges and rounded coordinates', () => {
    const s9 = [200, 191, 75, 274, 173, 102, 126, 57, 90];
    const total = s9.reduce((p, q) => p + q, 0);
    const want = s9.map((v) => v / total);
    const wedges = bounds(want).map(([a0, a1], i) => shape(polygonWedgePath(180, 167, 120, a0, a1), COLORS[i % COLORS.length]!, { stroke: '#ffffff', strokeWidth: 1 }));
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), want, 0.1);
  });

  it('recovers a donut (ring segments) and its inner radius', () => {
    const want = [503, 585, 845, 684].map((v) => v / 2617);
    const wedges = bounds(want).map(([a0, a1], i) => shape(wedgePath('arc', 150, 150, 140, a0, a1, 70), COLORS[i]!));
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), want, 0.05);
    expect(pie!.innerRadius).toBeCloseTo(70, 1);
    expect(pie!.radius).toBeCloseTo(140, 1);
  });

  it('finds an exploded wedge, reports it, and still measures its true angle', () => {
    const b = bounds(shares, 0.4);
    const wedges = b.map(([a0, a1], i) => {
      const pull = i === 2 ? 14 : 0;
      const mid = (a0 + a1) / 2;
      const cx = 220 + pull * Math.sin(mid);
      const cy = 160 - pull * Math.cos(mid);
      return shape(wedgePath('bezier', cx, cy, 110, a0, a1), COLORS[i]!);
    });
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), shares, 0.1);
    expect(pie!.exploded).toEqual([wedges[2]!.index]);
    const w = pie!.wedges.find((q) => q.item === wedges[2]!.index)!;
    expect(w.offset).toBeCloseTo(14, 1);
    expect(pie!.cx).toBeCloseTo(220, 2);
    expect(pie!.cy).toBeCloseTo(160, 2);
  });

  it('finds the centre where the bisectors meet when every wedge is pulled out', () => {
    const want = [0.4, 0.35, 0.25];
    const wedges = bounds(want, 1).map(([a0, a1], i) => {
      const mid = (a0 + a1) / 2;
      return shape(wedgePath('arc', 250 + 10 * Math.sin(mid), 250 - 10 * Math.cos(mid), 90, a0, a1), COLORS[i]!);
    });
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), want, 0.05);
    expect(pie!.exploded.length).toBe(3);
    expect(pie!.cx).toBeCloseTo(250, 1);
    expect(pie!.cy).toBeCloseTo(250, 1);
  });

  it('treats a single full circle as a one-wedge pie (share 1), and a full ring as a donut', () => {
    const circle = shape('M 300 100 A 80 80 0 1 1 300 260 A 80 80 0 1 1 300 100 Z', '#0072b2');
    const pie = detectPie([circle], []);
    expect(pie).not.toBeNull();
    expect(pie!.wedges.length).toBe(1);
    // source: construction (one full circle)
    expect(pie!.wedges[0]!.share).toBe(1);
    expect(pie!.wedges[0]!.end - pie!.wedges[0]!.start).toBeCloseTo(2 * Math.PI, 6);
    const ring = shape(
      'M 300 100 A 80 80 0 1 1 300 260 A 80 80 0 1 1 300 100 Z M 300 140 A 40 40 0 1 0 300 220 A 40 40 0 1 0 300 140 Z',
      '#e69f00',
    );
    const donut = detectPie([ring], []);
    expect(donut).not.toBeNull();
    expect(donut!.wedges[0]!.share).toBe(1);
    expect(donut!.innerRadius).toBeCloseTo(40, 1);
  });

  it('keeps tiny slivers whose arc flattens to a single chord', () => {
    const want = [0.5, 0.3, 0.195, 0.003, 0.002];
    const wedges = bounds(want).map(([a0, a1], i) => shape(wedgePath('arc', 200, 200, 100, a0, a1), COLORS[i]!));
    const pie = detectPie(wedges, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedges), want, 0.02);
  });

  it('reads a rose (equal angles, radius encodes the value) from the radial extent', () => {
    const values = [15, 37, 17, 73, 55, 19, 36, 58];
    const max = Math.max(...values);
    const total = values.reduce((p, q) => p + q, 0);
    const eighth = (2 * Math.PI) / 8;
    const wedges = values.map((v, i) => shape(wedgePath('arc', 320, 220, 24 + (116 * v) / max, i * eighth, (i + 1) * eighth, 24), COLORS[i]!));
    const pie = detectPie(wedges, []);
    expect(pie).not.toBeNull();
    expect(pie!.radiusVaries).toBe(true);
    expect(pie!.shareBasis).toBe('radius');
    // source: construction (radius = r0 + k·value, so radial extent ∝ value)
    expectShares(sharesOf(pie, wedges), values.map((v) => v / total), 0.05);
    for (const w of pie!.wedges) expect(w.angleShare).toBeCloseTo(1 / 8, 4);
    // Area grows with the square of the radius: the largest value looks larger than its share.
    const big = pie!.wedges.find((w) => w.item === wedges[3]!.index)!;
    expect(big.areaShare).toBeGreaterThan(big.share);
    const d = measureProjectionDistortion(pie!, wedges);
    expect(d.worstRatio).not.toBeCloseTo(1, 1);
  });

  it('sets shadow copies aside and reports them, and ignores legend swatches', () => {
    const b = bounds(shares);
    const shadowItems: ShapeItem[] = [];
    const wedgeItems: ShapeItem[] = [];
    for (let i = 0; i < shares.length; i++) {
      // A darker, half-transparent copy offset down-left, drawn first (as a shadow patch is).
      const [a0, a1] = b[i]!;
      shadowItems.push(shape(wedgePath('bezier', 200 - 2.5, 150 + 2.5, 100, a0, a1), '#1a2a33', { opacity: 0.5 }));
    }
    for (let i = 0; i < shares.length; i++) {
      const [a0, a1] = b[i]!;
      wedgeItems.push(shape(wedgePath('bezier', 200, 150, 100, a0, a1), COLORS[i]!));
    }
    const swatches = shares.map((_, i) => shape(`M 340 ${40 + 20 * i} h 12 v 12 h -12 Z`, COLORS[i]!));
    const dots = shares.map((_, i) => shape(`M 376 ${46 + 20 * i} A 5 5 0 1 1 366 ${46 + 20 * i} A 5 5 0 1 1 376 ${46 + 20 * i} Z`, COLORS[i]!));
    const pie = detectPie([...shadowItems, ...wedgeItems, ...swatches, ...dots], []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, wedgeItems), shares, 0.1);
    expect(pie!.wedges.length).toBe(shares.length);
    expect(pie!.shadows).toEqual(shadowItems.map((s) => s.index));
  });

  it('treats same-shaped copies under a filter as shadows, but keeps filtered wedges that have no copy', () => {
    const b = bounds(shares);
    const filtered = b.map(([a0, a1], i) => shape(wedgePath('arc', 320, 220, 116, a0, a1), COLORS[i]!, { filter: 'shadow' }));
    const pie = detectPie(filtered, []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, filtered), shares, 0.05);
    expect(pie!.shadows).toEqual([]);
  });

  it('links labels outside the rim and inside wedges, preferring names over numbers', () => {
    const b = bounds(shares);
    const wedges = b.map(([a0, a1], i) => shape(wedgePath('arc', 200, 200, 100, a0, a1), COLORS[i]!));
    const names = ['Bread', 'Pastry', 'Cakes', 'Coffee', 'Tea'];
    const texts: TextItem[] = [];
    b.forEach(([a0, a1], i) => {
      const mid = (a0 + a1) / 2;
      const [x, y] = at(200, 200, 115, mid);
      texts.push(text(names[i]!, x, y + 3, Math.sin(mid) >= 0 ? 'start' : 'end'));
      const [px, py] = at(200, 200, 60, mid);
      texts.push(text(`${Math.round(shares[i]! * 100)}%`, px, py + 3));
    });
    texts.push(text('Share of sales by product', 200, 70, 'middle', 16));
    texts.push(text('Legend entry', 420, 40, 'start'));
    const pie = detectPie(wedges, texts);
    expect(pie).not.toBeNull();
    const labels = wedges.map((s) => pie!.wedges.find((w) => w.item === s.index)!.label);
    // source: construction (labels placed at the bisectors in the test)
    expect(labels).toEqual(names);
  });

  it('handles wedges wider than half the pie and exact halves (a diameter edge)', () => {
    for (const want of [
      [0.7, 0.3],
      [0.5, 0.5],
      [0.92, 0.08],
    ]) {
      const wedges = bounds(want, 0.2).map(([a0, a1], i) => shape(wedgePath('bezier', 200, 200, 90, a0, a1), COLORS[i]!));
      const pie = detectPie(wedges, []);
      // source: construction (shares chosen in the test)
      expectShares(sharesOf(pie, wedges), want, 0.1);
    }
  });

  it('never throws on random outlines', () => {
    // Deterministic pseudo-random polygons, arcs and slivers.
    let state = 12345;
    const rnd = (): number => {
      state = (state * 1103515245 + 12345) % 2147483648;
      return state / 2147483648;
    };
    const items: ShapeItem[] = [];
    for (let k = 0; k < 60; k++) {
      const n = 3 + Math.floor(rnd() * 12);
      let d = `M ${f(rnd() * 400)} ${f(rnd() * 300)}`;
      for (let i = 0; i < n; i++) {
        const r = rnd();
        if (r < 0.4) d += ` L ${f(rnd() * 400)} ${f(rnd() * 300)}`;
        else if (r < 0.7) d += ` A ${f(rnd() * 100)} ${f(rnd() * 100)} ${f(rnd() * 90)} ${rnd() < 0.5 ? 1 : 0} ${rnd() < 0.5 ? 1 : 0} ${f(rnd() * 400)} ${f(rnd() * 300)}`;
        else d += ` C ${f(rnd() * 400)} ${f(rnd() * 300)} ${f(rnd() * 400)} ${f(rnd() * 300)} ${f(rnd() * 400)} ${f(rnd() * 300)}`;
      }
      items.push(shape(d + ' Z', COLORS[k % COLORS.length]!));
    }
    expect(() => detectPie(items, [])).not.toThrow();
    const withPie = [...items, ...bounds(shares).map(([a0, a1], i) => shape(wedgePath('arc', 600, 400, 150, a0, a1), COLORS[i]!))];
    expect(() => detectPie(withPie, [])).not.toThrow();
  });

  it('finds no pie in a bar chart or a scatter plot', () => {
    const bars = [40, 80, 60, 120].map((h, i) => shape(`M ${50 + 40 * i} 300 h 30 v ${-h} h -30 Z`, '#3b6ea5'));
    expect(detectPie(bars, [])).toBeNull();
    const dots = Array.from({ length: 30 }, (_, i) => {
      const x = 50 + ((i * 37) % 300);
      const y = 50 + ((i * 53) % 200);
      return shape(`M ${x + 4} ${y} A 4 4 0 1 1 ${x - 4} ${y} A 4 4 0 1 1 ${x + 4} ${y} Z`, '#3b6ea5');
    });
    expect(detectPie(dots, [])).toBeNull();
    expect(detectPie([], [])).toBeNull();
  });

  it('survives malformed outlines (non-finite points, degenerate paths)', () => {
    const bad = shape('M 0 0 L 10 10 Z', '#000000');
    bad.polylines = [[0, 0, NaN, 5, Infinity, 3, 0, 0]];
    const dot = shape('M 5 5 Z', '#000000');
    const good = bounds(shares).map(([a0, a1], i) => shape(wedgePath('arc', 200, 150, 100, a0, a1), COLORS[i]!));
    const pie = detectPie([bad, dot, ...good], []);
    // source: construction (shares chosen in the test)
    expectShares(sharesOf(pie, good), shares, 0.05);
  });
});
