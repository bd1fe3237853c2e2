/**
 * Escaping for text that comes from a chart (titles, labels, ids, file names,
 * messages that quote them) before it goes into GitHub-flavoured Markdown: a
 * PR comment, a job summary, a report file.
 *
 * The output contains no character that Markdown or HTML treat as syntax:
 * every such character becomes a numeric character reference, which both
 * Markdown and HTML show as the literal character and never as markup (a
 * decoded reference is text, not a delimiter). So one escaped string is safe
 * in a paragraph, in a table cell, in a list item and inside `<summary>`.
 * It is not meant for code spans or code blocks, where references are not
 * decoded.
 *
 * What GitHub does after rendering needs a different trick: it links
 * `@name` mentions, `#123` references and bare URLs in the rendered text, so
 * references would not stop it. A zero-width joiner after `@` and `#`, and a
 * zero-width space inside `://` and `www.`, break those patterns while the
 * text still reads the same.
 */

/** Zero-width joiner: invisible, ends the `@mention` and `#123` patterns. */
const ZWJ = '\u200d';
/** Zero-width space: invisible, ends bare-URL autolinks. */
const ZWSP = '\u200b';

const ENTITY: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
  '`': '&#96;',
  '[': '&#91;',
  ']': '&#93;',
  '(': '&#40;',
  ')': '&#41;',
  '*': '&#42;',
  _: '&#95;',
  '~': '&#126;',
  '|': '&#124;',
  '!': '&#33;',
  '#': '&#35;',
  '\\': '&#92;',
  $: '&#36;',
  '{': '&#123;',
  '}': '&#125;',
};

/** Characters that start a block at the start of a line (bullet list, rule, setext underline). */
const LEADING = /^[-+=]/;
/** An ordered-list marker at the start: digits then a dot (the `)` form is escaped anyway). */
const LEADING_ORDINAL = /^(\d{1,9})\./;

/**
 * Control characters (C0 except tab and line breaks, DEL, C1), bidirectional
 * overrides and isolates (they can make text read differently from what it
 * is), and the byte-order mark.
 */
// eslint-disable-next-line no-control-regex
const INVISIBLE = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069\ufeff]/g;

/**
 * Escapes text for inline use in Markdown (paragraph, table cell, list item,
 * `<summary>`). Line breaks and tabs become single spaces, so a cell stays one
 * cell and no new block can start.
 */
export function escapeMarkdown(text: string): string {
  let s = String(text).replace(INVISIBLE, '').replace(/\r\n|[\r\n\t\u2028\u2029\u0085]/g, ' ');
  s = s.replace(/[&<>"'`[\]()*_~|!#\\${}]/g, (c) => ENTITY[c] ?? c);
  // After entity replacement `@` and the URL markers are still literal: break the patterns.
  s = s.replace(/@/g, `@${ZWJ}`);
  s = s.replace(/&#35;(?=\d+(?![\p{L}\p{N}_]))/gu, `&#35;${ZWJ}`);
  s = s.replace(/:\/\//g, `:${ZWSP}//`);
  s = s.replace(/\bwww\./gi, (m) => `${m.slice(0, 3)}${ZWSP}.`);
  // Leading blanks would make an indented code block at the start of a line.
  s = s.replace(/^ +/, '');
  if (LEADING.test(s)) s = `&#${s.charCodeAt(0)};${s.slice(1)}`;
  else s = s.replace(LEADING_ORDINAL, '$1&#46;');
  return s;
}

/**
 * Escaped text cut to at most `max` visible characters (counted before
 * escaping), with an ellipsis when cut. Cuts never split a surrogate pair.
 */
export function escapeMarkdownShort(text: string, max: number): string {
  const chars = Array.from(String(text));
  if (chars.length <= max) return escapeMarkdown(text);
  return `${escapeMarkdown(chars.slice(0, Math.max(0, max - 1)).join(''))}…`;
}
