/**
 * A redraw that changes only the gridlines' colour changes only those
 * colour values: compared line by line, every other line is identical and a
 * changed line differs only in colour tokens (attribute values or style
 * declarations) that were gridline colours and now are the new grey. Read
 * again, every gridline has the new colour and every other item kept its
 * paint.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSvg } from '../engine/audit/analyze.js';
import { auditText } from '../engine/audit/audit-file.js';
import { formatHex } from '../engine/color/format-hex.js';
import { parseColor } from '../engine/color/parse-color.js';
import type { Paint } from '../engine/read/scene.js';
import { applyEdits, type Edit } from '../engine/redraw/edit-list.js';
import { buildFixContext, setItemProperty } from '../engine/redraw/fix-context.js';
import { redrawWithFindings } from '../engine/redraw/redraw.js';
import { loadManifest, readChart } from './support/real-charts.js';

const GREY = '#e2e2e2';

/** Tokens that keep a colour function or hex colour whole. */
function tokens(line: string): string[] {
  return line.match(/rgba?\([^)]*\)|hsla?\([^)]*\)|#[0-9a-fA-F]+|[A-Za-z_-]+|\d+(?:\.\d+)?|\s+|[^\sA-Za-z0-9_#-]/g) ?? [];
}

function hex(c: { r: number; g: number; b: number } | null): string | null {
  return c ? formatHex({ r: c.r, g: c.g, b: c.b, alpha: 1 }) : null;
}

function paintKey(p: Paint): string {
  return `${p.kind}:${hex(p.color)}:${p.opacity.toFixed(4)}`;
}

/** Changed lines must differ only in colour tokens: old = a gridline colour, new = the grey. */
function checkLines(before: string, after: string, gridColors: Set<string>): { changedLines: number; changedTokens: number } {
  const a = before.split('\n');
  const b = after.split('\n');
  expect(b.length).toBe(a.length);
  let changedLines = 0;
  let changedTokens = 0;
  for (let k = 0; k < a.length; k++) {
    if (a[k] === b[k]) continue;
    changedLines++;
    const ta = tokens(a[k]!);
    const tb = tokens(b[k]!);
    expect(tb.length).toBe(ta.length);
    for (let i = 0; i < ta.length; i++) {
      if (ta[i] === tb[i]) continue;
      changedTokens++;
      const old = parseColor(ta[i]!);
      expect(old, `line ${k + 1}: "${ta[i]}" → "${tb[i]}" is not a colour change`).not.toBeNull();
      expect(gridColors.has(hex(old)!)).toBe(true);
      expect(tb[i]).toBe(GREY);
    }
  }
  return { changedLines, changedTokens };
}

describe('gridline colour only', () => {
  const charts = loadManifest().map((t) => t.file);

  it('on every real chart with gridlines, recolouring them changes only their colour values', () => {
    let withGrid = 0;
    let tokensChanged = 0;
    for (const file of charts) {
      const text = readChart(file);
      const audit = auditText(text, file);
      const analysis = audit.analysis!;
      const grid = analysis.scene.items.filter((it, i) => it.kind === 'shape' && analysis.chart.roles[i]?.sub === 'guide/grid' && it.stroke.kind === 'color');
      if (grid.length === 0) continue;
      withGrid++;
      const ctx = buildFixContext(analysis, audit.measures!, new Set());
      const allowed = new Set(grid.map((g) => g.index));
      const edits: Edit[] = [];
      for (const g of grid) {
        const e = setItemProperty(ctx, g.index, 'stroke', GREY, allowed);
        if (e) edits.push(...e);
      }
      const out = applyEdits(text, edits);
      const gridColors = new Set(grid.map((g) => (g.kind === 'shape' ? hex(g.stroke.color)! : '')));
      // common practice, no source: a targeted rewrite leaves every other byte alone
      const { changedTokens } = checkLines(text, out, gridColors);
      expect(changedTokens, file).toBeGreaterThan(0);
      tokensChanged += changedTokens;

      // Read again: gridlines grey, everything else painted as before.
      const before = analysis.scene.items;
      const after = analyzeSvg(out).scene.items;
      expect(after.length, file).toBe(before.length);
      for (let i = 0; i < before.length; i++) {
        const x = before[i]!;
        const y = after[i]!;
        if (x.kind !== 'shape' || y.kind !== 'shape') continue;
        if (allowed.has(i)) expect(hex(y.stroke.color), `${file} item ${i}`).toBe(GREY);
        else {
          expect(paintKey(y.stroke), `${file} item ${i}`).toBe(paintKey(x.stroke));
          expect(paintKey(y.fill), `${file} item ${i}`).toBe(paintKey(x.fill));
        }
      }
    }
    console.log(`gridline recolouring: ${withGrid} charts with gridlines, ${tokensChanged} colour values changed, no other token`);
    expect(withGrid).toBeGreaterThanOrEqual(20);
  });

  it('the heavy-grid fix on a chart whose grid is already thin changes only gridline colour values', () => {
    // ec-bar-clean draws 1 px gridlines: the fix has no width to take off, only colour.
    const file = 'ec-bar-clean-01.svg';
    const text = readChart(file);
    const r = redrawWithFindings(text, file, [{ rule: 'ink.heavy-grid', severity: 'warning', message: 'applied on request', elements: [], measures: {} }]);
    const analysis = analyzeSvg(text);
    const grid = analysis.scene.items.filter((it, i) => it.kind === 'shape' && analysis.chart.roles[i]?.sub === 'guide/grid');
    expect(grid.length).toBeGreaterThan(0);
    expect(r.applied).toEqual([{ rule: 'ink.heavy-grid', count: grid.length }]);
    const gridColors = new Set(grid.map((g) => (g.kind === 'shape' ? hex(g.stroke.color)! : '')));
    const { changedLines, changedTokens } = checkLines(text, r.output, gridColors);
    // One gridline per line in this file, one colour value each.
    expect(changedLines).toBe(grid.length);
    expect(changedTokens).toBe(grid.length);
    expect(r.stats.charsDelta).toBe(0);
  });
});
