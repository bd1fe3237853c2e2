/**
 * The demo figures (corpus-demo/): the generator reproduces the committed
 * SVGs byte for byte, the built command's audit of them matches the
 * committed expected report, and every figure is flagged with the rules it
 * was drawn to trigger while the clean figures pass.
 *
 * Needs the built command (`npm test` builds first).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildFigures } from '../corpus-demo/build-figures.js';
import { auditDemoFigures, EXPECTED_REPORT, FIGURES_DIR, REPO_ROOT, runBuiltCli } from '../corpus-demo/demo-report.js';

interface Finding {
  rule: string;
  severity: 'error' | 'warning' | 'note';
}
interface FileEntry {
  path: string;
  ok: boolean;
  findings: Finding[];
}

const figures = buildFigures();
let fresh: Record<string, unknown>;

beforeAll(() => {
  fresh = auditDemoFigures();
});

/**
 * Intended rules known not to fire yet, with the reason (an engine gap, not a
 * figure problem). The test fails when one of them starts firing, so the
 * entry gets removed.
 */
const KNOWN_MISSES: Record<string, { rule: string; why: string }[]> = {};

const UPDATE_HINT =
  'If the change is intended (check the diff first), run `npm run demo:update` and commit corpus-demo/expected/.';

describe('corpus-demo figures', () => {
  it('the generator reproduces every committed figure byte for byte, and nothing else is in the folder', () => {
    // source: corpus-demo/figures/*.svg as committed, written by corpus-demo/generate.ts (seeded, so reproducible)
    const dir = join(REPO_ROOT, FIGURES_DIR);
    const committed = readdirSync(dir).filter((f) => f.endsWith('.svg')).sort();
    expect(committed, 'the figures folder lists other files than the generator writes; run `node --import tsx corpus-demo/generate.ts`').toEqual(
      figures.map((f) => `${f.name}.svg`).sort(),
    );
    const differing = figures.filter((f) => readFileSync(join(dir, `${f.name}.svg`), 'utf8') !== f.svg).map((f) => f.name);
    expect(differing, 'these figures differ from what corpus-demo/generate.ts writes; regenerate them, then run `npm run demo:update`').toEqual([]);
  });

  it('building the figures twice gives the same text (no unseeded randomness, no clock)', () => {
    const again = buildFigures();
    expect(again.map((f) => f.svg)).toEqual(figures.map((f) => f.svg));
  });
});

describe('corpus-demo audit report', () => {
  it('matches corpus-demo/expected/report.json', () => {
    // source: corpus-demo/expected/report.json, the reviewed output of the previous `npm run demo:update`
    const expected = JSON.parse(readFileSync(join(REPO_ROOT, EXPECTED_REPORT), 'utf8')) as unknown;
    expect(fresh, `The audit of ${FIGURES_DIR} changed. ${UPDATE_HINT}`).toEqual(expected);
  });

  it('flags each figure with the rules it was drawn to trigger (where the rule exists; known misses listed), and passes the clean figures', () => {
    // source: the problems each figure was drawn with (corpus-demo/build-figures.ts, the PLAN table)
    const catalogue = runBuiltCli(['rules', '--format', 'json']);
    expect(catalogue.status).toBe(0);
    const known = new Set((JSON.parse(catalogue.stdout) as { rules: { id: string }[] }).rules.map((r) => r.id));
    const files = fresh.files as FileEntry[];
    const problems: string[] = [];
    for (const f of figures) {
      const path = `${FIGURES_DIR}/${f.name}.svg`;
      const entry = files.find((e) => e.path === path);
      if (!entry) {
        problems.push(`${path}: not in the report`);
        continue;
      }
      if (!entry.ok) problems.push(`${path}: could not be read`);
      const fired = new Set(entry.findings.map((x) => x.rule));
      const knownMisses = (KNOWN_MISSES[f.name] ?? []).map((m) => m.rule);
      for (const rule of f.intended) {
        if (!known.has(rule)) continue;
        const isKnownMiss = knownMisses.includes(rule);
        if (!fired.has(rule) && !isKnownMiss) problems.push(`${path}: ${rule} did not fire`);
        if (fired.has(rule) && isKnownMiss) problems.push(`${path}: ${rule} fires now; remove it from KNOWN_MISSES`);
      }
      if (f.intended.length === 0) {
        for (const x of entry.findings) if (x.severity !== 'note') problems.push(`${path} (clean): ${x.rule} (${x.severity})`);
      }
    }
    expect(problems).toEqual([]);
  });
});
