import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { detectPie } from '../engine/classify/pie/detect-wedges.js';
import { measureProjectionDistortion } from '../engine/measure/pie/projection-distortion.js';
import { buildScene } from '../engine/read/build-scene.js';
import { parseXml } from '../engine/read/parse-xml.js';
import type { ShapeItem, TextItem } from '../engine/read/scene.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const chartsDir = path.resolve(repoRoot, '../shared/real-charts');

interface ManifestPoint {
  x: string | number;
  y: number;
  color?: string;
}
interface ManifestEntry {
  file: string;
  kind: string;
  notes: string;
  planted: string[];
  series: { points: ManifestPoint[] }[];
}

const manifest = JSON.parse(readFileSync(path.join(chartsDir, 'manifest.json'), 'utf8')) as ManifestEntry[];
const PIE_KINDS = new Set(['pie', 'donut', 'pie3d']);

function load(file: string): { shapes: ShapeItem[]; texts: TextItem[] } {
  const scene = buildScene(parseXml(readFileSync(path.join(chartsDir, file), 'utf8')));
  return {
    shapes: scene.items.filter((i): i is ShapeItem => i.kind === 'shape'),
    texts: scene.items.filter((i): i is TextItem => i.kind === 'text'),
  };
}

function hex(c: { r: number; g: number; b: number } | null): string | null {
  if (!c) return null;
  return '#' + [c.r, c.g, c.b].map((v) => Math.round(v * 255).toString(16).padStart(2, '0')).join('');
}

describe('detectPie on real charts (../shared/real-charts)', () => {
  const pies = manifest.filter((e) => PIE_KINDS.has(e.kind));

  it('the manifest lists the pie, donut and 3D pie charts', () => {
    expect(pies.length).toBeGreaterThanOrEqual(8);
  });

  for (const entry of pies) {
    it(`${entry.file}: recovers every slice's share within 0.5 percentage points`, () => {
      const { shapes, texts } = load(entry.file);
      const pie = detectPie(shapes, texts);
      expect(pie, 'a pie is found').not.toBeNull();
      const points = entry.series[0]!.points;
      const total = points.reduce((s, p) => s + p.y, 0);
      expect(pie!.wedges.length).toBe(points.length);
      const rows: string[] = [];
      let worst = 0;
      for (const p of points) {
        const w = pie!.wedges.find((q) => hex(q.color) === p.color!.toLowerCase());
        expect(w, `a wedge coloured ${p.color}`).toBeDefined();
        // source: ../shared/real-charts/manifest.json (share = y / sum of y)
        const want = p.y / total;
        const err = Math.abs(w!.share - want) * 100;
        worst = Math.max(worst, err);
        rows.push(`${String(p.x).padEnd(18)} manifest ${(want * 100).toFixed(2).padStart(6)}  recovered ${(w!.share * 100).toFixed(2).padStart(6)}  label ${w!.label ?? '-'}`);
        expect(err, `${p.x}`).toBeLessThanOrEqual(0.5);
        // A label, when linked, is this slice's name.
        if (w!.label !== null) expect(w!.label).toBe(String(p.x));
      }
      const d = measureProjectionDistortion(pie!, shapes);
      console.log(
        `${entry.file} (${entry.kind}, basis ${pie!.shareBasis}, worst error ${worst.toFixed(3)} pp, apparent/true worst ${d.worstRatio.toFixed(3)}, drawn-angle/true worst ${d.worstAngleRatio.toFixed(3)})\n  ` +
          rows.join('\n  '),
      );
    });
  }

  it('mpl-pie-exploded-shadow-01: three pulled-out slices and a shadow under every wedge', () => {
    const entry = manifest.find((e) => e.file === 'mpl-pie-exploded-shadow-01.svg')!;
    // source: manifest notes ("three slices pulled out", "under every wedge a dark, half-transparent offset copy")
    expect(entry.planted).toEqual(expect.arrayContaining(['exploded-pie', 'drop-shadow']));
    const { shapes, texts } = load(entry.file);
    const pie = detectPie(shapes, texts)!;
    expect(pie.exploded.length).toBe(3);
    expect(pie.shadows.length).toBe(entry.series[0]!.points.length);
    const wedgeItems = new Set(pie.wedges.map((w) => w.item));
    for (const s of pie.shadows) expect(wedgeItems.has(s)).toBe(false);
  });

  it('mpl-pie3d-01: tilted top face, side walls, and apparent shares that differ from the data', () => {
    const entry = manifest.find((e) => e.file === 'mpl-pie3d-01.svg')!;
    // source: manifest (kind pie3d, planted 3d-tilt, notes: side walls shaded darker)
    expect(entry.planted).toContain('3d-tilt');
    const { shapes, texts } = load(entry.file);
    const pie = detectPie(shapes, texts)!;
    expect(pie.ellipse).not.toBeNull();
    expect(pie.ellipse!.tilt).toBeGreaterThan(0.3);
    expect(pie.walls.length).toBeGreaterThan(0);
    const d = measureProjectionDistortion(pie, shapes);
    expect(Math.abs(Math.log(d.worstRatio))).toBeGreaterThan(Math.log(1.1));
  });

  it('ec-rose-many-01: same angle for every slice, the value in the radius', () => {
    const entry = manifest.find((e) => e.file === 'ec-rose-many-01.svg')!;
    // source: manifest notes ("all 8 slices get the same 45-degree angle and the value is encoded by the radius only")
    const { shapes, texts } = load(entry.file);
    const pie = detectPie(shapes, texts)!;
    expect(pie.radiusVaries).toBe(true);
    expect(pie.shareBasis).toBe('radius');
    for (const w of pie.wedges) expect(w.end - w.start).toBeCloseTo(Math.PI / 4, 3);
  });

  it('vl-donut-clean-01: a donut has an inner radius', () => {
    // source: manifest (kind donut, notes: innerRadius 70)
    const { shapes, texts } = load('vl-donut-clean-01.svg');
    const pie = detectPie(shapes, texts)!;
    expect(pie.innerRadius).toBeCloseTo(70, 0);
  });

  it('finds no pie in any chart the manifest does not list as a pie', () => {
    const others = manifest.filter((e) => !PIE_KINDS.has(e.kind));
    expect(others.length).toBeGreaterThan(0);
    const found: string[] = [];
    for (const e of others) {
      const { shapes, texts } = load(e.file);
      // source: ../shared/real-charts/manifest.json (kind)
      if (detectPie(shapes, texts) !== null) found.push(e.file);
    }
    expect(found).toEqual([]);
  });
});
