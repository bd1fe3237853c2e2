/**
 * Reads one `<style>` sheet into rules: compiled selectors with their parsed
 * declarations. Nothing is ever fetched: `@import` and `@font-face` are
 * ignored. `@media` blocks apply per media.ts. Other at-rules (`@supports`,
 * `@layer`, `@page`, `@keyframes`, ...) are not part of CSS Cascade 4's
 * handling of author rules here and are skipped with a warning (`@charset`
 * and `@namespace` silently).
 */
import * as csstree from 'css-tree';
import { declarationsOf } from './declarations.js';
import { mediaPreludeApplies } from './media.js';
import { compileSelectorList, type CompiledSelector } from './selectors.js';
import type { Declaration } from './types.js';
import { asciiLower } from './values.js';

export interface SheetRule {
  readonly selectors: readonly CompiledSelector[];
  /** Longhand declarations without `!important`, in source order. */
  readonly normal: readonly Declaration[];
  /** Longhand declarations with `!important`, in source order. */
  readonly important: readonly Declaration[];
  /** Position of the rule in document order across all sheets. */
  readonly order: number;
}

export interface SheetPosition {
  /** 1-based line and column where the sheet text starts in the document. */
  readonly line: number;
  readonly column: number;
}

export type Warn = (message: string, line: number, column: number) => void;

const SILENT_AT_RULES = new Set(['charset', 'namespace', 'font-face']);

/**
 * Parses sheet text. `firstOrder` numbers the rules; the returned rules use
 * consecutive order values from it.
 */
export function readSheet(text: string, at: SheetPosition, firstOrder: number, warn: Warn): SheetRule[] {
  const rules: SheetRule[] = [];
  let ast: csstree.CssNode;
  let parseErrors = 0;
  try {
    ast = csstree.parse(text, {
      context: 'stylesheet',
      positions: true,
      line: at.line,
      column: at.column,
      parseValue: false,
      parseAtrulePrelude: true,
      parseRulePrelude: true,
      onParseError: () => {
        parseErrors++;
      },
    });
  } catch (err) {
    warn(`style sheet could not be read and was ignored: ${(err as Error).message}`, at.line, at.column);
    return rules;
  }
  if (parseErrors > 0) warn(`style sheet has ${parseErrors} syntax error(s); the affected rules were skipped`, at.line, at.column);
  if (ast.type !== 'StyleSheet') return rules;

  const posOf = (node: csstree.CssNode): [number, number] => [node.loc?.start.line ?? at.line, node.loc?.start.column ?? at.column];

  const visit = (nodes: readonly csstree.CssNode[]): void => {
    for (const node of nodes) {
      if (node.type === 'Rule') {
        if (node.prelude.type !== 'SelectorList') {
          warn(`rule with an unreadable selector was skipped: '${clip(node.prelude.value)}'`, ...posOf(node));
          continue;
        }
        const compiled = compileSelectorList(node.prelude);
        if (!compiled.ok) {
          warn(`rule skipped: ${compiled.reason}`, ...posOf(node));
          continue;
        }
        for (const d of compiled.dropped) warn(`selector '${clip(d.text)}' skipped: ${d.reason}`, ...posOf(node));
        if (compiled.selectors.length === 0) continue;
        const selectorText = compiled.selectors.map((s) => s.text).join(', ');
        const decls = declarationsOf(node.block.children.toArray(), { origin: 'sheet', selector: selectorText });
        if (decls.length === 0) continue;
        rules.push({
          selectors: compiled.selectors,
          normal: decls.filter((d) => !d.important),
          important: decls.filter((d) => d.important),
          order: firstOrder + rules.length,
        });
      } else if (node.type === 'Atrule') {
        const name = asciiLower(node.name);
        if (name === 'import') {
          warn('@import ignored: external style sheets are never fetched', ...posOf(node));
        } else if (name === 'media') {
          if (node.block && mediaPreludeApplies(node.prelude)) visit(node.block.children.toArray());
        } else if (!SILENT_AT_RULES.has(name)) {
          warn(`@${clip(node.name)} block skipped: not supported`, ...posOf(node));
        }
      }
      // CDO/CDC tokens, comments and raw garbage carry no rules.
    }
  };
  visit(ast.children.toArray());
  return rules;
}

function clip(s: string): string {
  const one = s.replace(/\s+/g, ' ').trim();
  return one.length > 80 ? one.slice(0, 77) + '...' : one;
}
