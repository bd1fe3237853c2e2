/**
 * The demo's audit report as it is kept in corpus-demo/expected/report.json:
 * the JSON report of `plumbline audit corpus-demo/figures`, produced by the
 * built command (bin/plumbline.js → dist/), with fields that change between
 * releases or machines replaced by fixed placeholders.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO_ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
export const DEMO_DIR = 'corpus-demo';
export const FIGURES_DIR = `${DEMO_DIR}/figures`;
export const EXPECTED_REPORT = `${DEMO_DIR}/expected/report.json`;
export const EXPECTED_REDRAWN = `${DEMO_DIR}/expected/redrawn`;
/** The demo's own configuration (the defaults), so a configuration file elsewhere in the checkout cannot change its results. */
export const DEMO_CONFIG = `${DEMO_DIR}/plumbline.config.json`;

/** Placeholder for the package version, which changes with every release. */
export const VERSION_PLACEHOLDER = '<version>';

export interface CliRun {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Runs the built command from the repository root (paths in its output stay relative). */
export function runBuiltCli(args: string[]): CliRun {
  const bin = join(REPO_ROOT, 'bin', 'plumbline.js');
  if (!existsSync(join(REPO_ROOT, 'dist', 'engine', 'cli', 'main.js'))) {
    throw new Error('the command is not built: run `npm run build` first');
  }
  const r = spawnSync(process.execPath, [bin, ...args], { cwd: REPO_ROOT, encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  if (r.error) throw new Error(`cannot run bin/plumbline.js: ${r.error.message}`);
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** The volatile fields replaced: the package version. Files sorted by path. */
export function normaliseReport(report: unknown): Record<string, unknown> {
  if (!report || typeof report !== 'object' || Array.isArray(report)) throw new Error('the audit report is not a JSON object');
  const r = { ...(report as Record<string, unknown>) };
  if (typeof r.plumbline !== 'string') throw new Error('the audit report has no "plumbline" version field');
  r.plumbline = VERSION_PLACEHOLDER;
  if (!Array.isArray(r.files)) throw new Error('the audit report has no "files" list');
  r.files = [...(r.files as { path: string }[])].sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  return r;
}

/** Audits the committed figures with the built command; the normalised report. */
export function auditDemoFigures(): Record<string, unknown> {
  const run = runBuiltCli(['audit', FIGURES_DIR, '--format', 'json', '--fail-on', 'never', '--quiet', '--config', DEMO_CONFIG]);
  if (run.status !== 0) {
    throw new Error(`plumbline audit exited with status ${run.status}: ${run.stderr.trim() || '(no message)'}`);
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(run.stdout);
  } catch (err) {
    throw new Error(`plumbline audit did not print one JSON document: ${(err as Error).message}`);
  }
  return normaliseReport(parsed);
}

/** The text written to expected/report.json. */
export function reportText(report: Record<string, unknown>): string {
  return JSON.stringify(report, null, 2) + '\n';
}
