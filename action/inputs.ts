/** The action's inputs, read from the environment the runner sets, checked. */
import * as core from '@actions/core';
import type { FailOn } from '../engine/report/totals.js';

export interface ActionInputs {
  /** Glob patterns (one per line); `!pattern` excludes. */
  files: string[];
  failOn: FailOn;
  comment: boolean;
  suggestRedraw: boolean;
  token: string;
  outputDir: string;
}

export class InputError extends Error {
  override readonly name = 'InputError';
}

/**
 * An input's value. JavaScript actions get `INPUT_<NAME>` with the name upper-cased
 * and spaces as underscores (hyphens kept); a composite step may pass hyphens as
 * underscores, so that spelling is read too.
 */
export function readInput(name: string, env: NodeJS.ProcessEnv = process.env): string {
  const viaCore = core.getInput(name);
  if (viaCore !== '') return viaCore;
  const alt = `INPUT_${name.replace(/[ -]/g, '_').toUpperCase()}`;
  return (env[alt] ?? '').trim();
}

function booleanInput(name: string, fallback: boolean): boolean {
  const v = readInput(name);
  if (v === '') return fallback;
  if (/^(true|yes|on|1)$/i.test(v)) return true;
  if (/^(false|no|off|0)$/i.test(v)) return false;
  throw new InputError(`input "${name}" must be true or false, got "${v}"`);
}

export function readInputs(): ActionInputs {
  const files = readInput('files')
    .split(/\r?\n/)
    .map((s) => s.trim())
    .filter((s) => s !== '' && !s.startsWith('#'));
  const failOn = readInput('fail-on') || 'error';
  if (failOn !== 'error' && failOn !== 'warning' && failOn !== 'note' && failOn !== 'never') {
    throw new InputError(`input "fail-on" must be error, warning, note or never, got "${failOn}"`);
  }
  const outputDir = readInput('output-dir') || 'plumbline-report';
  if (outputDir.split(/[\\/]/).includes('..')) throw new InputError(`input "output-dir" must stay inside the workspace, got "${outputDir}"`);
  const token = readInput('token');
  if (token) core.setSecret(token);
  return {
    files: files.length > 0 ? files : ['**/*.svg'],
    failOn,
    comment: booleanInput('comment', true),
    suggestRedraw: booleanInput('suggest-redraw', true),
    token,
    outputDir,
  };
}
