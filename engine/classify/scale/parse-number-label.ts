/**
 * Grammar for numeric tick labels.
 *
 *   label    := '(' body ')'            accounting negative
 *             | body
 *   body     := sign? currency? sign? mantissa exponent? suffix? unit?
 *   mantissa := digits with optional grouping and one decimal mark
 *   exponent := e±n | ×10^n | ×10ⁿ | (mantissa = "10") ^n
 *   suffix   := SI / financial magnitude (k, M, G, B, bn, m, µ …) or byte prefix (kB, MiB …)
 *   unit     := %, ‰, °C, °F, ×, currency symbol or code, or a short unit word (km, ms, kg …)
 *
 * Choices (common practice, no single source):
 * - `B` alone means billions (finance, news graphics); with a byte prefix (`kB`,
 *   `MB`, `KiB`) it means bytes. `bareB: 'byte'` reads a lone `B` as bytes.
 *   Decimal byte prefixes are powers of 1000 and `Ki`, `Mi` … powers of 1024
 *   (source: IEC 80000-13).
 * - Lower-case `m` attached to the number is milli (the SI-prefix number format
 *   of d3/Vega writes 0.5 as `500m`), except after a currency sign where it is
 *   million (`£5m`). With a space before it (`5 m`) it is a unit word (metres).
 * - Upper-case `K` is thousand, not kelvin.
 * - `µ`, `u`, `n`, `p`, `m` must be attached to the digits to count as prefixes;
 *   `k`, `K`, `M`, `G`, `T`, `P`, `B`, `bn` may follow a space.
 * - Ordinal endings (`1st`, `2nd`) and `AM`/`PM` are not units: such labels are categories.
 */
import type { NumberTick, ParseOptions } from './tick-types.js';

const CURRENCY_PREFIXES = [
  'US$', 'CA$', 'AU$', 'NZ$', 'HK$', 'MX$', 'C$', 'A$', 'S$', 'R$',
  '$', '€', '£', '¥', '￥', '₹', '₩', '₽', '₺', '₪', '₫', '₱', '฿', '₦', '₴', '₡', '₲', '₵', '₸', '₿',
  'CHF', 'Fr.',
].sort((a, b) => b.length - a.length);

/** A small set of ISO 4217 codes seen on chart axes (source: ISO 4217 code list). */
const CURRENCY_CODES = new Set([
  'USD', 'EUR', 'GBP', 'JPY', 'CNY', 'CHF', 'CAD', 'AUD', 'NZD', 'HKD', 'SGD', 'INR', 'KRW', 'SEK',
  'NOK', 'DKK', 'PLN', 'CZK', 'HUF', 'BRL', 'MXN', 'ZAR', 'TRY', 'RUB', 'ILS',
]);

const CURRENCY_SUFFIXES = new Set(['€', '$', '£', '¥', '₽', '₫', '₴', '₺', '¢', 'kr', 'zł', 'Kč', 'Ft', 'lei', 'CHF']);

const SI_EXPONENT: Record<string, number> = {
  p: -12, n: -9, 'µ': -6, 'μ': -6, u: -6, m: -3,
  k: 3, K: 3, M: 6, G: 9, T: 12, P: 15,
  B: 9, bn: 9, Bn: 9, BN: 9, mn: 6, tn: 12,
};
/** Prefixes that need to touch the digits (a space before them makes a unit word instead). */
const ATTACHED_ONLY = new Set(['p', 'n', 'µ', 'μ', 'u', 'm']);

const BYTE_EXPONENT: Record<string, number> = { k: 1, K: 1, M: 2, G: 3, T: 4, P: 5 };

/** Endings that make a number something other than a quantity: ordinals, clock halves. */
const NOT_UNITS = new Set(['st', 'nd', 'rd', 'th', 'am', 'pm', 'a.m.', 'p.m.', 'a.m', 'p.m']);

/** Normalise a unit token to its canonical spelling. */
function canonicalUnit(token: string): string {
  const t = token.replace(/\s+/g, '');
  if (t === '℃' || t === '°C') return '°C';
  if (t === '℉' || t === '°F') return '°F';
  if (t === 'x' || t === 'X' || t === '×') return '×';
  // Superscript powers were folded to ^n for parsing; give units their usual spelling back.
  return t.replace(/\^2(?!\d)/g, '²').replace(/\^3(?!\d)/g, '³');
}

interface Cursor {
  rest: string;
}

function consume(cur: Cursor, re: RegExp): RegExpExecArray | null {
  const m = re.exec(cur.rest);
  if (m && m.index === 0) {
    cur.rest = cur.rest.slice(m[0].length);
    return m;
  }
  return null;
}

function consumeCurrencyPrefix(cur: Cursor): string | undefined {
  for (const sym of CURRENCY_PREFIXES) {
    if (cur.rest.startsWith(sym)) {
      cur.rest = cur.rest.slice(sym.length).replace(/^ /, '');
      return sym;
    }
  }
  const code = /^([A-Z]{3}) ?(?=[\d.+-])/.exec(cur.rest);
  if (code && CURRENCY_CODES.has(code[1])) {
    cur.rest = cur.rest.slice(code[0].length);
    return code[1];
  }
  return undefined;
}

interface Mantissa {
  intDigits: string;
  fracDigits: string;
  grouped: boolean;
  ambiguous: boolean;
  evidence?: '.' | ',';
  hadDecimalMark: boolean;
}

const GROUP_CHARS = /[ '’]/;

/** Check western (1,234,567) or Indian (12,34,567) digit grouping of an integer part. */
function validGrouping(groups: string[]): boolean {
  if (groups.length < 2) return true;
  if (!groups.every((g) => /^\d+$/.test(g))) return false;
  const first = groups[0];
  const tail = groups.slice(1);
  const western = first.length >= 1 && first.length <= 3 && tail.every((g) => g.length === 3);
  const indian =
    first.length >= 1 &&
    first.length <= 2 &&
    tail.length >= 2 &&
    tail.slice(0, -1).every((g) => g.length === 2) &&
    tail[tail.length - 1].length === 3;
  return western || indian;
}

/** Split a digit string with separators into integer and fraction digits. */
function readMantissa(core: string, decimalMark: '.' | ',' | undefined): Mantissa | null {
  const hasComma = core.includes(',');
  const hasDot = core.includes('.');
  const hasSpaceGroup = GROUP_CHARS.test(core);
  let mark: '.' | ',' | null;
  let ambiguous = false;
  let evidence: '.' | ',' | undefined;
  if (decimalMark) {
    mark = decimalMark;
  } else if (hasComma && hasDot) {
    mark = core.lastIndexOf(',') > core.lastIndexOf('.') ? ',' : '.';
    evidence = mark;
  } else if (hasComma) {
    const parts = core.split(',');
    if (parts.length > 2) {
      mark = null; // several commas: grouping
      evidence = '.';
    } else if (parts[1].length === 3 && !hasSpaceGroup && parts[0].length <= 3 && parts[0].length > 0) {
      mark = null; // 1,000: grouping by convention, but a comma-decimal locale reads 1.0
      ambiguous = true;
    } else if (parts[1].length === 3 && (hasSpaceGroup || parts[0].length > 3)) {
      mark = ','; // "1 000,250" or "1000,250": grouping cannot sit there
      evidence = ',';
    } else {
      mark = ',';
      evidence = ',';
    }
  } else if (hasDot) {
    const parts = core.split('.');
    if (parts.length > 2) {
      mark = null; // 1.000.000
      evidence = ',';
    } else {
      mark = '.';
      if (parts[1].length === 3 && parts[0].length >= 1 && parts[0].length <= 3 && !hasSpaceGroup) ambiguous = true;
      if (hasSpaceGroup) evidence = '.';
    }
  } else {
    mark = null;
  }

  const groupChar = mark === ',' ? '.' : mark === '.' ? ',' : hasDot ? '.' : ',';
  let intPart = core;
  let fracPart = '';
  let hadDecimalMark = false;
  if (mark !== null) {
    const idx = core.lastIndexOf(mark);
    if (idx >= 0) {
      if (core.indexOf(mark) !== idx) return null; // two decimal marks
      intPart = core.slice(0, idx);
      fracPart = core.slice(idx + 1);
      hadDecimalMark = true;
    }
  }
  if (!/^\d*$/.test(fracPart)) return null;
  const groups = intPart.split(new RegExp(`[${groupChar === '.' ? '\\.' : ','} '’]`));
  const grouped = groups.length > 1;
  if (grouped) {
    if (!validGrouping(groups)) return null;
    // one kind of group separator per number
    const seps = new Set(intPart.replace(/\d/g, ''));
    if (seps.size > 1) return null;
  } else if (!/^\d*$/.test(intPart)) {
    return null;
  }
  const intDigits = groups.join('');
  if (intDigits === '' && fracPart === '') return null;
  return { intDigits: intDigits || '0', fracDigits: fracPart, grouped, ambiguous, evidence, hadDecimalMark };
}

/**
 * Read a normalised label (see `normalizeForParsing`) as a number, or return
 * null when it does not follow the numeric grammar. `text` is the original label.
 */
export function parseNumberLabel(norm: string, text: string, options: ParseOptions = {}): NumberTick | null {
  const cur: Cursor = { rest: norm };
  let negative = false;
  const paren = /^\((.+)\)$/.exec(cur.rest);
  if (paren) {
    negative = true;
    cur.rest = paren[1].trim();
  }
  let signed = false;
  const sign1 = consume(cur, /^[+-] ?/);
  if (sign1) {
    if (paren) return null;
    signed = true;
    negative = sign1[0].startsWith('-');
  }
  const currency = consumeCurrencyPrefix(cur);
  if (!signed && currency) {
    const sign2 = consume(cur, /^[+-]/);
    if (sign2) {
      if (paren) return null;
      signed = true;
      negative = sign2[0] === '-';
    }
  }

  const coreMatch = consume(cur, /^(?:\d(?:[\d,.'’ ]*\d)?\.?|[.,]\d+)/);
  if (!coreMatch) return null;
  const core = coreMatch[0];
  // A leading comma (",5") is too unusual to read.
  if (core.startsWith(',')) return null;

  let exponent = 0;
  let notation: NumberTick['notation'] = 'plain';
  let mantissa: Mantissa | null;

  const powerOnly = core === '10' ? consume(cur, /^ ?(?:\^|\*\*) ?([+-]?\d+)/) : null;
  if (powerOnly) {
    mantissa = { intDigits: '1', fracDigits: '', grouped: false, ambiguous: false, hadDecimalMark: false };
    exponent = Number(powerOnly[1]);
    notation = 'scientific';
  } else {
    mantissa = readMantissa(core, options.decimalMark);
    if (!mantissa) return null;
    const eNotation = consume(cur, /^[eE]([+-]?\d+)/);
    const timesTen = eNotation ? null : consume(cur, /^ ?[×xX·⋅*] ?10 ?(?:\^|\*\*) ?([+-]?\d+)/);
    const expMatch = eNotation ?? timesTen;
    if (expMatch) {
      if (mantissa.grouped) return null;
      exponent = Number(expMatch[1]);
      notation = 'scientific';
    }
  }

  // Magnitude suffix or byte prefix.
  let suffix: string | undefined;
  let unit: string | undefined;
  let binaryPower = 0;
  const bytes = consume(cur, /^ ?([kKMGTP])(i?)B(?![A-Za-z])/);
  if (bytes) {
    unit = 'B';
    if (bytes[2] === 'i') {
      suffix = `${bytes[1].toUpperCase()}i`;
      binaryPower = BYTE_EXPONENT[bytes[1]];
    } else {
      suffix = bytes[1];
      exponent += 3 * BYTE_EXPONENT[bytes[1]];
    }
    if (notation === 'plain') notation = 'suffix';
  } else {
    const si = /^( ?)(bn|Bn|BN|mn|tn|[kKMGTPBpnµμum])(?![A-Za-z])/.exec(cur.rest);
    if (si && !(si[1] === ' ' && ATTACHED_ONLY.has(si[2]))) {
      let symbol = si[2];
      if (symbol === 'B' && options.bareB === 'byte') {
        unit = 'B';
      } else {
        let exp = SI_EXPONENT[symbol];
        if (symbol === 'm' && currency) exp = 6; // £5m: million
        if (symbol === 'μ') symbol = 'µ';
        suffix = symbol;
        exponent += exp;
      }
      cur.rest = cur.rest.slice(si[0].length);
      if (notation === 'plain') notation = 'suffix';
    }
  }

  // Unit after the number.
  if (cur.rest.length > 0) {
    const u = /^ ?(%|‰|‱|° ?[CF]|℃|℉|°|×|zł|Kč|[A-Za-zµμΩÅ][A-Za-zµμΩÅ/^0-9·.-]{0,11}|[€$£¥₽₫₴₺¢])$/.exec(cur.rest);
    if (!u) return null;
    const token = u[1];
    if (NOT_UNITS.has(token.toLowerCase())) return null;
    if (unit !== undefined && !CURRENCY_SUFFIXES.has(token) && !CURRENCY_CODES.has(token)) return null;
    if (currency) return null; // a currency prefix and a unit after the number: not a form we read
    const canon = canonicalUnit(token);
    unit = unit === undefined ? canon : `${unit} ${canon}`;
    cur.rest = '';
  }
  if (currency) {
    if (unit !== undefined) return null;
    unit = currency;
  }

  const digits = `${mantissa.intDigits}.${mantissa.fracDigits || '0'}`;
  let magnitude = Number(`${digits}e${exponent}`);
  if (binaryPower > 0) magnitude *= 1024 ** binaryPower;
  if (!Number.isFinite(magnitude)) return null;
  const value = negative && magnitude !== 0 ? -magnitude : magnitude;
  const factor = binaryPower > 0 ? 1024 ** binaryPower * 10 ** exponent : Number(`1e${exponent}`);

  const out: NumberTick = {
    kind: 'number',
    value,
    decimals: mantissa.fracDigits.length,
    factor,
    notation,
    grouped: mantissa.grouped,
    text,
  };
  if (unit !== undefined) out.unit = unit;
  if (suffix !== undefined) out.suffix = suffix;
  if (mantissa.ambiguous && !options.decimalMark) out.ambiguousSeparator = true;
  if (mantissa.evidence && !options.decimalMark) out.decimalMarkEvidence = mantissa.evidence;
  if (
    !negative &&
    !signed &&
    !currency &&
    unit === undefined &&
    suffix === undefined &&
    notation === 'plain' &&
    !mantissa.grouped &&
    !mantissa.hadDecimalMark &&
    /^[12]\d{3}$/.test(mantissa.intDigits)
  ) {
    out.maybeYear = true;
  }
  return out;
}
