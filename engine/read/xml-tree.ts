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
  /** Span of the start tag `<name ...>` (or the whole self-closing tag). */
  openTag: Span;
  /** Span of the whole element, start tag to end of end tag. */
  span: Span;
  attributeSpans: Record<string, AttributeSpan>;
  selfClosing: boolean;
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
