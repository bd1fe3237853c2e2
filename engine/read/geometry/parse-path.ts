/**
 * SVG path data (the `d` attribute) to absolute segments.
 *
 * - Relative commands become absolute; H and V become L; S and T become C
 *   and Q with the reflected control point (SVG 1.1 §8.3.6, §8.3.7); A
 *   stays an arc and also gets its centre parameterisation (Appendix F.6.5),
 *   or becomes a line (zero radius) or nothing (coincident endpoints) per F.6.2.
 * - Implicit repetition: extra coordinate sets repeat the command, except
 *   after M/m where they are implicit L/l.
 * - Numbers may run together where the grammar allows (`1.5.5`, `1-2`,
 *   `1e-3`) and arc flags may be packed (`a1 1 0 00.5.5`).
 * - After Z, a drawing command that is not M starts a new subpath at the
 *   closed subpath's start; an explicit M segment is emitted for it so every
 *   subpath in the output begins with M.
 * - A single comma after a command's last number is tolerated (as browsers
 *   do: `L10 10, L20 20`).
 * - Error handling follows SVG 1.1 Appendix F.2 as browsers implement it:
 *   everything up to the last complete segment before the first error is
 *   kept, and the error's offset and reason are returned. Numbers that
 *   overflow (`1e400`) and coordinates that become non-finite are errors.
 *
 * Runs in one pass over char codes; time and memory are linear in the
 * length of `d`.
 */
import { arcSegment } from './arc.js';
import type { ParseError } from './parse-error.js';
import { isNumberStart, isWsp, readNumber as scanNumber, scanned, skipWsp } from './scan.js';
import type { Segment } from './segments.js';

export interface PathParseResult {
  segments: Segment[];
  error?: ParseError;
}

/** Number of arguments per repetition, by upper-case command letter. */
const ARG_COUNT: Record<number, number> = {
  77: 2, // M
  76: 2, // L
  72: 1, // H
  86: 1, // V
  67: 6, // C
  83: 4, // S
  81: 4, // Q
  84: 2, // T
  65: 7, // A
  90: 0, // Z
};

class PathDataError {
  constructor(
    readonly offset: number,
    readonly message: string,
  ) {}
}

export function parsePath(d: string): PathParseResult {
  const segments: Segment[] = [];
  const n = d.length;
  let i = skipWsp(d, 0);
  if (i >= n) return { segments };

  // Current point, subpath start, and control point for S/T reflection.
  let cx = 0;
  let cy = 0;
  let sx = 0;
  let sy = 0;
  let ctrlX = 0;
  let ctrlY = 0;
  let prev = 0; // upper-case letter of the previous command (0 at start)
  let closed = false; // the previous command was Z
  let committed = 0; // segments.length after the last complete coordinate set
  const args = [0, 0, 0, 0, 0, 0, 0];

  // Reads one number at i into args[k] and advances i past it.
  const readNumber = (k: number, cmdLetter: string): void => {
    const end = scanNumber(d, i);
    if (end < 0) {
      throw new PathDataError(
        i,
        i >= n ? `path data ends inside '${cmdLetter}': expected a number` : `expected a number for '${cmdLetter}', found '${d[i]}'`,
      );
    }
    const v = scanned.value;
    if (!Number.isFinite(v)) throw new PathDataError(i, 'number out of range');
    args[k] = v;
    i = end;
  };
  const readFlag = (k: number): void => {
    const c = d.charCodeAt(i);
    if (c !== 48 && c !== 49) {
      throw new PathDataError(i, i >= n ? "path data ends inside 'A': expected a flag" : `arc flag must be 0 or 1, found '${d[i]}'`);
    }
    args[k] = c - 48;
    i++;
  };
  // Between two arguments of one coordinate set: comma-wsp?.
  const skipSep = (): void => {
    while (i < n && isWsp(d.charCodeAt(i))) i++;
    if (d.charCodeAt(i) === 44) {
      i++;
      while (i < n && isWsp(d.charCodeAt(i))) i++;
    }
  };

  const first = d.charCodeAt(i);
  if (first !== 77 && first !== 109) {
    return { segments, error: { offset: i, message: "path data must begin with a moveto ('M' or 'm')" } };
  }

  try {
    while (i < n) {
      const code = d.charCodeAt(i);
      const upper = code >= 97 ? code - 32 : code;
      const count = ARG_COUNT[upper];
      if (count === undefined || code < 65 || (code > 90 && code < 97) || code > 122) {
        throw new PathDataError(i, isNumberStart(code) ? 'number without a command' : `unknown path command '${d[i]}'`);
      }
      const relative = code >= 97;
      const letter = d[i];
      i = skipWsp(d, i + 1);

      if (upper === 90) {
        segments.push({ type: 'Z', x0: cx, y0: cy, x: sx, y: sy });
        cx = sx;
        cy = sy;
        prev = 90;
        closed = true;
        committed = segments.length;
        continue;
      }

      let repeat = 0;
      for (;;) {
        const setOffset = i;
        // Read one full coordinate set; a partial set is dropped (F.2).
        if (upper === 65) {
          readNumber(0, letter);
          skipSep();
          readNumber(1, letter);
          skipSep();
          readNumber(2, letter);
          skipSep();
          readFlag(3);
          skipSep();
          readFlag(4);
          skipSep();
          readNumber(5, letter);
          skipSep();
          readNumber(6, letter);
        } else {
          for (let k = 0; k < count; k++) {
            if (k > 0) skipSep();
            readNumber(k, letter);
          }
        }

        const ox = relative ? cx : 0;
        const oy = relative ? cy : 0;
        if (closed && upper !== 77) {
          // A drawing command straight after Z: new subpath at the old start.
          segments.push({ type: 'M', x: sx, y: sy });
        }
        closed = false;
        let nx: number;
        let ny: number;
        switch (upper) {
          case 77: {
            nx = ox + args[0];
            ny = oy + args[1];
            checkFinite(nx, ny, setOffset);
            if (repeat === 0) {
              segments.push({ type: 'M', x: nx, y: ny });
              sx = nx;
              sy = ny;
            } else {
              segments.push({ type: 'L', x0: cx, y0: cy, x: nx, y: ny });
            }
            break;
          }
          case 76:
            nx = ox + args[0];
            ny = oy + args[1];
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'L', x0: cx, y0: cy, x: nx, y: ny });
            break;
          case 72:
            nx = ox + args[0];
            ny = cy;
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'L', x0: cx, y0: cy, x: nx, y: ny });
            break;
          case 86:
            nx = cx;
            ny = oy + args[0];
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'L', x0: cx, y0: cy, x: nx, y: ny });
            break;
          case 67: {
            const x1 = ox + args[0];
            const y1 = oy + args[1];
            const x2 = ox + args[2];
            const y2 = oy + args[3];
            nx = ox + args[4];
            ny = oy + args[5];
            checkFinite(x1, y1, setOffset);
            checkFinite(x2, y2, setOffset);
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'C', x0: cx, y0: cy, x1, y1, x2, y2, x: nx, y: ny });
            ctrlX = x2;
            ctrlY = y2;
            break;
          }
          case 83: {
            const smooth = prev === 67 || prev === 83;
            const x1 = smooth ? 2 * cx - ctrlX : cx;
            const y1 = smooth ? 2 * cy - ctrlY : cy;
            const x2 = ox + args[0];
            const y2 = oy + args[1];
            nx = ox + args[2];
            ny = oy + args[3];
            checkFinite(x1, y1, setOffset);
            checkFinite(x2, y2, setOffset);
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'C', x0: cx, y0: cy, x1, y1, x2, y2, x: nx, y: ny });
            ctrlX = x2;
            ctrlY = y2;
            break;
          }
          case 81: {
            const x1 = ox + args[0];
            const y1 = oy + args[1];
            nx = ox + args[2];
            ny = oy + args[3];
            checkFinite(x1, y1, setOffset);
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'Q', x0: cx, y0: cy, x1, y1, x: nx, y: ny });
            ctrlX = x1;
            ctrlY = y1;
            break;
          }
          case 84: {
            const smooth = prev === 81 || prev === 84;
            const x1 = smooth ? 2 * cx - ctrlX : cx;
            const y1 = smooth ? 2 * cy - ctrlY : cy;
            nx = ox + args[0];
            ny = oy + args[1];
            checkFinite(x1, y1, setOffset);
            checkFinite(nx, ny, setOffset);
            segments.push({ type: 'Q', x0: cx, y0: cy, x1, y1, x: nx, y: ny });
            ctrlX = x1;
            ctrlY = y1;
            break;
          }
          default: {
            // A
            nx = ox + args[5];
            ny = oy + args[6];
            checkFinite(nx, ny, setOffset);
            const seg = arcSegment(cx, cy, args[0], args[1], args[2], args[3] === 1, args[4] === 1, nx, ny);
            if (seg !== null) segments.push(seg);
            break;
          }
        }
        cx = nx;
        cy = ny;
        prev = upper;
        repeat++;
        committed = segments.length;

        // Another coordinate set (implicit repetition), or the next command.
        let j = i;
        while (j < n && isWsp(d.charCodeAt(j))) j++;
        let comma = false;
        if (d.charCodeAt(j) === 44) {
          comma = true;
          j++;
          while (j < n && isWsp(d.charCodeAt(j))) j++;
        }
        if (j < n && isNumberStart(d.charCodeAt(j))) {
          i = j;
          continue;
        }
        // One comma after the last number of a command is tolerated before
        // the next command or the end (browsers accept it); anything else
        // after a comma is an error.
        if (comma && j < n && !isCommandLetter(d.charCodeAt(j))) {
          throw new PathDataError(j, `expected a number after ',', found '${d[j]}'`);
        }
        i = j;
        break;
      }
    }
  } catch (e) {
    if (e instanceof PathDataError) {
      segments.length = committed;
      return { segments, error: { offset: e.offset, message: e.message } };
    }
    throw e;
  }
  return { segments };
}

function isCommandLetter(c: number): boolean {
  const upper = c >= 97 ? c - 32 : c;
  return ((c >= 65 && c <= 90) || (c >= 97 && c <= 122)) && ARG_COUNT[upper] !== undefined;
}

function checkFinite(x: number, y: number, offset: number): void {
  if (!Number.isFinite(x) || !Number.isFinite(y)) {
    throw new PathDataError(offset, 'coordinates overflow (result is not finite)');
  }
}
