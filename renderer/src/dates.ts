/**
 * Turning instants into words and form values in a question's own time zone, and back.
 * The arithmetic lives in shared/time (RFC 5545 rules for repeated and skipped wall times).
 */
import { parseLocalDateTime, toIso, toLocalInputValue, wallTimeToInstant } from '../../shared/time';

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
