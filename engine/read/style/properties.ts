/**
 * The style properties the cascade tracks: which inherit, and which may also
 * be written as presentation attributes.
 *
 * Inheritance follows the property definitions of SVG 2 (§13 Painting, §11
 * Text, §14 Clipping/Masking), CSS Fonts 4, CSS Color 4, CSS Masking 1, CSS
 * Inline 3 and CSS Writing Modes 3. Where SVG 1.1 and SVG 2 disagree
 * (dominant-baseline: not inherited in 1.1, inherited in 2) SVG 2 is used.
 */

export type StyleProperty =
  | 'color'
  | 'fill'
  | 'fill-opacity'
  | 'fill-rule'
  | 'stroke'
  | 'stroke-opacity'
  | 'stroke-width'
  | 'stroke-dasharray'
  | 'stroke-dashoffset'
  | 'stroke-linecap'
  | 'stroke-linejoin'
  | 'stroke-miterlimit'
  | 'paint-order'
  | 'vector-effect'
  | 'opacity'
  | 'display'
  | 'visibility'
  | 'clip-path'
  | 'clip-rule'
  | 'mask'
  | 'filter'
  | 'stop-color'
  | 'stop-opacity'
  | 'flood-color'
  | 'flood-opacity'
  | 'font-family'
  | 'font-size'
  | 'font-weight'
  | 'font-style'
  | 'font-stretch'
  | 'font-variant-caps'
  | 'font-variant-numeric'
  | 'text-anchor'
  | 'dominant-baseline'
  | 'alignment-baseline'
  | 'baseline-shift'
  | 'letter-spacing'
  | 'writing-mode';

/** Every tracked property, in the order computeStyle resolves them. */
export const STYLE_PROPERTIES: readonly StyleProperty[] = Object.freeze([
  'color',
  'font-size',
  'font-family',
  'font-weight',
  'font-style',
  'font-stretch',
  'font-variant-caps',
  'font-variant-numeric',
  'fill',
  'fill-opacity',
  'fill-rule',
  'stroke',
  'stroke-opacity',
  'stroke-width',
  'stroke-dasharray',
  'stroke-dashoffset',
  'stroke-linecap',
  'stroke-linejoin',
  'stroke-miterlimit',
  'paint-order',
  'vector-effect',
  'opacity',
  'display',
  'visibility',
  'clip-path',
  'clip-rule',
  'mask',
  'filter',
  'stop-color',
  'stop-opacity',
  'flood-color',
  'flood-opacity',
  'text-anchor',
  'dominant-baseline',
  'alignment-baseline',
  'baseline-shift',
  'letter-spacing',
  'writing-mode',
] as const);

const INHERITED: ReadonlySet<StyleProperty> = new Set<StyleProperty>([
  'color',
  'fill',
  'fill-opacity',
  'fill-rule',
  'stroke',
  'stroke-opacity',
  'stroke-width',
  'stroke-dasharray',
  'stroke-dashoffset',
  'stroke-linecap',
  'stroke-linejoin',
  'stroke-miterlimit',
  'paint-order',
  'visibility',
  'clip-rule',
  'font-family',
  'font-size',
  'font-weight',
  'font-style',
  'font-stretch',
  'font-variant-caps',
  'font-variant-numeric',
  'text-anchor',
  'dominant-baseline',
  'letter-spacing',
  'writing-mode',
]);

/** True when the property inherits by default (absent or `unset` takes the parent's computed value). */
export function isInherited(property: StyleProperty): boolean {
  return INHERITED.has(property);
}

const KNOWN: ReadonlySet<string> = new Set<string>(STYLE_PROPERTIES);

export function isStyleProperty(name: string): name is StyleProperty {
  return KNOWN.has(name);
}

/**
 * Attributes that act as presentation attributes (SVG 2 §6.6 and its property
 * index). `font-variant` is a shorthand here too. `transform` is a
 * presentation attribute in SVG 2 but is handled as geometry, not style.
 */
export const PRESENTATION_ATTRIBUTES: ReadonlySet<string> = new Set<string>([
  ...STYLE_PROPERTIES,
  'font-variant',
]);
