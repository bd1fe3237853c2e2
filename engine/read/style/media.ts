/**
 * Media queries for `@media` blocks and `<style media="...">`.
 *
 * The cascade describes the document as shown on a screen with no known
 * size or preferences: a query applies when its media type is `all` or
 * `screen` (or absent) and it has no feature conditions; `not <type>` applies
 * when the type is neither. Queries with feature conditions (`(min-width: …)`,
 * `(prefers-color-scheme: dark)`) cannot be decided without a viewer and are
 * treated as not applying. A list applies if any of its queries does
 * (Media Queries 4 §2.1).
 */
import * as csstree from 'css-tree';
import { asciiLower } from './values.js';

function screenType(type: string | null): boolean {
  return type === null || type === 'all' || type === 'screen';
}

/** Evaluates a parsed at-rule prelude (MediaQueryList or Raw). */
export function mediaPreludeApplies(prelude: csstree.CssNode | null): boolean {
  if (prelude === null) return true;
  let list: csstree.CssNode | null | undefined = prelude;
  if (prelude.type === 'AtrulePrelude') {
    const kids = prelude.children.toArray();
    if (kids.length === 0) return true;
    list = kids.length === 1 ? kids[0] : null;
  }
  if (!list || list.type !== 'MediaQueryList') return false;
  const queries = list.children.toArray();
  if (queries.length === 0) return true;
  return queries.some((q) => {
    if (q.type !== 'MediaQuery') return false;
    if (q.condition !== null) return false;
    const type = q.mediaType === null ? null : asciiLower(q.mediaType);
    const modifier = q.modifier === null ? null : asciiLower(q.modifier);
    if (modifier === 'not') return type !== null && !screenType(type);
    return screenType(type);
  });
}

/** Evaluates media query text, e.g. the `media` attribute of `<style>`. Empty text applies. */
export function mediaTextApplies(text: string): boolean {
  if (text.trim() === '') return true;
  let failed = false;
  let ast: csstree.CssNode;
  try {
    ast = csstree.parse(text, { context: 'mediaQueryList', onParseError: () => (failed = true) });
  } catch {
    return false;
  }
  return !failed && mediaPreludeApplies(ast);
}
