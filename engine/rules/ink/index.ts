/** The ink rules. */
import type { Rule } from '../rule.js';

export const INK_RULES: Rule[] = [];
