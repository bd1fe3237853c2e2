/**
 * Content-addressed cache of file reports (`audit --cache DIR`).
 *
 * Key: sha256 over the plumbline version, a hash of the settings that change
 * a report (rule settings and display width) and the sha256 of the file's
 * bytes. The path is not part of the key: an entry is reused for a moved or
 * copied file, with the `path` field rewritten on read.
 *
 * Entries are written to a temporary file and renamed into place, so a reader
 * never sees half an entry. They are not fsynced: after a power cut an entry
 * may be empty or cut short, and an entry that does not parse or does not
 * match its key is ignored (the file is analysed again and the entry
 * rewritten).
 */
import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readFile, rename, unlink, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Config } from '../config/config.js';
import type { FileReport } from '../report/types.js';
import { VERSION } from '../version.js';

/** Bumped when the entry layout changes. */
const ENTRY_FORMAT = 1;

interface CacheEntry {
  format: number;
  plumbline: string;
  config: string;
  content: string;
  report: FileReport;
}

/** JSON with object keys sorted, so equal settings hash equal whatever their order in the file. */
function stableJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stableJson).join(',')}]`;
  if (value && typeof value === 'object') {
    const o = value as Record<string, unknown>;
    const keys = Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

/** Hash of the settings that change a file's report (not `ignore` or `path`, which only pick files). */
export function configHash(config: Config): string {
  return createHash('sha256')
    .update(stableJson({ rules: config.rules, displayWidth: config.displayWidth }))
    .digest('hex');
}

export function contentHash(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

export interface CacheKey {
  /** Entry name: sha256 of version, settings hash and content hash. */
  id: string;
  content: string;
  config: string;
}

export function cacheKey(bytes: Uint8Array, settingsHash: string, version: string = VERSION): CacheKey {
  const content = contentHash(bytes);
  const id = createHash('sha256').update(`${version}\0${settingsHash}\0${content}`).digest('hex');
  return { id, content, config: settingsHash };
}

export function entryPath(dir: string, key: CacheKey): string {
  return join(dir, key.id.slice(0, 2), `${key.id}.json`);
}

function looksLikeReport(r: unknown): r is FileReport {
  if (!r || typeof r !== 'object') return false;
  const o = r as Record<string, unknown>;
  return typeof o.path === 'string' && typeof o.ok === 'boolean' && Array.isArray(o.findings) && (o.error === null || typeof o.error === 'object');
}

/** The cached report for this content, with `path` set to the given path; null when absent or unusable. */
export async function readCachedReport(dir: string, key: CacheKey, path: string): Promise<FileReport | null> {
  let text: string;
  try {
    text = await readFile(entryPath(dir, key), 'utf8');
  } catch {
    return null;
  }
  let entry: unknown;
  try {
    entry = JSON.parse(text);
  } catch {
    return null;
  }
  if (!entry || typeof entry !== 'object') return null;
  const e = entry as Partial<CacheEntry>;
  if (e.format !== ENTRY_FORMAT || e.plumbline !== VERSION || e.config !== key.config || e.content !== key.content) return null;
  if (!looksLikeReport(e.report)) return null;
  return { ...e.report, path };
}

/** Stores a report under its key (temporary file + rename). Failure to write is not an error: the cache is optional. */
export async function writeCachedReport(dir: string, key: CacheKey, report: FileReport): Promise<boolean> {
  const entry: CacheEntry = { format: ENTRY_FORMAT, plumbline: VERSION, config: key.config, content: key.content, report };
  const file = entryPath(dir, key);
  const tmp = `${file}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
  try {
    await mkdir(join(dir, key.id.slice(0, 2)), { recursive: true });
    await writeFile(tmp, JSON.stringify(entry), { flag: 'wx' });
    await rename(tmp, file);
    return true;
  } catch {
    await unlink(tmp).catch(() => undefined);
    return false;
  }
}
