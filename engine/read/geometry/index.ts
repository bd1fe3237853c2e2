/**
 * Pure geometry for reading SVG: matrices, transform lists, lengths,
 * viewBox mapping, path data and basic shapes as absolute segments, and
 * measurements of those segments.
 */
export {
  type Matrix,
  type Point,
  type Decomposition,
  identity,
  multiply,
  applyToPoint,
  applyToVector,
  determinant,
  invert,
  decompose,
  isFiniteMatrix,
  isIdentity,
  translation,
  scaling,
  rotation,
  skewingX,
  skewingY,
  cosSinDegrees,
} from './matrix.js';
export type { ParseError } from './parse-error.js';
export { parseTransform, type TransformParseResult } from './parse-transform.js';
export {
  type Length,
  type LengthUnit,
  type LengthContext,
  type LengthParseResult,
  type ResolvedLength,
  PX_PER_UNIT,
  DEFAULT_FONT_SIZE,
  parseLength,
  lengthToPx,
  resolveLength,
  percentReference,
} from './parse-length.js';
export {
  type ViewBox,
  type ViewBoxParseResult,
  type Align,
  type PreserveAspectRatio,
  type PreserveAspectRatioParseResult,
  type Viewport,
  DEFAULT_PRESERVE_ASPECT_RATIO,
  parseViewBox,
  parsePreserveAspectRatio,
  viewBoxToViewport,
} from './viewbox.js';
export type {
  Segment,
  SegmentType,
  DrawSegment,
  MoveSegment,
  LineSegment,
  CubicSegment,
  QuadSegment,
  ArcSegment,
  CloseSegment,
} from './segments.js';
export { type ArcCenter, type AffineArc, arcCenter, arcSegment, arcPointAt, affineArc } from './arc.js';
export { parsePath, type PathParseResult } from './parse-path.js';
export { parsePoints, type PointsParseResult } from './parse-points.js';
export {
  type ShapeResult,
  type RectInput,
  type CircleInput,
  type EllipseInput,
  type LineInput,
  rectToPath,
  circleToPath,
  ellipseToPath,
  lineToPath,
  polylineToPath,
  polygonToPath,
} from './shape-to-path.js';
export { type BBox, pathBBox, pathLength, pathArea, flatten } from './measure-path.js';
export { type FlattenResult, flattenSegments, MAX_PIECES_PER_SEGMENT } from './flatten.js';
export { transformSegments, ellipseOfMatrix } from './transform-segments.js';
