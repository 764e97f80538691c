/**
 * Notification wording, in plain words: one nudge names its question and what to do; a
 * batch is summed up in one notification so a return from sleep is not a flood.
 */
import type { Nudge, NudgeKind } from './plan';
import { calendarDaysBetween } from './local-days';

export interface NudgeMessage {
  title: string;
  body: string;
}

const HEADINGS: Record<NudgeKind, string> = {
  checkin: 'Check-in due',
  closing_soon: 'Closing soon',
  window_closed: 'Window closed',
  overdue: 'Overdue',
};

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/**
 * The notification for a single nudge. `close` is the question's close (epoch ms),
 * `closingSoonHours` the diary's warning lead, `timeZone` the diary's zone (days since
 * the close are counted on its calendar).
 */
export function nudgeMessage(
  nudge: Nudge,
  close: number,
  closingSoonHours: number,
  timeZone: string,
  now: number,
): NudgeMessage {
  const title = HEADINGS[nudge.kind];
  switch (nudge.kind) {
    case 'checkin':
      return { title, body: `Check-in due: ${nudge.title}` };
    case 'closing_soon':
      return { title, body: `Closes within ${closingSoonHours} h: ${nudge.title}` };
    case 'window_closed':
      return { title, body: `Window closed: ${nudge.title} — how did it resolve?` };
    case 'overdue': {
      const days = calendarDaysBetween(close, now, timeZone);
      const ago = days <= 0 ? 'today' : `${plural(days, 'day', 'days')} ago`;
      return { title, body: `Overdue: ${nudge.title} closed ${ago}` };
    }
  }
}

/** Why several nudges go out together: the app was closed or asleep, quiet hours held them, or they fell due at once. */
export type BatchCause = 'away' | 'quiet' | 'together';

const LEAD_INS: Record<BatchCause, string> = {
  away: 'while you were away',
  quiet: 'during quiet hours',
  together: 'due',
};

/** One notification standing for several nudges, e.g. "5 nudges while you were away: 2 to resolve, 3 check-ins". */
export function summaryMessage(nudges: readonly Nudge[], cause: BatchCause): NudgeMessage {
  const count = (kinds: NudgeKind[]) => nudges.filter((n) => kinds.includes(n.kind)).length;
  const parts: string[] = [];
  const toResolve = count(['window_closed', 'overdue']);
  const closing = count(['closing_soon']);
  const checkins = count(['checkin']);
  if (toResolve > 0) parts.push(`${toResolve} to resolve`);
  if (closing > 0) parts.push(`${closing} closing soon`);
  if (checkins > 0) parts.push(plural(checkins, 'check-in', 'check-ins'));
  return {
    title: 'Nudges',
    body: `${plural(nudges.length, 'nudge', 'nudges')} ${LEAD_INS[cause]}: ${parts.join(', ')}`,
  };
}
