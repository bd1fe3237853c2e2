/**
 * ink.ornament: decoration laid on the data or the plot — gradient or
 * pattern fills, filters (drop shadows, blurs, glows), shadow copies of
 * marks, pictures behind or inside marks. Each kind is one finding.
 * A colour bar may use a gradient or an image: that is a scale, not ornament.
 */
import type { Chart } from '../../classify/chart.js';
import type { Paint, SceneItem } from '../../read/scene.js';
import type { XmlElement } from '../../read/xml-tree.js';
import { elementsOf, type Rule, type RuleFinding } from '../rule.js';
import { deltaEab, JND_DELTA_E_AB } from './color-distance.js';

/** Roles on which paint effects count as ornament: data marks, the plot and page backgrounds, decoration. */
function onDataOrPlot(chart: Chart, i: number): boolean {
  const r = chart.roles[i];
  if (!r) return false;
  return r.role === 'mark' || r.role === 'decoration' || r.sub === 'guide/background' || r.sub === 'guide/frame';
}

/** A gradient whose stops differ visibly (colour by a JND, or opacity by a tenth). */
function visibleGradient(p: Paint): boolean {
  if (p.kind !== 'gradient' || !p.stops || p.stops.length < 2) return false;
  const s = p.stops;
  for (let a = 0; a < s.length; a++) {
    for (let b = a + 1; b < s.length; b++) {
      if (Math.abs(s[a]!.color.alpha - s[b]!.color.alpha) >= 0.1) return true;
      if (deltaEab(s[a]!.color, s[b]!.color) >= JND_DELTA_E_AB) return true;
    }
  }
  return false;
}

function filterIds(root: XmlElement): Set<string> {
  const ids = new Set<string>();
  const walk = (el: XmlElement) => {
    if (el.name === 'filter' && el.attributes.id) ids.add(el.attributes.id);
    for (const c of el.children) if (c.type === 'element') walk(c);
  };
  walk(root);
  return ids;
}

/** The filter an item is drawn through, when it names one the document defines. */
function appliedFilter(it: SceneItem, defined: Set<string>): string | null {
  if (!it.filter) return null;
  const m = /url\(\s*['"]?#([^'")\s]+)['"]?\s*\)/.exec(it.filter);
  if (m) return defined.has(m[1]!) ? m[1]! : null;
  // CSS filter functions (drop-shadow(), blur()...) apply directly.
  return /\w+\(/.test(it.filter) ? it.filter : null;
}

export const ornament: Rule = {
  id: 'ink.ornament',
  family: 'ink',
  severity: 'warning',
  rationale: 'Gradients, shadows, patterns and pictures on the data add ink that encodes nothing and can change how large or dark a mark looks.',
  source: 'Tufte 1983, The Visual Display of Quantitative Information, ch. 5 ("chartjunk": moiré vibration, ducks); Tufte 1983 data-ink principles',
  thresholds: {},
  fix: 'Flatten: plain fills instead of gradients and patterns; remove shadows, filters and background pictures.',
  check({ chart }) {
    const items = chart.scene.items;
    const defined = filterIds(chart.scene.document.root);
    const found: Record<'gradient' | 'pattern' | 'filter' | 'shadow' | 'image', number[]> = { gradient: [], pattern: [], filter: [], shadow: [], image: [] };
    items.forEach((it, i) => {
      const sub = chart.roles[i]?.sub;
      if (!sub || sub === 'guide/colorbar') return;
      if (sub === 'decoration/shadow') found.shadow.push(i);
      if (appliedFilter(it, defined) !== null && chart.roles[i]!.role !== 'legend') found.filter.push(i);
      if (!onDataOrPlot(chart, i)) return;
      if (it.kind === 'image') found.image.push(i);
      if (it.kind === 'shape' || it.kind === 'text') {
        const paints = it.kind === 'shape' ? [it.fill, it.stroke] : [it.fill];
        if (paints.some(visibleGradient)) found.gradient.push(i);
        if (paints.some((p) => p.kind === 'pattern')) found.pattern.push(i);
      }
    });
    const what: Record<keyof typeof found, string> = {
      gradient: 'gradient fills',
      pattern: 'pattern fills',
      filter: 'filter effects (shadows, blurs or glows)',
      shadow: 'shadow copies',
      image: 'pictures',
    };
    const out: RuleFinding[] = [];
    for (const kind of Object.keys(found) as (keyof typeof found)[]) {
      const list = found[kind];
      if (list.length === 0) continue;
      const marks = list.filter((i) => chart.roles[i]!.role === 'mark').length;
      const where = marks === list.length ? 'on data marks' : marks > 0 ? 'on data marks and the plot' : 'on the plot';
      out.push({
        message: `${list.length} item${list.length > 1 ? 's' : ''} with ${what[kind]} ${where}: ornament that encodes no data.`,
        elements: elementsOf(chart, list),
        measures: { kind, count: list.length, onMarks: marks },
      });
    }
    return out;
  },
};
