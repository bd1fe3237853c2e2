/**
 * Property-based fuzzing: real charts mutated (elements deleted, duplicated, swapped,
 * attribute values corrupted, files truncated) go through audit and redraw without an
 * uncaught error. 1,000 cases here; `npm run fuzz` runs 10,000.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseXml, walkElements } from '../engine/read/parse-xml.js';
import { attributeSpan } from '../engine/read/xml-tree.js';
import { auditText } from '../engine/audit/audit-file.js';
import { redrawText } from '../engine/redraw/redraw.js';

const RUNS = Number(process.env.PLUMBLINE_FUZZ_RUNS ?? 1000);
const dir = resolve(import.meta.dirname, '../../shared/real-charts');
const charts = readdirSync(dir)
  .filter((f) => f.endsWith('.svg') && statSync(resolve(dir, f)).size < 60_000)
  .map((f) => ({ name: f, text: readFileSync(resolve(dir, f), 'utf8') }));
const spans = charts.map((c) => {
  const doc = parseXml(c.text);
  const els = [...walkElements(doc.root)].slice(1);
  const attrs = els.flatMap((el) => Object.keys(el.attributes).map((n) => attributeSpan(doc, el, n)!.value));
  return { els: els.map((e) => ({ start: e.start, end: e.end })), attrs };
});

const GARBAGE = ['', 'NaN', 'Infinity', '-1e308', '1e308', 'M', 'url(#nowhere)', 'url(#', 'none', '#zzz', '0 0 0 0', 'matrix(0 0 0 0 0 0)', 'rotate(NaN)', 'M0 0 L', 'A 1 1 0 1 1', '&amp;', '💥', '-0', '1e-320', 'inherit'];

type Mutation =
  | { kind: 'delete'; el: number }
  | { kind: 'duplicate'; el: number }
  | { kind: 'swap'; a: number; b: number }
  | { kind: 'corrupt'; attr: number; value: number }
  | { kind: 'truncate'; at: number };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('delete' as const), el: fc.nat() }),
  fc.record({ kind: fc.constant('duplicate' as const), el: fc.nat() }),
  fc.record({ kind: fc.constant('swap' as const), a: fc.nat(), b: fc.nat() }),
  fc.record({ kind: fc.constant('corrupt' as const), attr: fc.nat(), value: fc.nat({ max: GARBAGE.length - 1 }) }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
);

/** Applies one mutation to the original text (spans refer to the original). */
export function mutate(text: string, s: (typeof spans)[number], m: Mutation): string {
  switch (m.kind) {
    case 'delete': {
      const e = s.els[m.el % s.els.length]!;
      return text.slice(0, e.start) + text.slice(e.end);
    }
    case 'duplicate': {
      const e = s.els[m.el % s.els.length]!;
      return text.slice(0, e.end) + text.slice(e.start, e.end) + text.slice(e.end);
    }
    case 'swap': {
      const a = s.els[m.a % s.els.length]!;
      const b = s.els[m.b % s.els.length]!;
      // Only disjoint spans can be swapped.
      if (a.end <= b.start) return text.slice(0, a.start) + text.slice(b.start, b.end) + text.slice(a.end, b.start) + text.slice(a.start, a.end) + text.slice(b.end);
      if (b.end <= a.start) return text.slice(0, b.start) + text.slice(a.start, a.end) + text.slice(b.end, a.start) + text.slice(b.start, b.end) + text.slice(a.end);
      return text;
    }
    case 'corrupt': {
      if (s.attrs.length === 0) return text;
      const v = s.attrs[m.attr % s.attrs.length]!;
      return text.slice(0, v.start) + GARBAGE[m.value]!.replace(/"/g, '') + text.slice(v.end);
    }
    case 'truncate':
      return text.slice(0, Math.floor(m.at * text.length));
  }
}

const PROGRAMMING_ERRORS = [TypeError, RangeError, ReferenceError, SyntaxError];

describe('fuzzing real charts', () => {
  it(`survives ${RUNS} mutated charts through audit and redraw`, () => {
    fc.assert(
      fc.property(fc.nat({ max: charts.length - 1 }), fc.array(mutation, { minLength: 1, maxLength: 3 }), (ci, ms) => {
        let text = charts[ci]!.text;
        // Later mutations apply to the original spans of the first mutated text only when unchanged in length.
        for (const m of ms) text = text.length === charts[ci]!.text.length ? mutate(text, spans[ci]!, m) : text;
        const { report } = auditText(text, charts[ci]!.name);
        expect(typeof report.ok).toBe('boolean');
        JSON.stringify(report);
        if (report.ok) {
          try {
            redrawText(text, charts[ci]!.name, {});
          } catch (err) {
            if (PROGRAMMING_ERRORS.some((E) => err instanceof E)) throw err;
          }
        }
      }),
      { numRuns: RUNS, seed: Number(process.env.PLUMBLINE_FUZZ_SEED ?? 20261201) },
    );
  });
});
