/**
 * Shapes shared by the tick-label parser, the scale fitter and axis inference.
 *
 * A tick label parses to exactly one of three kinds:
 *
 * - `number`: a quantity. `value` has every written factor applied (SI or
 *   financial suffix, exponent, byte prefix) but a percent sign is *not*
 *   divided out: `45%` → 45 with `unit: '%'`, `$1.2k` → 1200 with
 *   `unit: '$'` and `suffix: 'k'`.
 * - `date`: an instant in UTC epoch milliseconds. Labels that omit calendar
 *   fields (`April`, `Mar 15`, `12:00`) still get an `ms` — the missing
 *   fields take the values of 1970-01-01T00:00Z — and `parts` tells which
 *   fields were actually written, so a caller with context (the neighbouring
 *   labels of a time axis) can fill them in.
 * - `category`: anything else, kept as whitespace-normalised text.
 */

/** Calendar fields a date label can state. Month is 1–12, day 1–31, hour 0–23. */
export interface DateParts {
  year?: number;
  month?: number;
  day?: number;
  hour?: number;
  minute?: number;
  second?: number;
  millisecond?: number;
}

export type DateGranularity = 'year' | 'quarter' | 'month' | 'day' | 'hour' | 'minute' | 'second';

export interface NumberTick {
  kind: 'number';
  /** The quantity, all multiplicative factors applied; percent not divided by 100. */
  value: number;
  /** Digits after the decimal mark in the written mantissa (`1.50k` → 2, `2×10³` → 0). */
  decimals: number;
  /**
   * Unit written with the number: `'%'`, `'‰'`, `'°'`, `'°C'`, `'°F'`, `'×'`
   * (fold change), a currency symbol or ISO 4217 code (`'$'`, `'€'`, `'£'`,
   * `'USD'` …), or `'B'` for bytes (only with a byte prefix such as `kB`,
   * `MiB`, or when `bareB: 'byte'`).
   */
  unit?: string;
  /** Magnitude suffix as written: `k`, `K`, `M`, `G`, `T`, `P`, `B`, `bn`, `m`, `µ`, `n`, `p`, or a byte prefix `Ki`, `Mi` …. */
  suffix?: string;
  /** Factor the suffix and exponent contribute: value = mantissa × factor (sign included in mantissa). */
  factor: number;
  /** How the magnitude was written. */
  notation: 'plain' | 'scientific' | 'suffix';
  /** Digit-group separators were present (`1,000`, `1 000`). */
  grouped: boolean;
  /**
   * The separator reading was a guess: a single `,` or `.` followed by exactly
   * three digits (`1,000` / `1.000`) reads as grouping for `,` and decimal for `.`
   * unless a decimal mark was given.
   */
  ambiguousSeparator?: true;
  /** Evidence about the decimal mark in this label: `','` for `0,5` or `1.000.000`; `'.'` for `1,000.5`. */
  decimalMarkEvidence?: '.' | ',';
  /** A bare integer 1000–2999 with no sign, separator, unit or suffix: could be a calendar year. */
  maybeYear?: true;
  /** The label as given. */
  text: string;
}

export interface DateTick {
  kind: 'date';
  /** UTC epoch milliseconds; fields missing from `parts` are taken from 1970-01-01T00:00:00Z. */
  ms: number;
  /** The smallest calendar unit the label states. */
  granularity: DateGranularity;
  /** The fields the label actually states (after 12-hour clock and two-digit-year expansion). */
  parts: DateParts;
  /** Day and month order was a guess (`03/04/2024` with both numbers ≤ 12 → month first unless told). */
  ambiguousOrder?: true;
  /** Evidence about the day/month order from this label alone (`15/03/2024` → `'day-first'`). */
  orderEvidence?: 'day-first' | 'month-first';
  /** The label as given. */
  text: string;
}

export interface CategoryTick {
  kind: 'category';
  /** Whitespace-normalised label text. */
  text: string;
}

export type ParsedTick = NumberTick | DateTick | CategoryTick;

/** Options for reading a single label. All optional; defaults suit English-language output. */
export interface ParseOptions {
  /**
   * Decimal mark. When omitted each label is read on its own: `1,5` and
   * `1.000.000` read as comma-decimal, `1,000` as comma-grouped, `1.5` as dot-decimal.
   */
  decimalMark?: '.' | ',';
  /** Numeric dates `a/b/yyyy` with both a, b ≤ 12: which comes first. Default month-first. */
  dayFirst?: boolean;
  /** A bare `B` after a number: billions (default) or bytes. */
  bareB?: 'billion' | 'byte';
}

/** A tick's value and its position along the axis in SVG user units. */
export interface TickPoint {
  value: number;
  position: number;
}
