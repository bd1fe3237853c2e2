/** Rendering with bundled fonts, pixel comparison and the three-panel picture. */
export { RasterInputError } from './errors.js';
export {
  BUNDLED_FACES,
  DEFAULT_FONT_FAMILY,
  GENERIC_FAMILY_MAP,
  bundledFontDir,
  bundledFontFiles,
  substituteGenericFamilies,
  type BundledFace,
} from './fonts.js';
export { neutralizeExternalRefs } from './external-refs.js';
export {
  intrinsicSize,
  prepareSvg,
  renderPng,
  renderSvg,
  renderSvgAsync,
  type PreparedSvg,
  type RenderOptions,
  type RgbaImage,
} from './render.js';
export { diffImages, findRegions, padImage, type DiffRegion, type PixelDiff, type PixelDiffOptions, type Rgb } from './diff-pixels.js';
export { compositePng, compositeRgba, encodePng, type CompositeOptions, type DiffLayer } from './composite.js';
export { diffSvgTexts, type DifferentSvgs, type IdenticalSvgs, type SvgDiffOptions, type SvgDiffResult } from './diff-svgs.js';
