/**
 * Basic shapes as path segments, following the equivalent paths of SVG 2
 * §10 (which agree with SVG 1.1 §9 on geometry): rect (with the rx/ry auto
 * and clamping rules), circle, ellipse, line, polyline and polygon.
 *
 * Inputs are numbers already resolved to user units. A zero size disables
 * rendering (no segments, no issue); a negative or non-finite size is an
 * error (no segments, with an issue).
 */
import { arcSegment } from './arc.js';
import type { Segment } from './segments.js';

export interface ShapeResult {
  segments: Segment[];
  /** Set when an input was invalid; the segments follow what the spec says to do then. */
  issue?: string;
}

export interface RectInput {
  x?: number;
  y?: number;
  width: number;
  height: number;
  /** undefined means auto (not specified). */
  rx?: number;
  ry?: number;
}

/** A usable radius: finite and ≥ 0. */
function validRadius(r: number | undefined): r is number {
  return r !== undefined && Number.isFinite(r) && r >= 0;
}

function sizeIssue(name: string, v: number): string | undefined {
  if (!Number.isFinite(v)) return `${name} is not a finite number`;
  if (v < 0) return `${name} is negative`;
  return undefined;
}

function push(out: Segment[], seg: Segment | null): void {
  if (seg !== null) out.push(seg);
}

/**
 * rx/ry rules (SVG 1.1 §9.2, SVG 2 §10.2): if only one of rx, ry is given
 * the other takes its value; neither gives square corners; then rx is
 * clamped to width/2 and ry to height/2. A negative or non-finite radius
 * counts as not given (and is reported).
 */
export function rectToPath(r: RectInput): ShapeResult {
  const x = r.x ?? 0;
  const y = r.y ?? 0;
  const { width: w, height: h } = r;
  const bad = sizeIssue('width', w) ?? sizeIssue('height', h) ?? (Number.isFinite(x) && Number.isFinite(y) ? undefined : 'x or y is not a finite number');
  if (bad !== undefined) return { segments: [], issue: bad };
  if (w === 0 || h === 0) return { segments: [] };

  let issue: string | undefined;
  if (r.rx !== undefined && !validRadius(r.rx)) issue = 'rx is negative or not finite; treated as auto';
  if (r.ry !== undefined && !validRadius(r.ry)) issue = 'ry is negative or not finite; treated as auto';
  const rxGiven = validRadius(r.rx) ? r.rx : undefined;
  const ryGiven = validRadius(r.ry) ? r.ry : undefined;
  let rx = rxGiven ?? ryGiven ?? 0;
  let ry = ryGiven ?? rxGiven ?? 0;
  if (rx > w / 2) rx = w / 2;
  if (ry > h / 2) ry = h / 2;

  const out: Segment[] = [];
  if (rx === 0 || ry === 0) {
    out.push({ type: 'M', x, y });
    out.push({ type: 'L', x0: x, y0: y, x: x + w, y });
    out.push({ type: 'L', x0: x + w, y0: y, x: x + w, y: y + h });
    out.push({ type: 'L', x0: x + w, y0: y + h, x, y: y + h });
    out.push({ type: 'Z', x0: x, y0: y + h, x, y });
  } else {
    const line = (x0: number, y0: number, x1: number, y1: number): void => {
      if (x0 !== x1 || y0 !== y1) out.push({ type: 'L', x0, y0, x: x1, y: y1 });
    };
    const arc = (x0: number, y0: number, x1: number, y1: number): void => {
      push(out, arcSegment(x0, y0, rx, ry, 0, false, true, x1, y1));
    };
    out.push({ type: 'M', x: x + rx, y });
    line(x + rx, y, x + w - rx, y);
    arc(x + w - rx, y, x + w, y + ry);
    line(x + w, y + ry, x + w, y + h - ry);
    arc(x + w, y + h - ry, x + w - rx, y + h);
    line(x + w - rx, y + h, x + rx, y + h);
    arc(x + rx, y + h, x, y + h - ry);
    line(x, y + h - ry, x, y + ry);
    arc(x, y + ry, x + rx, y);
    out.push({ type: 'Z', x0: x + rx, y0: y, x: x + rx, y });
  }
  return issue === undefined ? { segments: out } : { segments: out, issue };
}

export interface CircleInput {
  cx?: number;
  cy?: number;
  r: number;
}

/** Circle as four quarter arcs from (cx + r, cy) in the positive-angle direction (SVG 2 §10.3). */
export function circleToPath(input: CircleInput): ShapeResult {
  const { cx = 0, cy = 0, r } = input;
  const bad = sizeIssue('r', r) ?? (Number.isFinite(cx) && Number.isFinite(cy) ? undefined : 'cx or cy is not a finite number');
  if (bad !== undefined) return { segments: [], issue: bad };
  if (r === 0) return { segments: [] };
  return { segments: ellipseSegments(cx, cy, r, r) };
}

/**
 * Ellipse (SVG 2 §10.4). rx or ry undefined means auto: it takes the other
 * radius's value; both auto means nothing is drawn.
 */
export interface EllipseInput {
  cx?: number;
  cy?: number;
  /** undefined means auto. */
  rx?: number;
  ry?: number;
}

export function ellipseToPath(input: EllipseInput): ShapeResult {
  const { cx = 0, cy = 0, rx, ry } = input;
  if (!Number.isFinite(cx) || !Number.isFinite(cy)) return { segments: [], issue: 'cx or cy is not a finite number' };
  const rxUsed = rx ?? ry;
  const ryUsed = ry ?? rx;
  if (rxUsed === undefined || ryUsed === undefined) return { segments: [] };
  const bad = sizeIssue('rx', rxUsed) ?? sizeIssue('ry', ryUsed);
  if (bad !== undefined) return { segments: [], issue: bad };
  if (rxUsed === 0 || ryUsed === 0) return { segments: [] };
  return { segments: ellipseSegments(cx, cy, rxUsed, ryUsed) };
}

function ellipseSegments(cx: number, cy: number, rx: number, ry: number): Segment[] {
  const out: Segment[] = [{ type: 'M', x: cx + rx, y: cy }];
  push(out, arcSegment(cx + rx, cy, rx, ry, 0, false, true, cx, cy + ry));
  push(out, arcSegment(cx, cy + ry, rx, ry, 0, false, true, cx - rx, cy));
  push(out, arcSegment(cx - rx, cy, rx, ry, 0, false, true, cx, cy - ry));
  push(out, arcSegment(cx, cy - ry, rx, ry, 0, false, true, cx + rx, cy));
  out.push({ type: 'Z', x0: cx + rx, y0: cy, x: cx + rx, y: cy });
  return out;
}

export interface LineInput {
  x1?: number;
  y1?: number;
  x2?: number;
  y2?: number;
}

/** Missing coordinates default to 0, as for the attributes. */
export function lineToPath(input: LineInput): ShapeResult {
  const { x1 = 0, y1 = 0, x2 = 0, y2 = 0 } = input;
  if (![x1, y1, x2, y2].every(Number.isFinite)) return { segments: [], issue: 'line coordinates are not finite numbers' };
  return {
    segments: [
      { type: 'M', x: x1, y: y1 },
      { type: 'L', x0: x1, y0: y1, x: x2, y: y2 },
    ],
  };
}

/** Polyline through flat [x0, y0, x1, y1, …] (see parsePoints); an odd last value is ignored. */
export function polylineToPath(points: readonly number[]): ShapeResult {
  return pointsToPath(points, false);
}

/** Polygon: the polyline closed back to its first point. */
export function polygonToPath(points: readonly number[]): ShapeResult {
  return pointsToPath(points, true);
}

function pointsToPath(points: readonly number[], close: boolean): ShapeResult {
  const pairs = points.length >> 1;
  if (pairs === 0) return { segments: [] };
  for (let k = 0; k < pairs * 2; k++) {
    if (!Number.isFinite(points[k])) return { segments: [], issue: 'points contain a non-finite number' };
  }
  const out: Segment[] = new Array<Segment>(pairs + (close ? 1 : 0));
  let px = points[0];
  let py = points[1];
  out[0] = { type: 'M', x: px, y: py };
  for (let k = 1; k < pairs; k++) {
    const x = points[2 * k];
    const y = points[2 * k + 1];
    out[k] = { type: 'L', x0: px, y0: py, x, y };
    px = x;
    py = y;
  }
  if (close) out[pairs] = { type: 'Z', x0: px, y0: py, x: points[0], y: points[1] };
  const issue = points.length % 2 === 1 ? 'points has an odd number of coordinates; the last one is ignored' : undefined;
  return issue === undefined ? { segments: out } : { segments: out, issue };
}
