/**
 * Text splices on the original SVG source. An edit replaces the characters
 * [start, end) of the source with new text; everything outside the edits stays
 * byte-identical (formatting, comments, ids, element order). Edits may not
 * overlap: a list that would need one edit applied inside another is refused.
 * Insertions (start === end) at the same offset are kept in the order added.
 */
import { attributeSpan, type XmlDocument, type XmlElement, type XmlNode, type XmlText } from '../read/xml-tree.js';

export interface Edit {
  /** Offsets into the source the document was read from (BOM removed). */
  start: number;
  end: number;
  text: string;
}

export class EditConflictError extends Error {
  readonly a: Edit;
  readonly b: Edit;
  constructor(a: Edit, b: Edit) {
    super(`edits overlap: [${a.start}, ${a.end}) and [${b.start}, ${b.end})`);
    this.name = 'EditConflictError';
    this.a = a;
    this.b = b;
  }
}

/** Two edits conflict when one would have to be applied inside the other. Equal edits do not conflict (one is kept). */
export function editsOverlap(a: Edit, b: Edit): boolean {
  if (a.start === a.end && b.start === b.end) return false;
  if (a.start === a.end) return a.start > b.start && a.start < b.end;
  if (b.start === b.end) return b.start > a.start && b.start < a.end;
  return a.start < b.end && b.start < a.end;
}

function sameEdit(a: Edit, b: Edit): boolean {
  return a.start === b.start && a.end === b.end && a.text === b.text;
}

/** Edits kept sorted by position; `add` refuses an edit that overlaps one already held. */
export class EditList {
  private readonly items: Edit[] = [];

  constructor(private readonly sourceLength: number) {}

  get size(): number {
    return this.items.length;
  }

  /** The edits in application order. */
  get edits(): readonly Edit[] {
    return this.items;
  }

  /** The held edit that `e` would overlap, or null. An identical edit held already counts as no conflict. */
  conflictOf(e: Edit): Edit | null {
    const i = this.lowerBound(e.start);
    for (let k = Math.max(0, i - 1); k < this.items.length; k++) {
      const h = this.items[k]!;
      if (h.start > e.end) break;
      if (sameEdit(h, e)) continue;
      if (editsOverlap(h, e)) return h;
    }
    // An edit starting earlier may still cover e.start.
    for (let k = i - 2; k >= 0; k--) {
      const h = this.items[k]!;
      if (h.end <= e.start) break;
      if (!sameEdit(h, e) && editsOverlap(h, e)) return h;
    }
    return null;
  }

  /** true when an identical edit is held. */
  has(e: Edit): boolean {
    const i = this.lowerBound(e.start);
    for (let k = i; k < this.items.length && this.items[k]!.start === e.start; k++) if (sameEdit(this.items[k]!, e)) return true;
    return false;
  }

  /** Adds an edit; an identical one already held is not added twice. Throws EditConflictError on overlap. */
  add(e: Edit): void {
    checkEdit(e, this.sourceLength);
    if (this.has(e)) return;
    const c = this.conflictOf(e);
    if (c) throw new EditConflictError(c, e);
    // Insert after every held edit that starts at or before e.start (stable for insertions at one offset);
    // an insertion at the start of a held replacement goes before it.
    let k = this.items.length;
    while (k > 0) {
      const h = this.items[k - 1]!;
      if (h.start < e.start || (h.start === e.start && !(e.start === e.end && h.end > h.start))) break;
      k--;
    }
    this.items.splice(k, 0, e);
  }

  /** Adds all edits or none: on a conflict nothing is added and the error is thrown. */
  addAll(edits: readonly Edit[]): void {
    const trial = new EditList(this.sourceLength);
    for (const e of this.items) trial.items.push(e);
    for (const e of edits) trial.add(e);
    this.items.length = 0;
    this.items.push(...trial.items);
  }

  apply(source: string): string {
    return applyEdits(source, this.items);
  }

  /** Where an offset of the source lands in the output; null when an edit replaced it. */
  mapOffset(offset: number): number | null {
    return mapOffset(this.items, offset);
  }

  private lowerBound(start: number): number {
    let lo = 0;
    let hi = this.items.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.items[mid]!.start < start) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }
}

function checkEdit(e: Edit, n: number): void {
  if (!Number.isInteger(e.start) || !Number.isInteger(e.end) || e.start < 0 || e.end < e.start || e.end > n) {
    throw new RangeError(`edit [${e.start}, ${e.end}) is outside the source (length ${n})`);
  }
}

/**
 * Applies edits to a source. The edits must not overlap (EditConflictError);
 * they may be given in any order. Insertions at one offset keep their order.
 */
export function applyEdits(source: string, edits: readonly Edit[]): string {
  const list = new EditList(source.length);
  for (const e of edits) list.add(e);
  const sorted = list.edits;
  const parts: string[] = [];
  let at = 0;
  for (const e of sorted) {
    parts.push(source.slice(at, e.start), e.text);
    at = e.end;
  }
  parts.push(source.slice(at));
  return parts.join('');
}

/**
 * Where `offset` of the source lands after the edits (sorted, non-overlapping).
 * An offset at which text is inserted moves behind the insertion; an offset
 * inside a replaced or removed span (or at its start) maps to null.
 */
export function mapOffset(edits: readonly Edit[], offset: number): number | null {
  let delta = 0;
  for (const e of edits) {
    if (e.start > offset) break;
    if (e.start === e.end) {
      delta += e.text.length;
      continue;
    }
    if (offset < e.end) return null;
    delta += e.text.length - (e.end - e.start);
  }
  return offset + delta;
}

// --- XML text helpers --------------------------------------------------------------------------

/** Escapes text for an element's content. */
export function escapeText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Escapes text for an attribute value in the given quotes. */
export function escapeAttribute(s: string, quote: '"' | "'" = '"'): string {
  const t = s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/\t/g, '&#9;').replace(/\n/g, '&#10;').replace(/\r/g, '&#13;');
  return quote === '"' ? t.replace(/"/g, '&quot;') : t.replace(/'/g, '&apos;');
}

/** The quote character the element's attributes use (the first one's), else the document's habit, else `"`. */
export function quoteOf(doc: XmlDocument, el: XmlElement): '"' | "'" {
  const o = doc.attrOffsets;
  if (el.attrCount > 0) {
    const c = doc.source[o[el.attrIndex + 3]!];
    if (c === "'" || c === '"') return c;
  }
  const rootQuote = doc.root.attrCount > 0 ? doc.source[o[doc.root.attrIndex + 3]!] : '"';
  return rootQuote === "'" ? "'" : '"';
}

/** Offset just after the element's name in its start tag. */
function nameEnd(doc: XmlDocument, el: XmlElement): number {
  const src = doc.source;
  let i = el.start + 1;
  while (i < el.openEnd && !/[\s/>]/.test(src[i]!)) i++;
  return i;
}

/** The namespace prefix the element's name is written with (`svg:` or ''), for new sibling or child elements. */
export function namePrefix(doc: XmlDocument, el: XmlElement): string {
  const raw = doc.source.slice(el.start + 1, nameEnd(doc, el));
  const colon = raw.indexOf(':');
  return colon === -1 ? '' : raw.slice(0, colon + 1);
}

/** Offset where a new attribute goes: after the last attribute, else after the name. */
function attributeInsertionPoint(doc: XmlDocument, el: XmlElement): number {
  if (el.attrCount > 0) {
    const o = doc.attrOffsets;
    return o[el.attrIndex + 4 * (el.attrCount - 1) + 3]! + 1;
  }
  return nameEnd(doc, el);
}

/** Sets an attribute's value: replaces the value when the attribute is written, else adds it at the end of the start tag. */
export function setAttribute(doc: XmlDocument, el: XmlElement, name: string, value: string): Edit {
  const span = attributeSpan(doc, el, name);
  const q = quoteOf(doc, el);
  if (span) {
    const quote = doc.source[span.value.end] === "'" ? "'" : '"';
    return { start: span.value.start, end: span.value.end, text: escapeAttribute(value, quote) };
  }
  const at = attributeInsertionPoint(doc, el);
  return { start: at, end: at, text: ` ${name}=${q}${escapeAttribute(value, q)}${q}` };
}

/** Adds an attribute at the end of the start tag (the caller knows it is not written yet). */
export function addAttribute(doc: XmlDocument, el: XmlElement, name: string, value: string): Edit {
  const q = quoteOf(doc, el);
  const at = attributeInsertionPoint(doc, el);
  return { start: at, end: at, text: ` ${name}=${q}${escapeAttribute(value, q)}${q}` };
}

/** Removes a written attribute with the whitespace before it; null when the element has no such attribute. */
export function removeAttribute(doc: XmlDocument, el: XmlElement, name: string): Edit | null {
  const span = attributeSpan(doc, el, name);
  if (!span) return null;
  let start = span.whole.start;
  while (start > el.start && /\s/.test(doc.source[start - 1]!)) start--;
  return { start, end: span.whole.end, text: '' };
}

/**
 * Removes an element's whole span. When the element is alone on its line(s),
 * the line goes too: the newline before it and the whitespace around it.
 */
export function removeElement(doc: XmlDocument, el: XmlElement): Edit {
  const src = doc.source;
  let before = el.start;
  while (before > 0 && (src[before - 1] === ' ' || src[before - 1] === '\t')) before--;
  let after = el.end;
  while (after < src.length && (src[after] === ' ' || src[after] === '\t')) after++;
  const lineStartsHere = before === 0 || src[before - 1] === '\n';
  const lineEndsHere = after === src.length || src[after] === '\n' || src[after] === '\r';
  if (lineStartsHere && lineEndsHere && before > 0) {
    // Take the newline before (\n or \r\n) so the line disappears.
    let start = before - 1;
    if (start > 0 && src[start - 1] === '\r') start--;
    return { start, end: after, text: '' };
  }
  return { start: el.start, end: el.end, text: '' };
}

/** Replaces an element's whole span by new markup. */
export function replaceElement(el: XmlElement, markup: string): Edit {
  return { start: el.start, end: el.end, text: markup };
}

/** Inserts markup just after the element (as its next sibling). */
export function insertAfter(el: XmlElement, markup: string): Edit {
  return { start: el.end, end: el.end, text: markup };
}

/**
 * Inserts markup as the element's first child. A self-closing element is
 * opened and closed around it. When the element's content starts with a
 * newline and indentation, the new child gets the same.
 */
export function insertFirstChild(doc: XmlDocument, el: XmlElement, markup: string): Edit {
  const src = doc.source;
  if (el.selfClosing) {
    let slash = el.openEnd - 2;
    while (slash > el.start && src[slash] !== '/') slash--;
    const rawName = src.slice(el.start + 1, nameEnd(doc, el));
    return { start: slash, end: el.openEnd, text: `>${markup}</${rawName}>` };
  }
  return { start: el.openEnd, end: el.openEnd, text: indentationAfter(src, el.openEnd) + markup };
}

/** The newline and indentation that follow `at` when the text there is whitespace up to a `<` (else ''). */
export function indentationAfter(src: string, at: number): string {
  let i = at;
  while (i < src.length && /\s/.test(src[i]!)) i++;
  const ws = src.slice(at, i);
  const nl = ws.lastIndexOf('\n');
  if (nl === -1) return '';
  const eol = nl > 0 && ws[nl - 1] === '\r' ? '\r\n' : '\n';
  return eol + ws.slice(nl + 1);
}

/** The indentation of the line an offset is on (spaces and tabs from the line start). */
export function lineIndentation(src: string, at: number): string {
  let s = at;
  while (s > 0 && src[s - 1] !== '\n') s--;
  let e = s;
  while (e < src.length && (src[e] === ' ' || src[e] === '\t')) e++;
  return src.slice(s, e);
}

/** The text nodes under an element, in document order. */
export function textNodesOf(el: XmlElement): XmlText[] {
  const out: XmlText[] = [];
  const visit = (n: XmlNode): void => {
    if (n.type === 'text') out.push(n);
    else for (const c of n.children) visit(c);
  };
  for (const c of el.children) visit(c);
  return out;
}

/** Replaces the content of an element (between its start and end tags) by escaped text. */
export function setTextContent(doc: XmlDocument, el: XmlElement, text: string): Edit {
  if (el.selfClosing) return insertFirstChild(doc, el, escapeText(text));
  const close = doc.source.lastIndexOf('</', el.end);
  return { start: el.openEnd, end: close, text: escapeText(text) };
}
