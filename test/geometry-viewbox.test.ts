import { describe, expect, it } from 'vitest';
import { applyToPoint } from '../engine/read/geometry/matrix.js';
import { parsePreserveAspectRatio, parseViewBox, viewBoxToViewport } from '../engine/read/geometry/viewbox.js';

describe('viewBox', () => {
  it('parses four numbers with comma or white space', () => {
    // source: SVG 1.1 (Second Edition) §7.7: viewBox = "<min-x> <min-y> <width> <height>",
    // separated by white space and/or a comma
    expect(parseViewBox('0 0 100 50').viewBox).toEqual({ x: 0, y: 0, width: 100, height: 50 });
    expect(parseViewBox(' -10,-20, 1e2 ,50 ').viewBox).toEqual({ x: -10, y: -20, width: 100, height: 50 });
    expect(parseViewBox('0-5 10.5.5').viewBox).toEqual({ x: 0, y: -5, width: 10.5, height: 0.5 });
  });

  it('rejects zero or negative sizes and malformed text', () => {
    // source: SVG 1.1 (Second Edition) §7.7: negative width/height is an error, zero disables rendering
    for (const text of ['0 0 0 10', '0 0 10 0', '0 0 -1 10', '0 0 10', '0 0 10 10 10', 'a b c d', '0 0 1e400 1', '0,,0,1,1', '']) {
      const r = parseViewBox(text);
      expect(r.viewBox, text).toBeNull();
      expect(r.error, text).toBeDefined();
    }
  });
});

describe('preserveAspectRatio', () => {
  it('parses align and meetOrSlice with defaults', () => {
    // source: SVG 1.1 (Second Edition) §7.8 (initial value xMidYMid meet)
    expect(parsePreserveAspectRatio('xMinYMax slice').value).toEqual({ align: 'xMinYMax', meetOrSlice: 'slice' });
    expect(parsePreserveAspectRatio('defer none').value).toEqual({ align: 'none', meetOrSlice: 'meet' });
    expect(parsePreserveAspectRatio('xMaxYMid').value).toEqual({ align: 'xMaxYMid', meetOrSlice: 'meet' });
    for (const bad of ['xmidymid', 'xMidYMid meets', 'meet', 'xMidYMid meet extra', '']) {
      const r = parsePreserveAspectRatio(bad);
      expect(r.error, bad).toBeDefined();
      expect(r.value).toEqual({ align: 'xMidYMid', meetOrSlice: 'meet' });
    }
  });

  it('maps a 100×50 viewBox into a 200×200 viewport', () => {
    // source: SVG 1.1 (Second Edition) §7.8; the arithmetic follows SVG 2 §8.2
    // "equivalent transform of an SVG viewport".
    const vb = { x: 0, y: 0, width: 100, height: 50 };
    const vp = { width: 200, height: 200 };
    // meet: scale = min(200/100, 200/50) = min(2, 4) = 2; content 200 × 100;
    // xMid: tx = (200 − 200)/2 = 0; YMid: ty = (200 − 100)/2 = 50.
    expect(viewBoxToViewport(vb, vp, { align: 'xMidYMid', meetOrSlice: 'meet' })).toEqual([2, 0, 0, 2, 0, 50]);
    // slice: scale = max(2, 4) = 4; content 400 × 200; tx = (200 − 400)/2 = −100; ty = 0.
    expect(viewBoxToViewport(vb, vp, { align: 'xMidYMid', meetOrSlice: 'slice' })).toEqual([4, 0, 0, 4, -100, 0]);
    // none: independent scales 2 and 4, no translation.
    expect(viewBoxToViewport(vb, vp, { align: 'none', meetOrSlice: 'meet' })).toEqual([2, 0, 0, 4, 0, 0]);
    // xMinYMin meet: ty = 0; xMaxYMax meet: ty = 200 − 100 = 100.
    expect(viewBoxToViewport(vb, vp, { align: 'xMinYMin', meetOrSlice: 'meet' })).toEqual([2, 0, 0, 2, 0, 0]);
    expect(viewBoxToViewport(vb, vp, { align: 'xMaxYMax', meetOrSlice: 'meet' })).toEqual([2, 0, 0, 2, 0, 100]);
    // xMaxYMin slice: tx = 200 − 400 = −200, ty = 0.
    expect(viewBoxToViewport(vb, vp, { align: 'xMaxYMin', meetOrSlice: 'slice' })).toEqual([4, 0, 0, 4, -200, 0]);
    // Default is xMidYMid meet.
    expect(viewBoxToViewport(vb, vp)).toEqual([2, 0, 0, 2, 0, 50]);
  });

  it('honours the viewBox origin and the viewport position', () => {
    // viewBox 10 20 100 50 into x=5 y=7 200×200, xMidYMid meet:
    //   scale 2; tx = 5 − 10·2 + 0 = −15; ty = 7 − 20·2 + (200 − 100)/2 = 17.
    const m = viewBoxToViewport({ x: 10, y: 20, width: 100, height: 50 }, { x: 5, y: 7, width: 200, height: 200 });
    expect(m).toEqual([2, 0, 0, 2, -15, 17]);
    // The viewBox's top-left corner lands at the top-left of the centred content box.
    expect(applyToPoint(m, { x: 10, y: 20 })).toEqual({ x: 5, y: 57 });
    expect(applyToPoint(m, { x: 110, y: 70 })).toEqual({ x: 205, y: 157 });
  });
});
