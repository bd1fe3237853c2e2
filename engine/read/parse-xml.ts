/**
 * A strict, fast XML reader for untrusted SVG text.
 *
 * - keeps the line and column of every element and the spans of every
 *   attribute value (redraw splices edits by these offsets);
 * - refuses entity declarations (no expansion, so no entity bombs) and never
 *   resolves external identifiers;
 * - enforces size and nesting limits;
 * - reports malformed input as SvgReadError with line and column.
 */
import { SvgReadError, type XmlDocument, type XmlElement, type XmlNode, type Span } from './xml-tree.js';

export interface ReadLimits {
  /** Largest accepted source, in UTF-16 code units (≈ bytes for SVG). */
  maxChars: number;
  /** Deepest accepted element nesting. */
  maxDepth: number;
  /** Most elements accepted in one document. */
  maxElements: number;
}

export const DEFAULT_LIMITS: ReadLimits = {
  maxChars: 50 * 1024 * 1024,
  maxDepth: 2000,
  maxElements: 2_000_000,
};

export interface ParseOptions {
  file?: string;
  limits?: Partial<ReadLimits>;
}

const hasOwn = Object.prototype.hasOwnProperty;
const PREDEFINED: Record<string, string> = { lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" };

/** Elements whose whitespace-only text children are kept (they lay out glyphs). */
const TEXT_CONTAINERS = new Set(['text', 'tspan', 'textPath', 'title', 'desc', 'style']);

function isNameStart(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 65 && c <= 90) || c === 95 || c === 58 || c >= 0xc0;
}

function isNameChar(c: number): boolean {
  return isNameStart(c) || (c >= 48 && c <= 57) || c === 45 || c === 46 || c === 0xb7;
}

function isSpace(c: number): boolean {
  return c === 32 || c === 10 || c === 9 || c === 13;
}

export function parseXml(input: string, options: ParseOptions = {}): XmlDocument {
  const limits: ReadLimits = { ...DEFAULT_LIMITS, ...options.limits };
  const file = options.file;
  const src = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
  const n = src.length;

  // Incremental line tracking: positions are requested in increasing order.
  let trackedOffset = 0;
  let trackedLine = 1;
  let trackedLineStart = 0;
  // The next newline at or after trackedOffset (n when there is none): long single-line files stay linear.
  let nextNewline = -1;
  let lastLine = 1;
  let lastColumn = 1;
  const track = (offset: number): void => {
    if (offset < trackedOffset) {
      // Rare (errors pointing backwards): recount from the start.
      trackedOffset = 0;
      trackedLine = 1;
      trackedLineStart = 0;
      nextNewline = -1;
    }
    if (nextNewline < trackedOffset) {
      const nl = src.indexOf('\n', trackedOffset);
      nextNewline = nl === -1 ? n : nl;
    }
    while (nextNewline < offset) {
      trackedLine++;
      trackedLineStart = nextNewline + 1;
      const nl = src.indexOf('\n', trackedLineStart);
      nextNewline = nl === -1 ? n : nl;
    }
    trackedOffset = offset;
    lastLine = trackedLine;
    lastColumn = offset - trackedLineStart + 1;
  };
  const lineCol = (offset: number): [number, number] => {
    track(offset);
    return [lastLine, lastColumn];
  };
  const fail = (message: string, offset: number): never => {
    const [line, column] = lineCol(Math.min(Math.max(offset, 0), n));
    throw new SvgReadError(message, line, column, file);
  };

  if (n > limits.maxChars) {
    throw new SvgReadError(
      `file is larger than the ${limits.maxChars}-character limit (${n} characters)`,
      1,
      1,
      file,
    );
  }
  if (n === 0 || src.trim() === '') throw new SvgReadError('empty document: no SVG element', 1, 1, file);

  const decode = (raw: string, at: number): string => {
    let amp = raw.indexOf('&');
    if (amp === -1) return raw;
    let out = '';
    let last = 0;
    while (amp !== -1) {
      const semi = raw.indexOf(';', amp);
      if (semi === -1 || semi - amp > 12) fail('unterminated character or entity reference', at + amp);
      const name = raw.slice(amp + 1, semi);
      let ch: string | undefined;
      if (name.charCodeAt(0) === 35 /* # */) {
        const hex = name.charCodeAt(1) === 120 || name.charCodeAt(1) === 88;
        const digits = name.slice(hex ? 2 : 1);
        const code = digits !== '' && (hex ? /^[0-9a-fA-F]+$/ : /^[0-9]+$/).test(digits) ? parseInt(digits, hex ? 16 : 10) : NaN;
        if (!Number.isFinite(code) || code <= 0 || code > 0x10ffff || (code >= 0xd800 && code <= 0xdfff)) {
          fail(`invalid character reference &${name};`, at + amp);
        }
        ch = String.fromCodePoint(code);
      } else {
        ch = PREDEFINED[name];
        if (ch === undefined) fail(`undefined entity &${name}; (entity declarations are not supported)`, at + amp);
      }
      out += raw.slice(last, amp) + ch;
      last = semi + 1;
      amp = raw.indexOf('&', last);
    }
    return out + raw.slice(last);
  };

  const stack: XmlElement[] = [];
  const comments: Span[] = [];
  let root: XmlElement | null = null;
  let rootClosed = false;
  let elementCount = 0;
  let offsets = new Int32Array(4096);
  const store: AttributeStore = { src, offsets, decode: (raw, at) => decode(raw, at) };
  let offCount = 0;
  // Names repeat endlessly in charts: reuse one string per distinct name.
  const nameCache = new Map<number, string[]>();
  const nameAt = (start: number, end: number): string => {
    const len = end - start;
    const key = len * 65536 + src.charCodeAt(start) * 64 + (src.charCodeAt(end - 1) & 63);
    let bucket = nameCache.get(key);
    if (bucket) {
      for (const candidate of bucket) if (src.startsWith(candidate, start)) return candidate;
    } else {
      bucket = [];
      nameCache.set(key, bucket);
    }
    const name = src.slice(start, end);
    bucket.push(name);
    return name;
  };
  let i = 0;

  const isBlank = (start: number, end: number): boolean => {
    for (let q = start; q < end; q++) if (!isSpace(src.charCodeAt(q))) return false;
    return true;
  };
  const pushText = (start: number, end: number, cdata: boolean): void => {
    const parent = stack[stack.length - 1];
    if (!parent) {
      if (cdata || !isBlank(start, end)) fail('text outside the root element', start);
      return;
    }
    if (!cdata && !TEXT_CONTAINERS.has(parent.name) && isBlank(start, end)) return;
    const raw = src.slice(start, end);
    const value = cdata ? raw : decode(raw, start);
    parent.children.push({ type: 'text', value, span: { start, end }, cdata });
  };

  while (i < n) {
    const lt = src.indexOf('<', i);
    if (lt === -1) {
      pushText(i, n, false);
      break;
    }
    if (lt > i) pushText(i, lt, false);
    const c1 = src.charCodeAt(lt + 1);

    if (c1 === 33 /* ! */) {
      if (src.startsWith('<!--', lt)) {
        const end = src.indexOf('-->', lt + 4);
        if (end === -1) fail('unterminated comment', lt);
        comments.push({ start: lt, end: end + 3 });
        i = end + 3;
        continue;
      }
      if (src.startsWith('<![CDATA[', lt)) {
        const end = src.indexOf(']]>', lt + 9);
        if (end === -1) fail('unterminated CDATA section', lt);
        if (stack.length === 0) fail('CDATA outside the root element', lt);
        pushText(lt + 9, end, true);
        i = end + 3;
        continue;
      }
      if (src.startsWith('<!DOCTYPE', lt)) {
        if (root) fail('DOCTYPE after the root element', lt);
        i = skipDoctype(lt);
        continue;
      }
      fail('unexpected markup declaration', lt);
    }

    if (c1 === 63 /* ? */) {
      const end = src.indexOf('?>', lt + 2);
      if (end === -1) fail('unterminated processing instruction', lt);
      i = end + 2;
      continue;
    }

    if (c1 === 47 /* / */) {
      let j = lt + 2;
      const nameStart = j;
      while (j < n && isNameChar(src.charCodeAt(j))) j++;
      const rawName = src.slice(nameStart, j);
      while (j < n && isSpace(src.charCodeAt(j))) j++;
      if (src.charCodeAt(j) !== 62 /* > */) fail(`malformed end tag </${rawName}`, lt);
      const open = stack.pop();
      if (!open) fail(`end tag </${rawName}> without a matching start tag`, lt);
      const name = stripSvgPrefix(rawName);
      if (open!.name !== name) fail(`end tag </${rawName}> does not match <${open!.name}> opened at line ${open!.line}`, lt);
      open!.end = j + 1;
      if (stack.length === 0) rootClosed = true;
      i = j + 1;
      continue;
    }

    // Start tag.
    if (rootClosed) fail('content after the root element', lt);
    let j = lt + 1;
    if (!isNameStart(src.charCodeAt(j))) fail("'<' not followed by a tag name", lt);
    const nameStart = j;
    while (j < n && isNameChar(src.charCodeAt(j))) j++;
    const name = stripSvgPrefix(nameAt(nameStart, j));
    const attrIndex = offCount;
    let attrCount = 0;
    let selfClosing = false;
    for (;;) {
      const before = j;
      while (j < n && isSpace(src.charCodeAt(j))) j++;
      if (j >= n) fail(`unterminated start tag <${name}>`, lt);
      const c = src.charCodeAt(j);
      if (c === 62 /* > */) {
        j++;
        break;
      }
      if (c === 47 /* / */) {
        if (src.charCodeAt(j + 1) !== 62) fail(`expected '>' after '/' in <${name}>`, j);
        selfClosing = true;
        j += 2;
        break;
      }
      if (j === before) fail(`expected whitespace before attribute in <${name}>`, j);
      if (!isNameStart(c)) fail(`invalid character in attribute name in <${name}>`, j);
      const attrStart = j;
      while (j < n && isNameChar(src.charCodeAt(j))) j++;
      const attrName = nameAt(attrStart, j);
      while (j < n && isSpace(src.charCodeAt(j))) j++;
      if (src.charCodeAt(j) !== 61 /* = */) fail(`attribute ${attrName} has no value`, attrStart);
      j++;
      while (j < n && isSpace(src.charCodeAt(j))) j++;
      const quote = src.charCodeAt(j);
      if (quote !== 34 && quote !== 39) fail(`attribute ${attrName} value is not quoted`, j);
      const valueStart = j + 1;
      const valueEnd = src.indexOf(quote === 34 ? '"' : "'", valueStart);
      if (valueEnd === -1) fail(`unterminated value of attribute ${attrName}`, j);
      // One pass over the value: '<' is an error, '&' needs decoding (scans stay inside the value).
      let hasAmp = false;
      for (let q = valueStart; q < valueEnd; q++) {
        const ch = src.charCodeAt(q);
        if (ch === 60) fail(`'<' in the value of attribute ${attrName}`, q);
        if (ch === 38) hasAmp = true;
      }
      for (let k = attrIndex; k < offCount; k += 4) {
        if (offsets[k + 1]! - offsets[k]! === attrName.length && src.startsWith(attrName, offsets[k]!)) {
          fail(`duplicate attribute ${attrName}`, attrStart);
        }
      }
      if (hasAmp) decode(src.slice(valueStart, valueEnd), valueStart); // validates references now; decoded again on demand
      attrCount++;
      if (offCount + 4 > offsets.length) {
        const grown = new Int32Array(offsets.length * 2);
        grown.set(offsets);
        offsets = grown;
        store.offsets = grown;
      }
      offsets[offCount++] = attrStart;
      offsets[offCount++] = attrStart + attrName.length;
      offsets[offCount++] = valueStart;
      offsets[offCount++] = valueEnd;
      j = valueEnd + 1;
    }

    track(lt);
    const line = lastLine;
    const column = lastColumn;
    const parent = stack[stack.length - 1] ?? null;
    const element = new SourceElement(store, name, parent, line, column, lt, j, attrIndex, attrCount, selfClosing);
    if (selfClosing) element.children = NO_CHILDREN;
    if (++elementCount > limits.maxElements) fail(`more than ${limits.maxElements} elements`, lt);
    if (parent) parent.children.push(element);
    else if (root) fail('more than one root element', lt);
    else root = element;
    if (!selfClosing) {
      stack.push(element);
      if (stack.length > limits.maxDepth) fail(`elements nested deeper than ${limits.maxDepth} levels`, lt);
    } else if (!parent) {
      rootClosed = true;
    }
    i = j;
  }

  if (stack.length > 0) {
    const open = stack[stack.length - 1]!;
    throw new SvgReadError(`unexpected end of file: <${open.name}> opened at line ${open.line} is not closed`, ...lineCol(n), file);
  }
  if (!root) fail('no root element', 0);
  store.offsets = offsets.subarray(0, offCount);
  return { root: root as XmlElement, source: src, comments, attrOffsets: store.offsets };

  function skipDoctype(start: number): number {
    // <!DOCTYPE name ExternalID? ('[' intSubset ']')? >
    let j = start + 9;
    let quote = 0;
    while (j < n) {
      const c = src.charCodeAt(j);
      if (quote) {
        if (c === quote) quote = 0;
      } else if (c === 34 || c === 39) {
        quote = c;
      } else if (c === 91 /* [ */) {
        const close = src.indexOf(']', j);
        const subset = src.slice(j, close === -1 ? n : close);
        const entity = subset.indexOf('<!ENTITY');
        if (entity !== -1) fail('DOCTYPE declares entities; entity declarations are refused (no expansion)', j + entity);
        if (close === -1) fail('unterminated DOCTYPE internal subset', j);
        j = close;
      } else if (c === 62 /* > */) {
        return j + 1;
      }
      j++;
    }
    return fail('unterminated DOCTYPE', start);
  }
}

/** Shared by every self-closing element (frozen: the tree is read-only after parsing). */
const NO_CHILDREN: XmlNode[] = Object.freeze([]) as unknown as XmlNode[];

interface AttributeStore {
  src: string;
  offsets: Int32Array;
  decode: (raw: string, at: number) => string;
}

/**
 * An element read from source. The reader validates every attribute while
 * scanning but builds the `attributes` record on first use: large files keep
 * only offsets for attributes nobody asks for.
 */
class SourceElement implements XmlElement {
  readonly type = 'element' as const;
  children: XmlNode[] = [];
  end: number;
  private record: Record<string, string> | null = null;
  constructor(
    private readonly store: AttributeStore,
    public name: string,
    public parent: XmlElement | null,
    public line: number,
    public column: number,
    public start: number,
    public openEnd: number,
    public attrIndex: number,
    public attrCount: number,
    public selfClosing: boolean,
  ) {
    this.end = openEnd;
  }

  get attributes(): Record<string, string> {
    if (this.record) return this.record;
    const { src, offsets, decode } = this.store;
    const record: Record<string, string> = {};
    for (let k = 0; k < this.attrCount; k++) {
      const o = this.attrIndex + 4 * k;
      const name = src.slice(offsets[o]!, offsets[o + 1]!);
      const raw = src.slice(offsets[o + 2]!, offsets[o + 3]!);
      const value = raw.indexOf('&') === -1 ? raw : decode(raw, offsets[o + 2]!);
      if (name === '__proto__') Object.defineProperty(record, name, { value, enumerable: true, writable: true, configurable: true });
      else record[name] = value;
    }
    this.record = record;
    return record;
  }

  set attributes(value: Record<string, string>) {
    this.record = value;
  }

  /** One attribute's value without building the whole record (undefined when absent). */
  attribute(name: string): string | undefined {
    if (this.record) return hasOwn.call(this.record, name) ? this.record[name] : undefined;
    const { src, offsets, decode } = this.store;
    for (let k = 0; k < this.attrCount; k++) {
      const o = this.attrIndex + 4 * k;
      if (offsets[o + 1]! - offsets[o]! === name.length && src.startsWith(name, offsets[o]!)) {
        const raw = src.slice(offsets[o + 2]!, offsets[o + 3]!);
        return raw.indexOf('&') === -1 ? raw : decode(raw, offsets[o + 2]!);
      }
    }
    return undefined;
  }
}

function stripSvgPrefix(name: string): string {
  return name.startsWith('svg:') ? name.slice(4) : name;
}

/** All descendants in document order (depth first), without recursion. */
export function* walkElements(root: XmlElement): Generator<XmlElement> {
  const stack: XmlNode[] = [root];
  while (stack.length > 0) {
    const node = stack.pop()!;
    if (node.type !== 'element') continue;
    yield node;
    for (let k = node.children.length - 1; k >= 0; k--) stack.push(node.children[k]!);
  }
}
