/**
 * Measures: numbers about a Chart that rules read. Computed once per chart by
 * `measureChart`; each part lives in its own module of this folder.
 */
import type { Chart } from '../classify/chart.js';
import { measureInk, type InkMeasure } from './ink.js';
import { measureOverplot, type OverplotMeasure } from './overplot.js';
import { buildSurfaceIndex } from './surfaces.js';
import { measureTextLabels, type TextMeasure } from './text.js';
import { measureBaseline, type BaselineMeasure } from './baseline.js';
import { measureRamp, type RampMeasure } from './color-ramp.js';
import { measureMarkContrast, type MarkContrast } from './mark-contrast.js';
import { measurePalette, type PaletteMeasure } from './palette.js';
import { measureProjection, type ProjectionMeasure } from './projection.js';

export interface MeasureOptions {
  /** Intended display width in CSS px (null: the figure's own width). */
  displayWidth?: number | null;
}

export interface Measures {
  ink: InkMeasure;
  /** Text sizes at the display size, contrast, collisions, numeric columns and precision. */
  text: TextMeasure;
  /** Point marks overlapping other point marks. */
  overplot: OverplotMeasure;
  /** Bars and areas: baseline and lie factor (null for other charts). */
  baseline: BaselineMeasure | null;
  /** Categorical colours and their pairwise ΔE00 under normal and simulated CVD vision. */
  palette: PaletteMeasure;
  /** The quantity colour ramp (colour bar or numeric legend) and its lightness shape. */
  ramp: RampMeasure | null;
  /** WCAG contrast of each categorical mark colour against what is behind it. */
  markContrast: MarkContrast[];
  /** Tilted/extruded pies and extruded bars. */
  projection: ProjectionMeasure;
}

export function measureChart(chart: Chart, options: MeasureOptions = {}): Measures {
  const palette = measurePalette(chart);
  const surfaces = buildSurfaceIndex(chart.scene);
  return {
    ink: measureInk(chart, surfaces),
    text: measureTextLabels(chart, surfaces, { displayWidth: options.displayWidth ?? null }),
    overplot: measureOverplot(chart),
    baseline: measureBaseline(chart),
    palette,
    ramp: measureRamp(chart),
    markContrast: measureMarkContrast(chart, palette.entries, surfaces),
    projection: measureProjection(chart),
  };
}
