/**
 * Deterministic SVG rasterisation with resvg-js: bundled fonts only (system
 * fonts are never loaded), no external resources, no network.
 *
 * Font loading: resvg-js 2.6.2 builds a fresh font database from the font
 * files on every construction; it has no option to pass font data kept in
 * memory (an unknown option makes it silently drop *all* options, see
 * `assertOptionsHonoured`). Loading the bundled files costs well under a
 * millisecond per render (bench/diff.ts prints the figure), small next to
 * parsing and drawing, so every render loads them.
 */
import { Resvg, renderAsync, type RenderedImage, type ResvgRenderOptions } from '@resvg/resvg-js';
import { DEFAULT_FONT_FAMILY, bundledFontFiles, substituteGenericFamilies } from './fonts.js';
import { RasterInputError } from './errors.js';
import { neutralizeExternalRefs } from './external-refs.js';

export { RasterInputError } from './errors.js';

/** An RGBA image, 4 bytes per pixel, rows top to bottom, not premultiplied. */
export interface RgbaImage {
  width: number;
  height: number;
  rgba: Uint8Array;
}

export interface RenderOptions {
  /** Output width in pixels; the height follows the aspect ratio. Excludes `scale`. */
  width?: number;
  /** Zoom factor relative to the SVG's own size (1 = one pixel per user unit). Excludes `width`. */
  scale?: number;
  /** CSS colour painted under the drawing; default transparent. */
  background?: string;
  /** Largest output accepted, in pixels (width × height); default 40 million. */
  maxPixels?: number;
}

/** Longest SVG text accepted, in UTF-16 code units. */
export const MAX_SVG_LENGTH = 64 * 1024 * 1024;
export const DEFAULT_MAX_PIXELS = 40_000_000;

type FitTo = NonNullable<ResvgRenderOptions['fitTo']>;

interface Plan {
  fitTo: FitTo;
  background: string | undefined;
  maxPixels: number;
}

function positiveFinite(value: unknown, name: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new RasterInputError(`${name} must be a positive finite number, got ${String(value)}`);
  }
  return value;
}

/** Validates the text and returns what the renderer will see (external refs cut, generic families mapped). */
function prepareText(svgText: unknown): string {
  if (typeof svgText !== 'string') {
    throw new RasterInputError(`SVG text must be a string, got ${typeof svgText}`);
  }
  if (svgText.trim() === '') throw new RasterInputError('SVG text is empty');
  if (svgText.length > MAX_SVG_LENGTH) {
    throw new RasterInputError(
      `SVG text is ${svgText.length} characters; the limit is ${MAX_SVG_LENGTH}`,
    );
  }
  return substituteGenericFamilies(neutralizeExternalRefs(svgText).text);
}

/** Validates the options. */
function plan(opts: RenderOptions | undefined): Plan {
  const o = opts ?? {};
  if (o.width !== undefined && o.scale !== undefined) {
    throw new RasterInputError('Give either width or scale, not both');
  }
  let fitTo: FitTo = { mode: 'original' };
  if (o.width !== undefined) {
    const w = positiveFinite(o.width, 'width');
    if (!Number.isInteger(w)) throw new RasterInputError(`width must be a whole number, got ${w}`);
    fitTo = { mode: 'width', value: w };
  } else if (o.scale !== undefined) {
    fitTo = { mode: 'zoom', value: positiveFinite(o.scale, 'scale') };
  }
  if (o.background !== undefined && typeof o.background !== 'string') {
    throw new RasterInputError('background must be a CSS colour string');
  }
  const maxPixels = o.maxPixels === undefined ? DEFAULT_MAX_PIXELS : positiveFinite(o.maxPixels, 'maxPixels');
  return { fitTo, background: o.background, maxPixels };
}

/** SVG text that was checked and rewritten for rendering; `width`/`height` are its own size. */
export interface PreparedSvg {
  readonly width: number;
  readonly height: number;
}

const preparedTexts = new WeakMap<PreparedSvg, string>();

/**
 * Checks and rewrites SVG text once and reads its own size, so that the size
 * can decide the render options before rendering. Parses without fonts.
 */
export function prepareSvg(svgText: string): PreparedSvg {
  const text = prepareText(svgText);
  const own = ownSize(text);
  const prepared: PreparedSvg = Object.freeze({ width: own.width, height: own.height });
  preparedTexts.set(prepared, text);
  return prepared;
}

function textOf(svg: string | PreparedSvg): { text: string; own?: { width: number; height: number } } {
  if (typeof svg === 'string' || typeof svg !== 'object' || svg === null) return { text: prepareText(svg) };
  const text = preparedTexts.get(svg);
  if (text === undefined) throw new RasterInputError('Not an SVG returned by prepareSvg');
  return { text, own: { width: svg.width, height: svg.height } };
}

/** The option object handed to resvg-js; every field is one that 2.6.2 knows. */
export function resvgOptions(fitTo: FitTo, background: string | undefined, withFonts = true): ResvgRenderOptions {
  const options: ResvgRenderOptions = {
    font: {
      loadSystemFonts: false,
      fontFiles: withFonts ? bundledFontFiles() : [],
      defaultFontFamily: DEFAULT_FONT_FAMILY,
    },
    fitTo,
    logLevel: 'off',
  };
  if (background !== undefined) options.background = background;
  return options;
}

let optionsChecked = false;

/**
 * resvg-js 2.6.2 rejects an option object with any unknown field by silently
 * falling back to its defaults, which load the system's fonts. This renders a
 * tiny probe once per process with the same option shape and checks that the
 * size and background it asked for were applied.
 */
export function assertOptionsHonoured(): void {
  if (optionsChecked) return;
  const probe = '<svg xmlns="http://www.w3.org/2000/svg" width="2" height="2"/>';
  const img = new Resvg(probe, resvgOptions({ mode: 'width', value: 3 }, '#ff0000')).render();
  const px = img.pixels;
  if (img.width !== 3 || px[0] !== 255 || px[3] !== 255) {
    throw new Error(
      'resvg-js ignored the render options (unexpected version?); refusing to render with system defaults',
    );
  }
  optionsChecked = true;
}

function wrap(err: unknown): RasterInputError {
  if (err instanceof RasterInputError) return err;
  const msg = err instanceof Error ? err.message : String(err);
  return new RasterInputError(`Cannot render SVG: ${msg}`);
}

/** Output size the renderer will produce for an SVG of the given own size. */
export function plannedSize(own: { width: number; height: number }, fitTo: FitTo): { width: number; height: number } {
  switch (fitTo.mode) {
    case 'width':
      return { width: fitTo.value, height: Math.ceil((own.height * fitTo.value) / own.width) };
    case 'height':
      return { width: Math.ceil((own.width * fitTo.value) / own.height), height: fitTo.value };
    case 'zoom':
      return { width: Math.ceil(own.width * fitTo.value), height: Math.ceil(own.height * fitTo.value) };
    default:
      return { width: Math.ceil(own.width), height: Math.ceil(own.height) };
  }
}

function checkSize(own: { width: number; height: number }, p: Plan): void {
  if (!(own.width > 0 && own.height > 0)) {
    throw new RasterInputError(`SVG has no drawable size (${own.width}×${own.height})`);
  }
  const out = plannedSize(own, p.fitTo);
  if (out.width * out.height > p.maxPixels) {
    throw new RasterInputError(
      `Rendering would produce ${out.width}×${out.height} pixels, more than the limit of ${p.maxPixels}`,
    );
  }
}

function toImage(img: RenderedImage, p: Plan): RgbaImage {
  if (p.fitTo.mode === 'width' && img.width !== p.fitTo.value) {
    throw new Error(`Renderer produced width ${img.width}, asked for ${p.fitTo.value}`);
  }
  const pixels = img.pixels;
  return { width: img.width, height: img.height, rgba: pixels };
}

/**
 * The SVG's own size in pixels (user units of the root at 96 dpi), as the
 * renderer reads it. Parses without fonts, so text is not laid out.
 */
export function intrinsicSize(svgText: string): { width: number; height: number } {
  const { width, height } = prepareSvg(svgText);
  return { width, height };
}

function ownSize(preparedText: string): { width: number; height: number } {
  try {
    const r = new Resvg(preparedText, resvgOptions({ mode: 'original' }, undefined, false));
    return { width: r.width, height: r.height };
  } catch (err) {
    throw wrap(err);
  }
}

/** Renders SVG text to RGBA pixels on the calling thread. */
export function renderSvg(svgText: string, opts?: RenderOptions): RgbaImage {
  const text = prepareText(svgText);
  const p = plan(opts);
  assertOptionsHonoured();
  let r: Resvg;
  try {
    r = new Resvg(text, resvgOptions(p.fitTo, p.background));
  } catch (err) {
    throw wrap(err);
  }
  checkSize({ width: r.width, height: r.height }, p);
  let img: RenderedImage;
  try {
    img = r.render();
  } catch (err) {
    throw wrap(err);
  }
  return toImage(img, p);
}

/**
 * Renders SVG text (or a prepared SVG) to RGBA pixels on libuv's thread pool,
 * so two renders can run on two cores at once. Validation and the size check
 * run synchronously before the first await.
 */
export async function renderSvgAsync(svg: string | PreparedSvg, opts?: RenderOptions): Promise<RgbaImage> {
  const { text, own } = textOf(svg);
  const p = plan(opts);
  assertOptionsHonoured();
  checkSize(own ?? ownSize(text), p);
  let img: RenderedImage;
  try {
    img = await renderAsync(text, resvgOptions(p.fitTo, p.background));
  } catch (err) {
    throw wrap(err);
  }
  return toImage(img, p);
}

/** Renders SVG text to a PNG file's bytes. */
export function renderPng(svgText: string, opts?: RenderOptions): Buffer {
  const text = prepareText(svgText);
  const p = plan(opts);
  assertOptionsHonoured();
  try {
    const r = new Resvg(text, resvgOptions(p.fitTo, p.background));
    checkSize({ width: r.width, height: r.height }, p);
    return r.render().asPng();
  } catch (err) {
    throw wrap(err);
  }
}
