/** The access rules. */
import type { Rule } from '../rule.js';
import { missingDescription } from './missing-description.js';

export const ACCESS_RULES: Rule[] = [missingDescription];
