/**
 * The `font` and `font-variant` shorthands, expanded to the longhands the
 * cascade tracks.
 *
 * `font` follows CSS Fonts 3 §3.7:
 *   [ [ <font-style> || <font-variant-css21> || <font-weight> || <font-stretch-css3> ]?
 *     <font-size> [ / <line-height> ]? <font-family> ]
 *   | caption | icon | menu | message-box | small-caption | status-bar
 * with the CSS Fonts 4 extensions for numeric weights (1–1000) and
 * `oblique <angle>`. The shorthand resets every font longhand it does not set
 * (including font-variant-numeric) to its initial value. Line height is parsed
 * and validated but not tracked (SVG text does not use it). System font
 * keywords depend on the platform, so a declaration using them is dropped.
 */
import type { SpecifiedValues } from './types.js';
import {
  FONT_STRETCH_KEYWORDS,
  FONT_VARIANT_CAPS,
  asciiLower,
  fontFamilyOf,
  fontSizeOf,
  fontWeightOf,
  isAngle,
  isNumericVariantKeyword,
  keywordOf,
  lengthOf,
  numericVariantValid,
  type ValueNode,
} from './values.js';

export interface FontLonghands {
  'font-style': SpecifiedValues['font-style'];
  'font-variant-caps': SpecifiedValues['font-variant-caps'];
  'font-variant-numeric': SpecifiedValues['font-variant-numeric'];
  'font-weight': SpecifiedValues['font-weight'];
  'font-stretch': SpecifiedValues['font-stretch'];
  'font-size': SpecifiedValues['font-size'];
  'font-family': SpecifiedValues['font-family'];
}

/** CSS Fonts 3 §3.7: only these stretch keywords may appear in the shorthand. */
const STRETCH_CSS3 = new Set([
  'ultra-condensed', 'extra-condensed', 'condensed', 'semi-condensed',
  'semi-expanded', 'expanded', 'extra-expanded', 'ultra-expanded',
]);

/** Expands `font`; null when the value does not match the grammar. */
export function expandFont(nodes: readonly ValueNode[]): FontLonghands | null {
  let style: SpecifiedValues['font-style'] | null = null;
  let caps: string | null = null;
  let weight: SpecifiedValues['font-weight'] | null = null;
  let stretch: number | null = null;
  let normals = 0;
  let i = 0;

  // Up to four optional leading keywords/numbers, in any order; `normal` fills any slot.
  for (; i < nodes.length && i < 5; i++) {
    const node = nodes[i]!;
    const k = keywordOf(node);
    if (k === 'normal') {
      normals++;
    } else if (k === 'italic' || k === 'oblique') {
      if (style !== null) return null;
      style = k;
      if (k === 'oblique' && isAngle(nodes[i + 1])) i++;
    } else if (k === 'small-caps') {
      if (caps !== null) return null;
      caps = k;
    } else if (k !== null && STRETCH_CSS3.has(k)) {
      if (stretch !== null) return null;
      stretch = FONT_STRETCH_KEYWORDS[k]!;
    } else if (k === 'bold' || k === 'bolder' || k === 'lighter' || node.type === 'Number') {
      if (weight !== null) return null;
      const w = fontWeightOf(node);
      if (w === null) return null;
      weight = w;
    } else {
      break;
    }
    const used = normals + (style ? 1 : 0) + (caps ? 1 : 0) + (weight !== null ? 1 : 0) + (stretch !== null ? 1 : 0);
    if (used > 4) return null;
  }

  const size = fontSizeOf(nodes[i]);
  if (size === null) return null;
  // A bare number is a weight in this position, never a size (the grammar needs a length).
  if (typeof size === 'object' && size.unit === '' && size.value !== 0) return null;
  i++;

  if (nodes[i]?.type === 'Operator' && (nodes[i] as { value: string }).value === '/') {
    const lh = nodes[i + 1];
    if (!lh) return null;
    const lk = keywordOf(lh);
    if (lk !== 'normal') {
      const l = lengthOf(lh);
      if (!l || l.value < 0) return null;
    }
    i += 2;
  }

  const family = fontFamilyOf(nodes.slice(i));
  if (family === null || family.length === 0) return null;

  return {
    'font-style': style ?? 'normal',
    'font-variant-caps': caps ?? 'normal',
    'font-variant-numeric': [],
    'font-weight': weight ?? 400,
    'font-stretch': stretch ?? 100,
    'font-size': size,
    'font-family': family,
  };
}

export interface FontVariantLonghands {
  'font-variant-caps': SpecifiedValues['font-variant-caps'];
  'font-variant-numeric': SpecifiedValues['font-variant-numeric'];
}

/** Keywords of the other font-variant subproperties: accepted, not tracked. */
const OTHER_VARIANT_KEYWORDS = new Set([
  'common-ligatures', 'no-common-ligatures', 'discretionary-ligatures', 'no-discretionary-ligatures',
  'historical-ligatures', 'no-historical-ligatures', 'contextual', 'no-contextual', 'historical-forms',
  'jis78', 'jis83', 'jis90', 'jis04', 'simplified', 'traditional', 'full-width', 'proportional-width', 'ruby',
  'sub', 'super',
]);
const VARIANT_FUNCTIONS = new Set(['stylistic', 'styleset', 'character-variant', 'swash', 'ornaments', 'annotation']);

/** Expands `font-variant` (CSS Fonts 3 §6.11): `normal`, `none`, or subproperty values. */
export function expandFontVariant(nodes: readonly ValueNode[]): FontVariantLonghands | null {
  if (nodes.length === 0) return null;
  if (nodes.length === 1) {
    const k = keywordOf(nodes[0]);
    if (k === 'normal' || k === 'none') return { 'font-variant-caps': 'normal', 'font-variant-numeric': [] };
  }
  let caps: string | null = null;
  const numeric: string[] = [];
  for (const node of nodes) {
    if (node.type === 'Function' && VARIANT_FUNCTIONS.has(asciiLower(node.name))) continue;
    const k = keywordOf(node);
    if (k === null || k === 'normal' || k === 'none') return null;
    if (FONT_VARIANT_CAPS.includes(k)) {
      if (caps !== null) return null;
      caps = k;
    } else if (isNumericVariantKeyword(k)) {
      numeric.push(k);
    } else if (!OTHER_VARIANT_KEYWORDS.has(k)) {
      return null;
    }
  }
  if (!numericVariantValid(numeric)) return null;
  return { 'font-variant-caps': caps ?? 'normal', 'font-variant-numeric': numeric };
}
