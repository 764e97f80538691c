/**
 * The nudge planner and scheduler (main/nudges) wired to the diary file: which questions
 * are unresolved, what is snoozed, what was delivered.
 */
import type { Question, QuestionKind, QuestionType, Settings } from '../../shared/domain';
import { addCalendarDays, wallTimeAt, wallTimeToInstant } from '../../shared/time';
import { activeSnoozes, countDueQuestions, planNudges, type Nudge, type NudgeKind, type PlanQuestion, type Snooze } from '../nudges/plan';
import { createScheduler, type Scheduler, type SchedulerPorts } from '../nudges/scheduler';
import * as nudgeStore from '../store/nudges';
import { readSnapshot, type Db, type StoreHandles } from '../store/open';
import * as qs from '../store/questions';

export type Notifier = SchedulerPorts['notifier'];

/**
 * Every unresolved question, whole, as it stands at `now` (the calendar export). The ids and
 * the questions come from one snapshot, so a commit from another process between the two
 * reads cannot mix two states of the diary.
 */
export function unresolvedQuestions(store: StoreHandles, now: number): Question[] {
  return readSnapshot(store.read, () => {
    const ids = (store.read.prepare('SELECT id FROM unresolved_questions').raw().all() as [string][]).map(([id]) => id);
    return ids.length ? qs.loadBundles(store.read, ids).map((b) => qs.toQuestion(b, now)) : [];
  });
}

/** An unresolved question as planning and the due list see it: no history, only its latest revision. */
export interface DueQuestion extends PlanQuestion {
  kind: QuestionKind;
  type: QuestionType;
  /**
   * Probability of the latest revision (latest time; same time: entered last), null when
   * there is none or the question is not yes/no (check-ins count revisions of every type).
   */
  last_p: number | null;
}

type DueRow = [string, string, QuestionKind, number, number, string, number | null, number | null, number | null, QuestionType];

/**
 * Every unresolved question with its latest revision: `unresolved_questions`, which the
 * schema's triggers keep (migration 8), holds exactly these rows, side by side, so the
 * cost follows the number of open questions, not the size of the diary.
 */
export function dueQuestions(db: Db): DueQuestion[] {
  const rows = db
    .prepare('SELECT id, title, kind, opened_at, closes_at, time_zone, checkin_days, last_at, last_p, type FROM unresolved_questions')
    .raw()
    .all() as DueRow[];
  return rows.map(([id, title, kind, opened, closes, zone, checkinDays, lastAt, lastP, type]) => ({
    id,
    title,
    kind,
    type,
    opened_at: opened,
    closes_at: closes,
    time_zone: zone,
    checkin_days: checkinDays,
    last_forecast_at: lastAt,
    last_p: lastP,
  }));
}

export function snoozes(store: StoreHandles): Snooze[] {
  return nudgeStore.allSnoozes(store.read);
}

type PlanInput = { questions: readonly DueQuestion[]; snoozed: readonly Snooze[] };

// What planning reads is kept until the diary changes: SQLite's data_version on the read
// handle moves whenever another connection (this process's write handle, or another
// process) commits. The top bar's count, the Desk and the scheduler's minute tick then
// re-plan from memory instead of reading every open question again; on a large diary the
// reading is most of their cost. Callers must not change what they are given.
const planInputs = new WeakMap<Db, { version: number; input: PlanInput }>();

/** The unresolved questions and the snoozes, from one snapshot of the file, read again only after a change. */
function planInput(store: StoreHandles): PlanInput {
  const db = store.read;
  return readSnapshot(db, () => {
    const version = db.pragma('data_version', { simple: true }) as number;
    const known = planInputs.get(db);
    if (known?.version === version) return known.input;
    const input = { questions: dueQuestions(db), snoozed: snoozes(store) };
    planInputs.set(db, { version, input });
    return input;
  });
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
): { questions: readonly DueQuestion[]; nudges: Nudge[]; snoozed: { nudge: Nudge; until: number }[] } {
  const { questions, snoozed: running } = planInput(store);
  const hidden = activeSnoozes(running, at);
  const nudges: Nudge[] = [];
  const snoozed: { nudge: Nudge; until: number }[] = [];
  for (const nudge of planNudges(questions, settings, [], at)) {
    const until = hidden.get(`${nudge.kind}|${nudge.question_id}`);
    if (until !== undefined) snoozed.push({ nudge, until });
    else nudges.push(nudge);
  }
  return { questions, nudges, snoozed };
}

/** How many questions have something due at `at` (the Desk's item count). */
export function countDueAt(store: StoreHandles, settings: Settings, at: number): number {
  const { questions, snoozed } = planInput(store);
  return countDueQuestions(questions, settings, snoozed, at);
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
    source: { questions: () => planInput(store).questions, settings, snoozes: () => planInput(store).snoozed },
    log,
    notifier,
    onDueCountChanged,
  });
}
