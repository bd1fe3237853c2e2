/**
 * Pixel comparison of two RGBA images with pixelmatch (perceptual colour
 * distance in YIQ, anti-aliased pixels recognised and not counted), plus the
 * rectangles that enclose the changed pixels.
 */
import pixelmatch from 'pixelmatch';
import { RasterInputError } from './errors.js';
import type { RgbaImage } from './render.js';

export type Rgb = [number, number, number];

/** A rectangle of changed pixels, in pixel coordinates of the compared images. */
export interface DiffRegion {
  x: number;
  y: number;
  width: number;
  height: number;
  /** Changed pixels inside this region. */
  changedPixels: number;
}

export interface PixelDiffOptions {
  /** Colour distance below which two pixels count as equal, 0..1; default 0.1 (pixelmatch's own default). */
  threshold?: number;
  /** Count differences in anti-aliased edge pixels too; default false. */
  includeAntialiasing?: boolean;
  /**
   * Region merge distance in pixels; default 8. Changed pixels closer than
   * this (in both x and y) always end up in one region; pixels up to twice
   * this far apart may.
   */
  regionGap?: number;
  /** Colour of changed pixels in `diffRgba`; default a strong magenta-red. */
  highlight?: Rgb;
}

export interface PixelDiff {
  /** Size both images were compared at (the larger of each dimension). */
  width: number;
  height: number;
  changedPixels: number;
  /** changedPixels / (width × height), 0..1. */
  changedShare: number;
  /** Largest first (by changed pixels), ties top-to-bottom then left-to-right. */
  regions: DiffRegion[];
  /** Transparent except the changed pixels, which carry `highlight` at full opacity. */
  diffRgba: Uint8Array;
}

export const DEFAULT_HIGHLIGHT: Rgb = [230, 0, 110];
export const DEFAULT_REGION_GAP = 8;

function checkImage(img: RgbaImage, name: string): void {
  if (img === null || typeof img !== 'object') throw new RasterInputError(`${name} is not an image`);
  const { width, height, rgba } = img;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width <= 0 || height <= 0) {
    throw new RasterInputError(`${name} has an invalid size ${String(width)}×${String(height)}`);
  }
  if (!(rgba instanceof Uint8Array) || rgba.length !== width * height * 4) {
    throw new RasterInputError(
      `${name} pixel data has ${rgba instanceof Uint8Array ? rgba.length : 'no'} bytes; ${width}×${height} RGBA needs ${width * height * 4}`,
    );
  }
}

/**
 * Returns the image at `width`×`height`, anchored at the top-left corner; the
 * added area is transparent black (0,0,0,0). Returns the input itself when it
 * already has that size and its data is 4-byte aligned.
 */
export function padImage(img: RgbaImage, width: number, height: number): RgbaImage {
  if (width < img.width || height < img.height) {
    throw new RasterInputError(`Cannot pad ${img.width}×${img.height} down to ${width}×${height}`);
  }
  if (width === img.width && height === img.height && img.rgba.byteOffset % 4 === 0) return img;
  const out = new Uint8Array(width * height * 4);
  const rowBytes = img.width * 4;
  for (let y = 0; y < img.height; y++) {
    out.set(img.rgba.subarray(y * rowBytes, (y + 1) * rowBytes), y * width * 4);
  }
  return { width, height, rgba: out };
}

function rgbOption(c: Rgb | undefined, fallback: Rgb): Rgb {
  if (c === undefined) return fallback;
  if (!Array.isArray(c) || c.length !== 3 || c.some((v) => !Number.isInteger(v) || v < 0 || v > 255)) {
    throw new RasterInputError('highlight must be three integers 0..255');
  }
  return [c[0], c[1], c[2]];
}

/**
 * Compares two images. When their sizes differ, both are padded to the larger
 * width and the larger height (top-left anchored, transparent padding); every
 * pixel that only one image covers counts as changed unless it is fully
 * transparent, so a change of size shows up along the right or bottom edge.
 */
export function diffImages(a: RgbaImage, b: RgbaImage, opts?: PixelDiffOptions): PixelDiff {
  checkImage(a, 'first image');
  checkImage(b, 'second image');
  const o = opts ?? {};
  const threshold = o.threshold ?? 0.1;
  if (typeof threshold !== 'number' || !(threshold >= 0 && threshold <= 1)) {
    throw new RasterInputError(`threshold must be between 0 and 1, got ${String(threshold)}`);
  }
  const gap = o.regionGap ?? DEFAULT_REGION_GAP;
  if (typeof gap !== 'number' || !Number.isFinite(gap) || gap < 1) {
    throw new RasterInputError(`regionGap must be a number ≥ 1, got ${String(gap)}`);
  }
  const highlight = rgbOption(o.highlight, DEFAULT_HIGHLIGHT);
  const width = Math.max(a.width, b.width);
  const height = Math.max(a.height, b.height);
  const pa = padImage(a, width, height);
  const pb = padImage(b, width, height);
  const diffRgba = new Uint8Array(width * height * 4);
  const matched = pixelmatch(pa.rgba, pb.rgba, diffRgba, width, height, {
    threshold,
    includeAA: o.includeAntialiasing === true,
    diffMask: true,
    diffColor: highlight,
    diffColorAlt: highlight,
  });
  const changedPixels =
    matched + (a.width === b.width && a.height === b.height ? 0 : markUncovered(a, b, diffRgba, highlight));
  const regions = changedPixels === 0 ? [] : findRegions(diffRgba, width, height, gap);
  return {
    width,
    height,
    changedPixels,
    changedShare: changedPixels / (width * height),
    regions,
    diffRgba,
  };
}

/**
 * Where only one image has pixels (the other was padded), a pixel counts as
 * changed unless it is fully transparent. pixelmatch blends transparency with
 * a dark backdrop, so without this pass a dark pixel next to padding could go
 * unnoticed. Marks those pixels in `mask` and returns how many it added.
 */
function markUncovered(a: RgbaImage, b: RgbaImage, mask: Uint8Array, highlight: Rgb): number {
  const width = Math.max(a.width, b.width);
  const height = Math.max(a.height, b.height);
  let added = 0;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const inA = x < a.width && y < a.height;
      const inB = x < b.width && y < b.height;
      if (inA === inB) {
        // Both cover it (pixelmatch judged it) or neither does (nothing to compare).
        if (inA) x = Math.min(a.width, b.width) - 1;
        continue;
      }
      const img = inA ? a : b;
      if (img.rgba[(y * img.width + x) * 4 + 3] === 0) continue;
      const m = (y * width + x) * 4;
      if (mask[m + 3] !== 0) continue;
      mask[m] = highlight[0];
      mask[m + 1] = highlight[1];
      mask[m + 2] = highlight[2];
      mask[m + 3] = 255;
      added++;
    }
  }
  return added;
}

/**
 * Groups the pixels whose alpha is non-zero into rectangles. The image is cut
 * into square cells of side `gap`; cells holding a changed pixel are joined
 * with their eight neighbours, and each group's rectangle is the tight bounds
 * of its changed pixels. Linear in the number of pixels.
 */
export function findRegions(mask: Uint8Array, width: number, height: number, gap: number): DiffRegion[] {
  if (mask.length !== width * height * 4) {
    throw new RasterInputError('mask size does not match width × height × 4');
  }
  const g = Math.max(1, Math.round(gap));
  const cols = Math.ceil(width / g);
  const rows = Math.ceil(height / g);
  const cells = cols * rows;
  const count = new Uint32Array(cells);
  const minX = new Int32Array(cells);
  const minY = new Int32Array(cells);
  const maxX = new Int32Array(cells);
  const maxY = new Int32Array(cells);
  for (let y = 0; y < height; y++) {
    const rowCell = ((y / g) | 0) * cols;
    let p = y * width * 4 + 3;
    for (let x = 0; x < width; x++, p += 4) {
      if (mask[p] === 0) continue;
      const c = rowCell + ((x / g) | 0);
      if (count[c] === 0) {
        minX[c] = maxX[c] = x;
        minY[c] = maxY[c] = y;
      } else {
        if (x < minX[c]) minX[c] = x;
        if (x > maxX[c]) maxX[c] = x;
        if (y > maxY[c]) maxY[c] = y;
      }
      count[c]++;
    }
  }

  const seen = new Uint8Array(cells);
  const stack = new Int32Array(cells);
  const regions: DiffRegion[] = [];
  for (let start = 0; start < cells; start++) {
    if (count[start] === 0 || seen[start] === 1) continue;
    let top = 0;
    stack[top++] = start;
    seen[start] = 1;
    let x0 = Infinity;
    let y0 = Infinity;
    let x1 = -1;
    let y1 = -1;
    let n = 0;
    while (top > 0) {
      const c = stack[--top];
      n += count[c];
      if (minX[c] < x0) x0 = minX[c];
      if (minY[c] < y0) y0 = minY[c];
      if (maxX[c] > x1) x1 = maxX[c];
      if (maxY[c] > y1) y1 = maxY[c];
      const cx = c % cols;
      const cy = (c - cx) / cols;
      for (let dy = -1; dy <= 1; dy++) {
        const ny = cy + dy;
        if (ny < 0 || ny >= rows) continue;
        for (let dx = -1; dx <= 1; dx++) {
          const nx = cx + dx;
          if (nx < 0 || nx >= cols) continue;
          const nc = ny * cols + nx;
          if (count[nc] !== 0 && seen[nc] === 0) {
            seen[nc] = 1;
            stack[top++] = nc;
          }
        }
      }
    }
    regions.push({ x: x0, y: y0, width: x1 - x0 + 1, height: y1 - y0 + 1, changedPixels: n });
  }
  regions.sort((p, q) => q.changedPixels - p.changedPixels || p.y - q.y || p.x - q.x);
  return regions;
}
