/**
 * SARIF output: schema-valid for the reports of every real chart, for
 * unreadable files and for awkward paths; results point where the findings do.
 */
import { readdirSync } from 'node:fs';
import { join, relative } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditFile, auditText } from '../engine/audit/audit-file.js';
import { formatSarif, pathToUriReference } from '../engine/report/format-sarif.js';
import { makeReport } from '../engine/report/totals.js';
import type { FileReport, Report } from '../engine/report/types.js';
import { ALL_RULES } from '../engine/rules/index.js';
import { REAL_CHARTS } from './support/real-charts.js';
import { sarifSchemaErrors } from './support/report-sarif-schema.js';

let real: Report;

beforeAll(async () => {
  const files = readdirSync(REAL_CHARTS).filter((f) => f.endsWith('.svg')).sort();
  const reports: FileReport[] = [];
  // Paths as a user would give them: relative to the working directory.
  for (const f of files) reports.push((await auditFile(relative(process.cwd(), join(REAL_CHARTS, f)))).report);
  real = makeReport(reports);
});

describe('formatSarif', () => {
  it('writes a log that validates against the SARIF 2.1.0 schema for all real charts', () => {
    const log = formatSarif(real);
    // source: OASIS SARIF 2.1.0 JSON schema (2.1.0-rtm.5) from @microsoft/jest-sarif
    expect(sarifSchemaErrors(JSON.parse(JSON.stringify(log)))).toEqual([]);
    expect(log.version).toBe('2.1.0');
    expect(log.runs).toHaveLength(1);
  });

  it('has one result per finding, at the first element, with the rule and level', () => {
    const log = formatSarif(real);
    const run = log.runs[0]!;
    const findings = real.files.flatMap((f) => f.findings.map((x) => ({ f, x })));
    expect(run.results).toHaveLength(findings.length);
    expect(findings.length).toBeGreaterThan(40);
    findings.forEach(({ f, x }, i) => {
      const r = run.results[i]!;
      expect(r.ruleId).toBe(x.rule);
      expect(run.tool.driver.rules[r.ruleIndex]!.id).toBe(x.rule);
      expect(r.level).toBe(x.severity);
      expect(r.message.text).toBe(x.message);
      const loc = r.locations[0]!.physicalLocation;
      expect(decodeURIComponent(loc.artifactLocation.uri)).toBe(f.path);
      if (x.elements[0]) {
        expect(loc.region).toEqual({ startLine: x.elements[0].line, startColumn: x.elements[0].column });
      }
      expect(r.relatedLocations?.length ?? 0).toBe(Math.max(0, x.elements.length - 1));
    });
  });

  it('describes every catalogue rule with its rationale and source', () => {
    const rules = formatSarif(real).runs[0]!.tool.driver.rules;
    for (const r of ALL_RULES) {
      const d = rules.find((x) => x.id === r.id);
      expect(d?.shortDescription.text).toBe(r.rationale);
      expect(d?.properties.source).toBe(r.source);
      expect(d?.defaultConfiguration.level).toBe(r.severity);
    }
  });

  it('reports unreadable files and odd paths validly', () => {
    const bad = auditText('<svg xmlns="http://www.w3.org/2000/svg"><rect', 'figures/with space/#1 100%?.svg').report;
    const truncated = auditText('not svg at all', 'C:\\charts\\a.svg').report;
    const abs = auditText('<svg/>', '/abs/path/ü.svg').report;
    const report = makeReport([bad, truncated, abs]);
    const log = formatSarif(report);
    expect(sarifSchemaErrors(JSON.parse(JSON.stringify(log)))).toEqual([]);
    const uris = log.runs[0]!.artifacts.map((a) => a.location.uri);
    expect(uris).toEqual(['figures/with%20space/%231%20100%25%3F.svg', 'file:///C:/charts/a.svg', 'file:///abs/path/%C3%BC.svg']);
    expect(log.runs[0]!.results.some((r) => r.ruleId === 'plumbline.unreadable' && r.level === 'error')).toBe(true);
  });

  it('keeps relative paths relative and round-trips them through URL parsing', () => {
    for (const p of ['a/b.svg', 'dir with space/x.svg', 'weird#name?.svg', 'ñ/ü.svg']) {
      const uri = pathToUriReference(p);
      // source: WHATWG URL Standard, relative URL parsing against a base
      const url = new URL(uri, 'file:///root/');
      expect(decodeURIComponent(url.pathname)).toBe(`/root/${p}`);
    }
  });

  it('is refused by the schema when a required field is missing (the check can fail)', () => {
    const log = JSON.parse(JSON.stringify(formatSarif(real))) as { runs: { results: { message?: unknown }[] }[] };
    delete log.runs[0]!.results[0]!.message;
    expect(sarifSchemaErrors(log).length).toBeGreaterThan(0);
  });
});
