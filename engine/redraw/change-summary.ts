/**
 * What a redraw changed, line by line, read straight from its edits: hunks of
 * old and new lines in the manner of a unified diff, with long lines (whole
 * charts written on one line are common) cut to a window around the change.
 */
import type { Edit } from './edit-list.js';

export interface Hunk {
  /** 1-based first line and line count, before and after. */
  oldStart: number;
  oldLines: string[];
  newStart: number;
  newLines: string[];
}

export interface ChangeStats {
  hunks: number;
  linesRemoved: number;
  linesAdded: number;
  /** Output length minus input length, in characters. */
  charsDelta: number;
  /** Characters replaced or inserted by the edits. */
  charsWritten: number;
  charsRemoved: number;
}

function lineStartsOf(text: string): number[] {
  const out = [0];
  for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) out.push(i + 1);
  return out;
}

/** Index (0-based) of the line holding offset `at`. */
function lineOf(starts: number[], at: number): number {
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid]! <= at) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

function splitLines(text: string): string[] {
  const lines = text.split('\n');
  return lines.map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l));
}

/** Hunks of a redraw, from its sorted, non-overlapping edits on `source`. */
export function changeHunks(source: string, edits: readonly Edit[]): Hunk[] {
  if (edits.length === 0) return [];
  const starts = lineStartsOf(source);
  const lineEnd = (k: number): number => (k + 1 < starts.length ? starts[k + 1]! - 1 : source.length);
  // Group edits whose lines touch.
  const groups: { first: number; last: number; edits: Edit[] }[] = [];
  for (const e of edits) {
    const first = lineOf(starts, e.start);
    const last = lineOf(starts, Math.max(e.start, e.end - (e.end > e.start ? 1 : 0)));
    const g = groups[groups.length - 1];
    if (g && first <= g.last) {
      g.last = Math.max(g.last, last);
      g.edits.push(e);
    } else groups.push({ first, last, edits: [e] });
  }
  const hunks: Hunk[] = [];
  let delta = 0;
  for (const g of groups) {
    const from = starts[g.first]!;
    const to = lineEnd(g.last);
    let text = '';
    let at = from;
    for (const e of g.edits) {
      text += source.slice(at, e.start) + e.text;
      at = e.end;
    }
    text += source.slice(at, Math.max(at, to));
    const oldLines = splitLines(source.slice(from, to));
    const newLines = text === '' ? [] : splitLines(text);
    hunks.push({ oldStart: g.first + 1, oldLines, newStart: g.first + 1 + delta, newLines });
    delta += newLines.length - oldLines.length;
  }
  return hunks;
}

export function changeStats(source: string, edits: readonly Edit[]): ChangeStats {
  const hunks = changeHunks(source, edits);
  let written = 0;
  let removed = 0;
  for (const e of edits) {
    written += e.text.length;
    removed += e.end - e.start;
  }
  return {
    hunks: hunks.length,
    linesRemoved: hunks.reduce((s, h) => s + h.oldLines.length, 0),
    linesAdded: hunks.reduce((s, h) => s + h.newLines.length, 0),
    charsDelta: written - removed,
    charsWritten: written,
    charsRemoved: removed,
  };
}

/** A line cut to about `width` characters around `focus` (the first differing column). */
function window(line: string, focus: number, width: number): string {
  if (line.length <= width) return line;
  const start = Math.max(0, Math.min(focus - Math.floor(width / 3), line.length - width));
  const end = Math.min(line.length, start + width);
  return `${start > 0 ? '…' : ''}${line.slice(start, end)}${end < line.length ? '…' : ''}`;
}

function firstDifference(a: string, b: string): number {
  const n = Math.min(a.length, b.length);
  let i = 0;
  while (i < n && a.charCodeAt(i) === b.charCodeAt(i)) i++;
  return i;
}

export interface SummaryOptions {
  /** Most hunks printed (the rest are counted). Default 12. */
  maxHunks?: number;
  /** Most characters shown of one line. Default 160. */
  width?: number;
}

/** The hunks as text, unified-diff style. */
export function formatHunks(hunks: readonly Hunk[], opts: SummaryOptions = {}): string[] {
  const maxHunks = opts.maxHunks ?? 12;
  const width = opts.width ?? 160;
  const out: string[] = [];
  for (const h of hunks.slice(0, maxHunks)) {
    out.push(`@@ -${h.oldStart},${h.oldLines.length} +${h.newStart},${h.newLines.length} @@`);
    const pairs = Math.max(h.oldLines.length, h.newLines.length);
    const minus: string[] = [];
    const plus: string[] = [];
    for (let k = 0; k < pairs; k++) {
      const a = h.oldLines[k];
      const b = h.newLines[k];
      const focus = a !== undefined && b !== undefined ? firstDifference(a, b) : 0;
      if (a !== undefined) minus.push(`-${window(a, focus, width)}`);
      if (b !== undefined) plus.push(`+${window(b, focus, width)}`);
    }
    out.push(...minus, ...plus);
  }
  if (hunks.length > maxHunks) out.push(`… and ${hunks.length - maxHunks} more hunk(s)`);
  return out;
}
