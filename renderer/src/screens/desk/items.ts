/**
 * The Desk lists questions, not nudges: a question can have a check-in due while it is also
 * closing soon, and the user answers both with one revision. Each question appears once, in
 * the group of its most pressing nudge, and carries every kind due for it (a snooze hides
 * them all; a revision clears the check-in and may leave it under "Closing soon").
 */
import type { DueNudge, NudgeKind, QuestionType } from '../../../../shared/domain';
import { formatCount, plural } from '../../dates';

export type DeskGroup = 'resolve' | 'closing' | 'checkin';

export const GROUPS: readonly { group: DeskGroup; heading: string; intro: string }[] = [
  { group: 'resolve', heading: 'To resolve', intro: 'Their windows have closed. How did they come out?' },
  { group: 'closing', heading: 'Closing soon', intro: 'A last look before the window closes.' },
  { group: 'checkin', heading: 'Check-ins', intro: 'Time to revise, or to confirm your number still stands.' },
];

export interface DeskItem {
  id: string;
  title: string;
  group: DeskGroup;
  /** When each due kind came due (ISO), e.g. { closing_soon: …, checkin: … }. */
  due: Partial<Record<NudgeKind, string>>;
  closes_at: string;
  time_zone: string;
  /** yes/no, choice or numeric: a choice or numeric item is revised and resolved in its own dialogs. */
  type: QuestionType;
  last_p: number | null;
  last_forecast_at: string | null;
  stale: boolean;
}

const GROUP_OF: Record<NudgeKind, DeskGroup> = {
  overdue: 'resolve',
  window_closed: 'resolve',
  closing_soon: 'closing',
  checkin: 'checkin',
};

const URGENCY: readonly DeskGroup[] = ['resolve', 'closing', 'checkin'];

/**
 * One item per question, in the order the Desk shows them: by group (to resolve, closing
 * soon, check-ins), then in the order the first of its nudges came due (the service sorts
 * by due time), so the longest-waiting comes first.
 */
export function deskItems(nudges: readonly DueNudge[]): DeskItem[] {
  const byId = new Map<string, DeskItem>();
  for (const n of nudges) {
    const known = byId.get(n.id);
    const group = GROUP_OF[n.kind];
    if (known) {
      known.due[n.kind] = n.due_at;
      if (URGENCY.indexOf(group) < URGENCY.indexOf(known.group)) known.group = group;
      continue;
    }
    byId.set(n.id, {
      id: n.id,
      title: n.title,
      group,
      due: { [n.kind]: n.due_at },
      closes_at: n.closes_at,
      time_zone: n.time_zone,
      type: n.type,
      last_p: n.last_p,
      last_forecast_at: n.last_forecast_at,
      stale: n.stale,
    });
  }
  // Array.prototype.sort is stable, so the due order survives within each group.
  return [...byId.values()].sort((x, y) => URGENCY.indexOf(x.group) - URGENCY.indexOf(y.group));
}

/** The kinds a snooze of this item must cover so that it leaves the Desk. */
export function dueKinds(item: DeskItem): NudgeKind[] {
  return Object.keys(item.due) as NudgeKind[];
}

/** The summary under the heading, e.g. "1 to resolve · 2 closing soon · 1 check-in". */
export function summary(items: readonly DeskItem[]): string {
  const count = (group: DeskGroup) => items.filter((i) => i.group === group).length;
  const parts: string[] = [];
  const resolve = count('resolve');
  const closing = count('closing');
  const checkins = count('checkin');
  if (resolve) parts.push(`${formatCount(resolve)} to resolve`);
  if (closing) parts.push(`${formatCount(closing)} closing soon`);
  if (checkins) parts.push(plural(checkins, 'check-in'));
  return parts.join(' · ');
}
