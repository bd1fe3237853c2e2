/**
 * The colour ramp a chart uses for a quantity, in order from low to high,
 * and the shape of its CIELAB lightness: monotonic (sequential), rising then
 * falling around a light, near-neutral middle (diverging), or neither.
 *
 * Sources, in order: the colour bar's samples; legend keys labelled with
 * numbers, sorted by number (stepped ramps drawn as a legend).
 */
import type { Chart } from '../classify/chart.js';
import { isMonotonicLightness, lightnessProfile } from '../color/lightness-profile.js';
import { toOklch } from '../color/to-oklch.js';
import type { Rgba } from '../color/types.js';

export type RampShape = 'sequential' | 'diverging' | 'irregular' | 'flat';

export interface RampMeasure {
  source: 'colorbar' | 'legend';
  /** Scene indices of the items that show the ramp. */
  items: number[];
  colors: Rgba[];
  /** CIELAB L* of each colour. */
  lightness: number[];
  shape: RampShape;
  /**
   * Largest fall of L* against the ramp's direction (sequential reading:
   * from the first colour to the last). For diverging ramps this is the
   * largest reversal within either arm.
   */
  largestReversal: number;
  /** Position (0..1 along the ramp) where that reversal bottoms out. */
  reversalAt: number | null;
  /** Index of the turning point when the ramp is diverging. */
  turningPoint: number | null;
}

/**
 * Lightness differences below this are not seen as a step: the 50% noticeable
 * difference in L* for marks of 1° or more (Stone, Szafir & Setlur 2014:
 * ND(50%, s) = 5.079 + 0.751/s).
 */
export const RAMP_LIGHTNESS_TOLERANCE = 5;
/** A diverging ramp's middle is near neutral: OKLCh chroma at most this (plumbline's own choice). */
export const DIVERGING_MID_CHROMA = 0.1;

const NUMBER = /^\s*([+\-−]?\d[\d,]*(?:\.\d+)?|[+\-−]?\.\d+)\s*%?\s*$/;

function parseKey(name: string | null): number | null {
  if (name === null) return null;
  const m = NUMBER.exec(name);
  if (!m) return null;
  const v = Number(m[1]!.replace('−', '-').replace(/,/g, ''));
  return Number.isFinite(v) ? v : null;
}

/** The ramp of a chart, or null when it has none with at least three colours. */
export function measureRamp(chart: Chart, tolerance = RAMP_LIGHTNESS_TOLERANCE): RampMeasure | null {
  if (chart.colorBar && chart.colorBar.colors.length >= 3) {
    return describe('colorbar', chart.colorBar.items, chart.colorBar.colors, tolerance);
  }
  const keys = chart.legend
    .map((e) => ({ v: parseKey(e.name), e }))
    .filter((k): k is { v: number; e: (typeof chart.legend)[number] } => k.v !== null && k.e.color !== null)
    .sort((a, b) => a.v - b.v);
  const distinct = new Set(keys.map((k) => `${k.e.color!.r},${k.e.color!.g},${k.e.color!.b}`));
  if (keys.length >= 3 && distinct.size >= 3) {
    return describe('legend', keys.map((k) => k.e.swatch), keys.map((k) => k.e.color!), tolerance);
  }
  return null;
}

/** Lightness shape of an ordered list of colours (at least three). */
export function describe(source: RampMeasure['source'], items: number[], colors: Rgba[], tolerance: number): RampMeasure {
  const lightness = lightnessProfile(colors);
  const n = colors.length;
  const at = (k: number | null) => (k === null || n < 2 ? null : k / (n - 1));
  const whole = isMonotonicLightness(colors, tolerance);
  const range = Math.max(...lightness) - Math.min(...lightness);
  if (range <= tolerance) {
    return { source, items, colors, lightness, shape: 'flat', largestReversal: range, reversalAt: null, turningPoint: null };
  }
  if (whole.monotonic && whole.direction !== 'flat') {
    return { source, items, colors, lightness, shape: 'sequential', largestReversal: whole.largestReversal, reversalAt: at(whole.reversalAt), turningPoint: null };
  }
  // Diverging: two monotonic arms meeting at the lightest (or darkest) colour,
  // which sits in the middle half of the ramp and is near neutral.
  const lightest = lightness.indexOf(Math.max(...lightness));
  const darkest = lightness.indexOf(Math.min(...lightness));
  for (const turn of [lightest, darkest]) {
    const t = turn / (n - 1);
    if (t < 0.25 || t > 0.75) continue;
    const left = isMonotonicLightness(colors.slice(0, turn + 1), tolerance);
    const right = isMonotonicLightness(colors.slice(turn), tolerance);
    const opposite = left.direction !== 'flat' && right.direction !== 'flat' && left.direction !== right.direction;
    if (left.monotonic && right.monotonic && opposite && toOklch(colors[turn]!).c <= DIVERGING_MID_CHROMA) {
      const worst = left.largestReversal >= right.largestReversal ? left : right;
      const offset = worst === right ? turn : 0;
      return {
        source,
        items,
        colors,
        lightness,
        shape: 'diverging',
        largestReversal: worst.largestReversal,
        reversalAt: at(worst.reversalAt === null ? null : worst.reversalAt + offset),
        turningPoint: turn,
      };
    }
  }
  return { source, items, colors, lightness, shape: 'irregular', largestReversal: whole.largestReversal, reversalAt: at(whole.reversalAt), turningPoint: null };
}
