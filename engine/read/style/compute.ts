/**
 * Computed style: declared values plus inheritance, CSS-wide keywords,
 * `currentColor` and initial values, with lengths resolved to user units.
 *
 * Kept apart from the cascade so that `<use>` instances can be computed with
 * the `<use>` element's style as parent while their declared values still
 * come from the referenced element's place in the original tree.
 *
 * Opacity is reported per element and not multiplied down the tree.
 */
import { isInherited, type StyleProperty } from './properties.js';
import {
  isCssWide,
  type CssLength,
  type DeclaredStyle,
  type PaintOrderPart,
  type SpecifiedColor,
  type SpecifiedPaint,
  type SpecifiedValues,
  type WritingMode,
} from './types.js';

export interface ComputedStyle {
  /** The `color` property as written (a CSS colour); `currentColor` in other properties resolves to it. */
  readonly color: string;
  /** 'none', a CSS colour as written, 'url(#id)' optionally followed by a fallback, or 'context-fill'/'context-stroke'. */
  readonly fill: string;
  readonly fillOpacity: number;
  readonly fillRule: 'nonzero' | 'evenodd';
  /** Same forms as fill. */
  readonly stroke: string;
  readonly strokeOpacity: number;
  /** User units. */
  readonly strokeWidth: number;
  /** User units, an even count (an odd list is repeated); null for none or an all-zero list. Frozen. */
  readonly strokeDasharray: number[] | null;
  readonly strokeDashoffset: number;
  readonly strokeLinecap: 'butt' | 'round' | 'square';
  readonly strokeLinejoin: 'miter' | 'miter-clip' | 'round' | 'bevel' | 'arcs';
  readonly strokeMiterlimit: number;
  /** Painting order of the three parts, always all three. */
  readonly paintOrder: readonly PaintOrderPart[];
  /** 'none', 'non-scaling-stroke', ... (keywords space-separated). */
  readonly vectorEffect: string;
  /** This element's own opacity in [0, 1] (not multiplied by ancestors'). */
  readonly opacity: number;
  /** 'inline' (initial), 'none', ... */
  readonly display: string;
  readonly visibility: 'visible' | 'hidden' | 'collapse';
  /** Same-document reference to a clipPath element, as 'url(#id)' (see paintReference), or null. */
  readonly clipPath: string | null;
  /** A CSS basic shape used as clip path (`circle(40%)`), as text, or null. */
  readonly clipPathShape: string | null;
  readonly clipRule: 'nonzero' | 'evenodd';
  /** Same-document reference to a mask element, as 'url(#id)', or null. */
  readonly mask: string | null;
  /** Same-document reference to a filter element, as 'url(#id)', or null. */
  readonly filter: string | null;
  /** CSS filter functions (`drop-shadow(...)`), as text, or null. */
  readonly filterFunctions: string | null;
  readonly stopColor: string;
  readonly stopOpacity: number;
  readonly floodColor: string;
  readonly floodOpacity: number;
  /** Family names in order of preference; generic families lowercased. Frozen. */
  readonly fontFamily: string[];
  /** CSS px (= user units). */
  readonly fontSize: number;
  /** 1–1000; normal = 400, bold = 700. */
  readonly fontWeight: number;
  readonly fontStyle: 'normal' | 'italic' | 'oblique';
  /** Percentage of normal width. */
  readonly fontStretch: number;
  readonly fontVariantCaps: string;
  /** font-variant-numeric: 'normal' or its keywords space-separated ('tabular-nums lining-nums'). */
  readonly fontVariantNumeric: string;
  readonly textAnchor: 'start' | 'middle' | 'end';
  readonly dominantBaseline: string;
  readonly alignmentBaseline: string;
  /** User units (positive raises the text), or the keywords sub/super. */
  readonly baselineShift: number | 'sub' | 'super';
  /** User units; normal = 0. */
  readonly letterSpacing: number;
  readonly writingMode: WritingMode;
  /** Font size of the document root, for `rem`. */
  readonly rootFontSize: number;
  /**
   * Whether fill/stroke hold the `currentColor` keyword. CSS Color 4 §6.4:
   * the keyword is inherited as such and resolves against each element's own
   * `color`; the fill/stroke strings above are already resolved.
   */
  readonly currentColorPaint: { readonly fill: boolean; readonly stroke: boolean };
}

export interface ComputeContext {
  /**
   * Size of the nearest viewport in user units, for percentages of
   * stroke-width and dashes (SVG 2 §13.5: of the normalized diagonal).
   * Default 300 × 150, the CSS default object size (CSS 2.1 §10.3.2).
   */
  readonly viewport?: { readonly width: number; readonly height: number };
}

/** The CSS initial font size, `medium` (CSS Fonts 4 §2.5). */
export const MEDIUM_FONT_SIZE = 16;

const NO_CURRENT = Object.freeze({ fill: false, stroke: false });

/**
 * Initial values. Sources: SVG 2 property definitions (§13 painting, §11
 * text, §14 clipping and masking), CSS Fonts 4 §2, CSS Color 4 §3.1, CSS
 * Display 3 §2, CSS Inline 3 §4, CSS Writing Modes 3 §3.2, Filter Effects 1
 * §9 (flood). Two are user-agent dependent in CSS and fixed here:
 * `color` black (the usual canvas text colour) and `font-family` serif (the
 * usual browser default).
 */
export const INITIAL_STYLE: ComputedStyle = Object.freeze({
  color: 'black',
  fill: 'black',
  fillOpacity: 1,
  fillRule: 'nonzero',
  stroke: 'none',
  strokeOpacity: 1,
  strokeWidth: 1,
  strokeDasharray: null,
  strokeDashoffset: 0,
  strokeLinecap: 'butt',
  strokeLinejoin: 'miter',
  strokeMiterlimit: 4,
  paintOrder: Object.freeze(['fill', 'stroke', 'markers'] as PaintOrderPart[]),
  vectorEffect: 'none',
  opacity: 1,
  display: 'inline',
  visibility: 'visible',
  clipPath: null,
  clipPathShape: null,
  clipRule: 'nonzero',
  mask: null,
  filter: null,
  filterFunctions: null,
  stopColor: 'black',
  stopOpacity: 1,
  floodColor: 'black',
  floodOpacity: 1,
  fontFamily: Object.freeze(['serif']) as string[],
  fontSize: MEDIUM_FONT_SIZE,
  fontWeight: 400,
  fontStyle: 'normal',
  fontStretch: 100,
  fontVariantCaps: 'normal',
  fontVariantNumeric: 'normal',
  textAnchor: 'start',
  dominantBaseline: 'auto',
  alignmentBaseline: 'baseline',
  baselineShift: 0,
  letterSpacing: 0,
  writingMode: 'horizontal-tb',
  rootFontSize: MEDIUM_FONT_SIZE,
  currentColorPaint: NO_CURRENT,
} satisfies ComputedStyle);

/** CSS Fonts 4 §2.5 absolute-size table, scaling factors against medium. */
const ABSOLUTE_SIZES: Readonly<Record<string, number>> = Object.freeze({
  'xx-small': 3 / 5,
  'x-small': 3 / 4,
  small: 8 / 9,
  medium: 1,
  large: 6 / 5,
  'x-large': 3 / 2,
  'xx-large': 2,
  'xxx-large': 3,
});
/** Ratio for `larger`/`smaller` (CSS Fonts 4 §2.5 allows 1.2–1.5; browsers use 1.2). */
const RELATIVE_SIZE_RATIO = 1.2;

/** px per unit for absolute units (CSS Values 4 §6.2: 96px = 1in). */
const ABSOLUTE_UNITS: Readonly<Record<string, number>> = Object.freeze({
  '': 1,
  px: 1,
  in: 96,
  cm: 96 / 2.54,
  mm: 96 / 25.4,
  q: 96 / 101.6,
  pt: 96 / 72,
  pc: 16,
});

/**
 * A length in user units. em uses `fontSize`; ex and ch use half of it (CSS
 * Values 4 §6.1.1 fallback, no font metrics here); rem the root font size;
 * % the given base.
 */
function toUserUnits(len: CssLength, fontSize: number, rootFontSize: number, percentBase: number): number {
  switch (len.unit) {
    case 'em':
      return len.value * fontSize;
    case 'ex':
    case 'ch':
      return len.value * fontSize * 0.5;
    case 'rem':
      return len.value * rootFontSize;
    case '%':
      return (len.value / 100) * percentBase;
    default:
      return len.value * ABSOLUTE_UNITS[len.unit]!;
  }
}

const INHERIT = Symbol('inherit');
const INITIAL = Symbol('initial');

/** Quotes a reference id for `url()` unless it is a plain name. */
function urlOf(id: string): string {
  return /^[A-Za-z0-9_.:-]+$/.test(id) ? `url(#${id})` : `url("#${id.replace(/["\\\n]/g, (c) => (c === '\n' ? '\\a ' : '\\' + c))}")`;
}

/**
 * Computes an element's style from its declared values and its parent's
 * computed style (null at the root, or for an element drawn on its own).
 */
export function computeStyle(declared: DeclaredStyle, parent: ComputedStyle | null, context: ComputeContext = {}): ComputedStyle {
  const base = parent ?? INITIAL_STYLE;
  const from = <P extends StyleProperty>(p: P): SpecifiedValues[P] | typeof INHERIT | typeof INITIAL => {
    const d = declared[p];
    if (d === undefined) return parent !== null && isInherited(p) ? INHERIT : INITIAL;
    const v = d.value;
    if (isCssWide(v)) {
      if (v.cssWide === 'initial' || parent === null) return INITIAL;
      if (v.cssWide === 'inherit') return INHERIT;
      return isInherited(p) ? INHERIT : INITIAL;
    }
    return v as SpecifiedValues[P];
  };

  // color first: currentColor elsewhere resolves to it.
  const colorSpec = from('color');
  const color =
    colorSpec === INHERIT
      ? base.color
      : colorSpec === INITIAL
        ? INITIAL_STYLE.color
        : colorSpec.type === 'currentColor'
          ? base.color // CSS Color 4 §6.4: `color: currentColor` is `color: inherit`
          : colorSpec.color;

  // font-size next: em and % in it refer to the parent's font size.
  const parentFont = base.fontSize;
  const rootFont = parent ? parent.rootFontSize : MEDIUM_FONT_SIZE;
  const sizeSpec = from('font-size');
  let fontSize: number;
  if (sizeSpec === INHERIT) fontSize = base.fontSize;
  else if (sizeSpec === INITIAL) fontSize = MEDIUM_FONT_SIZE;
  else if (typeof sizeSpec === 'string') {
    if (sizeSpec === 'larger') fontSize = parentFont * RELATIVE_SIZE_RATIO;
    else if (sizeSpec === 'smaller') fontSize = parentFont / RELATIVE_SIZE_RATIO;
    else fontSize = MEDIUM_FONT_SIZE * ABSOLUTE_SIZES[sizeSpec]!;
  } else {
    // CSS Fonts 4 §2.5: em, ex, ch and % in font-size refer to the parent's font size.
    fontSize = toUserUnits(sizeSpec, parentFont, rootFont, parentFont);
  }
  const rootFontSize = parent ? parent.rootFontSize : fontSize;

  const vw = context.viewport?.width ?? 300;
  const vh = context.viewport?.height ?? 150;
  const diagonal = Math.sqrt((vw * vw + vh * vh) / 2);
  const len = (l: CssLength, percentBase: number): number => toUserUnits(l, fontSize, rootFontSize, percentBase);

  /** Properties whose value needs no conversion. */
  const plain = <P extends StyleProperty, K extends keyof ComputedStyle>(
    p: P,
    key: K,
    convert: (v: SpecifiedValues[P]) => ComputedStyle[K],
  ): ComputedStyle[K] => {
    const v = from(p);
    if (v === INHERIT) return base[key];
    if (v === INITIAL) return INITIAL_STYLE[key];
    return convert(v);
  };
  const same = <T,>(v: T): T => v;

  const colorValue = (c: SpecifiedColor): string => (c.type === 'currentColor' ? color : c.color);
  const paint = (p: 'fill' | 'stroke'): [string, boolean] => {
    const v = from(p);
    if (v === INHERIT) return base.currentColorPaint[p] ? [color, true] : [base[p], false];
    if (v === INITIAL) return [INITIAL_STYLE[p], false];
    return paintValue(v);
  };
  const paintValue = (v: SpecifiedPaint): [string, boolean] => {
    switch (v.type) {
      case 'none':
      case 'context-fill':
      case 'context-stroke':
        return [v.type, false];
      case 'currentColor':
        return [color, true];
      case 'color':
        return [v.color, false];
      case 'url':
        return [v.fallback ? `${urlOf(v.id)} ${paintValue(v.fallback)[0]}` : urlOf(v.id), false];
    }
  };
  const [fill, fillCurrent] = paint('fill');
  const [stroke, strokeCurrent] = paint('stroke');

  const weightSpec = from('font-weight');
  const fontWeight =
    weightSpec === INHERIT
      ? base.fontWeight
      : weightSpec === INITIAL
        ? INITIAL_STYLE.fontWeight
        : weightSpec === 'bolder'
          ? bolder(base.fontWeight)
          : weightSpec === 'lighter'
            ? lighter(base.fontWeight)
            : weightSpec;

  const clip = from('clip-path');
  const filterSpec = from('filter');

  const style: ComputedStyle = {
    color,
    fill,
    fillOpacity: plain('fill-opacity', 'fillOpacity', same),
    fillRule: plain('fill-rule', 'fillRule', same),
    stroke,
    strokeOpacity: plain('stroke-opacity', 'strokeOpacity', same),
    strokeWidth: plain('stroke-width', 'strokeWidth', (l) => len(l, diagonal)),
    strokeDasharray: plain('stroke-dasharray', 'strokeDasharray', (list) =>
      list === null ? null : dashes(list.map((l) => len(l, diagonal))),
    ),
    strokeDashoffset: plain('stroke-dashoffset', 'strokeDashoffset', (l) => len(l, diagonal)),
    strokeLinecap: plain('stroke-linecap', 'strokeLinecap', same),
    strokeLinejoin: plain('stroke-linejoin', 'strokeLinejoin', same),
    strokeMiterlimit: plain('stroke-miterlimit', 'strokeMiterlimit', same),
    paintOrder: plain('paint-order', 'paintOrder', same),
    vectorEffect: plain('vector-effect', 'vectorEffect', same),
    opacity: plain('opacity', 'opacity', same),
    display: plain('display', 'display', same),
    visibility: plain('visibility', 'visibility', same),
    clipPath: clip === INHERIT ? base.clipPath : clip === INITIAL || clip === null || clip.id === null ? null : urlOf(clip.id),
    clipPathShape: clip === INHERIT ? base.clipPathShape : clip === INITIAL || clip === null ? null : clip.shape,
    clipRule: plain('clip-rule', 'clipRule', same),
    mask: plain('mask', 'mask', (id) => (id === null ? null : urlOf(id))),
    filter:
      filterSpec === INHERIT
        ? base.filter
        : filterSpec === INITIAL || filterSpec === null || filterSpec.id === null
          ? null
          : urlOf(filterSpec.id),
    filterFunctions:
      filterSpec === INHERIT ? base.filterFunctions : filterSpec === INITIAL || filterSpec === null ? null : filterSpec.functions,
    stopColor: plain('stop-color', 'stopColor', colorValue),
    stopOpacity: plain('stop-opacity', 'stopOpacity', same),
    floodColor: plain('flood-color', 'floodColor', colorValue),
    floodOpacity: plain('flood-opacity', 'floodOpacity', same),
    fontFamily: plain('font-family', 'fontFamily', (f) => f as string[]),
    fontSize,
    fontWeight,
    fontStyle: plain('font-style', 'fontStyle', same),
    fontStretch: plain('font-stretch', 'fontStretch', same),
    fontVariantCaps: plain('font-variant-caps', 'fontVariantCaps', same),
    fontVariantNumeric: plain('font-variant-numeric', 'fontVariantNumeric', (k) => (k.length === 0 ? 'normal' : k.join(' '))),
    textAnchor: plain('text-anchor', 'textAnchor', same),
    dominantBaseline: plain('dominant-baseline', 'dominantBaseline', same),
    alignmentBaseline: plain('alignment-baseline', 'alignmentBaseline', same),
    // SVG 1.1 §10.9.2: percentages refer to the line height, which is the font size in SVG.
    baselineShift: plain('baseline-shift', 'baselineShift', (v) => (typeof v === 'string' ? v : len(v, fontSize))),
    letterSpacing: plain('letter-spacing', 'letterSpacing', (l) => len(l, fontSize)),
    writingMode: plain('writing-mode', 'writingMode', same),
    rootFontSize,
    currentColorPaint: fillCurrent || strokeCurrent ? { fill: fillCurrent, stroke: strokeCurrent } : NO_CURRENT,
  };
  return style;
}

/**
 * SVG 2 §13.5.4: an odd list is repeated to make it even; a list summing to
 * zero renders as a solid line, reported here as null.
 */
function dashes(values: number[]): number[] | null {
  let sum = 0;
  for (const v of values) sum += v;
  if (!(sum > 0) || !Number.isFinite(sum)) return null;
  return Object.freeze(values.length % 2 === 1 ? values.concat(values) : values) as number[];
}

/** CSS Fonts 4 §2.2, table of relative weights. */
function bolder(w: number): number {
  if (w < 350) return 400;
  if (w < 550) return 700;
  if (w < 900) return 900;
  return w;
}

function lighter(w: number): number {
  if (w < 100) return w;
  if (w < 550) return 100;
  if (w < 750) return 400;
  return 700;
}

/**
 * The same-document reference and fallback of a computed fill, stroke,
 * clipPath, mask or filter string, or null if it is not a reference.
 */
export function paintReference(paint: string): { id: string; fallback: string | null } | null {
  const m = /^url\((?:#([^)"'\s]+)|"#((?:[^"\\]|\\.)*)")\)\s*(.*)$/s.exec(paint);
  if (!m) return null;
  const id = m[1] ?? m[2]!.replace(/\\a |\\(.)/gs, (all, c: string | undefined) => (c === undefined ? '\n' : c));
  const rest = m[3]!.trim();
  return { id, fallback: rest === '' ? null : rest };
}
