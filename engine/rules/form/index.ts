/** The form rules. */
import type { Rule } from '../rule.js';

export const FORM_RULES: Rule[] = [];
