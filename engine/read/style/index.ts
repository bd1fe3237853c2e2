/**
 * The CSS cascade for SVG documents: buildCascade(doc).declared(el) gives each
 * element's winning declarations; computeStyle(declared, parentStyle) applies
 * inheritance and resolves values.
 */
export { buildCascade, DEFAULT_CASCADE_LIMITS, type Cascade, type CascadeLimits } from './cascade.js';
export {
  computeStyle,
  paintReference,
  INITIAL_STYLE,
  MEDIUM_FONT_SIZE,
  type ComputedStyle,
  type ComputeContext,
} from './compute.js';
export { isInherited, isStyleProperty, PRESENTATION_ATTRIBUTES, STYLE_PROPERTIES, type StyleProperty } from './properties.js';
export { compileSelectorText, type CompiledSelector, type SelectorListResult } from './selectors.js';
export type {
  CssLength,
  CssLengthUnit,
  CssWide,
  CssWideKeyword,
  Declaration,
  DeclarationOrigin,
  DeclaredStyle,
  PaintOrderPart,
  SpecifiedPaint,
  SpecifiedValues,
  StyleWarning,
  WritingMode,
} from './types.js';
