/**
 * `plumbline redraw` as a command: usage errors, --out-dir mirroring, inputs
 * never written without --in-place, one bad file reported while the others
 * go on, --dry-run, and --in-place surviving SIGKILL mid-batch (every file is
 * the old version or the new one, never a mix).
 *
 * The command runs in a child process through the TypeScript sources
 * (engine/cli/main.ts under tsx), the same code the built bin/plumbline.js runs.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { SaxesParser } from 'saxes';
import { afterAll, describe, expect, it } from 'vitest';
import { redrawText } from '../engine/redraw/redraw.js';
import { REAL_CHARTS } from './support/real-charts.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const tsxLoader = path.join(repoRoot, 'node_modules/tsx/dist/loader.mjs');
const mainUrl = pathToFileURL(path.join(repoRoot, 'engine/cli/main.ts')).href;
const ENTRY = `const { main } = await import(${JSON.stringify(mainUrl)}); process.exitCode = await main(process.argv.slice(1));`;

const temps: string[] = [];
function tempDir(): string {
  const d = mkdtempSync(path.join(tmpdir(), 'plumbline-redraw-'));
  temps.push(d);
  return d;
}
afterAll(() => {
  for (const d of temps) rmSync(d, { recursive: true, force: true });
});

function start(args: string[], cwd: string): ChildProcess {
  return spawn(process.execPath, ['--import', tsxLoader, '--input-type=module', '-e', ENTRY, '--', ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
}

function run(args: string[], cwd: string): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = start(args, cwd);
    let stdout = '';
    let stderr = '';
    child.stdout!.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

function wellFormed(xml: string): boolean {
  const p = new SaxesParser();
  let ok = true;
  p.on('error', () => {
    ok = false;
  });
  p.write(xml).close();
  return ok;
}

function snapshot(dir: string): Map<string, string> {
  const out = new Map<string, string>();
  const walk = (d: string): void => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else out.set(path.relative(dir, p), readFileSync(p, 'latin1'));
    }
  };
  walk(dir);
  return out;
}

const SMALL = ['vl-bar-clean-01.svg', 'ec-bar-clean-01.svg', 'gg-bar-truncated-01.svg', 'mpl-bar-clean-01.svg', 'gp-histogram-clustered-01.svg', 'vl-donut-clean-01.svg'];

describe('plumbline redraw (command)', () => {
  it('refuses to run without exactly one of --out-dir and --in-place, and with unknown --only ids (exit 2)', async () => {
    const dir = tempDir();
    cpSync(path.join(REAL_CHARTS, SMALL[0]!), path.join(dir, 'a.svg'));
    const before = snapshot(dir);
    // source: ../shared/CONTRACT.md, exit status 2 for usage errors
    expect((await run(['redraw', 'a.svg'], dir)).code).toBe(2);
    expect((await run(['redraw', '--in-place', '--out-dir', 'o', 'a.svg'], dir)).code).toBe(2);
    const only = await run(['redraw', '--dry-run', '--only', 'ink.no-such-rule', 'a.svg'], dir);
    expect(only.code).toBe(2);
    expect(only.stderr).toContain('ink.no-such-rule');
    expect((await run(['redraw', '--in-place', 'missing/*.svg'], dir)).code).toBe(2);
    expect(snapshot(dir)).toEqual(before);
  });

  it('--out-dir mirrors relative paths, leaves the inputs untouched, and a bad file fails alone (exit 1)', async () => {
    const dir = tempDir();
    mkdirSync(path.join(dir, 'figs/a'), { recursive: true });
    mkdirSync(path.join(dir, 'figs/b'), { recursive: true });
    cpSync(path.join(REAL_CHARTS, SMALL[0]!), path.join(dir, 'figs/a/one.svg'));
    cpSync(path.join(REAL_CHARTS, SMALL[1]!), path.join(dir, 'figs/b/two.svg'));
    writeFileSync(path.join(dir, 'figs/b/broken.svg'), '<svg xmlns="http://www.w3.org/2000/svg">\n  <g>\n</svg>\n');
    const inputs = snapshot(path.join(dir, 'figs'));
    const r = await run(['redraw', '--out-dir', 'clean', 'figs'], dir);
    // source: ../shared/CONTRACT.md, a file that cannot be read never stops the others; exit 1 when one failed
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/broken\.svg: .*line 3, column \d+/);
    expect(snapshot(path.join(dir, 'figs'))).toEqual(inputs);
    expect(existsSync(path.join(dir, 'clean/figs/a/one.svg'))).toBe(true);
    expect(existsSync(path.join(dir, 'clean/figs/b/two.svg'))).toBe(true);
    expect(existsSync(path.join(dir, 'clean/figs/b/broken.svg'))).toBe(false);
    const one = readFileSync(path.join(dir, 'clean/figs/a/one.svg'), 'utf8');
    expect(wellFormed(one)).toBe(true);
    expect(one).toBe(redrawText(readFileSync(path.join(dir, 'figs/a/one.svg'), 'utf8'), 'one.svg').output);
  });

  it('--dry-run writes nothing and prints the fixes and the changed lines', async () => {
    const dir = tempDir();
    cpSync(path.join(REAL_CHARTS, 'gp-points-clean-01.svg'), path.join(dir, 'p.svg'));
    const before = snapshot(dir);
    const r = await run(['redraw', '--dry-run', 'p.svg'], dir);
    expect(r.code).toBe(0);
    expect(snapshot(dir)).toEqual(before);
    expect(r.stdout).toContain('access.missing-description');
    expect(r.stdout).toMatch(/^ {2}@@ -\d+,\d+ \+\d+,\d+ @@$/m);
    expect(r.stdout).toMatch(/^ {2}-<title>/m);
    expect(r.stdout).toMatch(/^ {2}\+<title>/m);
  });

  it('--in-place keeps a UTF-8 byte-order mark', async () => {
    const dir = tempDir();
    const body = readFileSync(path.join(REAL_CHARTS, SMALL[1]!));
    writeFileSync(path.join(dir, 'bom.svg'), Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), body]));
    const r = await run(['redraw', '--in-place', 'bom.svg'], dir);
    expect(r.code).toBe(0);
    const out = readFileSync(path.join(dir, 'bom.svg'));
    expect([...out.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(out.length).toBeGreaterThan(body.length + 3);
  });

  it('--in-place killed mid-batch leaves every file either old or new, and readable', async () => {
    const dir = tempDir();
    const originals = new Map<string, string>();
    for (let copy = 0; copy < 12; copy++) {
      for (const f of SMALL) {
        const name = `c${String(copy).padStart(2, '0')}-${f}`;
        const text = readFileSync(path.join(REAL_CHARTS, f), 'utf8');
        writeFileSync(path.join(dir, name), text);
        originals.set(name, text);
      }
    }
    const mtimes = new Map([...originals.keys()].map((n) => [n, statSync(path.join(dir, n)).mtimeMs]));
    const child = start(['redraw', '--in-place', '--quiet', '.'], dir);
    const exited = new Promise<void>((resolve) => child.on('close', () => resolve()));
    // Wait until the first file has been replaced, then kill the process without warning.
    const deadline = Date.now() + 90_000;
    let seen = false;
    while (!seen && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 15));
      for (const [n, t] of mtimes) {
        if (statSync(path.join(dir, n)).mtimeMs !== t) {
          seen = true;
          break;
        }
      }
    }
    child.kill('SIGKILL');
    await exited;
    expect(seen).toBe(true);

    let changed = 0;
    let unchanged = 0;
    for (const [name, old] of originals) {
      const now = readFileSync(path.join(dir, name), 'utf8');
      if (now === old) {
        unchanged++;
        continue;
      }
      changed++;
      // common practice, no source: an atomic replace shows the complete new file
      expect(wellFormed(now), name).toBe(true);
      expect(now, name).toBe(redrawText(old, name).output);
    }
    expect(changed).toBeGreaterThan(0);
    expect(unchanged).toBeGreaterThan(0);
    // No half-written file under an .svg name.
    const svgs = readdirSync(dir).filter((n) => n.endsWith('.svg'));
    expect(svgs.sort()).toEqual([...originals.keys()].sort());
  });
});
