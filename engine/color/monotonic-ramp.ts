import { clampChroma, converter } from 'culori';
import { rgbToLab65Unchecked } from './to-lab65.js';
import { assertRgba, assertRgbaList, type Lab, type Rgba } from './types.js';

const toRgb = converter('rgb');

export interface RebuildRampOptions {
  /** Two arms meeting at a light midpoint (t = 0.5) instead of one sequential ramp. */
  diverging?: boolean;
  /**
   * Least L* difference between the two ends of a sequential ramp (or between
   * the ends and the midpoint of a diverging one). When the original ends are
   * closer in lightness they are pushed apart, the darker one darker and the
   * lighter one lighter, within L* 5..98. Default 40; 0 keeps the ends as they are.
   */
  minLightnessRange?: number;
  /** Midpoint of a diverging ramp. Default: the original's lightest interior stop when it is clearly lighter than both ends, otherwise a neutral grey. */
  midpoint?: Rgba;
  /** Give both arms of a diverging ramp the darker end's L*, so neither side looks heavier. Default true. */
  balanceEnds?: boolean;
}

const L_MIN = 5;
const L_MAX = 98;

function lerpLab(p: Lab, q: Lab, t: number): Lab {
  return { space: 'lab65', l: p.l + (q.l - p.l) * t, a: p.a + (q.a - p.a) * t, b: p.b + (q.b - p.b) * t };
}

/**
 * Lab (D65) → sRGB keeping L* and hue: chroma is reduced (LCh, D65) until the
 * colour fits the sRGB gamut, so lightness is exactly the interpolated one.
 */
function labToRgb(c: Lab, alpha: number): Rgba {
  const fitted = clampChroma({ mode: 'lab65', l: c.l, a: c.a, b: c.b }, 'lch65');
  const x = toRgb(fitted);
  const cl = (v: number) => (Number.isFinite(v) ? Math.min(1, Math.max(0, v)) : 0);
  return { r: cl(x.r), g: cl(x.g), b: cl(x.b), alpha };
}

/** Moves the two L* values apart to at least `range`, keeping their order. */
function spreadLightness(lo: number, hi: number, range: number): [number, number] {
  if (hi - lo >= range) return [lo, hi];
  const r = Math.min(range, L_MAX - L_MIN);
  const mid = (lo + hi) / 2;
  let a = mid - r / 2;
  let b = mid + r / 2;
  if (a < L_MIN) {
    b += L_MIN - a;
    a = L_MIN;
  }
  if (b > L_MAX) {
    a -= b - L_MAX;
    b = L_MAX;
  }
  return [a, b];
}

/**
 * Rebuilds a colour ramp so its lightness is monotonic: a straight line in
 * CIELAB (D65) between the ramp's own end colours, so L* changes linearly
 * with t. A diverging ramp runs end → light midpoint → end, L* rising over
 * t ∈ [0, 0.5] and falling over [0.5, 1]. Colours outside sRGB are brought
 * in by lowering chroma at constant L* and hue, which keeps L* exact.
 *
 * Returns a function of t ∈ [0, 1] (values outside are clamped; NaN throws).
 * Throws for fewer than two stops.
 */
export function rebuildRamp(stops: readonly Rgba[], opts: RebuildRampOptions = {}): (t: number) => Rgba {
  assertRgbaList(stops, 'stops');
  if (stops.length < 2) throw new RangeError(`rebuildRamp: need at least two stops; got ${stops.length}`);
  const range = opts.minLightnessRange ?? 40;
  if (typeof range !== 'number' || !(range >= 0)) {
    throw new RangeError(`rebuildRamp: minLightnessRange must be a non-negative number; got ${String(range)}`);
  }
  const first = stops[0];
  const last = stops[stops.length - 1];
  const labs = stops.map(rgbToLab65Unchecked);
  let a = labs[0];
  let b = labs[labs.length - 1];
  const alphaA = first.alpha;
  const alphaB = last.alpha;

  if (!opts.diverging) {
    const aDarker = a.l <= b.l;
    const [lo, hi] = spreadLightness(Math.min(a.l, b.l), Math.max(a.l, b.l), range);
    a = { ...a, l: aDarker ? lo : hi };
    b = { ...b, l: aDarker ? hi : lo };
    return (t: number) => {
      const u = checkT(t);
      return labToRgb(lerpLab(a, b, u), alphaA + (alphaB - alphaA) * u);
    };
  }

  if (opts.balanceEnds ?? true) {
    const l = Math.min(a.l, b.l);
    a = { ...a, l };
    b = { ...b, l };
  }
  let mid: Lab;
  if (opts.midpoint !== undefined) {
    assertRgba(opts.midpoint, 'midpoint');
    mid = rgbToLab65Unchecked(opts.midpoint);
  } else {
    let k = -1;
    for (let i = 1; i < labs.length - 1; i++) if (k < 0 || labs[i].l > labs[k].l) k = i;
    const ends = Math.max(a.l, b.l);
    mid = k >= 0 && labs[k].l > ends + 10 ? labs[k] : { space: 'lab65', l: Math.min(L_MAX, ends + range), a: 0, b: 0 };
  }
  // Keep the midpoint lighter than both ends by the required range where the scale allows.
  const needMid = Math.min(L_MAX, Math.max(a.l, b.l) + range);
  if (mid.l < needMid) mid = { ...mid, l: needMid };
  if (mid.l - range < Math.max(a.l, b.l)) {
    const l = Math.max(L_MIN, Math.min(a.l, b.l, mid.l - range));
    a = { ...a, l: Math.min(a.l, l) };
    b = { ...b, l: Math.min(b.l, l) };
  }
  const m = mid;
  return (t: number) => {
    const u = checkT(t);
    if (u <= 0.5) return labToRgb(lerpLab(a, m, u / 0.5), alphaA + (1 - alphaA) * (u / 0.5));
    return labToRgb(lerpLab(m, b, (u - 0.5) / 0.5), 1 + (alphaB - 1) * ((u - 0.5) / 0.5));
  };
}

function checkT(t: number): number {
  if (typeof t !== 'number' || Number.isNaN(t)) throw new RangeError(`ramp position must be a number in 0..1; got ${String(t)}`);
  return Math.min(1, Math.max(0, t));
}
