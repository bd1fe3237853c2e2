/**
 * Fitting an axis mapping to tick (value, position) pairs.
 *
 * Linear: position = a·value + b. Log: position = a·log10(value) + b (all
 * values > 0). Both by ordinary least squares on position.
 *
 * Acceptance (a fit is "the axis" only when every tick sits on it):
 *   maxResidual ≤ tolerance, tolerance = max(minTolerancePx, relativeTolerance × median tick spacing)
 * with defaults 0.75 px and 2 %. Reasoning: tick labels in SVG output are
 * placed exactly at their tick (libraries print 2–6 decimals; a few round to
 * whole pixels, error ≤ 0.5 px), so a correct mapping leaves sub-pixel
 * residuals; a tick off by more than 2 % of a tick step would misstate every
 * value read from the axis by that much. The limit is relative to the tick
 * spacing rather than the axis span so that it does not loosen as more ticks
 * are drawn. The maximum residual, not the RMS, is tested: one misplaced tick
 * is enough to make an axis irregular.
 *
 * Linear is preferred: log is chosen only when linear is rejected, log is
 * accepted and there are at least three distinct values (two points fit any
 * monotone mapping).
 */
import type { TickPoint } from './tick-types.js';

export type { TickPoint } from './tick-types.js';

export interface FitOptions {
  /** Absolute floor of the acceptance limit, px. Default 0.75. */
  minTolerancePx?: number;
  /** Share of the median spacing between adjacent ticks. Default 0.02. */
  relativeTolerance?: number;
}

export const DEFAULT_MIN_TOLERANCE_PX = 0.75;
export const DEFAULT_RELATIVE_TOLERANCE = 0.02;

export interface ScaleFit {
  type: 'linear' | 'log';
  /** Slope: px per unit value (linear) or per decade (log). Negative when positions fall as values rise (SVG y axes). */
  a: number;
  /** Intercept in px. */
  b: number;
  /** RMS of position residuals, px. */
  residual: number;
  /** Largest absolute position residual, px. */
  maxResidual: number;
  /** Coefficient of determination of positions. */
  r2: number;
  /** Number of ticks fitted. */
  tickCount: number;
  /** Value → position. Log: NaN for values ≤ 0. */
  forward(value: number): number;
  /** Position → value. */
  invert(position: number): number;
}

export interface ScaleAssessment {
  /** The accepted fit, or null. */
  best: ScaleFit | null;
  /** The raw linear least-squares fit (accepted or not), null when it cannot be computed. */
  linear: ScaleFit | null;
  /** The raw log fit, null when a value ≤ 0 or fewer than three distinct values. */
  log: ScaleFit | null;
  /** The acceptance limit used, px. */
  tolerance: number;
  /** Why nothing was accepted (absent when `best` is set). */
  reason?: string;
}

function checkTicks(ticks: readonly TickPoint[], fn: string): void {
  if (!Array.isArray(ticks)) throw new TypeError(`${fn}: expected an array of {value, position}`);
  ticks.forEach((t, i) => {
    if (t === null || typeof t !== 'object') throw new TypeError(`${fn}: tick ${i} is not an object`);
    if (typeof t.value !== 'number' || !Number.isFinite(t.value)) {
      throw new RangeError(`${fn}: tick ${i} has a non-finite value (${String(t.value)})`);
    }
    if (typeof t.position !== 'number' || !Number.isFinite(t.position)) {
      throw new RangeError(`${fn}: tick ${i} has a non-finite position (${String(t.position)})`);
    }
  });
}

function distinctCount(xs: readonly number[]): number {
  return new Set(xs).size;
}

function median(xs: number[]): number {
  if (xs.length === 0) return 0;
  const s = [...xs].sort((p, q) => p - q);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

/**
 * Median gap between positions of ticks adjacent in value order (px); ticks
 * sharing a value are collapsed first. 0 when fewer than two distinct values.
 */
export function medianTickSpacing(ticks: readonly TickPoint[]): number {
  const byValue = new Map<number, number[]>();
  for (const t of ticks) {
    const list = byValue.get(t.value);
    if (list) list.push(t.position);
    else byValue.set(t.value, [t.position]);
  }
  const pts = [...byValue.entries()]
    .map(([value, ps]) => ({ value, position: ps.reduce((s, p) => s + p, 0) / ps.length }))
    .sort((p, q) => p.value - q.value);
  const gaps: number[] = [];
  for (let i = 1; i < pts.length; i++) gaps.push(Math.abs(pts[i].position - pts[i - 1].position));
  return median(gaps);
}

/** The acceptance limit for a set of ticks (see the module note). */
export function scaleTolerance(ticks: readonly TickPoint[], options: FitOptions = {}): number {
  const floor = options.minTolerancePx ?? DEFAULT_MIN_TOLERANCE_PX;
  const rel = options.relativeTolerance ?? DEFAULT_RELATIVE_TOLERANCE;
  return Math.max(floor, rel * medianTickSpacing(ticks));
}

interface LineFit {
  a: number;
  b: number;
  residual: number;
  maxResidual: number;
  r2: number;
}

/** Least squares of ys on xs, centred for precision (xs may be epoch milliseconds). */
function leastSquares(xs: readonly number[], ys: readonly number[]): LineFit | null {
  const n = xs.length;
  if (n < 2 || distinctCount(xs) < 2) return null;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += xs[i];
    my += ys[i];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = xs[i] - mx;
    const dy = ys[i] - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (sxx === 0) return null;
  const a = sxy / sxx;
  const b = my - a * mx;
  if (!Number.isFinite(a) || !Number.isFinite(b) || a === 0) return null;
  let ss = 0;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    const r = ys[i] - (a * (xs[i] - mx) + my);
    ss += r * r;
    maxAbs = Math.max(maxAbs, Math.abs(r));
  }
  const r2 = syy === 0 ? 0 : 1 - ss / syy;
  return { a, b, residual: Math.sqrt(ss / n), maxResidual: maxAbs, r2 };
}

function makeFit(type: 'linear' | 'log', line: LineFit, n: number): ScaleFit {
  const { a, b } = line;
  const forward =
    type === 'linear'
      ? (value: number): number => a * value + b
      : (value: number): number => (value > 0 ? a * Math.log10(value) + b : Number.NaN);
  const invert =
    type === 'linear'
      ? (position: number): number => (position - b) / a
      : (position: number): number => 10 ** ((position - b) / a);
  return { type, a, b, residual: line.residual, maxResidual: line.maxResidual, r2: line.r2, tickCount: n, forward, invert };
}

/**
 * Unconditional linear least-squares fit. Null when there are fewer than two
 * distinct values or every tick sits at one position.
 * @throws RangeError / TypeError on non-finite or malformed ticks.
 */
export function fitLinear(ticks: readonly TickPoint[]): ScaleFit | null {
  checkTicks(ticks, 'fitLinear');
  const line = leastSquares(
    ticks.map((t) => t.value),
    ticks.map((t) => t.position),
  );
  return line ? makeFit('linear', line, ticks.length) : null;
}

/**
 * Unconditional fit of position against log10(value). Null when any value is
 * ≤ 0, fewer than three distinct values, or every tick sits at one position.
 * @throws RangeError / TypeError on non-finite or malformed ticks.
 */
export function fitLog(ticks: readonly TickPoint[]): ScaleFit | null {
  checkTicks(ticks, 'fitLog');
  if (ticks.some((t) => t.value <= 0)) return null;
  if (distinctCount(ticks.map((t) => t.value)) < 3) return null;
  const line = leastSquares(
    ticks.map((t) => Math.log10(t.value)),
    ticks.map((t) => t.position),
  );
  return line ? makeFit('log', line, ticks.length) : null;
}

/** Both fits, the acceptance limit, and the chosen one (or why none). */
export function assessScale(ticks: readonly TickPoint[], options: FitOptions = {}): ScaleAssessment {
  checkTicks(ticks, 'assessScale');
  const tolerance = scaleTolerance(ticks, options);
  const distinctValues = distinctCount(ticks.map((t) => t.value));
  if (distinctValues < 2) {
    return { best: null, linear: null, log: null, tolerance, reason: 'fewer than 2 distinct tick values' };
  }
  const linear = fitLinear(ticks);
  const log = fitLog(ticks);
  if (!linear) {
    return { best: null, linear, log, tolerance, reason: 'all ticks at one position' };
  }
  if (linear.maxResidual <= tolerance) return { best: linear, linear, log, tolerance };
  if (log && log.maxResidual <= tolerance) return { best: log, linear, log, tolerance };
  const logNote = log ? `, log ${log.maxResidual.toFixed(2)} px` : '';
  return {
    best: null,
    linear,
    log,
    tolerance,
    reason: `largest tick residual (linear ${linear.maxResidual.toFixed(2)} px${logNote}) exceeds ${tolerance.toFixed(2)} px`,
  };
}

/** The accepted linear or log mapping, or null (see the module note for the rule). */
export function fitScale(ticks: readonly TickPoint[], options: FitOptions = {}): ScaleFit | null {
  return assessScale(ticks, options).best;
}

export interface BandCategory {
  text: string;
  position: number;
  /** Rank by position, 0 for the smallest position. */
  index: number;
}

export interface BandFit {
  /** Categories in order of increasing position. */
  categories: BandCategory[];
  /** Least-squares px per category step (always > 0 when defined); null for a single category. */
  step: number | null;
  /** Fitted position of index 0, px. */
  offset: number;
  /** Every category within `tolerance` of offset + index × step. */
  evenlySpaced: boolean;
  /** Largest deviation from even spacing, px. */
  maxDeviation: number;
  /** The acceptance limit used, px (same rule as `fitScale`, relative to the step). */
  tolerance: number;
}

/**
 * Order band (category) labels by position and measure how evenly they are
 * spaced. Null for an empty list.
 * @throws RangeError / TypeError on a non-finite position or a non-string text.
 */
export function fitBand(categories: readonly { text: string; position: number }[], options: FitOptions = {}): BandFit | null {
  if (!Array.isArray(categories)) throw new TypeError('fitBand: expected an array of {text, position}');
  categories.forEach((c, i) => {
    if (c === null || typeof c !== 'object' || typeof c.text !== 'string') {
      throw new TypeError(`fitBand: category ${i} needs a string text`);
    }
    if (typeof c.position !== 'number' || !Number.isFinite(c.position)) {
      throw new RangeError(`fitBand: category ${i} has a non-finite position (${String(c.position)})`);
    }
  });
  if (categories.length === 0) return null;
  const sorted = categories
    .map((c, i) => ({ text: c.text, position: c.position, order: i }))
    .sort((p, q) => p.position - q.position || p.order - q.order)
    .map((c, index) => ({ text: c.text, position: c.position, index }));
  const floor = options.minTolerancePx ?? DEFAULT_MIN_TOLERANCE_PX;
  const rel = options.relativeTolerance ?? DEFAULT_RELATIVE_TOLERANCE;
  if (sorted.length === 1) {
    return { categories: sorted, step: null, offset: sorted[0].position, evenlySpaced: true, maxDeviation: 0, tolerance: floor };
  }
  const line = leastSquares(
    sorted.map((c) => c.index),
    sorted.map((c) => c.position),
  );
  if (!line) {
    // All labels at one position.
    return { categories: sorted, step: 0, offset: sorted[0].position, evenlySpaced: false, maxDeviation: 0, tolerance: floor };
  }
  const tolerance = Math.max(floor, rel * Math.abs(line.a));
  const gaps = sorted.slice(1).map((c, i) => c.position - sorted[i].position);
  const evenlySpaced = line.maxResidual <= tolerance && gaps.every((g) => g > 0);
  return { categories: sorted, step: line.a, offset: line.b, evenlySpaced, maxDeviation: line.maxResidual, tolerance };
}
