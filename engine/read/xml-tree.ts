/**
 * The document tree produced by the reader. Node shape follows the familiar
 * `{name, type, attributes, children}` form, plus exact source positions so
 * findings can point at line:column and redraw can splice text in place.
 */

/** Byte-free character offsets into the source text (UTF-16 code units). */
export interface Span {
  start: number;
  end: number;
}

export interface AttributeSpan {
  /** Span of the whole `name="value"` text. */
  whole: Span;
  /** Span of the value between the quotes (raw, before entity decoding). */
  value: Span;
}

/** Where an attribute sits in the source, or null when the element has no such attribute. */
export function attributeSpan(doc: XmlDocument, element: XmlElement, name: string): AttributeSpan | null {
  const o = doc.attrOffsets;
  const src = doc.source;
  for (let k = 0; k < element.attrCount; k++) {
    const base = element.attrIndex + 4 * k;
    if (o[base + 1]! - o[base]! === name.length && src.startsWith(name, o[base]!)) {
      const valueEnd = o[base + 3]!;
      return { whole: { start: o[base]!, end: valueEnd + 1 }, value: { start: o[base + 2]!, end: valueEnd } };
    }
  }
  return null;
}

export interface XmlElement {
  type: 'element';
  /** Qualified name as written, minus an `svg:` prefix. */
  name: string;
  attributes: Record<string, string>;
  children: XmlNode[];
  parent: XmlElement | null;
  /** 1-based line and column of the `<` that opens the element. */
  line: number;
  column: number;
  /** Offset of the `<` that opens the element. */
  start: number;
  /** Offset just after the `>` that ends the start tag. */
  openEnd: number;
  /** Offset just after the end tag (or the self-closing start tag). */
  end: number;
  /**
   * Index into the document's `attrOffsets` where this element's attribute
   * offsets begin (four per attribute, in source order: name start, name end,
   * value start, value end). Read with `attributeSpan()`.
   */
  attrIndex: number;
  /** Number of attributes written in the source. */
  attrCount: number;
  selfClosing: boolean;
  /** One attribute's value without building the whole record (undefined when absent). */
  attribute(name: string): string | undefined;
}

export interface XmlText {
  type: 'text';
  value: string;
  span: Span;
  /** true for CDATA sections. */
  cdata: boolean;
}

export type XmlNode = XmlElement | XmlText;

export interface XmlDocument {
  root: XmlElement;
  /** The source text exactly as read (BOM removed). */
  source: string;
  /** Comments are kept only as spans, for formatting-preserving redraw. */
  comments: Span[];
  /**
   * Attribute source offsets of all elements, flat: for each attribute its
   * name start, name end, value start and value end. Elements index it by
   * `attrIndex`.
   */
  attrOffsets: Int32Array;
}

/** A readable error with a position in the source. */
export class SvgReadError extends Error {
  readonly line: number;
  readonly column: number;
  readonly file: string | undefined;
  constructor(message: string, line: number, column: number, file?: string) {
    super(message);
    this.name = 'SvgReadError';
    this.line = line;
    this.column = column;
    this.file = file;
  }
}
