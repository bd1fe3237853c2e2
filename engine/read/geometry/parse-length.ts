/**
 * SVG/CSS lengths: a number with an optional unit, converted to user units
 * (CSS px) at the CSS reference resolution of 96 per inch:
 * 1in = 96px, 1cm = 96/2.54px, 1mm = 96/25.4px, 1pt = 1/72in = 4/3px,
 * 1pc = 12pt = 16px. `em` and `ex` need the font size, `%` a reference length.
 */
import type { ParseError } from './parse-error.js';
import { readNumber, scanned, skipWsp } from './scan.js';

export type LengthUnit = '' | 'px' | 'pt' | 'pc' | 'mm' | 'cm' | 'in' | 'em' | 'ex' | '%';

export interface Length {
  readonly value: number;
  /** '' for a bare number (user units, same as px). */
  readonly unit: LengthUnit;
}

/** Absolute units in px. */
export const PX_PER_UNIT: Readonly<Record<'' | 'px' | 'pt' | 'pc' | 'mm' | 'cm' | 'in', number>> = Object.freeze({
  '': 1,
  px: 1,
  in: 96,
  cm: 96 / 2.54,
  mm: 96 / 25.4,
  pt: 96 / 72,
  pc: 16,
});

/** The CSS initial font size ('medium'). */
export const DEFAULT_FONT_SIZE = 16;

export interface LengthContext {
  /** What 100% means, in px (e.g. the viewport width for x and width). */
  readonly percentBase?: number;
  /** The element's font size in px; default 16. */
  readonly fontSize?: number;
  /** The font's x-height in px; default half the font size (the CSS fallback). */
  readonly xHeight?: number;
}

export interface LengthParseResult {
  length: Length | null;
  error?: ParseError;
}

const UNITS: ReadonlySet<string> = new Set(['px', 'pt', 'pc', 'mm', 'cm', 'in', 'em', 'ex']);

/**
 * Parses one length. Leading and trailing white space is allowed; units are
 * matched ASCII case-insensitively (as CSS does). Returns null with an error
 * for anything else, including non-finite numbers.
 */
export function parseLength(text: string): LengthParseResult {
  const n = text.length;
  const start = skipWsp(text, 0);
  if (start >= n) return { length: null, error: { offset: start, message: 'empty length' } };
  const end = readNumber(text, start);
  if (end < 0) return { length: null, error: { offset: start, message: 'a length must start with a number' } };
  const value = scanned.value;
  if (!Number.isFinite(value)) return { length: null, error: { offset: start, message: 'number out of range' } };
  let i = end;
  let unit: LengthUnit = '';
  if (text.charCodeAt(i) === 37) {
    unit = '%';
    i++;
  } else {
    const unitStart = i;
    while (i < n && isAsciiLetter(text.charCodeAt(i))) i++;
    if (i > unitStart) {
      const u = text.slice(unitStart, i).toLowerCase();
      if (!UNITS.has(u)) {
        return { length: null, error: { offset: unitStart, message: `unknown length unit '${text.slice(unitStart, i)}'` } };
      }
      unit = u as LengthUnit;
    }
  }
  const rest = skipWsp(text, i);
  if (rest < n) return { length: null, error: { offset: rest, message: `unexpected '${text[rest]}' after length` } };
  return { length: { value, unit } };
}

function isAsciiLetter(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 65 && c <= 90);
}

/**
 * The length in px, or null when it cannot be resolved: a percentage without
 * `context.percentBase`, or a result that overflows.
 */
export function lengthToPx(length: Length, context: LengthContext = {}): number | null {
  let px: number;
  switch (length.unit) {
    case '%':
      if (context.percentBase === undefined || !Number.isFinite(context.percentBase)) return null;
      px = (length.value / 100) * context.percentBase;
      break;
    case 'em':
      px = length.value * fontSizeOf(context);
      break;
    case 'ex':
      px = length.value * (context.xHeight !== undefined && Number.isFinite(context.xHeight) ? context.xHeight : fontSizeOf(context) / 2);
      break;
    default:
      px = length.value * PX_PER_UNIT[length.unit];
  }
  return Number.isFinite(px) ? px : null;
}

function fontSizeOf(context: LengthContext): number {
  const fs = context.fontSize;
  return fs !== undefined && Number.isFinite(fs) ? fs : DEFAULT_FONT_SIZE;
}

export interface ResolvedLength {
  /** px, or null when the text is malformed or cannot be resolved. */
  px: number | null;
  error?: ParseError;
}

/** parseLength followed by lengthToPx, with an error explaining a null. */
export function resolveLength(text: string, context: LengthContext = {}): ResolvedLength {
  const parsed = parseLength(text);
  if (parsed.length === null) return { px: null, error: parsed.error };
  const px = lengthToPx(parsed.length, context);
  if (px === null) {
    const message =
      parsed.length.unit === '%' && (context.percentBase === undefined || !Number.isFinite(context.percentBase))
        ? 'a percentage needs a reference length'
        : 'length out of range';
    return { px: null, error: { offset: skipWsp(text, 0), message } };
  }
  return { px };
}

/**
 * What 100% refers to for a coordinate or length inside a viewport of the
 * given size: the width for horizontal quantities, the height for vertical
 * ones, and sqrt((w² + h²)/2) for others such as a circle's r or a stroke
 * width (SVG 1.1 §7.10).
 */
export function percentReference(direction: 'x' | 'y' | 'other', viewportWidth: number, viewportHeight: number): number {
  if (direction === 'x') return viewportWidth;
  if (direction === 'y') return viewportHeight;
  return Math.hypot(viewportWidth, viewportHeight) / Math.SQRT2;
}
