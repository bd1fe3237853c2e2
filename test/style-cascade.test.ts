import { describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import http from 'node:http';
import https from 'node:https';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import { buildCascade, compileSelectorText, computeStyle, type Cascade, type ComputedStyle } from '../engine/read/style/index.js';
import { SvgReadError, type XmlDocument, type XmlElement } from '../engine/read/xml-tree.js';

const SVG = (body: string, sheet = ''): string =>
  `<svg xmlns="http://www.w3.org/2000/svg">${sheet ? `<style>${sheet}</style>` : ''}${body}</svg>`;

function byId(doc: XmlDocument, id: string): XmlElement {
  for (const el of walkElements(doc.root)) if (el.attribute('id') === id) return el;
  throw new Error(`no element #${id}`);
}

/** Computed style of an element through its ancestors in the document tree. */
function styleOf(cascade: Cascade, el: XmlElement): ComputedStyle {
  const parent = el.parent ? styleOf(cascade, el.parent) : null;
  return computeStyle(cascade.declared(el), parent);
}

function setup(body: string, sheet = ''): { doc: XmlDocument; cascade: Cascade; style: (id: string) => ComputedStyle } {
  const doc = parseXml(SVG(body, sheet));
  const cascade = buildCascade(doc);
  return { doc, cascade, style: (id) => styleOf(cascade, byId(doc, id)) };
}

describe('cascade order', () => {
  it('ranks id over class over type, whatever the source order', () => {
    // source: Selectors Level 3, §9 (specificity); CSS Cascading and Inheritance Level 4, §6.1 (specificity criterion)
    const { style } = setup(
      '<rect id="r" class="c"/>',
      '#r { fill: #010101 } .c { fill: #020202 } rect { fill: #030303 }',
    );
    expect(style('r').fill).toBe('#010101');
    const { style: s2 } = setup('<rect id="r" class="c"/>', '.c { fill: #020202 } rect { fill: #030303 }');
    expect(s2('r').fill).toBe('#020202');
  });

  it('lets the later rule win at equal specificity', () => {
    // source: CSS Cascading and Inheritance Level 4, §6.1 (order of appearance)
    const { style } = setup('<rect id="r" class="a b"/>', '.a { fill: red } .b { fill: blue }');
    expect(style('r').fill).toBe('blue');
    const { style: s2 } = setup('<rect id="r" class="a b"/>', '.b { fill: blue } .a { fill: red }');
    expect(s2('r').fill).toBe('red');
  });

  it('counts a grouped rule once, with its most specific matching selector', () => {
    // source: Selectors Level 4, §17 (specificity of a selector list is that of the most specific matching selector)
    const { style } = setup('<rect id="r" class="a"/>', '#r, rect { fill: red } .a { fill: blue }');
    expect(style('r').fill).toBe('red');
  });

  it('puts style="" above sheet rules, and !important sheet rules above style=""', () => {
    // source: CSS Cascading and Inheritance Level 4, §6.1 (origin and importance; element-attached styles)
    const { style } = setup(
      '<rect id="a" style="fill: green"/><rect id="b" style="fill: green; stroke: green"/><rect id="c" style="fill: green !important"/>',
      '#a { fill: red } #b { fill: red !important; stroke: red } #c { fill: red !important }',
    );
    expect(style('a').fill).toBe('green');
    expect(style('b').fill).toBe('red');
    expect(style('b').stroke).toBe('green');
    expect(style('c').fill).toBe('green'); // important inline beats important sheet
  });

  it('lets any sheet rule, even the universal selector, beat a presentation attribute', () => {
    // source: SVG 2, §6.6 (presentation attributes: author level, specificity 0, before all author rules)
    const { style } = setup('<rect id="r" fill="red" stroke="blue"/>', '* { fill: green }');
    expect(style('r').fill).toBe('green');
    expect(style('r').stroke).toBe('blue');
  });

  it('ignores !important in a presentation attribute (invalid there)', () => {
    // source: SVG 2, §6.6 (presentation attribute values are parsed as CSS values, without !important)
    const { style } = setup('<g fill="blue"><rect id="r" fill="red !important"/></g>');
    expect(style('r').fill).toBe('blue');
  });

  it('drops invalid declarations so a lower-priority valid one still applies', () => {
    // source: CSS Syntax Level 3, §5.4.6 / CSS Cascading and Inheritance Level 4, §4.1 (invalid declarations are ignored)
    const { style } = setup(
      '<rect id="r" class="c" fill="blue" style="stroke-width: -3; fill: #zzz"/>',
      '.c { fill: [object Object]; stroke-width: 2 }',
    );
    expect(style('r').fill).toBe('blue');
    expect(style('r').strokeWidth).toBe(2);
  });

  it('reads text and CDATA children of <style> and several sheets in document order', () => {
    const doc = parseXml(
      '<svg xmlns="http://www.w3.org/2000/svg"><style><![CDATA[ rect > * {} .a { fill: red } ]]></style>' +
        '<defs><style>.a { fill: blue }</style></defs><rect id="r" class="a"/></svg>',
    );
    expect(styleOf(buildCascade(doc), byId(doc, 'r')).fill).toBe('blue');
  });

  it('ignores <style> of a non-CSS type', () => {
    const { style } = setup('<style type="text/x-other">.a { fill: red }</style><rect id="r" class="a"/>');
    expect(style('r').fill).toBe('black');
  });

  it('applies @media screen/all/unconditioned blocks and skips print-only ones', () => {
    // source: Media Queries Level 4, §2.1 and §2.3 (media types)
    const { style } = setup(
      '<rect id="a" class="a"/><rect id="b" class="b"/><rect id="c" class="c"/><rect id="d" class="d"/><rect id="e" class="e"/>',
      '@media print { .a { fill: red } } @media screen { .b { fill: red } } @media all { .c { fill: red } }' +
        ' @media not print { .d { fill: red } } @media screen and (min-width: 10000px) { .e { fill: red } }',
    );
    expect(style('a').fill).toBe('black');
    expect(style('b').fill).toBe('red');
    expect(style('c').fill).toBe('red');
    expect(style('d').fill).toBe('red');
    expect(style('e').fill).toBe('black'); // feature conditions cannot be decided without a viewer
    const { style: s2 } = setup('<style media="print">.x { fill: red }</style><rect id="x" class="x"/>');
    expect(s2('x').fill).toBe('black');
  });

  it('expands the font shorthand in sheets and lets a later longhand override it', () => {
    // source: CSS Fonts Level 3, §3.7 (font shorthand resets all font longhands)
    const { style } = setup(
      '<text id="t" class="lbl">x</text><text id="u" class="lbl2">y</text>',
      '.lbl { font: italic bold 12px/30px Georgia, serif; font-weight: 300 } .lbl2 { font-variant-numeric: tabular-nums } .lbl2 { font: 9px sans-serif }',
    );
    expect(style('t')).toMatchObject({ fontStyle: 'italic', fontWeight: 300, fontSize: 12, fontFamily: ['Georgia', 'serif'] });
    expect(style('u').fontVariantNumeric).toBe('normal');
  });

  it('caches declared() per element', () => {
    const { doc, cascade } = setup('<rect id="r" class="a"/>', '.a { fill: red }');
    const r = byId(doc, 'r');
    expect(cascade.declared(r)).toBe(cascade.declared(r));
    expect(cascade.declared(r).fill).toMatchObject({ origin: 'sheet', selector: '.a', text: 'red' });
  });
});

describe('selectors', () => {
  it('computes specificity for the examples of the specification', () => {
    // source: Selectors Level 3, §9 (examples)
    const cases: [string, [number, number, number]][] = [
      ['*', [0, 0, 0]],
      ['LI', [0, 0, 1]],
      ['UL LI', [0, 0, 2]],
      ['UL OL+LI', [0, 0, 3]],
      ['H1 + *[REL=up]', [0, 1, 1]],
      ['UL OL LI.red', [0, 1, 3]],
      ['LI.red.level', [0, 2, 1]],
      ['#x34y', [1, 0, 0]],
      ['#s12:not(FOO)', [1, 0, 1]],
    ];
    for (const [text, spec] of cases) {
      const r = compileSelectorText(text);
      expect(r.ok, text).toBe(true);
      if (r.ok) expect(r.selectors[0]!.specificity, text).toEqual(spec);
    }
  });

  it('matches type, classes, id, universal, descendant, child, siblings, attributes and :not()', () => {
    const { style } = setup(
      '<g class="plot main" id="p"><g class="series"><rect id="a" class="bar hi" data-k="v-1" role="img graphics"/><rect id="b" class="bar"/></g>' +
        '<circle id="c"/><circle id="d"/></g><rect id="e" class="bar"/>',
      [
        '.plot rect { stroke: #000001 }', // descendant
        '.plot > rect { stroke: #ffffff }', // child: no rect is a direct child of .plot
        '.series > .bar.hi { fill: #000002 }', // child + compound
        '[data-k] { stroke-width: 2 }',
        '[data-k="v-1"] { stroke-width: 3 }',
        '[role~="graphics"] { opacity: 0.5 }',
        '[data-k^="v-"][data-k$="1"][data-k*="-"] { stroke-opacity: 0.25 }',
        '[data-k|="v"] { fill-opacity: 0.75 }',
        'rect:not(.hi) { fill: #000003 }',
        'circle + circle { fill: #000004 }',
        'rect ~ circle { stroke: #000005 }',
        '#p * { stroke-miterlimit: 7 }',
        'g.plot.main#p > g > :first-child { stroke-linecap: round }',
      ].join('\n'),
    );
    expect(style('a')).toMatchObject({ stroke: '#000001', fill: '#000002', strokeWidth: 3, opacity: 0.5, strokeOpacity: 0.25, fillOpacity: 0.75, strokeMiterlimit: 7, strokeLinecap: 'round' });
    expect(style('b')).toMatchObject({ stroke: '#000001', fill: '#000003', strokeWidth: 1, strokeLinecap: 'butt' });
    expect(style('c').fill).toBe('black');
    expect(style('d').fill).toBe('#000004');
    expect(style('c').stroke).toBe('none'); // the rects are not earlier siblings of the circles
    expect(style('e')).toMatchObject({ stroke: 'none', fill: '#000003', strokeMiterlimit: 4 });
  });

  it('matches element names, ids and classes case-sensitively (XML document)', () => {
    // source: Selectors Level 3, §4 (case sensitivity depends on the document language; XML is case-sensitive)
    const { style } = setup('<linearGradient id="g"/><rect id="r" class="Bar"/>', 'lineargradient { stop-color: red } .bar { fill: red } .Bar { stroke: red }');
    expect(style('r').fill).toBe('black');
    expect(style('r').stroke).toBe('red');
  });

  it('skips selectors that cannot apply statically but keeps the rest of the group', () => {
    // source: the ECharts output in ../shared/real-charts writes `.zr0-cls-1:hover { fill: ... }` rules
    const { style, cascade } = setup(
      '<rect id="r" class="zr0-cls-1"/><rect id="s" class="k"/>',
      '.zr0-cls-1:hover { cursor: pointer; fill: rgba(88,123,243,1) } rect::before { fill: red } .k:hover, .k { fill: blue } :focus { fill: red }',
    );
    expect(style('r').fill).toBe('black');
    expect(style('s').fill).toBe('blue');
    expect(cascade.warnings.some((w) => w.message.includes(':hover'))).toBe(true);
  });

  it('drops a whole rule when one selector of its group is invalid', () => {
    // source: Selectors Level 3, §5 (an invalid selector invalidates the whole group)
    const { style } = setup('<rect id="r" class="k"/>', '.k, :no-such-class { fill: red } .k, #1abc { stroke: red } .k, a >> b { opacity: 0.5 }');
    expect(style('r').fill).toBe('black');
    expect(style('r').stroke).toBe('none');
    expect(style('r').opacity).toBe(1);
  });

  it('evaluates :nth-child, :last-child, :only-child and :root', () => {
    // source: Selectors Level 3, §6.6.5 (structural pseudo-classes)
    const { style } = setup(
      '<g><rect id="r1"/><rect id="r2"/><rect id="r3"/><rect id="r4"/></g><g><circle id="only"/></g>',
      'rect:nth-child(2n+1) { fill: red } rect:last-child { stroke: blue } :only-child { opacity: 0.5 } :root { color: green } rect:nth-child(-n+2) { stroke-width: 5 }',
    );
    expect([style('r1').fill, style('r2').fill, style('r3').fill, style('r4').fill]).toEqual(['red', 'black', 'red', 'black']);
    expect(style('r4').stroke).toBe('blue');
    expect(style('only').opacity).toBe(0.5);
    expect(style('r1').color).toBe('green'); // inherited from :root
    expect([style('r1').strokeWidth, style('r2').strokeWidth, style('r3').strokeWidth]).toEqual([5, 5, 1]);
  });
});

describe('hostile input', () => {
  it('never fetches: @import, external url() and @font-face are ignored', async () => {
    const fetchSpy = vi.spyOn(globalThis, 'fetch');
    const httpSpy = vi.spyOn(http, 'request');
    const httpsSpy = vi.spyOn(https, 'request');
    const { style, cascade } = setup(
      '<rect id="r" class="a" style="fill: url(http://example.invalid/x.svg#g) red"/><rect id="s" class="a" clip-path="url(file:///etc/passwd#c)"/>',
      '@import url(file:///etc/passwd); @import "http://example.invalid/a.css";' +
        '@font-face { font-family: X; src: url(http://example.invalid/f.woff) } .a { stroke: url(https://example.invalid/p#q); filter: url(other.svg#f) }',
    );
    expect(style('r').fill).toBe('red'); // SVG 2 §13.3: unusable reference → fallback
    expect(style('r').stroke).toBe('none');
    expect(style('r').filter).toBeNull();
    expect(style('s').clipPath).toBeNull();
    expect(cascade.warnings.some((w) => w.message.startsWith('@import ignored'))).toBe(true);
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(fetchSpy).not.toHaveBeenCalled();
    expect(httpSpy).not.toHaveBeenCalled();
    expect(httpsSpy).not.toHaveBeenCalled();
    vi.restoreAllMocks();
  });

  it('survives a large garbage sheet and still applies the valid rules around it', () => {
    let s = 7;
    const rand = (): number => {
      s = (s * 1664525 + 1013904223) >>> 0;
      return s / 2 ** 32;
    };
    const alphabet = '{}[]()<>;:,.#*!@"\'\\/ \nabcXYZ0123-_%&|~^$=+';
    let garbage = '';
    for (let i = 0; i < 400_000; i++) garbage += alphabet[Math.floor(rand() * alphabet.length)];
    const sheet = `.ok { fill: #123456 } ${garbage.replace(/]]>/g, '')} }}}} .ok2 { stroke: #654321 }`;
    const doc = parseXml(`<svg xmlns="http://www.w3.org/2000/svg"><style><![CDATA[${sheet}]]></style><rect id="r" class="ok ok2"/></svg>`);
    const cascade = buildCascade(doc);
    const st = styleOf(cascade, byId(doc, 'r'));
    expect(st.fill).toBe('#123456');
    expect(cascade.warnings.length).toBeLessThanOrEqual(200);
  });

  it('refuses sheets beyond the size and selector limits with a positioned error', () => {
    const doc = parseXml(SVG('<rect/>', '.a{fill:red}'.repeat(1000)));
    expect(() => buildCascade(doc, { maxSheetChars: 5000 })).toThrow(SvgReadError);
    expect(() => buildCascade(doc, { maxSelectors: 10 })).toThrow(/selectors/);
  });

  it('matches a long descendant chain over a deep tree without exponential backtracking', () => {
    let body = '';
    for (let i = 0; i < 300; i++) body += '<g>';
    body += '<rect id="deep"/>';
    for (let i = 0; i < 300; i++) body += '</g>';
    const chain = 'g '.repeat(30);
    const { style } = setup(body, `${chain}nope rect { fill: red } ${chain}rect { stroke: blue }`);
    expect(style('deep').fill).toBe('black');
    expect(style('deep').stroke).toBe('blue');
  });

  it('stops matching beyond its step budget with a positioned error instead of hanging', () => {
    const parts: string[] = [];
    for (let i = 0; i < 2000; i++) parts.push(`<rect id="r${i}"/>`);
    const doc = parseXml(SVG(parts.join(''), 'circle ~ rect { fill: red }'));
    const cascade = buildCascade(doc, { maxMatchSteps: 50_000 });
    const err = (() => {
      try {
        for (const el of walkElements(doc.root)) cascade.declared(el);
      } catch (e) {
        return e;
      }
      return null;
    })();
    expect(err).toBeInstanceOf(SvgReadError);
    expect((err as SvgReadError).line).toBe(1);
  });

  it('never throws anything but a read error on arbitrary sheets and style attributes', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), fc.string({ maxLength: 120 }), (sheet, inline) => {
        const esc = (t: string): string => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/"/g, '&quot;');
        let doc: XmlDocument;
        try {
          doc = parseXml(`<svg xmlns="http://www.w3.org/2000/svg"><style>${esc(sheet)}</style><g fill="${esc(inline)}"><rect id="r" style="${esc(inline)}" class="${esc(inline)}"/></g></svg>`);
        } catch (err) {
          if (err instanceof SvgReadError) return; // not well-formed XML: the reader's concern
          throw err;
        }
        const cascade = buildCascade(doc);
        const st = styleOf(cascade, byId(doc, 'r'));
        expect(typeof st.fill).toBe('string');
        expect(Number.isFinite(st.strokeWidth)).toBe(true);
      }),
      { numRuns: 400, seed: 11 },
    );
  });
});

describe('scale', () => {
  it('builds and resolves a 50,000-element document with a few dozen rules', () => {
    const rules: string[] = [];
    for (let k = 0; k < 12; k++) rules.push(`.s${k} { fill: #${(k * 0x111111).toString(16).padStart(6, '0')} }`);
    for (let k = 0; k < 8; k++) rules.push(`#panel${k} .pt { stroke-width: ${k + 1} }`);
    rules.push('circle { stroke: #333333 }', '.pt.hl { stroke: #ff0000 !important }', 'g > text { font: 10px sans-serif }');
    rules.push('[data-missing] { fill: red }', '.plot circle:not(.hl) { fill-opacity: 0.6 }', '* { stroke-linecap: round }');
    const parts: string[] = [`<svg xmlns="http://www.w3.org/2000/svg"><style>${rules.join('\n')}</style><g class="plot">`];
    let n = 0;
    for (let p = 0; p < 8; p++) {
      parts.push(`<g id="panel${p}">`);
      for (let k = 0; k < 6249; k++) {
        const hl = k % 97 === 0 ? ' hl' : '';
        parts.push(`<circle cx="${k}" cy="${p}" r="2" class="pt s${k % 12}${hl}"/>`);
        n++;
      }
      parts.push('<text>label</text></g>');
    }
    parts.push('</g></svg>');
    const doc = parseXml(parts.join('\n'));
    const t0 = performance.now();
    const cascade = buildCascade(doc);
    const styles = new Map<XmlElement, ComputedStyle>();
    let elements = 0;
    for (const el of walkElements(doc.root)) {
      styles.set(el, computeStyle(cascade.declared(el), el.parent ? styles.get(el.parent)! : null));
      elements++;
    }
    const ms = performance.now() - t0;
    console.log(`style cascade: ${elements} elements, ${cascade.selectorCount} selectors, ${ms.toFixed(0)} ms`);
    expect(elements).toBeGreaterThan(50_000);
    const panel3 = [...walkElements(doc.root)].filter((e) => e.parent?.attribute('id') === 'panel3');
    const first = styles.get(panel3[0]!)!; // k = 0: s0 and hl
    expect(first).toMatchObject({ fill: '#000000', stroke: '#ff0000', strokeWidth: 4, fillOpacity: 1, strokeLinecap: 'round' });
    const second = styles.get(panel3[1]!)!;
    expect(second).toMatchObject({ fill: '#111111', stroke: '#333333', strokeWidth: 4, fillOpacity: 0.6 });
    const label = styles.get(panel3[panel3.length - 1]!)!;
    expect(label).toMatchObject({ fontSize: 10, fontFamily: ['sans-serif'] });
  });
});
