/** The ink rules. */
import type { Rule } from '../rule.js';
import { backgroundFill } from './background-fill.js';
import { frameBox } from './frame-box.js';
import { heavyGrid } from './heavy-grid.js';
import { lowDataShare } from './low-data-share.js';
import { ornament } from './ornament.js';
import { redundantTicks } from './redundant-ticks.js';

export const INK_RULES: Rule[] = [backgroundFill, frameBox, heavyGrid, ornament, redundantTicks, lowDataShare];
