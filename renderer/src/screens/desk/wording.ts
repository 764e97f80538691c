/**
 * Why a Desk item is due, in plain words with the time on the question's own clocks:
 * "Closed 2 days ago, Tue 17:00 (Europe/London)", "Closes tomorrow 17:00 (Europe/London),
 * in 20 hours", "Check-in due since Thu". Days are counted on the question's calendar, so
 * "tomorrow" means tomorrow where the deadline is.
 */
import { wallTimeAt } from '../../../../shared/time';

const MINUTE_MS = 60_000;
const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

function plural(n: number, one: string): string {
  return `${n} ${n === 1 ? one : `${one}s`}`;
}

/** Calendar days from the date of `from` to the date of `to` on `timeZone`'s calendar (tomorrow = 1). */
function calendarDayDiff(from: number, to: number, timeZone: string): number {
  const a = wallTimeAt(from, timeZone);
  const b = wallTimeAt(to, timeZone);
  return Math.round((Date.UTC(b.year, b.month - 1, b.day) - Date.UTC(a.year, a.month - 1, a.day)) / DAY_MS);
}

const formats = new Map<string, Intl.DateTimeFormat>();

function format(timeZone: string, kind: 'weekday' | 'date' | 'date-year' | 'time'): Intl.DateTimeFormat {
  const key = `${timeZone}|${kind}`;
  let f = formats.get(key);
  if (!f) {
    const options: Intl.DateTimeFormatOptions =
      kind === 'weekday'
        ? { weekday: 'short' }
        : kind === 'time'
          ? // The diary writes times of day on a 24-hour clock (quiet hours are HH:MM too).
            { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }
          : { day: 'numeric', month: 'short', ...(kind === 'date-year' ? { year: 'numeric' } : {}) };
    f = new Intl.DateTimeFormat(undefined, { ...options, timeZone });
    formats.set(key, f);
  }
  return f;
}

/** "today", "tomorrow", "yesterday", a weekday within a week either side, else "26 Mar" (with the year if not this one). */
export function dayWord(ms: number, now: number, timeZone: string): string {
  const diff = calendarDayDiff(now, ms, timeZone);
  if (diff === 0) return 'today';
  if (diff === 1) return 'tomorrow';
  if (diff === -1) return 'yesterday';
  if (Math.abs(diff) < 7) return format(timeZone, 'weekday').format(ms);
  const sameYear = wallTimeAt(ms, timeZone).year === wallTimeAt(now, timeZone).year;
  return format(timeZone, sameYear ? 'date' : 'date-year').format(ms);
}

/** "17:00" on `timeZone`'s clocks. */
export function clockTime(ms: number, timeZone: string): string {
  return format(timeZone, 'time').format(ms);
}

export function zoneLabel(timeZone: string): string {
  return timeZone.replaceAll('_', ' ');
}

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

/** "tomorrow 17:00 (Europe/London)" */
function whenWithZone(ms: number, now: number, timeZone: string): string {
  return `${dayWord(ms, now, timeZone)} ${clockTime(ms, timeZone)} (${zoneLabel(timeZone)})`;
}

export function closedPhrase(closesAt: number, now: number, timeZone: string): string {
  return `Closed ${ago(closesAt, now)}, ${whenWithZone(closesAt, now, timeZone)}`;
}

export function closingPhrase(closesAt: number, now: number, timeZone: string): string {
  const left = closesAt - now < MINUTE_MS ? 'in under a minute' : `in ${duration(closesAt - now)}`;
  return `Closes ${whenWithZone(closesAt, now, timeZone)}, ${left}`;
}

/** Today's check-in names its time; an older one its day. */
export function checkinPhrase(dueAt: number, now: number, timeZone: string): string {
  const day = dayWord(dueAt, now, timeZone);
  return day === 'today' ? `Check-in due since ${clockTime(dueAt, timeZone)} today` : `Check-in due since ${day}`;
}

/** How long past the "overdue after" line a closed question has gone unresolved. */
export function overduePhrase(overdueSince: number, now: number): string {
  return `Overdue by ${duration(now - overdueSince)}`;
}
