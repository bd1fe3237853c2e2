/**
 * The JSON report contract: the built CLI's report on every real chart validates against
 * the published schema (schema/report.schema.json), ink shares sum to 1, and exit codes
 * follow the contract (0 / 1 / 2).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { Ajv } from 'ajv';
import type { Report } from '../engine/report/types.js';

const root = resolve(import.meta.dirname, '..');
const cli = resolve(root, 'bin/plumbline.js');
const charts = resolve(root, '../shared/real-charts');

function run(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', cwd: root, maxBuffer: 64 * 1024 * 1024, timeout: 300_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('JSON report contract', () => {
  const r = run(['audit', charts, '--format', 'json', '--fail-on', 'never', '--quiet']);
  const report = JSON.parse(r.stdout) as Report;

  it('writes exactly one JSON document that validates against the schema', () => {
    // source: JSON Schema draft-07 (validated with ajv, a general-purpose validator from npm)
    const schema = JSON.parse(readFileSync(resolve(root, 'schema/report.schema.json'), 'utf8')) as object;
    const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);
    const ok = validate(report);
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
    expect(r.status).toBe(0);
  });

  it('reads every real chart and keeps paths as given', () => {
    expect(report.files.length).toBe(44);
    expect(report.files.every((f) => f.ok)).toBe(true);
    expect(report.files.every((f) => f.path.startsWith(charts))).toBe(true);
  });

  it('gives ink shares that sum to 1', () => {
    for (const f of report.files) {
      const s = f.ink!.data + f.ink!.guides + f.ink!.labels + f.ink!.decoration;
      expect(Math.abs(s - 1), f.path).toBeLessThan(1e-6);
    }
  });

  it('exits 1 on findings at or above --fail-on, 2 on usage errors and on no input', () => {
    expect(run(['audit', resolve(charts, 'mpl-bar-truncated-01.svg'), '--format', 'json', '--quiet']).status).toBe(1);
    expect(run(['audit', resolve(charts, 'mpl-bar-truncated-01.svg'), '--format', 'json', '--fail-on', 'never', '--quiet']).status).toBe(0);
    expect(run(['audit', resolve(root, 'no-such-folder-anywhere')]).status).toBe(2);
    expect(run(['audit', charts, '--format', 'yaml']).status).toBe(2);
    expect(run(['audit', charts, '--shard', '5/3']).status).toBe(2);
  });
});
