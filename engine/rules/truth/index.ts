/** The truth rules. */
import type { Rule } from '../rule.js';
import { dualAxis } from './dual-axis.js';
import { radiusEncoding } from './radius-encoding.js';
import { threeDProjection } from './three-d-projection.js';
import { truncatedBaseline } from './truncated-baseline.js';

export const TRUTH_RULES: Rule[] = [truncatedBaseline, threeDProjection, dualAxis, radiusEncoding];
