import { rgbToLab65Unchecked } from './to-lab65.js';
import { toOklch } from './to-oklch.js';
import { assertRgbaList, type Rgba } from './types.js';

/** CIELAB L* (0..100) of each colour, in order. Alpha is ignored. */
export function lightnessProfile(colors: readonly Rgba[]): number[] {
  assertRgbaList(colors);
  return colors.map((c) => rgbToLab65Unchecked(c).l);
}

export interface LightnessMonotonicity {
  /** True when no reversal against `direction` exceeds the tolerance. */
  monotonic: boolean;
  /** Overall direction from the first to the last colour ('flat' when within tolerance). */
  direction: 'increasing' | 'decreasing' | 'flat';
  /**
   * Largest fall in L* against the direction, measured from the running
   * extreme (for an increasing ramp: max over k of (max L*[0..k]) − L*[k]).
   * For a flat ramp: the L* range. 0 for fewer than two colours.
   */
  largestReversal: number;
  /** Index where that reversal bottoms out, or null when there is none. */
  reversalAt: number | null;
  /** The L* sequence the verdict is based on. */
  lightness: number[];
}

/**
 * Whether a colour sequence (a ramp's stops, or samples of it) has monotonic
 * CIELAB lightness, within `tolerance` L* units.
 */
export function isMonotonicLightness(colors: readonly Rgba[], tolerance = 0): LightnessMonotonicity {
  if (typeof tolerance !== 'number' || !(tolerance >= 0)) {
    throw new RangeError(`tolerance must be a non-negative number; got ${String(tolerance)}`);
  }
  const L = lightnessProfile(colors);
  if (L.length < 2) {
    return { monotonic: true, direction: 'flat', largestReversal: 0, reversalAt: null, lightness: L };
  }
  const net = L[L.length - 1] - L[0];
  if (Math.abs(net) <= tolerance) {
    let max = -Infinity;
    let min = Infinity;
    for (const v of L) {
      if (v > max) max = v;
      if (v < min) min = v;
    }
    const range = max - min;
    // The stop farthest in L* from the first one marks the excursion.
    let far = 0;
    for (let k = 1; k < L.length; k++) if (Math.abs(L[k] - L[0]) > Math.abs(L[far] - L[0])) far = k;
    return {
      monotonic: range <= tolerance,
      direction: 'flat',
      largestReversal: range,
      reversalAt: range > 0 ? far : null,
      lightness: L,
    };
  }
  const sign = net > 0 ? 1 : -1;
  let extreme = L[0] * sign;
  let largest = 0;
  let at: number | null = null;
  for (let k = 1; k < L.length; k++) {
    const v = L[k] * sign;
    if (v > extreme) extreme = v;
    const fall = extreme - v;
    if (fall > largest) {
      largest = fall;
      at = k;
    }
  }
  return {
    monotonic: largest <= tolerance,
    direction: sign > 0 ? 'increasing' : 'decreasing',
    largestReversal: largest,
    reversalAt: at,
    lightness: L,
  };
}

export interface HueCycling {
  /** Sum of |Δh| in degrees between consecutive colours (OKLCh), over chromatic steps. */
  hueTravel: number;
  /**
   * Path length of hue change in OKLab units: the sum of |ΔH| with
   * ΔH = 2·√(C1·C2)·sin(Δh/2), the hue-difference term of CIE colour
   * difference formulas, evaluated in OKLCh.
   */
  hueArc: number;
  /** |L_last − L_first| in OKLab lightness units. */
  lightnessSpan: number;
  /**
   * True when the hue path is longer than the lightness span: hue, not
   * lightness, carries most of the ramp's change (rainbow-style ramps).
   * plumbline's own indicator; no published threshold.
   */
  cyclesHue: boolean;
}

export interface HueCyclingOptions {
  /** Steps where either colour has OKLCh chroma below this are skipped (hue undefined). Default 0.02. */
  minChroma?: number;
}

/** Hue-cycling indicator of a colour sequence, measured in OKLCh. */
export function hueCycling(colors: readonly Rgba[], opts: HueCyclingOptions = {}): HueCycling {
  assertRgbaList(colors);
  const minChroma = opts.minChroma ?? 0.02;
  const lch = colors.map(toOklch);
  let travel = 0;
  let arc = 0;
  for (let k = 1; k < lch.length; k++) {
    const p = lch[k - 1];
    const q = lch[k];
    if (p.c < minChroma || q.c < minChroma) continue;
    const dh = ((((q.h - p.h) % 360) + 540) % 360) - 180;
    travel += Math.abs(dh);
    arc += Math.abs(2 * Math.sqrt(p.c * q.c) * Math.sin((dh * Math.PI) / 360));
  }
  const span = lch.length < 2 ? 0 : Math.abs(lch[lch.length - 1].l - lch[0].l);
  return { hueTravel: travel, hueArc: arc, lightnessSpan: span, cyclesHue: arc > span };
}
