/** The text rules. */
import type { Rule } from '../rule.js';
import { textLowContrast } from './low-contrast.js';
import { mixedPrecision } from './mixed-precision.js';
import { textOverlap } from './overlap.js';
import { raggedNumerals } from './ragged-numerals.js';
import { textTooSmall } from './too-small.js';

export const TEXT_RULES: Rule[] = [textTooSmall, textLowContrast, textOverlap, raggedNumerals, mixedPrecision];
