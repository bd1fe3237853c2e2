/**
 * Selector compilation, specificity and matching against the document tree.
 *
 * Supported (Selectors Level 3, plus Level 4 selector lists in `:not()`):
 * type, universal (`*`, `*|x`), class, id, attribute presence and the
 * `=`, `~=`, `|=`, `^=`, `$=`, `*=` matchers (with the `i`/`s` flags),
 * compound selectors, the descendant, child, next-sibling and
 * subsequent-sibling combinators, `:not()` of compound selectors, `:root`,
 * `:first-child`, `:last-child`, `:only-child`, `:nth-child()` and
 * `:nth-last-child()` (without `of S`).
 *
 * A selector that can never match a static document (dynamic pseudo-classes
 * such as `:hover`, pseudo-elements) or that uses a feature not supported here
 * is dropped on its own; the rest of its group still applies. A selector that
 * is invalid CSS makes the whole rule invalid (Selectors 3 §5).
 *
 * The document is XML, so element names, attribute names, ids and classes are
 * matched case-sensitively.
 */
import * as csstree from 'css-tree';
import type { XmlElement } from '../xml-tree.js';
import { asciiLower } from './values.js';

type AttrMatcher = null | '=' | '~=' | '|=' | '^=' | '$=' | '*=';

interface AttrTest {
  readonly name: string;
  readonly matcher: AttrMatcher;
  readonly value: string;
  readonly caseInsensitive: boolean;
}

type StructuralTest =
  | { readonly kind: 'root' }
  | { readonly kind: 'nth'; readonly a: number; readonly b: number; readonly fromEnd: boolean };

interface Compound {
  /** Element name, or null for any element. */
  readonly type: string | null;
  readonly ids: readonly string[];
  readonly classes: readonly string[];
  readonly attrs: readonly AttrTest[];
  readonly structural: readonly StructuralTest[];
  /** Each entry is a `:not()` argument list: the compound matches only if none of them match. */
  readonly nots: readonly (readonly Compound[])[];
}

export type Combinator = ' ' | '>' | '+' | '~';

/** Where a selector's rightmost compound files it in the rule index. */
export type SelectorKey =
  | { readonly kind: 'id'; readonly name: string }
  | { readonly kind: 'class'; readonly name: string }
  | { readonly kind: 'type'; readonly name: string }
  | { readonly kind: 'any' };

export interface CompiledSelector {
  readonly text: string;
  /** Compounds from right to left. */
  readonly compounds: readonly Compound[];
  /** combinators[k] joins compounds[k] (right) to compounds[k + 1] (left). */
  readonly combinators: readonly Combinator[];
  /** (a, b, c) as in Selectors 3 §9. */
  readonly specificity: readonly [number, number, number];
  readonly key: SelectorKey;
}

export type SelectorListResult =
  | { readonly ok: true; readonly selectors: readonly CompiledSelector[]; readonly dropped: readonly DroppedSelector[] }
  | { readonly ok: false; readonly reason: string };

export interface DroppedSelector {
  readonly text: string;
  readonly reason: string;
}

class Unsupported extends Error {}
class Invalid extends Error {}

/** Dynamic and other pseudo-classes that are valid CSS but never match a static rendering here. */
const NEVER_MATCHING_PSEUDO_CLASSES = new Set([
  'hover', 'active', 'focus', 'focus-within', 'focus-visible', 'visited', 'link', 'any-link', 'local-link',
  'target', 'target-within', 'checked', 'disabled', 'enabled', 'indeterminate', 'default', 'valid', 'invalid',
  'in-range', 'out-of-range', 'required', 'optional', 'read-only', 'read-write', 'placeholder-shown',
  'autofill', 'user-valid', 'user-invalid', 'playing', 'paused', 'current', 'past', 'future', 'fullscreen',
  'modal', 'popover-open', 'picture-in-picture', 'defined', 'scope', 'drag', 'drop',
]);
/** Valid pseudo-classes not evaluated here: the selector is dropped. */
const UNSUPPORTED_PSEUDO_CLASSES = new Set([
  'is', 'where', 'has', 'matches', 'any', 'lang', 'dir', 'empty', 'first-of-type', 'last-of-type', 'only-of-type',
  'nth-of-type', 'nth-last-of-type', 'blank', 'host', 'host-context', 'state',
]);
/** CSS 2 pseudo-elements written with one colon. */
const LEGACY_PSEUDO_ELEMENTS = new Set(['before', 'after', 'first-line', 'first-letter']);

/** Compiles a parsed selector list (a rule prelude). */
export function compileSelectorList(list: csstree.CssNode): SelectorListResult {
  if (list.type !== 'SelectorList') return { ok: false, reason: 'unreadable selector' };
  const selectors: CompiledSelector[] = [];
  const dropped: DroppedSelector[] = [];
  const items = list.children.toArray();
  if (items.length === 0) return { ok: false, reason: 'empty selector' };
  for (const item of items) {
    if (item.type !== 'Selector') return { ok: false, reason: 'unreadable selector' };
    const text = csstree.generate(item);
    try {
      selectors.push(compileSelector(item, text));
    } catch (err) {
      if (err instanceof Unsupported) dropped.push({ text, reason: err.message });
      else if (err instanceof Invalid) return { ok: false, reason: `invalid selector '${text}': ${err.message}` };
      else throw err;
    }
  }
  return { ok: true, selectors, dropped };
}

/** Parses and compiles selector text (for callers outside a sheet, and tests). */
export function compileSelectorText(text: string): SelectorListResult {
  let ast: csstree.CssNode;
  let failed = false;
  try {
    ast = csstree.parse(text, { context: 'selectorList', onParseError: () => (failed = true) });
  } catch (err) {
    return { ok: false, reason: `invalid selector: ${(err as Error).message}` };
  }
  if (failed) return { ok: false, reason: 'invalid selector' };
  return compileSelectorList(ast);
}

function compileSelector(selector: csstree.Selector, text: string): CompiledSelector {
  const parts = selector.children.toArray();
  const compoundsLtr: csstree.CssNode[][] = [[]];
  const combinatorsLtr: Combinator[] = [];
  for (const node of parts) {
    if (node.type === 'Combinator') {
      const name = node.name.trim() === '' ? ' ' : node.name.trim();
      if (name !== ' ' && name !== '>' && name !== '+' && name !== '~') throw new Invalid(`unknown combinator '${node.name}'`);
      if (compoundsLtr[compoundsLtr.length - 1]!.length === 0) throw new Invalid('combinator without a selector before it');
      combinatorsLtr.push(name);
      compoundsLtr.push([]);
    } else {
      compoundsLtr[compoundsLtr.length - 1]!.push(node);
    }
  }
  if (compoundsLtr[compoundsLtr.length - 1]!.length === 0) throw new Invalid('combinator without a selector after it');
  const spec: [number, number, number] = [0, 0, 0];
  const compounds = compoundsLtr.map((nodes) => compileCompound(nodes, spec, true)).reverse();
  const combinators = combinatorsLtr.reverse();
  const right = compounds[0]!;
  const key: SelectorKey =
    right.ids.length > 0
      ? { kind: 'id', name: right.ids[0]! }
      : right.classes.length > 0
        ? { kind: 'class', name: right.classes[0]! }
        : right.type !== null
          ? { kind: 'type', name: right.type }
          : { kind: 'any' };
  return { text, compounds, combinators, specificity: spec, key };
}

function isValidIdent(name: string): boolean {
  // CSS Syntax 3 §4.3.9: an identifier cannot start with a digit, or with '-' followed by a digit.
  return name.length > 0 && !/^-?[0-9]/.test(name) && name !== '-';
}

function compileCompound(nodes: readonly csstree.CssNode[], spec: [number, number, number], topLevel: boolean): Compound {
  let type: string | null = null;
  const ids: string[] = [];
  const classes: string[] = [];
  const attrs: AttrTest[] = [];
  const structural: StructuralTest[] = [];
  const nots: Compound[][] = [];
  nodes.forEach((node, index) => {
    switch (node.type) {
      case 'TypeSelector': {
        if (index !== 0) throw new Invalid('type selector must come first in a compound');
        let name = node.name;
        const bar = name.indexOf('|');
        if (bar !== -1) {
          if (name.slice(0, bar) !== '*') throw new Unsupported(`namespace prefix '${name.slice(0, bar)}|' is not supported`);
          name = name.slice(bar + 1);
        }
        if (name !== '*') {
          type = csstree.ident.decode(name);
          spec[2]++;
        }
        break;
      }
      case 'IdSelector': {
        if (!isValidIdent(node.name)) throw new Invalid(`'#${node.name}' is not a valid id selector`);
        ids.push(csstree.ident.decode(node.name));
        spec[0]++;
        break;
      }
      case 'ClassSelector':
        classes.push(csstree.ident.decode(node.name));
        spec[1]++;
        break;
      case 'AttributeSelector': {
        const rawName = node.name.name;
        if (rawName.includes('|')) throw new Unsupported('namespaced attribute selectors are not supported');
        const value = node.value ? (node.value.type === 'String' ? node.value.value : csstree.ident.decode(node.value.name)) : '';
        const flags = node.flags ? asciiLower(node.flags) : null;
        if (flags !== null && flags !== 'i' && flags !== 's') throw new Invalid(`unknown attribute selector flag '${node.flags}'`);
        const matcher = node.matcher as AttrMatcher;
        if (matcher !== null && !['=', '~=', '|=', '^=', '$=', '*='].includes(matcher)) throw new Invalid(`unknown attribute matcher '${matcher}'`);
        attrs.push({ name: csstree.ident.decode(rawName), matcher, value, caseInsensitive: flags === 'i' });
        spec[1]++;
        break;
      }
      case 'PseudoClassSelector': {
        const name = asciiLower(node.name);
        if (name === 'not') {
          if (!topLevel) throw new Unsupported(':not() nested in :not() is not supported');
          const arg = node.children?.first;
          if (!arg || arg.type !== 'SelectorList') throw new Invalid(':not() needs a selector list');
          const options: Compound[] = [];
          let best: [number, number, number] = [0, 0, 0];
          for (const sel of arg.children.toArray()) {
            if (sel.type !== 'Selector') throw new Invalid('unreadable :not() argument');
            const inner = sel.children.toArray();
            if (inner.some((n) => n.type === 'Combinator')) throw new Unsupported(':not() with combinators is not supported');
            if (inner.length === 0) throw new Invalid('empty :not() argument');
            const s: [number, number, number] = [0, 0, 0];
            options.push(compileCompound(inner, s, false));
            if (compareSpecificity(s, best) > 0) best = s;
          }
          // Selectors 4 §16: :not() counts as its most specific argument.
          spec[0] += best[0];
          spec[1] += best[1];
          spec[2] += best[2];
          nots.push(options);
          break;
        }
        if (name === 'root') {
          structural.push({ kind: 'root' });
        } else if (name === 'first-child' || name === 'last-child') {
          structural.push({ kind: 'nth', a: 0, b: 1, fromEnd: name === 'last-child' });
        } else if (name === 'only-child') {
          structural.push({ kind: 'nth', a: 0, b: 1, fromEnd: false }, { kind: 'nth', a: 0, b: 1, fromEnd: true });
        } else if (name === 'nth-child' || name === 'nth-last-child') {
          const arg = node.children?.first;
          if (!arg || arg.type !== 'Nth') throw new Invalid(`:${name}() needs an argument`);
          if (arg.selector) throw new Unsupported(`:${name}(... of S) is not supported`);
          const ab = anPlusB(arg.nth);
          if (!ab) throw new Invalid(`bad :${name}() argument`);
          structural.push({ kind: 'nth', a: ab[0], b: ab[1], fromEnd: name === 'nth-last-child' });
        } else if (LEGACY_PSEUDO_ELEMENTS.has(name)) {
          throw new Unsupported(`pseudo-element ':${name}' draws nothing in SVG`);
        } else if (NEVER_MATCHING_PSEUDO_CLASSES.has(name)) {
          throw new Unsupported(`':${name}' does not apply to a static rendering`);
        } else if (UNSUPPORTED_PSEUDO_CLASSES.has(name)) {
          throw new Unsupported(`':${name}' is not supported`);
        } else {
          throw new Invalid(`unknown pseudo-class ':${node.name}'`);
        }
        spec[1]++;
        break;
      }
      case 'PseudoElementSelector':
        throw new Unsupported(`pseudo-element '::${node.name}' draws nothing in SVG`);
      case 'NestingSelector':
        throw new Unsupported('nesting selector & is not supported');
      default:
        throw new Invalid(`unexpected ${node.type} in selector`);
    }
  });
  return { type, ids, classes, attrs, structural, nots };
}

function anPlusB(node: csstree.AnPlusB | csstree.Identifier): [number, number] | null {
  if (node.type === 'Identifier') {
    const k = asciiLower(node.name);
    return k === 'odd' ? [2, 1] : k === 'even' ? [2, 0] : null;
  }
  const a = node.a === null ? 0 : node.a === '+' || node.a === '' ? 1 : node.a === '-' ? -1 : Number(node.a);
  const b = node.b === null ? 0 : Number(node.b);
  return Number.isInteger(a) && Number.isInteger(b) ? [a, b] : null;
}

/** Compares (a, b, c) specificities lexicographically. */
export function compareSpecificity(x: readonly [number, number, number], y: readonly [number, number, number]): number {
  return x[0] - y[0] || x[1] - y[1] || x[2] - y[2];
}

/** Thrown when matching exceeds its step budget (a hostile sheet or tree). */
export class MatchBudgetExceeded extends Error {
  constructor(limit: number) {
    super(`selector matching exceeded ${limit} steps; the style sheets are too costly for this document`);
    this.name = 'MatchBudgetExceeded';
  }
}

/**
 * Matches compiled selectors against elements, caching per-element class
 * lists and sibling positions. One matcher serves one document.
 */
export class SelectorMatcher {
  private readonly classCache = new WeakMap<XmlElement, readonly string[]>();
  private readonly siblingCache = new WeakMap<XmlElement, readonly XmlElement[]>();
  private readonly indexCache = new WeakMap<XmlElement, number>();
  private steps = 0;

  constructor(private readonly maxSteps: number) {}

  classesOf(el: XmlElement): readonly string[] {
    let list = this.classCache.get(el);
    if (list === undefined) {
      const raw = el.attribute('class');
      list = raw ? raw.split(/[ \t\n\r\f]+/).filter((c) => c !== '') : [];
      this.classCache.set(el, list);
    }
    return list;
  }

  matches(selector: CompiledSelector, el: XmlElement): boolean {
    // Failed (compound, element) pairs: with several descendant or sibling
    // combinators, naive backtracking revisits them exponentially often.
    this.failed = selector.compounds.length > 2 ? new Map() : null;
    return this.matchFrom(selector, 0, el);
  }

  private failed: Map<XmlElement, Set<number>> | null = null;

  private tick(): void {
    if (++this.steps > this.maxSteps) throw new MatchBudgetExceeded(this.maxSteps);
  }

  private matchFrom(sel: CompiledSelector, k: number, el: XmlElement): boolean {
    this.tick();
    const memo = this.failed;
    if (memo !== null && k > 0) {
      const seen = memo.get(el);
      if (seen?.has(k)) return false;
      const ok = this.matchStep(sel, k, el);
      if (!ok) {
        if (seen) seen.add(k);
        else memo.set(el, new Set([k]));
      }
      return ok;
    }
    return this.matchStep(sel, k, el);
  }

  private matchStep(sel: CompiledSelector, k: number, el: XmlElement): boolean {
    if (!this.matchCompound(sel.compounds[k]!, el)) return false;
    if (k === sel.compounds.length - 1) return true;
    const comb = sel.combinators[k]!;
    switch (comb) {
      case '>':
        return el.parent !== null && this.matchFrom(sel, k + 1, el.parent);
      case ' ':
        for (let p = el.parent; p !== null; p = p.parent) if (this.matchFrom(sel, k + 1, p)) return true;
        return false;
      case '+': {
        const prev = this.previousSibling(el);
        return prev !== null && this.matchFrom(sel, k + 1, prev);
      }
      case '~': {
        const sibs = this.siblingsOf(el);
        const at = this.indexOf(el);
        for (let j = at - 1; j >= 0; j--) if (this.matchFrom(sel, k + 1, sibs[j]!)) return true;
        return false;
      }
    }
  }

  private matchCompound(c: Compound, el: XmlElement): boolean {
    if (c.type !== null && c.type !== el.name) return false;
    if (c.ids.length > 0) {
      const id = el.attribute('id');
      for (const want of c.ids) if (id !== want) return false;
    }
    if (c.classes.length > 0) {
      const have = this.classesOf(el);
      for (const want of c.classes) if (!have.includes(want)) return false;
    }
    for (const a of c.attrs) if (!matchAttribute(a, el.attribute(a.name))) return false;
    for (const s of c.structural) {
      if (s.kind === 'root') {
        if (el.parent !== null) return false;
      } else if (!this.matchNth(s, el)) {
        return false;
      }
    }
    for (const options of c.nots) {
      for (const o of options) if (this.matchCompound(o, el)) return false;
    }
    return true;
  }

  private matchNth(s: { a: number; b: number; fromEnd: boolean }, el: XmlElement): boolean {
    if (el.parent === null) {
      // Selectors 4 §14: the root element is the first and last child of its (absent) parent.
      return nthMatches(s.a, s.b, 1);
    }
    const sibs = this.siblingsOf(el);
    const at = this.indexOf(el);
    const pos = s.fromEnd ? sibs.length - at : at + 1;
    return nthMatches(s.a, s.b, pos);
  }

  private siblingsOf(el: XmlElement): readonly XmlElement[] {
    const parent = el.parent;
    if (parent === null) return [el];
    let sibs = this.siblingCache.get(parent);
    if (sibs === undefined) {
      const list: XmlElement[] = [];
      for (const child of parent.children) {
        if (child.type === 'element') {
          this.indexCache.set(child, list.length);
          list.push(child);
        }
      }
      sibs = list;
      this.siblingCache.set(parent, sibs);
    }
    return sibs;
  }

  private indexOf(el: XmlElement): number {
    if (el.parent === null) return 0;
    this.siblingsOf(el);
    return this.indexCache.get(el) ?? 0;
  }

  private previousSibling(el: XmlElement): XmlElement | null {
    const at = this.indexOf(el);
    return at > 0 ? this.siblingsOf(el)[at - 1]! : null;
  }
}

function nthMatches(a: number, b: number, pos: number): boolean {
  if (a === 0) return pos === b;
  const n = (pos - b) / a;
  return Number.isInteger(n) && n >= 0;
}

function matchAttribute(t: AttrTest, actual: string | undefined): boolean {
  if (actual === undefined) return false;
  if (t.matcher === null) return true;
  const have = t.caseInsensitive ? asciiLower(actual) : actual;
  const want = t.caseInsensitive ? asciiLower(t.value) : t.value;
  switch (t.matcher) {
    case '=':
      return have === want;
    case '~=':
      return want !== '' && !/[ \t\n\r\f]/.test(want) && have.split(/[ \t\n\r\f]+/).includes(want);
    case '|=':
      return have === want || have.startsWith(want + '-');
    case '^=':
      return want !== '' && have.startsWith(want);
    case '$=':
      return want !== '' && have.endsWith(want);
    case '*=':
      return want !== '' && have.includes(want);
  }
}
