/**
 * `plumbline redraw`: writes decluttered, more honest copies of charts.
 *
 * - `--out-dir DIR` mirrors the inputs' relative paths below DIR (absolute
 *   inputs go to DIR/basename; leading `../` steps are dropped);
 * - `--in-place` replaces the inputs, each with an atomic write (a reader, or
 *   a crash, sees the old file or the new one, never a mix);
 * - exactly one of the two, unless `--dry-run`, which writes nothing and
 *   prints per file the fixes and a unified-diff-like summary of the lines
 *   they change;
 * - `--only RULE,...` limits the fixes.
 * Inputs are never written without `--in-place`. A file that cannot be read,
 * understood, redrawn or verified is reported on stderr (with line and column
 * when known) and the others go on. Exit status: 0 all done, 1 a file failed,
 * 2 usage error.
 */
import { readFile, stat } from 'node:fs/promises';
import { basename, isAbsolute, join, normalize, resolve, sep } from 'node:path';
import { ConfigError, loadConfig, type Config } from '../config/config.js';
import { decodeSvgBytes } from '../read/read-file.js';
import { DEFAULT_LIMITS } from '../read/parse-xml.js';
import { changeHunks, formatHunks } from '../redraw/change-summary.js';
import { FIXABLE_RULES } from '../redraw/fixes/index.js';
import { redrawText, RedrawInputError, RedrawVerificationError, type RedrawResult } from '../redraw/redraw.js';
import { writeFileAtomic } from '../report/write-atomic.js';
import { parseShard } from './options.js';
import { selectFiles } from './select-files.js';
import { UsageError } from './usage-error.js';

type Encoding = 'utf8' | 'utf8-bom' | 'utf16le' | 'utf16be';

function encodingOf(bytes: Uint8Array): Encoding {
  if (bytes.length >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) return 'utf8-bom';
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return 'utf16le';
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return 'utf16be';
  return 'utf8';
}

/** The output text in the input's encoding (its byte-order mark kept). */
function encode(text: string, enc: Encoding): Uint8Array {
  const body = text.startsWith('\ufeff') ? text.slice(1) : text;
  switch (enc) {
    case 'utf8':
      return Buffer.from(body, 'utf8');
    case 'utf8-bom':
      return Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(body, 'utf8')]);
    case 'utf16le':
      return Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(body, 'utf16le')]);
    case 'utf16be': {
      const le = Buffer.from(body, 'utf16le');
      for (let i = 0; i + 1 < le.length; i += 2) {
        const t = le[i]!;
        le[i] = le[i + 1]!;
        le[i + 1] = t;
      }
      return Buffer.concat([Buffer.from([0xfe, 0xff]), le]);
    }
  }
}

/** Where `--out-dir` puts the redrawn copy of `file`. */
export function outputPathFor(file: string, outDir: string): string {
  if (isAbsolute(file)) return join(outDir, basename(file));
  const parts = normalize(file).split(sep).filter((p) => p !== '' && p !== '.');
  while (parts[0] === '..') parts.shift();
  return join(outDir, ...(parts.length > 0 ? parts : [basename(file)]));
}

/** `--only` → rule ids, refusing ids redraw has no fix for. */
export function parseOnly(v: string | boolean | undefined): string[] | undefined {
  if (v === undefined || v === false) return undefined;
  if (v === true) throw new UsageError('--only needs a comma-separated list of rule ids');
  const ids = v.split(',').map((s) => s.trim()).filter(Boolean);
  if (ids.length === 0) throw new UsageError('--only needs a comma-separated list of rule ids');
  const unknown = ids.filter((id) => !FIXABLE_RULES.includes(id));
  if (unknown.length > 0) {
    throw new UsageError(`--only: redraw has no fix for ${unknown.join(', ')}; rules with a fix: ${FIXABLE_RULES.join(', ')}`);
  }
  return ids;
}

function describeError(err: unknown): string {
  if (err instanceof RedrawVerificationError) return `${err.message}`;
  const e = err as { message?: unknown; line?: unknown; column?: unknown };
  const message = typeof e?.message === 'string' ? e.message : String(err);
  const where = typeof e?.line === 'number' && e.line !== null ? ` (line ${e.line}${typeof e.column === 'number' ? `, column ${e.column}` : ''})` : '';
  return `${message}${where}`;
}

function appliedText(r: RedrawResult): string {
  if (r.applied.length === 0) return 'nothing to change';
  return r.applied.map((a) => `${a.rule} ×${a.count}`).join(', ');
}

function dryRunReport(file: string, text: string, r: RedrawResult): string {
  const lines: string[] = [file];
  if (r.applied.length === 0) lines.push('  nothing to change');
  for (const a of r.applied) lines.push(`  ${a.rule}: ${a.count} element${a.count === 1 ? '' : 's'}`);
  for (const s of r.skipped) lines.push(`  not applied: ${s.rule}: ${s.reason}`);
  for (const n of r.notes) lines.push(`  note (${n.rule}): ${n.note}`);
  if (r.changed) {
    const src = text.startsWith('\ufeff') ? text.slice(1) : text;
    for (const l of formatHunks(changeHunks(src, r.edits))) lines.push(`  ${l}`);
    const s = r.stats;
    lines.push(
      `  ${s.hunks} hunk(s), ${s.linesRemoved} line(s) out, ${s.linesAdded} in, ${s.charsDelta >= 0 ? '+' : ''}${s.charsDelta} characters; ` +
        `data-ink share ${r.dataInk.before.toFixed(3)} → ${r.dataInk.after.toFixed(3)}; data marks verified: ${r.verification?.marksChecked ?? 0}` +
        (r.verification && r.verification.reprojected > 0 ? `, redrawn at true shares: ${r.verification.reprojected}` : ''),
    );
  }
  return lines.join('\n') + '\n';
}

export async function runRedraw(paths: string[], opts: Record<string, string | boolean | undefined>): Promise<number> {
  const outDir = typeof opts.outDir === 'string' ? opts.outDir : undefined;
  if (opts.outDir === true || outDir === '') throw new UsageError('--out-dir needs a folder');
  const inPlace = opts.inPlace === true;
  const dryRun = opts.dryRun === true;
  if (outDir !== undefined && inPlace) throw new UsageError('give either --out-dir DIR or --in-place, not both');
  if (!dryRun && outDir === undefined && !inPlace) throw new UsageError('say where the redrawn files go: --out-dir DIR or --in-place (or look first with --dry-run)');
  const only = parseOnly(opts.only);
  let config: Config;
  try {
    config = loadConfig(typeof opts.config === 'string' ? opts.config : undefined);
  } catch (err) {
    if (err instanceof ConfigError) throw new UsageError(err.message);
    throw err;
  }
  const shard = parseShard(opts.shard);
  const quiet = opts.quiet === true;
  const files = await selectFiles(paths, config, shard);

  // Output paths, refusing collisions and writes onto inputs.
  const targets = new Map<string, string>();
  const claimed = new Map<string, string>();
  const planned = new Map<string, string>();
  for (const f of files) {
    if (!outDir || dryRun) continue;
    const out = outputPathFor(f, outDir);
    const key = resolve(out);
    if (key === resolve(f)) {
      planned.set(f, `its --out-dir copy would overwrite the input itself; use --in-place to replace inputs`);
      continue;
    }
    const other = claimed.get(key);
    if (other) {
      planned.set(f, `its output ${out} is also the output of ${other}`);
      continue;
    }
    claimed.set(key, f);
    targets.set(f, out);
  }
  const inputs = new Set(files.map((f) => resolve(f)));

  let failed = 0;
  for (const file of files) {
    const refused = planned.get(file);
    if (refused) {
      process.stderr.write(`plumbline: ${file}: not redrawn: ${refused}\n`);
      failed++;
      continue;
    }
    try {
      const info = await stat(file);
      if (!info.isFile()) throw new RedrawInputError('not a regular file', null, null);
      if (info.size > DEFAULT_LIMITS.maxChars) throw new RedrawInputError(`file is larger than the ${DEFAULT_LIMITS.maxChars}-byte limit (${info.size} bytes)`, null, null);
      const bytes = await readFile(file);
      const enc = encodingOf(bytes);
      const text = decodeSvgBytes(bytes, file);
      const result = redrawText(text, file, { only, config });
      if (dryRun) {
        process.stdout.write(dryRunReport(file, text, result));
        continue;
      }
      if (inPlace) {
        if (result.changed) await writeFileAtomic(file, encode(result.output, enc));
      } else {
        const out = targets.get(file)!;
        if (inputs.has(resolve(out))) throw new Error(`its output ${out} is another input file; refusing to overwrite an input without --in-place`);
        await writeFileAtomic(out, encode(result.output, enc));
      }
      if (!quiet) {
        const where = inPlace ? (result.changed ? 'rewritten' : 'unchanged') : `→ ${targets.get(file)}`;
        process.stderr.write(`plumbline: ${file}: ${appliedText(result)} ${where}\n`);
        for (const s of result.skipped) process.stderr.write(`  not applied: ${s.rule}: ${s.reason}\n`);
      }
    } catch (err) {
      failed++;
      process.stderr.write(`plumbline: ${file}: ${describeError(err)}\n`);
    }
  }
  return failed > 0 ? 1 : 0;
}
