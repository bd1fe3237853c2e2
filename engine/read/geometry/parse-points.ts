/**
 * The `points` attribute of polyline and polygon: numbers separated by white
 * space and/or a comma, read as x,y pairs. As with path data (SVG 1.1
 * Appendix F.2), reading stops at the first error and the pairs read so far
 * are kept; an odd trailing number is dropped and reported.
 */
import type { ParseError } from './parse-error.js';
import { readNumber, scanned, skipWsp } from './scan.js';

export interface PointsParseResult {
  /** Flat [x0, y0, x1, y1, …]; always of even length. */
  points: number[];
  error?: ParseError;
}

export function parsePoints(text: string): PointsParseResult {
  const n = text.length;
  const points: number[] = [];
  let i = skipWsp(text, 0);
  let lastStart = i;
  while (i < n) {
    if (points.length > 0) {
      if (text.charCodeAt(i) === 44) i = skipWsp(text, i + 1);
    }
    const end = readNumber(text, i);
    if (end < 0) {
      return finish(points, { offset: i, message: i >= n ? "points end with ','" : `expected a number in points, found '${text[i]}'` });
    }
    const v = scanned.value;
    if (!Number.isFinite(v)) return finish(points, { offset: i, message: 'number out of range in points' });
    lastStart = i;
    points.push(v);
    i = skipWsp(text, end);
  }
  if (points.length % 2 === 1) {
    return finish(points, { offset: lastStart, message: 'points has an odd number of coordinates; the last one is ignored' });
  }
  return { points };
}

function finish(points: number[], error: ParseError): PointsParseResult {
  if (points.length % 2 === 1) points.length -= 1;
  return { points, error };
}
