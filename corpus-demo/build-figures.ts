/**
 * Every demo figure with the problems it was drawn to have (rule ids), in
 * the order they are written. Figures with no intended rules are the clean
 * ones: they should pass the audit without warnings or errors.
 */
import { annualSupply, billingTableChart, connectionsByDistrict, customerSatisfaction, districtUsage3d, leakDetection, pipeRepairs, treatmentCosts } from './charts-bars.js';
import { meterReadings, pressureHeatmap } from './charts-grids.js';
import { rainfallMonthly, reservoirLevels } from './charts-lines.js';
import { spendingBreakdown, waterSources } from './charts-pies.js';
import type { Figure } from './svg-kit.js';

export interface DemoFigure extends Figure {
  /** Rule ids the figure was drawn to trigger; empty for a clean figure. */
  intended: string[];
}

const PLAN: [() => Figure, string[]][] = [
  [reservoirLevels, ['ink.background-fill', 'ink.heavy-grid']],
  [pipeRepairs, ['ink.frame-box']],
  [customerSatisfaction, ['truth.truncated-baseline']],
  [waterSources, ['truth.3d-projection']],
  [districtUsage3d, ['truth.3d-projection']],
  [leakDetection, ['color.cvd-confusable']],
  [pressureHeatmap, ['color.nonmonotonic-ramp']],
  [treatmentCosts, ['text.too-small', 'text.low-contrast']],
  [billingTableChart, ['text.ragged-numerals', 'text.mixed-precision']],
  [meterReadings, ['form.overplotting', 'access.missing-description']],
  [spendingBreakdown, ['form.pie-many-slices']],
  [rainfallMonthly, []],
  [connectionsByDistrict, []],
  [annualSupply, []],
];

/** Builds every figure in memory; pure and deterministic (fixed seeds). */
export function buildFigures(): DemoFigure[] {
  return PLAN.map(([build, intended]) => ({ ...build(), intended }));
}
