/**
 * Rewrites the demo's expected outputs from the current code:
 *   corpus-demo/expected/report.json   the audit report (normalised, see demo-report.ts)
 *   corpus-demo/expected/redrawn/*.svg the redrawn figures, when `plumbline redraw` works
 * Run after checking that a change in them is intended: npm run demo:update
 * (it builds first, so the expected outputs never come from a stale dist/).
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join, relative } from 'node:path';
import { auditDemoFigures, DEMO_CONFIG, EXPECTED_REDRAWN, EXPECTED_REPORT, FIGURES_DIR, REPO_ROOT, reportText, runBuiltCli } from './demo-report.js';

function say(s: string): void {
  process.stdout.write(s + '\n');
}

function svgsBelow(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...svgsBelow(p));
    else if (e.isFile() && e.name.endsWith('.svg')) out.push(p);
  }
  return out.sort();
}

function build(): void {
  const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
  const r = spawnSync(npm, ['run', 'build'], { cwd: REPO_ROOT, stdio: 'inherit' });
  if (r.status !== 0) {
    throw new Error('`npm run build` failed; the expected outputs were not changed');
  }
}

/** Redraws the figures into a temporary folder and copies the results; false (with a message) when redraw is not available. */
function updateRedrawn(): boolean {
  const tmp = mkdtempSync(join(tmpdir(), 'plumbline-demo-redraw-'));
  try {
    let run;
    try {
      run = runBuiltCli(['redraw', FIGURES_DIR, '--out-dir', tmp, '--quiet', '--config', DEMO_CONFIG]);
    } catch (err) {
      say(`redraw skipped: ${(err as Error).message}`);
      return false;
    }
    const written = svgsBelow(tmp);
    if (run.status === null || run.status > 1 || written.length === 0) {
      const why = run.stderr.trim().split('\n').slice(0, 5).join('\n  ') || `exit status ${run.status}, no files written`;
      say(`redraw skipped: \`plumbline redraw ${FIGURES_DIR} --out-dir DIR\` did not work:\n  ${why}\n${EXPECTED_REDRAWN} was left as it was.`);
      return false;
    }
    const names = written.map((f) => basename(f));
    if (new Set(names).size !== names.length) {
      throw new Error(`redraw wrote two files with one name: ${written.map((f) => relative(tmp, f)).join(', ')}`);
    }
    const dest = join(REPO_ROOT, EXPECTED_REDRAWN);
    rmSync(dest, { recursive: true, force: true });
    mkdirSync(dest, { recursive: true });
    for (const f of written) copyFileSync(f, join(dest, basename(f)));
    say(`wrote ${written.length} redrawn figures to ${EXPECTED_REDRAWN}`);
    return true;
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

function main(): void {
  build();
  const report = auditDemoFigures();
  mkdirSync(join(REPO_ROOT, 'corpus-demo', 'expected'), { recursive: true });
  writeFileSync(join(REPO_ROOT, EXPECTED_REPORT), reportText(report));
  say(`wrote ${EXPECTED_REPORT}`);
  updateRedrawn();
}

try {
  main();
} catch (err) {
  process.stderr.write(`demo:update: ${(err as Error).message}\n`);
  process.exitCode = 1;
}
