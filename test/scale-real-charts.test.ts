/**
 * Axis scales inferred from the tick labels of the real charts in
 * ../shared/real-charts, checked against manifest.json (axis scale type,
 * domain at the plot-area edges, band categories).
 *
 * The harness here stands in for the classifier: it reads every <text> with
 * its composed transform, and takes as an axis's labels the largest row of
 * texts just outside the plot area (same y below it for x; same x left or
 * right of it for y / y2). Label position is the text anchor point; for y
 * axes that is the baseline, which sits about a third of the font size below
 * the tick (except ECharts, which centres text on the tick), so y-axis domain
 * edges are checked within 5 px and x-axis edges within 1 px. Slopes do not
 * depend on that offset and are checked to 0.1 %.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { SaxesParser } from 'saxes';
import { describe, expect, it } from 'vitest';
import { inferAxisScale } from '../engine/classify/scale/infer-axis.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const chartsDir = path.resolve(repoRoot, '../shared/real-charts');

type Matrix = [number, number, number, number, number, number];
const IDENTITY: Matrix = [1, 0, 0, 1, 0, 0];

function multiply(m: Matrix, n: Matrix): Matrix {
  return [
    m[0] * n[0] + m[2] * n[1],
    m[1] * n[0] + m[3] * n[1],
    m[0] * n[2] + m[2] * n[3],
    m[1] * n[2] + m[3] * n[3],
    m[0] * n[4] + m[2] * n[5] + m[4],
    m[1] * n[4] + m[3] * n[5] + m[5],
  ];
}

/** SVG transform list (source: SVG 1.1 §7.6, the 'transform' attribute). */
function parseTransform(text: string | undefined): Matrix {
  let m = IDENTITY;
  if (!text) return m;
  const re = /(matrix|translate|scale|rotate)\s*\(([^)]*)\)/g;
  let x: RegExpExecArray | null;
  while ((x = re.exec(text))) {
    const a = x[2].trim().split(/[\s,]+/).map(Number);
    let n: Matrix;
    if (x[1] === 'matrix') n = [a[0], a[1], a[2], a[3], a[4], a[5]];
    else if (x[1] === 'translate') n = [1, 0, 0, 1, a[0], a[1] ?? 0];
    else if (x[1] === 'scale') n = [a[0], 0, 0, a[1] ?? a[0], 0, 0];
    else {
      const r = (a[0] * Math.PI) / 180;
      n = [Math.cos(r), Math.sin(r), -Math.sin(r), Math.cos(r), 0, 0];
      if (a.length === 3) n = multiply(multiply([1, 0, 0, 1, a[1], a[2]], n), [1, 0, 0, 1, -a[1], -a[2]]);
    }
    m = multiply(m, n);
  }
  return m;
}

interface SvgText {
  text: string;
  x: number;
  y: number;
  rotated: boolean;
}

function readTexts(file: string): SvgText[] {
  const parser = new SaxesParser();
  const stack: Matrix[] = [IDENTITY];
  const out: SvgText[] = [];
  let open: { buf: string; m: Matrix; x: number; y: number; depth: number } | null = null;
  parser.on('opentag', (tag) => {
    const attrs = tag.attributes as Record<string, string>;
    const m = multiply(stack[stack.length - 1], parseTransform(attrs.transform));
    stack.push(m);
    if (tag.name === 'text' && !open) open = { buf: '', m, x: Number(attrs.x ?? 0), y: Number(attrs.y ?? 0), depth: stack.length };
  });
  parser.on('text', (t) => {
    if (open) open.buf += t;
  });
  parser.on('closetag', () => {
    if (open && stack.length === open.depth) {
      const { m, x, y } = open;
      out.push({
        text: open.buf,
        x: m[0] * x + m[2] * y + m[4],
        y: m[1] * x + m[3] * y + m[5],
        rotated: Math.abs(m[1]) > 1e-6 || Math.abs(m[2]) > 1e-6,
      });
      open = null;
    }
    stack.pop();
  });
  parser.write(readFileSync(file, 'utf8')).close();
  return out;
}

/** Groups of ≥ 2 texts sharing a coordinate within 1 px. */
function rows(texts: SvgText[], key: (t: SvgText) => number): SvgText[][] {
  const groups: SvgText[][] = [];
  for (const t of texts) {
    const g = groups.find((grp) => Math.abs(key(grp[0]) - key(t)) < 1);
    if (g) g.push(t);
    else groups.push([t]);
  }
  return groups.filter((g) => g.length >= 2);
}

interface PlotArea {
  x: number;
  y: number;
  width: number;
  height: number;
}

function axisLabels(texts: SvgText[], pa: PlotArea, axis: 'x' | 'y' | 'y2'): { text: string; position: number }[] | null {
  let group: SvgText[] | undefined;
  if (axis === 'x') {
    const cands = texts.filter((t) => t.y > pa.y + pa.height - 1 && t.x > pa.x - 0.1 * pa.width && t.x < pa.x + 1.1 * pa.width);
    group = rows(cands, (t) => t.y).sort((a, b) => b.length - a.length || a[0].y - b[0].y)[0];
  } else {
    const left = axis === 'y';
    const cands = texts.filter(
      (t) =>
        !t.rotated &&
        (left ? t.x < pa.x + 1 : t.x > pa.x + pa.width - 1) &&
        t.y > pa.y - 0.1 * pa.height &&
        t.y < pa.y + 1.1 * pa.height,
    );
    group = rows(cands, (t) => t.x).sort((a, b) => b.length - a.length || (left ? b[0].x - a[0].x : a[0].x - b[0].x))[0];
  }
  if (!group) return null;
  return group.map((t) => ({ text: t.text, position: axis === 'x' ? t.x : t.y }));
}

interface ManifestAxis {
  scale: 'linear' | 'log' | 'time' | 'band';
  min: number | string | null;
  max: number | string | null;
  categories?: string[];
}
interface ManifestChart {
  file: string;
  textAsPaths: boolean;
  plotArea: PlotArea | null;
  axes: Record<string, ManifestAxis> | null;
}

const manifest = JSON.parse(readFileSync(path.join(chartsDir, 'manifest.json'), 'utf8')) as ManifestChart[];

interface Case {
  file: string;
  axis: 'x' | 'y' | 'y2';
  truth: ManifestAxis;
  plotArea: PlotArea;
}
const cases: Case[] = [];
for (const chart of manifest) {
  // Text drawn as paths has no label strings; 3D charts have no flat plot area.
  if (chart.textAsPaths || !chart.axes || !chart.plotArea) continue;
  for (const axis of ['x', 'y', 'y2'] as const) {
    const truth = chart.axes[axis];
    if (truth) cases.push({ file: chart.file, axis, truth, plotArea: chart.plotArea });
  }
}

function isSubsequence(needle: string[], hay: string[]): boolean {
  let j = 0;
  for (const s of hay) if (j < needle.length && s === needle[j]) j++;
  return j === needle.length;
}

describe('inferAxisScale on ../shared/real-charts', () => {
  it('covers every flat chart with text labels in the manifest', () => {
    // source: ../shared/real-charts/manifest.json — 64 axes on charts with text labels and a plot area
    expect(cases.length).toBe(64);
  });

  const outcome = { continuousOk: 0, bandOk: 0, bandReadAsEvenNumbers: 0 };

  for (const c of cases) {
    it(`${c.file} ${c.axis}: ${c.truth.scale}`, () => {
      const labels = axisLabels(readTexts(path.join(chartsDir, c.file)), c.plotArea, c.axis);
      expect(labels, 'harness found no label row').not.toBeNull();
      const pa = c.plotArea;
      const range: [number, number] = c.axis === 'x' ? [pa.x, pa.x + pa.width] : [pa.y + pa.height, pa.y];
      const result = inferAxisScale(labels!, undefined, { range });

      if (c.truth.scale === 'band') {
        // source: manifest.json categories, in axis order
        const cats = c.truth.categories ?? [];
        const texts = result.ticks.map((t) => t.text.trim());
        const inOrder = isSubsequence(texts, cats) || isSubsequence([...texts].reverse(), cats);
        expect(inOrder, `labels ${texts.join('|')} not in category order`).toBe(true);
        if (result.scale === 'band') {
          expect(result.band.evenlySpaced).toBe(true);
          outcome.bandOk++;
        } else {
          // Evenly spaced numeric or clock-time categories (2001…2017, 07:00…14:00) cannot be told
          // from a linear/time axis by their labels; they must at least fit exactly.
          expect(['linear', 'time']).toContain(result.scale);
          if (result.scale === 'linear' || result.scale === 'time') expect(result.fit.maxResidual).toBeLessThan(0.75);
          outcome.bandReadAsEvenNumbers++;
        }
        return;
      }

      expect(result.scale).toBe(c.truth.scale);
      if (result.scale !== 'linear' && result.scale !== 'log' && result.scale !== 'time') return;
      // source: manifest.json axis min/max and plotArea
      const toValue = (v: number | string | null): number => (typeof v === 'string' ? Date.parse(`${v}T00:00:00Z`) : (v as number));
      const vMin = toValue(c.truth.min);
      const vMax = toValue(c.truth.max);
      const f = (v: number): number => (c.truth.scale === 'log' ? Math.log10(v) : v);
      const expectedSlope = (range[1] - range[0]) / (f(vMax) - f(vMin));
      expect(Math.abs(result.fit.a / expectedSlope - 1)).toBeLessThan(0.001);
      const edgeTolerance = c.axis === 'x' ? 1 : 5;
      expect(Math.abs(result.fit.forward(vMin) - range[0])).toBeLessThan(edgeTolerance);
      expect(Math.abs(result.fit.forward(vMax) - range[1])).toBeLessThan(edgeTolerance);
      outcome.continuousOk++;
    });
  }

  it('summary', () => {
    // Printed for the report; each axis is asserted above.
    console.log(
      `real charts: ${cases.length} axes; linear/log/time matched ${outcome.continuousOk}; ` +
        `band matched ${outcome.bandOk}; band read as evenly spaced numbers/times ${outcome.bandReadAsEvenNumbers}`,
    );
    expect(outcome.continuousOk + outcome.bandOk + outcome.bandReadAsEvenNumbers).toBe(cases.length);
  });
});
