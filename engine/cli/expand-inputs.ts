/**
 * Turns command-line inputs (files, directories, globs) into a sorted list of
 * SVG paths, as given: relative inputs stay relative.
 */
import { stat } from 'node:fs/promises';
import { glob, isDynamicPattern } from 'tinyglobby';

export interface ExpandedInputs {
  files: string[];
  /** Inputs that matched nothing (missing paths, empty globs). */
  unmatched: string[];
}

export async function expandInputs(inputs: readonly string[], cwd = process.cwd()): Promise<ExpandedInputs> {
  const files = new Set<string>();
  const unmatched: string[] = [];
  for (const input of inputs) {
    const info = await stat(resolveIn(cwd, input)).catch(() => null);
    let found: string[] = [];
    if (info?.isDirectory()) {
      const base = input.replace(/\/+$/, '') || '.';
      found = (await glob('**/*.svg', { cwd: resolveIn(cwd, base), onlyFiles: true, dot: false, followSymbolicLinks: false }))
        .map((p) => (base === '.' ? p : `${base}/${p}`));
    } else if (info?.isFile()) {
      found = [input];
    } else if (isDynamicPattern(input)) {
      found = await glob(input, { cwd, onlyFiles: true, dot: false, followSymbolicLinks: false, expandDirectories: false });
    }
    if (found.length === 0) unmatched.push(input);
    for (const f of found) files.add(f);
  }
  return { files: [...files].sort(compareCodeUnits), unmatched };
}

function resolveIn(cwd: string, p: string): string {
  return p.startsWith('/') ? p : `${cwd}/${p}`;
}

function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
