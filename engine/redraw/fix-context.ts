/**
 * What a fix works with: the understood chart, its measures, the style
 * cascade, and helpers that turn "change this scene item" into edits confined
 * to that item (never to other items that share a definition or a group).
 */
import type { Analysis } from '../audit/analyze.js';
import type { Measures } from '../measure/measures.js';
import { walkElements } from '../read/parse-xml.js';
import type { SceneItem } from '../read/scene.js';
import { buildCascade, type Cascade } from '../read/style/cascade.js';
import type { StyleProperty } from '../read/style/properties.js';
import type { XmlElement } from '../read/xml-tree.js';
import type { Finding } from '../report/types.js';
import { removeElement, type Edit } from './edit-list.js';
import { setStyleProperty, removeStyleProperty } from './style-edit.js';

export interface FixContext {
  analysis: Analysis;
  measures: Measures;
  cascade: Cascade;
  /** Rule ids whose fixes run in this redraw (fixes may coordinate, e.g. grid colour after a background goes). */
  applying: ReadonlySet<string>;
  byId: ReadonlyMap<string, XmlElement>;
  /** Ids that something in the file refers to (href, url(#id)). */
  referencedIds: ReadonlySet<string>;
}

/** What one fix does to a file. */
export interface FixOutcome {
  edits: Edit[];
  /** Elements changed, removed or added. */
  count: number;
  /** Things the fix chose not to do, and why. */
  notes: string[];
  /** Data marks whose geometry the fix redraws on purpose, with the share of the whole each must show afterwards. */
  reprojected: { item: number; share: number }[];
  /**
   * Items whose ink this fix changes by design (recoloured marks and keys,
   * rewritten labels). The data-ink check holds their ink at the input amount
   * so it judges only what the other changes did.
   */
  inkHeld: number[];
}

export type Fix = (ctx: FixContext, finding: Finding) => FixOutcome;

export function emptyOutcome(): FixOutcome {
  return { edits: [], count: 0, notes: [], reprojected: [], inkHeld: [] };
}

/** Per-document indexes behind the item helpers, built once per context. */
interface Indexes {
  byPosition: Map<string, XmlElement>;
  /** Per item: the elements whose declarations reach only this item or instances of the same definition, innermost first. */
  editable: XmlElement[][];
  /** Per item: the `<use>` that instantiated it, or null. */
  use: (XmlElement | null)[];
  /** Per element: the items an edit on it affects (through `editable`). */
  affected: Map<XmlElement, number[]>;
  /** Items by the start offset of their owning element (the `<use>`, else the element), sorted. */
  ownerStarts: { start: number; item: number }[];
}

const INDEXES = new WeakMap<FixContext, Indexes>();

export function buildFixContext(analysis: Analysis, measures: Measures, applying: ReadonlySet<string>): FixContext {
  const doc = analysis.doc;
  const byId = new Map<string, XmlElement>();
  for (const el of walkElements(doc.root)) {
    const id = el.attribute('id');
    if (id !== undefined && !byId.has(id)) byId.set(id, el);
  }
  return { analysis, measures, cascade: buildCascade(doc), applying, byId, referencedIds: referencedIds(doc.source) };
}

/** Ids referenced anywhere in the text: `href="#id"`, `xlink:href='#id'`, `url(#id)`. */
export function referencedIds(source: string): Set<string> {
  const out = new Set<string>();
  for (const m of source.matchAll(/href\s*=\s*["']\s*#([^"'\s]+)/g)) out.add(m[1]!);
  for (const m of source.matchAll(/url\(\s*['"]?#([^'")\s]+)/g)) out.add(m[1]!);
  return out;
}

function hrefTarget(el: XmlElement, byId: ReadonlyMap<string, XmlElement>): XmlElement | null {
  const href = el.attribute('href') ?? el.attribute('xlink:href');
  return href?.startsWith('#') ? byId.get(href.slice(1)) ?? null : null;
}

function indexes(ctx: FixContext): Indexes {
  const hit = INDEXES.get(ctx);
  if (hit) return hit;
  const { doc, scene } = ctx.analysis;
  const byPosition = new Map<string, XmlElement>();
  for (const el of walkElements(doc.root)) byPosition.set(`${el.line}:${el.column}`, el);
  const editable: XmlElement[][] = [];
  const use: (XmlElement | null)[] = [];
  const affected = new Map<XmlElement, number[]>();
  const ownerStarts: { start: number; item: number }[] = [];
  for (const it of scene.items) {
    const el = it.element;
    let u: XmlElement | null = null;
    if (it.source.line !== el.line || it.source.column !== el.column) {
      const s = byPosition.get(`${it.source.line}:${it.source.column}`);
      if (s && s.name === 'use') u = s;
    }
    let chain: XmlElement[];
    if (u) {
      // Instance chain: the element up to the definition it belongs to, then the inner <use>s, then the outer <use>.
      const uses: XmlElement[] = [u];
      let target = hrefTarget(u, ctx.byId);
      for (let guard = 0; target && target.name === 'use' && guard < 16; guard++) {
        uses.push(target);
        target = hrefTarget(target, ctx.byId);
      }
      chain = [];
      let e: XmlElement | null = el;
      while (e) {
        chain.push(e);
        if (e === target) break;
        e = e.parent;
      }
      if (!e) chain = [el];
      for (let k = uses.length - 1; k >= 0; k--) chain.push(uses[k]!);
    } else {
      chain = [el];
    }
    editable.push(chain);
    use.push(u);
    for (const c of chain) {
      const list = affected.get(c);
      if (list) {
        if (list[list.length - 1] !== it.index) list.push(it.index);
      } else affected.set(c, [it.index]);
    }
    ownerStarts.push({ start: (u ?? el).start, item: it.index });
  }
  ownerStarts.sort((a, b) => a.start - b.start);
  const out: Indexes = { byPosition, editable, use, affected, ownerStarts };
  INDEXES.set(ctx, out);
  return out;
}

/** The `<use>` that instantiated an item, or null. */
export function useOf(ctx: FixContext, item: number): XmlElement | null {
  return indexes(ctx).use[item] ?? null;
}

/** The element a reader would point at for this item: its `<use>`, else its own element. */
export function ownerOf(ctx: FixContext, item: number): XmlElement {
  return useOf(ctx, item) ?? ctx.analysis.scene.items[item]!.element;
}

/** Scene items drawn by the elements a finding points at. */
export function itemsOfFinding(ctx: FixContext, finding: Finding): number[] {
  const want = new Set(finding.elements.map((e) => `${e.line}:${e.column}`));
  const out: number[] = [];
  for (const it of ctx.analysis.scene.items) if (want.has(`${it.source.line}:${it.source.column}`)) out.push(it.index);
  return out;
}

/** Items whose owning element lies inside `el` (its whole span). */
export function itemsUnder(ctx: FixContext, el: XmlElement): number[] {
  const list = indexes(ctx).ownerStarts;
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (list[mid]!.start < el.start) lo = mid + 1;
    else hi = mid;
  }
  const out: number[] = [];
  for (let k = lo; k < list.length && list[k]!.start < el.end; k++) out.push(list[k]!.item);
  return out;
}

function allIn(items: readonly number[] | undefined, allowed: ReadonlySet<number>): boolean {
  return !items || items.every((i) => allowed.has(i));
}

/** Items an edit on `el`'s own declarations would change. */
export function affectedBy(ctx: FixContext, el: XmlElement): readonly number[] {
  return indexes(ctx).affected.get(el) ?? [];
}

function declares(ctx: FixContext, el: XmlElement, property: StyleProperty): { value: string } | null {
  const d = ctx.cascade.declared(el)[property];
  if (!d) return null;
  if (typeof d.value === 'object' && d.value !== null && 'cssWide' in d.value && d.value.cssWide === 'inherit') return null;
  return { value: d.text };
}

/**
 * Edits that make one style property of an item take `value`, confined to
 * items in `allowed` (which must include `item`). The declaration that gives
 * the item its value is rewritten when it reaches only allowed items;
 * otherwise the value is set on the item's own element (or its `<use>`).
 * A paint given as currentColor is changed through `color`. Returns null when
 * the change cannot be confined.
 */
export function setItemProperty(
  ctx: FixContext,
  item: number,
  property: StyleProperty,
  value: string,
  allowed: ReadonlySet<number>,
): Edit[] | null {
  const ix = indexes(ctx);
  const chain = ix.editable[item];
  if (!chain) return null;
  const doc = ctx.analysis.doc;
  for (const el of chain) {
    const d = declares(ctx, el, property);
    if (!d) continue;
    if ((property === 'fill' || property === 'stroke') && /^currentcolor$/i.test(d.value.trim())) {
      // The paint follows `color`: change that where it is given (unless fill and stroke then disagree).
      return setItemProperty(ctx, item, 'color', value, allowed);
    }
    if (!allIn(ix.affected.get(el), allowed)) return null;
    return setStyleProperty(doc, ctx.cascade, el, property, value);
  }
  // Declared further out (or not at all): set it on the outermost element private to this item.
  const own = chain[chain.length - 1]!;
  if (!allIn(ix.affected.get(own), allowed)) return null;
  return setStyleProperty(doc, ctx.cascade, own, property, value);
}

/** Edits that take a property off an item's own declarations (see removeStyleProperty); null when not confined. */
export function clearItemProperty(
  ctx: FixContext,
  item: number,
  property: StyleProperty,
  fallback: string,
  allowed: ReadonlySet<number>,
): Edit[] | null {
  const ix = indexes(ctx);
  const chain = ix.editable[item];
  if (!chain) return null;
  const edits: Edit[] = [];
  for (const el of chain) {
    if (!declares(ctx, el, property)) continue;
    if (!allIn(ix.affected.get(el), allowed)) return null;
    edits.push(...removeStyleProperty(ctx.analysis.doc, ctx.cascade, el, property, fallback));
  }
  return edits;
}

/**
 * The element whose declaration gives an item its value of `property`
 * (inherited values included), and whether that element is private to the
 * item's definition chain (`chain`) or an ancestor group (`ancestor`).
 */
export function declaringElement(ctx: FixContext, item: number, property: StyleProperty): { el: XmlElement; where: 'chain' | 'ancestor' } | null {
  const chain = indexes(ctx).editable[item];
  if (!chain) return null;
  for (const el of chain) if (declares(ctx, el, property)) return { el, where: 'chain' };
  for (let el = chain[chain.length - 1]!.parent; el; el = el.parent) if (declares(ctx, el, property)) return { el, where: 'ancestor' };
  return null;
}

/**
 * Edits that take `property` off the element that gives it to an item, when
 * every item that element reaches is in `allowed`; null otherwise.
 */
export function clearDeclaration(ctx: FixContext, item: number, property: StyleProperty, fallback: string, allowed: ReadonlySet<number>): Edit[] | null {
  const d = declaringElement(ctx, item, property);
  if (!d) return [];
  const reach = d.where === 'chain' ? affectedBy(ctx, d.el) : itemsUnder(ctx, d.el);
  if (!allIn(reach, allowed)) return null;
  return removeStyleProperty(ctx.analysis.doc, ctx.cascade, d.el, property, fallback);
}

/** Whether something refers to an id on `el` or inside it. */
export function isReferenced(ctx: FixContext, el: XmlElement): boolean {
  if (ctx.referencedIds.size === 0) return false;
  for (const e of walkElements(el)) {
    const id = e.attribute('id');
    if (id !== undefined && ctx.referencedIds.has(id)) return true;
  }
  return false;
}

/**
 * An edit removing the element that draws an item (its `<use>` for
 * instances), or null when that would remove items outside `allowed`, or an
 * element something else refers to.
 */
export function removeItem(ctx: FixContext, item: number, allowed: ReadonlySet<number>): Edit | null {
  const owner = ownerOf(ctx, item);
  if (owner === ctx.analysis.doc.root) return null;
  if (!allIn(itemsUnder(ctx, owner), allowed)) return null;
  if (!allIn(affectedBy(ctx, owner), allowed)) return null;
  if (isReferenced(ctx, owner)) return null;
  return removeElement(ctx.analysis.doc, owner);
}

/** The scale of an item's transform (world units per local unit). */
export function itemScale(it: SceneItem): number {
  const m = it.matrix;
  return Math.sqrt(Math.abs(m[0] * m[3] - m[1] * m[2]));
}

/** Numbers for SVG attributes: at most `digits` decimals, no trailing zeros, no exponent. */
export function svgNumber(v: number, digits = 4): string {
  if (!Number.isFinite(v)) throw new RangeError(`cannot write ${v} into SVG`);
  let s = v.toFixed(digits);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}
