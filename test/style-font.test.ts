import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import { buildCascade, computeStyle, type ComputedStyle } from '../engine/read/style/index.js';
import type { XmlElement } from '../engine/read/xml-tree.js';

const realCharts = resolve(import.meta.dirname, '../../shared/real-charts');

/** Computed style of an element with a given style="" under a plain root. */
function withStyle(style: string, parentFontSize?: number): ComputedStyle {
  const esc = style.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');
  const rootAttr = parentFontSize === undefined ? '' : ` font-size="${parentFontSize}"`;
  const doc = parseXml(`<svg xmlns="http://www.w3.org/2000/svg"${rootAttr}><text style="${esc}">x</text></svg>`);
  const cascade = buildCascade(doc);
  const root = computeStyle(cascade.declared(doc.root), null);
  const text = doc.root.children.find((c): c is XmlElement => c.type === 'element')!;
  return computeStyle(cascade.declared(text), root);
}

describe('font shorthand (CSS Fonts 3 §3.7)', () => {
  it('expands the examples of the brief', () => {
    // source: CSS Fonts Level 3, §3.7 (font shorthand grammar)
    expect(withStyle('font: 400 13px sans-serif')).toMatchObject({ fontWeight: 400, fontSize: 13, fontFamily: ['sans-serif'], fontStyle: 'normal' });
    expect(withStyle('font: bold 10px "DejaVu Sans", Arial')).toMatchObject({ fontWeight: 700, fontSize: 10, fontFamily: ['DejaVu Sans', 'Arial'] });
  });

  it('expands the examples of the specification', () => {
    // source: CSS Fonts Level 3, §3.7, examples: "12pt/14pt sans-serif", "80% sans-serif",
    // "x-large/110% "new century schoolbook", serif", "bold italic large Palatino, serif", "normal small-caps 120%/120% fantasy",
    // "condensed oblique 12pt "Helvetica Neue", serif"
    expect(withStyle('font: 12pt/14pt sans-serif')).toMatchObject({ fontSize: 16, fontFamily: ['sans-serif'] });
    expect(withStyle('font: 80% sans-serif', 20)).toMatchObject({ fontSize: 16 });
    expect(withStyle('font: x-large/110% "new century schoolbook", serif')).toMatchObject({ fontSize: 24, fontFamily: ['new century schoolbook', 'serif'] });
    expect(withStyle('font: bold italic large Palatino, serif')).toMatchObject({ fontWeight: 700, fontStyle: 'italic', fontSize: 19.2, fontFamily: ['Palatino', 'serif'] });
    expect(withStyle('font: normal small-caps 120%/120% fantasy', 10)).toMatchObject({ fontVariantCaps: 'small-caps', fontSize: 12, fontFamily: ['fantasy'] });
    expect(withStyle('font: condensed oblique 12pt "Helvetica Neue", serif')).toMatchObject({ fontStretch: 75, fontStyle: 'oblique', fontSize: 16, fontFamily: ['Helvetica Neue', 'serif'] });
  });

  it('rejects values outside the grammar and keeps the earlier declaration', () => {
    // source: CSS Fonts Level 3, §3.7 (size and family are required; a bare number is a weight, not a size)
    for (const bad of ['font: 12px', 'font: bold sans-serif', 'font: 12 serif', 'font: 12px/ serif', 'font: italic italic 12px serif', 'font: caption', 'font: 12px inherit']) {
      const s = withStyle(`font-size: 7px; font-family: Mono; ${bad}`);
      expect([s.fontSize, s.fontFamily], bad).toEqual([7, ['Mono']]);
    }
  });

  it('resets longhands the shorthand does not mention', () => {
    // source: CSS Fonts Level 3, §3.7 (all subproperties are reset to their initial values)
    expect(withStyle('font-weight: 900; font-style: italic; font-variant-numeric: tabular-nums; font: 10px serif')).toMatchObject({
      fontWeight: 400,
      fontStyle: 'normal',
      fontVariantNumeric: 'normal',
    });
    expect(withStyle('font: 10px serif; font-weight: 900')).toMatchObject({ fontWeight: 900, fontSize: 10 });
  });

  it('reads every font: declaration written by matplotlib in the real charts', () => {
    // source: matplotlib SVG output in ../shared/real-charts (style="font: 10px 'DejaVu Sans', ...; text-anchor: middle")
    const files = readdirSync(realCharts).filter((f) => f.endsWith('.svg'));
    let checked = 0;
    for (const file of files) {
      const doc = parseXml(readFileSync(resolve(realCharts, file), 'utf8'), { file });
      const cascade = buildCascade(doc);
      const styles = new Map<XmlElement, ComputedStyle>();
      for (const el of walkElements(doc.root)) {
        const st = computeStyle(cascade.declared(el), el.parent ? styles.get(el.parent)! : null);
        styles.set(el, st);
        const inline = el.attribute('style');
        const m = inline ? /font:\s*([0-9.]+)px\s+([^;]+?)\s*(?:;|$)/.exec(inline) : null;
        if (!m) continue;
        // The size and family list as written, read independently of css-tree.
        const families = m[2]!.split(',').map((f) => f.trim().replace(/^'(.*)'$/, '$1'));
        expect(st.fontSize, `${file}:${el.line}`).toBe(Number(m[1]));
        expect(st.fontFamily, `${file}:${el.line}`).toEqual(families);
        expect(st.fontWeight).toBe(400);
        const anchor = /text-anchor:\s*(start|middle|end)/.exec(inline!);
        expect(st.textAnchor).toBe(anchor ? anchor[1] : 'start');
        const fill = /fill:\s*(#[0-9a-fA-F]{6})/.exec(inline!);
        if (fill) expect(st.fill).toBe(fill[1]);
        checked++;
      }
    }
    console.log(`font shorthand: ${checked} matplotlib text elements checked`);
    expect(checked).toBeGreaterThan(200);
  });
});
