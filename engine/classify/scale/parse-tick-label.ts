/**
 * Tick-label reading: one label string → number, date or category, and the
 * multiplier/offset note some libraries print near an axis end.
 *
 * See `tick-types.ts` for the result shapes and `parse-number-label.ts` /
 * `parse-date-label.ts` for the accepted forms and the choices made on
 * ambiguous ones (`B`, `m`, `1,000`, `03/04/2024`, bare years).
 *
 * Order of attempts: date grammar first (so `15 Mar` is not "15 with unit
 * Mar"), then number, else category. A bare four-digit integer such as
 * `2019` is a number flagged `maybeYear`; axis inference decides whether a
 * run of them is a time axis.
 */
import { collapseSpaces, normalizeForParsing } from './normalize-label.js';
import { parseDateLabel } from './parse-date-label.js';
import { parseNumberLabel } from './parse-number-label.js';
import type { ParseOptions, ParsedTick } from './tick-types.js';

export type { CategoryTick, DateGranularity, DateParts, DateTick, NumberTick, ParseOptions, ParsedTick } from './tick-types.js';

/** Longest label read as anything but a category; longer text is kept verbatim. */
const MAX_PARSE_LENGTH = 200;

/**
 * Read one tick label. Returns null for text that is empty after trimming
 * whitespace and invisible characters; every other string gives a result
 * (`category` when no numeric or date form matches).
 * @throws TypeError when `text` is not a string.
 */
export function parseTickLabel(text: string, options: ParseOptions = {}): ParsedTick | null {
  if (typeof text !== 'string') throw new TypeError(`parseTickLabel: expected a string, got ${typeof text}`);
  const collapsed = collapseSpaces(text);
  if (collapsed === '') return null;
  if (collapsed.length > MAX_PARSE_LENGTH) return { kind: 'category', text: collapsed };
  const norm = normalizeForParsing(collapsed);
  if (norm === '') return null;
  const date = parseDateLabel(norm, text, options);
  if (date) return date;
  const num = parseNumberLabel(norm, text, options);
  if (num) return num;
  return { kind: 'category', text: collapsed };
}

/**
 * A multiplier and/or offset printed near an axis end. The true value of a
 * tick is `label × multiplier + offset` (the convention of offset notation in
 * matplotlib's default formatter: a `×10³` factor and a `+1.5e3` offset).
 */
export interface AxisMultiplier {
  multiplier: number;
  offset: number;
  text: string;
}

function readFactor(body: string): number | null {
  const n = parseNumberLabel(body, body);
  if (!n || n.unit !== undefined || n.value <= 0) return null;
  return n.value;
}

function readOffset(body: string): number | null {
  const n = parseNumberLabel(body, body);
  if (!n || n.unit !== undefined) return null;
  return n.value;
}

/**
 * Read an axis multiplier/offset label: `×10³`, `× 10^-2`, `x1000`, `1e6`,
 * `10⁻²`, `+1.5e3`, `−2e3`, `1e6+1.5e3`, `×10³+1.5`, `(×10³)`, and the
 * mathtext source `$\times\mathdefault{10^{3}}\mathdefault{+1.5}$`.
 * A leading sign makes the whole label an offset; an unsigned label without
 * `×` is a multiplier only when written in scientific or power form (a plain
 * `1000` is more likely a tick label). Returns null for anything else.
 * @throws TypeError when `text` is not a string.
 */
export function parseAxisMultiplier(text: string): AxisMultiplier | null {
  if (typeof text !== 'string') throw new TypeError(`parseAxisMultiplier: expected a string, got ${typeof text}`);
  let s = normalizeForParsing(text);
  const paren = /^\((.*)\)$/.exec(s);
  if (paren) s = paren[1].trim();
  if (s === '' || s.length > MAX_PARSE_LENGTH) return null;

  // Offset alone.
  if (/^[+-]/.test(s)) {
    const offset = readOffset(s);
    return offset === null ? null : { multiplier: 1, offset, text };
  }

  let explicitTimes = false;
  const times = /^[×xX·⋅*] ?/.exec(s);
  if (times) {
    explicitTimes = true;
    s = s.slice(times[0].length);
  }
  const split = /^(.*?[^eE^\s])\s?([+-]\s?\d.*)$/.exec(s);
  const factorText = split ? split[1] : s;
  const offsetText = split ? split[2].replace(/^([+-]) /, '$1') : null;

  const factorTick = parseNumberLabel(factorText, factorText);
  if (!factorTick) return null;
  if (!explicitTimes && factorTick.notation !== 'scientific') return null;
  const multiplier = readFactor(factorText);
  if (multiplier === null) return null;
  let offset = 0;
  if (offsetText !== null) {
    const o = readOffset(offsetText);
    if (o === null) return null;
    offset = o;
  }
  return { multiplier, offset, text };
}
