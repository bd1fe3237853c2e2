/** Shared option parsing for the commands. */
import { UsageError } from './usage-error.js';
import type { FailOn } from '../report/totals.js';

export function parseJobs(v: string | boolean | undefined, fallback: number): number {
  if (v === undefined || typeof v === 'boolean') return fallback;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1 || n > 256) throw new UsageError(`--jobs must be a whole number from 1 to 256, got ${v}`);
  return n;
}

export function parseShard(v: string | boolean | undefined): { k: number; n: number } | null {
  if (v === undefined || typeof v === 'boolean') return null;
  const m = /^(\d+)\/(\d+)$/.exec(v);
  if (!m) throw new UsageError(`--shard must look like K/N (for example 2/4), got ${v}`);
  const k = Number(m[1]);
  const n = Number(m[2]);
  if (n < 1 || k < 1 || k > n) throw new UsageError(`--shard ${v}: K must be between 1 and N`);
  return { k, n };
}

export function parseFailOn(v: string | boolean | undefined): FailOn {
  if (v === 'error' || v === 'warning' || v === 'note' || v === 'never') return v;
  return 'error';
}
