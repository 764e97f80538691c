/**
 * Delivery keys: the identity of one notification in the nudge log, so that each nudge is
 * shown once however often the scheduler runs and however many times the app restarts.
 *
 * - checkin: once per (question, due instant) — a revision moves the instant, so the
 *   next check-in gets a fresh key.
 * - closing_soon and window_closed: once per (question, close) — changing the
 *   closing-soon hours does not repeat the warning; moving the close does.
 * - overdue: once per local day in the diary's zone while overdue, at the wall-clock time
 *   it first became overdue (not at midnight), so the reminder escalates daily.
 * - After a snooze ends, checkin, closing_soon and window_closed are shown once more (the
 *   key gains the snooze's end). Overdue needs no such mark: a snoozed overdue nudge is
 *   hidden, so that day's key is never recorded, and the next run after the snooze ends
 *   delivers it; if that day's reminder had already gone out, tomorrow's follows as usual.
 */
import type { Nudge, Snooze } from './plan';
import { addCalendarDays, toIso, wallTimeAt, wallTimeToInstant } from '../../shared/time';
import { dateLabel, dayNumber } from './local-days';

/**
 * The calendar date ("YYYY-MM-DD", in `timeZone`) of the latest daily repeat of
 * `overdueSince` — same wall-clock time, one calendar day apart — at or before `now`.
 */
export function overdueReminderDate(overdueSince: number, now: number, timeZone: string): string {
  const first = wallTimeAt(overdueSince, timeZone);
  let days = Math.max(0, dayNumber(wallTimeAt(now, timeZone)) - dayNumber(first));
  // Today's repeat may still be ahead of `now`; then yesterday's is the latest.
  if (days > 0 && wallTimeToInstant(addCalendarDays(first, days), timeZone) > now) days -= 1;
  return dateLabel(addCalendarDays(first, days));
}

/** End of the latest snooze of this nudge that ran out after it came due and by `now`. */
function endedSnooze(nudge: Nudge, snoozes: readonly Snooze[], now: number): number | null {
  let latest: number | null = null;
  for (const s of snoozes) {
    if (s.question_id !== nudge.question_id || s.kind !== nudge.kind) continue;
    if (s.until > nudge.due_at && s.until <= now && (latest === null || s.until > latest)) latest = s.until;
  }
  return latest;
}

/**
 * The log key for delivering `nudge` at `now`. `close` is the question's close (epoch ms);
 * `timeZone` is the diary's zone, in which overdue days are counted.
 */
export function deliveryKey(
  nudge: Nudge,
  close: number,
  timeZone: string,
  snoozes: readonly Snooze[],
  now: number,
): string {
  const q = nudge.question_id;
  if (nudge.kind === 'overdue') return `overdue|${q}|${overdueReminderDate(nudge.due_at, now, timeZone)}`;
  const base = nudge.kind === 'checkin' ? `checkin|${q}|${toIso(nudge.due_at)}` : `${nudge.kind}|${q}|${toIso(close)}`;
  const snoozeEnd = endedSnooze(nudge, snoozes, now);
  return snoozeEnd === null ? base : `${base}|after-snooze|${toIso(snoozeEnd)}`;
}
