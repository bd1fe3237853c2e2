/** The truth rules. */
import type { Rule } from '../rule.js';

export const TRUTH_RULES: Rule[] = [];
