/**
 * The ink rules on small drawings, one that triggers each and ones that do
 * not. Roles, plot area and colours behind are set by hand so that each test
 * looks at the rule alone, not at the classifier.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import type { Chart, ItemRole } from '../engine/classify/chart.js';
import { measureChart } from '../engine/measure/measures.js';
import { ruleById } from '../engine/rules/index.js';
import { backgroundFill } from '../engine/rules/ink/background-fill.js';
import { frameBox } from '../engine/rules/ink/frame-box.js';
import { heavyGrid } from '../engine/rules/ink/heavy-grid.js';
import { lowDataShare } from '../engine/rules/ink/low-data-share.js';
import { ornament } from '../engine/rules/ink/ornament.js';
import { redundantTicks } from '../engine/rules/ink/redundant-ticks.js';
import type { Rule, RuleFinding } from '../engine/rules/rule.js';

const WHITE = { r: 1, g: 1, b: 1, alpha: 1 };
const PLOT = { x: 50, y: 20, width: 300, height: 200 };

/** A drawing 400 × 260 with the plot area at (50, 20, 300 × 200), its items given the roles listed. */
function chartOf(body: string, roles: ItemRole['sub'][], background = WHITE, page = WHITE): Chart {
  const { chart } = analyzeSvg(`<svg xmlns="http://www.w3.org/2000/svg" width="400" height="260" viewBox="0 0 400 260">${body}</svg>`);
  expect(chart.scene.items.length, 'items drawn').toBe(roles.length);
  chart.roles = roles.map((sub) => ({ role: sub.split('/')[0] as ItemRole['role'], sub }));
  chart.plotArea = { ...PLOT };
  chart.background = background;
  chart.page = page;
  return chart;
}

function run(rule: Rule, chart: Chart): RuleFinding[] {
  return rule.check({ chart, measures: measureChart(chart), thresholds: { ...rule.thresholds }, severity: rule.severity });
}

const PAGE = '<rect width="400" height="260" fill="#fff"/>';
const BARS = '<rect x="80" y="120" width="40" height="100" fill="#1f77b4"/><rect x="180" y="60" width="40" height="160" fill="#1f77b4"/>';

describe('rule catalogue', () => {
  it('has every ink rule under its id with rationale and source', () => {
    for (const id of ['ink.background-fill', 'ink.frame-box', 'ink.heavy-grid', 'ink.ornament', 'ink.redundant-ticks', 'ink.low-data-share']) {
      const r = ruleById(id);
      expect(r, id).toBeDefined();
      expect(r!.family).toBe('ink');
      expect(r!.rationale.length).toBeGreaterThan(20);
      expect(r!.source.length).toBeGreaterThan(10);
    }
  });
});

describe('ink.background-fill', () => {
  it('fires for a grey plot background on a white page', () => {
    const grey = { r: 229 / 255, g: 229 / 255, b: 229 / 255, alpha: 1 };
    const f = run(backgroundFill, chartOf(`${PAGE}<rect x="50" y="20" width="300" height="200" fill="#e5e5e5"/>${BARS}`, ['decoration/page', 'guide/background', 'mark/bar', 'mark/bar'], grey));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.part).toBe('plot');
    expect(f[0]!.measures.fill).toBe('#e5e5e5');
  });

  it('fires for a tinted page', () => {
    const f = run(backgroundFill, chartOf(`<rect width="400" height="260" fill="#f3efe0"/>${BARS}`, ['decoration/page', 'mark/bar', 'mark/bar']));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.part).toBe('page');
  });

  it('stays quiet for white on white, for a barely tinted fill and for a background the data cover', () => {
    expect(run(backgroundFill, chartOf(`${PAGE}<rect x="50" y="20" width="300" height="200" fill="#fff"/>${BARS}`, ['decoration/page', 'guide/background', 'mark/bar', 'mark/bar']))).toEqual([]);
    // ΔE*ab of #fdfdfd from white is about 0.8, below one JND (2.3)
    expect(run(backgroundFill, chartOf(`${PAGE}<rect x="50" y="20" width="300" height="200" fill="#fdfdfd"/>${BARS}`, ['decoration/page', 'guide/background', 'mark/bar', 'mark/bar']))).toEqual([]);
    const cells = '<rect x="50" y="20" width="150" height="200" fill="#440154"/><rect x="200" y="20" width="150" height="200" fill="#21918c"/>';
    expect(run(backgroundFill, chartOf(`${PAGE}<rect x="50" y="20" width="300" height="200" fill="#ddd"/>${cells}`, ['decoration/page', 'guide/background', 'mark/cell', 'mark/cell']))).toEqual([]);
  });
});

describe('ink.frame-box', () => {
  it('fires for a stroked rectangle around the plot', () => {
    const f = run(frameBox, chartOf(`${BARS}<rect x="50" y="20" width="300" height="200" fill="none" stroke="#000"/>`, ['mark/bar', 'mark/bar', 'guide/frame']));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.top).toBe(1);
  });

  it('fires for four separate axis lines', () => {
    const lines = '<line x1="50" y1="20" x2="350" y2="20" stroke="#000"/><line x1="50" y1="220" x2="350" y2="220" stroke="#000"/><line x1="50" y1="20" x2="50" y2="220" stroke="#000"/><line x1="350" y1="20" x2="350" y2="220" stroke="#000"/>';
    expect(run(frameBox, chartOf(`${BARS}${lines}`, ['mark/bar', 'mark/bar', 'guide/axis', 'guide/axis', 'guide/axis', 'guide/axis']))).toHaveLength(1);
  });

  it('stays quiet for two axes, for grid-styled edge lines and for lines the colour of the page', () => {
    const two = '<line x1="50" y1="220" x2="350" y2="220" stroke="#000"/><line x1="50" y1="20" x2="50" y2="220" stroke="#000"/>';
    expect(run(frameBox, chartOf(`${BARS}${two}`, ['mark/bar', 'mark/bar', 'guide/axis', 'guide/axis']))).toEqual([]);
    // A grid whose outermost lines fall on the edges: all lines look alike.
    const grid: string[] = [];
    for (let k = 0; k <= 4; k++) grid.push(`<line x1="50" y1="${20 + k * 50}" x2="350" y2="${20 + k * 50}" stroke="#ddd" stroke-width="0.5"/>`);
    grid.push('<line x1="50" y1="20" x2="50" y2="220" stroke="#ddd" stroke-width="0.5"/><line x1="350" y1="20" x2="350" y2="220" stroke="#ddd" stroke-width="0.5"/>');
    // The edge lines (top, bottom, left, right) are what a classifier may call a frame; the inner lines are the grid.
    const roles: ItemRole['sub'][] = ['guide/frame', 'guide/grid', 'guide/grid', 'guide/grid', 'guide/frame', 'guide/frame', 'guide/frame'];
    expect(run(frameBox, chartOf(grid.join(''), roles))).toEqual([]);
    // The same four edge lines drawn darker than the grid are a frame.
    const dark = grid.map((l, k) => (k === 0 || k >= 4 ? l.replaceAll('#ddd', '#333') : l)).join('');
    expect(run(frameBox, chartOf(dark, roles))).toHaveLength(1);
    // White spines around a grey plot on a white page cannot be seen against the page.
    const grey = { r: 229 / 255, g: 229 / 255, b: 229 / 255, alpha: 1 };
    const white = '<rect x="50" y="20" width="300" height="200" fill="#e5e5e5" stroke="#fff"/>';
    expect(run(frameBox, chartOf(white, ['guide/background'], grey))).toEqual([]);
  });
});

describe('ink.heavy-grid', () => {
  const gridLines = (stroke: string, width: number) => {
    const out: string[] = [];
    for (let k = 0; k <= 4; k++) out.push(`<line x1="50" y1="${20 + k * 50}" x2="350" y2="${20 + k * 50}" stroke="${stroke}" stroke-width="${width}"/>`);
    for (let k = 0; k <= 6; k++) out.push(`<line x1="${50 + k * 50}" y1="20" x2="${50 + k * 50}" y2="220" stroke="${stroke}" stroke-width="${width}"/>`);
    return out.join('');
  };
  const line = '<polyline points="50,200 100,150 150,170 200,90 250,110 300,60 350,80" fill="none" stroke="#1f77b4" stroke-width="1.5"/>';
  const gridRoles: ItemRole['sub'][] = Array.from({ length: 12 }, () => 'guide/grid');

  it('fires for black gridlines about as wide as the data line', () => {
    const f = run(heavyGrid, chartOf(`${gridLines('#000', 1.2)}${line}`, [...gridRoles, 'mark/line']));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.gridContrast).toBe(21);
    expect(f[0]!.measures.gridInkRatio as number).toBeGreaterThan(0.5);
  });

  it('stays quiet for a light hairline grid', () => {
    expect(run(heavyGrid, chartOf(`${gridLines('#ebebeb', 0.5)}${line}`, [...gridRoles, 'mark/line']))).toEqual([]);
  });

  it('does not take short tick marks classified as grid for gridlines', () => {
    const ticks = Array.from({ length: 12 }, (_, k) => `<line x1="45" y1="${20 + k * 15}" x2="50" y2="${20 + k * 15}" stroke="#000" stroke-width="2"/>`).join('');
    expect(run(heavyGrid, chartOf(`${ticks}${line}`, [...gridRoles, 'mark/line']))).toEqual([]);
  });
});

describe('ink.ornament', () => {
  const defs =
    '<defs><linearGradient id="g" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#1f77b4"/><stop offset="1" stop-color="#ffffff"/></linearGradient>' +
    '<linearGradient id="flat"><stop offset="0" stop-color="#1f77b4"/><stop offset="1" stop-color="#1f77b4"/></linearGradient>' +
    '<filter id="shadow"><feDropShadow dx="2" dy="2" stdDeviation="2"/></filter>' +
    '<pattern id="hatch" width="4" height="4" patternUnits="userSpaceOnUse"><path d="M0,4 L4,0" stroke="#000"/></pattern></defs>';

  it('fires for gradient, filter, pattern, shadow copies and pictures on the data', () => {
    const body =
      `${defs}<rect x="80" y="120" width="40" height="100" fill="url(#g)"/>` +
      '<rect x="180" y="60" width="40" height="160" fill="#1f77b4" filter="url(#shadow)"/>' +
      '<rect x="240" y="60" width="40" height="160" fill="url(#hatch)"/>' +
      '<rect x="302" y="62" width="40" height="160" fill="#000" fill-opacity="0.3"/><rect x="300" y="60" width="40" height="160" fill="#1f77b4"/>' +
      '<image x="50" y="20" width="300" height="200" href="data:image/png;base64,iVBORw0KGgo="/>';
    const f = run(ornament, chartOf(body, ['mark/bar', 'mark/bar', 'mark/bar', 'decoration/shadow', 'mark/bar', 'guide/background']));
    expect(f.map((x) => x.measures.kind).sort()).toEqual(['filter', 'gradient', 'image', 'pattern', 'shadow']);
  });

  it('stays quiet for a colour-bar gradient, an even gradient and a filter that is not defined', () => {
    const body =
      `${defs}<rect x="360" y="20" width="10" height="200" fill="url(#g)"/>` +
      '<rect x="80" y="120" width="40" height="100" fill="url(#flat)"/>' +
      '<rect x="180" y="60" width="40" height="160" fill="#1f77b4" filter="url(#missing)"/>';
    expect(run(ornament, chartOf(body, ['guide/colorbar', 'mark/bar', 'mark/bar']))).toEqual([]);
  });
});

describe('ink.redundant-ticks', () => {
  const grid = [0, 1, 2, 3, 4].map((k) => `<line x1="50" y1="${20 + k * 50}" x2="350" y2="${20 + k * 50}" stroke="#ddd"/>`).join('');
  const ticksAt = (ys: number[]) => ys.map((y) => `<line x1="44" y1="${y}" x2="50" y2="${y}" stroke="#000"/>`).join('');

  it('fires for ticks at gridline positions', () => {
    const f = run(redundantTicks, chartOf(`${grid}${ticksAt([20, 70, 120, 170, 220])}`, [...Array(5).fill('guide/grid'), ...Array(5).fill('guide/tick')]));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.redundantTicks).toBe(5);
  });

  it('stays quiet for ticks between gridlines or without a grid', () => {
    expect(run(redundantTicks, chartOf(`${grid}${ticksAt([45, 95, 145, 195])}`, [...Array(5).fill('guide/grid'), ...Array(4).fill('guide/tick')]))).toEqual([]);
    expect(run(redundantTicks, chartOf(ticksAt([20, 70, 120]), Array(3).fill('guide/tick')))).toEqual([]);
  });
});

describe('ink.low-data-share', () => {
  it('fires when guides and labels print most of the ink', () => {
    const body = '<rect x="100" y="200" width="10" height="20" fill="#000"/><rect x="50" y="20" width="300" height="200" fill="none" stroke="#000" stroke-width="4"/><text x="60" y="15" font-size="14">A long title over a small amount of data</text>';
    const f = run(lowDataShare, chartOf(body, ['mark/bar', 'guide/frame', 'label/title']));
    expect(f).toHaveLength(1);
    expect(f[0]!.measures.dataShare as number).toBeLessThan(0.3);
  });

  it('stays quiet when the data print most', () => {
    expect(run(lowDataShare, chartOf(`${BARS}<text x="60" y="15" font-size="10">Title</text>`, ['mark/bar', 'mark/bar', 'label/title']))).toEqual([]);
  });
});
