/**
 * access.missing-description: a text alternative on the root <svg>.
 */
import { describe, expect, it } from 'vitest';
import { missingDescription } from '../engine/rules/access/missing-description.js';
import { barChart, check, understand } from './support/rules-svg.js';

const chart = (wrap: Parameters<typeof barChart>[0]['wrap']) =>
  understand(barChart({ series: [[10, 20, 15]], colors: ['#4477aa'], names: ['Loaves sold'], lo: 0, hi: 25, ticks: [0, 5, 10, 15, 20, 25], wrap }));

describe('access.missing-description', () => {
  it('no <title>, <desc> or aria-label on the root is reported, with the review disclaimer', () => {
    const f = check(missingDescription, chart({}));
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toMatch(/no <title>, <desc> or aria-label/);
    // House rule: accessibility findings say automated checks do not replace review or local requirements.
    expect(f[0]!.message).toMatch(/Automated checks do not replace an accessibility review, nor the accessibility requirements/);
    expect(f[0]!.elements[0]!.line).toBe(1);
    expect(missingDescription.fix).toMatch(/<title>/);
  });

  it('a title, a description or an aria-label that describes the chart passes', () => {
    expect(check(missingDescription, chart({ title: 'Loaves sold per day' }))).toEqual([]);
    expect(check(missingDescription, chart({ desc: 'Bar chart of loaves sold on three days' }))).toEqual([]);
    expect(check(missingDescription, chart({ ariaLabel: 'Loaves sold, three days' }))).toEqual([]);
  });

  it("a generator's boilerplate title that names nothing in the chart is noted", () => {
    const f = check(missingDescription, chart({ title: 'Produced by Plotter 5.1' }));
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('note');
    expect(f[0]!.message).toMatch(/names nothing the chart shows/);
  });
});
