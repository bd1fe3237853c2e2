/**
 * access.missing-description: the root gets a `<title>` and a `<desc>` as its
 * first children, written from the recovered chart (kind, title, axes,
 * series, value ranges and extremes), XML-escaped. Existing root title/desc
 * elements (a generator's boilerplate) get the new text instead; a
 * boilerplate `aria-label` on the root is rewritten to the new title, since
 * it would otherwise take precedence.
 */
import type { XmlElement } from '../../read/xml-tree.js';
import { describeChart } from '../describe-chart.js';
import { escapeText, indentationAfter, insertAfter, insertFirstChild, namePrefix, setAttribute, setTextContent, type Edit } from '../edit-list.js';
import { emptyOutcome, type Fix } from '../fix-context.js';

export const fixMissingDescription: Fix = (ctx) => {
  const out = emptyOutcome();
  const { doc, chart } = ctx.analysis;
  const root = doc.root;
  const { title, description } = describeChart(chart);
  const child = (name: string): XmlElement | undefined =>
    root.children.find((c): c is XmlElement => c.type === 'element' && c.name === name);
  const titleEl = child('title');
  const descEl = child('desc');
  const p = namePrefix(doc, root);
  const titleMarkup = `<${p}title>${escapeText(title)}</${p}title>`;
  const descMarkup = `<${p}desc>${escapeText(description)}</${p}desc>`;
  const edits: Edit[] = [];
  if (titleEl) edits.push(setTextContent(doc, titleEl, title));
  if (descEl) edits.push(setTextContent(doc, descEl, description));
  if (!titleEl && !descEl) {
    const sep = root.selfClosing ? '' : indentationAfter(doc.source, root.openEnd);
    edits.push(insertFirstChild(doc, root, `${titleMarkup}${sep}${descMarkup}`));
  } else if (!titleEl) {
    edits.push(insertFirstChild(doc, root, titleMarkup));
  } else if (!descEl) {
    edits.push(insertAfter(titleEl, `${indentationAfter(doc.source, titleEl.end) || ''}${descMarkup}`));
  }
  if (root.attribute('aria-label') !== undefined) edits.push(setAttribute(doc, root, 'aria-label', title));
  out.edits = edits;
  out.count = 2;
  out.notes.push(`title: ${title}`);
  out.notes.push('the text is generated from the recovered data; automated text does not replace a human-written description or a review against the accessibility requirements that apply');
  return out;
};
