/**
 * Grammar for date and time tick labels.
 *
 * Forms read (English month and weekday names only):
 * - ISO 8601 calendar dates and times: `2024-03`, `2024-03-15`,
 *   `2024-03-15T12:00`, `2024-03-15 12:00:30Z`, `2024-03-15T12:00+02:00`
 *   (source: ISO 8601-1:2019, extended format calendar date, time of day and UTC offset).
 * - Year-first with `/` or `.`: `2024/03/15`.
 * - Numeric day/month/year: `15/03/2024`, `03/15/2024`, `15.03.2024`,
 *   `03/15/24`; `mm/yyyy`. A dotted form is day-first; with `/` or `-` the
 *   order is decided by a number above 12, else `dayFirst` (default month-first).
 * - Month names and abbreviations: `Jan`, `January`, `Sept.`, `Jan 2024`,
 *   `January, 2024`, `Jan '24`, `Jan-24` (two-digit year), `2024 Jan`,
 *   `Mar 15`, `Mar 15, 2024`, `15 Mar`, `15-Mar-2024`, `15th March 2024`.
 *   `Mar 24` (space) is month-day; `Mar-24` (hyphen) is month-year.
 * - Quarters with a year: `Q1 2024`, `2024 Q1`, `2024-Q1`. A bare `Q1` stays a category.
 * - Times: `12:00`, `12:00:30`, `3:15 PM`, `12 PM`, `03 AM`, `:30` (seconds).
 * - A leading weekday is dropped when more follows (`Fri 03` → day 3,
 *   `Mon, Mar 15`); a weekday alone is a category.
 * Two-digit years: 69–99 → 1900s, 00–68 → 2000s (source: POSIX strptime `%y`).
 * Labels carry no time zone unless ISO 8601 writes one; they are read as UTC.
 */
import type { DateGranularity, DateParts, DateTick, ParseOptions } from './tick-types.js';

const MONTHS: ReadonlyArray<readonly string[]> = [
  ['jan', 'january'],
  ['feb', 'february'],
  ['mar', 'march'],
  ['apr', 'april'],
  ['may'],
  ['jun', 'june'],
  ['jul', 'july'],
  ['aug', 'august'],
  ['sep', 'sept', 'september'],
  ['oct', 'october'],
  ['nov', 'november'],
  ['dec', 'december'],
];
const MONTH_INDEX = new Map<string, number>();
MONTHS.forEach((names, i) => names.forEach((n) => MONTH_INDEX.set(n, i + 1)));
const MONTH_ALT = [...MONTH_INDEX.keys()].sort((a, b) => b.length - a.length).join('|');
const M = `(${MONTH_ALT})\\.?`;

const WEEKDAY = '(?:mon|monday|tue|tues|tuesday|wed|weds|wednesday|thu|thur|thurs|thursday|fri|friday|sat|saturday|sun|sunday)\\.?';
const WEEKDAY_PREFIX = new RegExp(`^${WEEKDAY},? (?=\\S)`, 'i');

const ORD = '(?:st|nd|rd|th)?';

function re(src: string): RegExp {
  return new RegExp(`^${src}$`, 'i');
}

const RX = {
  iso: /^(\d{4})-(\d{1,2})(?:-(\d{1,2})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(?: ?(Z|[+-]\d{2}(?::?\d{2})?))?)?)?$/i,
  ymdSep: /^(\d{4})([/.])(\d{1,2})\2(\d{1,2})$/,
  numericDate: /^(\d{1,2})([/.-])(\d{1,2})\2(\d{4}|\d{2})$/,
  monthSlashYear: /^(\d{1,2})\/(\d{4})$/,
  month: re(M),
  monthYear: re(`${M},? (\\d{4})`),
  monthApostropheYear: re(`${M} ?['’](\\d{2})`),
  monthDashYear: re(`${M}-(\\d{2}|\\d{4})`),
  yearMonth: re(`(\\d{4})[ -]${M}`),
  monthDay: re(`${M} (\\d{1,2})${ORD}(?:,? (\\d{4}))?`),
  dayMonth: re(`(\\d{1,2})${ORD}[ -]${M}(?:[ ,-]+(\\d{4}|\\d{2}))?`),
  quarterYear: /^Q([1-4])[ -]?(\d{4})$/i,
  yearQuarter: /^(\d{4})[ -]?Q([1-4])$/i,
  time: /^(\d{1,2}):(\d{2})(?::(\d{2})(?:\.(\d{1,3}))?)?(?: ?([AP])\.?M\.?)?$/i,
  hourMeridiem: /^(\d{1,2}) ?([AP])\.?M\.?$/i,
  secondsOnly: /^:(\d{2})$/,
};

/** Expand a two-digit year (source: POSIX strptime `%y`). */
function expandYear(text: string): number {
  const y = Number(text);
  if (text.length !== 2) return y;
  return y >= 69 ? 1900 + y : 2000 + y;
}

function daysInMonth(year: number | undefined, month: number): number {
  // Without a year, allow 29 February.
  const y = year ?? 2000;
  return new Date(Date.UTC(y, month, 0)).getUTCDate();
}

function validParts(p: DateParts): boolean {
  if (p.month !== undefined && (p.month < 1 || p.month > 12)) return false;
  if (p.day !== undefined) {
    if (p.day < 1) return false;
    if (p.month !== undefined && p.day > daysInMonth(p.year, p.month)) return false;
    if (p.month === undefined && p.day > 31) return false;
  }
  if (p.hour !== undefined && (p.hour < 0 || p.hour > 24)) return false;
  if (p.minute !== undefined && (p.minute < 0 || p.minute > 59)) return false;
  if (p.second !== undefined && (p.second < 0 || p.second > 59)) return false;
  if (p.hour === 24 && ((p.minute ?? 0) !== 0 || (p.second ?? 0) !== 0)) return false;
  return true;
}

/** UTC epoch ms of the given fields; missing fields take their 1970-01-01T00:00:00Z values. */
export function msFromParts(p: DateParts): number {
  const d = new Date(0);
  d.setUTCFullYear(p.year ?? 1970, (p.month ?? 1) - 1, p.day ?? 1);
  d.setUTCHours(p.hour ?? 0, p.minute ?? 0, p.second ?? 0, p.millisecond ?? 0);
  return d.getTime();
}

function granularityOf(p: DateParts, quarter: boolean): DateGranularity {
  if (p.second !== undefined || p.millisecond !== undefined) return 'second';
  if (p.minute !== undefined) return 'minute';
  if (p.hour !== undefined) return 'hour';
  if (p.day !== undefined) return 'day';
  if (quarter) return 'quarter';
  if (p.month !== undefined) return 'month';
  return 'year';
}

function hour12(h: number, meridiem: string): number | null {
  if (h < 1 || h > 12) return null;
  const pm = meridiem.toUpperCase() === 'P';
  if (h === 12) return pm ? 12 : 0;
  return pm ? h + 12 : h;
}

interface Extra {
  quarter?: boolean;
  offsetMinutes?: number;
  ambiguousOrder?: boolean;
  orderEvidence?: 'day-first' | 'month-first';
}

function build(text: string, parts: DateParts, extra: Extra = {}): DateTick | null {
  const clean: DateParts = {};
  for (const key of ['year', 'month', 'day', 'hour', 'minute', 'second', 'millisecond'] as const) {
    if (parts[key] !== undefined) clean[key] = parts[key];
  }
  if (!validParts(clean)) return null;
  const ms = msFromParts(clean) - (extra.offsetMinutes ?? 0) * 60_000;
  if (!Number.isFinite(ms)) return null;
  const tick: DateTick = { kind: 'date', ms, granularity: granularityOf(clean, extra.quarter === true), parts: clean, text };
  if (extra.ambiguousOrder) tick.ambiguousOrder = true;
  if (extra.orderEvidence) tick.orderEvidence = extra.orderEvidence;
  return tick;
}

function monthOf(name: string): number {
  const m = MONTH_INDEX.get(name.toLowerCase());
  if (m === undefined) throw new Error(`internal: unknown month name ${name}`);
  return m;
}

function parseOffset(zone: string | undefined): number {
  if (!zone || zone.toUpperCase() === 'Z') return 0;
  const m = /^([+-])(\d{2}):?(\d{2})?$/.exec(zone);
  if (!m) return 0;
  const minutes = Number(m[2]) * 60 + Number(m[3] ?? 0);
  return m[1] === '-' ? -minutes : minutes;
}

/**
 * Read a normalised label (see `normalizeForParsing`) as a date or time, or
 * return null. `text` is the original label, kept on the result.
 */
export function parseDateLabel(norm: string, text: string, options: ParseOptions = {}): DateTick | null {
  let s = norm;
  let weekdayStripped = false;
  const wd = WEEKDAY_PREFIX.exec(s);
  if (wd) {
    s = s.slice(wd[0].length);
    weekdayStripped = true;
  }
  let m: RegExpExecArray | null;

  if (weekdayStripped && (m = /^(\d{1,2})$/.exec(s))) {
    return build(text, { day: Number(m[1]) });
  }
  if ((m = RX.iso.exec(s))) {
    const parts: DateParts = { year: Number(m[1]), month: Number(m[2]) };
    if (m[3] !== undefined) parts.day = Number(m[3]);
    if (m[4] !== undefined) {
      parts.hour = Number(m[4]);
      parts.minute = Number(m[5]);
    }
    if (m[6] !== undefined) parts.second = Number(m[6]);
    if (m[7] !== undefined) parts.millisecond = Number(m[7].slice(0, 3).padEnd(3, '0'));
    return build(text, parts, { offsetMinutes: parseOffset(m[8]) });
  }
  if ((m = RX.ymdSep.exec(s))) {
    return build(text, { year: Number(m[1]), month: Number(m[3]), day: Number(m[4]) });
  }
  if ((m = RX.numericDate.exec(s))) {
    const a = Number(m[1]);
    const b = Number(m[3]);
    const year = expandYear(m[4]);
    if (m[2] === '.') {
      return build(text, { year, month: b, day: a }, { orderEvidence: 'day-first' });
    }
    if (a > 12 && b <= 12) return build(text, { year, month: b, day: a }, { orderEvidence: 'day-first' });
    if (b > 12 && a <= 12) return build(text, { year, month: a, day: b }, { orderEvidence: 'month-first' });
    if (a > 12 && b > 12) return null;
    const dayFirst = options.dayFirst === true;
    const parts = dayFirst ? { year, month: b, day: a } : { year, month: a, day: b };
    return build(text, parts, { ambiguousOrder: options.dayFirst === undefined && a !== b });
  }
  if ((m = RX.monthSlashYear.exec(s))) {
    return build(text, { year: Number(m[2]), month: Number(m[1]) });
  }
  if ((m = RX.month.exec(s))) {
    return build(text, { month: monthOf(m[1]) });
  }
  if ((m = RX.monthYear.exec(s))) {
    return build(text, { year: Number(m[2]), month: monthOf(m[1]) });
  }
  if ((m = RX.monthApostropheYear.exec(s)) || (m = RX.monthDashYear.exec(s))) {
    return build(text, { year: expandYear(m[2]), month: monthOf(m[1]) });
  }
  if ((m = RX.yearMonth.exec(s))) {
    return build(text, { year: Number(m[1]), month: monthOf(m[2]) });
  }
  if ((m = RX.monthDay.exec(s))) {
    const parts: DateParts = { month: monthOf(m[1]), day: Number(m[2]) };
    if (m[3] !== undefined) parts.year = Number(m[3]);
    return build(text, parts);
  }
  if ((m = RX.dayMonth.exec(s))) {
    const parts: DateParts = { month: monthOf(m[2]), day: Number(m[1]) };
    if (m[3] !== undefined) parts.year = expandYear(m[3]);
    return build(text, parts);
  }
  if ((m = RX.quarterYear.exec(s))) {
    return build(text, { year: Number(m[2]), month: Number(m[1]) * 3 - 2 }, { quarter: true });
  }
  if ((m = RX.yearQuarter.exec(s))) {
    return build(text, { year: Number(m[1]), month: Number(m[2]) * 3 - 2 }, { quarter: true });
  }
  if ((m = RX.time.exec(s))) {
    let hour: number | null = Number(m[1]);
    if (m[5] !== undefined) hour = hour12(hour, m[5]);
    if (hour === null) return null;
    const parts: DateParts = { hour, minute: Number(m[2]) };
    if (m[3] !== undefined) parts.second = Number(m[3]);
    if (m[4] !== undefined) parts.millisecond = Number(m[4].padEnd(3, '0'));
    return build(text, parts);
  }
  if ((m = RX.hourMeridiem.exec(s))) {
    const hour = hour12(Number(m[1]), m[2]);
    if (hour === null) return null;
    return build(text, { hour });
  }
  if ((m = RX.secondsOnly.exec(s))) {
    return build(text, { second: Number(m[1]) });
  }
  return null;
}
