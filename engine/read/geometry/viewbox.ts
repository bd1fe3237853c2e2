/**
 * `viewBox` and `preserveAspectRatio` (SVG 1.1 §7.7, §7.8): parsing, and the
 * matrix that maps viewBox coordinates into a viewport.
 */
import type { Matrix } from './matrix.js';
import type { ParseError } from './parse-error.js';
import { readNumber, scanned, skipCommaWsp, skipWsp } from './scan.js';

export interface ViewBox {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface ViewBoxParseResult {
  viewBox: ViewBox | null;
  error?: ParseError;
}

/**
 * Parses `min-x min-y width height` (numbers separated by white space and/or
 * a comma). A zero or negative width or height, a non-finite number, or
 * anything malformed gives null and an error (SVG 1.1 §7.7: negative is an
 * error, zero disables rendering; either way no usable viewBox).
 */
export function parseViewBox(text: string): ViewBoxParseResult {
  const n = text.length;
  const v: number[] = [];
  let i = skipWsp(text, 0);
  for (let k = 0; k < 4; k++) {
    if (k > 0) {
      const sep = skipCommaWsp(text, i);
      i = sep.index;
    }
    const end = readNumber(text, i);
    if (end < 0) {
      return { viewBox: null, error: { offset: i, message: i >= n ? 'viewBox needs four numbers' : 'expected a number in viewBox' } };
    }
    const value = scanned.value;
    if (!Number.isFinite(value)) return { viewBox: null, error: { offset: i, message: 'number out of range in viewBox' } };
    v.push(value);
    i = end;
  }
  const rest = skipWsp(text, i);
  if (rest < n) return { viewBox: null, error: { offset: rest, message: 'viewBox has more than four numbers or trailing text' } };
  const [x, y, width, height] = v;
  if (!(width > 0) || !(height > 0)) {
    return {
      viewBox: null,
      error: { offset: 0, message: `viewBox width and height must be positive (got ${width} × ${height})` },
    };
  }
  return { viewBox: { x, y, width, height } };
}

export type Align =
  | 'none'
  | 'xMinYMin'
  | 'xMidYMin'
  | 'xMaxYMin'
  | 'xMinYMid'
  | 'xMidYMid'
  | 'xMaxYMid'
  | 'xMinYMax'
  | 'xMidYMax'
  | 'xMaxYMax';

export interface PreserveAspectRatio {
  readonly align: Align;
  readonly meetOrSlice: 'meet' | 'slice';
}

/** The initial value: uniform scaling, centred, whole viewBox visible. */
export const DEFAULT_PRESERVE_ASPECT_RATIO: PreserveAspectRatio = Object.freeze({ align: 'xMidYMid', meetOrSlice: 'meet' });

const ALIGNS: ReadonlySet<string> = new Set([
  'none',
  'xMinYMin',
  'xMidYMin',
  'xMaxYMin',
  'xMinYMid',
  'xMidYMid',
  'xMaxYMid',
  'xMinYMax',
  'xMidYMax',
  'xMaxYMax',
]);

export interface PreserveAspectRatioParseResult {
  value: PreserveAspectRatio;
  error?: ParseError;
}

/**
 * Parses `[defer] <align> [meet | slice]` (keywords are case-sensitive).
 * Malformed text gives the default value and an error. `defer` is accepted
 * and ignored (it only concerns images).
 */
export function parsePreserveAspectRatio(text: string): PreserveAspectRatioParseResult {
  const tokens: { word: string; offset: number }[] = [];
  const re = /[^\x20\t\n\r\f]+/g;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) tokens.push({ word: m[0], offset: m.index });
  let k = 0;
  if (tokens[k]?.word === 'defer') k++;
  const alignTok = tokens[k];
  if (alignTok === undefined) {
    return { value: DEFAULT_PRESERVE_ASPECT_RATIO, error: { offset: text.length, message: 'preserveAspectRatio needs an align value' } };
  }
  if (!ALIGNS.has(alignTok.word)) {
    return {
      value: DEFAULT_PRESERVE_ASPECT_RATIO,
      error: { offset: alignTok.offset, message: `unknown preserveAspectRatio align value '${alignTok.word}'` },
    };
  }
  k++;
  let meetOrSlice: 'meet' | 'slice' = 'meet';
  const mos = tokens[k];
  if (mos !== undefined) {
    if (mos.word !== 'meet' && mos.word !== 'slice') {
      return { value: DEFAULT_PRESERVE_ASPECT_RATIO, error: { offset: mos.offset, message: `expected 'meet' or 'slice', found '${mos.word}'` } };
    }
    meetOrSlice = mos.word;
    k++;
  }
  if (k < tokens.length) {
    return { value: DEFAULT_PRESERVE_ASPECT_RATIO, error: { offset: tokens[k].offset, message: 'unexpected text after preserveAspectRatio value' } };
  }
  return { value: { align: alignTok.word as Align, meetOrSlice } };
}

export interface Viewport {
  /** Position of the viewport in its parent's user space; default 0. */
  readonly x?: number;
  readonly y?: number;
  readonly width: number;
  readonly height: number;
}

/**
 * The matrix from viewBox coordinates to the viewport's parent coordinates.
 *
 * Scale factors are viewport/viewBox per axis; unless align is `none` both
 * become the smaller (`meet`) or the larger (`slice`) of the two. The scaled
 * viewBox is then placed at the min, mid or max of the viewport on each axis
 * according to align. A zero-sized viewport gives a singular matrix.
 */
export function viewBoxToViewport(
  viewBox: ViewBox,
  viewport: Viewport,
  par: PreserveAspectRatio = DEFAULT_PRESERVE_ASPECT_RATIO,
): Matrix {
  const vx = viewport.x ?? 0;
  const vy = viewport.y ?? 0;
  let sx = viewport.width / viewBox.width;
  let sy = viewport.height / viewBox.height;
  if (par.align !== 'none') {
    const s = par.meetOrSlice === 'slice' ? Math.max(sx, sy) : Math.min(sx, sy);
    sx = s;
    sy = s;
  }
  let tx = vx - viewBox.x * sx;
  let ty = vy - viewBox.y * sy;
  if (par.align !== 'none') {
    const xPart = par.align.slice(0, 4);
    const yPart = par.align.slice(4);
    const freeX = viewport.width - viewBox.width * sx;
    const freeY = viewport.height - viewBox.height * sy;
    if (xPart === 'xMid') tx += freeX / 2;
    else if (xPart === 'xMax') tx += freeX;
    if (yPart === 'YMid') ty += freeY / 2;
    else if (yPart === 'YMax') ty += freeY;
  }
  return [sx, 0, 0, sy, tx, ty];
}
