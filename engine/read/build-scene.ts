/**
 * Document tree → Scene: resolves styles, composes transforms, expands
 * `<use>`, resolves paint servers and clip bounds, converts every shape to
 * world-space geometry and measures text with the bundled fonts.
 */
import type { Rgba } from '../color/types.js';
import { applyToPoint, identity, isFiniteMatrix, multiply, translation, type Matrix } from './geometry/matrix.js';
import { parseTransform } from './geometry/parse-transform.js';
import { parseLength, lengthToPx } from './geometry/parse-length.js';
import { parsePath } from './geometry/parse-path.js';
import { parsePoints } from './geometry/parse-points.js';
import { circleToPath, ellipseToPath, lineToPath, polygonToPath, polylineToPath, rectToPath } from './geometry/shape-to-path.js';
import { parseViewBox, parsePreserveAspectRatio, viewBoxToViewport } from './geometry/viewbox.js';
import type { Segment } from './geometry/segments.js';
import { flattenSegments } from './geometry/flatten.js';
import { buildCascade, computeStyle, type Cascade, type ComputedStyle } from './style/index.js';
import { measureText } from './fonts/measure-text.js';
import { readGlyphRun } from './fonts/read-glyph-run.js';
import { NO_PAINT, parseColor, parseUrlReference, resolvePaint, type PaintContext } from './paint.js';
import type { Box, ImageItem, ItemBase, Paint, Scene, SceneItem, ShapeItem, SourceRef, TextItem } from './scene.js';
import type { XmlDocument, XmlElement } from './xml-tree.js';
import { walkElements } from './parse-xml.js';

export interface SceneOptions {
  /** Most items a scene may hold (defends against `<use>` fan-out). */
  maxItems?: number;
  /** Deepest `<use>` nesting followed. */
  maxUseDepth?: number;
  /** Flattening tolerance in world units. */
  tolerance?: number;
}

const SKIP = new Set([
  'defs', 'clipPath', 'mask', 'marker', 'pattern', 'linearGradient', 'radialGradient', 'symbol', 'filter',
  'style', 'title', 'desc', 'metadata', 'script', 'foreignObject', 'font', 'font-face', 'cursor', 'view',
]);
const SHAPES = new Set(['rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon', 'path']);

interface Context {
  matrix: Matrix;
  style: ComputedStyle | null;
  opacity: number;
  clip: Box | null;
  filter: string | null;
  hints: string[];
  ignore: string[];
  useDepth: number;
  useChain: XmlElement[];
  /** The `<use>` that instantiated this subtree, for source references. */
  useSource: XmlElement | null;
}

export function buildScene(doc: XmlDocument, options: SceneOptions = {}): Scene {
  const maxItems = options.maxItems ?? 1_000_000;
  const maxUseDepth = options.maxUseDepth ?? 16;
  const root = doc.root;
  if (root.name !== 'svg') {
    throw Object.assign(new Error(`root element is <${root.name}>, not <svg>`), { line: root.line, column: root.column });
  }
  const warnings: Scene['warnings'] = [];
  const warn = (message: string, el: XmlElement): void => {
    if (warnings.length < 200) warnings.push({ message, line: el.line, column: el.column });
  };

  const byId = new Map<string, XmlElement>();
  for (const el of walkElements(root)) {
    const id = el.attribute('id');
    if (id !== undefined && !byId.has(id)) byId.set(id, el);
  }
  const cascade: Cascade = buildCascade(doc);
  const styleOf = (el: XmlElement, parent: ComputedStyle | null): ComputedStyle => computeStyle(cascade.declared(el), parent, { viewport: { width: viewBoxGuess.width, height: viewBoxGuess.height } });

  // Root viewport and user space.
  const viewBoxGuess = { width: 300, height: 150 };
  const rootStyle = styleOf(root, null);
  const vbParsed = root.attributes.viewBox !== undefined ? parseViewBox(root.attributes.viewBox) : null;
  if (vbParsed?.error) warn(`viewBox: ${vbParsed.error.message}`, root);
  const vb = vbParsed?.viewBox ?? null;
  const widthPx = rootLength(root.attributes.width, vb?.width);
  const heightPx = rootLength(root.attributes.height, vb?.height);
  const viewBox: Box = vb
    ? { x: vb.x, y: vb.y, width: vb.width, height: vb.height }
    : { x: 0, y: 0, width: widthPx ?? 300, height: heightPx ?? 150 };
  const displayWidth = widthPx ?? (heightPx !== null ? (heightPx * viewBox.width) / viewBox.height : viewBox.width);
  const displayHeight = heightPx ?? (widthPx !== null ? (widthPx * viewBox.height) / viewBox.width : viewBox.height);
  const pxPerUnit = Math.min(displayWidth / viewBox.width, displayHeight / viewBox.height);
  viewBoxGuess.width = viewBox.width;
  viewBoxGuess.height = viewBox.height;
  const tolerance = options.tolerance ?? Math.max(0.05, Math.min(viewBox.width, viewBox.height) / 2000);

  const items: SceneItem[] = [];
  const paintCtx = (style: ComputedStyle): PaintContext => ({
    byId,
    stopColor: (stop) => {
      const s = styleOf(stop, style);
      const c = s.stopColor === 'currentColor' ? parseColor(s.color) : parseColor(s.stopColor);
      return c ? { ...c, alpha: c.alpha * s.stopOpacity } : null;
    },
    currentColor: parseColor(style.color),
  });

  /** The fields every item shares: where it sits in paint order and in the file, and what applies to it. */
  const baseOf = (el: XmlElement, ctx: Context, matrix: Matrix, bbox: Box): ItemBase => ({
    index: items.length,
    element: el,
    source: sourceOf(el, ctx),
    matrix,
    bbox,
    clip: ctx.clip,
    filter: ctx.filter,
    hints: ctx.hints,
    ignore: ctx.ignore,
  });

  const sourceOf = (el: XmlElement, ctx: Context): SourceRef => {
    const s = ctx.useSource ?? el;
    return { id: s.attribute('id') ?? null, line: s.line, column: s.column };
  };

  const clipBoxOf = (el: XmlElement, style: ComputedStyle, matrix: Matrix, inherited: Box | null): Box | null => {
    const ref = style.clipPath ? parseUrlReference(style.clipPath) : null;
    if (!ref) return inherited;
    const cp = byId.get(ref.id);
    if (!cp || cp.name !== 'clipPath') return inherited;
    const cpTransform = cp.attributes.transform ? parseTransform(cp.attributes.transform).matrix : identity;
    const m = multiply(matrix, cpTransform);
    let box: Box | null = null;
    for (const c of cp.children) {
      if (c.type !== 'element' || !SHAPES.has(c.name)) continue;
      const segs = shapeSegments(c, style, viewBox, warn);
      const local = c.attributes.transform ? parseTransform(c.attributes.transform).matrix : identity;
      const b = boundsOfFlat(flattenSegments(segs, tolerance, multiply(m, local)).polylines);
      if (b) box = box ? union(box, b) : b;
    }
    if (!box) return inherited;
    if (cp.attributes.clipPathUnits === 'objectBoundingBox') return inherited; // bounds need the element box; keep the inherited clip
    return inherited ? intersect(inherited, box) : box;
  };

  // Class-only hint lists repeat across thousands of marks: share them.
  const hintCache = new WeakMap<string[], Map<string, string[]>>();
  const hintsFor = (id: string | undefined, cls: string | undefined, parent: string[]): string[] => {
    const make = (): string[] => [...(id ? [`#${id}`] : []), ...(cls ? cls.split(/\s+/).filter(Boolean).map((c) => `.${c}`) : []), ...parent];
    if (id) return make();
    let m = hintCache.get(parent);
    if (!m) hintCache.set(parent, (m = new Map()));
    let h = m.get(cls!);
    if (!h) m.set(cls!, (h = make()));
    return h;
  };

  const walk = (el: XmlElement, ctx: Context): void => {
    if (items.length >= maxItems) return;
    if (SKIP.has(el.name)) return;
    const style = styleOf(el, ctx.style);
    if (style.display === 'none') return;

    let matrix = ctx.matrix;
    const t = el.attributes.transform;
    if (t !== undefined) {
      const parsed = parseTransform(t);
      if (parsed.error) warn(`transform: ${parsed.error.message}`, el);
      matrix = multiply(matrix, parsed.matrix);
    }
    if (!isFiniteMatrix(matrix)) {
      warn('transform is not finite; element skipped', el);
      return;
    }
    const id = el.attribute('id');
    const cls = el.attribute('class');
    const hints = id || cls ? hintsFor(id, cls, ctx.hints) : ctx.hints;
    const ignoreAttr = el.attribute('data-plumbline-ignore');
    const ignore = ignoreAttr ? [...ctx.ignore, ...ignoreAttr.split(',').map((s) => s.trim()).filter(Boolean)] : ctx.ignore;
    const opacity = ctx.opacity * style.opacity;
    const clip = clipBoxOf(el, style, matrix, ctx.clip);
    const filter = style.filter && style.filter !== 'none' ? style.filter : ctx.filter;
    const here: Context = { ...ctx, matrix, style, opacity, clip, filter, hints, ignore };

    switch (el.name) {
      case 'svg': {
        if (el === root) break;
        const x = num(el.attributes.x, 0);
        const y = num(el.attributes.y, 0);
        const w = rootLength(el.attributes.width, undefined) ?? viewBox.width;
        const h = rootLength(el.attributes.height, undefined) ?? viewBox.height;
        const nvb = el.attributes.viewBox ? parseViewBox(el.attributes.viewBox).viewBox : null;
        const par = parsePreserveAspectRatio(el.attributes.preserveAspectRatio ?? '').value;
        here.matrix = multiply(matrix, nvb ? viewBoxToViewport(nvb, { x, y, width: w, height: h }, par) : translation(x, y));
        break;
      }
      case 'use': {
        const href = el.attributes.href ?? el.attributes['xlink:href'];
        const target = href?.startsWith('#') ? byId.get(href.slice(1)) : undefined;
        if (!target) {
          if (href) warn(`<use> reference ${href} not found in this file (external references are not loaded)`, el);
          return;
        }
        if (ctx.useChain.includes(target) || target === el || isAncestor(target, el)) {
          warn(`<use> reference ${href} is circular`, el);
          return;
        }
        if (ctx.useDepth >= maxUseDepth) {
          warn(`<use> nesting deeper than ${maxUseDepth}`, el);
          return;
        }
        const ux = num(el.attributes.x, 0);
        const uy = num(el.attributes.y, 0);
        let m = multiply(matrix, translation(ux, uy));
        const inner: Context = {
          ...here,
          matrix: m,
          useDepth: ctx.useDepth + 1,
          useChain: [...ctx.useChain, target],
          useSource: ctx.useSource ?? el,
        };
        if (target.name === 'symbol' || target.name === 'svg') {
          const w = num(el.attributes.width, num(target.attributes.width, viewBox.width));
          const h = num(el.attributes.height, num(target.attributes.height, viewBox.height));
          const svb = target.attributes.viewBox ? parseViewBox(target.attributes.viewBox).viewBox : null;
          if (svb) m = multiply(m, viewBoxToViewport(svb, { width: w, height: h }, parsePreserveAspectRatio(target.attributes.preserveAspectRatio ?? '').value));
          const symStyle = styleOf(target, style);
          for (const c of target.children) if (c.type === 'element') walk(c, { ...inner, matrix: m, style: symStyle });
          return;
        }
        walkInstance(target, inner);
        return;
      }
      case 'text':
        if (style.visibility !== 'hidden') pushText(el, here);
        return;
      case 'image':
        if (style.visibility !== 'hidden') pushImage(el, here);
        return;
      default:
        if (SHAPES.has(el.name)) {
          if (style.visibility !== 'hidden') pushShape(el, here);
          return;
        }
    }
    if (el.name === 'g' && tryGlyphRunGroup(el, here)) return;
    for (const c of el.children) if (c.type === 'element') walk(c, here);
  };

  /** A `<use>` target drawn as if it stood in place of the `<use>`: its own styles, inheriting from the `<use>`. */
  const walkInstance = (target: XmlElement, ctx: Context): void => {
    // The target's own transform applies after the use's translation (SVG 1.1 §5.6).
    walk(target, ctx);
  };

  const pushShape = (el: XmlElement, ctx: Context): void => {
    const style = ctx.style!;
    if (el.name === 'circle' && Math.abs(ctx.matrix[1]) < 1e-12 && Math.abs(ctx.matrix[2]) < 1e-12 && Math.abs(Math.abs(ctx.matrix[0]) - Math.abs(ctx.matrix[3])) < 1e-9) {
      pushCircle(el, ctx, style);
      return;
    }
    const segments = shapeSegments(el, style, viewBox, warn);
    if (segments.length === 0) return;
    const pc = paintCtx(style);
    const fill = el.name === 'line' ? NO_PAINT : resolvePaint(style.fill, ctx.opacity * style.fillOpacity, pc);
    const stroke = resolvePaint(style.stroke, ctx.opacity * style.strokeOpacity, pc);
    const scale = Math.sqrt(Math.abs(ctx.matrix[0] * ctx.matrix[3] - ctx.matrix[1] * ctx.matrix[2]));
    const strokeWidth = stroke.kind === 'none' ? 0 : Math.max(0, style.strokeWidth) * scale;
    if (fill.kind === 'none' && (stroke.kind === 'none' || strokeWidth === 0)) return;
    const flat = flattenSegments(segments, tolerance, ctx.matrix);
    const polylines = flat.polylines;
    const geomBox = boundsOfFlat(polylines);
    if (!geomBox) return;
    if (!saneBox(geomBox)) {
      warn(`<${el.name}>: coordinates out of range (beyond ±${MAX_COORD}); element skipped`, el);
      return;
    }
    const pad = strokeWidth / 2;
    let bbox: Box | null = { x: geomBox.x - pad, y: geomBox.y - pad, width: geomBox.width + 2 * pad, height: geomBox.height + 2 * pad };
    // What is painted is what the clip lets through.
    if (ctx.clip) {
      bbox = clipBox(bbox, ctx.clip);
      if (!bbox) return;
    }
    let area = 0;
    let length = 0;
    for (let k = 0; k < polylines.length; k++) {
      const p = polylines[k]!;
      area += signedArea(p);
      length += polylineLength(p, flat.closed[k] ?? false);
    }
    const item: ShapeItem = {
      kind: 'shape',
      ...baseOf(el, ctx, ctx.matrix, bbox),
      tag: el.name,
      segments,
      segmentsInWorld: false,
      polylines,
      closed: flat.closed,
      fill,
      stroke,
      strokeWidth,
      dashed: (style.strokeDasharray?.some((d) => d > 0) ?? false),
      area: Math.abs(area),
      length,
      rect: clippedRect(rectOf(polylines, flat.closed), ctx.clip),
      circle: circleOf(el, ctx.matrix, geomBox, polylines),
    };
    items.push(item);
  };

  /**
   * Circles under a translate/uniform-scale transform (the common case of
   * scatter plots with tens of thousands of points): exact measures without
   * building arc segments; the outline is a 16-gon.
   */
  const pushCircle = (el: XmlElement, ctx: Context, style: ComputedStyle): void => {
    const a = el.attributes;
    const lenOf = (v: string | undefined, base: number): number => {
      if (v === undefined) return 0;
      const parsed = parseLength(v);
      return parsed.length ? lengthToPx(parsed.length, { percentBase: base, fontSize: style.fontSize }) ?? NaN : NaN;
    };
    const lr = lenOf(a.r, Math.hypot(viewBox.width, viewBox.height) / Math.SQRT2);
    const lcx = lenOf(a.cx, viewBox.width);
    const lcy = lenOf(a.cy, viewBox.height);
    if (!Number.isFinite(lr) || !Number.isFinite(lcx) || !Number.isFinite(lcy) || lr < 0) {
      warn('<circle>: r, cx or cy is not a finite number', el);
      return;
    }
    if (lr === 0) return;
    const m = ctx.matrix;
    if (!saneBox({ x: m[0] * lcx + m[4] - lr, y: m[3] * lcy + m[5] - lr, width: 2 * lr * Math.abs(m[0]), height: 2 * lr * Math.abs(m[0]) })) {
      warn(`<circle>: coordinates out of range (beyond ±${MAX_COORD}); element skipped`, el);
      return;
    }
    const scale = Math.abs(m[0]);
    const cx = m[0] * lcx + m[4];
    const cy = m[3] * lcy + m[5];
    const r = lr * scale;
    const pc = paintCtx(style);
    const fill = resolvePaint(style.fill, ctx.opacity * style.fillOpacity, pc);
    const stroke = resolvePaint(style.stroke, ctx.opacity * style.strokeOpacity, pc);
    const strokeWidth = stroke.kind === 'none' ? 0 : Math.max(0, style.strokeWidth) * scale;
    if (fill.kind === 'none' && (stroke.kind === 'none' || strokeWidth === 0)) return;
    const poly = new Array<number>(32);
    for (let k = 0; k < 16; k++) {
      poly[2 * k] = cx + r * Math.cos((k * Math.PI) / 8);
      poly[2 * k + 1] = cy + r * Math.sin((k * Math.PI) / 8);
    }
    const pad = strokeWidth / 2;
    let bbox: Box | null = { x: cx - r - pad, y: cy - r - pad, width: 2 * (r + pad), height: 2 * (r + pad) };
    if (ctx.clip) {
      bbox = clipBox(bbox, ctx.clip);
      if (!bbox) return;
    }
    items.push({
      kind: 'shape',
      ...baseOf(el, ctx, m, bbox),
      tag: 'circle',
      segments: [],
      segmentsInWorld: false,
      polylines: [poly],
      closed: [true],
      fill,
      stroke,
      strokeWidth,
      dashed: style.strokeDasharray?.some((d) => d > 0) ?? false,
      area: Math.PI * r * r,
      length: 2 * Math.PI * r,
      rect: null,
      circle: { cx, cy, r },
    });
  };

  const pushText = (el: XmlElement, ctx: Context): void => {
    const style = ctx.style!;
    const { content, x, y, dx, dy } = textContent(el, style);
    if (content.trim() === '') return;
    const pc = paintCtx(style);
    const fill = resolvePaint(style.fill, ctx.opacity * style.fillOpacity, pc);
    if (fill.kind === 'none') return;
    emitText(el, ctx, content, x + dx, y + dy, style, fill, false);
  };

  const emitText = (
    el: XmlElement,
    ctx: Context,
    content: string,
    lx: number,
    ly: number,
    style: ComputedStyle,
    fill: Paint,
    fromGlyphs: boolean,
    measured?: { width: number; fontSize: number },
  ): void => {
    const m = ctx.matrix;
    const scale = Math.hypot(m[0], m[1]);
    const rotation = (Math.atan2(m[1], m[0]) * 180) / Math.PI;
    const font = { family: style.fontFamily, size: style.fontSize, weight: style.fontWeight, style: style.fontStyle as 'normal' | 'italic' | 'oblique' };
    const metrics = measured ? null : measureText(content, font);
    const localWidth = measured ? measured.width / (scale || 1) : metrics!.width;
    const ascent = metrics ? metrics.ascent : 0.76 * style.fontSize;
    const descent = metrics ? metrics.descent : 0.24 * style.fontSize;
    const anchor = (style.textAnchor === 'middle' || style.textAnchor === 'end' ? style.textAnchor : 'start') as TextItem['anchor'];
    let baseline = ly;
    const db = style.dominantBaseline;
    if (db === 'central' || db === 'middle') baseline = ly + (ascent - descent) / 2;
    else if (db === 'hanging' || db === 'text-before-edge') baseline = ly + ascent;
    else if (db === 'text-after-edge' || db === 'ideographic') baseline = ly - descent;
    const left = anchor === 'middle' ? lx - localWidth / 2 : anchor === 'end' ? lx - localWidth : lx;
    const corners = [
      applyToPoint(m, { x: left, y: baseline - ascent }),
      applyToPoint(m, { x: left + localWidth, y: baseline - ascent }),
      applyToPoint(m, { x: left, y: baseline + descent }),
      applyToPoint(m, { x: left + localWidth, y: baseline + descent }),
    ];
    const anchorPt = applyToPoint(m, { x: lx, y: baseline });
    const bbox = boundsOfPoints(corners);
    if (!saneBox(bbox)) {
      warn('<text>: position out of range; text skipped', el);
      return;
    }
    const item: TextItem = {
      kind: 'text',
      ...baseOf(el, ctx, m, bbox),
      content,
      x: anchorPt.x,
      y: anchorPt.y,
      anchor,
      rotation: Math.abs(rotation) < 1e-6 ? 0 : rotation,
      fontSize: measured ? measured.fontSize : style.fontSize * scale,
      fontFamily: [...style.fontFamily],
      fontWeight: style.fontWeight,
      fontStyle: style.fontStyle,
      tabularNums: style.fontVariantNumeric.includes('tabular-nums'),
      fill,
      fromGlyphs,
      fontSubstituted: metrics ? metrics.substituted : false,
      width: localWidth * scale,
    };
    items.push(item);
  };

  const pushImage = (el: XmlElement, ctx: Context): void => {
    const href = el.attributes.href ?? el.attributes['xlink:href'] ?? '';
    const x = num(el.attributes.x, 0);
    const y = num(el.attributes.y, 0);
    const w = num(el.attributes.width, 0);
    const h = num(el.attributes.height, 0);
    if (!(w > 0 && h > 0)) return;
    const pts = [
      applyToPoint(ctx.matrix, { x, y }),
      applyToPoint(ctx.matrix, { x: x + w, y }),
      applyToPoint(ctx.matrix, { x, y: y + h }),
      applyToPoint(ctx.matrix, { x: x + w, y: y + h }),
    ];
    if (!saneBox(boundsOfPoints(pts))) {
      warn('<image>: position out of range; image skipped', el);
      return;
    }
    const item: ImageItem = {
      kind: 'image',
      ...baseOf(el, ctx, ctx.matrix, boundsOfPoints(pts)),
      href: href.length > 64 && !href.startsWith('data:') ? href.slice(0, 64) : href,
      embedded: href.startsWith('data:'),
      opacity: ctx.opacity,
    };
    items.push(item);
  };

  // --- Text drawn as glyph outlines -------------------------------------------------------------

  /** A group whose drawables are all filled `<use>`s of path outlines laid out along one baseline. */
  const tryGlyphRunGroup = (g: XmlElement, ctx: Context): boolean => {
    const uses: { use: XmlElement; path: XmlElement }[] = [];
    for (const c of g.children) {
      if (c.type !== 'element') continue;
      if (c.name === 'defs') continue;
      if (c.name !== 'use') return false;
      const href = c.attributes.href ?? c.attributes['xlink:href'];
      const target = href?.startsWith('#') ? byId.get(href.slice(1)) : undefined;
      if (!target || target.name !== 'path') return false;
      uses.push({ use: c, path: target });
    }
    if (uses.length === 0 || uses.length > 400) return false;
    const style = ctx.style!;
    if (style.stroke && style.stroke !== 'none') return false;
    const glyphs = uses.map(({ use, path }) => {
      let m = ctx.matrix;
      if (use.attributes.transform) m = multiply(m, parseTransform(use.attributes.transform).matrix);
      m = multiply(m, translation(num(use.attributes.x, 0), num(use.attributes.y, 0)));
      if (path.attributes.transform) m = multiply(m, parseTransform(path.attributes.transform).matrix);
      return { pathData: path.attributes.d ?? '', matrix: m as [number, number, number, number, number, number] };
    });
    if (!onOneBaseline(glyphs.map((gl) => ({ x: gl.matrix[4], y: gl.matrix[5] })))) return false;
    let run;
    try {
      run = readGlyphRun(glyphs);
    } catch {
      return false;
    }
    if (!run.bbox || run.confidence < 0.5 || run.unrecognised > glyphs.length / 2 || run.text.trim() === '') return false;
    const pc = paintCtx(style);
    const fill = resolvePaint(style.fill, ctx.opacity * style.fillOpacity, pc);
    const first = glyphs[0]!.matrix;
    // The text item starts at the first glyph's origin on the baseline and runs along the reading direction.
    const baseM: Matrix = multiply(translation(first[4], first[5]), rotationMatrix(run.angle));
    const fontSize = run.fontSize ?? (Math.abs(run.angle) > 45 ? run.bbox.width : run.bbox.height);
    const width = Math.abs(run.angle) > 45 ? run.bbox.height : run.bbox.width;
    const before = items.length;
    emitText(g, { ...ctx, matrix: baseM }, run.text.replace(/\n/g, ' '), 0, 0, { ...style, textAnchor: 'start', dominantBaseline: 'auto' }, fill, true, {
      width,
      fontSize,
    });
    const item = items[before] as TextItem | undefined;
    if (item) item.bbox = run.bbox;
    return true;
  };

  const rootCtx: Context = {
    matrix: identity,
    style: rootStyle,
    opacity: 1,
    clip: null,
    filter: null,
    hints: [],
    ignore: [],
    useDepth: 0,
    useChain: [],
    useSource: null,
  };
  const rootIgnore = root.attribute('data-plumbline-ignore');
  const rootRule = rootIgnore ? rootIgnore.split(',').map((s) => s.trim()).filter(Boolean) : [];
  rootCtx.style = rootStyle;
  rootCtx.opacity = rootStyle.opacity;
  rootCtx.ignore = rootRule;
  for (const c of root.children) if (c.type === 'element') walk(c, rootCtx);

  const childText = (name: string): string | null => {
    const el = root.children.find((c): c is XmlElement => c.type === 'element' && c.name === name);
    if (!el) return null;
    const t = el.children.map((c) => (c.type === 'text' ? c.value : '')).join('').trim();
    return t === '' ? null : t;
  };

  return {
    document: doc,
    viewBox,
    displayWidth,
    displayHeight,
    pxPerUnit,
    items,
    title: childText('title'),
    description: childText('desc'),
    ariaLabel: root.attribute('aria-label') ?? null,
    ignore: rootRule,
    warnings,
  };
}

/**
 * Glyph origins of one line of text lie on a line and advance monotonically
 * along it; markers of a scatter plot drawn by reference do not.
 */
function onOneBaseline(origins: { x: number; y: number }[]): boolean {
  if (origins.length <= 1) return true;
  const a = origins[0]!;
  const b = origins[origins.length - 1]!;
  const len = Math.hypot(b.x - a.x, b.y - a.y);
  if (len === 0) return origins.every((o) => o.x === a.x && o.y === a.y);
  const ux = (b.x - a.x) / len;
  const uy = (b.y - a.y) / len;
  let last = -Infinity;
  for (const o of origins) {
    const along = (o.x - a.x) * ux + (o.y - a.y) * uy;
    const across = Math.abs(-(o.x - a.x) * uy + (o.y - a.y) * ux);
    if (across > 0.02 * len + 0.5) return false;
    if (along < last - 0.5) return false;
    last = along;
  }
  return true;
}

/** Coordinates beyond this (in world units) are treated as broken input: no chart is drawn that far out. */
const MAX_COORD = 1e9;

function saneBox(b: Box): boolean {
  return [b.x, b.y, b.width, b.height].every(Number.isFinite) && Math.abs(b.x) <= MAX_COORD && Math.abs(b.y) <= MAX_COORD && b.x + b.width <= MAX_COORD && b.y + b.height <= MAX_COORD;
}

// --- helpers ---------------------------------------------------------------------------------------

function num(v: string | undefined, fallback: number): number {
  if (v === undefined) return fallback;
  const parsed = parseLength(v);
  if (!parsed.length) return fallback;
  const px = lengthToPx(parsed.length, {});
  return px !== null && Number.isFinite(px) ? px : fallback;
}

/** Root width/height in CSS px; % or missing → null (the viewBox decides). */
function rootLength(v: string | undefined, _reference: number | undefined): number | null {
  if (v === undefined) return null;
  const parsed = parseLength(v);
  if (!parsed.length || parsed.length.unit === '%') return null;
  const px = lengthToPx(parsed.length, {});
  return px !== null && Number.isFinite(px) && px > 0 ? px : null;
}

function shapeSegments(el: XmlElement, style: ComputedStyle, vb: Box, warn: (m: string, el: XmlElement) => void): Segment[] {
  const a = el.attributes;
  const ctxX = { percentOf: vb.width, fontSize: style.fontSize };
  const ctxY = { percentOf: vb.height, fontSize: style.fontSize };
  const ctxO = { percentOf: Math.hypot(vb.width, vb.height) / Math.SQRT2, fontSize: style.fontSize };
  const len = (v: string | undefined, c: { percentOf: number; fontSize: number }, fallback: number): number => {
    if (v === undefined) return fallback;
    const parsed = parseLength(v);
    if (!parsed.length) return NaN;
    return lengthToPx(parsed.length, { percentBase: c.percentOf, fontSize: c.fontSize }) ?? NaN;
  };
  let result: { segments: Segment[]; issue?: string; error?: { message: string } };
  switch (el.name) {
    case 'rect': {
      const rx = a.rx !== undefined ? len(a.rx, ctxX, NaN) : undefined;
      const ry = a.ry !== undefined ? len(a.ry, ctxY, NaN) : undefined;
      result = rectToPath({ x: len(a.x, ctxX, 0), y: len(a.y, ctxY, 0), width: len(a.width, ctxX, 0), height: len(a.height, ctxY, 0), rx, ry });
      break;
    }
    case 'circle':
      result = circleToPath({ cx: len(a.cx, ctxX, 0), cy: len(a.cy, ctxY, 0), r: len(a.r, ctxO, 0) });
      break;
    case 'ellipse':
      result = ellipseToPath({ cx: len(a.cx, ctxX, 0), cy: len(a.cy, ctxY, 0), rx: len(a.rx, ctxX, 0), ry: len(a.ry, ctxY, 0) });
      break;
    case 'line':
      result = lineToPath({ x1: len(a.x1, ctxX, 0), y1: len(a.y1, ctxY, 0), x2: len(a.x2, ctxX, 0), y2: len(a.y2, ctxY, 0) });
      break;
    case 'polyline':
    case 'polygon': {
      const pts = parsePoints(a.points ?? '');
      if (pts.error) warn(`points: ${pts.error.message}`, el);
      result = el.name === 'polygon' ? polygonToPath(pts.points) : polylineToPath(pts.points);
      break;
    }
    case 'path': {
      const parsed = parsePath(a.d ?? '');
      if (parsed.error) warn(`path data: ${parsed.error.message}`, el);
      result = { segments: parsed.segments };
      break;
    }
    default:
      return [];
  }
  if (result.issue) warn(`<${el.name}>: ${result.issue}`, el);
  return result.segments;
}

function textContent(el: XmlElement, style: ComputedStyle): { content: string; x: number; y: number; dx: number; dy: number } {
  const first = (v: string | undefined): number => {
    if (v === undefined) return NaN;
    const t = v.trim().split(/[\s,]+/)[0] ?? '';
    const parsed = parseLength(t);
    if (!parsed.length) return NaN;
    return lengthToPx(parsed.length, { fontSize: style.fontSize }) ?? NaN;
  };
  let x = first(el.attributes.x);
  let y = first(el.attributes.y);
  let dx = first(el.attributes.dx);
  let dy = first(el.attributes.dy);
  const parts: string[] = [];
  const collect = (node: XmlElement): void => {
    for (const c of node.children) {
      if (c.type === 'text') parts.push(c.value);
      else if (c.name === 'tspan' || c.name === 'textPath' || c.name === 'a') {
        if (Number.isNaN(x) && parts.join('').trim() === '') {
          x = first(c.attributes.x);
          y = first(c.attributes.y);
          if (Number.isNaN(dx)) dx = first(c.attributes.dx);
          if (Number.isNaN(dy)) dy = first(c.attributes.dy);
        } else if ((c.attributes.x !== undefined || c.attributes.y !== undefined || c.attributes.dy !== undefined) && parts.length > 0) {
          parts.push(' ');
        }
        collect(c);
      }
    }
  };
  collect(el);
  const content = parts.join('').replace(/\s+/g, ' ').trim();
  return { content, x: Number.isNaN(x) ? 0 : x, y: Number.isNaN(y) ? 0 : y, dx: Number.isNaN(dx) ? 0 : dx, dy: Number.isNaN(dy) ? 0 : dy };
}

function rotationMatrix(deg: number): Matrix {
  const r = (deg * Math.PI) / 180;
  const c = Math.cos(r);
  const s = Math.sin(r);
  return [c, s, -s, c, 0, 0];
}

function transformFlat(p: number[], m: Matrix): number[] {
  const out = new Array<number>(p.length);
  const [a, b, c, d, e, f] = m;
  for (let k = 0; k < p.length; k += 2) {
    const x = p[k]!;
    const y = p[k + 1]!;
    out[k] = a * x + c * y + e;
    out[k + 1] = b * x + d * y + f;
  }
  return out;
}

function boundsOfFlat(polylines: number[][]): Box | null {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const p of polylines) {
    for (let k = 0; k < p.length; k += 2) {
      const x = p[k]!;
      const y = p[k + 1]!;
      if (x < x0) x0 = x;
      if (x > x1) x1 = x;
      if (y < y0) y0 = y;
      if (y > y1) y1 = y;
    }
  }
  if (!Number.isFinite(x0) || !Number.isFinite(y0) || !Number.isFinite(x1) || !Number.isFinite(y1)) return null;
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

function boundsOf(polylines: number[][], m: Matrix): Box | null {
  return boundsOfFlat(polylines.map((p) => transformFlat(p, m)));
}

function boundsOfPoints(pts: { x: number; y: number }[]): Box {
  const xs = pts.map((p) => p.x);
  const ys = pts.map((p) => p.y);
  const x = Math.min(...xs);
  const y = Math.min(...ys);
  return { x, y, width: Math.max(...xs) - x, height: Math.max(...ys) - y };
}

function union(a: Box, b: Box): Box {
  const x = Math.min(a.x, b.x);
  const y = Math.min(a.y, b.y);
  return { x, y, width: Math.max(a.x + a.width, b.x + b.width) - x, height: Math.max(a.y + a.height, b.y + b.height) - y };
}

/** The part of a box inside a clip box; null when nothing is left. */
function clipBox(b: Box, clip: Box): Box | null {
  const x = Math.max(b.x, clip.x);
  const y = Math.max(b.y, clip.y);
  const w = Math.min(b.x + b.width, clip.x + clip.width) - x;
  const h = Math.min(b.y + b.height, clip.y + clip.height) - y;
  return w >= 0 && h >= 0 && (w > 0 || h > 0) ? { x, y, width: w, height: h } : null;
}

function clippedRect(r: Box | null, clip: Box | null): Box | null {
  if (!r || !clip) return r;
  return clipBox(r, clip);
}

function intersect(a: Box, b: Box): Box {
  const x = Math.max(a.x, b.x);
  const y = Math.max(a.y, b.y);
  return { x, y, width: Math.max(0, Math.min(a.x + a.width, b.x + b.width) - x), height: Math.max(0, Math.min(a.y + a.height, b.y + b.height) - y) };
}

function signedArea(p: number[]): number {
  let s = 0;
  const n = p.length;
  if (n < 6) return 0;
  for (let k = 0; k < n; k += 2) {
    const x0 = p[k]!;
    const y0 = p[k + 1]!;
    const x1 = p[(k + 2) % n]!;
    const y1 = p[(k + 3) % n]!;
    s += x0 * y1 - x1 * y0;
  }
  return s / 2;
}

function polylineLength(p: number[], closed: boolean): number {
  let s = 0;
  for (let k = 2; k < p.length; k += 2) s += Math.hypot(p[k]! - p[k - 2]!, p[k + 1]! - p[k - 1]!);
  if (closed && p.length >= 4) s += Math.hypot(p[0]! - p[p.length - 2]!, p[1]! - p[p.length - 1]!);
  return s;
}

/** An axis-aligned rectangle: one closed subpath whose distinct corners are the bbox corners. */
function rectOf(polylines: number[][], closed: boolean[]): Box | null {
  if (polylines.length !== 1) return null;
  const p = polylines[0]!;
  const n = p.length / 2;
  if (n < 4 || n > 6) return null;
  const b = boundsOfFlat(polylines)!;
  const eps = Math.max(1e-6, 1e-6 * Math.max(b.width, b.height));
  for (let k = 0; k < p.length; k += 2) {
    const x = p[k]!;
    const y = p[k + 1]!;
    const onX = Math.abs(x - b.x) <= eps || Math.abs(x - b.x - b.width) <= eps;
    const onY = Math.abs(y - b.y) <= eps || Math.abs(y - b.y - b.height) <= eps;
    if (!onX || !onY) return null;
  }
  // Consecutive points must move along one axis only.
  for (let k = 2; k < p.length + 2; k += 2) {
    const x0 = p[(k - 2) % p.length]!;
    const y0 = p[(k - 1) % p.length]!;
    const x1 = p[k % p.length]!;
    const y1 = p[(k + 1) % p.length]!;
    if (Math.abs(x1 - x0) > eps && Math.abs(y1 - y0) > eps) return null;
  }
  if (!closed[0] && !(Math.abs(p[0]! - p[p.length - 2]!) <= eps && Math.abs(p[1]! - p[p.length - 1]!) <= eps)) {
    // An open path that ends where it starts is still a rectangle; otherwise only if 4+ sides.
    if (n < 5) return null;
  }
  return b;
}

/** A circle: a circle element, or one closed-looking outline whose points fit one circle (algebraic least squares). */
function circleOf(el: XmlElement, m: Matrix, box: Box, polylines: number[][]): ShapeItem['circle'] {
  if (Math.abs(box.width - box.height) > 0.05 * Math.max(box.width, box.height, 1e-9)) return null;
  if (el.name === 'circle' || (el.name === 'ellipse' && Math.abs(m[1]) < 1e-9)) {
    return { cx: box.x + box.width / 2, cy: box.y + box.height / 2, r: (box.width + box.height) / 4 };
  }
  if (polylines.length !== 1) return null;
  const p = polylines[0]!;
  const n = p.length / 2;
  if (n < 5) return null;
  const fit = fitCircle(p);
  if (!fit) return null;
  for (let k = 0; k < p.length; k += 2) {
    const d = Math.hypot(p[k]! - fit.cx, p[k + 1]! - fit.cy);
    if (Math.abs(d - fit.r) > 0.04 * fit.r + 1e-9) return null;
  }
  // The points must go round: their angles cover most of the circle.
  const seen = new Set<number>();
  for (let k = 0; k < p.length; k += 2) seen.add(Math.floor(((Math.atan2(p[k + 1]! - fit.cy, p[k]! - fit.cx) + Math.PI) / (2 * Math.PI)) * 8) % 8);
  return seen.size >= 7 ? fit : null;
}

/** Kåsa's algebraic circle fit: minimises Σ(x² + y² + Dx + Ey + F)². */
function fitCircle(p: number[]): { cx: number; cy: number; r: number } | null {
  const n = p.length / 2;
  let mx = 0;
  let my = 0;
  for (let k = 0; k < p.length; k += 2) {
    mx += p[k]!;
    my += p[k + 1]!;
  }
  mx /= n;
  my /= n;
  let suu = 0, svv = 0, suv = 0, suuu = 0, svvv = 0, suvv = 0, svuu = 0;
  for (let k = 0; k < p.length; k += 2) {
    const u = p[k]! - mx;
    const v = p[k + 1]! - my;
    suu += u * u;
    svv += v * v;
    suv += u * v;
    suuu += u * u * u;
    svvv += v * v * v;
    suvv += u * v * v;
    svuu += v * u * u;
  }
  const det = suu * svv - suv * suv;
  if (Math.abs(det) < 1e-12) return null;
  const bu = 0.5 * (suuu + suvv);
  const bv = 0.5 * (svvv + svuu);
  const uc = (bu * svv - bv * suv) / det;
  const vc = (bv * suu - bu * suv) / det;
  const r = Math.sqrt(uc * uc + vc * vc + (suu + svv) / n);
  return Number.isFinite(r) ? { cx: uc + mx, cy: vc + my, r } : null;
}

function isAncestor(a: XmlElement, b: XmlElement): boolean {
  for (let p = b.parent; p; p = p.parent) if (p === a) return true;
  return false;
}

export type { Rgba };
