/**
 * The written text alternative: <title> and <desc> become the root's first
 * children, their text comes from the recovered chart, markup characters in
 * chart labels are escaped (read back by the saxes parser, npm, they are the
 * labels' own characters), and the re-audit no longer reports the file.
 */
import { SaxesParser } from 'saxes';
import { describe, expect, it } from 'vitest';
import { auditText } from '../engine/audit/audit-file.js';
import { redrawText } from '../engine/redraw/redraw.js';
import { loadManifest, readChart } from './support/real-charts.js';

interface Node {
  name: string;
  text: string;
  children: Node[];
}

function saxRoot(xml: string): Node {
  const p = new SaxesParser();
  const stack: Node[] = [];
  let root: Node | null = null;
  p.on('opentag', (t) => {
    const n: Node = { name: t.name, text: '', children: [] };
    if (stack.length > 0) stack[stack.length - 1]!.children.push(n);
    else root = n;
    stack.push(n);
  });
  p.on('text', (t) => {
    if (stack.length > 0) stack[stack.length - 1]!.text += t;
  });
  p.on('closetag', () => void stack.pop());
  p.write(xml).close();
  return root!;
}

describe('title and description', () => {
  it('escapes markup characters taken from chart labels', () => {
    // A real chart whose title and one category label are given "<" and "&" (written escaped, as XML requires).
    const original = readChart('vl-bar-clean-01.svg');
    expect(original).toContain('>Pastries sold by weekday<');
    expect(original).toContain('>Mon<');
    const text = original.replace('>Pastries sold by weekday<', '>Pastries &lt;sold&gt; &amp; returned<').replace('>Mon<', '>Mon &amp; Tue &lt;1&gt;<');
    const r = redrawText(text, 'labels.svg', { only: ['access.missing-description'] });
    expect(r.applied).toEqual([{ rule: 'access.missing-description', count: 2 }]);
    // source: XML 1.0 §2.4 — '<' and '&' in character data must be escaped; saxes decodes them back
    const root = saxRoot(r.output);
    expect(root.children[0]!.name).toBe('title');
    expect(root.children[1]!.name).toBe('desc');
    expect(root.children[0]!.text).toBe('Pastries <sold> & returned');
    expect(root.children[1]!.text).toContain('Mon & Tue <1>');
    expect(r.output).not.toContain('<sold>');
    expect(r.output).toContain('<title>Pastries &lt;sold&gt; &amp; returned</title>');
    // The rest of the file is the input, byte for byte.
    const inserted = r.output.indexOf('<title>');
    const end = r.output.indexOf('</desc>') + '</desc>'.length;
    expect(r.output.slice(0, inserted) + r.output.slice(end)).toBe(text);
    expect(auditText(r.output, 'labels.svg').report.findings.map((f) => f.rule)).not.toContain('access.missing-description');
  });

  it('replaces a generator boilerplate title and description in place', () => {
    const text = readChart('gp-points-clean-01.svg');
    expect(text).toContain('<title>Gnuplot</title>');
    const r = redrawText(text, 'gp.svg', { only: ['access.missing-description'] });
    expect(r.applied.map((a) => a.rule)).toEqual(['access.missing-description']);
    const before = text.split('\n');
    const after = r.output.split('\n');
    expect(after.length).toBe(before.length);
    const changed = before.map((l, k) => (l === after[k] ? -1 : k)).filter((k) => k >= 0);
    expect(changed.map((k) => before[k]!.trim().slice(0, 7))).toEqual(['<title>', '<desc>P']);
    const root = saxRoot(r.output);
    const title = root.children.find((c) => c.name === 'title')!;
    // source: manifest.json ground truth, the title this chart was drawn with
    expect(title.text).toBe(loadManifest().find((t) => t.file === 'gp-points-clean-01.svg')!.title);
  });
});
