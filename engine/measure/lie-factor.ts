/**
 * Tufte's lie factor: the size of an effect as drawn over its size in the
 * data, each size of effect a relative change |second − first| / |first|.
 *
 * Note the definition is not a ratio of ratios: when the data grow by a
 * factor a and the drawing by a factor b, the lie factor is (b − 1)/(a − 1),
 * not b/a. On Tufte's fuel-economy example (data 18 → 27.5, lines 0.6 → 5.3)
 * this gives 14.8 where b/a would give 5.78.
 */

/** A pair of magnitudes: the first and the second of a comparison. */
export type Pair = readonly [first: number, second: number];

export interface LieFactorInput {
  /** The two magnitudes as drawn (lengths, areas…). */
  shown: Pair;
  /** The same two as data values. */
  data: Pair;
}

function assertPair(p: unknown, what: string): asserts p is Pair {
  if (!Array.isArray(p) || p.length !== 2) throw new TypeError(`${what}: expected [first, second]`);
  for (const v of p) {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new TypeError(`${what}: values must be finite numbers, got ${String(v)}`);
  }
  if (p[0] === 0) throw new RangeError(`${what}: the first value is 0, so a relative change is undefined`);
}

/** Relative change |second − first| / |first|. Throws when first is 0 or a value is not finite. */
export function sizeOfEffect(pair: Pair): number {
  assertPair(pair, 'sizeOfEffect');
  return Math.abs(pair[1] - pair[0]) / Math.abs(pair[0]);
}

/**
 * Lie factor = size of effect shown ÷ size of effect in data. 1 when both
 * show no change; Infinity when the data do not change but the drawing does.
 * Tufte calls values outside 0.95–1.05 substantial distortion.
 */
export function lieFactor(input: LieFactorInput): number {
  if (input === null || typeof input !== 'object') throw new TypeError('lieFactor: expected { shown, data }');
  assertPair(input.shown, 'lieFactor shown');
  assertPair(input.data, 'lieFactor data');
  const shown = sizeOfEffect(input.shown);
  const data = sizeOfEffect(input.data);
  if (data === 0) return shown === 0 ? 1 : Infinity;
  return shown / data;
}

/** Tufte's acceptable band for the lie factor. */
export const LIE_FACTOR_BAND = { low: 0.95, high: 1.05 } as const;
