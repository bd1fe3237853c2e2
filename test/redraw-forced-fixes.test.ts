/**
 * Every fix forced on every chart of ../shared/real-charts, whether or not its
 * rule fires, so each fix meets every generator's markup; the redraw must
 * still keep the data (checks in redraw-real-charts-check.ts). Prints
 * per-chart fixes, verification numbers and textual diff sizes.
 */
import { afterAll, describe, it } from 'vitest';
import { FIXABLE_RULES } from '../engine/redraw/fixes/index.js';
import { redrawWithFindings } from '../engine/redraw/redraw.js';
import { check, forced, rows } from './redraw-real-charts-check.js';
import { loadManifest, readChart } from './support/real-charts.js';

afterAll(() => {
  rows.sort();
  console.log(rows.join('\n'));
});

describe('every fix forced on the real charts', () => {
  for (const t of loadManifest()) {
    it(`${t.file}: every fix forced keeps the data`, () => {
      const text = readChart(t.file);
      check(t.file, text, redrawWithFindings(text, t.file, FIXABLE_RULES.map(forced)), 'forced');
    });
  }
});
