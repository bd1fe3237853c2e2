/** The color rules. */
import type { Rule } from '../rule.js';
import { cvdConfusable } from './cvd-confusable.js';
import { lowContrastMark } from './low-contrast-mark.js';
import { nonmonotonicRamp } from './nonmonotonic-ramp.js';
import { tooClose } from './too-close.js';
import { tooManyCategories } from './too-many-categories.js';

export const COLOR_RULES: Rule[] = [cvdConfusable, tooClose, nonmonotonicRamp, lowContrastMark, tooManyCategories];
