/**
 * The SVG `transform` attribute: a list of transform functions
 * (matrix, translate, scale, rotate, skewX, skewY) separated by white space
 * and/or commas, composed left to right: `transform="A B"` maps a point p to
 * A(B(p)), the same as nesting `<g transform="A"><g transform="B">`.
 *
 * Any syntax error, or a result that is not finite, makes the whole
 * attribute count as absent: the identity is returned together with the
 * error (browsers likewise ignore an unparsable transform attribute).
 */
import {
  identity,
  isFiniteMatrix,
  multiply,
  rotation,
  scaling,
  skewingX,
  skewingY,
  translation,
  type Matrix,
} from './matrix.js';
import type { ParseError } from './parse-error.js';
import { isWsp, readNumber, scanned, skipWsp } from './scan.js';

export interface TransformParseResult {
  matrix: Matrix;
  error?: ParseError;
}

/** Allowed argument counts per transform function. */
const ARITY: Readonly<Record<string, readonly number[]>> = {
  matrix: [6],
  translate: [1, 2],
  scale: [1, 2],
  rotate: [1, 3],
  skewX: [1],
  skewY: [1],
};

function fail(offset: number, message: string): TransformParseResult {
  return { matrix: identity, error: { offset, message } };
}

function isNameChar(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 65 && c <= 90);
}

export function parseTransform(text: string): TransformParseResult {
  const n = text.length;
  let m: Matrix = identity;
  let i = skipWsp(text, 0);
  let first = true;
  const args: number[] = [];
  while (i < n) {
    if (!first) {
      // Separators between transforms: any mix of white space and commas
      // (SVG 1.1 requires comma-wsp+, SVG 2 and browsers also accept none).
      let commaAt = -1;
      for (; i < n; i++) {
        const c = text.charCodeAt(i);
        if (c === 44) commaAt = i;
        else if (!isWsp(c)) break;
      }
      if (i >= n) {
        if (commaAt >= 0) return fail(commaAt, 'transform list ends with a comma');
        break;
      }
    }
    first = false;
    const nameStart = i;
    while (i < n && isNameChar(text.charCodeAt(i))) i++;
    const name = text.slice(nameStart, i);
    const arity = Object.prototype.hasOwnProperty.call(ARITY, name) ? ARITY[name] : undefined;
    if (arity === undefined) {
      return fail(
        nameStart,
        name === ''
          ? `expected a transform function name, found '${text[nameStart]}'`
          : `unknown transform function '${name}'`,
      );
    }
    i = skipWsp(text, i);
    if (text.charCodeAt(i) !== 40) return fail(i, `expected '(' after '${name}'`);
    i = skipWsp(text, i + 1);
    args.length = 0;
    // Arguments: number (comma-wsp number)*, then ')'.
    for (;;) {
      if (args.length > 0) {
        if (text.charCodeAt(i) === 44) i = skipWsp(text, i + 1);
        // ')' ends the list; one comma before it is tolerated, as browsers do.
        if (text.charCodeAt(i) === 41) {
          i++;
          break;
        }
      }
      const end = readNumber(text, i);
      if (end < 0) {
        if (i >= n) return fail(i, `unterminated '${name}(': expected ')'`);
        return fail(i, `expected a number in '${name}(…)'`);
      }
      const v = scanned.value;
      if (!Number.isFinite(v)) return fail(i, `number out of range in '${name}(…)'`);
      args.push(v);
      if (args.length > 6) return fail(i, `too many arguments to '${name}'`);
      i = skipWsp(text, end);
    }
    if (!arity.includes(args.length)) {
      return fail(
        nameStart,
        `'${name}' takes ${arity.join(' or ')} argument${arity[arity.length - 1] === 1 ? '' : 's'}, got ${args.length}`,
      );
    }
    m = multiply(m, functionMatrix(name, args));
    if (!isFiniteMatrix(m)) return fail(nameStart, 'transform is not finite (values overflow)');
  }
  return { matrix: m };
}

function functionMatrix(name: string, a: readonly number[]): Matrix {
  switch (name) {
    case 'matrix':
      return [a[0], a[1], a[2], a[3], a[4], a[5]];
    case 'translate':
      return translation(a[0], a.length > 1 ? a[1] : 0);
    case 'scale':
      return scaling(a[0], a.length > 1 ? a[1] : a[0]);
    case 'rotate':
      return a.length === 3 ? rotation(a[0], a[1], a[2]) : rotation(a[0]);
    case 'skewX':
      return skewingX(a[0]);
    default:
      return skewingY(a[0]);
  }
}
