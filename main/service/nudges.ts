/**
 * The nudge planner and scheduler (main/nudges) wired to the diary file: which questions
 * are unresolved, what is snoozed, what was delivered.
 */
import type { Question, Settings } from '../../shared/domain';
import { addCalendarDays, wallTimeAt, wallTimeToInstant } from '../../shared/time';
import { planNudges, runningSnooze, type Nudge, type NudgeKind, type Snooze } from '../nudges/plan';
import { createScheduler, type Scheduler, type SchedulerPorts } from '../nudges/scheduler';
import * as nudgeStore from '../store/nudges';
import type { StoreHandles } from '../store/open';
import * as qs from '../store/questions';

export type Notifier = SchedulerPorts['notifier'];

/** Every unresolved question, whole (the planner needs revisions for check-ins), as it stands at `now`. */
export function unresolvedQuestions(store: StoreHandles, now: number): Question[] {
  const ids = (store.read.prepare('SELECT id FROM questions WHERE id NOT IN (SELECT question_id FROM resolutions)').raw().all() as [string][]).map(
    ([id]) => id,
  );
  return ids.length ? qs.loadBundles(store.read, ids).map((b) => qs.toQuestion(b, now)) : [];
}

export function snoozes(store: StoreHandles): Snooze[] {
  return nudgeStore.allSnoozes(store.read);
}

/**
 * What is due at `at`: the nudges to show, and apart from them the ones a running snooze
 * hides, each with its snooze's end. Planned once without snoozes and then split, so the
 * two lists hold exactly what the planner would show with no snoozes at all.
 */
export function dueAt(
  store: StoreHandles,
  settings: Settings,
  at: number,
): { questions: Question[]; nudges: Nudge[]; snoozed: { nudge: Nudge; until: number }[] } {
  const questions = unresolvedQuestions(store, at);
  const running = snoozes(store);
  const nudges: Nudge[] = [];
  const snoozed: { nudge: Nudge; until: number }[] = [];
  for (const nudge of planNudges(questions, settings, [], at)) {
    const snooze = runningSnooze(running, nudge.question_id, nudge.kind, at);
    if (snooze) snoozed.push({ nudge, until: snooze.until });
    else nudges.push(nudge);
  }
  return { questions, nudges, snoozed };
}

export type SnoozePreset = 'hour' | 'tomorrow_morning' | 'next_week';

/**
 * When a snooze preset runs out: an hour from now; 09:00 tomorrow; 09:00 seven days on —
 * mornings in the diary's time zone, because that is when the user starts their day.
 */
export function snoozeUntil(preset: SnoozePreset, now: number, timeZone: string): number {
  if (preset === 'hour') return now + 3_600_000;
  const today = wallTimeAt(now, timeZone);
  const day = addCalendarDays({ ...today, hour: 9, minute: 0, second: 0 }, preset === 'tomorrow_morning' ? 1 : 7);
  return wallTimeToInstant(day, timeZone);
}

export function createDiaryScheduler(
  store: StoreHandles,
  now: () => number,
  settings: () => Settings,
  notifier: Notifier,
  onDueCountChanged?: (count: number) => void,
): Scheduler {
  // A read-only diary cannot record deliveries; this run of the app remembers them instead,
  // so a nudge is not shown again every minute.
  const delivered = new Set<string>();
  const log: SchedulerPorts['log'] = store.readOnly
    ? { wasDelivered: (key) => delivered.has(key) || nudgeStore.wasDelivered(store.read, key), record: (key) => void delivered.add(key) }
    : {
        wasDelivered: (key) => nudgeStore.wasDelivered(store.write, key),
        record: (key, questionId, kind: NudgeKind, at) => nudgeStore.recordDelivered(store.write, key, questionId, kind, at),
      };
  return createScheduler({
    clock: { now },
    source: { questions: () => unresolvedQuestions(store, now()), settings, snoozes: () => snoozes(store) },
    log,
    notifier,
    onDueCountChanged,
  });
}
