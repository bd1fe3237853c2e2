/**
 * truth.3d-projection: side walls and extrusion faces (decoration/3d-face,
 * pie walls, bar extrusions) are removed; a tilted pie is redrawn flat: every
 * wedge gets new geometry on one circle (centred on the tilted ellipse's
 * centre, with the ellipse's area) whose angles are the wedges' true shares,
 * in the drawn order, starting where the first wedge starts. Pulled-out
 * wedges stay pulled out by the same share of the radius.
 */
import { invert } from '../../read/geometry/matrix.js';
import { setAttribute, type Edit } from '../edit-list.js';
import { emptyOutcome, removeItem, setItemProperty, useOf, type Fix } from '../fix-context.js';
import { wedgePathData, wedgePoints, type FlatWedge } from '../wedge-path.js';

export const fixThreeDProjection: Fix = (ctx) => {
  const out = emptyOutcome();
  const { chart, scene } = ctx.analysis;
  const doc = ctx.analysis.doc;

  // Bars drawn in a 3D projection (their front faces are not upright rectangles) stay 3D
  // after their side faces go: flattening them needs a re-projection this fix does not do.
  const bars = ctx.measures.projection.bars;
  const barsProjected = !chart.pie && bars !== null && bars.bars.some((i) => {
    const it = scene.items[i];
    return !it || it.kind !== 'shape' || it.rect === null;
  });
  if (barsProjected) {
    out.notes.push('the bars themselves are drawn in a 3D projection; removing their side faces would not make them flat, so they are left as drawn');
    return out;
  }

  // Faces that carry no value.
  const faces = new Set<number>();
  scene.items.forEach((_, i) => {
    if (chart.roles[i]?.sub === 'decoration/3d-face') faces.add(i);
  });
  for (const i of chart.pie?.walls ?? []) faces.add(i);
  for (const w of chart.pie?.wedges ?? []) for (const i of w.walls) faces.add(i);
  for (const i of chart.extrusions) faces.add(i);
  let kept = 0;
  for (const i of [...faces].sort((a, b) => a - b)) {
    const e = removeItem(ctx, i, faces);
    const edits = e ? [e] : setItemProperty(ctx, i, 'display', 'none', faces);
    if (!edits) {
      kept++;
      continue;
    }
    out.edits.push(...edits);
    out.count++;
  }
  if (kept > 0) out.notes.push(`${kept} 3D face(s) kept: their element also draws something else`);

  // A tilted pie: flat wedges at the true angles.
  const pie = chart.pie;
  if (pie && pie.ellipse && pie.wedges.length > 0 && pie.shareBasis === 'angle') {
    const e = pie.ellipse;
    const r = Math.sqrt(e.rx * e.ry);
    const scaleR = pie.radius > 0 ? r / pie.radius : 1;
    const inner = pie.innerRadius * scaleR;
    const wedges = [...pie.wedges].sort((a, b) => a.start - b.start);
    const total = wedges.reduce((s, w) => s + w.share, 0);
    if (!(total > 0)) {
      out.notes.push('pie shares do not add up to a positive whole; wedges left as drawn');
      return out;
    }
    let angle = wedges[0]!.start;
    const planned: { item: number; edit: Edit; share: number }[] = [];
    for (const w of wedges) {
      const span = (2 * Math.PI * w.share) / total;
      const mid = angle + span / 2;
      const off = w.offset * scaleR;
      const flat: FlatWedge = {
        cx: e.cx + off * Math.sin(mid),
        cy: e.cy - off * Math.cos(mid),
        outer: r,
        inner,
        start: angle,
        end: angle + span,
      };
      angle += span;
      const it = scene.items[w.item];
      if (!it || it.kind !== 'shape' || useOf(ctx, w.item)) {
        out.notes.push('a wedge is not a plain shape element; the pie is left tilted');
        return out;
      }
      const inv = invert(it.matrix);
      if (!inv) {
        out.notes.push('a wedge has a singular transform; the pie is left tilted');
        return out;
      }
      const el = it.element;
      let edit: Edit;
      if (el.name === 'path') edit = setAttribute(doc, el, 'd', wedgePathData(flat, inv));
      else if (el.name === 'polygon') edit = setAttribute(doc, el, 'points', wedgePoints(flat, inv));
      else {
        out.notes.push(`a wedge is a <${el.name}>; the pie is left tilted`);
        return out;
      }
      planned.push({ item: w.item, edit, share: w.share / total });
    }
    for (const p of planned) {
      out.edits.push(p.edit);
      out.reprojected.push({ item: p.item, share: p.share });
      out.count++;
    }
    out.notes.push('wedge labels stay where they were drawn; check their placement');
  }
  return out;
};
