/**
 * Turns `property: value` pairs into validated longhand declarations,
 * expanding the font shorthands. Used for presentation attributes, `style=""`
 * and sheet rules alike.
 */
import * as csstree from 'css-tree';
import { expandFont, expandFontVariant } from './font-shorthand.js';
import { isStyleProperty, type StyleProperty } from './properties.js';
import type { CssWide, CssWideKeyword, Declaration, DeclarationOrigin } from './types.js';
import { asciiLower, keywordOf, parseLonghandNodes, valueNodes } from './values.js';

const FONT_LONGHANDS: readonly StyleProperty[] = [
  'font-style',
  'font-variant-caps',
  'font-variant-numeric',
  'font-weight',
  'font-stretch',
  'font-size',
  'font-family',
];
const FONT_VARIANT_LONGHANDS: readonly StyleProperty[] = ['font-variant-caps', 'font-variant-numeric'];

const WIDE: Readonly<Record<string, CssWide>> = Object.freeze({
  inherit: Object.freeze({ cssWide: 'inherit' as CssWideKeyword }),
  initial: Object.freeze({ cssWide: 'initial' as CssWideKeyword }),
  unset: Object.freeze({ cssWide: 'unset' as CssWideKeyword }),
  // No user or user-agent origin declares these properties, so rolling back
  // the author origin (or a layer) leaves them unset.
  revert: Object.freeze({ cssWide: 'unset' as CssWideKeyword }),
  'revert-layer': Object.freeze({ cssWide: 'unset' as CssWideKeyword }),
});

const NONE: readonly Declaration[] = Object.freeze([]);

export interface DeclarationSource {
  readonly origin: DeclarationOrigin;
  readonly important: boolean;
  readonly selector?: string;
}

/**
 * Parses one declaration. `name` must already be lowercased for CSS sources.
 * Returns the longhand declarations (several for a shorthand), or an empty
 * list when the property is not tracked or the value is invalid.
 */
export function parseDeclaration(name: string, text: string, source: DeclarationSource): readonly Declaration[] {
  const longhands: readonly StyleProperty[] | null =
    name === 'font' ? FONT_LONGHANDS : name === 'font-variant' ? FONT_VARIANT_LONGHANDS : isStyleProperty(name) ? [name] : null;
  if (longhands === null) return NONE;
  const trimmed = text.trim();
  const make = (property: StyleProperty, value: Declaration['value']): Declaration => {
    const d: { -readonly [K in keyof Declaration]: Declaration[K] } = {
      property,
      value: deepFreeze(value),
      important: source.important,
      origin: source.origin,
      text: trimmed,
    };
    if (source.selector !== undefined) d.selector = source.selector;
    return Object.freeze(d);
  };

  // var() is substituted at computed-value time; it is not supported here, so
  // the declaration behaves as invalid at computed-value time (CSS Variables 1
  // §3.1): as `unset`.
  if (/var\(/i.test(trimmed)) return Object.freeze(longhands.map((p) => make(p, WIDE.unset!)));

  const nodes = valueNodes(trimmed);
  if (!nodes || nodes.length === 0) return NONE;
  if (nodes.length === 1) {
    const k = keywordOf(nodes[0]);
    const wide = k !== null ? WIDE[k] : undefined;
    if (wide) return Object.freeze(longhands.map((p) => make(p, wide)));
  }

  if (name === 'font' || name === 'font-variant') {
    const expanded = name === 'font' ? expandFont(nodes) : expandFontVariant(nodes);
    if (!expanded) return NONE;
    return Object.freeze(
      (Object.keys(expanded) as (keyof typeof expanded)[]).map((p) => make(p, expanded[p] as Declaration['value'])),
    );
  }
  const property = longhands[0]!;
  const parsed = parseLonghandNodes(property, nodes);
  return parsed.ok ? Object.freeze([make(property, parsed.value as Declaration['value'])]) : NONE;
}

/**
 * Parses a declaration list (the body of a rule or a `style=""` attribute)
 * with css-tree. Invalid declarations are skipped, as CSS error recovery does.
 * Returns declarations in source order.
 */
export function parseDeclarationList(
  text: string,
  source: { readonly origin: DeclarationOrigin; readonly selector?: string },
): Declaration[] {
  let ast: csstree.CssNode;
  try {
    ast = csstree.parse(text, { context: 'declarationList', parseValue: false, onParseError: () => {} });
  } catch {
    return [];
  }
  if (ast.type !== 'DeclarationList') return [];
  return declarationsOf(ast.children.toArray(), source);
}

/** Declarations of parsed css-tree nodes (Declaration nodes with Raw values). */
export function declarationsOf(
  nodes: readonly csstree.CssNode[],
  source: { readonly origin: DeclarationOrigin; readonly selector?: string },
): Declaration[] {
  const out: Declaration[] = [];
  for (const node of nodes) {
    if (node.type !== 'Declaration') continue;
    // css-tree keeps `!ie`-style hacks as a string; only a real `!important` counts.
    if (node.important !== true && node.important !== false) continue;
    const value = node.value.type === 'Raw' ? node.value.value : csstree.generate(node.value);
    const name = asciiLower(node.property);
    if (name.startsWith('--')) continue;
    const src: DeclarationSource = { origin: source.origin, important: node.important, ...(source.selector !== undefined ? { selector: source.selector } : {}) };
    for (const d of parseDeclaration(name, value, src)) out.push(d);
  }
  return out;
}

/** Values are shared by every element a declaration applies to: make them immutable. */
function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    for (const v of Object.values(value)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}
