import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import { decodeSvgBytes } from '../engine/read/read-file.js';
import { SvgReadError, attributeSpan } from '../engine/read/xml-tree.js';

const realCharts = resolve(import.meta.dirname, '../../shared/real-charts');

function errorOf(fn: () => unknown): SvgReadError {
  try {
    fn();
  } catch (err) {
    if (err instanceof SvgReadError) return err;
    throw err;
  }
  throw new Error('expected a read error');
}

describe('parseXml', () => {
  it('keeps line and column of every element and the spans of attribute values', () => {
    const src = '<svg xmlns="http://www.w3.org/2000/svg">\n  <g id="a">\n    <rect x="1" y="2"/>\n  </g>\n</svg>';
    const doc = parseXml(src);
    const rect = [...walkElements(doc.root)].find((e) => e.name === 'rect')!;
    expect([rect.line, rect.column]).toEqual([3, 5]);
    const span = attributeSpan(doc, rect, 'y')!;
    expect(src.slice(span.value.start, span.value.end)).toBe('2');
    expect(src.slice(span.whole.start, span.whole.end)).toBe('y="2"');
    expect(src.slice(rect.start, rect.end)).toBe('<rect x="1" y="2"/>');
    const g = rect.parent!;
    expect(src.slice(g.start, g.end)).toBe('<g id="a">\n    <rect x="1" y="2"/>\n  </g>');
  });

  it('decodes the predefined entities and character references', () => {
    // source: XML 1.0 (Fifth Edition), §4.1 and §4.6 (predefined entities)
    const doc = parseXml('<svg><text a="&lt;&amp;&#65;&#x42;">x &gt; y</text></svg>');
    const text = doc.root.children[0]!;
    expect(text.type === 'element' && text.attributes.a).toBe('<&AB');
    expect(text.type === 'element' && text.children[0]!.type === 'text' && text.children[0]!.value).toBe('x > y');
  });

  it('accepts a DOCTYPE with an external identifier and never resolves it', () => {
    const doc = parseXml('<?xml version="1.0"?>\n<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">\n<svg/>');
    expect(doc.root.name).toBe('svg');
  });

  it('refuses entity declarations (billion laughs) at their position', () => {
    // source: OWASP XML External Entity Prevention Cheat Sheet (entity expansion attacks)
    const bomb = '<?xml version="1.0"?>\n<!DOCTYPE lolz [\n <!ENTITY lol "lol">\n <!ENTITY lol2 "&lol;&lol;&lol;">\n]>\n<svg>&lol2;</svg>';
    const err = errorOf(() => parseXml(bomb, { file: 'bomb.svg' }));
    expect(err.message).toMatch(/entity declarations are refused/);
    expect([err.line, err.column]).toEqual([3, 2]);
    expect(err.file).toBe('bomb.svg');
  });

  it('refuses external entities', () => {
    const xxe = '<!DOCTYPE svg [<!ENTITY x SYSTEM "file:///etc/passwd">]><svg>&x;</svg>';
    expect(errorOf(() => parseXml(xxe)).message).toMatch(/entity/);
  });

  it('reports an undefined entity reference with its position', () => {
    const err = errorOf(() => parseXml('<svg>\n<text>&nbsp;</text></svg>'));
    expect(err.message).toMatch(/undefined entity &nbsp;/);
    expect([err.line, err.column]).toEqual([2, 7]);
  });

  it('limits nesting depth', () => {
    const deep = '<svg>' + '<g>'.repeat(3000) + '</g>'.repeat(3000) + '</svg>';
    const err = errorOf(() => parseXml(deep));
    expect(err.message).toMatch(/nested deeper than 2000/);
    expect(err.line).toBe(1);
    expect(err.column).toBe(5 + 1999 * 3 + 1);
  });

  it('limits size before parsing', () => {
    const err = errorOf(() => parseXml('<svg>' + ' '.repeat(200) + '</svg>', { limits: { maxChars: 100 } }));
    expect(err.message).toMatch(/larger than the 100-character limit/);
  });

  it('reports truncated and mismatched documents with line and column', () => {
    const truncated = errorOf(() => parseXml('<svg>\n  <g>\n    <rect x="1'));
    expect(truncated.message).toMatch(/unterminated value of attribute x/);
    expect([truncated.line, truncated.column]).toEqual([3, 13]);
    const unclosed = errorOf(() => parseXml('<svg>\n<g>\n</svg>'));
    expect(unclosed.message).toMatch(/<\/svg> does not match <g>/);
    expect([unclosed.line, unclosed.column]).toEqual([3, 1]);
    const eof = errorOf(() => parseXml('<svg>\n<g></g>\n'));
    expect(eof.message).toMatch(/<svg> opened at line 1 is not closed/);
  });

  it('rejects empty input, duplicate attributes, unquoted values and text outside the root', () => {
    expect(errorOf(() => parseXml('')).message).toMatch(/empty document/);
    expect(errorOf(() => parseXml('<svg a="1" a="2"/>')).message).toMatch(/duplicate attribute a/);
    expect(errorOf(() => parseXml('<svg a=1/>')).message).toMatch(/not quoted/);
    expect(errorOf(() => parseXml('hello <svg/>')).message).toMatch(/text outside the root/);
  });

  it('strips a byte-order mark and keeps CDATA style sheets', () => {
    const doc = parseXml('\ufeff<svg><style><![CDATA[ .a > b { fill: red } ]]></style></svg>');
    const style = doc.root.children[0]!;
    expect(style.type === 'element' && style.children[0]!.type === 'text' && style.children[0]!.value).toBe(' .a > b { fill: red } ');
  });

  it('treats a __proto__ attribute as a plain attribute', () => {
    const doc = parseXml('<svg __proto__="x" y="1"/>');
    expect(Object.keys(doc.root.attributes)).toEqual(['__proto__', 'y']);
    expect(Object.getPrototypeOf(doc.root.attributes)).toBe(Object.prototype);
  });

  it('reads every real chart', () => {
    for (const name of readdirSync(realCharts).filter((f) => f.endsWith('.svg'))) {
      const doc = parseXml(readFileSync(resolve(realCharts, name), 'utf8'), { file: name });
      expect(doc.root.name).toBe('svg');
    }
  });
});

describe('decodeSvgBytes', () => {
  it('reports invalid UTF-8 at its line and column', () => {
    const bytes = Buffer.concat([Buffer.from('<svg>\n<text>ab'), Buffer.from([0xc3, 0x28]), Buffer.from('</text></svg>')]);
    const err = errorOf(() => decodeSvgBytes(bytes, 'bad.svg'));
    expect(err.message).toMatch(/invalid UTF-8 byte 0xc3/);
    expect([err.line, err.column]).toEqual([2, 9]);
  });
});
