/**
 * Value types shared by the cascade (declared values) and computeStyle
 * (computed values).
 */
import type { StyleProperty } from './properties.js';

/** Length units accepted in style values; '' is a bare number (user units). */
export type CssLengthUnit = '' | 'px' | 'pt' | 'pc' | 'mm' | 'cm' | 'q' | 'in' | 'em' | 'ex' | 'ch' | 'rem' | '%';

export interface CssLength {
  readonly value: number;
  readonly unit: CssLengthUnit;
}

/** A colour as written (validated as a CSS colour), or the `currentColor` keyword. */
export type SpecifiedColor = { readonly type: 'currentColor' } | { readonly type: 'color'; readonly color: string };

/** `<paint>` (SVG 2 §13.2): none, a colour, a same-document reference with optional fallback, or a context paint. */
export type SpecifiedPaint =
  | { readonly type: 'none' }
  | { readonly type: 'currentColor' }
  | { readonly type: 'color'; readonly color: string }
  | { readonly type: 'context-fill' }
  | { readonly type: 'context-stroke' }
  | {
      readonly type: 'url';
      /** Element id without '#'. */
      readonly id: string;
      readonly fallback: Exclude<SpecifiedPaint, { type: 'url' }> | null;
    };

export type FontSizeKeyword =
  | 'xx-small'
  | 'x-small'
  | 'small'
  | 'medium'
  | 'large'
  | 'x-large'
  | 'xx-large'
  | 'xxx-large'
  | 'larger'
  | 'smaller';

export type PaintOrderPart = 'fill' | 'stroke' | 'markers';

export interface SpecifiedFilter {
  /** Id of the first same-document `url(#id)` in the list, or null. */
  readonly id: string | null;
  /** The CSS filter functions of the list (`blur(2px) drop-shadow(...)`), as text, or null. */
  readonly functions: string | null;
}

export interface SpecifiedClipPath {
  readonly id: string | null;
  /** A basic shape or geometry box (`circle(40%)`, `inset(0 0 10px)`), as text. */
  readonly shape: string | null;
}

/** Specified values after parsing and validation, per property. */
export interface SpecifiedValues {
  color: SpecifiedColor;
  fill: SpecifiedPaint;
  'fill-opacity': number;
  'fill-rule': 'nonzero' | 'evenodd';
  stroke: SpecifiedPaint;
  'stroke-opacity': number;
  'stroke-width': CssLength;
  /** null for `none`. */
  'stroke-dasharray': readonly CssLength[] | null;
  'stroke-dashoffset': CssLength;
  'stroke-linecap': 'butt' | 'round' | 'square';
  'stroke-linejoin': 'miter' | 'miter-clip' | 'round' | 'bevel' | 'arcs';
  'stroke-miterlimit': number;
  'paint-order': readonly PaintOrderPart[];
  'vector-effect': string;
  opacity: number;
  display: string;
  visibility: 'visible' | 'hidden' | 'collapse';
  /** null for `none`. */
  'clip-path': SpecifiedClipPath | null;
  'clip-rule': 'nonzero' | 'evenodd';
  /** Referenced element id, or null for `none`. */
  mask: string | null;
  /** null for `none`. */
  filter: SpecifiedFilter | null;
  'stop-color': SpecifiedColor;
  'stop-opacity': number;
  'flood-color': SpecifiedColor;
  'flood-opacity': number;
  'font-family': readonly string[];
  'font-size': CssLength | FontSizeKeyword;
  'font-weight': number | 'bolder' | 'lighter';
  'font-style': 'normal' | 'italic' | 'oblique';
  /** Percentage of the normal width. */
  'font-stretch': number;
  'font-variant-caps': string;
  /** Keywords in written order; empty for `normal`. */
  'font-variant-numeric': readonly string[];
  'text-anchor': 'start' | 'middle' | 'end';
  'dominant-baseline': string;
  'alignment-baseline': string;
  'baseline-shift': CssLength | 'sub' | 'super';
  /** `normal` is stored as 0. */
  'letter-spacing': CssLength;
  'writing-mode': WritingMode;
}

export type WritingMode = 'horizontal-tb' | 'vertical-rl' | 'vertical-lr' | 'sideways-rl' | 'sideways-lr';

/** CSS-wide keywords (CSS Cascade 4 §7.3). `revert` is read as `unset`: there is no user or agent origin here. */
export type CssWideKeyword = 'inherit' | 'initial' | 'unset';

export interface CssWide {
  readonly cssWide: CssWideKeyword;
}

/** Where a winning declaration came from. */
export type DeclarationOrigin = 'attribute' | 'inline' | 'sheet';

/** One longhand declaration after parsing (a shorthand yields several). */
export interface Declaration<P extends StyleProperty = StyleProperty> {
  readonly property: P;
  readonly value: SpecifiedValues[P] | CssWide;
  readonly important: boolean;
  readonly origin: DeclarationOrigin;
  /** The value text as written (for a shorthand, the whole shorthand value). */
  readonly text: string;
  /** Selector text of the sheet rule it came from (origin 'sheet' only). */
  readonly selector?: string;
}

/** The winning declaration of each property for one element; absent properties were not declared. */
export type DeclaredStyle = { readonly [P in StyleProperty]?: Declaration<P> };

export function isCssWide(value: unknown): value is CssWide {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && 'cssWide' in value;
}

/** A problem with the document's style that did not stop the cascade. */
export interface StyleWarning {
  readonly message: string;
  /** Position of the `<style>` element (or the element whose attribute is at fault). */
  readonly line: number;
  readonly column: number;
}
