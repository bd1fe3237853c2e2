/**
 * Absolute path segments: what path data, basic shapes and polylines become.
 *
 * Every drawing segment carries its start point (x0, y0), so a segment can be
 * measured on its own. A list of segments is a sequence of subpaths, each
 * beginning with an `M`; a `Z` closes the current subpath with a straight
 * line back to its start (x, y of the `Z` is that start point).
 */
import type { ArcCenter } from './arc.js';

export interface MoveSegment {
  readonly type: 'M';
  readonly x: number;
  readonly y: number;
}

export interface LineSegment {
  readonly type: 'L';
  readonly x0: number;
  readonly y0: number;
  readonly x: number;
  readonly y: number;
}

export interface CubicSegment {
  readonly type: 'C';
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
  readonly x: number;
  readonly y: number;
}

export interface QuadSegment {
  readonly type: 'Q';
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
  readonly x: number;
  readonly y: number;
}

/**
 * An elliptical arc as written (endpoint parameterisation, with rx and ry
 * made non-negative) plus its centre parameterisation.
 */
export interface ArcSegment {
  readonly type: 'A';
  readonly x0: number;
  readonly y0: number;
  readonly rx: number;
  readonly ry: number;
  /** Degrees, as written. */
  readonly xAxisRotation: number;
  readonly largeArc: boolean;
  readonly sweep: boolean;
  readonly x: number;
  readonly y: number;
  readonly center: ArcCenter;
}

export interface CloseSegment {
  readonly type: 'Z';
  /** The point the closing line starts from. */
  readonly x0: number;
  readonly y0: number;
  /** The subpath's start point, where the closing line ends. */
  readonly x: number;
  readonly y: number;
}

export type DrawSegment = LineSegment | CubicSegment | QuadSegment | ArcSegment | CloseSegment;
export type Segment = MoveSegment | DrawSegment;
export type SegmentType = Segment['type'];
