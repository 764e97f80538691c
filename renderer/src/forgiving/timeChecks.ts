/**
 * The diary's rules for a typed time (docs/limits.md, "What a typed time may be"), run by
 * the forms before they send, with the diary's own wording (shared/time-rules.ts), so a
 * time that cannot be true is marked beside its field at once. The diary checks again on
 * its own clock; its answer lands beside the same field.
 */
import { beforeOpeningProblem, futureProblem } from '../../../shared/time-rules';
import { userLocale } from '../dates';
import { plainReason } from '../fieldMessages';

export interface Opening {
  opened_at: string;
  time_zone: string;
}

/** What the time is of, in the diary's words. */
export type TimedThing = 'the opening time (when the question was posed)' | 'a revision' | 'a resolution' | 'a reference forecast';

/**
 * The reason `at` (ISO) cannot be true, or null: never in the future; and, when `opening` is
 * given, never before the question opened. In plain words, as the diary's own answer would
 * be shown beside the field (`plainReason`): the opening written as the window writes dates,
 * no request names such as "opened_at".
 */
export function typedTimeProblem(at: string, what: TimedThing, opening?: Opening, now = Date.now(), locale = userLocale()): string | null {
  const ms = Date.parse(at);
  const reason = futureProblem(ms, now, what) ?? (opening ? beforeOpeningProblem(ms, Date.parse(opening.opened_at), opening.time_zone) : null);
  return reason === null ? null : plainReason(reason, {}, locale);
}
