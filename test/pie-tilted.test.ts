import { describe, expect, it } from 'vitest';
import { detectPie } from '../engine/classify/pie/detect-wedges.js';
import { fitEllipse } from '../engine/measure/pie/fit-ellipse.js';
import { measureProjectionDistortion } from '../engine/measure/pie/projection-distortion.js';
import { rectifierFor } from '../engine/measure/pie/rectify-ellipse.js';
import { visibleAreas } from '../engine/measure/pie/visible-area.js';
import { shapeFromPath } from './support/pie-shapes.js';
import type { Paint, ShapeItem } from '../engine/read/scene.js';

// ---------------------------------------------------------------------------
// Scene items from path data (parsed and flattened by the reader's geometry code).


function rgb(r: number, g: number, b: number): Paint {
  return { kind: 'color', color: { r, g, b, alpha: 1 }, opacity: 1, ref: null, stops: null };
}

function shape(d: string, fill: Paint): ShapeItem {
  return shapeFromPath(d, { fill });
}

const BASE: [number, number, number][] = [
  [0, 0.447, 0.698],
  [0.902, 0.624, 0],
  [0, 0.62, 0.451],
  [0.8, 0.475, 0.655],
  [0.337, 0.706, 0.914],
  [0.835, 0.369, 0],
];

const f = (v: number): string => v.toFixed(5);
const DEG = Math.PI / 180;

/** Flat-plane point at compass angle a (clockwise from 12 o'clock, y down). */
function flatAt(r: number, a: number): [number, number] {
  return [r * Math.sin(a), -r * Math.cos(a)];
}

/**
 * A pie tilted by θ under orthographic projection: page = (cx + X, cy + Y·cos θ),
 * top faces drawn with Béziers (an affine map keeps Béziers exact), side walls
 * of depth d (drawn height d·sin θ) on the front half of the rim.
 */
function tiltedPie(shares: number[], theta: number, opts: { cx?: number; cy?: number; R?: number; depth?: number; start?: number } = {}) {
  const cx = opts.cx ?? 250;
  const cy = opts.cy ?? 200;
  const R = opts.R ?? 120;
  const depth = opts.depth ?? 30;
  const c = Math.cos(theta);
  const h = depth * Math.sin(theta);
  const P = (X: number, Y: number, drop = 0): [number, number] => [cx + X, cy + Y * c + drop];
  const arc = (a0: number, a1: number, drop = 0, reverse = false): string => {
    const pieces = Math.max(1, Math.ceil((a1 - a0) / (Math.PI / 4) - 1e-9));
    const step = (a1 - a0) / pieces;
    const k = (4 / 3) * Math.tan(step / 4);
    let s = '';
    for (let i = 0; i < pieces; i++) {
      const t0 = reverse ? a1 - i * step : a0 + i * step;
      const t1 = reverse ? t0 - step : t0 + step;
      const sg = reverse ? -1 : 1;
      const [X0, Y0] = flatAt(R, t0);
      const [X3, Y3] = flatAt(R, t1);
      const c1 = P(X0 + sg * k * R * Math.cos(t0), Y0 + sg * k * R * Math.sin(t0), drop);
      const c2 = P(X3 - sg * k * R * Math.cos(t1), Y3 - sg * k * R * Math.sin(t1), drop);
      const e = P(X3, Y3, drop);
      s += ` C ${f(c1[0])} ${f(c1[1])} ${f(c2[0])} ${f(c2[1])} ${f(e[0])} ${f(e[1])}`;
    }
    return s;
  };
  const tops: ShapeItem[] = [];
  const walls: ShapeItem[] = [];
  let a = opts.start ?? 0;
  const spans: [number, number][] = [];
  for (const s of shares) {
    spans.push([a, a + s * 2 * Math.PI]);
    a += s * 2 * Math.PI;
  }
  spans.forEach(([a0, a1], i) => {
    const col = BASE[i % BASE.length]!;
    const [sx, sy] = P(...flatAt(R, a0));
    tops.push(shape(`M ${f(cx)} ${f(cy)} L ${f(sx)} ${f(sy)}${arc(a0, a1)} Z`, rgb(...col)));
    if (h <= 0) return;
    // Front half of the rim: compass angles in (90°, 270°), taken in every turn the wedge covers.
    for (const off of [0, 2 * Math.PI]) {
      const b0 = Math.max(a0, Math.PI / 2 + off);
      const b1 = Math.min(a1, (3 * Math.PI) / 2 + off);
      if (b1 - b0 < 1e-6) continue;
      const [wx, wy] = P(...flatAt(R, b0));
      const [ex, ey] = P(...flatAt(R, b1), h);
      const d = `M ${f(wx)} ${f(wy)}${arc(b0, b1)} L ${f(ex)} ${f(ey)}${arc(b0, b1, h, true)} Z`;
      walls.push(shape(d, rgb(col[0] * 0.7, col[1] * 0.7, col[2] * 0.7)));
    }
  });
  return { tops, walls, all: [...tops, ...walls] };
}

function sharesOf(pie: NonNullable<ReturnType<typeof detectPie>>, items: ShapeItem[]): number[] {
  return items.map((s) => {
    const w = pie.wedges.find((q) => q.item === s.index);
    expect(w, `wedge for item ${s.index}`).toBeDefined();
    return w!.share;
  });
}

// ---------------------------------------------------------------------------

describe('fitEllipse (direct least squares)', () => {
  // source: Fitzgibbon, Pilu & Fisher 1999 (method); expected values are the constructed ellipses.
  const cases = [
    { cx: 0, cy: 0, rx: 10, ry: 5, angle: 0 },
    { cx: 250, cy: 180, rx: 130, ry: 70, angle: 0.3 },
    { cx: -40, cy: 900, rx: 3, ry: 2.5, angle: -1.2 },
    { cx: 1e4, cy: -2e4, rx: 500, ry: 40, angle: 1.0 },
  ];
  for (const e of cases) {
    it(`recovers centre, axes and rotation of ${JSON.stringify(e)} from exact points`, () => {
      const pts: number[] = [];
      for (let k = 0; k < 40; k++) {
        const t = (k / 40) * 2 * Math.PI;
        const u = e.rx * Math.cos(t);
        const v = e.ry * Math.sin(t);
        pts.push(e.cx + u * Math.cos(e.angle) - v * Math.sin(e.angle), e.cy + u * Math.sin(e.angle) + v * Math.cos(e.angle));
      }
      const fit = fitEllipse(pts)!;
      expect(fit).not.toBeNull();
      const tol = 1e-6 * Math.max(e.rx, Math.abs(e.cx), Math.abs(e.cy));
      expect(Math.abs(fit.cx - e.cx)).toBeLessThan(tol);
      expect(Math.abs(fit.cy - e.cy)).toBeLessThan(tol);
      expect(Math.abs(fit.rx - e.rx)).toBeLessThan(1e-6 * e.rx);
      expect(Math.abs(fit.ry - e.ry)).toBeLessThan(1e-6 * e.rx);
      const da = Math.abs(((fit.angle - e.angle + Math.PI / 2) % Math.PI) - Math.PI / 2);
      expect(da).toBeLessThan(1e-6);
      expect(fit.rms).toBeLessThan(1e-6 * e.rx);
    });
  }

  it('recovers an ellipse from a 100° arc with small deterministic noise', () => {
    const e = { cx: 120, cy: 80, rx: 90, ry: 40, angle: 0.2 };
    const pts: number[] = [];
    for (let k = 0; k <= 50; k++) {
      const t = 0.3 + (k / 50) * 100 * DEG;
      const noise = 0.02 * Math.sin(k * 12.9898) ;
      const u = (e.rx + noise) * Math.cos(t);
      const v = (e.ry + noise) * Math.sin(t);
      pts.push(e.cx + u * Math.cos(e.angle) - v * Math.sin(e.angle), e.cy + u * Math.sin(e.angle) + v * Math.cos(e.angle));
    }
    const fit = fitEllipse(pts)!;
    expect(Math.abs(fit.cx - e.cx)).toBeLessThan(1);
    expect(Math.abs(fit.cy - e.cy)).toBeLessThan(1);
    expect(Math.abs(fit.rx - e.rx) / e.rx).toBeLessThan(0.01);
    expect(Math.abs(fit.ry - e.ry) / e.ry).toBeLessThan(0.02);
  });

  it('always returns an ellipse, even for points on a hyperbola', () => {
    // source: Fitzgibbon, Pilu & Fisher 1999 — the constraint 4AC − B² = 1 makes the fit ellipse-specific.
    const pts: number[] = [];
    for (let k = -10; k <= 10; k++) {
      const t = k / 5;
      pts.push(Math.cosh(t) * 10, Math.sinh(t) * 6);
    }
    const fit = fitEllipse(pts);
    expect(fit).not.toBeNull();
    const [A, B, C] = fit!.conic;
    expect(4 * A * C - B * B).toBeGreaterThan(0);
  });

  it('minor/major = cos θ for a circle seen tilted by θ (orthographic projection)', () => {
    // common practice, no source: orthographic projection scales the tilted axis by cos θ.
    for (const deg of [10, 20, 40, 60, 70, 80]) {
      const c = Math.cos(deg * DEG);
      const pts: number[] = [];
      for (let k = 0; k < 36; k++) pts.push(300 + 100 * Math.cos(k * 10 * DEG), 200 + 100 * Math.sin(k * 10 * DEG) * c);
      const fit = fitEllipse(pts)!;
      expect(fit.ry / fit.rx).toBeCloseTo(c, 9);
      const rect = rectifierFor(fit, 300, 200)!;
      expect(rect.tilt / DEG).toBeCloseTo(deg, 6);
      expect(rect.radius).toBeCloseTo(100, 6);
    }
  });

  it('gives null for points that fix no ellipse, and a clear error for malformed input', () => {
    expect(fitEllipse([0, 0, 1, 1, 2, 2, 3, 3, 4, 4, 5, 5])).toBeNull();
    expect(fitEllipse([0, 0, 1, 0, 0, 1])).toBeNull();
    expect(() => fitEllipse([0, 0, 1])).toThrow(RangeError);
    expect(() => fitEllipse([0, 0, 1, NaN, 2, 2, 3, 3, 4, 4])).toThrow(RangeError);
  });
});

describe('rectifierFor (un-projection)', () => {
  it('turns a circle seen in perspective back into a circle, with angles about its drawn centre', () => {
    // common practice, no source: pinhole projection x = f·X/Z of a circle tilted by θ.
    // from memory (Hartley & Zisserman, Multiple View Geometry, conics and pole–polar): the polar of the
    // circle centre's image is the vanishing line, which is what the rectifier uses.
    const R = 100;
    const theta = 55 * DEG;
    const D = 350;
    const proj = (a: number): [number, number] => {
      const [X, Y] = flatAt(R, a);
      const z = D - Y * Math.sin(theta);
      return [200 + (D * X) / z, 150 + (D * Y * Math.cos(theta)) / z];
    };
    const pts: number[] = [];
    for (let k = 0; k < 72; k++) pts.push(...proj(k * 5 * DEG));
    const fit = fitEllipse(pts)!;
    // The drawn centre is not the ellipse centre under perspective.
    expect(Math.hypot(fit.cx - 200, fit.cy - 150)).toBeGreaterThan(1);
    const rect = rectifierFor(fit, 200, 150)!;
    const base = rect.forward(...proj(0))!;
    const a0 = Math.atan2(base[0] - 200, -(base[1] - 150));
    for (const deg of [17, 90, 133, 200, 281, 340]) {
      const q = rect.forward(...proj(deg * DEG))!;
      expect(Math.hypot(q[0] - 200, q[1] - 150) / rect.radius).toBeCloseTo(1, 8);
      let a = Math.atan2(q[0] - 200, -(q[1] - 150)) - a0;
      if (a < 0) a += 2 * Math.PI;
      expect(a / DEG).toBeCloseTo(deg, 6);
      const back = rect.inverse(q[0], q[1])!;
      const p = proj(deg * DEG);
      expect(back[0]).toBeCloseTo(p[0], 8);
      expect(back[1]).toBeCloseTo(p[1], 8);
    }
  });
});

describe('detectPie: tilted and extruded pies', () => {
  const shares = [0.35, 0.25, 0.2, 0.12, 0.08];
  const tilts = [0, 20, 40, 60, 70];
  const worst: number[] = [];
  const worstAngle: number[] = [];

  for (const deg of tilts) {
    it(`recovers true shares within 1 percentage point at a tilt of ${deg}°`, () => {
      const pie3d = tiltedPie(shares, deg * DEG, { start: 0.3 });
      const pie = detectPie(pie3d.all, []);
      expect(pie).not.toBeNull();
      const got = sharesOf(pie!, pie3d.tops);
      // source: construction (shares chosen in the test, projected with y' = y·cos θ)
      for (let i = 0; i < shares.length; i++) expect(Math.abs(got[i]! - shares[i]!) * 100).toBeLessThan(1);
      if (deg === 0) {
        expect(pie!.ellipse).toBeNull();
      } else {
        expect(pie!.ellipse).not.toBeNull();
        // common practice, no source: minor/major = cos θ.
        expect(Math.abs(pie!.ellipse!.tilt / DEG - deg)).toBeLessThan(1);
        expect(pie!.walls.sort((a, b) => a - b)).toEqual(pie3d.walls.map((w) => w.index));
        for (const w of pie!.wedges) for (const wall of w.walls) expect(pie3d.walls.some((s) => s.index === wall)).toBe(true);
      }
      const d = measureProjectionDistortion(pie!, pie3d.all);
      worst.push(Math.abs(Math.log(d.worstRatio)));
      console.log(`tilt ${deg}°: worst apparent/true ${d.worstRatio.toFixed(3)}, worst drawn-angle/true ${d.worstAngleRatio.toFixed(3)}, shares ${sharesOf(pie!, pie3d.tops).map((v) => (v * 100).toFixed(2)).join(' ')}`);
      worstAngle.push(Math.abs(Math.log(d.worstAngleRatio)));
      const sum = d.wedges.reduce((s, w) => s + w.apparentShare, 0);
      expect(sum).toBeCloseTo(1, 9);
    });
  }

  it('apparent-share distortion grows with tilt (walls and foreshortening)', () => {
    expect(worst.length).toBe(tilts.length);
    // A flat pie drawn in place: apparent area shares equal the data.
    expect(worst[0]!).toBeLessThan(0.01);
    for (let i = 1; i < worst.length; i++) expect(worst[i]!, `tilt ${tilts[i]}°`).toBeGreaterThan(worst[i - 1]!);
    for (let i = 1; i < worstAngle.length; i++) expect(worstAngle[i]!).toBeGreaterThan(worstAngle[i - 1]!);
  });

  it('recovers true shares of a pie seen in perspective, with the apex off the ellipse centre', () => {
    const R = 110;
    const theta = 50 * DEG;
    const D = 380;
    const cx = 260;
    const cy = 190;
    const proj = (r: number, a: number): [number, number] => {
      const [X, Y] = flatAt(r, a);
      const z = D - Y * Math.sin(theta);
      return [cx + (D * X) / z, cy + (D * Y * Math.cos(theta)) / z];
    };
    const want = [0.3, 0.22, 0.18, 0.16, 0.14];
    const tops: ShapeItem[] = [];
    let a = 0.9;
    want.forEach((s, i) => {
      const a1 = a + s * 2 * Math.PI;
      const pts: [number, number][] = [[cx, cy]];
      const n = Math.ceil((a1 - a) / (2 * DEG));
      for (let k = 0; k <= n; k++) pts.push(proj(R, a + ((a1 - a) * k) / n));
      tops.push(shape('M ' + pts.map(([x, y]) => `${f(x)} ${f(y)}`).join(' L ') + ' Z', rgb(...BASE[i]!)));
      a = a1;
    });
    const pie = detectPie(tops, [])!;
    expect(pie).not.toBeNull();
    expect(pie.ellipse).not.toBeNull();
    expect(pie.cx).toBeCloseTo(cx, 3);
    expect(pie.cy).toBeCloseTo(cy, 3);
    // source: construction (shares chosen in the test, pinhole projection)
    const got = sharesOf(pie, tops);
    for (let i = 0; i < want.length; i++) expect(Math.abs(got[i]! - want[i]!) * 100).toBeLessThan(1);
  });
});

describe('visibleAreas', () => {
  it('credits overlapping outlines with what stays visible in paint order', () => {
    // source: construction (two 10×10 squares overlapping by half; the later one is on top)
    const a = { polylines: [[0, 0, 10, 0, 10, 10, 0, 10]], owner: 1 };
    const b = { polylines: [[5, 0, 15, 0, 15, 10, 5, 10]], owner: 2 };
    const areas = visibleAreas([a, b], 200);
    expect(areas.get(1)).toBeCloseTo(50, 9);
    expect(areas.get(2)).toBeCloseTo(100, 9);
    const swapped = visibleAreas([b, a], 200);
    expect(swapped.get(1)).toBeCloseTo(100, 9);
    expect(swapped.get(2)).toBeCloseTo(50, 9);
    expect(() => visibleAreas([a], 0)).toThrow(RangeError);
  });
});
