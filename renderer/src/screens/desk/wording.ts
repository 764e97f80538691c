/**
 * Why a Desk item is due, in plain words with the time on the question's own clocks:
 * "Closed 2 days ago, Tue 17:00 GMT+1", "Closes tomorrow 17:00 GMT+1, in 20 hours",
 * "Check-in due since Thu". Days are counted on the question's calendar, so "tomorrow"
 * means tomorrow where the deadline is.
 */
import { dayWord, formatClock, formatNearby, plural } from '../../dates';

const MINUTE_MS = 60_000;
const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

// "today", "tomorrow", a weekday or a date, and "17:00": dates.ts writes every date in the window.
export { dayWord, formatClock as clockTime };

/** A length of time in the largest whole unit: "45 minutes", "5 hours", "2 days". */
export function duration(ms: number): string {
  const span = Math.max(0, ms);
  if (span < HOUR_MS) return plural(Math.max(1, Math.floor(span / MINUTE_MS)), 'minute');
  if (span < DAY_MS) return plural(Math.floor(span / HOUR_MS), 'hour');
  return plural(Math.floor(span / DAY_MS), 'day');
}

/** "just now" or "3 hours ago". */
export function ago(ms: number, now: number): string {
  return now - ms < MINUTE_MS ? 'just now' : `${duration(now - ms)} ago`;
}

export function closedPhrase(closesAt: number, now: number, timeZone: string): string {
  return `Closed ${ago(closesAt, now)}, ${formatNearby(closesAt, now, timeZone)}`;
}

export function closingPhrase(closesAt: number, now: number, timeZone: string): string {
  const left = closesAt - now < MINUTE_MS ? 'in under a minute' : `in ${duration(closesAt - now)}`;
  return `Closes ${formatNearby(closesAt, now, timeZone)}, ${left}`;
}

/** Today's check-in names its time; an older one its day. */
export function checkinPhrase(dueAt: number, now: number, timeZone: string): string {
  const day = dayWord(dueAt, now, timeZone);
  return day === 'today' ? `Check-in due since ${formatClock(dueAt, timeZone)} today` : `Check-in due since ${day}`;
}

/** How long past the "overdue after" line a closed question has gone unresolved. */
export function overduePhrase(overdueSince: number, now: number): string {
  return `Overdue by ${duration(now - overdueSince)}`;
}
