/**
 * Axis scale inference from the tick labels found along one axis.
 *
 * Decision, in order:
 * 1. Empty labels are set aside. A single label of the form `×10³` (a power
 *    of ten) among the labels is taken as the axis multiplier (when none was given).
 * 2. Every label is parsed; if the labels give one-sided evidence about the
 *    decimal mark (`0,5`), the day/month order (`15/03/2024`) or bytes
 *    (`kB`), all labels are re-read with it.
 * 3. Any category label → `band` (a mixture of numbers and text is a band).
 * 4. Dates (with bare four-digit numbers read as years when mixed with
 *    dates) → partial dates completed from their neighbours, then a linear
 *    fit on epoch ms → `time`. Date labels evenly spaced but not proportional
 *    to time (monthly labels at equal steps) → `band`.
 * 5. Numbers → multiplier/offset applied, linear or log fit (see `fit-scale.ts`).
 *    A run of years (2019, 2020, 2021) stays numeric: the caller may call it time.
 *    Numbers fitting neither but evenly spaced → `band` (ordinal numbers).
 * 6. Anything else → `unfitted`, with the reason and the rejected fits: an
 *    axis whose ticks do not sit on any linear, log or time mapping.
 *
 * Labels alone cannot tell a band of evenly spaced numbers or hours (bars at
 * 2001, 2002, …) from a linear axis: such axes come back linear/time, and the
 * caller decides from the marks.
 */
import { fillDateSequence } from './fill-dates.js';
import { msFromParts } from './parse-date-label.js';
import { assessScale, fitBand, fitLinear, scaleTolerance } from './fit-scale.js';
import type { BandFit, FitOptions, ScaleAssessment, ScaleFit } from './fit-scale.js';
import { parseAxisMultiplier, parseTickLabel } from './parse-tick-label.js';
import type { AxisMultiplier } from './parse-tick-label.js';
import { normalizeForParsing } from './normalize-label.js';
import type { DateParts, ParseOptions, ParsedTick } from './tick-types.js';

export interface AxisLabel {
  text: string;
  /** Position along the axis in SVG user units (x for a horizontal axis, y for a vertical one). */
  position: number;
}

export interface AxisTick {
  text: string;
  position: number;
  parsed: ParsedTick;
  /**
   * Numeric value on the axis: the number with multiplier/offset applied,
   * or epoch ms for dates (after completion from neighbours); null for categories.
   */
  value: number | null;
}

export interface InferOptions extends FitOptions, ParseOptions {
  /**
   * Pixel extent of the axis (e.g. the plot-area edges). When given, the
   * domain of a linear/log/time axis is the values at these two positions;
   * otherwise it is the span of the tick values.
   */
  range?: readonly [number, number];
}

interface AxisCommon {
  /** Parsed labels in order of increasing position. */
  ticks: AxisTick[];
  /** Labels set aside: empty text, or the one read as the multiplier. */
  ignored: AxisLabel[];
  /** The multiplier/offset applied to numeric ticks, if any. */
  multiplier?: AxisMultiplier;
  /** Human-readable remarks on choices made. */
  notes: string[];
}

export interface ContinuousAxisScale extends AxisCommon {
  scale: 'linear' | 'log';
  fit: ScaleFit;
  /** [low, high] values (see `InferOptions.range`). */
  domain: [number, number];
}

export interface TimeAxisScale extends AxisCommon {
  scale: 'time';
  /** Linear fit of position on epoch ms. */
  fit: ScaleFit;
  /** [earliest, latest] epoch ms (see `InferOptions.range`). */
  domain: [number, number];
  /** At least one label stated a year; otherwise dates are placed from 1970-01-01 (time of day, month names). */
  hasYear: boolean;
}

export interface BandAxisScale extends AxisCommon {
  scale: 'band';
  band: BandFit;
  /** Category texts in order of increasing position. */
  domain: string[];
  /** The rejected continuous fits when the labels were numbers or dates. */
  assessment?: ScaleAssessment;
}

export interface UnfittedAxisScale extends AxisCommon {
  scale: 'unfitted';
  reason: string;
  assessment?: ScaleAssessment;
  band?: BandFit;
  domain: null;
}

export type AxisScale = ContinuousAxisScale | TimeAxisScale | BandAxisScale | UnfittedAxisScale;

function validate(labels: readonly AxisLabel[]): void {
  if (!Array.isArray(labels)) throw new TypeError('inferAxisScale: expected an array of {text, position}');
  labels.forEach((l, i) => {
    if (l === null || typeof l !== 'object' || typeof l.text !== 'string') {
      throw new TypeError(`inferAxisScale: label ${i} needs a string text`);
    }
    if (typeof l.position !== 'number' || !Number.isFinite(l.position)) {
      throw new RangeError(`inferAxisScale: label ${i} ("${l.text}") has a non-finite position (${String(l.position)})`);
    }
  });
}

function parseAll(labels: readonly AxisLabel[], options: ParseOptions): { label: AxisLabel; parsed: ParsedTick }[] {
  const out: { label: AxisLabel; parsed: ParsedTick }[] = [];
  for (const label of labels) {
    const parsed = parseTickLabel(label.text, options);
    if (parsed) out.push({ label, parsed });
  }
  return out;
}

/** Options implied by one-sided evidence in the labels themselves. */
function evidenceOptions(parsed: readonly ParsedTick[], given: ParseOptions, notes: string[]): ParseOptions {
  const opts: ParseOptions = { ...given };
  if (given.decimalMark === undefined) {
    const marks = new Set(parsed.flatMap((p) => (p.kind === 'number' && p.decimalMarkEvidence ? [p.decimalMarkEvidence] : [])));
    if (marks.size === 1 && marks.has(',')) {
      opts.decimalMark = ',';
      notes.push('labels use a decimal comma; all labels read with "," as the decimal mark');
    } else if (marks.size === 1 && marks.has('.')) {
      opts.decimalMark = '.';
    } else if (marks.size === 2) {
      notes.push('labels disagree on the decimal mark; each read on its own');
    }
  }
  if (given.dayFirst === undefined) {
    const orders = new Set(parsed.flatMap((p) => (p.kind === 'date' && p.orderEvidence ? [p.orderEvidence] : [])));
    if (orders.size === 1) {
      opts.dayFirst = orders.has('day-first');
      if (opts.dayFirst) notes.push('numeric dates read day-first (a label has a day above 12 in first place)');
    }
  }
  if (given.bareB === undefined && parsed.some((p) => p.kind === 'number' && p.unit === 'B' && p.suffix !== undefined)) {
    opts.bareB = 'byte';
    notes.push('byte units present; a bare "B" read as bytes');
  }
  return opts;
}

/** A `×10³`-style label: a times sign, then a power of ten, no offset. */
function isMultiplierLabel(text: string): boolean {
  if (!/^\(?[×xX·⋅*] ?\d/.test(normalizeForParsing(text))) return false;
  const m = parseAxisMultiplier(text);
  return m !== null && m.offset === 0 && Number.isInteger(Math.round(Math.log10(m.multiplier) * 1e9) / 1e9);
}

function domainFrom(fit: ScaleFit, values: readonly number[], range: readonly [number, number] | undefined): [number, number] {
  if (range) {
    const v0 = fit.invert(range[0]);
    const v1 = fit.invert(range[1]);
    return v0 <= v1 ? [v0, v1] : [v1, v0];
  }
  return [Math.min(...values), Math.max(...values)];
}

function bandResult(
  items: { label: AxisLabel; parsed: ParsedTick; value: number | null }[],
  common: Omit<AxisCommon, 'ticks'>,
  options: FitOptions,
  assessment?: ScaleAssessment,
): BandAxisScale {
  const band = fitBand(
    items.map((i) => ({ text: i.label.text, position: i.label.position })),
    options,
  ) as BandFit; // items is non-empty here
  const out: BandAxisScale = {
    scale: 'band',
    band,
    domain: band.categories.map((c) => c.text),
    ticks: toTicks(items),
    ...common,
  };
  if (assessment) out.assessment = assessment;
  return out;
}

function toTicks(items: { label: AxisLabel; parsed: ParsedTick; value: number | null }[]): AxisTick[] {
  return items
    .map((i) => ({ text: i.label.text, position: i.label.position, parsed: i.parsed, value: i.value }))
    .sort((p, q) => p.position - q.position);
}

function unfitted(
  items: { label: AxisLabel; parsed: ParsedTick; value: number | null }[],
  common: Omit<AxisCommon, 'ticks'>,
  reason: string,
  extra: { assessment?: ScaleAssessment; band?: BandFit } = {},
): UnfittedAxisScale {
  const out: UnfittedAxisScale = { scale: 'unfitted', reason, domain: null, ticks: toTicks(items), ...common };
  if (extra.assessment) out.assessment = extra.assessment;
  if (extra.band) out.band = extra.band;
  return out;
}

/** Date parts of a tick: dates as parsed, bare four-digit numbers as years. */
function datePartsOf(p: ParsedTick): DateParts | null {
  if (p.kind === 'date') return p.parts;
  if (p.kind === 'number' && p.maybeYear) return { year: p.value };
  return null;
}

/**
 * Decide an axis scale from its tick labels and their positions.
 * `multiplierText` is an offset/multiplier label found near the axis end (see `parseAxisMultiplier`).
 * @throws TypeError / RangeError on malformed input (non-string text, non-finite position).
 */
export function inferAxisScale(
  labels: readonly AxisLabel[],
  multiplierText?: string,
  options: InferOptions = {},
): AxisScale {
  validate(labels);
  if (multiplierText !== undefined && typeof multiplierText !== 'string') {
    throw new TypeError('inferAxisScale: multiplierText must be a string when given');
  }
  if (options.range !== undefined) {
    const r = options.range;
    if (!Array.isArray(r) || r.length !== 2 || !r.every((v) => typeof v === 'number' && Number.isFinite(v))) {
      throw new RangeError('inferAxisScale: range must be two finite numbers');
    }
  }
  const notes: string[] = [];
  const ignored: AxisLabel[] = [];
  let multiplier: AxisMultiplier | undefined;
  if (multiplierText !== undefined && multiplierText.trim() !== '') {
    const m = parseAxisMultiplier(multiplierText);
    if (m) multiplier = m;
    else notes.push(`multiplier label "${multiplierText}" not understood; not applied`);
  }

  const kept: AxisLabel[] = [];
  // Only a single ×10ⁿ label among the others is a multiplier; several are tick labels of their own.
  const multiplierLabels = labels.filter((l) => isMultiplierLabel(l.text));
  const pullMultiplier = multiplierLabels.length === 1 && labels.length > 2;
  for (const l of labels) {
    if (parseTickLabel(l.text) === null) ignored.push(l);
    else if (pullMultiplier && l === multiplierLabels[0]) {
      ignored.push(l);
      if (!multiplier) {
        multiplier = parseAxisMultiplier(l.text) ?? undefined;
        notes.push(`label "${l.text}" read as the axis multiplier`);
      } else {
        notes.push(`label "${l.text}" looks like a second multiplier; ignored`);
      }
    } else kept.push(l);
  }

  const parseOpts: ParseOptions = { decimalMark: options.decimalMark, dayFirst: options.dayFirst, bareB: options.bareB };
  const first = parseAll(kept, parseOpts);
  const derived = evidenceOptions(
    first.map((f) => f.parsed),
    parseOpts,
    notes,
  );
  const parsed = parseAll(kept, derived);
  const fitOpts: FitOptions = { minTolerancePx: options.minTolerancePx, relativeTolerance: options.relativeTolerance };
  const common = (): Omit<AxisCommon, 'ticks'> => {
    const c: Omit<AxisCommon, 'ticks'> = { ignored, notes };
    if (multiplier) c.multiplier = multiplier;
    return c;
  };

  if (parsed.length === 0) {
    return unfitted([], common(), 'no labels');
  }

  const kinds = new Set(parsed.map((p) => p.parsed.kind));
  const valueOf = (p: ParsedTick): number | null =>
    p.kind === 'number' ? (multiplier ? p.value * multiplier.multiplier + multiplier.offset : p.value) : p.kind === 'date' ? p.ms : null;

  // 3. Categories (alone or mixed) → band.
  if (kinds.has('category')) {
    if (kinds.size > 1) notes.push('labels mix text with numbers or dates; read as categories');
    return bandResult(
      parsed.map((p) => ({ ...p, value: valueOf(p.parsed) })),
      common(),
      fitOpts,
    );
  }

  // 4. Dates.
  if (kinds.has('date')) {
    const partsList = parsed.map((p) => datePartsOf(p.parsed));
    if (partsList.some((p) => p === null)) {
      notes.push('labels mix dates with numbers that are not years; read as categories');
      return bandResult(
        parsed.map((p) => ({ ...p, value: valueOf(p.parsed) })),
        common(),
        fitOpts,
      );
    }
    if (multiplier) notes.push('multiplier label ignored on a date axis');
    return inferTime(parsed, partsList as DateParts[], common, fitOpts, options.range, notes);
  }

  // 5. Numbers.
  const items = parsed.map((p) => ({ ...p, value: valueOf(p.parsed) as number }));
  const points = items.map((i) => ({ value: i.value, position: i.label.position }));
  const assessment = assessScale(points, fitOpts);
  if (assessment.best) {
    const fit = assessment.best;
    const out: ContinuousAxisScale = {
      scale: fit.type,
      fit,
      domain: domainFrom(
        fit,
        points.map((p) => p.value),
        options.range,
      ),
      ticks: toTicks(items),
      ...common(),
    };
    return out;
  }
  const band = fitBand(
    items.map((i) => ({ text: i.label.text, position: i.label.position })),
    fitOpts,
  );
  const reason = assessment.reason ?? 'no mapping fits';
  if (band && band.evenlySpaced && band.categories.length >= 2 && new Set(points.map((p) => p.value)).size >= 2) {
    notes.push(`numeric labels evenly spaced but ${reason}; read as ordered categories`);
    return bandResult(items, common(), fitOpts, assessment);
  }
  return unfitted(items, common(), reason, band ? { assessment, band } : { assessment });
}

function inferTime(
  parsed: { label: AxisLabel; parsed: ParsedTick }[],
  partsList: DateParts[],
  common: () => Omit<AxisCommon, 'ticks'>,
  fitOpts: FitOptions,
  range: readonly [number, number] | undefined,
  notes: string[],
): AxisScale {
  const order = parsed.map((_, i) => i).sort((p, q) => parsed[p].label.position - parsed[q].label.position);
  const complete = partsList.every((p) => p.year !== undefined);
  let ms: number[] | null = null;
  if (complete) {
    ms = partsList.map((p) => msFromParts(p));
  } else {
    for (const seq of [order, [...order].reverse()]) {
      const filled = fillDateSequence(seq.map((i) => partsList[i]));
      if (filled) {
        ms = new Array<number>(parsed.length);
        seq.forEach((idx, k) => {
          (ms as number[])[idx] = filled[k];
        });
        break;
      }
    }
    if (!ms) {
      notes.push('partial dates could not be completed into an increasing sequence');
      ms = partsList.map((p) => msFromParts(p));
    }
  }
  const hasYear = partsList.some((p) => p.year !== undefined);
  if (!hasYear) notes.push('no label states a year; dates placed from 1970-01-01');
  const items = parsed.map((p, i) => ({ ...p, value: (ms as number[])[i] }));
  const points = items.map((i) => ({ value: i.value, position: i.label.position }));
  const tolerance = scaleTolerance(points, fitOpts);
  const distinct = new Set(points.map((p) => p.value)).size;
  const fit = distinct >= 2 ? fitLinear(points) : null;
  if (fit && fit.maxResidual <= tolerance) {
    const out: TimeAxisScale = {
      scale: 'time',
      fit,
      domain: domainFrom(
        fit,
        points.map((p) => p.value),
        range,
      ),
      hasYear,
      ticks: toTicks(items),
      ...common(),
    };
    return out;
  }
  const reason =
    distinct < 2
      ? 'fewer than 2 distinct tick values'
      : fit
        ? `largest tick residual (time ${fit.maxResidual.toFixed(2)} px) exceeds ${tolerance.toFixed(2)} px`
        : 'all ticks at one position';
  const assessment: ScaleAssessment = { best: null, linear: fit, log: null, tolerance, reason };
  const band = fitBand(
    items.map((i) => ({ text: i.label.text, position: i.label.position })),
    fitOpts,
  );
  if (band && band.evenlySpaced && band.categories.length >= 2 && distinct >= 2) {
    notes.push('date labels evenly spaced but not proportional to time; read as ordered categories');
    return bandResult(items, common(), fitOpts, assessment);
  }
  return unfitted(items, common(), reason, band ? { assessment, band } : { assessment });
}
