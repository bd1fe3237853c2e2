/**
 * Parses and validates one longhand value with css-tree's value parser.
 * An invalid value yields null: the declaration is then dropped, as a CSS
 * parser drops invalid declarations (CSS Syntax 3 §5.4.6 / CSS Cascade 4 §3)
 * and SVG 2 (§6.6) ignores invalid presentation attributes.
 *
 * Leniency: bare numbers are accepted wherever a length is (SVG user units),
 * in style sheets as well as attributes.
 */
import * as csstree from 'css-tree';
import { parse as parseCssColor } from 'culori';
import type { StyleProperty } from './properties.js';
import type {
  CssLength,
  CssLengthUnit,
  FontSizeKeyword,
  PaintOrderPart,
  SpecifiedClipPath,
  SpecifiedColor,
  SpecifiedFilter,
  SpecifiedPaint,
  SpecifiedValues,
  WritingMode,
} from './types.js';

export type ValueNode = csstree.CssNode;

/** Parses a value into its top-level component nodes; null when css-tree reports an error. */
export function valueNodes(text: string): ValueNode[] | null {
  let failed = false;
  let ast: csstree.CssNode;
  try {
    ast = csstree.parse(text, {
      context: 'value',
      onParseError: () => {
        failed = true;
      },
    });
  } catch {
    return null;
  }
  if (failed || ast.type !== 'Value') return null;
  const nodes = ast.children.toArray();
  for (const node of nodes) if (node.type === 'Raw') return null;
  return nodes;
}

/** Identifier name, unescaped and ASCII-lowercased (keywords are case-insensitive). */
export function keywordOf(node: ValueNode | undefined): string | null {
  if (!node || node.type !== 'Identifier') return null;
  return asciiLower(csstree.ident.decode(node.name));
}

export function asciiLower(s: string): string {
  return s.replace(/[A-Z]+/g, (m) => m.toLowerCase());
}

const LENGTH_UNITS: ReadonlySet<string> = new Set(['px', 'pt', 'pc', 'mm', 'cm', 'q', 'in', 'em', 'ex', 'ch', 'rem']);

/** A number, dimension with a length unit, or percentage; null otherwise. */
export function lengthOf(node: ValueNode | undefined): CssLength | null {
  if (!node) return null;
  let value: number;
  let unit: CssLengthUnit;
  if (node.type === 'Number') {
    value = Number(node.value);
    unit = '';
  } else if (node.type === 'Percentage') {
    value = Number(node.value);
    unit = '%';
  } else if (node.type === 'Dimension') {
    const u = asciiLower(node.unit);
    if (!LENGTH_UNITS.has(u)) return null;
    value = Number(node.value);
    unit = u as CssLengthUnit;
  } else {
    return null;
  }
  return Number.isFinite(value) ? { value, unit } : null;
}

function numberOf(node: ValueNode | undefined): number | null {
  if (!node || node.type !== 'Number') return null;
  const v = Number(node.value);
  return Number.isFinite(v) ? v : null;
}

function single(nodes: ValueNode[]): ValueNode | null {
  return nodes.length === 1 ? nodes[0]! : null;
}

function keywordIn<T extends string>(nodes: ValueNode[], allowed: readonly T[]): T | null {
  const k = keywordOf(single(nodes) ?? undefined);
  return k !== null && (allowed as readonly string[]).includes(k) ? (k as T) : null;
}

/** A colour or `currentColor`; colour syntax is checked with culori, the text kept as written. */
export function colorOf(node: ValueNode | undefined): SpecifiedColor | null {
  if (!node) return null;
  let text: string;
  if (node.type === 'Identifier') {
    const name = csstree.ident.decode(node.name);
    if (asciiLower(name) === 'currentcolor') return { type: 'currentColor' };
    text = name;
  } else if (node.type === 'Hash') {
    text = '#' + node.value;
  } else if (node.type === 'Function') {
    text = csstree.generate(node);
  } else {
    return null;
  }
  return parseCssColor(text) ? { type: 'color', color: text } : null;
}

/** Id of a same-document reference `url(#id)`; '' for any other URL (external: never fetched). */
function localUrlId(node: ValueNode): string | null {
  if (node.type !== 'Url') return null;
  const v = node.value.trim();
  return v.length > 1 && v.charCodeAt(0) === 35 /* # */ ? v.slice(1) : '';
}

function simplePaint(node: ValueNode | undefined): Exclude<SpecifiedPaint, { type: 'url' }> | null {
  const k = keywordOf(node);
  if (k === 'none') return { type: 'none' };
  if (k === 'context-fill') return { type: 'context-fill' };
  if (k === 'context-stroke') return { type: 'context-stroke' };
  return colorOf(node);
}

function paintOf(nodes: ValueNode[]): SpecifiedPaint | null {
  if (nodes.length === 0 || nodes.length > 2) return null;
  const first = nodes[0]!;
  if (first.type === 'Url') {
    const id = localUrlId(first)!;
    const fallback = nodes.length === 2 ? simplePaint(nodes[1]) : null;
    if (nodes.length === 2 && (!fallback || fallback.type === 'context-fill' || fallback.type === 'context-stroke')) return null;
    // SVG 2 §13.3: a reference that cannot be used falls back, else renders as none.
    if (id === '') return fallback ?? { type: 'none' };
    return { type: 'url', id, fallback };
  }
  return nodes.length === 1 ? simplePaint(first) : null;
}

function opacityOf(nodes: ValueNode[]): number | null {
  const node = single(nodes);
  if (!node) return null;
  let v: number | null = null;
  if (node.type === 'Number') v = numberOf(node);
  else if (node.type === 'Percentage') v = Number(node.value) / 100;
  if (v === null || !Number.isFinite(v)) return null;
  // CSS Color 4 §4.2: out-of-range alpha values are clamped, not invalid.
  return Math.min(1, Math.max(0, v));
}

function nonNegativeLength(nodes: ValueNode[]): CssLength | null {
  const l = lengthOf(single(nodes) ?? undefined);
  return l && l.value >= 0 ? l : null;
}

function dashArrayOf(nodes: ValueNode[]): readonly CssLength[] | null | undefined {
  if (keywordIn(nodes, ['none'])) return null;
  const out: CssLength[] = [];
  let expectItem = true;
  for (const node of nodes) {
    if (node.type === 'Operator' && node.value === ',') {
      if (expectItem) return undefined;
      expectItem = true;
      continue;
    }
    const l = lengthOf(node);
    if (!l || l.value < 0) return undefined; // SVG 2 §13.5.4: negative values are in error
    out.push(l);
    expectItem = false;
  }
  if (out.length === 0 || expectItem) return undefined;
  return out;
}

const PAINT_PARTS: readonly PaintOrderPart[] = ['fill', 'stroke', 'markers'];

function paintOrderOf(nodes: ValueNode[]): readonly PaintOrderPart[] | null {
  if (keywordIn(nodes, ['normal'])) return PAINT_PARTS;
  if (nodes.length === 0 || nodes.length > 3) return null;
  const seen: PaintOrderPart[] = [];
  for (const node of nodes) {
    const k = keywordOf(node) as PaintOrderPart | null;
    if (!k || !PAINT_PARTS.includes(k) || seen.includes(k)) return null;
    seen.push(k);
  }
  // SVG 2 §13.6: omitted parts are painted after the listed ones, in the default order.
  for (const p of PAINT_PARTS) if (!seen.includes(p)) seen.push(p);
  return seen;
}

const DISPLAY_KEYWORDS: ReadonlySet<string> = new Set([
  'inline', 'block', 'run-in', 'flow', 'flow-root', 'table', 'flex', 'grid', 'ruby', 'list-item', 'contents', 'none',
  'inline-block', 'inline-table', 'inline-flex', 'inline-grid', 'inline-list-item', 'table-row-group',
  'table-header-group', 'table-footer-group', 'table-row', 'table-cell', 'table-column-group', 'table-column',
  'table-caption', 'ruby-base', 'ruby-text', 'ruby-base-container', 'ruby-text-container', 'compact', 'marker',
]);

function keywordList(nodes: ValueNode[], allowed: ReadonlySet<string>, max: number): string | null {
  if (nodes.length === 0 || nodes.length > max) return null;
  const words: string[] = [];
  for (const node of nodes) {
    const k = keywordOf(node);
    if (k === null || !allowed.has(k)) return null;
    words.push(k);
  }
  if (words.length > 1 && words.includes('none')) return null;
  return words.join(' ');
}

const VECTOR_EFFECTS: ReadonlySet<string> = new Set([
  'none', 'non-scaling-stroke', 'non-scaling-size', 'non-rotation', 'fixed-position', 'viewport', 'screen',
]);

const SHAPE_FUNCTIONS: ReadonlySet<string> = new Set(['inset', 'circle', 'ellipse', 'polygon', 'path', 'rect', 'xywh']);
const GEOMETRY_BOXES: ReadonlySet<string> = new Set([
  'margin-box', 'border-box', 'padding-box', 'content-box', 'fill-box', 'stroke-box', 'view-box',
]);

function clipPathOf(nodes: ValueNode[]): SpecifiedClipPath | null | undefined {
  if (keywordIn(nodes, ['none'])) return null;
  if (nodes.length === 1 && nodes[0]!.type === 'Url') {
    const id = localUrlId(nodes[0]!)!;
    // CSS Masking 1 §6.1: a reference to a missing or external object means no clipping here.
    return id === '' ? null : { id, shape: null };
  }
  if (nodes.length === 0 || nodes.length > 2) return undefined;
  let shape = 0;
  let box = 0;
  for (const node of nodes) {
    if (node.type === 'Function' && SHAPE_FUNCTIONS.has(asciiLower(csstree.ident.decode(node.name)))) shape++;
    else if (GEOMETRY_BOXES.has(keywordOf(node) ?? '')) box++;
    else return undefined;
  }
  if (shape > 1 || box > 1) return undefined;
  return { id: null, shape: nodes.map((n) => csstree.generate(n)).join(' ') };
}

function maskOf(nodes: ValueNode[]): string | null | undefined {
  if (keywordIn(nodes, ['none'])) return null;
  const first = nodes[0];
  if (!first || first.type !== 'Url') return undefined;
  for (const node of nodes) if (node.type === 'Operator' && node.value === ',') return undefined; // one layer only
  const id = localUrlId(first)!;
  return id === '' ? null : id;
}

function filterOf(nodes: ValueNode[]): SpecifiedFilter | null | undefined {
  if (keywordIn(nodes, ['none'])) return null;
  if (nodes.length === 0) return undefined;
  let id: string | null = null;
  const functions: string[] = [];
  for (const node of nodes) {
    if (node.type === 'Url') {
      const ref = localUrlId(node)!;
      // Filter Effects 1 §5: a reference that cannot be resolved makes the filter chain be ignored.
      if (ref === '') return null;
      if (id === null) id = ref;
    } else if (node.type === 'Function') {
      functions.push(csstree.generate(node));
    } else {
      return undefined;
    }
  }
  return { id, functions: functions.length > 0 ? functions.join(' ') : null };
}

const GENERIC_FAMILIES: ReadonlySet<string> = new Set([
  'serif', 'sans-serif', 'monospace', 'cursive', 'fantasy', 'system-ui', 'ui-serif', 'ui-sans-serif',
  'ui-monospace', 'ui-rounded', 'math', 'emoji', 'fangsong',
]);
const NOT_FAMILY_NAMES: ReadonlySet<string> = new Set(['inherit', 'initial', 'unset', 'revert', 'revert-layer', 'default']);

/** `<family-name>#` (CSS Fonts 4 §2.1): quoted strings or runs of identifiers, comma separated. */
export function fontFamilyOf(nodes: readonly ValueNode[]): string[] | null {
  const families: string[] = [];
  let words: string[] = [];
  let quoted: string | null = null;
  const flush = (): boolean => {
    if (quoted !== null) {
      if (words.length > 0) return false;
      families.push(quoted);
    } else {
      if (words.length === 0) return false;
      if (words.length === 1) {
        const lower = asciiLower(words[0]!);
        if (NOT_FAMILY_NAMES.has(lower)) return false;
        families.push(GENERIC_FAMILIES.has(lower) ? lower : words[0]!);
      } else {
        families.push(words.join(' '));
      }
    }
    words = [];
    quoted = null;
    return true;
  };
  for (const node of nodes) {
    if (node.type === 'Operator' && node.value === ',') {
      if (!flush()) return null;
    } else if (node.type === 'String') {
      if (quoted !== null || words.length > 0) return null;
      quoted = node.value;
    } else if (node.type === 'Identifier') {
      if (quoted !== null) return null;
      words.push(csstree.ident.decode(node.name));
    } else {
      return null;
    }
  }
  if (!flush()) return null;
  return families;
}

export const FONT_SIZE_KEYWORDS: readonly FontSizeKeyword[] = [
  'xx-small', 'x-small', 'small', 'medium', 'large', 'x-large', 'xx-large', 'xxx-large', 'larger', 'smaller',
];

export function fontSizeOf(node: ValueNode | undefined): CssLength | FontSizeKeyword | null {
  const k = keywordOf(node);
  if (k !== null) return (FONT_SIZE_KEYWORDS as readonly string[]).includes(k) ? (k as FontSizeKeyword) : null;
  const l = lengthOf(node);
  return l && l.value >= 0 ? l : null;
}

export function fontWeightOf(node: ValueNode | undefined): number | 'bolder' | 'lighter' | null {
  const k = keywordOf(node);
  if (k === 'normal') return 400;
  if (k === 'bold') return 700;
  if (k === 'bolder' || k === 'lighter') return k;
  const n = numberOf(node);
  // CSS Fonts 4 §2.2: any number in [1, 1000].
  return n !== null && n >= 1 && n <= 1000 ? n : null;
}

/** CSS Fonts 4 §2.3 (font-stretch keyword table), as percentages. */
export const FONT_STRETCH_KEYWORDS: Readonly<Record<string, number>> = Object.freeze({
  'ultra-condensed': 50,
  'extra-condensed': 62.5,
  condensed: 75,
  'semi-condensed': 87.5,
  normal: 100,
  'semi-expanded': 112.5,
  expanded: 125,
  'extra-expanded': 150,
  'ultra-expanded': 200,
});

function fontStretchOf(nodes: ValueNode[]): number | null {
  const node = single(nodes);
  if (!node) return null;
  const k = keywordOf(node);
  if (k !== null) return FONT_STRETCH_KEYWORDS[k] ?? null;
  if (node.type === 'Percentage') {
    const v = Number(node.value);
    return Number.isFinite(v) && v >= 0 ? v : null;
  }
  return null;
}

function fontStyleOf(nodes: ValueNode[]): 'normal' | 'italic' | 'oblique' | null {
  const k = keywordOf(nodes[0]);
  if (nodes.length === 1 && (k === 'normal' || k === 'italic' || k === 'oblique')) return k;
  if (nodes.length === 2 && k === 'oblique' && isAngle(nodes[1])) return 'oblique';
  return null;
}

export function isAngle(node: ValueNode | undefined): boolean {
  return !!node && node.type === 'Dimension' && ['deg', 'grad', 'rad', 'turn'].includes(asciiLower(node.unit));
}

export const FONT_VARIANT_CAPS: readonly string[] = [
  'normal', 'small-caps', 'all-small-caps', 'petite-caps', 'all-petite-caps', 'unicase', 'titling-caps',
];

/** CSS Fonts 4 §6.7: the four numeric groups, each at most once. */
const NUMERIC_GROUPS: readonly (readonly string[])[] = [
  ['lining-nums', 'oldstyle-nums'],
  ['proportional-nums', 'tabular-nums'],
  ['diagonal-fractions', 'stacked-fractions'],
  ['ordinal'],
  ['slashed-zero'],
];

export function isNumericVariantKeyword(k: string): boolean {
  return NUMERIC_GROUPS.some((g) => g.includes(k));
}

/** Validates a list of font-variant-numeric keywords (each group at most once). */
export function numericVariantValid(words: readonly string[]): boolean {
  const used = new Set<number>();
  for (const w of words) {
    const g = NUMERIC_GROUPS.findIndex((grp) => grp.includes(w));
    if (g < 0 || used.has(g)) return false;
    used.add(g);
  }
  return true;
}

function fontVariantNumericOf(nodes: ValueNode[]): readonly string[] | null {
  if (keywordIn(nodes, ['normal'])) return [];
  if (nodes.length === 0) return null;
  const words: string[] = [];
  for (const node of nodes) {
    const k = keywordOf(node);
    if (k === null) return null;
    words.push(k);
  }
  return numericVariantValid(words) ? words : null;
}

const DOMINANT_BASELINES: readonly string[] = [
  'auto', 'text-bottom', 'alphabetic', 'ideographic', 'middle', 'central', 'mathematical', 'hanging', 'text-top',
  // SVG 1.1 values, still written by older tools
  'use-script', 'no-change', 'reset-size', 'text-after-edge', 'text-before-edge',
];
const ALIGNMENT_BASELINES: readonly string[] = [
  'auto', 'baseline', 'before-edge', 'text-before-edge', 'middle', 'central', 'after-edge', 'text-after-edge',
  'ideographic', 'alphabetic', 'hanging', 'mathematical', 'top', 'center', 'bottom', 'text-bottom', 'text-top',
];

/** CSS Writing Modes 3 §3.1: SVG 1.1 values compute to their CSS equivalents. */
const WRITING_MODES: Readonly<Record<string, WritingMode>> = Object.freeze({
  'horizontal-tb': 'horizontal-tb',
  'vertical-rl': 'vertical-rl',
  'vertical-lr': 'vertical-lr',
  'sideways-rl': 'sideways-rl',
  'sideways-lr': 'sideways-lr',
  lr: 'horizontal-tb',
  'lr-tb': 'horizontal-tb',
  rl: 'horizontal-tb',
  'rl-tb': 'horizontal-tb',
  tb: 'vertical-rl',
  'tb-rl': 'vertical-rl',
});

type Parser<P extends StyleProperty> = (nodes: ValueNode[]) => SpecifiedValues[P] | null | undefined;
type ParserTable = { [P in StyleProperty]: Parser<P> };

/**
 * One parser per property. A parser returns undefined or null for an invalid
 * value, except where null is itself a valid value (`none`), in which case only
 * undefined means invalid — see NULL_IS_VALID.
 */
const PARSERS: ParserTable = {
  color: (n) => colorOf(single(n) ?? undefined),
  fill: paintOf,
  'fill-opacity': opacityOf,
  'fill-rule': (n) => keywordIn(n, ['nonzero', 'evenodd'] as const),
  stroke: paintOf,
  'stroke-opacity': opacityOf,
  'stroke-width': nonNegativeLength,
  'stroke-dasharray': dashArrayOf,
  'stroke-dashoffset': (n) => lengthOf(single(n) ?? undefined),
  'stroke-linecap': (n) => keywordIn(n, ['butt', 'round', 'square'] as const),
  'stroke-linejoin': (n) => keywordIn(n, ['miter', 'miter-clip', 'round', 'bevel', 'arcs'] as const),
  'stroke-miterlimit': (n) => {
    const v = numberOf(single(n) ?? undefined);
    return v !== null && v >= 1 ? v : null;
  },
  'paint-order': paintOrderOf,
  'vector-effect': (n) => keywordList(n, VECTOR_EFFECTS, 4),
  opacity: opacityOf,
  display: (n) => keywordList(n, DISPLAY_KEYWORDS, 3),
  visibility: (n) => keywordIn(n, ['visible', 'hidden', 'collapse'] as const),
  'clip-path': clipPathOf,
  'clip-rule': (n) => keywordIn(n, ['nonzero', 'evenodd'] as const),
  mask: maskOf,
  filter: filterOf,
  'stop-color': (n) => colorOf(single(n) ?? undefined),
  'stop-opacity': opacityOf,
  'flood-color': (n) => colorOf(single(n) ?? undefined),
  'flood-opacity': opacityOf,
  'font-family': fontFamilyOf,
  'font-size': (n) => fontSizeOf(single(n) ?? undefined),
  'font-weight': (n) => fontWeightOf(single(n) ?? undefined),
  'font-style': fontStyleOf,
  'font-stretch': fontStretchOf,
  'font-variant-caps': (n) => keywordIn(n, FONT_VARIANT_CAPS),
  'font-variant-numeric': fontVariantNumericOf,
  'text-anchor': (n) => keywordIn(n, ['start', 'middle', 'end'] as const),
  'dominant-baseline': (n) => keywordIn(n, DOMINANT_BASELINES),
  'alignment-baseline': (n) => keywordIn(n, ALIGNMENT_BASELINES),
  'baseline-shift': (n) => {
    const k = keywordOf(single(n) ?? undefined);
    if (k === 'sub' || k === 'super') return k;
    if (k === 'baseline') return { value: 0, unit: '' };
    return lengthOf(single(n) ?? undefined);
  },
  'letter-spacing': (n) => (keywordIn(n, ['normal']) ? { value: 0, unit: '' } : lengthOf(single(n) ?? undefined)),
  'writing-mode': (n) => {
    const k = keywordOf(single(n) ?? undefined);
    return k !== null ? (WRITING_MODES[k] ?? null) : null;
  },
};

const NULL_IS_VALID: ReadonlySet<StyleProperty> = new Set<StyleProperty>(['stroke-dasharray', 'clip-path', 'mask', 'filter']);

export type ParsedValue<P extends StyleProperty> = { readonly ok: true; readonly value: SpecifiedValues[P] } | { readonly ok: false };

const INVALID = Object.freeze({ ok: false as const });

/** Parses a longhand value from already-parsed component nodes. */
export function parseLonghandNodes<P extends StyleProperty>(property: P, nodes: ValueNode[]): ParsedValue<P> {
  const parser = PARSERS[property] as Parser<P>;
  const value = parser(nodes);
  if (value === undefined || (value === null && !NULL_IS_VALID.has(property))) return INVALID;
  return { ok: true, value: value as SpecifiedValues[P] };
}

/** Parses a longhand value from text. */
export function parseLonghand<P extends StyleProperty>(property: P, text: string): ParsedValue<P> {
  const nodes = valueNodes(text);
  if (!nodes || nodes.length === 0) return INVALID;
  return parseLonghandNodes(property, nodes);
}
