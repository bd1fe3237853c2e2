/**
 * The Scene: every drawable thing of a document, flattened, in world
 * coordinates (the root element's user space), in paint order, each pointing
 * back at the element it came from. Everything after the reader consumes this.
 */
import type { Rgba } from '../color/types.js';
import type { Matrix } from './geometry/matrix.js';
import type { Segment } from './geometry/segments.js';
import type { XmlDocument, XmlElement } from './xml-tree.js';

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Where a finding should point: the element as written in the file. */
export interface SourceRef {
  id: string | null;
  line: number;
  column: number;
}

export interface GradientStop {
  offset: number;
  color: Rgba;
}

export interface Paint {
  kind: 'none' | 'color' | 'gradient' | 'pattern';
  /**
   * The colour drawn; for gradients the mean of the stops in CIELAB, for
   * patterns a representative colour when one can be found (else null).
   */
  color: Rgba | null;
  /** Effective opacity: paint opacity × element opacity × group opacities. */
  opacity: number;
  /** Referenced paint server id for gradients and patterns. */
  ref: string | null;
  stops: GradientStop[] | null;
}

export interface ItemBase {
  /** Position in paint order. */
  index: number;
  /** The element that draws this item (for `<use>` instances: the referenced shape). */
  element: XmlElement;
  /** The element a reader of the file should look at (for `<use>` instances: the `<use>`). */
  source: SourceRef;
  /** Matrix from the element's user space to world space. */
  matrix: Matrix;
  /** World bounding box of what is painted (strokes included for shapes). */
  bbox: Box;
  /** Clip rectangle in world space when a clip path applies (its bounds). */
  clip: Box | null;
  /** Filter reference (e.g. a drop shadow) applied to the item or a group around it. */
  filter: string | null;
  /** ids and classes of the item and its ancestors, innermost first (hints only). */
  hints: string[];
  /** Rule ids switched off for this item by `data-plumbline-ignore` on it or an ancestor. */
  ignore: string[];
}

export interface ShapeItem extends ItemBase {
  kind: 'shape';
  tag: string;
  /**
   * Path segments in the element's own user space (see `matrix`). Empty for
   * circles drawn under a translate/uniform scale: `circle` describes them exactly.
   */
  segments: Segment[];
  segmentsInWorld: boolean;
  /** Flattened outline in world coordinates: one flat [x0, y0, x1, y1, ...] array per subpath. */
  polylines: number[][];
  /** Whether each subpath is closed (explicit Z, or a closed basic shape). */
  closed: boolean[];
  fill: Paint;
  stroke: Paint;
  /** Stroke width in world units (scaled by the transform). */
  strokeWidth: number;
  dashed: boolean;
  /** Filled area in world units² (absolute, subpaths summed with their signs). */
  area: number;
  /** Outline length in world units. */
  length: number;
  /** The axis-aligned rectangle this shape is, if it is one (world). */
  rect: Box | null;
  /** The circle this shape is, if it is one (world). */
  circle: { cx: number; cy: number; r: number } | null;
}

export interface TextItem extends ItemBase {
  kind: 'text';
  content: string;
  /** Anchor point in world coordinates (x, baseline y). */
  x: number;
  y: number;
  anchor: 'start' | 'middle' | 'end';
  /** Rotation of the baseline in degrees (clockwise, as SVG's y points down). */
  rotation: number;
  /** Font size in world units. */
  fontSize: number;
  fontFamily: string[];
  fontWeight: number;
  fontStyle: string;
  /** `font-variant-numeric` asks for tabular figures. */
  tabularNums: boolean;
  fill: Paint;
  /** true when the text was drawn as glyph outlines and read back. */
  fromGlyphs: boolean;
  /** true when the requested font family was not available and metrics come from a substitute. */
  fontSubstituted: boolean;
  /** Advance width of the text in world units. */
  width: number;
}

export interface ImageItem extends ItemBase {
  kind: 'image';
  /** `data:` URI when embedded; external references are recorded, never loaded. */
  href: string;
  embedded: boolean;
  opacity: number;
}

export type SceneItem = ShapeItem | TextItem | ImageItem;

export interface Scene {
  document: XmlDocument;
  /** Root user space (viewBox) in world units. */
  viewBox: Box;
  /** Intended display size in CSS px (root width/height, else the viewBox size). */
  displayWidth: number;
  displayHeight: number;
  /** CSS px per world unit at the intended display size. */
  pxPerUnit: number;
  items: SceneItem[];
  /** Root `<title>` / `<desc>` / aria-label text, when present. */
  title: string | null;
  description: string | null;
  ariaLabel: string | null;
  /** Rule ids switched off for the whole file (`data-plumbline-ignore` on the root). */
  ignore: string[];
  /** Recoverable problems met while building (bad path data, unknown references...). */
  warnings: { message: string; line: number; column: number }[];
}
