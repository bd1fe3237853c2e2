/** The text rules. */
import type { Rule } from '../rule.js';

export const TEXT_RULES: Rule[] = [];
