/** The report cache: keys, entries, damaged entries, and batches served from it (on the calling thread). */
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG, parseConfig } from '../engine/config/config.js';
import { auditFiles, type BatchStats } from '../engine/audit/audit-batch.js';
import { cacheKey, configHash, contentHash, entryPath, readCachedReport, writeCachedReport } from '../engine/audit/cache.js';
import type { FileReport } from '../engine/report/types.js';
import { VERSION } from '../engine/version.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const realCharts = path.resolve(repoRoot, '../shared/real-charts');
const tmp = mkdtempSync(path.join(os.tmpdir(), 'plumbline-batch-cache-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const sample: FileReport = {
  path: 'a/b.svg',
  ok: true,
  error: null,
  findings: [{ rule: 'ink.frame-box', severity: 'note', message: 'm', elements: [{ id: null, line: 3, column: 5 }], measures: { sides: 4 } }],
};

function allFiles(dir: string): string[] {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((d) => d.isFile())
    .map((d) => path.join(d.parentPath, d.name));
}

describe('cache keys', () => {
  it('hashes content with SHA-256', () => {
    // source: FIPS 180-2, Appendix B.1 (SHA-256 of "abc")
    expect(contentHash(new TextEncoder().encode('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('settings hash ignores key order and file selection, and follows rule settings and display width', () => {
    const a = parseConfig({ rules: { 'ink.frame-box': 'off', 'text.too-small': { severity: 'error', minPx: 9 } }, displayWidth: 640 });
    const b = parseConfig({ displayWidth: 640, rules: { 'text.too-small': { minPx: 9, severity: 'error' }, 'ink.frame-box': 'off' }, ignore: ['x/**'] }, 'elsewhere.json');
    expect(configHash(a)).toBe(configHash(b));
    expect(configHash(a)).not.toBe(configHash(parseConfig({ rules: { 'ink.frame-box': 'off', 'text.too-small': { severity: 'error', minPx: 10 } }, displayWidth: 640 })));
    expect(configHash(a)).not.toBe(configHash(parseConfig({ rules: { 'ink.frame-box': 'off', 'text.too-small': { severity: 'error', minPx: 9 } }, displayWidth: 800 })));
    expect(configHash(a)).not.toBe(configHash(DEFAULT_CONFIG));
  });

  it('the entry name changes with content, settings and version', () => {
    const bytes = new TextEncoder().encode('<svg/>');
    const h = configHash(DEFAULT_CONFIG);
    const k = cacheKey(bytes, h);
    expect(k.id).toMatch(/^[0-9a-f]{64}$/);
    expect(cacheKey(new TextEncoder().encode('<svg />'), h).id).not.toBe(k.id);
    expect(cacheKey(bytes, configHash(parseConfig({ displayWidth: 300 }))).id).not.toBe(k.id);
    expect(cacheKey(bytes, h, `${VERSION}-next`).id).not.toBe(k.id);
    expect(cacheKey(bytes, h).id).toBe(k.id);
  });
});

describe('cache entries', () => {
  const dir = path.join(tmp, 'entries');
  const key = cacheKey(new TextEncoder().encode('<svg>1</svg>'), configHash(DEFAULT_CONFIG));

  it('round-trips a report and rewrites its path', async () => {
    expect(await readCachedReport(dir, key, 'x.svg')).toBeNull();
    expect(await writeCachedReport(dir, key, sample)).toBe(true);
    expect(await readCachedReport(dir, key, 'moved/here.svg')).toEqual({ ...sample, path: 'moved/here.svg' });
    // No temporary files are left behind.
    expect(allFiles(dir).map((f) => path.basename(f))).toEqual([`${key.id}.json`]);
  });

  it('ignores damaged entries', async () => {
    await writeCachedReport(dir, key, sample);
    const file = entryPath(dir, key);
    const good = JSON.stringify({ format: 1, plumbline: VERSION, config: key.config, content: key.content, report: sample });
    for (const damaged of ['', good.slice(0, good.length >> 1), 'null', '[]', '{"format":1}', good.replace(key.content, '0'.repeat(64)), good.replace('"findings":', '"findingz":'), good.replace(`"plumbline":"${VERSION}"`, '"plumbline":"0.0.0-other"')]) {
      writeFileSync(file, damaged);
      expect(await readCachedReport(dir, key, 'x.svg')).toBeNull();
    }
  });

  it('a folder that cannot hold entries makes writes fail quietly', async () => {
    const blocked = path.join(tmp, 'blocked');
    writeFileSync(blocked, 'a file, not a folder');
    expect(await writeCachedReport(blocked, key, sample)).toBe(false);
  });
});

describe('batches with a cache (calling thread)', () => {
  const names = readdirSync(realCharts).filter((f) => f.endsWith('.svg')).sort().slice(0, 6);
  const files = names.map((f) => path.join(realCharts, f));

  async function run(list: string[], cacheDir: string | null, jobs = 1): Promise<{ reports: FileReport[]; stats: BatchStats }> {
    let stats: BatchStats | null = null;
    const reports = await auditFiles(list, DEFAULT_CONFIG, { jobs, cacheDir, progress: false, onStats: (s) => (stats = s) });
    return { reports, stats: stats! };
  }

  it('gives the same reports as no cache, analyses nothing the second time, and serves moved files', async () => {
    const cacheDir = path.join(tmp, 'cache');
    const plain = await run(files, null);
    const first = await run(files, cacheDir);
    expect(first.reports).toEqual(plain.reports);
    expect(first.stats).toMatchObject({ files: names.length, analysed: names.length, fromCache: 0 });
    const entries = allFiles(cacheDir);
    expect(entries).toHaveLength(names.length);
    const mtimes = entries.map((f) => statSync(f).mtimeMs);

    const second = await run(files, cacheDir);
    expect(second.reports).toEqual(plain.reports);
    expect(second.stats).toMatchObject({ analysed: 0, fromCache: names.length });
    expect(allFiles(cacheDir).map((f) => statSync(f).mtimeMs)).toEqual(mtimes);

    // Copies under other names reuse the entries, with their own paths.
    const moved = path.join(tmp, 'moved');
    mkdirSync(moved);
    const copies = names.map((f, i) => {
      const to = path.join(moved, `copy-${i}.svg`);
      copyFileSync(path.join(realCharts, f), to);
      return to;
    });
    const third = await run(copies, cacheDir);
    expect(third.stats).toMatchObject({ analysed: 0, fromCache: names.length });
    expect(third.reports).toEqual(plain.reports.map((r, i) => ({ ...r, path: copies[i] })));
  });

  it('re-analyses a file whose entry was damaged, and rewrites the entry', async () => {
    const cacheDir = path.join(tmp, 'cache-damaged');
    const plain = await run(files, cacheDir);
    const entries = allFiles(cacheDir).sort();
    writeFileSync(entries[0]!, '{"format":1,"report":');
    writeFileSync(entries[1]!, '');
    const again = await run(files, cacheDir);
    expect(again.stats).toMatchObject({ analysed: 2, fromCache: names.length - 2 });
    expect(again.reports).toEqual(plain.reports);
    const third = await run(files, cacheDir);
    expect(third.stats).toMatchObject({ analysed: 0, fromCache: names.length });
  });

  it('does not cache unreadable-file errors that come from the file system', async () => {
    const cacheDir = path.join(tmp, 'cache-missing');
    const missing = path.join(tmp, 'no-such-file.svg');
    const { reports } = await run([missing], cacheDir);
    expect(reports[0]).toMatchObject({ path: missing, ok: false });
    expect(allFiles(cacheDir)).toHaveLength(0);
  });

  it('a cache path that is a file is a clear error', async () => {
    const blocked = path.join(tmp, 'blocked-cache');
    writeFileSync(blocked, 'x');
    await expect(run(files.slice(0, 1), path.join(blocked, 'sub'))).rejects.toThrow(/cannot use cache folder/);
  });
});
