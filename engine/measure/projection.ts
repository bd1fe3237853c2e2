/**
 * What a third dimension does to a chart: for tilted or extruded pies, each
 * wedge's true share against the share it appears to have (drawn angle, and
 * visible area of top face plus side walls); for extruded bars, the share of
 * the bars' ink that is extrusion (side and top faces) rather than the front
 * face whose height carries the value.
 */
import type { Chart } from '../classify/chart.js';
import type { ShapeItem } from '../read/scene.js';
import { measureProjectionDistortion, type ProjectionDistortion } from './pie/projection-distortion.js';

export interface BarExtrusion {
  /** Extrusion area over extrusion + front-face area. */
  share: number;
  faces: number[];
  bars: number[];
}

export interface ProjectionMeasure {
  /** Tilted or extruded pie: per-wedge distortion (null for flat pies and non-pies). */
  pie: (ProjectionDistortion & { tilt: number | null; walls: number }) | null;
  bars: BarExtrusion | null;
}

function shapeAt(chart: Chart, i: number): ShapeItem | null {
  const it = chart.scene.items[i];
  return it && it.kind === 'shape' ? it : null;
}

export function measureProjection(chart: Chart): ProjectionMeasure {
  let pie: ProjectionMeasure['pie'] = null;
  const p = chart.pie;
  if (p && p.wedges.length > 0 && (p.ellipse !== null || p.walls.length > 0)) {
    const shapes = chart.scene.items.filter((it): it is ShapeItem => it.kind === 'shape');
    const d = measureProjectionDistortion(p, shapes);
    pie = { ...d, tilt: p.ellipse ? p.ellipse.tilt : null, walls: p.walls.length };
  }
  let bars: BarExtrusion | null = null;
  if (!p && chart.extrusions.length > 0) {
    const faces = chart.extrusions.filter((i) => shapeAt(chart, i) !== null);
    const fronts: number[] = [];
    chart.roles.forEach((r, i) => {
      if (r.sub === 'mark/bar' && shapeAt(chart, i)) fronts.push(i);
    });
    const area = (list: number[]) => list.reduce((s, i) => s + (shapeAt(chart, i)?.area ?? 0), 0);
    const fa = area(faces);
    const ba = area(fronts);
    if (fa + ba > 0) bars = { share: fa / (fa + ba), faces, bars: fronts };
  }
  return { pie, bars };
}
