/**
 * Nudge planning: which reminders are due for the diary at one instant. Pure — the clock,
 * the questions, the settings and the snoozes all come in as arguments — so the same
 * answer feeds the scheduler's notifications, `forelog due` and the Desk list.
 *
 * Rules, for unresolved questions only (the caller leaves resolved and void ones out):
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
import { NUDGE_KINDS, type NudgeKind, type Settings } from '../../shared/domain';
import { addCalendarDays, isValidTimeZone, wallTimeAt, wallTimeToInstant } from '../../shared/time';

export { NUDGE_KINDS, type NudgeKind };

/**
 * What planning needs of one unresolved question — not its history: the store hands over
 * exactly this, so planning a large diary reads a few columns per open question.
 */
export interface PlanQuestion {
  id: string;
  title: string;
  /** Epoch ms. */
  opened_at: number;
  /** Epoch ms. */
  closes_at: number;
  /** IANA zone; an unknown one falls back to the diary's (see `nudgeTimeZone`). */
  time_zone: string;
  /** The question's own check-in cadence in days; null: the diary default. */
  checkin_days: number | null;
  /** Time of the latest revision (epoch ms), null when there is none. */
  last_forecast_at: number | null;
}

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
export function nudgeTimeZone(question: Pick<PlanQuestion, 'time_zone'>, settings: Settings): string {
  if (isValidTimeZone(question.time_zone)) return question.time_zone;
  if (isValidTimeZone(settings.time_zone)) return settings.time_zone;
  return 'UTC';
}

// The scheduler re-plans every minute from the same anchors, and each shift costs several
// Intl formatting calls (tens of µs each); the answer depends only on the arguments (the
// runtime's tz data is fixed for the process), so it is remembered. Bounded by clearing, at
// a size that holds a check-in and an overdue instant for every open question of a very
// large diary (about 10 MB), so the minute tick does not start from nothing each time.
const shiftMemo = new Map<string, number>();
const SHIFT_MEMO_LIMIT = 100_000;

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
export function checkinAt(question: PlanQuestion, settings: Settings): number | null {
  const days = wholeDays(question.checkin_days ?? settings.default_checkin_days);
  if (days === 0) return null;
  const anchor = question.last_forecast_at ?? question.opened_at;
  if (!Number.isFinite(anchor)) return null;
  return sameWallTimeDaysLater(anchor, days, nudgeTimeZone(question, settings));
}

/** The instant a closed, unresolved question turns from "window closed" to "overdue". */
export function overdueAt(close: number, zone: string, settings: Settings): number {
  return sameWallTimeDaysLater(close, wholeDays(settings.overdue_after_days), zone);
}

/**
 * The (question, kind) nudges a snooze hides at `now`, keyed `kind|question_id`, each with
 * when its snooze ends: looked up once per nudge however many snoozes the diary holds.
 */
export function activeSnoozes(snoozes: readonly Snooze[], now: number): Map<string, number> {
  const active = new Map<string, number>();
  for (const s of snoozes) {
    if (s.until <= now) continue;
    const key = `${s.kind}|${s.question_id}`;
    active.set(key, Math.max(active.get(key) ?? s.until, s.until));
  }
  return active;
}

const KIND_ORDER = new Map(NUDGE_KINDS.map((k, i) => [k, i]));
const DAY_MS = 86_400_000;

/** Appends to `out` the nudges of one question due at `now`; the rules of the module comment, in one place. */
function planQuestion(q: PlanQuestion, settings: Settings, snoozed: ReadonlyMap<string, number>, soonMs: number, now: number, out: Nudge[]): void {
  const close = q.closes_at;
  if (!Number.isFinite(close)) return;
  const add = (kind: NudgeKind, due_at: number): void => {
    if (!snoozed.has(`${kind}|${q.id}`)) out.push({ question_id: q.id, title: q.title, kind, due_at });
  };
  if (now < close) {
    const checkin = checkinAt(q, settings);
    if (checkin !== null && checkin <= now && checkin < close) add('checkin', checkin);
    const soon = close - soonMs;
    if (soon <= now) add('closing_soon', soon);
  } else {
    const overdue = overdueAt(close, nudgeTimeZone(q, settings), settings);
    if (now < overdue) add('window_closed', close);
    else add('overdue', overdue);
  }
}

/**
 * Every nudge due at `now` (epoch ms), sorted by `due_at`, then title (then question id and
 * kind, so the order never depends on input order). A question whose close is not a finite
 * instant is left out: the service never stores such a question.
 */
export function planNudges(
  questions: readonly PlanQuestion[],
  settings: Settings,
  snoozes: readonly Snooze[],
  now: number,
): Nudge[] {
  const nudges: Nudge[] = [];
  const snoozed = activeSnoozes(snoozes, now);
  const soonMs = Math.max(0, settings.closing_soon_hours) * HOUR_MS;
  for (const q of questions) planQuestion(q, settings, snoozed, soonMs, now, nudges);
  // One collator for the whole sort: `localeCompare(…, 'en')` per pair sets one up each time.
  const byTitle = new Intl.Collator('en').compare;
  return nudges.sort(
    (a, b) =>
      a.due_at - b.due_at ||
      byTitle(a.title, b.title) ||
      (a.question_id < b.question_id ? -1 : a.question_id > b.question_id ? 1 : 0) ||
      (KIND_ORDER.get(a.kind) ?? 0) - (KIND_ORDER.get(b.kind) ?? 0),
  );
}

/**
 * How many questions need attention: the Desk lists questions, not nudges (a question closing
 * soon with a check-in due is one thing to do), and the tray, the dock and the top bar show
 * the same number.
 */
export function dueQuestionCount(nudges: readonly Nudge[]): number {
  return new Set(nudges.map((n) => n.question_id)).size;
}

/**
 * `dueQuestionCount(planNudges(…))` without working out instants that cannot change the
 * answer, for the count every screen and the tray show: a closed question is due whichever
 * of its two nudges applies unless one of them is snoozed, and a check-in more than two days
 * from `now` is settled by arithmetic (a shift of N calendar days differs from N × 24 h by at
 * most the change in UTC offset, under 26 h, plus as much again for a gap). Anything nearer
 * is planned exactly.
 */
export function countDueQuestions(questions: readonly PlanQuestion[], settings: Settings, snoozes: readonly Snooze[], now: number): number {
  const snoozed = activeSnoozes(snoozes, now);
  const soonMs = Math.max(0, settings.closing_soon_hours) * HOUR_MS;
  const margin = 2 * DAY_MS;
  const scratch: Nudge[] = [];
  let count = 0;
  for (const q of questions) {
    const close = q.closes_at;
    if (!Number.isFinite(close)) continue;
    if (now >= close) {
      if (!snoozed.has(`window_closed|${q.id}`) && !snoozed.has(`overdue|${q.id}`)) {
        count++;
        continue;
      }
    } else {
      if (close - soonMs <= now && !snoozed.has(`closing_soon|${q.id}`)) {
        count++;
        continue;
      }
      const days = wholeDays(q.checkin_days ?? settings.default_checkin_days);
      const anchor = q.last_forecast_at ?? q.opened_at;
      const roughly = anchor + days * DAY_MS;
      if (days === 0 || !Number.isFinite(anchor) || now < roughly - margin || snoozed.has(`checkin|${q.id}`)) continue;
    }
    scratch.length = 0;
    planQuestion(q, settings, snoozed, soonMs, now, scratch);
    if (scratch.length > 0) count++;
  }
  return count;
}
