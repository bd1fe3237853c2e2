/**
 * The cascade for one document: which declaration wins, per element and
 * property, among presentation attributes, `style=""` and `<style>` sheets.
 *
 * Order of precedence, lowest first (CSS Cascade 4 §6.1 for the author
 * origin, SVG 2 §6.6 for presentation attributes):
 *   1. presentation attributes (specificity 0, before every author rule;
 *      `!important` is not allowed in them);
 *   2. normal sheet declarations, by specificity then order of appearance;
 *   3. normal `style=""` declarations;
 *   4. `!important` sheet declarations, by specificity then order;
 *   5. `!important` `style=""` declarations.
 *
 * Matching is indexed by the rightmost compound's id, else a class, else
 * the element name, so each element is tested only against rules that can
 * match it. declared() results are cached per element.
 */
import { walkElements } from '../parse-xml.js';
import { SvgReadError, type XmlDocument, type XmlElement } from '../xml-tree.js';
import { parseDeclaration, parseDeclarationList } from './declarations.js';
import { mediaTextApplies } from './media.js';
import { PRESENTATION_ATTRIBUTES } from './properties.js';
import { compareSpecificity, MatchBudgetExceeded, SelectorMatcher, type CompiledSelector } from './selectors.js';
import { readSheet, type SheetRule } from './sheet.js';
import type { Declaration, DeclaredStyle, StyleWarning } from './types.js';
import { asciiLower } from './values.js';

export interface CascadeLimits {
  /** Most characters of `<style>` text accepted in one document. */
  maxSheetChars: number;
  /** Most selectors (after splitting groups) accepted in one document. */
  maxSelectors: number;
  /** Most selector-matching steps over the life of the cascade. */
  maxMatchSteps: number;
  /** Most warnings kept (further ones are counted in the last). */
  maxWarnings: number;
}

export const DEFAULT_CASCADE_LIMITS: Readonly<CascadeLimits> = Object.freeze({
  maxSheetChars: 4 * 1024 * 1024,
  maxSelectors: 20_000,
  maxMatchSteps: 50_000_000,
  maxWarnings: 200,
});

export interface Cascade {
  /**
   * The winning declaration per property for this element, from its own
   * attributes and from the sheets matched against its place in the original
   * tree. Cached per element. Throws SvgReadError if matching exceeds
   * maxMatchSteps.
   */
  declared(el: XmlElement): DeclaredStyle;
  /** Problems found while reading the sheets (skipped rules, ignored @import, ...). */
  readonly warnings: readonly StyleWarning[];
  /** Number of rules read from the sheets (a grouped selector counts once). */
  readonly ruleCount: number;
  /** Number of selectors in the index (each selector of a group counts). */
  readonly selectorCount: number;
}

interface IndexEntry {
  readonly selector: CompiledSelector;
  readonly rule: SheetRule;
  /** Position after sorting all entries by (specificity, order of appearance). */
  rank: number;
}

const EMPTY_STYLE: DeclaredStyle = Object.freeze({});

/** Reads every `<style>` sheet of the document and returns its cascade. */
export function buildCascade(doc: XmlDocument, limits: Partial<CascadeLimits> = {}): Cascade {
  const lim: CascadeLimits = { ...DEFAULT_CASCADE_LIMITS, ...limits };
  const warnings: StyleWarning[] = [];
  let dropped = 0;
  const warn = (message: string, line: number, column: number): void => {
    if (warnings.length < lim.maxWarnings - 1) warnings.push({ message, line, column });
    else dropped++;
  };

  // 1. Collect the sheets in document order.
  const rules: SheetRule[] = [];
  const lineColumnAt = lineTracker(doc.source);
  let sheetChars = 0;
  for (const el of walkElements(doc.root)) {
    if (el.name !== 'style') continue;
    const type = el.attribute('type');
    if (type !== undefined && !['', 'text/css'].includes(asciiLower(type.trim()))) {
      warn(`<style type="${type}"> ignored: only text/css is read`, el.line, el.column);
      continue;
    }
    const media = el.attribute('media');
    if (media !== undefined && !mediaTextApplies(media)) continue;
    let text = '';
    let firstOffset = -1;
    for (const child of el.children) {
      if (child.type !== 'text') continue;
      if (firstOffset < 0) firstOffset = child.span.start;
      text += child.value;
    }
    if (text.trim() === '') continue;
    sheetChars += text.length;
    if (sheetChars > lim.maxSheetChars) {
      throw new SvgReadError(`style sheets total more than ${lim.maxSheetChars} characters`, el.line, el.column);
    }
    const [line, column] = lineColumnAt(firstOffset);
    for (const rule of readSheet(text, { line, column }, rules.length, warn)) rules.push(rule);
  }

  // 2. Index every selector by its rightmost compound, ranked by (specificity, order).
  const entries: IndexEntry[] = [];
  for (const rule of rules) for (const selector of rule.selectors) entries.push({ selector, rule, rank: 0 });
  if (entries.length > lim.maxSelectors) {
    throw new SvgReadError(`style sheets hold ${entries.length} selectors, more than the ${lim.maxSelectors} accepted`, 1, 1);
  }
  // Array.prototype.sort is stable (ES2019), so equal keys keep document order.
  const sorted = entries
    .slice()
    .sort((x, y) => compareSpecificity(x.selector.specificity, y.selector.specificity) || x.rule.order - y.rule.order);
  sorted.forEach((e, i) => (e.rank = i));
  const byId = new Map<string, IndexEntry[]>();
  const byClass = new Map<string, IndexEntry[]>();
  const byType = new Map<string, IndexEntry[]>();
  const universal: IndexEntry[] = [];
  const file = (map: Map<string, IndexEntry[]>, key: string, e: IndexEntry): void => {
    const list = map.get(key);
    if (list) list.push(e);
    else map.set(key, [e]);
  };
  for (const e of sorted) {
    const k = e.selector.key;
    if (k.kind === 'id') file(byId, k.name, e);
    else if (k.kind === 'class') file(byClass, k.name, e);
    else if (k.kind === 'type') file(byType, k.name, e);
    else universal.push(e);
  }
  if (dropped > 0) warnings.push({ message: `${dropped} more style warning(s) not listed`, line: 1, column: 1 });

  // 3. Per-element resolution, cached.
  const matcher = new SelectorMatcher(lim.maxMatchSteps);
  const cache = new WeakMap<XmlElement, DeclaredStyle>();
  const attrCache = new Map<string, readonly Declaration[]>();
  const inlineCache = new Map<string, readonly Declaration[]>();
  const hasRules = sorted.length > 0;

  const attributeDeclarations = (name: string, value: string): readonly Declaration[] => {
    const key = name + '\u0000' + value;
    let decls = attrCache.get(key);
    if (decls === undefined) {
      decls = parseDeclaration(name, value, { origin: 'attribute', important: false });
      attrCache.set(key, decls);
    }
    return decls;
  };
  const inlineDeclarations = (text: string): readonly Declaration[] => {
    let decls = inlineCache.get(text);
    if (decls === undefined) {
      decls = Object.freeze(parseDeclarationList(text, { origin: 'inline' }));
      inlineCache.set(text, decls);
    }
    return decls;
  };

  const matchedRules = (el: XmlElement): IndexEntry[] => {
    const found: IndexEntry[] = [];
    const consider = (list: readonly IndexEntry[] | undefined): void => {
      if (!list) return;
      for (const e of list) if (matcher.matches(e.selector, el)) found.push(e);
    };
    const id = el.attribute('id');
    if (id !== undefined && byId.size > 0) consider(byId.get(id));
    if (byClass.size > 0) {
      const classes = matcher.classesOf(el);
      for (let i = 0; i < classes.length; i++) {
        const c = classes[i]!;
        if (classes.indexOf(c) === i) consider(byClass.get(c));
      }
    }
    consider(byType.get(el.name));
    consider(universal);
    if (found.length < 2) return found;
    // Selectors 4 §17: a rule counts once, with its most specific matching selector.
    found.sort((x, y) => x.rank - y.rank);
    const seen = new Map<SheetRule, number>();
    found.forEach((e, i) => seen.set(e.rule, i));
    return found.filter((e, i) => seen.get(e.rule) === i);
  };

  const declared = (el: XmlElement): DeclaredStyle => {
    const hit = cache.get(el);
    if (hit) return hit;
    const out: { [property: string]: Declaration } = {};
    let any = false;
    const put = (d: Declaration): void => {
      out[d.property] = d;
      any = true;
    };
    let styleText: string | undefined;
    if (el.attrCount > 0) {
      const attrs = el.attributes;
      for (const name in attrs) {
        if (name === 'style') styleText = attrs[name];
        else if (PRESENTATION_ATTRIBUTES.has(name)) for (const d of attributeDeclarations(name, attrs[name]!)) put(d);
      }
    }
    let matched: IndexEntry[] = [];
    if (hasRules) {
      try {
        matched = matchedRules(el);
      } catch (err) {
        if (err instanceof MatchBudgetExceeded) throw new SvgReadError(err.message, el.line, el.column);
        throw err;
      }
    }
    for (const e of matched) for (const d of e.rule.normal) put(d);
    const inline = styleText !== undefined && styleText.trim() !== '' ? inlineDeclarations(styleText) : [];
    for (const d of inline) if (!d.important) put(d);
    for (const e of matched) for (const d of e.rule.important) put(d);
    for (const d of inline) if (d.important) put(d);
    const result = any ? (Object.freeze(out) as DeclaredStyle) : EMPTY_STYLE;
    cache.set(el, result);
    return result;
  };

  return {
    declared,
    warnings,
    ruleCount: rules.length,
    selectorCount: sorted.length,
  };
}

/** Line and column of source offsets asked for in increasing order (sheets come in document order). */
function lineTracker(source: string): (offset: number) => [number, number] {
  let line = 1;
  let lineStart = 0;
  let next = source.indexOf('\n'); // first newline not yet counted, -1 when none is left
  return (offset) => {
    if (offset < lineStart) {
      line = 1;
      lineStart = 0;
      next = source.indexOf('\n');
    }
    while (next !== -1 && next < offset) {
      line++;
      lineStart = next + 1;
      next = source.indexOf('\n', lineStart);
    }
    return [line, Math.max(0, offset - lineStart) + 1];
  };
}
