/**
 * Turning instants into words and form values in a question's own time zone, and back.
 * The arithmetic lives in shared/time (RFC 5545 rules for repeated and skipped wall times).
 */
import { addCalendarDays, parseLocalDateTime, toIso, toLocalInputValue, wallTimeToInstant } from '../../shared/time';

/** The instant a datetime-local value means in `timeZone`, as an ISO string; null if incomplete. */
export function localToIso(local: string, timeZone: string): string | null {
  const wall = parseLocalDateTime(local);
  if (!wall) return null;
  return toIso(wallTimeToInstant(wall, timeZone));
}

/** The datetime-local value showing `iso` on `timeZone`'s clocks. */
export function isoToLocal(iso: string, timeZone: string): string {
  return toLocalInputValue(Date.parse(iso), timeZone);
}

const readable = new Map<string, Intl.DateTimeFormat>();

function readableFormat(timeZone: string, withZone: boolean): Intl.DateTimeFormat {
  const key = `${timeZone}|${withZone}`;
  let format = readable.get(key);
  if (!format) {
    format = new Intl.DateTimeFormat(undefined, {
      timeZone,
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
      ...(withZone ? { timeZoneName: 'short' } : {}),
    });
    readable.set(key, format);
  }
  return format;
}

/** e.g. "31 Mar 2026, 17:00 BST" — the instant as the question's own clocks show it. */
export function formatInstant(iso: string, timeZone: string, withZone = true): string {
  const ms = Date.parse(iso);
  if (!Number.isFinite(ms)) return iso;
  return readableFormat(timeZone, withZone).format(ms);
}

/** Every IANA zone this runtime knows, with the given ones (e.g. "UTC") guaranteed present. */
export function timeZoneNames(...mustInclude: string[]): string[] {
  let names: string[] = [];
  try {
    names = Intl.supportedValuesOf('timeZone');
  } catch {
    names = [];
  }
  const all = new Set([...names, 'UTC', ...mustInclude.filter(Boolean)]);
  return [...all].sort((a, b) => a.localeCompare(b));
}

/** The first instant of `date` ("YYYY-MM-DD") or its last millisecond, on `timeZone`'s clocks. */
function dayBound(date: string, timeZone: string, end: 'start' | 'end'): number | null {
  const wall = parseLocalDateTime(`${date}T00:00`);
  if (!wall) return null;
  if (end === 'start') return wallTimeToInstant(wall, timeZone);
  return wallTimeToInstant(addCalendarDays(wall, 1), timeZone) - 1;
}

export interface DayRange {
  /** ISO instants, or undefined when that end is open. */
  from?: string;
  to?: string;
  problems: { from?: string; to?: string };
}

/**
 * A From/To pair of whole days on the diary's clocks (the user thinks "windows that ended in
 * March", not "in March UTC") as the instants the API filters by: From's first instant, To's
 * last millisecond. Empty text leaves that end open.
 */
export function dayRange(fromText: string, toText: string, timeZone: string): DayRange {
  const problems: DayRange['problems'] = {};
  const from = fromText ? dayBound(fromText, timeZone, 'start') : null;
  const to = toText ? dayBound(toText, timeZone, 'end') : null;
  if (fromText && from === null) problems.from = 'must be a date';
  if (toText && to === null) problems.to = 'must be a date';
  if (from !== null && to !== null && to < from) problems.to = 'must not be before From';
  return { ...(from !== null ? { from: toIso(from) } : {}), ...(to !== null ? { to: toIso(to) } : {}), problems };
}
