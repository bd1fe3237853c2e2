/**
 * Measures: numbers about a Chart that rules read. Computed once per chart by
 * `measureChart`; each part lives in its own module of this folder.
 */
import type { Chart } from '../classify/chart.js';
import { measureInk, type InkMeasure } from './ink.js';

export interface MeasureOptions {
  /** Intended display width in CSS px (null: the figure's own width). */
  displayWidth?: number | null;
}

export interface Measures {
  ink: InkMeasure;
}

export function measureChart(chart: Chart, options: MeasureOptions = {}): Measures {
  void options;
  return { ink: measureInk(chart) };
}
