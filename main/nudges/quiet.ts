/**
 * Quiet hours: a daily stretch of the diary's local clock during which no notification is
 * shown. Nudges that come due meanwhile are held, not dropped, and go out at the first
 * run after the stretch ends.
 */
import type { QuietHours } from '../../shared/domain';
import { isValidTimeZone, wallTimeAt } from '../../shared/time';

const CLOCK_RE = /^([01]\d|2[0-3]):([0-5]\d)$/;

/** Minutes after midnight for "HH:MM" (00:00–23:59); null when malformed. */
export function parseClockTime(text: string): number | null {
  const m = CLOCK_RE.exec(text);
  return m ? Number(m[1]) * 60 + Number(m[2]) : null;
}

/**
 * True when `now` falls in the quiet stretch [start, end) read on the clocks of
 * `timeZone`. A start later than the end wraps past midnight (22:00–07:00). Equal start
 * and end is an empty stretch, as is a malformed time or zone: the service validates
 * settings on the way in, and an unreadable setting must not silence nudges for good.
 */
export function inQuietHours(now: number, quiet: QuietHours | null, timeZone: string): boolean {
  if (!quiet || !isValidTimeZone(timeZone)) return false;
  const start = parseClockTime(quiet.start);
  const end = parseClockTime(quiet.end);
  if (start === null || end === null || start === end) return false;
  const w = wallTimeAt(now, timeZone);
  const minute = w.hour * 60 + w.minute;
  return start < end ? minute >= start && minute < end : minute >= start || minute < end;
}
