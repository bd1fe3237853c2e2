/** The access rules. */
import type { Rule } from '../rule.js';

export const ACCESS_RULES: Rule[] = [];
