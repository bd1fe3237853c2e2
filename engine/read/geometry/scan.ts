/**
 * Low-level scanning of the number and separator syntax shared by SVG
 * attribute micro-grammars (path data, transform lists, viewBox, points,
 * lengths). Works on char codes; common numbers are converted without
 * allocating.
 */

/** SVG white space: space, tab, line feed, carriage return (plus form feed, as CSS allows). */
export function isWsp(c: number): boolean {
  return c === 32 || c === 9 || c === 10 || c === 13 || c === 12;
}

/** True for a char that can begin a number token: digit, sign or decimal point. */
export function isNumberStart(c: number): boolean {
  return (c >= 48 && c <= 57) || c === 45 || c === 43 || c === 46;
}

/** Index of the first non-white-space char at or after `i`. */
export function skipWsp(s: string, i: number): number {
  const n = s.length;
  while (i < n && isWsp(s.charCodeAt(i))) i++;
  return i;
}

/**
 * Skips `wsp* ,? wsp*` starting at `i`. Returns the new index; `sawComma`
 * reports whether a comma was consumed (the caller then requires another value).
 */
export function skipCommaWsp(s: string, i: number): { index: number; sawComma: boolean } {
  i = skipWsp(s, i);
  if (s.charCodeAt(i) === 44) {
    return { index: skipWsp(s, i + 1), sawComma: true };
  }
  return { index: i, sawComma: false };
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * Where readNumber leaves the value of the token it read. (A plain object
 * rather than an exported `let`, whose live binding some module loaders turn
 * into a getter call on every access.)
 */
export const scanned = { value: 0 };

/**
 * Scans the number token at `i` and stores its value in `scanned.value`.
 * Returns the end index, or -1 when no number starts at `i`.
 *
 * Grammar (SVG 1.1 path and basic-data-type number, also CSS <number>):
 * `sign? (digits ('.' digits?)? | '.' digits) (('e'|'E') sign? digits)?`.
 * An `e` that is not followed by digits is left unconsumed, so `1em` scans
 * as the number `1` followed by the unit `em`, and `1.5.5` as `1.5` then `.5`.
 *
 * Plain decimals with at most 15 significant digits are converted without
 * allocating: the digits form an exact integer m and the result m / 10^k is
 * a single correctly rounded division (both operands exact). Anything else
 * (exponents, long mantissas) goes through `Number()`.
 */
export function readNumber(s: string, i: number): number {
  let j = i;
  let c = s.charCodeAt(j);
  let negative = false;
  if (c === 43 || c === 45) {
    negative = c === 45;
    c = s.charCodeAt(++j);
  }
  let mantissa = 0;
  let digits = 0;
  let fracDigits = 0;
  while (c >= 48 && c <= 57) {
    mantissa = mantissa * 10 + (c - 48);
    digits++;
    c = s.charCodeAt(++j);
  }
  if (c === 46) {
    c = s.charCodeAt(++j);
    while (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      fracDigits++;
      c = s.charCodeAt(++j);
    }
  }
  if (digits === 0) return -1;
  let simple = digits <= 15;
  if (c === 101 || c === 69) {
    let k = j + 1;
    let e = s.charCodeAt(k);
    if (e === 43 || e === 45) e = s.charCodeAt(++k);
    if (e >= 48 && e <= 57) {
      while (e >= 48 && e <= 57) e = s.charCodeAt(++k);
      j = k;
      simple = false;
    }
  }
  if (simple) {
    const v = fracDigits === 0 ? mantissa : mantissa / POW10[fracDigits];
    scanned.value = negative ? -v : v;
  } else {
    scanned.value = Number(s.slice(i, j));
  }
  return j;
}
