/**
 * Completing date labels that leave out larger calendar fields.
 *
 * Time axes commonly print the larger unit only where it changes: `2014,
 * April, July, October, 2015, April …` or `Mar 30, Apr 6, 13, 20` or
 * `22:00, 00:00, 02:00`. Read in axis order, each partial label takes its
 * missing fields from its neighbour and is moved forward (or, before the
 * first label that states a year, backward) by whole units of the lowest
 * missing field until the sequence strictly increases.
 */
import { msFromParts } from './parse-date-label.js';
import type { DateParts } from './tick-types.js';

const FIELDS = ['year', 'month', 'day', 'hour', 'minute', 'second', 'millisecond'] as const;
type Field = (typeof FIELDS)[number];

/** Values a missing field takes when nothing else is known. */
const EPOCH: Required<DateParts> = { year: 1970, month: 1, day: 1, hour: 0, minute: 0, second: 0, millisecond: 0 };

/** Bound on the steps a single label may be moved (a year of days, a day of minutes …). */
const MAX_STEPS = 1500;

/** Fields above the largest one the label states. */
function missingFields(p: DateParts): Field[] {
  const first = FIELDS.findIndex((f) => p[f] !== undefined);
  return first <= 0 ? [] : FIELDS.slice(0, first);
}

function fullParts(ms: number): Required<DateParts> {
  const d = new Date(ms);
  return {
    year: d.getUTCFullYear(),
    month: d.getUTCMonth() + 1,
    day: d.getUTCDate(),
    hour: d.getUTCHours(),
    minute: d.getUTCMinutes(),
    second: d.getUTCSeconds(),
    millisecond: d.getUTCMilliseconds(),
  };
}

function combine(context: Required<DateParts>, stated: DateParts, missing: Field[]): DateParts {
  const out: DateParts = { ...stated };
  for (const f of missing) out[f] = context[f];
  return out;
}

/** Exact fit: the composed fields must survive a round trip through the calendar (no 31 April). */
function exactMs(p: DateParts): number | null {
  const ms = msFromParts(p);
  // 24:00 is the end of the stated day (ISO 8601): compare the other fields against the day before.
  const endOfDay = p.hour === 24;
  const back = fullParts(endOfDay ? ms - 86_400_000 : ms);
  for (const f of FIELDS) {
    const v = p[f];
    if (v === undefined || (endOfDay && f === 'hour')) continue;
    if (back[f] !== v) return null;
  }
  return ms;
}

/** Move the missing fields by one unit of the lowest of them. */
function step(p: DateParts, missing: Field[], dir: 1 | -1): DateParts {
  const lowest = missing[missing.length - 1];
  const probe: DateParts = {};
  for (const f of missing) probe[f] = p[f];
  // Day-of-month moves need a valid day to step from; keep the probe on day 1 when the day itself is stated.
  const base = new Date(msFromParts({ ...EPOCH, ...probe, ...(missing.includes('day') ? {} : { day: 1 }) }));
  switch (lowest) {
    case 'year':
      base.setUTCFullYear(base.getUTCFullYear() + dir);
      break;
    case 'month':
      base.setUTCMonth(base.getUTCMonth() + dir);
      break;
    case 'day':
      base.setUTCDate(base.getUTCDate() + dir);
      break;
    case 'hour':
      base.setUTCHours(base.getUTCHours() + dir);
      break;
    case 'minute':
      base.setUTCMinutes(base.getUTCMinutes() + dir);
      break;
    case 'second':
      base.setUTCSeconds(base.getUTCSeconds() + dir);
      break;
    case 'millisecond':
      base.setUTCMilliseconds(base.getUTCMilliseconds() + dir);
      break;
  }
  const moved = fullParts(base.getTime());
  const out: DateParts = { ...p };
  for (const f of missing) out[f] = moved[f];
  return out;
}

function resolveRelative(stated: DateParts, neighbour: number, dir: 1 | -1): number | null {
  const missing = missingFields(stated);
  if (missing.length === 0) return exactMs(stated);
  let cand = combine(fullParts(neighbour), stated, missing);
  for (let i = 0; i < MAX_STEPS; i++) {
    const ms = exactMs(cand);
    if (ms !== null && (dir === 1 ? ms > neighbour : ms < neighbour)) return ms;
    cand = step(cand, missing, dir);
  }
  return null;
}

/**
 * Epoch milliseconds for labels given in axis order, with missing fields
 * filled so the sequence strictly increases; null when that is impossible.
 * Labels that state no year anywhere are placed from 1970-01-01.
 */
export function fillDateSequence(parts: readonly DateParts[]): number[] | null {
  if (parts.length === 0) return [];
  const out: (number | null)[] = parts.map(() => null);
  let anchor = parts.findIndex((p) => p.year !== undefined);
  if (anchor < 0) {
    anchor = 0;
    out[0] = exactMs(combine(EPOCH, parts[0], missingFields(parts[0])));
  } else {
    out[anchor] = exactMs(parts[anchor]);
  }
  if (out[anchor] === null) return null;
  for (let i = anchor + 1; i < parts.length; i++) {
    const prev = out[i - 1] as number;
    out[i] = parts[i].year !== undefined ? exactMs(parts[i]) : resolveRelative(parts[i], prev, 1);
    if (out[i] === null) return null;
  }
  for (let i = anchor - 1; i >= 0; i--) {
    const next = out[i + 1] as number;
    out[i] = resolveRelative(parts[i], next, -1);
    if (out[i] === null) return null;
  }
  const result = out as number[];
  for (let i = 1; i < result.length; i++) if (!(result[i] > result[i - 1])) return null;
  return result;
}
