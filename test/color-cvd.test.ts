import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { filterDeficiencyDeuter, filterDeficiencyProt, filterDeficiencyTrit, formatHex as culoriHex, parse } from 'culori';
import { describe, expect, it } from 'vitest';
import { cvdMatrix, formatHex, MACHADO_2009_MATRICES, parseColor, simulateCvd, type CvdType } from '../engine/color/index.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const reference = JSON.parse(
  fs.readFileSync(path.resolve(repoRoot, '../shared/reference/cvd-machado2009.json'), 'utf8'),
) as {
  matrices: Record<string, Record<string, number[][]>>;
  workedExamples: {
    cases: {
      type: string;
      severity: number;
      input: string;
      linearRGBout: number[];
      hexOut_linearPipeline: string;
      hexOut_gammaPipeline: string;
    }[];
  };
};

const TYPE_OF: Record<string, CvdType> = { protanomaly: 'protan', deuteranomaly: 'deutan', tritanomaly: 'tritan' };
const SEVERITIES = ['0.0', '0.1', '0.2', '0.3', '0.4', '0.5', '0.6', '0.7', '0.8', '0.9', '1.0'];

describe('Machado et al. (2009) matrices', () => {
  // source: Machado, Oliveira & Fernandes 2009, supplementary pre-computed matrices,
  // via ../shared/reference/cvd-machado2009.json (checked there against three public copies)
  for (const [name, type] of Object.entries(TYPE_OF)) {
    it(`${type}: all 11 severities equal the published values`, () => {
      SEVERITIES.forEach((s, k) => {
        expect(MACHADO_2009_MATRICES[type][k]).toEqual(reference.matrices[name][s]);
        expect(cvdMatrix(type, Number(s))).toEqual(reference.matrices[name][s]);
      });
    });
  }

  it('interpolates linearly between the 0.1 steps', () => {
    // source: ../shared/reference/REFERENCES.md §2 — M(0.15)[0][0] = 0.7954665 by linear
    // interpolation between the 0.1 and 0.2 protanomaly matrices
    expect(cvdMatrix('protan', 0.15)[0][0]).toBeCloseTo(0.7954665, 7);
    const m = cvdMatrix('deutan', 0.55);
    const lo = reference.matrices.deuteranomaly['0.5'];
    const hi = reference.matrices.deuteranomaly['0.6'];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(m[i][j]).toBeCloseTo((lo[i][j] + hi[i][j]) / 2, 12);
  });

  it('rejects unknown types and severities outside 0..1', () => {
    // @ts-expect-error runtime guard
    expect(() => cvdMatrix('achromat', 1)).toThrow(/CVD type/);
    expect(() => cvdMatrix('protan', 1.2)).toThrow(RangeError);
    expect(() => cvdMatrix('protan', NaN)).toThrow(RangeError);
  });
});

describe('simulateCvd (linear-RGB pipeline)', () => {
  const cases = reference.workedExamples.cases;
  it('has the 42 computed worked examples', () => {
    expect(cases).toHaveLength(42);
  });

  // source: computed worked examples in ../shared/reference/cvd-machado2009.json
  // (Machado 2009 matrices applied in linear RGB, clamped, re-encoded, 8-bit hex)
  it.each(cases.map((c) => [c.type, c.severity, c.input, c] as const))('%s %s of %s', (_t, _s, _i, c) => {
    const out = simulateCvd(parseColor(c.input)!, TYPE_OF[c.type], c.severity);
    expect(formatHex(out)).toBe(c.hexOut_linearPipeline);
  });

  it('keeps greys and alpha unchanged', () => {
    // source: every row of every Machado matrix sums to 1 (REFERENCES.md §2), so greys map to themselves
    const grey = { r: 0.3, g: 0.3, b: 0.3, alpha: 0.4 };
    for (const t of ['protan', 'deutan', 'tritan'] as const) {
      const out = simulateCvd(grey, t, 0.7);
      expect(out.r).toBeCloseTo(0.3, 5);
      expect(out.g).toBeCloseTo(0.3, 5);
      expect(out.b).toBeCloseTo(0.3, 5);
      expect(out.alpha).toBe(0.4);
    }
  });

  it('clamps results to the sRGB gamut', () => {
    // source: worked example — protanopia of #00ff00 is (1.052583, 0.786281, -0.048116) in linear RGB before clamping
    const out = simulateCvd(parseColor('#00ff00')!, 'protan', 1);
    expect(out.r).toBeCloseTo(1, 12);
    expect(out.r).toBeLessThanOrEqual(1);
    expect(out.b).toBe(0);
  });
});

describe("culori's built-in deficiency filters differ (gamma-encoded pipeline)", () => {
  // source: ../shared/reference/REFERENCES.md §2 "Discrepancies found in culori 4.0.2": culori multiplies
  // gamma-encoded sRGB; deuteranopia of #ff0000 is #5e4700 there and #a39000 in the linear pipeline
  it('deuteranopia of #ff0000: #a39000 here, #5e4700 in culori', () => {
    expect(formatHex(simulateCvd(parseColor('#ff0000')!, 'deutan', 1))).toBe('#a39000');
    expect(culoriHex(filterDeficiencyDeuter(1)(parse('#ff0000')!))).toBe('#5e4700');
  });

  it("culori's output equals the reference's gamma-pipeline column, ours the linear column", () => {
    const filters = { protanomaly: filterDeficiencyProt, deuteranomaly: filterDeficiencyDeuter, tritanomaly: filterDeficiencyTrit };
    let differing = 0;
    for (const c of reference.workedExamples.cases) {
      const f = filters[c.type as keyof typeof filters];
      expect(culoriHex(f(c.severity)(parse(c.input)!))).toBe(c.hexOut_gammaPipeline);
      if (c.hexOut_gammaPipeline !== c.hexOut_linearPipeline) differing++;
    }
    expect(differing).toBeGreaterThan(20);
  });
});
