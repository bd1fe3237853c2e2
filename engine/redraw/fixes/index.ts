/** The fixes redraw can apply, by rule id, in the order they are applied. */
import type { Fix } from '../fix-context.js';
import { fixMissingDescription } from './access.missing-description.js';
import { fixCvdConfusable } from './color.cvd-confusable.js';
import { fixNonmonotonicRamp } from './color.nonmonotonic-ramp.js';
import { fixBackgroundFill } from './ink.background-fill.js';
import { fixFrameBox } from './ink.frame-box.js';
import { fixHeavyGrid } from './ink.heavy-grid.js';
import { fixOrnament } from './ink.ornament.js';
import { fixRedundantTicks } from './ink.redundant-ticks.js';
import { fixMixedPrecision } from './text.mixed-precision.js';
import { fixRaggedNumerals } from './text.ragged-numerals.js';
import { fixThreeDProjection } from './truth.3d-projection.js';

/**
 * Order matters where fixes meet: removals first (a removed element needs no
 * other edit), then recolouring, then text, then the description (written
 * last, from the recovered data).
 */
export const FIXES: ReadonlyMap<string, Fix> = new Map<string, Fix>([
  ['truth.3d-projection', fixThreeDProjection],
  ['ink.ornament', fixOrnament],
  ['ink.background-fill', fixBackgroundFill],
  ['ink.frame-box', fixFrameBox],
  ['ink.redundant-ticks', fixRedundantTicks],
  ['ink.heavy-grid', fixHeavyGrid],
  ['color.cvd-confusable', fixCvdConfusable],
  ['color.nonmonotonic-ramp', fixNonmonotonicRamp],
  ['text.ragged-numerals', fixRaggedNumerals],
  ['text.mixed-precision', fixMixedPrecision],
  ['access.missing-description', fixMissingDescription],
]);

/** Rule ids redraw has a fix for. */
export const FIXABLE_RULES: readonly string[] = [...FIXES.keys()];
