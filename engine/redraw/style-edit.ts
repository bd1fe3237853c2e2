/**
 * Setting and removing one style property of one element as a text edit,
 * where the cascade says the value comes from: a `style=""` declaration is
 * rewritten in place; a presentation attribute is rewritten in place; a value
 * that a `<style>` sheet gives is overridden by an inline declaration (sheets
 * beat presentation attributes); an undeclared property becomes a
 * presentation attribute (or an inline declaration for properties that have
 * no attribute form).
 */
import type { Cascade } from '../read/style/cascade.js';
import { PRESENTATION_ATTRIBUTES, type StyleProperty } from '../read/style/properties.js';
import { attributeSpan, type XmlDocument, type XmlElement } from '../read/xml-tree.js';
import { addAttribute, escapeAttribute, removeAttribute, setAttribute, type Edit } from './edit-list.js';

/** One `name: value` declaration of a style text, with offsets relative to the start of that text. */
export interface DeclarationSpan {
  name: string;
  /** The whole declaration, from its name to its `;` (inclusive) or the end of the text. */
  start: number;
  end: number;
  /** The value, trimmed, without `!important`. */
  valueStart: number;
  valueEnd: number;
  important: boolean;
}

/** Splits a declaration list (the text of `style=""` or of a rule block) at top-level semicolons. */
export function scanDeclarations(text: string): DeclarationSpan[] {
  const out: DeclarationSpan[] = [];
  let i = 0;
  const n = text.length;
  while (i < n) {
    // One declaration: up to a top-level ';'.
    const start = i;
    let depth = 0;
    let quote = '';
    let j = i;
    for (; j < n; j++) {
      const c = text[j]!;
      if (quote) {
        if (c === '\\') j++;
        else if (c === quote) quote = '';
      } else if (c === '"' || c === "'") quote = c;
      else if (c === '(') depth++;
      else if (c === ')') depth = Math.max(0, depth - 1);
      else if (c === ';' && depth === 0) break;
    }
    const declEnd = j;
    const colon = text.indexOf(':', start);
    if (colon !== -1 && colon < declEnd) {
      const rawName = text.slice(start, colon);
      const name = rawName.trim().toLowerCase();
      let vs = colon + 1;
      while (vs < declEnd && /\s/.test(text[vs]!)) vs++;
      let ve = declEnd;
      while (ve > vs && /\s/.test(text[ve - 1]!)) ve--;
      let important = false;
      const bang = /!\s*important$/i.exec(text.slice(vs, ve));
      if (bang) {
        important = true;
        ve = vs + bang.index;
        while (ve > vs && /\s/.test(text[ve - 1]!)) ve--;
      }
      let ds = start;
      while (ds < colon && /\s/.test(text[ds]!)) ds++;
      if (name !== '' && !/\s/.test(name)) {
        out.push({ name, start: ds, end: declEnd < n ? declEnd + 1 : declEnd, valueStart: vs, valueEnd: ve, important });
      }
    }
    i = declEnd + 1;
  }
  return out;
}

/** The raw text of the element's style attribute and where its value starts, or null. */
function styleAttribute(doc: XmlDocument, el: XmlElement): { raw: string; at: number; end: number; quote: '"' | "'" } | null {
  const span = attributeSpan(doc, el, 'style');
  if (!span) return null;
  const raw = doc.source.slice(span.value.start, span.value.end);
  const quote = doc.source[span.value.end] === "'" ? "'" : '"';
  return { raw, at: span.value.start, end: span.value.end, quote };
}

/** Raw style text that entity references would make unsafe to edit by offset. */
function opaque(raw: string): boolean {
  return raw.includes('&');
}

/** Appends a declaration to an existing style attribute's value. */
function appendDeclaration(style: { raw: string; end: number; quote: '"' | "'" }, property: string, value: string, important: boolean): Edit {
  const trimmedEnd = style.raw.replace(/\s+$/, '');
  const needsSemicolon = trimmedEnd !== '' && !trimmedEnd.endsWith(';');
  const at = style.end - (style.raw.length - trimmedEnd.length);
  const sep = trimmedEnd === '' ? '' : needsSemicolon ? '; ' : ' ';
  const decl = `${property}: ${value}${important ? ' !important' : ''}`;
  return { start: at, end: at, text: escapeAttribute(sep + decl, style.quote) };
}

/**
 * Edits that make `property` of `el` take `value`. The cascade must be the
 * one of `doc`. Values are written as given (callers pass plain CSS values).
 */
export function setStyleProperty(doc: XmlDocument, cascade: Cascade, el: XmlElement, property: StyleProperty, value: string): Edit[] {
  const declared = cascade.declared(el)[property];
  const style = styleAttribute(doc, el);
  if (style && !opaque(style.raw)) {
    const decls = scanDeclarations(style.raw).filter((d) => d.name === property);
    const last = decls[decls.length - 1];
    if (last) {
      // Rewrite the declaration that wins inside the attribute (the last one, or the last !important one).
      const winner = decls.filter((d) => d.important).pop() ?? last;
      return [{ start: style.at + winner.valueStart, end: style.at + winner.valueEnd, text: escapeAttribute(value, style.quote) }];
    }
  }
  const inlineNeeded = declared?.origin === 'sheet' || declared?.origin === 'inline' || !PRESENTATION_ATTRIBUTES.has(property);
  if (!inlineNeeded) {
    const attr = attributeSpan(doc, el, property);
    if (attr) return [setAttribute(doc, el, property, value)];
    return [addAttribute(doc, el, property, value)];
  }
  const important = declared?.important === true;
  if (style && !opaque(style.raw)) return [appendDeclaration(style, property, value, important)];
  if (style) {
    // A style attribute written with entity references: replace it whole with its decoded text plus the declaration.
    const decoded = el.attribute('style') ?? '';
    const sep = decoded.trim() === '' || decoded.trim().endsWith(';') ? ' ' : '; ';
    return [setAttribute(doc, el, 'style', `${decoded.trim()}${sep}${property}: ${value}${important ? ' !important' : ''}`.trim())];
  }
  return [addAttribute(doc, el, 'style', `${property}: ${value}${important ? ' !important' : ''}`)];
}

/**
 * Edits that remove `property` from the element's own declarations (its
 * attribute and its style="" declarations). A value from a sheet is
 * overridden with `fallback` inline instead (e.g. `none`).
 */
export function removeStyleProperty(doc: XmlDocument, cascade: Cascade, el: XmlElement, property: StyleProperty, fallback: string): Edit[] {
  const edits: Edit[] = [];
  const style = styleAttribute(doc, el);
  let inline = false;
  if (style) {
    if (opaque(style.raw)) return setStyleProperty(doc, cascade, el, property, fallback);
    for (const d of scanDeclarations(style.raw)) {
      if (d.name !== property) continue;
      inline = true;
      let s = d.start;
      // Take the whitespace before the declaration when it is not the first one.
      while (s > 0 && /\s/.test(style.raw[s - 1]!)) s--;
      if (s === 0) s = d.start;
      edits.push({ start: style.at + s, end: style.at + d.end, text: '' });
    }
  }
  const attr = removeAttribute(doc, el, property);
  if (attr) edits.push(attr);
  const declared = cascade.declared(el)[property];
  if (declared?.origin === 'sheet') return setStyleProperty(doc, cascade, el, property, fallback);
  if (edits.length === 0 && !inline) return [];
  return edits;
}
