/** Scene items built from path data (parsed and flattened by the reader's geometry code), for pie tests. */
import { flattenSegments } from '../../engine/read/geometry/flatten.js';
import { parsePath } from '../../engine/read/geometry/parse-path.js';
import { parseXml } from '../../engine/read/parse-xml.js';
import type { Paint, ShapeItem } from '../../engine/read/scene.js';

const element = parseXml('<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0"/></svg>').root;

export const NO_PAINT: Paint = { kind: 'none', color: null, opacity: 0, ref: null, stops: null };

let nextIndex = 0;

/** A fresh paint-order index shared by every item these helpers build. */
export function takeIndex(): number {
  return nextIndex++;
}

export interface PathShapeOptions {
  fill: Paint;
  stroke?: Paint;
  strokeWidth?: number;
  filter?: string | null;
}

export function shapeFromPath(d: string, opts: PathShapeOptions): ShapeItem {
  const { segments } = parsePath(d);
  const flat = flattenSegments(segments, 0.2);
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  let area = 0;
  for (const p of flat.polylines) {
    const n = p.length / 2;
    let a = 0;
    for (let i = 0; i < n; i++) {
      const j = (i + 1) % n;
      a += p[2 * i]! * p[2 * j + 1]! - p[2 * j]! * p[2 * i + 1]!;
      x0 = Math.min(x0, p[2 * i]!);
      x1 = Math.max(x1, p[2 * i]!);
      y0 = Math.min(y0, p[2 * i + 1]!);
      y1 = Math.max(y1, p[2 * i + 1]!);
    }
    area += a / 2;
  }
  return {
    kind: 'shape',
    index: nextIndex++,
    element,
    source: { id: null, line: 1, column: 1 },
    matrix: [1, 0, 0, 1, 0, 0],
    bbox: { x: x0, y: y0, width: x1 - x0, height: y1 - y0 },
    clip: null,
    filter: opts.filter ?? null,
    hints: [],
    ignore: [],
    tag: 'path',
    segments,
    segmentsInWorld: true,
    polylines: flat.polylines,
    closed: flat.closed,
    fill: opts.fill,
    stroke: opts.stroke ?? NO_PAINT,
    strokeWidth: opts.strokeWidth ?? 0,
    dashed: false,
    area: Math.abs(area),
    length: 0,
    rect: null,
    circle: null,
  };
}
