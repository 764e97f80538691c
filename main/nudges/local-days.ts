/**
 * Counting days on the user's own calendar (a zone's wall clock) rather than in 24-hour
 * blocks, so "once a day" and "closed 3 days ago" follow the dates the user sees even
 * when a DST change makes a day 23 or 25 hours long.
 */
import type { WallTime } from '../../shared/time';
import { wallTimeAt } from '../../shared/time';

/** Days since 1970-01-01 of the wall time's calendar date (its time of day is ignored). */
export function dayNumber(wall: WallTime): number {
  // setUTCFullYear rather than Date.UTC: Date.UTC maps years 0–99 onto 1900–1999.
  const d = new Date(0);
  d.setUTCFullYear(wall.year, wall.month - 1, wall.day);
  return Math.round(d.getTime() / 86_400_000);
}

/** Calendar days from the local date of `fromMs` to that of `toMs`, both read in `timeZone`. */
export function calendarDaysBetween(fromMs: number, toMs: number, timeZone: string): number {
  return dayNumber(wallTimeAt(toMs, timeZone)) - dayNumber(wallTimeAt(fromMs, timeZone));
}

/** "YYYY-MM-DD" of a wall time's calendar date. */
export function dateLabel(wall: WallTime): string {
  const p = (n: number, width: number) => String(n).padStart(width, '0');
  return `${p(wall.year, 4)}-${p(wall.month, 2)}-${p(wall.day, 2)}`;
}
