/**
 * Time-zone arithmetic on IANA zones using only `Intl` (no tz database of our own).
 *
 * Local wall-clock times are resolved to instants by RFC 5545 §3.3.5: a wall time that
 * occurs twice (the hour repeated when clocks go back) means its first occurrence; a
 * wall time in a gap (the hour skipped when clocks go forward) is read with the UTC
 * offset in force before the gap, which lands it that far after the gap's start.
 */

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      second: 'numeric',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

/** True when `timeZone` is an IANA zone name this runtime knows. */
export function isValidTimeZone(timeZone: string): boolean {
  if (typeof timeZone !== 'string' || timeZone.length === 0) return false;
  try {
    formatterFor(timeZone);
    return true;
  } catch {
    return false;
  }
}

let zoneNamesByLowerCase: Map<string, string> | undefined;

/**
 * The spelling of zone name `timeZone` a diary keeps, or null when this runtime knows no such
 * zone. Intl reads zone names in any case, so "europe/london" worked everywhere but was kept
 * as typed: shown so on every page and in every export, and not the name the zone picker
 * lists. A name that differs only in case from one the runtime lists, or from the runtime's
 * own name for it, takes that spelling ("Europe/London"); any other name is kept as given,
 * so an alias in its own spelling (US/Pacific, Asia/Kolkata) reads back exactly as written.
 */
export function zoneName(timeZone: string): string | null {
  if (!isValidTimeZone(timeZone)) return null;
  zoneNamesByLowerCase ??= new Map(Intl.supportedValuesOf('timeZone').map((name) => [name.toLowerCase(), name]));
  const listed = zoneNamesByLowerCase.get(timeZone.toLowerCase());
  if (listed !== undefined) return listed;
  const own = formatterFor(timeZone).resolvedOptions().timeZone;
  return own.toLowerCase() === timeZone.toLowerCase() ? own : timeZone;
}

/** The system's own zone, falling back to UTC. */
export function systemTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}

export interface WallTime {
  year: number;
  month: number; // 1–12
  day: number;
  hour: number;
  minute: number;
  second: number;
}

// How the en-US formatter above writes an instant: "1/4/2021, 00:05:07".
const FORMATTED_WALL_TIME = /^(\d+)\/(\d+)\/(\d+), (\d+):(\d+):(\d+)$/;

/**
 * The wall-clock reading in `timeZone` at instant `ms`. Read from the formatter's text,
 * which costs a fifth of its parts list (nudge planning shifts thousands of instants);
 * the parts are the answer whenever the text does not have the expected layout.
 */
export function wallTimeAt(ms: number, timeZone: string): WallTime {
  const formatter = formatterFor(timeZone);
  const m = FORMATTED_WALL_TIME.exec(formatter.format(ms));
  if (m) return { year: Number(m[3]), month: Number(m[1]), day: Number(m[2]), hour: Number(m[4]) % 24, minute: Number(m[5]), second: Number(m[6]) };
  const parts = formatter.formatToParts(new Date(ms));
  const get = (type: Intl.DateTimeFormatPartTypes): number =>
    Number(parts.find((p) => p.type === type)?.value ?? 0);
  return {
    year: get('year'),
    month: get('month'),
    day: get('day'),
    hour: get('hour') % 24,
    minute: get('minute'),
    second: get('second'),
  };
}

/**
 * UTC offset of `timeZone` at instant `ms`, in milliseconds east of UTC (whole seconds).
 * Not rounded to minutes: before standard time many zones kept local mean time, whose
 * offsets have seconds (Amsterdam +0:19:32 until 1937, Monrovia −0:44:30 until 1972), and
 * a wall time read with a rounded offset lands up to 30 seconds off.
 */
function offsetMsAt(ms: number, timeZone: string): number {
  const w = wallTimeAt(ms, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return asUtc - Math.floor(ms / 1000) * 1000;
}

const DAY_MS = 86_400_000;
/** Per zone, per UTC day number: the offset in force all that day, or NaN when it changes during the day. */
const steadyOffsets = new Map<string, Map<number, number>>();
const STEADY_DAYS_KEPT = 200_000;
let steadyDaysKept = 0;

/**
 * `offsetMsAt`, with the answer for a whole UTC day remembered when the zone's offset
 * is the same at the day's first and last second, i.e. when no transition falls in it (a
 * zone's clock changes at most once in a day). Turning wall times into instants asks three
 * or four offsets each, and planning a large diary's nudges turns thousands: most of them
 * fall on days already asked about. A day with a transition is answered exactly each time.
 */
function steadyOffsetMsAt(ms: number, timeZone: string): number {
  // A day's ends must be dates too: near the ends of the Date range (±8.64e15 ms) ask directly.
  if (!(Math.abs(ms) < 8.64e15 - 2 * DAY_MS)) return offsetMsAt(ms, timeZone);
  const day = Math.floor(ms / DAY_MS);
  let offset = steadyOffsets.get(timeZone)?.get(day);
  if (offset === undefined) {
    const first = offsetMsAt(day * DAY_MS, timeZone);
    offset = first === offsetMsAt(day * DAY_MS + DAY_MS - 1000, timeZone) ? first : NaN;
    // Bounded by starting afresh: a long-running app plans the same days again and again.
    if (steadyDaysKept >= STEADY_DAYS_KEPT) {
      steadyOffsets.clear();
      steadyDaysKept = 0;
    }
    let days = steadyOffsets.get(timeZone);
    if (days === undefined) {
      days = new Map();
      steadyOffsets.set(timeZone, days);
    }
    days.set(day, offset);
    steadyDaysKept++;
  }
  return Number.isNaN(offset) ? offsetMsAt(ms, timeZone) : offset;
}

/**
 * The instant at which `timeZone`'s clocks read `wall` (RFC 5545 §3.3.5 for repeated
 * and skipped wall times; see the module comment).
 */
export function wallTimeToInstant(wall: WallTime, timeZone: string): number {
  const naive = Date.UTC(wall.year, wall.month - 1, wall.day, wall.hour, wall.minute, wall.second);
  // Offsets a day either side bracket any single transition near this wall time.
  const before = steadyOffsetMsAt(naive - DAY_MS, timeZone);
  const after = steadyOffsetMsAt(naive + DAY_MS, timeZone);
  const candidates = [naive - before, naive - after].sort((a, b) => a - b);
  for (const t of candidates) {
    if (steadyOffsetMsAt(t, timeZone) === naive - t) return t; // first occurrence
  }
  // In a gap: read with the offset in force before it.
  return naive - before;
}

const LOCAL_RE = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2}))?$/;

/** Parses "YYYY-MM-DDTHH:MM[:SS]" (no offset) as a wall time; null when malformed. */
export function parseLocalDateTime(text: string): WallTime | null {
  const m = LOCAL_RE.exec(text.trim());
  if (!m) return null;
  const [year, month, day, hour, minute, second] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? '0'].map(Number) as [
    number, number, number, number, number, number,
  ];
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) return null;
  if (hour > 23 || minute > 59 || second > 59) return null;
  return { year, month, day, hour, minute, second };
}

export function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/**
 * The same wall-clock reading `days` calendar days later (earlier when negative), in the
 * proleptic Gregorian calendar: month lengths and leap days come from `Date.UTC`, so
 * 2028-02-28 + 1 is 2028-02-29 and 2027-02-28 + 1 is 2027-03-01. The time of day is kept;
 * turning the result into an instant (and handling a DST gap or repeat) is
 * `wallTimeToInstant`'s job.
 */
export function addCalendarDays(wall: WallTime, days: number): WallTime {
  // setUTCFullYear rather than Date.UTC: Date.UTC maps years 0–99 onto 1900–1999.
  const d = new Date(0);
  d.setUTCFullYear(wall.year, wall.month - 1, wall.day + days);
  return {
    year: d.getUTCFullYear(),
    month: d.getUTCMonth() + 1,
    day: d.getUTCDate(),
    hour: wall.hour,
    minute: wall.minute,
    second: wall.second,
  };
}

/** "YYYY-MM-DDTHH:MM" of instant `ms` in `timeZone` (the value an <input type=datetime-local> takes). */
export function toLocalInputValue(ms: number, timeZone: string): string {
  const w = wallTimeAt(ms, timeZone);
  const p = (n: number) => String(n).padStart(2, '0');
  return `${w.year}-${p(w.month)}-${p(w.day)}T${p(w.hour)}:${p(w.minute)}`;
}

/**
 * The instants Forelog accepts wherever a time comes in (the API, the diary file, CSV, the
 * command line's --at/--from/--to): from 1900-01-01T00:00:00Z up to, not including,
 * 2200-01-01T00:00:00Z. Why a range at all: an accepted instant must come back out
 * unchanged (ISO 8601's four-digit years end at 9999, so a year-10000 instant exported as
 * "+010000-…" and no longer re-imported), and the calendar arithmetic on it (check-ins,
 * overdue days, snoozes, the briefing's dates) must stay well inside four-digit years.
 * No real forecast needs more. Compare with `isInstantInRange`, never by hand.
 */
export const INSTANT_RANGE = {
  /** 1900-01-01T00:00:00.000Z, the first instant accepted. */
  earliest: Date.UTC(1900, 0, 1),
  /** 2200-01-01T00:00:00.000Z, the first instant refused after the range. */
  end: Date.UTC(2200, 0, 1),
} as const;

/** What a user reads when an instant falls outside `INSTANT_RANGE`. */
export const INSTANT_RANGE_RULE = 'must be between 1900 and 2199 (from 1900-01-01T00:00:00Z up to, not including, 2200-01-01T00:00:00Z)';

/** True when epoch-ms `ms` lies in `INSTANT_RANGE` (earliest included, end excluded). */
export function isInstantInRange(ms: number): boolean {
  return ms >= INSTANT_RANGE.earliest && ms < INSTANT_RANGE.end;
}

/**
 * Parses an ISO 8601 date-time that carries an offset or `Z` (as the diary file and the
 * API require); returns epoch ms or null. A bare date or a time without offset is
 * rejected here on purpose: it would be ambiguous. This reads the syntax only: whether
 * the instant is in `INSTANT_RANGE` is the validator's question (shared/validation.ts),
 * so stored times always read back.
 */
const ISO_INSTANT_RE =
  /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:?\d{2})$/i;

/**
 * An instant in the spelling `toIso` writes ("2026-03-31T16:00:00.000Z"), read by
 * arithmetic: the diary files hold millions of them, and this costs a fraction of the
 * general reading below. Checks the same things (digits, calendar date, 23:59:59 at most);
 * null for any other spelling, and for years before 1000, which the general reading takes.
 */
const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function parseCanonicalUtc(text: string): number | null {
  if (text.length !== 24 || text.charCodeAt(23) !== 90 /* Z */) return null;
  if (text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || text.charCodeAt(10) !== 84 /* - - T */) return null;
  if (text.charCodeAt(13) !== 58 || text.charCodeAt(16) !== 58 || text.charCodeAt(19) !== 46 /* : : . */) return null;
  const year = digitsAt(text, 0, 4);
  const month = digitsAt(text, 5, 7);
  const day = digitsAt(text, 8, 10);
  const hour = digitsAt(text, 11, 13);
  const minute = digitsAt(text, 14, 16);
  const second = digitsAt(text, 17, 19);
  const milli = digitsAt(text, 20, 23);
  if (year < 1000 || milli < 0 || month < 1 || month > 12 || day < 1) return null;
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  if (day > (month === 2 && leap ? 29 : MONTH_DAYS[month - 1]!)) return null;
  if (hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59) return null;
  return Date.UTC(year, month - 1, day, hour, minute, second, milli);
}

/** The decimal number written in text[from, to), or -1 when a character there is not a digit. */
function digitsAt(text: string, from: number, to: number): number {
  let n = 0;
  for (let i = from; i < to; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) return -1;
    n = n * 10 + d;
  }
  return n;
}

export function parseInstant(text: string): number | null {
  if (typeof text !== 'string') return null;
  const canonical = parseCanonicalUtc(text);
  if (canonical !== null) return canonical;
  const m = ISO_INSTANT_RE.exec(text.trim());
  if (!m) return null;
  const wall = parseLocalDateTime(`${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6] ?? '00'}`);
  if (!wall) return null;
  const ms = Date.parse(text.trim());
  return Number.isFinite(ms) ? ms : null;
}

/** Canonical form used across the API: ISO 8601 UTC with milliseconds. */
const ISO_DAY_MS = 86_400_000;
const TWO_DIGITS = Array.from({ length: 100 }, (_, i) => String(i).padStart(2, '0'));
const THREE_DIGITS = Array.from({ length: 1000 }, (_, i) => String(i).padStart(3, '0'));
/** "YYYY-MM-DDT" by day number: a diary's times fall on a few thousand days. */
const isoDates = new Map<number, string>();
const ISO_DATES_LIMIT = 100_000;

/** "YYYY-MM-DDT" of day number `day` (days since 1970-01-01), from toISOString once per day. */
function isoDate(day: number): string {
  let date = isoDates.get(day);
  if (date === undefined) {
    if (isoDates.size >= ISO_DATES_LIMIT) isoDates.clear();
    isoDates.set(day, (date = new Date(day * ISO_DAY_MS).toISOString().slice(0, -13)));
  }
  return date;
}

/**
 * `new Date(ms).toISOString()`, faster: exports and the due list write millions of times,
 * so the date part comes from toISOString once per day and the time of day is arithmetic.
 */
export function toIso(ms: number): string {
  if (!Number.isInteger(ms)) return new Date(ms).toISOString();
  const day = Math.floor(ms / ISO_DAY_MS);
  const t = ms - day * ISO_DAY_MS;
  return `${isoDate(day)}${TWO_DIGITS[Math.floor(t / 3_600_000)]}:${TWO_DIGITS[Math.floor(t / 60_000) % 60]}:${TWO_DIGITS[Math.floor(t / 1000) % 60]}.${THREE_DIGITS[t % 1000]}Z`;
}

/** The most room `writeIso` takes: a six-digit signed year's "+YYYYYY-MM-DDTHH:MM:SS.mmmZ". */
export const ISO_MAX_BYTES = 27;

const ZERO = 0x30;

let lastDay = NaN;
let lastDate = '';

/**
 * Writes toIso(ms) as ASCII bytes into `out` at `at` (which has ISO_MAX_BYTES of room) and
 * returns the position after it. Exports write millions of times, and bytes written in
 * place cost no string each, nor its encoding.
 */
export function writeIso(ms: number, out: Uint8Array, at: number): number {
  if (!Number.isInteger(ms)) {
    const text = new Date(ms).toISOString();
    for (let i = 0; i < text.length; i++) out[at++] = text.charCodeAt(i);
    return at;
  }
  const day = Math.floor(ms / ISO_DAY_MS);
  // A question's revisions often fall on one day: the last day's date without a lookup.
  if (day !== lastDay) {
    lastDate = isoDate(day);
    lastDay = day;
  }
  const date = lastDate;
  for (let i = 0; i < date.length; i++) out[at++] = date.charCodeAt(i);
  const t = ms - day * ISO_DAY_MS;
  const hours = Math.floor(t / 3_600_000);
  const minutes = Math.floor(t / 60_000) % 60;
  const seconds = Math.floor(t / 1000) % 60;
  const millis = t % 1000;
  out[at] = ZERO + Math.floor(hours / 10);
  out[at + 1] = ZERO + (hours % 10);
  out[at + 2] = 0x3a; // :
  out[at + 3] = ZERO + Math.floor(minutes / 10);
  out[at + 4] = ZERO + (minutes % 10);
  out[at + 5] = 0x3a;
  out[at + 6] = ZERO + Math.floor(seconds / 10);
  out[at + 7] = ZERO + (seconds % 10);
  out[at + 8] = 0x2e; // .
  out[at + 9] = ZERO + Math.floor(millis / 100);
  out[at + 10] = ZERO + (Math.floor(millis / 10) % 10);
  out[at + 11] = ZERO + (millis % 10);
  out[at + 12] = 0x5a; // Z
  return at + 13;
}

/** How a bare date is written: "2026-03-31". */
export const BARE_DATE_FORM = /^(\d{4})-(\d{2})-(\d{2})$/;

/**
 * How a date and time without offset is written: "2026-03-31T17:00", seconds optional, and
 * after them a fraction of up to nine digits as an instant may have ("17:00:00.250").
 */
export const LOCAL_DATE_TIME_FORM = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(\.\d{1,9})?)?$/;

/**
 * A date-range bound for filters: an ISO instant, or a bare date `YYYY-MM-DD` meaning that
 * whole day in UTC (start of the day for `from`, end of the day for `to`, both inclusive).
 */
export function parseRangeBound(text: string, end: 'from' | 'to'): number | null {
  const bare = BARE_DATE_FORM.exec(text.trim());
  if (bare) {
    const wall = parseLocalDateTime(`${bare[1]}-${bare[2]}-${bare[3]}T00:00`);
    if (!wall) return null;
    // setUTCFullYear rather than Date.UTC, which would read year 0099 as 1999.
    const start = new Date(0).setUTCFullYear(wall.year, wall.month - 1, wall.day);
    return end === 'from' ? start : start + 86_400_000 - 1;
  }
  return parseInstant(text);
}

/**
 * "YYYY-MM-DD HH:MM" of instant `ms` on `timeZone`'s clock, with ":SS" when the seconds are
 * not zero (a message about two times a few seconds apart must show them apart). The one
 * format for times written in sentences: refusals and the command line's `due`.
 */
export function formatLocal(ms: number, timeZone: string): string {
  const w = wallTimeAt(ms, timeZone);
  const p = (n: number) => String(n).padStart(2, '0');
  return `${w.year}-${p(w.month)}-${p(w.day)} ${p(w.hour)}:${p(w.minute)}${w.second ? `:${p(w.second)}` : ''}`;
}

/**
 * A date and time written without an offset ("2026-03-31T17:00", seconds and their fraction optional) read on
 * `timeZone`'s clock, as epoch ms (RFC 5545 §3.3.5 for skipped and repeated wall times);
 * null when `text` is not of that form. Text with an offset or `Z`, or a bare date, is not
 * this form: read it with parseInstant or parseRangeBound.
 */
export function parseLocalInZone(text: string, timeZone: string): number | null {
  const trimmed = text.trim();
  const form = LOCAL_DATE_TIME_FORM.exec(trimmed);
  if (!form) return null;
  // A fraction is read to the millisecond, cut as parseInstant cuts one (Date.parse): the
  // same time written with an offset lands on the same instant.
  const fraction = form[1] ?? '';
  const wall = parseLocalDateTime(trimmed.slice(0, trimmed.length - fraction.length));
  return wall ? wallTimeToInstant(wall, timeZone) + Number(`${fraction.slice(1)}000`.slice(0, 3)) : null;
}
