/**
 * What a time typed into the diary may be: the checks the service applies to the
 * interactive operations (create and edit a question, add and edit a revision or a
 * reference forecast, resolve), here as small pure checks that return the reason a user
 * reads, or null, so the forms can run the same rules before they send anything.
 *
 * Importing a diary file does not apply them: a file is a record kept elsewhere, perhaps
 * written on another machine's clock, so import keeps only the file's own rules and the
 * accepted instant range (docs/diary-file.md, "Times").
 */
import type { AnyOutcome, QuestionKind } from './domain';
import { formatLocal } from './time';

/**
 * How far ahead of the diary's clock a time may be and still count as "now": the screen
 * that sends a time (or another machine in browser mode) may run a little fast. Five
 * minutes is more than ordinary clock drift and far less than any real forecast horizon.
 */
export const CLOCK_SKEW_MS = 5 * 60_000;

/** A time on the question's own clock, for messages: "2026-03-31 17:00 Europe/London". */
export function onClock(ms: number, timeZone: string): string {
  return `${formatLocal(ms, timeZone)} ${timeZone}`;
}

/**
 * Null when `at` is not later than `now` plus the clock-skew allowance; otherwise the
 * reason. `what` says what the time is of, e.g. "a revision".
 */
export function futureProblem(at: number, now: number, what: string): string | null {
  if (at <= now + CLOCK_SKEW_MS) return null;
  return `must not be in the future: ${what} records something that has already happened (up to 5 minutes ahead of this computer's clock is allowed for clock differences)`;
}

/** Null when `at` is at or after the question's opening; otherwise the reason. */
export function beforeOpeningProblem(at: number, openedAt: number, timeZone: string): string | null {
  if (at >= openedAt) return null;
  return `must not be before the question opened (${onClock(openedAt, timeZone)}); if it happened earlier, first move the question's opening time (opened_at) back`;
}

/**
 * True when resolving a question this way is unusual enough to ask first: a question about
 * the state of things at its close, resolved (Yes, No, an option, a value) at a time before that close. (The
 * answer may be settled early — a contract ended, a system retired — so it is a warning,
 * not a refusal.) A void resolution is never unusual.
 */
export function isEarlyStateResolution(kind: QuestionKind, outcome: AnyOutcome, at: number, closesAt: number): boolean {
  return kind === 'state_at_deadline' && outcome !== 'void' && at < closesAt;
}

/** What the user is asked when `isEarlyStateResolution` holds. */
export function earlyStateResolutionWarning(title: string, outcome: AnyOutcome, closesAt: number, timeZone: string): string {
  const answer = outcome === 'yes' ? 'a Yes' : outcome === 'no' ? 'a No' : outcome === 'option' ? 'an option chosen' : 'a value given';
  return (
    `“${title}” asks about the state of things at its close, ${onClock(closesAt, timeZone)}, and the resolution time is before that close; ` +
    `${answer} before the close is unusual. Nothing was changed. If the answer is already settled, resolve it again and confirm (the request's confirm: true).`
  );
}
