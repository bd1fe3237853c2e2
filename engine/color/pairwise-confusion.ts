import { deltaE00Lab } from './ciede2000.js';
import { compositeOver } from './composite.js';
import { applyCvdMatrixUnchecked, cvdMatrix } from './simulate-cvd.js';
import { rgbToLab65Unchecked } from './to-lab65.js';
import { assertRgba, assertRgbaList, CVD_TYPES, VISIONS, type Lab, type Rgba, type Vision } from './types.js';

/** ΔE00 of one pair of colours under each vision. */
export interface PairConfusion {
  i: number;
  j: number;
  normal: number;
  protan: number;
  deutan: number;
  tritan: number;
}

/** The pair with the smallest ΔE00 under one vision. */
export interface WorstPair {
  i: number;
  j: number;
  deltaE: number;
}

export interface PairwiseConfusion {
  /** Every pair i < j, in order (0,1), (0,2), …, (1,2), … */
  pairs: PairConfusion[];
  /** Smallest-ΔE00 pair per vision; null when fewer than two colours. */
  worst: Record<Vision, WorstPair | null>;
}

export interface PairwiseConfusionOptions {
  /** Deficiency severity 0..1 for the simulations; default 1 (dichromacy). */
  severity?: number;
  /**
   * Backdrop for translucent colours: each colour is composited over it
   * before comparison. Without it alpha is ignored.
   */
  background?: Rgba;
}

/** Lab (D65) of each colour as seen under each vision. */
export function labsByVision(colors: readonly Rgba[], severity = 1): Record<Vision, Lab[]> {
  const sim = (t: (typeof CVD_TYPES)[number]): Lab[] => {
    const m = cvdMatrix(t, severity);
    return colors.map((c) => rgbToLab65Unchecked(applyCvdMatrixUnchecked(c, m)));
  };
  return { normal: colors.map(rgbToLab65Unchecked), protan: sim('protan'), deutan: sim('deutan'), tritan: sim('tritan') };
}

/**
 * CIEDE2000 (D65 Lab) between every pair of colours under normal vision and
 * under simulated protan, deutan and tritan vision (Machado et al. 2009,
 * linear-RGB pipeline), plus the most confusable pair per vision.
 *
 * Simulation is a model of dichromatic or anomalous vision; these automated
 * numbers do not replace review by people nor a jurisdiction's accessibility
 * requirements.
 */
export function pairwiseConfusion(colors: readonly Rgba[], opts: PairwiseConfusionOptions = {}): PairwiseConfusion {
  assertRgbaList(colors);
  const severity = opts.severity ?? 1;
  let list: readonly Rgba[] = colors;
  if (opts.background !== undefined) {
    assertRgba(opts.background, 'background');
    const bg = opts.background;
    list = colors.map((c) => (c.alpha < 1 ? compositeOver(c, bg) : c));
  }
  const labs = labsByVision(list, severity);
  const pairs: PairConfusion[] = [];
  const worst: Record<Vision, WorstPair | null> = { normal: null, protan: null, deutan: null, tritan: null };
  for (let i = 0; i < list.length; i++) {
    for (let j = i + 1; j < list.length; j++) {
      const p: PairConfusion = {
        i,
        j,
        normal: deltaE00Lab(labs.normal[i], labs.normal[j]),
        protan: deltaE00Lab(labs.protan[i], labs.protan[j]),
        deutan: deltaE00Lab(labs.deutan[i], labs.deutan[j]),
        tritan: deltaE00Lab(labs.tritan[i], labs.tritan[j]),
      };
      pairs.push(p);
      for (const v of VISIONS) {
        const w = worst[v];
        if (w === null || p[v] < w.deltaE) worst[v] = { i, j, deltaE: p[v] };
      }
    }
  }
  return { pairs, worst };
}
