/**
 * `plumbline diff`: pixel and structural comparison of two versions of a real
 * chart, the picture written atomically, identical files short-circuited,
 * unreadable files refused with status 2.
 */
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { compareSvgs, formatDiffText, runDiff, type ChartDiff } from '../engine/cli/run-diff.js';
import { REAL_CHARTS } from './support/real-charts.js';

const BAR = join(REAL_CHARTS, 'mpl-bar-truncated-01.svg');
const barText = readFileSync(BAR, 'utf8');
let dir: string;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-diff-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs the command and returns its exit status, stdout and stderr. */
async function run(before: string, after: string, opts: { out?: string; format?: 'text' | 'json' }): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s: string | Uint8Array) => {
    out += String(s);
    return true;
  });
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s: string | Uint8Array) => {
    err += String(s);
    return true;
  });
  try {
    const code = await runDiff(before, after, opts);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

function write(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

// The "Harbour" bar (patch_3) is drawn from y = 2947.955625 up to y = 136.95555.
// Its top moves to y = 110.5. The y axis ticks written in the file put 100 at
// y = 25.91812 and 90 at y = 318.1219 (linear), so the new value is
// 100 - (110.5 - 25.91812) / (318.1219 - 25.91812) * 10.
const NEW_TOP = 110.5;
// source: hand computation from the tick positions in the file (linear axis)
const EXPECTED_HARBOUR = 100 - ((NEW_TOP - 25.91812) / (318.1219 - 25.91812)) * 10;

describe('plumbline diff', () => {
  it('finds the one bar that changed: pixels, geometry and data value, and writes the picture', async () => {
    const after = write('bar-changed.svg', barText.replaceAll('136.95555', String(NEW_TOP)));
    const png = join(dir, 'out', 'diff.png');
    const { code, out } = await run(BAR, after, { out: png, format: 'json' });
    expect(code).toBe(0);
    const d = JSON.parse(out) as ChartDiff;
    expect(d.identical).toBe(false);
    expect(d.marks.moved).toHaveLength(1);
    expect(d.marks.added).toHaveLength(0);
    expect(d.marks.removed).toHaveLength(0);
    expect(d.marks.unchanged).toBe(4);
    expect(d.marks.moved[0]!.after.box.y).toBeCloseTo(NEW_TOP, 1);
    expect(d.values).toHaveLength(1);
    expect(d.values[0]!.x).toBe('Harbour');
    expect(d.values[0]!.before).toBeCloseTo(96.2, 1);
    expect(d.values[0]!.after).toBeCloseTo(EXPECTED_HARBOUR, 1);
    // the changed pixels sit where the bar top moved
    expect(d.pixels!.changedShare).toBeGreaterThan(0);
    expect(d.pixels!.changedShare).toBeLessThan(0.05);
    expect(d.pixels!.regions.length).toBeGreaterThanOrEqual(1);
    expect(d.findings.new).toHaveLength(0);
    expect(d.findings.resolved).toHaveLength(0);
    expect(d.picture).toBe(png);
    const pic = PNG.sync.read(readFileSync(png));
    expect(pic.width).toBe(3 * d.pixels!.width + 2 * 6);
    expect(pic.height).toBe(d.pixels!.height);
    // no temporary file left beside it
    expect(readdirSync(join(dir, 'out'))).toEqual(['diff.png']);
  });

  it('sees no change when only line numbers shift (findings matched by element, not by line)', async () => {
    const shifted = barText.replace('<svg ', '<!-- a\ncomment\nof\nfour lines -->\n<svg ');
    const { diff } = await compareSvgs(barText, shifted, { before: 'a.svg', after: 'b.svg' });
    expect(diff.identical).toBe(false);
    expect(diff.pixels!.changedPixels).toBe(0);
    expect(diff.marks.unchanged).toBe(5);
    expect(diff.marks.moved.length + diff.marks.added.length + diff.marks.removed.length).toBe(0);
    expect(diff.values).toEqual([]);
    expect(diff.findings.new).toEqual([]);
    expect(diff.findings.resolved).toEqual([]);
    expect(diff.findings.unchanged).toBeGreaterThan(0);
  });

  it('reports a removed bar and its value', async () => {
    // patch_5 draws the "Mill Lane" bar, x from 223.241801 to 277.323824.
    const without = barText.replace(/<g id="patch_5">[\s\S]*?<\/g>/, '');
    expect(without.length).toBeLessThan(barText.length);
    const { diff } = await compareSvgs(barText, without, { before: 'a.svg', after: 'b.svg' });
    expect(diff.marks.removed).toHaveLength(1);
    expect(diff.marks.removed[0]!.box.x).toBeCloseTo(223.24, 1);
    expect(diff.marks.added).toHaveLength(0);
    expect(diff.marks.unchanged).toBe(4);
    const mill = diff.values.find((v) => v.x === 'Mill Lane');
    expect(mill?.before).toBeCloseTo(96, 1);
    expect(mill?.after).toBeNull();
    expect(diff.pixels!.changedPixels).toBeGreaterThan(0);
  });

  it('compares two different real charts: the truncated baseline is resolved', async () => {
    const { code, out } = await run(BAR, join(REAL_CHARTS, 'mpl-bar-clean-01.svg'), { format: 'json' });
    expect(code).toBe(0);
    const d = JSON.parse(out) as ChartDiff;
    expect(d.findings.resolved.map((x) => x.rule)).toContain('truth.truncated-baseline');
    expect(d.findings.new.map((x) => x.rule)).not.toContain('truth.truncated-baseline');
    expect(d.values.length).toBeGreaterThan(0);
    const text = formatDiffText(d);
    expect(text).toContain('resolved  error truth.truncated-baseline');
  });

  it('returns at once for identical content and writes no picture', async () => {
    const copy = write('copy.svg', barText);
    const png = join(dir, 'identical.png');
    const { code, out, err } = await run(BAR, copy, { out: png, format: 'text' });
    expect(code).toBe(0);
    expect(out).toContain('identical');
    expect(err).toContain('no picture written');
    expect(existsSync(png)).toBe(false);
    const json = JSON.parse((await run(BAR, copy, { format: 'json' })).out) as ChartDiff;
    expect(json.identical).toBe(true);
    expect(json.pixels).toBeNull();
  });

  it('exits 2 for missing or unreadable files and a bad format', async () => {
    const missing = await run(join(dir, 'nope.svg'), BAR, {});
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/cannot read .*nope\.svg/);
    const broken = write('broken.svg', '<svg xmlns="http://www.w3.org/2000/svg"><rect');
    const bad = await run(BAR, broken, { format: 'text' });
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('broken.svg');
    expect(bad.out).toBe('');
    const fmt = await run(BAR, BAR, { format: 'xml' as 'text' });
    expect(fmt.code).toBe(2);
  });

  it('prints a readable text summary', async () => {
    const after = write('bar-changed-2.svg', barText.replaceAll('136.95555', String(NEW_TOP)));
    const { out } = await run(BAR, after, { format: 'text' });
    expect(out).toMatch(/^.*mpl-bar-truncated-01\.svg → .*bar-changed-2\.svg$/m);
    expect(out).toMatch(/pixels {4}\d+\.\d % changed/);
    expect(out).toContain('1 moved or resized');
    expect(out).toMatch(/Harbour: 96\.2 → 97\.1/);
  });
});
