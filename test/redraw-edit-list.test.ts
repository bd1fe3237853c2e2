/**
 * The text-splice engine: edits keep everything outside them byte-identical,
 * overlapping edits are refused, and the element helpers produce markup that
 * an independent XML parser (saxes, npm) reads as intended.
 */
import { SaxesParser } from 'saxes';
import { describe, expect, it } from 'vitest';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import { buildCascade } from '../engine/read/style/cascade.js';
import type { XmlElement } from '../engine/read/xml-tree.js';
import {
  applyEdits,
  EditConflictError,
  EditList,
  insertFirstChild,
  mapOffset,
  removeAttribute,
  removeElement,
  setAttribute,
  setTextContent,
} from '../engine/redraw/edit-list.js';
import { removeStyleProperty, scanDeclarations, setStyleProperty } from '../engine/redraw/style-edit.js';

interface SaxElement {
  name: string;
  attributes: Record<string, string>;
  text: string;
  children: SaxElement[];
}

/** The document as the saxes parser (npm) reads it: names, attribute values and text, decoded. */
function saxTree(xml: string): SaxElement {
  const parser = new SaxesParser();
  const stack: SaxElement[] = [];
  let root: SaxElement | null = null;
  parser.on('opentag', (t) => {
    const el: SaxElement = { name: t.name, attributes: { ...(t.attributes as Record<string, string>) }, text: '', children: [] };
    if (stack.length > 0) stack[stack.length - 1]!.children.push(el);
    else root = el;
    stack.push(el);
  });
  parser.on('text', (t) => {
    if (stack.length > 0) stack[stack.length - 1]!.text += t;
  });
  parser.on('closetag', () => void stack.pop());
  parser.write(xml).close();
  if (!root) throw new Error('no root');
  return root;
}

function byId(xml: string, id: string): XmlElement {
  const doc = parseXml(xml);
  for (const el of walkElements(doc.root)) if (el.attribute('id') === id) return el;
  throw new Error(`no #${id}`);
}

const SAMPLE = [
  '<?xml version="1.0"?>',
  '<!-- made by hand -->',
  "<svg xmlns='http://www.w3.org/2000/svg' viewBox='0 0 100 100'>",
  "  <rect id='bg' x='0' y='0' width='100' height='100' style='fill: #eeeeee; stroke: none'/>",
  "  <g id='grid' stroke='#000'>",
  "    <line id='g1' x1='0' y1='50' x2='100' y2='50'/>",
  "    <line id='g2' x1='0' y1='25' x2='100' y2='25'/> <line id='g3' x1='0' y1='75' x2='100' y2='75'/>",
  '  </g>',
  "  <text id='t' x='5' y='95'>A &amp; B</text>",
  '</svg>',
  '',
].join('\r\n');

describe('applyEdits', () => {
  // common practice, no source: a splice changes exactly its span
  it('keeps every character outside the edits', () => {
    const edits = [
      { start: 10, end: 12, text: 'XY' },
      { start: 30, end: 30, text: '<!--in-->' },
      { start: 40, end: 45, text: '' },
    ];
    const out = applyEdits(SAMPLE, edits);
    expect(out.slice(0, 10)).toBe(SAMPLE.slice(0, 10));
    expect(out.slice(12, 30)).toBe(SAMPLE.slice(12, 30));
    expect(out.slice(39, 39 + 10)).toBe(SAMPLE.slice(30, 40));
    expect(out.slice(49)).toBe(SAMPLE.slice(45));
    expect(out.length).toBe(SAMPLE.length + 9 - 5);
  });

  it('gives the same result for edits in any order, and keeps the order of insertions at one offset', () => {
    const edits = [
      { start: 5, end: 5, text: 'a' },
      { start: 5, end: 5, text: 'b' },
      { start: 0, end: 2, text: '__' },
      { start: 5, end: 8, text: 'R' },
    ];
    const forward = applyEdits('0123456789', edits);
    expect(forward).toBe('__234abR89');
    expect(applyEdits('0123456789', [edits[2]!, edits[3]!, edits[0]!, edits[1]!])).toBe(forward);
  });

  it('refuses overlapping edits and accepts touching ones', () => {
    expect(() => applyEdits('0123456789', [{ start: 2, end: 5, text: '' }, { start: 4, end: 6, text: 'x' }])).toThrow(EditConflictError);
    expect(() => applyEdits('0123456789', [{ start: 2, end: 5, text: '' }, { start: 3, end: 3, text: 'x' }])).toThrow(EditConflictError);
    expect(applyEdits('0123456789', [{ start: 2, end: 5, text: '' }, { start: 5, end: 7, text: 'x' }, { start: 2, end: 2, text: 'y' }])).toBe('01yx789');
  });

  it('refuses edits outside the source', () => {
    expect(() => applyEdits('abc', [{ start: 2, end: 4, text: '' }])).toThrow(RangeError);
    expect(() => applyEdits('abc', [{ start: 2, end: 1, text: '' }])).toThrow(RangeError);
  });

  it('adds a list of edits atomically', () => {
    const list = new EditList(10);
    list.add({ start: 1, end: 3, text: 'x' });
    expect(() => list.addAll([{ start: 5, end: 6, text: 'y' }, { start: 2, end: 4, text: 'z' }])).toThrow(EditConflictError);
    expect(list.size).toBe(1);
    list.add({ start: 1, end: 3, text: 'x' }); // the same edit twice is kept once
    expect(list.size).toBe(1);
  });

  it('maps source offsets to output offsets', () => {
    const edits = [
      { start: 2, end: 4, text: 'abc' },
      { start: 6, end: 6, text: 'ZZ' },
    ];
    expect(mapOffset(edits, 0)).toBe(0);
    expect(mapOffset(edits, 2)).toBeNull();
    expect(mapOffset(edits, 3)).toBeNull();
    expect(mapOffset(edits, 4)).toBe(5);
    expect(mapOffset(edits, 6)).toBe(9);
    expect(mapOffset(edits, 7)).toBe(10);
    const out = applyEdits('0123456789', edits);
    expect(out[mapOffset(edits, 7)!]).toBe('7');
  });
});

describe('element helpers', () => {
  it('replaces an attribute value in place, keeping its quotes', () => {
    const doc = parseXml(SAMPLE);
    const g1 = byId(SAMPLE, 'g1');
    const out = applyEdits(SAMPLE, [setAttribute(doc, doc.root.children.find((c): c is XmlElement => c.type === 'element' && c.name === 'g')!.children[0] as XmlElement, 'y1', '51')]);
    expect(out).toBe(SAMPLE.replace("y1='50'", "y1='51'"));
    expect(g1.attribute('y1')).toBe('50');
  });

  it('adds an attribute after the last one, in the document quote style, escaped', () => {
    const doc = parseXml(SAMPLE);
    const t = [...walkElements(doc.root)].find((e) => e.attribute('id') === 't')!;
    const out = applyEdits(SAMPLE, [setAttribute(doc, t, 'data-note', `a "b" & 'c' <d>`)]);
    // Reference: the saxes parser (npm) reads the value back decoded.
    const text = saxTree(out).children.find((c) => c.attributes.id === 't')!;
    expect(text.attributes['data-note']).toBe(`a "b" & 'c' <d>`);
    expect(text.text).toBe('A & B');
    expect(out.split('\r\n').length).toBe(SAMPLE.split('\r\n').length);
  });

  it('removes an attribute with the space before it', () => {
    const doc = parseXml(SAMPLE);
    const g1 = [...walkElements(doc.root)].find((e) => e.attribute('id') === 'g1')!;
    const out = applyEdits(SAMPLE, [removeAttribute(doc, g1, 'x1')!]);
    expect(out).toBe(SAMPLE.replace(" x1='0' y1='50'", " y1='50'"));
    expect(removeAttribute(doc, g1, 'nope')).toBeNull();
  });

  it('removes an element alone on its line together with the line (CRLF kept elsewhere)', () => {
    const doc = parseXml(SAMPLE);
    const bg = [...walkElements(doc.root)].find((e) => e.attribute('id') === 'bg')!;
    const out = applyEdits(SAMPLE, [removeElement(doc, bg)]);
    const lines = SAMPLE.split('\r\n');
    expect(out.split('\r\n')).toEqual([...lines.slice(0, 3), ...lines.slice(4)]);
  });

  it('removes an element that shares its line, and only it', () => {
    const doc = parseXml(SAMPLE);
    const g2 = [...walkElements(doc.root)].find((e) => e.attribute('id') === 'g2')!;
    const out = applyEdits(SAMPLE, [removeElement(doc, g2)]);
    expect(out).toBe(SAMPLE.replace("<line id='g2' x1='0' y1='25' x2='100' y2='25'/>", ''));
    const ids = [...walkElements(parseXml(out).root)].map((e) => e.attribute('id')).filter(Boolean);
    expect(ids).toEqual(['bg', 'grid', 'g1', 'g3', 't']);
  });

  it('inserts a first child with the indentation of the existing children', () => {
    const doc = parseXml(SAMPLE);
    const out = applyEdits(SAMPLE, [insertFirstChild(doc, doc.root, '<title>T</title>')]);
    const lines = out.split('\r\n');
    expect(lines[3]).toBe('  <title>T</title>');
    expect(lines[4]).toBe(SAMPLE.split('\r\n')[3]);
    // Reference: saxes sees <title> as the root's first child.
    expect(saxTree(out).children[0]!.name).toBe('title');
  });

  it('opens a self-closing element to insert a child', () => {
    const src = '<svg xmlns="http://www.w3.org/2000/svg"/>';
    const doc = parseXml(src);
    const out = applyEdits(src, [insertFirstChild(doc, doc.root, '<desc>d</desc>')]);
    expect(out).toBe('<svg xmlns="http://www.w3.org/2000/svg"><desc>d</desc></svg>');
  });

  it('replaces text content escaped', () => {
    const doc = parseXml(SAMPLE);
    const t = [...walkElements(doc.root)].find((e) => e.attribute('id') === 't')!;
    const out = applyEdits(SAMPLE, [setTextContent(doc, t, 'x < y & z')]);
    expect(saxTree(out).children.find((c) => c.attributes.id === 't')!.text).toBe('x < y & z');
  });
});

describe('style edits', () => {
  it('reads declaration spans of a style text', () => {
    const text = " fill: #eee ; stroke:url('a;b') !important;font: 10px 'X; Y'";
    const d = scanDeclarations(text);
    expect(d.map((x) => x.name)).toEqual(['fill', 'stroke', 'font']);
    expect(d.map((x) => text.slice(x.valueStart, x.valueEnd))).toEqual(['#eee', "url('a;b')", "10px 'X; Y'"]);
    expect(d.map((x) => x.important)).toEqual([false, true, false]);
  });

  it('rewrites a style="" declaration in place, a presentation attribute in place, and overrides a sheet inline', () => {
    const src = [
      '<svg xmlns="http://www.w3.org/2000/svg">',
      '<style>.k { stroke: red }</style>',
      '<path id="a" style="fill: #eeeeee; stroke: none" d="M0 0"/>',
      '<path id="b" stroke="#000" d="M0 0"/>',
      '<path id="c" class="k" stroke="#000" d="M0 0"/>',
      '<path id="d" d="M0 0"/>',
      '</svg>',
    ].join('\n');
    const doc = parseXml(src);
    const cascade = buildCascade(doc);
    const el = (id: string): XmlElement => [...walkElements(doc.root)].find((e) => e.attribute('id') === id)!;
    const edits = [
      ...setStyleProperty(doc, cascade, el('a'), 'stroke', '#123456'),
      ...setStyleProperty(doc, cascade, el('b'), 'stroke', '#123456'),
      ...setStyleProperty(doc, cascade, el('c'), 'stroke', '#123456'),
      ...setStyleProperty(doc, cascade, el('d'), 'stroke', '#123456'),
    ];
    const out = applyEdits(src, edits);
    const lines = out.split('\n');
    expect(lines[2]).toBe('<path id="a" style="fill: #eeeeee; stroke: #123456" d="M0 0"/>');
    expect(lines[3]).toBe('<path id="b" stroke="#123456" d="M0 0"/>');
    expect(lines[4]).toBe('<path id="c" class="k" stroke="#000" d="M0 0" style="stroke: #123456"/>');
    expect(lines[5]).toBe('<path id="d" d="M0 0" stroke="#123456"/>');
    // The cascade of the output gives every path the new stroke.
    const doc2 = parseXml(out);
    const c2 = buildCascade(doc2);
    for (const e of walkElements(doc2.root)) if (e.name === 'path') expect(c2.declared(e).stroke?.text).toBe('#123456');
  });

  it('removes a property from style="" and from attributes', () => {
    const src = '<svg xmlns="http://www.w3.org/2000/svg"><g id="g" filter="url(#f)" style="opacity: 1; filter: url(#f)"/></svg>';
    const doc = parseXml(src);
    const g = [...walkElements(doc.root)].find((e) => e.attribute('id') === 'g')!;
    const out = applyEdits(src, removeStyleProperty(doc, buildCascade(doc), g, 'filter', 'none'));
    expect(out).toBe('<svg xmlns="http://www.w3.org/2000/svg"><g id="g" style="opacity: 1;"/></svg>');
  });
});
