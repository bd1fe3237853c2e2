/**
 * Configuration: `plumbline.config.json`, found from the working directory up
 * (or given with --config).
 *
 * {
 *   "rules": { "ink.heavy-grid": "off", "text.too-small": { "severity": "error", "minPx": 9 } },
 *   "ignore": ["vendor/**"],
 *   "displayWidth": 640
 * }
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import type { Severity } from '../report/types.js';

export interface RuleSetting {
  severity?: Severity | 'off';
  thresholds?: Record<string, number>;
}

export interface Config {
  rules: Record<string, RuleSetting>;
  ignore: string[];
  /** Intended display width in CSS px; figures are judged as if shown this wide. */
  displayWidth: number | null;
  /** Where the config came from (null: defaults). */
  path: string | null;
}

export const DEFAULT_CONFIG: Config = { rules: {}, ignore: [], displayWidth: null, path: null };

export class ConfigError extends Error {}

export function findConfig(start: string = process.cwd()): string | null {
  let dir = resolve(start);
  for (;;) {
    const p = join(dir, 'plumbline.config.json');
    if (existsSync(p)) return p;
    const up = dirname(dir);
    if (up === dir) return null;
    dir = up;
  }
}

export function loadConfig(path: string | null | undefined): Config {
  const file = path ?? findConfig();
  if (!file) return DEFAULT_CONFIG;
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(file, 'utf8'));
  } catch (err) {
    throw new ConfigError(`cannot read config ${file}: ${(err as Error).message}`);
  }
  return parseConfig(raw, file);
}

const SEVERITIES = new Set(['error', 'warning', 'note', 'off']);

export function parseConfig(raw: unknown, path: string | null = null): Config {
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) throw new ConfigError('config must be a JSON object');
  const o = raw as Record<string, unknown>;
  const rules: Record<string, RuleSetting> = {};
  if (o.rules !== undefined) {
    if (!o.rules || typeof o.rules !== 'object') throw new ConfigError('"rules" must be an object');
    for (const [id, v] of Object.entries(o.rules as Record<string, unknown>)) {
      if (typeof v === 'string') {
        if (!SEVERITIES.has(v)) throw new ConfigError(`rule ${id}: severity must be error, warning, note or off`);
        rules[id] = { severity: v as RuleSetting['severity'] };
      } else if (v && typeof v === 'object') {
        const { severity, ...rest } = v as Record<string, unknown>;
        if (severity !== undefined && (typeof severity !== 'string' || !SEVERITIES.has(severity))) throw new ConfigError(`rule ${id}: bad severity`);
        const thresholds: Record<string, number> = {};
        for (const [k, n] of Object.entries(rest)) {
          if (typeof n !== 'number' || !Number.isFinite(n)) throw new ConfigError(`rule ${id}: threshold ${k} must be a number`);
          thresholds[k] = n;
        }
        rules[id] = { severity: severity as RuleSetting['severity'], thresholds };
      } else throw new ConfigError(`rule ${id}: expected a severity string or an object`);
    }
  }
  const ignore = Array.isArray(o.ignore) ? o.ignore.filter((x): x is string => typeof x === 'string') : [];
  const displayWidth = typeof o.displayWidth === 'number' && o.displayWidth > 0 ? o.displayWidth : null;
  return { rules, ignore, displayWidth, path };
}
