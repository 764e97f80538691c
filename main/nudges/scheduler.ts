/**
 * The nudge scheduler: on every run it plans what is due (plan.ts), works out which of it
 * has not been shown yet (the nudge log, keys.ts), and hands the rest to the notifier —
 * one notification for a single nudge, one summary for several. Runs come from a
 * node-cron tick every minute, from app start and from system resume; a nudge that fell
 * due while the app was closed or asleep is therefore caught up at the next run, never
 * lost, and the log makes sure it is never shown twice, across restarts too.
 *
 * Everything it touches is a port, so tests drive it with a fake clock and in-memory
 * stores, and the app plugs in SQLite, Electron notifications and the Desk badge.
 */
import { createRequire } from 'node:module';
import type { Settings } from '../../shared/domain';
import { isValidTimeZone } from '../../shared/time';
import { deliveryKey } from './keys';
import { nudgeMessage, summaryMessage, type BatchCause } from './messages';
import { dueQuestionCount, planNudges, type Nudge, type NudgeKind, type PlanQuestion, type Snooze } from './plan';
import { inQuietHours } from './quiet';

export interface SchedulerPorts {
  clock: { now(): number };
  source: {
    /** The diary's unresolved questions (resolved and void ones get no nudges). */
    questions(): readonly PlanQuestion[];
    settings(): Settings;
    /** Snoozes, including ones that have run out (they mark a reminder as due again). */
    snoozes(): readonly Snooze[];
  };
  log: {
    wasDelivered(key: string): boolean;
    /** Marks `key` delivered at `at` (epoch ms); must be durable before the next run. */
    record(key: string, question_id: string, kind: NudgeKind, at: number): void;
  };
  notifier: {
    /** `question_id` is the question to open on click, or null for a summary (open the Desk). */
    notify(n: { title: string; body: string; question_id: string | null }): void;
  };
  /** Called with the number of nudges due (after snoozes) whenever it changes, and on the first run. */
  onDueCountChanged?: (count: number) => void;
}

export type RunReason = 'tick' | 'start' | 'resume';

export interface RunResult {
  /** Nudges newly delivered (and recorded) by this run. */
  delivered: number;
  /** True when they went out as one summary notification. */
  summary: boolean;
  /** Nudges due now, including ones delivered earlier. */
  due: number;
}

/** The part of a node-cron task the scheduler uses. */
export interface CronTask {
  start(): void;
  stop(): void;
  destroy(): void;
}

/** The part of the node-cron module the scheduler uses; tests pass a fake. */
export interface CronModule {
  createTask(expression: string, fn: () => void, options?: { name?: string; noOverlap?: boolean }): CronTask;
}

export interface Scheduler {
  runOnce(reason: RunReason): RunResult;
  /** Starts the minute tick, then runs once with reason 'start'. Does nothing if already started. */
  start(cronModule?: CronModule): void;
  /** Stops and discards the minute tick. Does nothing if not started. */
  stop(): void;
}

/**
 * A run this long after the previous one means the machine slept or the process stalled,
 * so what it finds is a catch-up. Two minutes plus slack for a late cron tick.
 */
export const CATCH_UP_GAP_MS = 150_000;

export const TICK_EXPRESSION = '* * * * *';

/**
 * node-cron, loaded when a scheduler first starts rather than when this module is: the
 * command line imports the service (and so this module) on every call but never starts a
 * scheduler, and loading node-cron is a noticeable part of a short command's start-up.
 */
function nodeCron(): CronModule {
  return createRequire(import.meta.url)('node-cron') as CronModule;
}

export function createScheduler(ports: SchedulerPorts): Scheduler {
  let lastRunAt: number | null = null;
  let heldByQuietHours = false;
  let lastDueCount: number | null = null;
  let task: CronTask | null = null;

  function batchCause(reason: RunReason, now: number): BatchCause {
    if (reason !== 'tick' || lastRunAt === null || now - lastRunAt > CATCH_UP_GAP_MS) return 'away';
    return heldByQuietHours ? 'quiet' : 'together';
  }

  function runOnce(reason: RunReason): RunResult {
    const now = ports.clock.now();
    const settings = ports.source.settings();
    const questions = ports.source.questions();
    const snoozes = ports.source.snoozes();
    const nudges = planNudges(questions, settings, snoozes, now);

    const dueQuestions = dueQuestionCount(nudges);
    if (dueQuestions !== lastDueCount) {
      lastDueCount = dueQuestions;
      ports.onDueCountChanged?.(dueQuestions);
    }

    const cause = batchCause(reason, now);
    lastRunAt = now;
    const zone = isValidTimeZone(settings.time_zone) ? settings.time_zone : 'UTC';
    if (inQuietHours(now, settings.quiet_hours, zone)) {
      // Nothing is shown or recorded: the held nudges go out after the quiet hours.
      heldByQuietHours = true;
      return { delivered: 0, summary: false, due: nudges.length };
    }

    const closes = new Map(questions.map((q) => [q.id, q.closes_at]));
    const pending: { nudge: Nudge; key: string; close: number }[] = [];
    for (const nudge of nudges) {
      const close = closes.get(nudge.question_id);
      if (close === undefined) continue; // planNudges only plans questions with a readable close
      const key = deliveryKey(nudge, close, zone, snoozes, now);
      if (!ports.log.wasDelivered(key)) pending.push({ nudge, key, close });
    }
    heldByQuietHours = false;

    const [only] = pending;
    if (!only) return { delivered: 0, summary: false, due: nudges.length };
    if (pending.length === 1) {
      const message = nudgeMessage(only.nudge, only.close, settings.closing_soon_hours, zone, now);
      ports.notifier.notify({ ...message, question_id: only.nudge.question_id });
    } else {
      const message = summaryMessage(pending.map((p) => p.nudge), cause);
      ports.notifier.notify({ ...message, question_id: null });
    }
    // Recorded after the notifier returns: a notification that failed is retried next run.
    for (const p of pending) ports.log.record(p.key, p.nudge.question_id, p.nudge.kind, now);
    return { delivered: pending.length, summary: pending.length > 1, due: nudges.length };
  }

  return {
    runOnce,
    start(cronModule?: CronModule) {
      if (task) return;
      cronModule ??= nodeCron();
      // The tick is scheduled before the start-up run, so a failing first run (its error
      // is rethrown to the caller) is retried by the next tick instead of ending nudges.
      task = cronModule.createTask(TICK_EXPRESSION, () => void runOnce('tick'), {
        name: 'forelog-nudges',
        noOverlap: true,
      });
      task.start();
      runOnce('start');
    },
    stop() {
      if (!task) return;
      task.stop();
      task.destroy(); // also drops it from node-cron's task registry
      task = null;
    },
  };
}
