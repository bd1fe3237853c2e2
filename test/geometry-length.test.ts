import { describe, expect, it } from 'vitest';
import { lengthToPx, parseLength, percentReference, resolveLength } from '../engine/read/geometry/parse-length.js';

describe('lengths', () => {
  it('converts absolute units at 96 px per inch', () => {
    // source: CSS Values and Units Module Level 3, §6.2 Absolute lengths
    // (1in = 2.54cm = 96px, 1pt = 1/72in, 1pc = 12pt)
    expect(resolveLength('1in').px).toBe(96);
    expect(resolveLength('72pt').px).toBeCloseTo(96, 12);
    expect(resolveLength('25.4mm').px).toBeCloseTo(96, 12);
    expect(resolveLength('2.54cm').px).toBeCloseTo(96, 12);
    expect(resolveLength('6pc').px).toBeCloseTo(96, 12);
    expect(resolveLength('12pt').px).toBeCloseTo(16, 12);
    expect(resolveLength('96px').px).toBe(96);
    expect(resolveLength('96').px).toBe(96);
  });

  it('resolves em, ex and percentages from the context', () => {
    // source: SVG 1.1 (Second Edition) §7.10 Units: em = font-size, % of a reference length
    expect(resolveLength('2em', { fontSize: 10 }).px).toBe(20);
    expect(resolveLength('1em').px).toBe(16); // CSS initial font-size 'medium' = 16px, from memory
    // source: CSS Values and Units Level 3 §6.1.1: ex falls back to 0.5em without an x-height
    expect(resolveLength('2ex', { fontSize: 10 }).px).toBe(10);
    expect(resolveLength('2ex', { fontSize: 10, xHeight: 4 }).px).toBe(8);
    expect(resolveLength('50%', { percentBase: 300 }).px).toBe(150);
    const noBase = resolveLength('50%');
    expect(noBase.px).toBeNull();
    expect(noBase.error?.message).toMatch(/reference/);
    // source: SVG 1.1 (Second Edition) §7.10: other lengths use sqrt((w² + h²)/2)
    expect(percentReference('other', 300, 400)).toBeCloseTo(Math.sqrt((300 ** 2 + 400 ** 2) / 2), 12);
    expect(percentReference('x', 300, 400)).toBe(300);
    expect(percentReference('y', 300, 400)).toBe(400);
  });

  it('reads the number syntax with white space and unit case', () => {
    // source: CSS Syntax Level 3 §4.3.3 (number token), units are ASCII case-insensitive
    expect(parseLength(' 1.5e1PX ').length).toEqual({ value: 15, unit: 'px' });
    expect(parseLength('.5em').length).toEqual({ value: 0.5, unit: 'em' });
    expect(parseLength('-3').length).toEqual({ value: -3, unit: '' });
    expect(parseLength('1e2%').length).toEqual({ value: 100, unit: '%' });
    expect(parseLength('1ex').length).toEqual({ value: 1, unit: 'ex' });
  });

  it('rejects malformed or out-of-range lengths', () => {
    const bad: [string, number][] = [
      ['', 0],
      ['px', 0],
      ['10 px', 3],
      ['10qq', 2],
      ['10px10', 4],
      ['1e400', 0],
      ['NaN', 0],
      ['--1', 0],
      ['1.2.3', 3],
    ];
    for (const [text, offset] of bad) {
      const r = parseLength(text);
      expect(r.length, text).toBeNull();
      expect(r.error?.offset, text).toBe(offset);
    }
    // Finite number, overflowing result: 1e308in = 9.6e309px.
    const big = resolveLength('1e308in');
    expect(big.px).toBeNull();
    expect(big.error?.message).toMatch(/out of range/);
    expect(lengthToPx({ value: 1, unit: '%' }, { percentBase: NaN })).toBeNull();
  });
});
