import { describe, expect, it } from 'vitest';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import {
  buildCascade,
  computeStyle,
  INITIAL_STYLE,
  paintReference,
  type Cascade,
  type ComputedStyle,
} from '../engine/read/style/index.js';
import type { XmlDocument, XmlElement } from '../engine/read/xml-tree.js';

function byId(doc: XmlDocument, id: string): XmlElement {
  for (const el of walkElements(doc.root)) if (el.attribute('id') === id) return el;
  throw new Error(`no element #${id}`);
}

function styleOf(cascade: Cascade, el: XmlElement): ComputedStyle {
  const parent = el.parent ? styleOf(cascade, el.parent) : null;
  return computeStyle(cascade.declared(el), parent);
}

function setup(body: string, sheet = ''): (id: string) => ComputedStyle {
  const doc = parseXml(`<svg xmlns="http://www.w3.org/2000/svg">${sheet ? `<style>${sheet}</style>` : ''}${body}</svg>`);
  const cascade = buildCascade(doc);
  return (id) => styleOf(cascade, byId(doc, id));
}

describe('initial values', () => {
  it('uses the SVG/CSS initial values when nothing is declared', () => {
    const style = setup('<rect id="r"/>');
    const s = style('r');
    // source: SVG 2, §13.2 (fill: initial black) and the stroke property table (stroke: none, stroke-width: 1px, stroke-miterlimit: 4)
    expect([s.fill, s.stroke, s.strokeWidth, s.strokeMiterlimit, s.strokeLinecap, s.strokeLinejoin]).toEqual(['black', 'none', 1, 4, 'butt', 'miter']);
    // source: CSS Color Level 4, §4.2 (opacity: initial 1)
    expect(s.opacity).toBe(1);
    // source: CSS Fonts Level 3, §3.5 (font-size: initial medium) and §3.2 (font-weight: initial normal = 400)
    expect([s.fontSize, s.fontWeight, s.fontStyle]).toEqual([16, 400, 'normal']);
    // source: SVG 2, text chapter property table (text-anchor: initial start)
    expect(s.textAnchor).toBe('start');
    // font-family is user-agent dependent in CSS; serif is the documented choice here
    expect(s.fontFamily).toEqual(['serif']);
    expect(s).toEqual({ ...INITIAL_STYLE });
  });
});

describe('inheritance', () => {
  it('inherits fill, stroke, stroke-width, font and text-anchor through groups', () => {
    // source: CSS Cascading and Inheritance Level 4, §7.2; SVG 2 property tables (these properties are inherited)
    const style = setup(
      '<g fill="#aa0000" stroke="#00aa00" stroke-width="3" font-family="DejaVu Sans" font-size="11" text-anchor="end" stroke-dasharray="2 1" visibility="hidden">' +
        '<g><text id="t">x</text><rect id="r" visibility="visible"/></g></g>',
    );
    expect(style('t')).toMatchObject({
      fill: '#aa0000',
      stroke: '#00aa00',
      strokeWidth: 3,
      fontFamily: ['DejaVu Sans'],
      fontSize: 11,
      textAnchor: 'end',
      strokeDasharray: [2, 1],
      visibility: 'hidden',
    });
    expect(style('r').visibility).toBe('visible');
  });

  it('does not inherit opacity, display, clip-path, mask, filter, stop-color or stop-opacity', () => {
    // source: CSS Color Level 4, §4.2 (opacity: Inherited: no); CSS Display Level 3, §2 (display: Inherited: no);
    // CSS Masking Level 1, §6.1 and §7 (clip-path, mask: Inherited: no); Filter Effects Level 1, §5 (filter: Inherited: no);
    // SVG 2, §14.3 (stop-color, stop-opacity: Inherited: no)
    const style = setup(
      '<g opacity="0.5" display="inline-block" clip-path="url(#c)" mask="url(#m)" filter="url(#f)" stop-color="red" stop-opacity="0.3"><rect id="r"/></g>',
    );
    expect(style('r')).toMatchObject({ opacity: 1, display: 'inline', clipPath: null, mask: null, filter: null, stopColor: 'black', stopOpacity: 1 });
  });

  it('reports each element\'s own opacity without multiplying down the tree', () => {
    const style = setup('<g id="g" opacity="0.5"><rect id="r" opacity="0.5"/></g>');
    expect(style('g').opacity).toBe(0.5);
    expect(style('r').opacity).toBe(0.5);
  });

  it('applies inherit, initial and unset', () => {
    // source: CSS Cascading and Inheritance Level 4, §7.3 (explicit defaulting: initial, inherit, unset)
    const style = setup(
      '<g fill="red" opacity="0.4" stroke-width="5"><rect id="a" opacity="inherit" fill="blue" style="fill: inherit"/>' +
        '<rect id="b" style="fill: initial; stroke-width: unset; opacity: unset"/><rect id="c" class="c"/></g>',
      '.c { fill: revert; stroke-width: initial }',
    );
    expect(style('a')).toMatchObject({ fill: 'red', opacity: 0.4 });
    expect(style('b')).toMatchObject({ fill: 'black', strokeWidth: 5, opacity: 1 });
    expect(style('c')).toMatchObject({ fill: 'red', strokeWidth: 1 });
  });

  it('treats inherit at the root as initial', () => {
    // source: CSS Cascading and Inheritance Level 4, §7.3.2 (inherit on the root element gives the initial value)
    const doc = parseXml('<svg xmlns="http://www.w3.org/2000/svg" fill="inherit" stroke-width="inherit"/>');
    const s = computeStyle(buildCascade(doc).declared(doc.root), null);
    expect([s.fill, s.strokeWidth]).toEqual(['black', 1]);
  });

  it('clamps opacity values to [0, 1] and accepts percentages', () => {
    // source: CSS Color Level 4, §4.2 (out-of-range alpha values are clamped; <alpha-value> accepts percentages)
    const style = setup('<rect id="a" opacity="1.7" fill-opacity="-2"/><rect id="b" style="opacity: 25%"/>');
    expect([style('a').opacity, style('a').fillOpacity, style('b').opacity]).toEqual([1, 0, 0.25]);
  });
});

describe('currentColor', () => {
  it('resolves against the computed color of the element', () => {
    // source: CSS Color Level 4, §6.4 (currentcolor resolves to the value of the color property)
    const style = setup('<g color="#123456"><rect id="r" fill="currentColor" stroke="currentcolor" stop-color="currentColor"/></g>');
    expect(style('r')).toMatchObject({ fill: '#123456', stroke: '#123456', stopColor: '#123456', color: '#123456' });
  });

  it('is inherited as the keyword, so a child with its own color uses it', () => {
    // source: CSS Color Level 4, §6.4 (currentcolor computes to itself and is inherited as such)
    const style = setup('<g color="red" fill="currentColor"><rect id="r" color="blue"/><rect id="s"/></g>');
    expect(style('r').fill).toBe('blue');
    expect(style('s').fill).toBe('red');
  });

  it('treats color: currentColor as inherit', () => {
    // source: CSS Color Level 4, §6.4 (currentcolor in the color property is treated as inherit)
    const style = setup('<g color="green"><rect id="r" style="color: currentColor; fill: currentColor"/></g>');
    expect(style('r').fill).toBe('green');
  });

  it('follows the gnuplot point-symbol chain: use(color) → use(fill=currentColor) → circle(stroke=currentColor)', () => {
    // source: the marker definitions written by gnuplot 5.4 in ../shared/real-charts/gp-points-clean-01.svg
    const doc = parseXml(
      `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink"><defs>
	<circle id='gpPt5' stroke-width='0.242' stroke='currentColor' cx='0' cy='0' r='1'/>
	<use xlink:href='#gpPt5' id='gpPt6' fill='currentColor' stroke='none'/>
</defs>
<g fill="none" color="black" stroke="currentColor" stroke-width="1.00" stroke-linecap="butt" stroke-linejoin="miter">
	<use id="u" xlink:href='#gpPt6' transform='translate(191.43,200.85) scale(2.89)' color='rgb(  0, 114, 178)'/>
</g></svg>`,
    );
    const cascade = buildCascade(doc);
    const useStyle = styleOf(cascade, byId(doc, 'u'));
    const inner = computeStyle(cascade.declared(byId(doc, 'gpPt6')), useStyle);
    const circle = computeStyle(cascade.declared(byId(doc, 'gpPt5')), inner);
    expect(circle.fill).toBe(useStyle.color);
    expect(circle.stroke).toBe(useStyle.color);
    expect(circle.strokeWidth).toBe(0.242);
    expect(useStyle.color.replace(/\s+/g, '')).toBe('rgb(0,114,178)');
  });
});

describe('<use> instances', () => {
  it('match selectors in the original tree but inherit from the <use> element', () => {
    // source: SVG 2, §5.6 (the use element: instances inherit from the use element; style rules match the referenced element in its original place) — from memory
    const doc = parseXml(
      '<svg xmlns="http://www.w3.org/2000/svg"><style>.lib circle { stroke: #aa0000 } .here circle { stroke: #0000aa }</style>' +
        '<defs><g class="lib" fill="#777777" font-size="30"><circle id="c" r="2"/></g></defs>' +
        '<g class="here"><use id="u" href="#c" fill="#00aa00" font-size="8"/></g></svg>',
    );
    const cascade = buildCascade(doc);
    const useStyle = styleOf(cascade, byId(doc, 'u'));
    const instance = computeStyle(cascade.declared(byId(doc, 'c')), useStyle);
    expect(instance).toMatchObject({ stroke: '#aa0000', fill: '#00aa00', fontSize: 8 });
    const original = styleOf(cascade, byId(doc, 'c'));
    expect(original).toMatchObject({ stroke: '#aa0000', fill: '#777777', fontSize: 30 });
  });
});

describe('font-size and font-weight', () => {
  it('resolves keywords, em, %, rem and absolute units against the parent', () => {
    // source: CSS Fonts Level 4, §2.5 (absolute-size scaling factors: small 8/9, large 6/5, xx-large 2 of medium 16px)
    // source: CSS Values and Units Level 4, §6.2 (1in = 96px, 1pt = 1/72in)
    const style = setup(
      '<g font-size="20"><text id="em" font-size="1.5em"/><text id="pc" font-size="50%"/><text id="sm" font-size="small"/>' +
        '<text id="lg" font-size="large"/><text id="xx" style="font-size: xx-large"/><text id="pt" font-size="9pt"/>' +
        '<text id="rem" style="font-size: 2rem"/><g font-size="2em"><text id="nested" font-size="0.5em"/></g></g>',
    );
    expect(style('em').fontSize).toBe(30);
    expect(style('pc').fontSize).toBe(10);
    expect(style('sm').fontSize).toBeCloseTo((16 * 8) / 9, 10);
    expect(style('lg').fontSize).toBeCloseTo(19.2, 10);
    expect(style('xx').fontSize).toBe(32);
    expect(style('pt').fontSize).toBe(12);
    expect(style('rem').fontSize).toBe(32); // root is 16px (initial)
    expect(style('nested').fontSize).toBe(20);
  });

  it('uses the element\'s own font size for em in other properties', () => {
    // source: CSS Values and Units Level 4, §6.1.1 (em is relative to the element's font-size, except in font-size itself)
    const style = setup('<g font-size="10"><path id="p" font-size="20" stroke-width="0.1em" letter-spacing="0.5em" stroke-dasharray="1em, 0.5em, 2"/></g>');
    expect(style('p')).toMatchObject({ strokeWidth: 2, letterSpacing: 10, strokeDasharray: [20, 10, 2, 20, 10, 2] });
  });

  it('maps weights and relative weights', () => {
    // source: CSS Fonts Level 4, §2.2 (normal = 400, bold = 700; bolder/lighter relative weight table)
    const style = setup(
      '<text id="b" font-weight="bold"/><g font-weight="300"><text id="br" font-weight="bolder"/></g>' +
        '<g font-weight="600"><text id="lt" font-weight="lighter"/></g><text id="n" style="font-weight: 450"/><text id="bad" font-weight="1200"/>',
    );
    expect([style('b').fontWeight, style('br').fontWeight, style('lt').fontWeight, style('n').fontWeight, style('bad').fontWeight]).toEqual([
      700, 400, 400, 450, 400,
    ]);
  });
});

describe('other values', () => {
  it('keeps url(#id) references with fallbacks and exposes them', () => {
    // source: SVG 2, §13.2 (<paint>: url reference with optional fallback colour)
    const style = setup('<rect id="r" fill="url(#grad) #ff0000" stroke="url(&quot;#a b&quot;)" clip-path="url(#clip)" filter="url(#f) blur(2px)"/>');
    const s = style('r');
    expect(s.fill).toBe('url(#grad) #ff0000');
    expect(paintReference(s.fill)).toEqual({ id: 'grad', fallback: '#ff0000' });
    expect(paintReference(s.stroke)).toEqual({ id: 'a b', fallback: null });
    expect(paintReference(s.clipPath!)).toEqual({ id: 'clip', fallback: null });
    expect(s.filter).toBe('url(#f)');
    expect(s.filterFunctions).toBe('blur(2px)');
  });

  it('normalizes dash arrays, paint order and SVG 1.1 writing modes', () => {
    // source: SVG 2, §13.5.4 (odd dash lists are repeated; a zero-sum list renders solid) and §13.6 (paint-order)
    // source: CSS Writing Modes Level 3, §3.1 (SVG 1.1 writing-mode values: tb-rl computes to vertical-rl, lr-tb to horizontal-tb)
    const style = setup(
      '<path id="a" stroke-dasharray="5,3,2"/><path id="b" stroke-dasharray="0 0"/><path id="c" stroke-dasharray="4 -1"/>' +
        '<text id="t" paint-order="stroke" writing-mode="tb-rl"/><text id="u" writing-mode="lr-tb"/>',
    );
    expect(style('a').strokeDasharray).toEqual([5, 3, 2, 5, 3, 2]);
    expect(style('b').strokeDasharray).toBeNull();
    expect(style('c').strokeDasharray).toBeNull(); // negative: invalid, ignored
    expect(style('t').paintOrder).toEqual(['stroke', 'fill', 'markers']);
    expect(style('t').writingMode).toBe('vertical-rl');
    expect(style('u').writingMode).toBe('horizontal-tb');
  });

  it('resolves percentage stroke widths against the normalized viewport diagonal', () => {
    // source: SVG 2, §13.5.2 (stroke-width percentages refer to the normalized diagonal of the viewport) — from memory
    const doc = parseXml('<svg xmlns="http://www.w3.org/2000/svg"><rect id="r" stroke-width="1%"/></svg>');
    const cascade = buildCascade(doc);
    const root = computeStyle(cascade.declared(doc.root), null);
    const s = computeStyle(cascade.declared(byId(doc, 'r')), root, { viewport: { width: 300, height: 400 } });
    expect(s.strokeWidth).toBeCloseTo(Math.sqrt((300 ** 2 + 400 ** 2) / 2) / 100, 12);
  });

  it('treats var() as unsupported: invalid at computed-value time, i.e. unset', () => {
    // source: CSS Custom Properties Level 1, §3.1 (invalid at computed-value time behaves as unset)
    const style = setup('<g fill="red"><rect id="r" fill="green" style="fill: var(--c, blue)"/></g>');
    expect(style('r').fill).toBe('red');
  });

  it('reads font-variant-numeric directly and through font-variant', () => {
    // source: CSS Fonts Level 3, §6.7 (font-variant-numeric) and §6.11 (font-variant shorthand)
    const style = setup('<text id="a" style="font-variant-numeric: tabular-nums lining-nums"/><text id="b" font-variant="small-caps tabular-nums"/><text id="c" style="font-variant-numeric: tabular-nums proportional-nums"/>');
    expect(style('a').fontVariantNumeric).toBe('tabular-nums lining-nums');
    expect(style('b')).toMatchObject({ fontVariantNumeric: 'tabular-nums', fontVariantCaps: 'small-caps' });
    expect(style('c').fontVariantNumeric).toBe('normal'); // two keywords of one group: invalid
  });
});
