/**
 * Text clean-up shared by the tick-label and multiplier parsers.
 *
 * Plotting libraries write the same number in many spellings: Unicode minus
 * (U+2212) instead of hyphen-minus, thin or narrow no-break spaces between
 * digit groups, superscript exponents, and (from matplotlib's mathtext) raw TeX
 * such as `$\mathdefault{10^{3}}$`. These helpers fold those spellings into one
 * plain ASCII-ish form that the grammars in this folder read.
 */

/** Invisible characters that carry no meaning in a tick label (zero-width, bidi marks, BOM). */
const INVISIBLE = /[\u200B-\u200F\u202A-\u202E\u2060-\u2064\u2066-\u2069\uFEFF\u00AD]/g;

/**
 * Space-like characters: no-break space, en/em/thin/hair spaces, figure space,
 * narrow no-break space, medium mathematical space, ideographic space, and
 * ordinary whitespace (tabs, newlines from multi-line labels).
 */
const SPACES = /[\s\u00A0\u1680\u2000-\u200A\u202F\u205F\u3000]+/g;

/**
 * Dash-like characters read as a minus sign in numeric context: hyphen (U+2010),
 * non-breaking hyphen (U+2011), figure dash (U+2012), en dash (U+2013),
 * minus sign (U+2212), small hyphen-minus (U+FE63), full-width hyphen-minus (U+FF0D).
 */
const DASHES = /[\u2010-\u2013\u2212\uFE63\uFF0D]/g;

const SUPERSCRIPT_DIGITS: Record<string, string> = {
  '\u2070': '0',
  '\u00B9': '1',
  '\u00B2': '2',
  '\u00B3': '3',
  '\u2074': '4',
  '\u2075': '5',
  '\u2076': '6',
  '\u2077': '7',
  '\u2078': '8',
  '\u2079': '9',
  '\u207A': '+',
  '\u207B': '-',
};
const SUPERSCRIPT_RUN = /[\u207A\u207B]?[\u2070\u00B9\u00B2\u00B3\u2074-\u2079]+/g;

/** TeX commands whose argument is kept as is (the braces are dropped later). */
const TEX_WRAPPERS = /\\(?:mathdefault|mathregular|mathrm|mathit|mathbf|mathsf|mathtt|textrm|text|operatorname|displaystyle|textstyle)(?![A-Za-z])/g;

/** Collapse whitespace variants to single ASCII spaces and drop invisible characters. */
export function collapseSpaces(text: string): string {
  return text.replace(INVISIBLE, '').replace(SPACES, ' ').trim();
}

/**
 * Undo matplotlib-style mathtext left in a label: `$\mathdefault{10^{3}}$` →
 * `10^3`, `$\times10^{-2}$` → `×10^-2`. An escaped dollar (`\$`) is kept as a
 * currency sign. Text without TeX markers is returned unchanged.
 */
export function stripMathText(text: string): string {
  const hasCommand = /\\[A-Za-z]/.test(text);
  const unescapedDollars = text.replace(/\\\$/g, '').split('$').length - 1;
  const pairedDollars = unescapedDollars >= 2 && unescapedDollars % 2 === 0;
  if (!hasCommand && !pairedDollars) return text;
  const PLACEHOLDER = '\u0000';
  let s = text.replace(/\\\$/g, PLACEHOLDER);
  if (pairedDollars) s = s.replace(/\$/g, '');
  s = s
    .replace(TEX_WRAPPERS, '')
    .replace(/\\times(?![A-Za-z])/g, '×')
    .replace(/\\cdot(?![A-Za-z])/g, '·')
    .replace(/\\minus(?![A-Za-z])/g, '-')
    .replace(/\\%/g, '%')
    .replace(/\\[,;:! ]/g, '')
    .replace(/\\(?:quad|qquad)(?![A-Za-z])/g, ' ')
    .replace(/[{}]/g, '');
  // Any TeX command still present is unknown to us; leave it so the label stays a category.
  return s.replace(/\u0000/g, '$');
}

/** Replace each superscript run (`⁻²`) with `^` and its ASCII form (`^-2`). */
export function foldSuperscripts(text: string): string {
  return text.replace(SUPERSCRIPT_RUN, (run) => '^' + [...run].map((c) => SUPERSCRIPT_DIGITS[c] ?? c).join(''));
}

/** Map every dash-like character to ASCII hyphen-minus. */
export function foldDashes(text: string): string {
  return text.replace(DASHES, '-');
}

/**
 * Full normalisation for numeric and date grammars: spaces collapsed, mathtext
 * stripped, superscripts folded to `^n`, dashes folded to `-`.
 */
export function normalizeForParsing(text: string): string {
  return collapseSpaces(foldDashes(foldSuperscripts(stripMathText(collapseSpaces(text)))));
}
