/** The rule catalogue, in family order. */
import { ACCESS_RULES } from './access/index.js';
import { COLOR_RULES } from './color/index.js';
import { FORM_RULES } from './form/index.js';
import { INK_RULES } from './ink/index.js';
import type { Rule } from './rule.js';
import { TEXT_RULES } from './text/index.js';
import { TRUTH_RULES } from './truth/index.js';

export const ALL_RULES: readonly Rule[] = [...INK_RULES, ...TRUTH_RULES, ...COLOR_RULES, ...TEXT_RULES, ...FORM_RULES, ...ACCESS_RULES];

export function ruleById(id: string): Rule | undefined {
  return ALL_RULES.find((r) => r.id === id);
}
