/** The color rules. */
import type { Rule } from '../rule.js';

export const COLOR_RULES: Rule[] = [];
