import { deltaE00Lab } from './ciede2000.js';
import { fromOklch } from './from-oklch.js';
import { createRandom, gaussian } from './prng.js';
import { applyCvdMatrixUnchecked, cvdMatrix } from './simulate-cvd.js';
import { rgbToLab65Unchecked } from './to-lab65.js';
import { toOklch } from './to-oklch.js';
import { assertRgba, assertRgbaList, CVD_TYPES, type Lab, type Rgba } from './types.js';
import { contrastRatioOpaque } from './wcag-contrast.js';
import type { Matrix3 } from './machado-2009-matrices.js';

export interface RepairPaletteOptions {
  /** Starting state of the search's random generator; the same inputs and state give the same output. Default 1. */
  randomState?: number;
  /** Number of proposed moves. Default 400 per colour (at least 1600); at most 200 000. */
  iterations?: number;
  /** Contrast ratio against the background to keep where possible. Default 3 (WCAG 2.x SC 1.4.11). */
  minContrast?: number;
  /** Deficiency severity for the protan, deutan and tritan simulations. Default 1. */
  severity?: number;
  /** Weight of the hue-keeping penalty. Default 1. */
  hueWeight?: number;
  /** Weight of the lightness-order-keeping penalty. Default 1. */
  lightnessOrderWeight?: number;
  /** Weight of the contrast penalty. Default 1. */
  contrastWeight?: number;
  /**
   * ΔE00 beyond which a pair counts as fully separated, so the search stops
   * trading the original look for more distance. Default 15 (plumbline's
   * choice: above the worst simulated pair of the Okabe & Ito palette, about
   * 11–12).
   */
  sufficientDeltaE?: number;
}

/** Soft-minimum temperature in ΔE00 units (smaller = closer to the true minimum). */
const SOFTMIN_TAU = 0.75;
/*
 * Penalty scales, in ΔE00-equivalent units (plumbline's own tuning, no
 * published source). Per colour k, averaged over the palette:
 *   hueWeight · w_k · (HUE_COST · (1 − cos Δh) + CHROMA_COST · chromaLoss²)
 *   + DRIFT_COST · ΔE00(original, new)
 * with w_k = min(1, C_k / 0.05) so near-greys have no hue to keep, and
 * chromaLoss the fraction of the original OKLCh chroma given up.
 */
/** Cost of a 90° hue change of a chromatic colour (saturates at 2× for 180°). */
const HUE_COST = 8;
/** Cost of losing all of the original chroma. */
const CHROMA_COST = 6;
/**
 * Contrast below the minimum costs a fixed step (so a near miss such as
 * 2.99:1 is not traded for a sliver of distance) plus a cost per unit of
 * ratio short, per colour (not averaged).
 */
const CONTRAST_STEP = 2;
const CONTRAST_COST = 20;
/** Cost per unit ΔE00 of a colour's change from its original. */
const DRIFT_COST = 0.3;
/**
 * Pairs whose original OKLab lightness differs by less than this have no order
 * to keep. A flipped pair costs lightnessOrderWeight per 0.05 of OKLab
 * lightness it is flipped by (summed over pairs, not averaged).
 */
const ORDER_MARGIN = 0.02;
/** Categorical palettes longer than this are not told apart by colour alone; refuse rather than run long. */
const MAX_COLORS = 24;
const MAX_ITERATIONS = 200_000;

interface State {
  L: number[];
  C: number[];
  H: number[];
  rgb: Rgba[];
  /** labs[v][k]: Lab of colour k under vision v (0 normal, 1..3 protan, deutan, tritan). */
  labs: Lab[][];
}

function cloneState(s: State): State {
  return { L: [...s.L], C: [...s.C], H: [...s.H], rgb: [...s.rgb], labs: s.labs.map((row) => [...row]) };
}

function angleDiff(a: number, b: number): number {
  return Math.abs(((((a - b) % 360) + 540) % 360) - 180);
}

/**
 * Adjusts a categorical palette so every pair of colours stays apart under
 * normal vision and under simulated protan, deutan and tritan vision
 * (Machado et al. 2009, linear-RGB pipeline), while staying close to the
 * original hues and lightness order and keeping contrast against the
 * background.
 *
 * The search maximises
 *   softmin over pairs and visions of ΔE00 (D65 Lab)
 *   − hue penalty (hue change, weighted by the original colour's chroma)
 *   − lightness-order penalty (pairs whose OKLab lightness order flips)
 *   − contrast penalty (shortfall below `minContrast` against `background`)
 *   − a small drift penalty (ΔE00 from the original colour)
 * by simulated annealing over OKLCh coordinates, clipped to the sRGB gamut,
 * with a random generator started from a fixed state: deterministic for
 * given inputs and options.
 * The best state by the true minimum ΔE00 (minus the same penalties) is
 * returned. Alpha of each input colour is kept; translucency is ignored in
 * the distances and the background is taken as opaque. Colours are returned
 * in input order. Throws RangeError for more than 24 colours or bad options.
 *
 * Automated palette checks do not replace review by people, including people
 * with colour-vision deficiencies, nor a jurisdiction's accessibility
 * requirements.
 */
export function repairPalette(colors: readonly Rgba[], background: Rgba, opts: RepairPaletteOptions = {}): Rgba[] {
  assertRgbaList(colors);
  assertRgba(background, 'background');
  const n = colors.length;
  if (n > MAX_COLORS) {
    throw new RangeError(`repairPalette: at most ${MAX_COLORS} colours can be repaired as one palette; got ${n}`);
  }
  if (n < 2) return colors.map((c) => ({ ...c }));
  const randomState = opts.randomState ?? 1;
  const iterations = opts.iterations ?? Math.max(1600, 400 * n);
  const minContrast = opts.minContrast ?? 3;
  const severity = opts.severity ?? 1;
  const hueWeight = opts.hueWeight ?? 1;
  const orderWeight = opts.lightnessOrderWeight ?? 1;
  const contrastWeight = opts.contrastWeight ?? 1;
  const enough = opts.sufficientDeltaE ?? 15;
  for (const [name, v] of Object.entries({
    randomState,
    iterations,
    minContrast,
    hueWeight,
    lightnessOrderWeight: orderWeight,
    contrastWeight,
    sufficientDeltaE: enough,
  })) {
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
      throw new RangeError(`repairPalette: option ${name} must be a finite non-negative number; got ${String(v)}`);
    }
  }
  if (iterations > MAX_ITERATIONS) {
    throw new RangeError(`repairPalette: iterations must be at most ${MAX_ITERATIONS}; got ${iterations}`);
  }
  const matrices: Matrix3[] = CVD_TYPES.map((t) => cvdMatrix(t, severity));
  const bg: Rgba = { ...background, alpha: 1 };

  const orig = colors.map((c) => toOklch(c));
  const origLab = colors.map(rgbToLab65Unchecked);
  const hueImportance = orig.map((o) => Math.min(1, o.c / 0.05));

  const labsOf = (c: Rgba): Lab[] => [
    rgbToLab65Unchecked(c),
    ...matrices.map((m) => rgbToLab65Unchecked(applyCvdMatrixUnchecked(c, m))),
  ];

  const init: State = {
    L: orig.map((o) => o.l),
    C: orig.map((o) => o.c),
    H: orig.map((o) => o.h),
    rgb: colors.map((c) => ({ r: c.r, g: c.g, b: c.b, alpha: 1 })),
    labs: [[], [], [], []],
  };
  for (let k = 0; k < n; k++) {
    const ls = labsOf(init.rgb[k]);
    for (let v = 0; v < 4; v++) init.labs[v][k] = ls[v];
  }

  // Pairwise distances d[v][i*n+j], kept in sync with the current state.
  const dist = (s: State): Float64Array[] => {
    const d = [0, 1, 2, 3].map(() => new Float64Array(n * n));
    for (let v = 0; v < 4; v++) {
      for (let i = 0; i < n; i++) {
        for (let j = i + 1; j < n; j++) {
          const x = deltaE00Lab(s.labs[v][i], s.labs[v][j]);
          d[v][i * n + j] = x;
          d[v][j * n + i] = x;
        }
      }
    }
    return d;
  };

  const penaltyOf = (s: State, k: number): number => {
    const dh = angleDiff(s.H[k], orig[k].h);
    // Hue change, and loss of chroma (a colour turned grey loses its hue too).
    const chromaLoss = Math.max(0, orig[k].c - s.C[k]) / Math.max(orig[k].c, 1e-9);
    const hueTerm = HUE_COST * (1 - Math.cos((dh * Math.PI) / 180));
    let p = (hueWeight * hueImportance[k] * (hueTerm + CHROMA_COST * chromaLoss ** 2)) / n;
    if (minContrast > 0) {
      const cr = contrastRatioOpaque(s.rgb[k], bg);
      if (cr < minContrast) p += contrastWeight * (CONTRAST_STEP + CONTRAST_COST * (minContrast - cr));
    }
    p += (DRIFT_COST * deltaE00Lab(s.labs[0][k], origLab[k])) / n;
    return p;
  };

  const orderPenalty = (s: State): number => {
    let p = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        if (orig[i].l + ORDER_MARGIN < orig[j].l && s.L[i] > s.L[j]) p += orderWeight * ((s.L[i] - s.L[j]) / 0.05);
      }
    }
    return p;
  };

  const separation = (d: Float64Array[]): { hard: number; soft: number } => {
    let hard = Infinity;
    for (let v = 0; v < 4; v++) {
      for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) hard = Math.min(hard, d[v][i * n + j]);
    }
    hard = Math.min(hard, enough);
    let sum = 0;
    for (let v = 0; v < 4; v++) {
      for (let i = 0; i < n; i++) {
        for (let j = i + 1; j < n; j++) sum += Math.exp(-(Math.min(d[v][i * n + j], enough) - hard) / SOFTMIN_TAU);
      }
    }
    return { hard, soft: hard - SOFTMIN_TAU * Math.log(sum) };
  };

  // Current state, updated in place; a rejected move is rolled back.
  const cur = init;
  const d = dist(cur);
  const pen = cur.L.map((_, k) => penaltyOf(cur, k));
  const sumPen = () => pen.reduce((a, b) => a + b, 0) + orderPenalty(cur);
  let penTotal = sumPen();
  let sep = separation(d);
  let curScore = sep.soft - penTotal;
  let best = cloneState(cur);
  let bestScore = sep.hard - penTotal;

  const rand = createRandom(randomState);
  const T0 = 3;
  const T1 = 0.02;
  const savedRow = [0, 1, 2, 3].map(() => new Float64Array(n));
  const oldLabs: Lab[] = [];
  for (let it = 0; it < iterations; it++) {
    const frac = it / Math.max(1, iterations - 1);
    const T = T0 * (T1 / T0) ** frac;
    const step = 0.15 + 0.85 * (1 - frac);
    const k = Math.floor(rand() * n);
    const dim = Math.floor(rand() * 3);
    let L = cur.L[k];
    let C = cur.C[k];
    let H = cur.H[k];
    if (dim === 0) L = Math.min(1, Math.max(0, L + 0.08 * step * gaussian(rand)));
    else if (dim === 1) C = Math.max(0, C + 0.05 * step * gaussian(rand));
    else H = (((H + 40 * step * gaussian(rand)) % 360) + 360) % 360;
    let rgb = fromOklch({ space: 'oklch', l: L, c: C, h: H });
    if (rgb === null) {
      // Pull chroma back to the gamut boundary at this lightness and hue.
      let lo = 0;
      let hi = C;
      for (let b = 0; b < 10; b++) {
        const mid = (lo + hi) / 2;
        if (fromOklch({ space: 'oklch', l: L, c: mid, h: H }) === null) hi = mid;
        else lo = mid;
      }
      C = lo;
      rgb = fromOklch({ space: 'oklch', l: L, c: C, h: H }) ?? { r: L, g: L, b: L, alpha: 1 };
    }
    // Apply the move, remembering what it replaces.
    const old = { L: cur.L[k], C: cur.C[k], H: cur.H[k], rgb: cur.rgb[k], pen: pen[k] };
    for (let v = 0; v < 4; v++) oldLabs[v] = cur.labs[v][k];
    cur.L[k] = L;
    cur.C[k] = C;
    cur.H[k] = H;
    cur.rgb[k] = rgb;
    const ls = labsOf(rgb);
    for (let v = 0; v < 4; v++) {
      cur.labs[v][k] = ls[v];
      for (let j = 0; j < n; j++) {
        savedRow[v][j] = d[v][k * n + j];
        if (j === k) continue;
        const x = deltaE00Lab(ls[v], cur.labs[v][j]);
        d[v][k * n + j] = x;
        d[v][j * n + k] = x;
      }
    }
    pen[k] = penaltyOf(cur, k);
    const nPenTotal = sumPen();
    const nsep = separation(d);
    const score = nsep.soft - nPenTotal;
    if (score >= curScore || rand() < Math.exp((score - curScore) / T)) {
      curScore = score;
      penTotal = nPenTotal;
      const trueScore = nsep.hard - nPenTotal;
      if (trueScore > bestScore) {
        bestScore = trueScore;
        best = cloneState(cur);
      }
    } else {
      cur.L[k] = old.L;
      cur.C[k] = old.C;
      cur.H[k] = old.H;
      cur.rgb[k] = old.rgb;
      pen[k] = old.pen;
      for (let v = 0; v < 4; v++) {
        cur.labs[v][k] = oldLabs[v];
        for (let j = 0; j < n; j++) {
          d[v][k * n + j] = savedRow[v][j];
          d[v][j * n + k] = savedRow[v][j];
        }
      }
    }
  }
  return best.rgb.map((c, k) => ({ r: c.r, g: c.g, b: c.b, alpha: colors[k].alpha }));
}
