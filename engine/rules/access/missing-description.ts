/**
 * access.missing-description: the figure has no text alternative of its
 * own — no `<title>`, `<desc>`, `aria-label` or `aria-labelledby` on the
 * root `<svg>` — or has one that names nothing shown in the chart (a
 * generator's boilerplate).
 */
import type { Rule } from '../rule.js';

const WORD = /[\p{L}\p{N}]{3,}/gu;

function words(s: string | null): Set<string> {
  const out = new Set<string>();
  if (!s) return out;
  for (const m of s.toLowerCase().matchAll(WORD)) out.add(m[0]);
  return out;
}

const DISCLAIMER =
  'Automated checks do not replace an accessibility review, nor the accessibility requirements of the place where the figure is published.';

export const missingDescription: Rule = {
  id: 'access.missing-description',
  family: 'access',
  severity: 'warning',
  rationale:
    'People using screen readers get nothing from a chart without a text alternative; a title and a short description of what the data show give them the point of the figure.',
  source:
    'W3C WCAG 2.x SC 1.1.1 Non-text Content (Level A); SVG 2 `title` and `desc` elements and WAI-ARIA `aria-label` as the text alternative of an `svg` element',
  thresholds: {},
  fix: 'write a <title> and a <desc> on the root from the recovered chart: its kind, title, axes and series, and the range of the values',
  check({ chart }) {
    const scene = chart.scene;
    const root = scene.document.root;
    const at = [{ id: root.attribute('id') ?? null, line: root.line, column: root.column }];
    const labelledBy = root.attribute('aria-labelledby') ?? null;
    const own = [scene.title, scene.description, scene.ariaLabel].filter((s): s is string => s !== null && s.trim() !== '');
    if (own.length === 0 && !labelledBy) {
      return [
        {
          message: `The SVG has no <title>, <desc> or aria-label on its root, so it has no text alternative of its own unless the page embedding it gives one. ${DISCLAIMER}`,
          elements: at,
          measures: { title: null, description: null, ariaLabel: null },
        },
      ];
    }
    if (own.length === 0) return [];
    // Present: does it name anything the chart shows?
    const shown = new Set<string>();
    scene.items.forEach((it, i) => {
      const role = chart.roles[i];
      if (it.kind === 'text' && role && role.role === 'label') for (const w of words(it.content)) shown.add(w);
    });
    for (const s of chart.series) for (const w of words(s.name)) shown.add(w);
    const shownWords = [...shown].filter((w) => /\p{L}/u.test(w));
    if (shownWords.length === 0) return [];
    const said = new Set(own.flatMap((s) => [...words(s)]));
    if (shownWords.some((w) => said.has(w))) return [];
    return [
      {
        severity: 'note',
        message: `The root's text alternative ("${own.join(' / ').slice(0, 80)}") names nothing the chart shows, so it does not describe this figure. ${DISCLAIMER}`,
        elements: at,
        measures: { title: scene.title, description: scene.description, ariaLabel: scene.ariaLabel },
      },
    ];
  },
};
