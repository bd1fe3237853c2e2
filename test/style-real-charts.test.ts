import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import { buildCascade, computeStyle, type Cascade, type ComputedStyle } from '../engine/read/style/index.js';
import type { XmlDocument, XmlElement } from '../engine/read/xml-tree.js';

const realCharts = resolve(import.meta.dirname, '../../shared/real-charts');
const files = readdirSync(realCharts).filter((f) => f.endsWith('.svg')).sort();

interface Resolved {
  doc: XmlDocument;
  cascade: Cascade;
  elements: XmlElement[];
  style: Map<XmlElement, ComputedStyle>;
}

function resolveChart(file: string): Resolved {
  const doc = parseXml(readFileSync(resolve(realCharts, file), 'utf8'), { file });
  const cascade = buildCascade(doc);
  const style = new Map<XmlElement, ComputedStyle>();
  const elements: XmlElement[] = [];
  for (const el of walkElements(doc.root)) {
    style.set(el, computeStyle(cascade.declared(el), el.parent ? style.get(el.parent)! : null));
    elements.push(el);
  }
  return { doc, cascade, elements, style };
}

describe('real charts', () => {
  it('resolves every element of every chart; only the ECharts :hover rules are skipped', () => {
    expect(files.length).toBeGreaterThanOrEqual(44);
    let elements = 0;
    for (const file of files) {
      const r = resolveChart(file);
      elements += r.elements.length;
      for (const w of r.cascade.warnings) {
        // source: the ECharts files write only `.zrN-cls-M:hover { ... }` rules in their <style>
        expect(file.startsWith('ec-') && w.message.includes(':hover'), `${file}: ${w.message}`).toBe(true);
        // the warning points at the rule's line in the file
        const selector = /selector '([^']+)'/.exec(w.message)![1]!;
        expect(r.doc.source.split('\n')[w.line - 1]).toContain(selector);
      }
      for (const st of r.style.values()) {
        expect(Number.isFinite(st.fontSize) && st.fontSize > 0).toBe(true);
        expect(Number.isFinite(st.strokeWidth) && st.strokeWidth >= 0).toBe(true);
      }
    }
    console.log(`real charts: ${files.length} files, ${elements} elements resolved`);
  });

  it('applies the svglite sheet under style="" in ggplot2 output', () => {
    // source: ../shared/real-charts/gg-bar-truncated-01.svg — sheet `.svglite rect { fill: none; stroke: #000000;
    // stroke-linecap: round; stroke-linejoin: round }` on the root class, plus per-element style=""
    const r = resolveChart('gg-bar-truncated-01.svg');
    const styleAttr = (el: XmlElement): string => el.attribute('style') ?? '';
    const background = r.elements.find((e) => e.name === 'rect' && styleAttr(e) === 'stroke: none; fill: #FFFFFF;')!;
    expect(r.style.get(background)).toMatchObject({ fill: '#FFFFFF', stroke: 'none' });
    const bar = r.elements.find((e) => e.name === 'rect' && styleAttr(e).includes('fill: #2C7FB8'))!;
    expect(r.style.get(bar)).toMatchObject({ fill: '#2C7FB8', stroke: 'none', strokeWidth: 1.07, strokeLinecap: 'butt', strokeLinejoin: 'miter' });
    const grid = r.elements.find((e) => e.name === 'polyline' && styleAttr(e).includes('stroke: #EBEBEB'))!;
    // fill and line join come from the sheet; stroke, width and cap from style=""
    expect(r.style.get(grid)).toMatchObject({ fill: 'none', stroke: '#EBEBEB', strokeLinecap: 'butt', strokeLinejoin: 'round' });
    const label = r.elements.find((e) => e.name === 'text' && styleAttr(e).includes('font-size: 8.80px'))!;
    expect(r.style.get(label)).toMatchObject({ fontSize: 8.8, fontFamily: ['DejaVu Sans'], fill: '#4D4D4D', textAnchor: label.attribute('text-anchor') ?? 'start' });
  });

  it('applies matplotlib\'s universal rule below every style=""', () => {
    // source: ../shared/real-charts/mpl-bar-clean-01.svg — `*{stroke-linejoin: round; stroke-linecap: butt}` and
    // style="...; stroke-linejoin: miter; stroke-linecap: square" on axis spines
    const r = resolveChart('mpl-bar-clean-01.svg');
    for (const el of r.elements) {
      const inline = el.attribute('style') ?? '';
      const join = /stroke-linejoin:\s*([a-z]+)/.exec(inline);
      const cap = /stroke-linecap:\s*([a-z]+)/.exec(inline);
      expect(r.style.get(el)!.strokeLinejoin).toBe(join ? join[1] : 'round');
      expect(r.style.get(el)!.strokeLinecap).toBe(cap ? cap[1] : 'butt');
    }
  });

  it('reads Vega-Lite presentation attributes and ECharts style="" text', () => {
    // source: ../shared/real-charts/vl-bar-clean-01.svg (font-size="13px" font-weight="bold" on the title) and
    // ec-bar-clean-01.svg (style="font-size:12px;font-family:sans-serif;" fill="#54555a")
    const vl = resolveChart('vl-bar-clean-01.svg');
    const title = vl.elements.find((e) => e.name === 'text' && e.attribute('font-weight') === 'bold' && e.attribute('font-size') === '13px')!;
    expect(vl.style.get(title)).toMatchObject({ fontWeight: 700, fontSize: 13, fontFamily: ['sans-serif'], fill: '#000', textAnchor: 'middle' });
    const ec = resolveChart('ec-bar-clean-01.svg');
    const tick = ec.elements.find((e) => e.name === 'text' && e.attribute('style') === 'font-size:12px;font-family:sans-serif;')!;
    expect(ec.style.get(tick)).toMatchObject({ fontSize: 12, fontFamily: ['sans-serif'], fill: tick.attribute('fill'), dominantBaseline: 'central' });
  });

  it('colours gnuplot point symbols from the <use> element through the instance chain', () => {
    // source: ../shared/real-charts/gp-points-clean-01.svg — <use xlink:href='#gpPt6' color='rgb(...)'> referencing
    // <use id='gpPt6' xlink:href='#gpPt5' fill='currentColor' stroke='none'> referencing <circle id='gpPt5' stroke='currentColor'>
    const r = resolveChart('gp-points-clean-01.svg');
    const byId = new Map<string, XmlElement>();
    for (const el of r.elements) {
      const id = el.attribute('id');
      if (id !== undefined) byId.set(id, el);
    }
    const target = (el: XmlElement): XmlElement | undefined => {
      const href = el.attribute('href') ?? el.attribute('xlink:href');
      return href?.startsWith('#') ? byId.get(href.slice(1)) : undefined;
    };
    let checked = 0;
    for (const el of r.elements) {
      if (el.name !== 'use' || el.attribute('color') === undefined) continue;
      // Instance chain: each referenced element computed with the previous instance as parent.
      let parentStyle = r.style.get(el)!;
      let ref = target(el);
      while (ref) {
        parentStyle = computeStyle(r.cascade.declared(ref), parentStyle);
        if (ref.name !== 'use') break;
        ref = target(ref);
      }
      expect(ref?.name).toBe('circle');
      const written = el.attribute('color')!.replace(/\s+/g, '');
      expect(parentStyle.stroke.replace(/\s+/g, '')).toBe(written);
      expect(parentStyle.fill.replace(/\s+/g, '')).toBe(written);
      expect(parentStyle.strokeWidth).toBe(0.242);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });
});
