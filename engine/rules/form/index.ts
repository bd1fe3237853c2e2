/** The form rules. */
import type { Rule } from '../rule.js';
import { angleJudgment } from './angle-judgment.js';
import { overplotting } from './overplotting.js';
import { pieManySlices } from './pie-many-slices.js';

export const FORM_RULES: Rule[] = [pieManySlices, angleJudgment, overplotting];
