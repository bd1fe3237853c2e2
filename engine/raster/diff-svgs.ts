/**
 * Visual difference between two SVG texts: render both at one width with the
 * bundled fonts, compare the pixels, optionally build the three-panel picture.
 */
import { createHash } from 'node:crypto';
import { compositePng, type CompositeOptions } from './composite.js';
import { diffImages, type DiffRegion, type PixelDiffOptions } from './diff-pixels.js';
import { RasterInputError } from './errors.js';
import { prepareSvg, renderSvgAsync } from './render.js';

export interface SvgDiffOptions extends PixelDiffOptions {
  /** Render width in pixels for both; default the `before` SVG's own width, capped at `maxWidth`. */
  width?: number;
  /** Cap for the default width; default 1000. */
  maxWidth?: number;
  /** CSS colour painted under both drawings; default white (as a browser page shows them). */
  background?: string;
  /** Also build the before | after | difference PNG; default false. */
  composite?: boolean | CompositeOptions;
  /** Largest render accepted per SVG, in pixels; default the renderer's limit. */
  maxPixels?: number;
}

/** Byte-identical texts: nothing was rendered, so there is no size. */
export interface IdenticalSvgs {
  identical: true;
  width: null;
  height: null;
  changedPixels: 0;
  changedShare: 0;
  regions: DiffRegion[];
  compositePng?: undefined;
}

export interface DifferentSvgs {
  identical: false;
  /** Size the two renders were compared at (larger height when the aspect ratios differ). */
  width: number;
  height: number;
  changedPixels: number;
  changedShare: number;
  regions: DiffRegion[];
  compositePng?: Buffer;
}

export type SvgDiffResult = IdenticalSvgs | DifferentSvgs;

export const DEFAULT_MAX_WIDTH = 1000;

function sha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/**
 * Compares two SVG texts. Texts with the same SHA-256 return at once without
 * rendering. Otherwise both are rendered at the same width (in parallel on the
 * thread pool); when their aspect ratios differ the shorter render is padded
 * at the bottom with transparent pixels, which then count as changed.
 */
export async function diffSvgTexts(before: string, after: string, opts?: SvgDiffOptions): Promise<SvgDiffResult> {
  if (typeof before !== 'string' || typeof after !== 'string') {
    throw new RasterInputError('diffSvgTexts needs two SVG texts');
  }
  const o = opts ?? {};
  if (sha256(before) === sha256(after)) {
    return { identical: true, width: null, height: null, changedPixels: 0, changedShare: 0, regions: [] };
  }
  const maxWidth = o.maxWidth ?? DEFAULT_MAX_WIDTH;
  if (!Number.isInteger(maxWidth) || maxWidth < 1) {
    throw new RasterInputError(`maxWidth must be a whole number ≥ 1, got ${String(maxWidth)}`);
  }
  const preparedBefore = prepareSvg(before);
  let width = o.width;
  if (width === undefined) {
    width = Math.min(maxWidth, Math.max(1, Math.ceil(preparedBefore.width)));
  } else if (!Number.isInteger(width) || width < 1) {
    throw new RasterInputError(`width must be a whole number ≥ 1, got ${String(width)}`);
  }
  const renderOpts = { width, background: o.background ?? 'white', maxPixels: o.maxPixels };
  // The first render starts on the thread pool before the second text is prepared.
  const renderingBefore = renderSvgAsync(preparedBefore, renderOpts);
  const renderingAfter = renderSvgAsync(after, renderOpts);
  const [a, b] = await Promise.all([renderingBefore, renderingAfter]);
  const diff = diffImages(a, b, o);
  const result: DifferentSvgs = {
    identical: false,
    width: diff.width,
    height: diff.height,
    changedPixels: diff.changedPixels,
    changedShare: diff.changedShare,
    regions: diff.regions,
  };
  if (o.composite) {
    const compositeOpts: CompositeOptions = typeof o.composite === 'object' ? o.composite : {};
    result.compositePng = compositePng(a, b, diff, { highlight: o.highlight, ...compositeOpts });
  }
  return result;
}
