/**
 * Hostile and broken input, generated here (no downloaded samples): every file gets a clear
 * error or a sensible report, nothing crashes or hangs, and nothing outside the input is read
 * or fetched. The CLI runs in a child process with file and network access trapped.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, writeFileSync, mkdirSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { spawnSync } from 'node:child_process';
import type { Report } from '../engine/report/types.js';

const root = resolve(import.meta.dirname, '..');
const realCharts = resolve(root, '../shared/real-charts');
const trap = resolve(import.meta.dirname, 'hostile/trap-io.mjs');

const svg = (body: string, attrs = 'width="200" height="100" viewBox="0 0 200 100"'): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" ${attrs}>${body}</svg>`;

/** The hostile cases: file name → content. */
function cases(): Record<string, string | Buffer> {
  const lol = '<!ENTITY lol "lol">' + Array.from({ length: 9 }, (_, k) => `<!ENTITY lol${k + 1} "${`&lol${k || ''};`.repeat(10)}">`).join('');
  const bigData = 'data:image/png;base64,' + 'A'.repeat(12 * 1024 * 1024);
  return {
    'entity-bomb.svg': `<?xml version="1.0"?><!DOCTYPE svg [${lol}]>${svg('<text>&lol9;</text>')}`,
    'external-entity.svg': `<!DOCTYPE svg [<!ENTITY x SYSTEM "file:///etc/passwd">]>${svg('<text>&x;</text>')}`,
    'image-file.svg': svg('<image href="file:///etc/passwd" width="10" height="10"/><rect width="10" height="10" fill="red"/>'),
    'image-http.svg': svg('<image xlink:href="http://127.0.0.1:9/x.png" width="10" height="10"/>'),
    'use-external.svg': svg('<use href="http://127.0.0.1:9/defs.svg#a"/><use href="file:///etc/passwd#a"/>'),
    'css-import.svg': svg('<style>@import url("file:///etc/passwd"); @import "http://127.0.0.1:9/x.css"; rect { fill: url(http://127.0.0.1:9/p.svg#p) }</style><rect width="10" height="10"/>'),
    'huge-data-uri.svg': svg(`<image href="${bigData}" width="10" height="100"/>`),
    'deep-nesting.svg': svg('<g>'.repeat(100_000) + '</g>'.repeat(100_000)),
    'path-garbage.svg': svg('<path d="M 10 10 L NaN 5 L Infinity 3 L 1e308 1e308 L -1e308 2 Q x y z"/><path d="M0 0 L 10 10 @@@"/><path d="M1e308 1e308 L -1e308 -1e308" stroke="black"/>'),
    'transform-zero.svg': svg('<g transform="scale(0)"><rect width="10" height="10"/></g><g transform="matrix(NaN 0 0 1 0 0)"><rect width="5" height="5"/></g><g transform="scale(1e308) translate(1e308)"><rect width="10" height="10"/></g>'),
    'viewbox-zero.svg': svg('<rect width="10" height="10"/>', 'width="100" height="100" viewBox="0 0 0 -5"'),
    'circular-use.svg': svg('<defs><g id="a"><use href="#b"/></g><g id="b"><use href="#a"/></g></defs><use href="#a"/><use id="self" href="#self"/>'),
    'gradient-self.svg': svg('<defs><linearGradient id="g" href="#h"/><linearGradient id="h" href="#g"/></defs><rect width="10" height="10" fill="url(#g)"/>'),
    'text-1mb.svg': svg(`<text x="0" y="10">${'W'.repeat(1024 * 1024)}</text>`),
    'invalid-utf8.svg': Buffer.concat([Buffer.from(svg('<text>ab')), Buffer.from([0xff, 0xfe, 0xc3]), Buffer.from('</text></svg>')]),
    'bom.svg': '\ufeff' + svg('<rect width="50" height="50" fill="#336699"/>'),
    'actually-html.svg': '<!DOCTYPE html><html><head><title>x</title></head><body><p>hello<br></body></html>',
    'empty.svg': '',
    'truncated.svg': svg('<rect width="10" height="10"/>').slice(0, 80),
  };
}

interface Outcome {
  name: string;
  ok: boolean;
  message: string | null;
  line: number | null;
}

let report: Report;
let trapLine: string[] = [];
let elapsedMs = 0;
let exitCode: number | null = null;
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-hostile-'));
  const input = join(dir, 'in');
  mkdirSync(input);
  for (const [name, content] of Object.entries(cases())) writeFileSync(join(input, name), content);
  // Good files beside the hostile ones: their results must be unaffected.
  copyFileSync(join(realCharts, 'mpl-bar-clean-01.svg'), join(input, 'good-mpl-bar.svg'));
  copyFileSync(join(realCharts, 'vl-line-time-01.svg'), join(input, 'good-vl-line.svg'));
  const t0 = performance.now();
  const run = spawnSync(process.execPath, ['--import', trap, join(root, 'bin/plumbline.js'), 'audit', input, '--format', 'json', '--jobs', '1', '--quiet'], {
    env: { ...process.env, PLUMBLINE_TRAP_ALLOW: `${input}:${root}` },
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
    timeout: 240_000,
  });
  elapsedMs = performance.now() - t0;
  exitCode = run.status;
  report = JSON.parse(run.stdout) as Report;
  const m = /TRAP (\[.*\])/.exec(run.stderr);
  trapLine = m ? (JSON.parse(m[1]!) as string[]) : ['trap output missing'];
});

describe('hostile input', () => {
  it('reports every file, exits 1 for the failures, and prints the outcomes', () => {
    const outcomes: Outcome[] = report.files.map((f) => ({
      name: f.path.split('/').pop()!,
      ok: f.ok,
      message: f.error?.message ?? null,
      line: f.error?.line ?? null,
    }));
    console.log(`hostile batch of ${outcomes.length} files in ${(elapsedMs / 1000).toFixed(1)} s`);
    for (const o of outcomes) console.log(`  ${o.name.padEnd(22)} ${o.ok ? 'report' : 'error '} ${o.message ?? ''}${o.line ? ` (line ${o.line})` : ''}`.slice(0, 200));
    expect(report.files.length).toBe(Object.keys(cases()).length + 2);
    expect(exitCode).toBe(1);
  });

  it('never reads a file outside the input or touches the network', () => {
    expect(trapLine).toEqual([]);
  });

  it('gives specific errors with positions for malformed files', () => {
    const byName = new Map(report.files.map((f) => [f.path.split('/').pop()!, f]));
    const err = (n: string): string => byName.get(n)?.error?.message ?? '';
    expect(err('entity-bomb.svg')).toMatch(/entity declarations are refused/);
    expect(err('external-entity.svg')).toMatch(/entity/);
    expect(err('deep-nesting.svg')).toMatch(/nested deeper than/);
    expect(err('invalid-utf8.svg')).toMatch(/invalid UTF-8/);
    expect(err('actually-html.svg')).toMatch(/html|not <svg>|does not match|end tag/i);
    expect(err('empty.svg')).toMatch(/empty document/);
    expect(err('truncated.svg')).toMatch(/unexpected end of file|unterminated/);
    for (const n of ['entity-bomb.svg', 'deep-nesting.svg', 'invalid-utf8.svg', 'truncated.svg']) expect(byName.get(n)!.error!.line).toBeGreaterThan(0);
    // Every unreadable file counts as one error finding.
    for (const f of report.files.filter((x) => !x.ok)) expect(f.findings.some((x) => x.severity === 'error')).toBe(true);
  });

  it('reads what can be read: external references, garbage geometry, cycles, huge text', () => {
    const byName = new Map(report.files.map((f) => [f.path.split('/').pop()!, f]));
    for (const n of ['image-file.svg', 'image-http.svg', 'use-external.svg', 'css-import.svg', 'path-garbage.svg', 'transform-zero.svg', 'viewbox-zero.svg', 'circular-use.svg', 'gradient-self.svg', 'text-1mb.svg', 'bom.svg', 'huge-data-uri.svg']) {
      expect(byName.get(n)?.ok, n).toBe(true);
    }
    const json = JSON.stringify(report);
    expect(json).not.toMatch(/NaN|Infinity/);
  });

  it('leaves the good files unaffected', () => {
    const good = report.files.filter((f) => f.path.includes('good-'));
    expect(good.map((f) => [f.ok, f.chart?.kind])).toEqual([
      [true, 'bar'],
      [true, 'line'],
    ]);
  });
});
