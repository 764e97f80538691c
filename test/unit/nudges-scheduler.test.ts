/**
 * The nudge scheduler driven by a fake clock and in-memory ports. Expected delivery
 * instants are derived from the planning rules (see nudges-plan.test.ts) and the IANA tz
 * database transitions as listed by `zdump -v` (Europe/London GMT→BST 2025-03-30 01:00Z;
 * America/New_York EDT→EST 2025-11-02 06:00Z).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createRequire } from 'node:module';
import { defaultSettings, type Settings } from '../../shared/domain';
import { planQuestion } from '../support/builders';
import { createScheduler, type CronModule, type SchedulerPorts } from '../../main/nudges/scheduler';
import { inQuietHours, parseClockTime } from '../../main/nudges/quiet';
import { nudgeMessage, summaryMessage } from '../../main/nudges/messages';
import type { NudgeKind, PlanQuestion, Snooze } from '../../main/nudges/plan';

const MINUTE = 60_000;
const ms = (iso: string): number => Date.parse(iso);
const iso = (t: number): string => new Date(t).toISOString();

interface Sent {
  at: string;
  title: string;
  body: string;
  question_id: string | null;
}

type LogRow = { question_id: string; kind: NudgeKind; at: number };

/** In-memory stand-ins for the SQLite tables and the notifier; `log` can be shared across instances. */
function harness(init: { now: string; questions: PlanQuestion[]; settings: Settings; log?: Map<string, LogRow> }) {
  const h = {
    now: ms(init.now),
    questions: init.questions,
    settings: init.settings,
    snoozes: [] as Snooze[],
    log: init.log ?? new Map<string, LogRow>(),
    sent: [] as Sent[],
    counts: [] as number[],
  };
  const ports: SchedulerPorts = {
    clock: { now: () => h.now },
    source: { questions: () => h.questions, settings: () => h.settings, snoozes: () => h.snoozes },
    log: {
      wasDelivered: (key) => h.log.has(key),
      record: (key, question_id, kind, at) => void h.log.set(key, { question_id, kind, at }),
    },
    notifier: { notify: (n) => void h.sent.push({ at: iso(h.now), ...n }) },
    onDueCountChanged: (count) => void h.counts.push(count),
  };
  return { h, ports, scheduler: createScheduler(ports) };
}

/** Calls runOnce('tick') at every whole minute after the current time up to and including `until`. */
function tickUntil(t: ReturnType<typeof harness>, until: string, beforeEach?: (now: number) => void): void {
  const end = ms(until);
  while (t.h.now + MINUTE <= end) {
    t.h.now += MINUTE;
    beforeEach?.(t.h.now);
    t.scheduler.runOnce('tick');
  }
}

const london = { ...defaultSettings('Europe/London') };

test('a week of minute ticks delivers each nudge once, at the minute it comes due', () => {
  // Every minute from Mon 2025-03-24 00:00Z to Mon 2025-03-31 00:00Z: 10 080 ticks, across London's
  // change to BST on 2025-03-30 01:00Z. Default settings: check-in 7 days, warning 24 h, overdue 3 days.
  const t = harness({
    now: '2025-03-24T00:00:00.000Z',
    settings: london,
    questions: [
      // Check-in 03-17 09:00 GMT + 7 → 03-24 09:00Z; revised 03-25 10:00Z → next 04-01, after the week.
      planQuestion({ id: 'A', title: 'Alpha renewal', time_zone: 'Europe/London', opened_at: '2025-03-17T09:00:00.000Z', closes_at: '2025-04-30T12:00:00.000Z' }),
      // Close 03-26 17:00Z: warning 03-25 17:00Z, closed prompt at the close, overdue from 03-29 17:00 GMT,
      // repeated daily at 17:00 London time: 03-30 17:00 BST = 16:00Z. Its check-in (03-27) is after the close.
      planQuestion({ id: 'B', title: 'Board approval', time_zone: 'Europe/London', opened_at: '2025-03-20T12:00:00.000Z', closes_at: '2025-03-26T17:00:00.000Z' }),
      // Cadence 2: 03-23 08:00 + 2 → 03-25 08:00Z; never revised, so it stays due and is not repeated.
      planQuestion({ id: 'D', title: 'Delivery on time', time_zone: 'Europe/London', checkin_days: 2, opened_at: '2025-03-23T08:00:00.000Z', closes_at: '2025-04-10T12:00:00.000Z' }),
      // Cadence 3: 03-22 06:00 + 3 → 03-25 06:00Z; snoozed at 06:30 until 03-26 07:00Z, then shown once more.
      planQuestion({ id: 'E', title: 'Export licence', time_zone: 'Europe/London', checkin_days: 3, opened_at: '2025-03-22T06:00:00.000Z', closes_at: '2025-04-10T12:00:00.000Z' }),
    ],
  });
  const started = performance.now();
  t.scheduler.runOnce('start');
  tickUntil(t, '2025-03-31T00:00:00.000Z', (now) => {
    if (now === ms('2025-03-25T10:00:00.000Z')) {
      t.h.questions = t.h.questions.map((q) => (q.id === 'A' ? { ...q, last_forecast_at: ms('2025-03-25T10:00:00.000Z') } : q));
    }
    if (now === ms('2025-03-25T06:30:00.000Z')) {
      t.h.snoozes = [{ question_id: 'E', kind: 'checkin', until: ms('2025-03-26T07:00:00.000Z') }];
    }
  });
  const elapsed = performance.now() - started;

  assert.deepEqual(
    t.h.sent.map((s) => [s.at, s.question_id, s.body]),
    [
      ['2025-03-24T09:00:00.000Z', 'A', 'Check-in due: Alpha renewal'],
      ['2025-03-25T06:00:00.000Z', 'E', 'Check-in due: Export licence'],
      ['2025-03-25T08:00:00.000Z', 'D', 'Check-in due: Delivery on time'],
      ['2025-03-25T17:00:00.000Z', 'B', 'Closes within 24 h: Board approval'],
      ['2025-03-26T07:00:00.000Z', 'E', 'Check-in due: Export licence'],
      ['2025-03-26T17:00:00.000Z', 'B', 'Window closed: Board approval — how did it resolve?'],
      ['2025-03-29T17:00:00.000Z', 'B', 'Overdue: Board approval closed 3 days ago'],
      ['2025-03-30T16:00:00.000Z', 'B', 'Overdue: Board approval closed 4 days ago'],
    ],
  );
  assert.equal(t.h.log.size, 8);
  const byKind = (kind: NudgeKind) => [...t.h.log.values()].filter((r) => r.kind === kind).length;
  assert.deepEqual([byKind('checkin'), byKind('closing_soon'), byKind('window_closed'), byKind('overdue')], [4, 1, 1, 2]);
  console.log(`week of minute ticks: ${elapsed.toFixed(0)} ms`);
});

test('three days asleep, then resume: one summary for everything missed, and every key recorded', () => {
  const utc = defaultSettings('UTC');
  const t = harness({
    now: '2025-06-02T08:00:00.000Z',
    settings: utc,
    questions: [
      // Closed 06-01 10:00Z: window-closed prompt at start; overdue from 06-04 10:00Z.
      planQuestion({ id: 'Q', checkin_days: 0, closes_at: '2025-06-01T10:00:00.000Z' }),
      // Closes while asleep (06-03 12:00Z): its prompt is due on waking.
      planQuestion({ id: 'P', checkin_days: 0, closes_at: '2025-06-03T12:00:00.000Z' }),
      // Check-ins due while asleep: 05-27 09:00 + 7, 06-02 07:30 + 1, 06-01 12:00 + 2.
      planQuestion({ id: 'R', opened_at: '2025-05-27T09:00:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
      planQuestion({ id: 'S', checkin_days: 1, opened_at: '2025-06-02T07:30:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
      planQuestion({ id: 'T', checkin_days: 2, opened_at: '2025-06-01T12:00:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
    ],
  });
  assert.deepEqual(t.scheduler.runOnce('start'), { delivered: 1, summary: false, due: 1 });
  assert.equal(t.h.sent[0]?.question_id, 'Q');

  t.h.now = ms('2025-06-05T08:00:00.000Z');
  assert.deepEqual(t.scheduler.runOnce('resume'), { delivered: 5, summary: true, due: 5 });
  assert.equal(t.h.sent.length, 2);
  assert.deepEqual(t.h.sent[1], {
    at: '2025-06-05T08:00:00.000Z',
    title: 'Nudges',
    body: '5 nudges while you were away: 2 to resolve, 3 check-ins',
    question_id: null,
  });
  assert.equal(t.h.log.size, 6);
  // Everything is in the log, so the next ticks stay silent.
  tickUntil(t, '2025-06-05T09:00:00.000Z');
  assert.equal(t.h.sent.length, 2);
});

test('a tick long after the previous run counts as a catch-up too; a single missed nudge names its question', () => {
  const t = harness({
    now: '2025-06-02T08:00:00.000Z',
    settings: { ...defaultSettings('UTC'), closing_soon_hours: 2 },
    questions: [
      // Check-in 06-02 07:00 + 1 → 06-03 07:00Z.
      planQuestion({ id: 'one', title: 'One', checkin_days: 1, opened_at: '2025-06-02T07:00:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
      // Warning from 06-03 10:00Z, closed prompt from 12:00Z.
      planQuestion({ id: 'two', title: 'Two', checkin_days: 0, closes_at: '2025-06-03T12:00:00.000Z' }),
    ],
  });
  t.scheduler.runOnce('start');
  // Process stalled (no resume event): 3 minutes later is past the ~2-minute catch-up gap.
  t.h.now = ms('2025-06-03T07:03:00.000Z');
  t.scheduler.runOnce('tick');
  assert.deepEqual(t.h.sent.at(-1), {
    at: '2025-06-03T07:03:00.000Z',
    title: 'Check-in due',
    body: 'Check-in due: One',
    question_id: 'one',
  });
  // Asleep again from 07:03Z to 13:00Z: two closed at 12:00Z (its warning went unseen and is no
  // longer due), three's warning started at 12:00Z. One was resolved meanwhile (left out).
  t.h.now = ms('2025-06-03T13:00:00.000Z');
  t.h.questions = [t.h.questions[1]!, planQuestion({ id: 'three', title: 'Three', checkin_days: 0, closes_at: '2025-06-03T14:00:00.000Z' })];
  assert.deepEqual(t.scheduler.runOnce('tick'), { delivered: 2, summary: true, due: 2 });
  assert.equal(t.h.sent.at(-1)?.body, '2 nudges while you were away: 1 to resolve, 1 closing soon');
});

test('nudges falling due on the same tick go out as one summary', () => {
  const utc = defaultSettings('UTC');
  const close = '2025-06-10T17:00:00.000Z';
  const t = harness({
    now: '2025-06-10T16:58:00.000Z',
    settings: { ...utc, closing_soon_hours: 0 },
    questions: [planQuestion({ id: 'a', checkin_days: 0, closes_at: close }), planQuestion({ id: 'b', checkin_days: 0, closes_at: close })],
  });
  t.scheduler.runOnce('start');
  tickUntil(t, '2025-06-10T17:05:00.000Z');
  assert.deepEqual(t.h.sent, [
    { at: close, title: 'Nudges', body: '2 nudges due: 2 to resolve', question_id: null },
  ]);
});

test('a restart over the same log re-delivers nothing, and still delivers what is new', () => {
  const utc = defaultSettings('UTC');
  const questions = [
    planQuestion({ id: 'x', checkin_days: 0, closes_at: '2025-06-01T10:00:00.000Z' }),
    planQuestion({ id: 'y', opened_at: '2025-05-20T09:00:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
    planQuestion({ id: 'z', checkin_days: 0, closes_at: '2025-06-03T12:00:00.000Z' }),
  ];
  const first = harness({ now: '2025-06-02T08:00:00.000Z', settings: utc, questions });
  first.scheduler.runOnce('start');
  assert.equal(first.h.sent.length, 1); // window closed (x) + check-in (y) as one summary
  assert.equal(first.h.log.size, 2);

  const second = harness({ now: '2025-06-02T08:05:00.000Z', settings: utc, questions, log: first.h.log });
  assert.deepEqual(second.scheduler.runOnce('start'), { delivered: 0, summary: false, due: 2 });
  tickUntil(second, '2025-06-02T12:10:00.000Z');
  // Only the new one: z's closing-soon warning at 06-02 12:00Z (close − 24 h).
  assert.deepEqual(second.h.sent.map((s) => [s.at, s.question_id]), [['2025-06-02T12:00:00.000Z', 'z']]);
  assert.equal(second.h.log.size, 3);
});

test('overdue is re-delivered once per local day at the time it first fell due, across a DST change', () => {
  // New York: close 2025-10-28 09:00 EDT (13:00Z); overdue from 10-31 09:00 EDT (13:00Z), then daily at
  // 09:00 New York time: 11-01 13:00Z, and after EDT→EST on 11-02 06:00Z, 11-02 and 11-03 at 14:00Z.
  const ny = defaultSettings('America/New_York');
  const questions = [planQuestion({ id: 'late', title: 'Late one', time_zone: 'America/New_York', checkin_days: 0, closes_at: '2025-10-28T13:00:00.000Z' })];
  const t = harness({ now: '2025-10-31T12:00:00.000Z', settings: ny, questions });
  t.scheduler.runOnce('start'); // window-closed prompt, still due at 08:00 EDT
  tickUntil(t, '2025-11-02T20:00:00.000Z');
  // Restarted in the afternoon of 11-02 with the same log: no second reminder that day.
  const restarted = harness({ now: '2025-11-02T20:00:00.000Z', settings: ny, questions, log: t.h.log });
  restarted.scheduler.runOnce('start');
  tickUntil(restarted, '2025-11-04T12:00:00.000Z');
  const overdue = [...t.h.sent, ...restarted.h.sent].filter((s) => s.title === 'Overdue').map((s) => [s.at, s.body]);
  assert.deepEqual(overdue, [
    ['2025-10-31T13:00:00.000Z', 'Overdue: Late one closed 3 days ago'],
    ['2025-11-01T13:00:00.000Z', 'Overdue: Late one closed 4 days ago'],
    ['2025-11-02T14:00:00.000Z', 'Overdue: Late one closed 5 days ago'],
    ['2025-11-03T14:00:00.000Z', 'Overdue: Late one closed 6 days ago'],
  ]);
  assert.deepEqual(
    [...t.h.log.keys()].filter((k) => k.startsWith('overdue')),
    ['overdue|late|2025-10-31', 'overdue|late|2025-11-01', 'overdue|late|2025-11-02', 'overdue|late|2025-11-03'],
  );
});

test('quiet hours hold nudges and release them, summed up, at the first run after', () => {
  // London in June is BST (UTC+1): quiet 22:00–07:00 local = 21:00Z–06:00Z.
  const settings: Settings = { ...london, quiet_hours: { start: '22:00', end: '07:00' } };
  const t = harness({
    now: '2025-06-10T20:00:00.000Z',
    settings,
    questions: [
      // Check-in 06-03 22:00Z + 7 → 06-10 22:00Z (23:00 BST, quiet).
      planQuestion({ id: 'X', title: 'X', time_zone: 'Europe/London', opened_at: '2025-06-03T22:00:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
      // Closes 06-11 01:00Z (02:00 BST, quiet); its closing-soon warning is already due at start.
      planQuestion({ id: 'Y', title: 'Y', time_zone: 'Europe/London', checkin_days: 0, closes_at: '2025-06-11T01:00:00.000Z' }),
    ],
  });
  t.scheduler.runOnce('start');
  tickUntil(t, '2025-06-11T05:59:00.000Z'); // last quiet minute
  assert.equal(t.h.sent.length, 1, 'nothing shown during quiet hours');
  assert.equal(t.h.log.size, 1, 'nothing recorded during quiet hours');
  tickUntil(t, '2025-06-11T07:00:00.000Z');
  assert.deepEqual(t.h.sent, [
    { at: '2025-06-10T20:00:00.000Z', title: 'Closing soon', body: 'Closes within 24 h: Y', question_id: 'Y' },
    { at: '2025-06-11T06:00:00.000Z', title: 'Nudges', body: '2 nudges during quiet hours: 1 to resolve, 1 check-in', question_id: null },
  ]);
  // The in-app count keeps up during quiet hours: 1 at start, 2 from 22:00Z (Y's warning becomes its closed prompt).
  assert.deepEqual(t.h.counts, [1, 2]);
});

test('a single nudge held by quiet hours goes out on its own, naming its question', () => {
  const settings: Settings = { ...defaultSettings('UTC'), quiet_hours: { start: '22:00', end: '07:00' } };
  const t = harness({
    now: '2025-06-10T21:00:00.000Z',
    settings,
    questions: [planQuestion({ id: 'X', title: 'X', opened_at: '2025-06-03T23:30:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' })],
  });
  t.scheduler.runOnce('start');
  tickUntil(t, '2025-06-11T08:00:00.000Z');
  assert.deepEqual(t.h.sent, [{ at: '2025-06-11T07:00:00.000Z', title: 'Check-in due', body: 'Check-in due: X', question_id: 'X' }]);
});

test('quiet-hours boundaries: [start, end), wrapping midnight, read in the diary zone', () => {
  // Common practice: a quiet stretch includes its start minute and ends at its end minute.
  const day = { start: '13:00', end: '14:00' };
  assert.equal(inQuietHours(ms('2025-01-15T12:59:59.999Z'), day, 'UTC'), false);
  assert.equal(inQuietHours(ms('2025-01-15T13:00:00.000Z'), day, 'UTC'), true);
  assert.equal(inQuietHours(ms('2025-01-15T13:59:59.999Z'), day, 'UTC'), true);
  assert.equal(inQuietHours(ms('2025-01-15T14:00:00.000Z'), day, 'UTC'), false);
  const night = { start: '22:00', end: '07:00' };
  for (const [at, quiet] of [['21:59', false], ['22:00', true], ['00:00', true], ['06:59', true], ['07:00', false], ['12:00', false]] as const) {
    assert.equal(inQuietHours(ms(`2025-01-15T${at}:00.000Z`), night, 'UTC'), quiet, at);
  }
  // 22:00 in London in July is 21:00Z (BST); in New York in January 22:00 EST is 03:00Z.
  assert.equal(inQuietHours(ms('2025-07-15T21:00:00.000Z'), night, 'Europe/London'), true);
  assert.equal(inQuietHours(ms('2025-07-15T20:59:00.000Z'), night, 'Europe/London'), false);
  assert.equal(inQuietHours(ms('2025-01-16T03:00:00.000Z'), night, 'America/New_York'), true);
  assert.equal(inQuietHours(ms('2025-01-16T02:59:00.000Z'), night, 'America/New_York'), false);
  // Equal ends, malformed times and no setting mean no quiet hours.
  assert.equal(inQuietHours(ms('2025-01-15T13:00:00.000Z'), { start: '13:00', end: '13:00' }, 'UTC'), false);
  assert.equal(inQuietHours(ms('2025-01-15T23:00:00.000Z'), { start: '22:00', end: '7:00' }, 'UTC'), false);
  assert.equal(inQuietHours(ms('2025-01-15T23:00:00.000Z'), null, 'UTC'), false);
  assert.deepEqual(['00:00', '23:59', '24:00', '7:00', '12:60'].map(parseClockTime), [0, 1439, null, null, null]);
});

test('a notifier failure records nothing, so the next run tries again', () => {
  const t = harness({
    now: '2025-06-02T08:00:00.000Z',
    settings: defaultSettings('UTC'),
    questions: [planQuestion({ id: 'q', checkin_days: 0, closes_at: '2025-06-01T00:00:00.000Z' })],
  });
  let fail = true;
  const ports: SchedulerPorts = {
    ...t.ports,
    notifier: {
      notify: (n) => {
        if (fail) throw new Error('notification service unavailable');
        t.h.sent.push({ at: iso(t.h.now), ...n });
      },
    },
  };
  const scheduler = createScheduler(ports);
  assert.throws(() => scheduler.runOnce('start'), /notification service unavailable/);
  assert.equal(t.h.log.size, 0);
  fail = false;
  t.h.now += MINUTE;
  assert.deepEqual(scheduler.runOnce('tick'), { delivered: 1, summary: false, due: 1 });
  assert.equal(t.h.log.size, 1);
});

test('the due count is reported on the first run and on every change only', () => {
  const t = harness({
    now: '2025-06-02T08:00:00.000Z',
    settings: { ...defaultSettings('UTC'), closing_soon_hours: 1 },
    questions: [planQuestion({ id: 'q', checkin_days: 0, closes_at: '2025-06-02T10:00:00.000Z' })],
  });
  t.scheduler.runOnce('start');
  tickUntil(t, '2025-06-02T11:00:00.000Z');
  // 0 until 09:00Z, then closing soon (1), then window closed (still 1).
  assert.deepEqual(t.h.counts, [0, 1]);
  t.h.questions = []; // resolved: the source lists unresolved questions only
  t.scheduler.runOnce('tick');
  assert.deepEqual(t.h.counts, [0, 1, 0]);
});

test('the due count counts questions, as the Desk does: a check-in and closing soon on one question is 1', () => {
  const t = harness({
    now: '2025-06-09T09:30:00.000Z',
    settings: { ...defaultSettings('UTC'), closing_soon_hours: 24 },
    questions: [planQuestion({ id: 'q', checkin_days: 7, closes_at: '2025-06-10T08:00:00.000Z' })],
  });
  const result = t.scheduler.runOnce('start');
  assert.equal(result.due, 2, 'two reminders are due');
  assert.deepEqual(t.h.counts, [1], 'one question needs attention');
});

test('single-nudge wording for every kind, and summary wording', () => {
  const close = ms('2025-03-26T17:00:00.000Z');
  const nudge = (kind: NudgeKind) => ({ question_id: 'q', title: 'Northgate phase 2', kind, due_at: close });
  const now = ms('2025-03-31T09:00:00.000Z');
  assert.deepEqual(nudgeMessage(nudge('checkin'), close, 24, 'UTC', now), { title: 'Check-in due', body: 'Check-in due: Northgate phase 2' });
  assert.deepEqual(nudgeMessage(nudge('closing_soon'), close, 36, 'UTC', now), { title: 'Closing soon', body: 'Closes within 36 h: Northgate phase 2' });
  assert.deepEqual(nudgeMessage(nudge('window_closed'), close, 24, 'UTC', now), {
    title: 'Window closed',
    body: 'Window closed: Northgate phase 2 — how did it resolve?',
  });
  // 03-26 → 03-31 is 5 calendar days.
  assert.deepEqual(nudgeMessage(nudge('overdue'), close, 24, 'UTC', now), { title: 'Overdue', body: 'Overdue: Northgate phase 2 closed 5 days ago' });
  assert.equal(nudgeMessage(nudge('overdue'), close, 24, 'UTC', ms('2025-03-27T01:00:00.000Z')).body, 'Overdue: Northgate phase 2 closed 1 day ago');
  assert.equal(nudgeMessage(nudge('overdue'), close, 24, 'UTC', ms('2025-03-26T18:00:00.000Z')).body, 'Overdue: Northgate phase 2 closed today');
  const kinds: NudgeKind[] = ['overdue', 'checkin', 'window_closed', 'checkin', 'checkin', 'closing_soon'];
  assert.equal(summaryMessage(kinds.map(nudge), 'away').body, '6 nudges while you were away: 2 to resolve, 1 closing soon, 3 check-ins');
  assert.equal(summaryMessage(kinds.slice(0, 2).map(nudge), 'quiet').body, '2 nudges during quiet hours: 1 to resolve, 1 check-in');
});

/** A fake of the node-cron module: records tasks and lets the test fire their function. */
function fakeCron() {
  const tasks: { expression: string; fn: () => void; events: string[] }[] = [];
  const module: CronModule = {
    createTask(expression, fn) {
      const task = { expression, fn, events: [] as string[] };
      tasks.push(task);
      return {
        start: () => void task.events.push('start'),
        stop: () => void task.events.push('stop'),
        destroy: () => void task.events.push('destroy'),
      };
    },
  };
  return { module, tasks };
}

test('start() creates and starts a minute task, runs once at start, and the task ticks; stop() stops it', () => {
  const t = harness({
    now: '2025-06-02T08:00:00.000Z',
    settings: defaultSettings('UTC'),
    questions: [
      planQuestion({ id: 'now', checkin_days: 0, closes_at: '2025-06-01T00:00:00.000Z' }),
      planQuestion({ id: 'soon', checkin_days: 1, opened_at: '2025-06-01T08:01:00.000Z', closes_at: '2025-07-01T00:00:00.000Z' }),
    ],
  });
  const scheduler = t.scheduler;
  const cronFake = fakeCron();
  scheduler.start(cronFake.module);
  assert.equal(cronFake.tasks.length, 1);
  const [task] = cronFake.tasks;
  assert.equal(task?.expression, '* * * * *');
  assert.deepEqual(task?.events, ['start']);
  assert.deepEqual(t.h.sent.map((s) => s.question_id), ['now']); // the start-up run
  scheduler.start(cronFake.module); // already started: no second task
  assert.equal(cronFake.tasks.length, 1);

  t.h.now = ms('2025-06-02T08:01:00.000Z');
  task?.fn(); // what node-cron does each minute
  assert.deepEqual(t.h.sent.map((s) => s.question_id), ['now', 'soon']);

  scheduler.stop();
  assert.deepEqual(task?.events, ['start', 'stop', 'destroy']);
  scheduler.stop(); // not started: nothing to do
  assert.deepEqual(task?.events, ['start', 'stop', 'destroy']);
  scheduler.start(cronFake.module);
  assert.equal(cronFake.tasks.length, 2);
  scheduler.stop();
  assert.deepEqual(cronFake.tasks[1]?.events, ['start', 'stop', 'destroy']);
});

test('with the real node-cron module, start() registers a started minute task and stop() removes it', () => {
  // The scheduler requires node-cron when it starts (as the bundled app does), so its task
  // is in the registry of the module `require` gives, not of an ES-module import.
  const cron = createRequire(import.meta.url)('node-cron') as typeof import('node-cron');
  const t = harness({ now: '2025-06-02T08:00:00.000Z', settings: defaultSettings('UTC'), questions: [] });
  const before = new Set(cron.getTasks().keys());
  t.scheduler.start();
  const added = [...cron.getTasks().values()].filter((task) => !before.has(task.id));
  assert.equal(added.length, 1);
  assert.equal(added[0]?.getPattern(), '* * * * *');
  assert.equal(added[0]?.name, 'forelog-nudges');
  assert.equal(added[0]?.getStatus(), 'idle'); // started and waiting for the next minute
  assert.deepEqual(t.h.counts, [0]); // the start-up run happened
  t.scheduler.stop();
  assert.equal(added[0]?.getStatus(), 'destroyed');
  assert.deepEqual([...cron.getTasks().keys()].filter((id) => !before.has(id)), []);
});
