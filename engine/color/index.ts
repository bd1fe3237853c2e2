/**
 * Colour science for plumbline: parsing, CIELAB (D65) and OKLab, CIEDE2000,
 * colour-vision-deficiency simulation (Machado, Oliveira & Fernandes 2009),
 * WCAG 2.x contrast, palette and ramp diagnostics and repairs.
 */
export type { CvdType, Lab, Oklab, Oklch, Rgba, Vision } from './types.js';
export { CVD_TYPES, VISIONS } from './types.js';
export { parseColor } from './parse-color.js';
export { formatHex } from './format-hex.js';
export { toLab65 } from './to-lab65.js';
export { toOklab } from './to-oklab.js';
export { toOklch } from './to-oklch.js';
export { fromOklch } from './from-oklch.js';
export { deltaE00 } from './ciede2000.js';
export type { Matrix3 } from './machado-2009-matrices.js';
export { MACHADO_2009_MATRICES } from './machado-2009-matrices.js';
export { cvdMatrix, simulateCvd } from './simulate-cvd.js';
export { compositeOver } from './composite.js';
export { contrastRatio, relativeLuminance, WCAG_CONTRAST } from './wcag-contrast.js';
export type { PairConfusion, PairwiseConfusion, PairwiseConfusionOptions, WorstPair } from './pairwise-confusion.js';
export { pairwiseConfusion } from './pairwise-confusion.js';
export type { HueCycling, HueCyclingOptions, LightnessMonotonicity } from './lightness-profile.js';
export { hueCycling, isMonotonicLightness, lightnessProfile } from './lightness-profile.js';
export type { RepairPaletteOptions } from './repair-palette.js';
export { repairPalette } from './repair-palette.js';
export type { RebuildRampOptions } from './monotonic-ramp.js';
export { rebuildRamp } from './monotonic-ramp.js';
