/**
 * Nudge planning: which reminders are due for the diary at one instant. Pure — the clock,
 * the questions, the settings and the snoozes all come in as arguments — so the same
 * answer feeds the scheduler's notifications, `forelog due` and the Desk list.
 *
 * Rules, for unresolved questions only (a resolved or void question gets nothing):
 * - checkin: `checkin_days` (the question's, else the diary default; 0 = never) calendar
 *   days after the latest revision — or after the opening when there is none — at the
 *   same wall-clock time in the question's time zone. A wall time that falls in a DST gap
 *   or repeat is resolved by RFC 5545 §3.3.5 (see shared/time.ts). It stays due until the
 *   user revises (the next one counts from the new revision) and is shown only while the
 *   window is still open; a check-in falling at or after the close is never planned.
 * - closing_soon: from `closing_soon_hours` before the close until the close.
 * - window_closed: from the close until `overdue_after_days` calendar days after it (same
 *   wall-clock time in the question's zone, as for check-ins, so "3 days" means three
 *   days on the user's calendar even across a DST change).
 * - overdue: from then on, until resolved.
 * A snooze hides its (question, kind) nudge while `until` is in the future.
 */
import { NUDGE_KINDS, type NudgeKind, type Question, type Settings } from '../../shared/domain';
import { addCalendarDays, isValidTimeZone, parseInstant, wallTimeAt, wallTimeToInstant } from '../../shared/time';

export { NUDGE_KINDS, type NudgeKind };

export interface Nudge {
  question_id: string;
  title: string;
  kind: NudgeKind;
  /** Epoch ms at which it became due: the check-in instant, close − hours, close, or close + overdue days. */
  due_at: number;
}

/** The user asked not to see this (question, kind) nudge before `until` (epoch ms). */
export interface Snooze {
  question_id: string;
  kind: NudgeKind;
  until: number;
}

const HOUR_MS = 3_600_000;

/** The zone a question's nudges are placed in: its own, else the diary's, else UTC. */
export function nudgeTimeZone(question: Question, settings: Settings): string {
  if (isValidTimeZone(question.time_zone)) return question.time_zone;
  if (isValidTimeZone(settings.time_zone)) return settings.time_zone;
  return 'UTC';
}

// The scheduler re-plans every minute from the same anchors, and each shift costs several
// Intl formatting calls (tens of µs each); the answer depends only on the arguments (the
// runtime's tz data is fixed for the process), so it is remembered. Bounded by clearing.
const shiftMemo = new Map<string, number>();
const SHIFT_MEMO_LIMIT = 10_000;

/**
 * `days` calendar days after `ms` at the same wall-clock time in `timeZone`. Keeps the
 * sub-second part of `ms`, which wall times (whole seconds) would otherwise drop.
 */
export function sameWallTimeDaysLater(ms: number, days: number, timeZone: string): number {
  const key = `${ms}|${days}|${timeZone}`;
  const known = shiftMemo.get(key);
  if (known !== undefined) return known;
  const subSecond = ((ms % 1000) + 1000) % 1000;
  const result = wallTimeToInstant(addCalendarDays(wallTimeAt(ms, timeZone), days), timeZone) + subSecond;
  if (shiftMemo.size >= SHIFT_MEMO_LIMIT) shiftMemo.clear();
  shiftMemo.set(key, result);
  return result;
}

/** Whole calendar days from a setting; fractions are dropped and negatives count as 0. */
function wholeDays(value: number): number {
  return Number.isFinite(value) && value > 0 ? Math.floor(value) : 0;
}

/**
 * The instant of the question's pending check-in, whether or not it has come due yet;
 * null when check-ins are off for it (cadence 0) or its times cannot be read.
 */
export function checkinAt(question: Question, settings: Settings): number | null {
  const days = wholeDays(question.checkin_days ?? settings.default_checkin_days);
  if (days === 0) return null;
  let anchor: number | null = null;
  for (const f of question.forecasts) {
    const at = parseInstant(f.at);
    if (at !== null && (anchor === null || at > anchor)) anchor = at;
  }
  anchor ??= parseInstant(question.opened_at);
  if (anchor === null) return null;
  return sameWallTimeDaysLater(anchor, days, nudgeTimeZone(question, settings));
}

/** The instant a closed, unresolved question turns from "window closed" to "overdue". */
export function overdueAt(close: number, zone: string, settings: Settings): number {
  return sameWallTimeDaysLater(close, wholeDays(settings.overdue_after_days), zone);
}

/** The snooze hiding the (question, kind) nudge at `now`, if one is running. */
export function runningSnooze(snoozes: readonly Snooze[], questionId: string, kind: NudgeKind, now: number): Snooze | undefined {
  return snoozes.find((s) => s.question_id === questionId && s.kind === kind && s.until > now);
}

function isSnoozed(snoozes: readonly Snooze[], questionId: string, kind: NudgeKind, now: number): boolean {
  return runningSnooze(snoozes, questionId, kind, now) !== undefined;
}

const KIND_ORDER = new Map(NUDGE_KINDS.map((k, i) => [k, i]));

/**
 * Every nudge due at `now` (epoch ms), sorted by `due_at`, then title (then question id and
 * kind, so the order never depends on input order). Questions whose close cannot be
 * parsed are left out: the service never stores such a question.
 */
export function planNudges(
  questions: readonly Question[],
  settings: Settings,
  snoozes: readonly Snooze[],
  now: number,
): Nudge[] {
  const nudges: Nudge[] = [];
  for (const q of questions) {
    if (q.resolution) continue;
    const close = parseInstant(q.closes_at);
    if (close === null) continue;
    const zone = nudgeTimeZone(q, settings);
    const add = (kind: NudgeKind, due_at: number): void => {
      if (!isSnoozed(snoozes, q.id, kind, now)) nudges.push({ question_id: q.id, title: q.title, kind, due_at });
    };

    if (now < close) {
      const checkin = checkinAt(q, settings);
      if (checkin !== null && checkin <= now && checkin < close) add('checkin', checkin);
      const soon = close - Math.max(0, settings.closing_soon_hours) * HOUR_MS;
      if (soon <= now) add('closing_soon', soon);
    } else {
      const overdue = overdueAt(close, zone, settings);
      if (now < overdue) add('window_closed', close);
      else add('overdue', overdue);
    }
  }
  return nudges.sort(
    (a, b) =>
      a.due_at - b.due_at ||
      a.title.localeCompare(b.title, 'en') ||
      (a.question_id < b.question_id ? -1 : a.question_id > b.question_id ? 1 : 0) ||
      (KIND_ORDER.get(a.kind) ?? 0) - (KIND_ORDER.get(b.kind) ?? 0),
  );
}
