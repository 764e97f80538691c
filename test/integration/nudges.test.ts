/**
 * Nudges on a real diary file: what `due` reports, snoozing, revising and resolving, and
 * the scheduler's delivery log surviving a restart (nothing delivered twice).
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { test } from 'node:test';
import { openDiary } from '../../main/service/index';
import { openTestDiary } from '../support/temp-diary';

const HOUR = 3_600_000;

async function diaryWithClosedQuestion() {
  const d = openTestDiary({ now: '2026-03-02T09:00:00Z', timeZone: 'Europe/London' });
  const closed = await d.call('createQuestion', {
    title: 'Phase-2 statement of work signed',
    closes_at: '2026-03-10T17:00:00Z',
    time_zone: 'Europe/London',
    first_forecast: { p: 0.6 },
  });
  const open = await d.call('createQuestion', {
    title: 'Pilot reaches 500 weekly users',
    closes_at: '2026-06-30T17:00:00+01:00',
    time_zone: 'Europe/London',
    first_forecast: { p: 0.3 },
  });
  return { d, closed, open };
}

test('due lists exactly what the rules give at an instant', async () => {
  const { d, closed } = await diaryWithClosedQuestion();
  const kinds = async (at: string) =>
    (await d.call('due', { at })).nudges.map((n: { id: string; kind: string }) => `${n.id === closed.id ? 'closed' : 'open'}:${n.kind}`);
  assert.deepEqual(await kinds('2026-03-02T10:00:00Z'), []);
  // Check-in: 7 days after the first forecast, same wall-clock time (09:00 London = 09:00Z in March).
  assert.deepEqual(await kinds('2026-03-09T08:59:00Z'), []);
  assert.deepEqual(await kinds('2026-03-09T09:00:00Z'), ['closed:checkin', 'open:checkin']);
  // Closing soon: from 24 h before the close.
  assert.deepEqual(await kinds('2026-03-09T17:00:00Z'), ['closed:checkin', 'open:checkin', 'closed:closing_soon']);
  // Window closed, then overdue after 3 days.
  assert.deepEqual(await kinds('2026-03-10T17:00:00Z'), ['open:checkin', 'closed:window_closed']);
  assert.deepEqual(await kinds('2026-03-13T17:00:00Z'), ['open:checkin', 'closed:overdue']);
  const due = await d.call('due', { at: '2026-03-10T17:00:00Z' });
  assert.equal(due.at, '2026-03-10T17:00:00.000Z');
  assert.deepEqual(
    Object.keys(due.nudges[1]).slice(0, 4),
    ['id', 'title', 'kind', 'due_at'],
  );
  assert.equal(due.nudges[1].due_at, '2026-03-10T17:00:00.000Z');
});

test('revising clears a check-in, snoozing hides a nudge until its time, resolving clears everything', async () => {
  const { d, closed, open } = await diaryWithClosedQuestion();
  d.clock.now = Date.parse('2026-03-09T12:00:00Z');
  await d.call('addForecast', { question_id: open.id, p: 0.35, note: 'usage up' });
  let due = await d.call('due', {});
  assert.deepEqual(due.nudges.map((n: { id: string }) => n.id), [closed.id]);

  const snoozed = await d.call('snooze', { question_id: closed.id, kind: 'checkin', preset: 'hour' });
  assert.equal(snoozed.until, '2026-03-09T13:00:00.000Z');
  assert.deepEqual((await d.call('due', {})).nudges, []);
  d.clock.now += HOUR;
  assert.equal((await d.call('due', {})).nudges.length, 1, 'back when the snooze runs out');

  const morning = await d.call('snooze', { question_id: closed.id, kind: 'checkin', preset: 'tomorrow_morning' });
  assert.equal(morning.until, '2026-03-10T09:00:00.000Z', '09:00 London time (GMT in March)');

  d.clock.now = Date.parse('2026-03-11T09:00:00Z');
  due = await d.call('due', {});
  assert.ok(due.nudges.some((n: { kind: string }) => n.kind === 'window_closed'));
  await d.call('resolveQuestion', { id: closed.id, outcome: 'yes' });
  due = await d.call('due', {});
  assert.ok(due.nudges.every((n: { id: string }) => n.id !== closed.id));
  await assert.rejects(d.call('snooze', { question_id: closed.id, kind: 'overdue', preset: 'hour' }), /resolved/);
  await assert.rejects(d.call('snooze', { question_id: open.id, kind: 'nagging' as never, preset: 'hour' }), /kind: must be one of/);
});

test('dueCount is the number of questions the Desk lists; resolved and void questions get nothing', async () => {
  const { d, closed, open } = await diaryWithClosedQuestion();
  const both = async (at: string) => {
    const due = await d.call('due', { at });
    const count = await d.call('dueCount', { at });
    assert.equal(count.at, due.at);
    return { ids: [...new Set(due.nudges.map((n: { id: string }) => n.id))], count: count.count };
  };
  // The closed question has a check-in and its closing-soon warning: one question, two nudges.
  assert.deepEqual(await both('2026-03-09T17:00:00Z'), { ids: [closed.id, open.id], count: 2 });
  assert.deepEqual(await both('2026-03-02T10:00:00Z'), { ids: [], count: 0 });
  d.clock.now = Date.parse('2026-03-09T17:00:00Z');
  await d.call('snooze', { question_id: open.id, kind: 'checkin', preset: 'hour' });
  assert.deepEqual(await both('2026-03-09T17:30:00Z'), { ids: [closed.id], count: 1 });
  for (const outcome of ['void', 'yes'] as const) {
    await d.call('resolveQuestion', { id: closed.id, outcome });
    assert.deepEqual(await both('2026-04-30T12:00:00Z'), { ids: [open.id], count: 1 }, outcome);
    await d.call('reopenQuestion', { id: closed.id });
  }
  await assert.rejects(d.call('dueCount', { at: 'soon' }), /at: must be an ISO 8601/);
});

test('the due list and count follow changes at once, from this window or from another process on the same file', async () => {
  const { d, closed, open } = await diaryWithClosedQuestion();
  const at = '2026-03-11T09:00:00Z';
  d.clock.now = Date.parse('2026-03-11T08:00:00Z');
  assert.equal((await d.call('dueCount', { at })).count, 2, 'the closed question, and the open one with its check-in due');
  await d.call('resolveQuestion', { id: closed.id, outcome: 'yes', at: '2026-03-10T18:00:00Z' });
  assert.equal((await d.call('dueCount', { at })).count, 1, "this window's own resolution is seen");
  // Another process (a second connection to the same file) revises the open question.
  const other = openDiary({ dbPath: d.dbPath, now: () => Date.parse('2026-03-11T08:00:00Z'), timeZone: 'Europe/London' });
  try {
    const answer = await other.dispatch('addForecast', { question_id: open.id, p: 0.35 });
    assert.equal(answer.ok, true, JSON.stringify(answer));
  } finally {
    other.close();
  }
  assert.equal((await d.call('dueCount', { at })).count, 0, "another process's revision resets the check-in here too");
  assert.deepEqual((await d.call('due', { at })).nudges, []);
});

test('the latest revision by time anchors the check-in and is the one listed, whatever order they were entered in', async () => {
  const d = openTestDiary({ now: '2026-03-02T09:00:00Z' });
  const q = await d.call('createQuestion', {
    title: 'Depot sale completes',
    closes_at: '2026-06-30T17:00:00Z',
    opened_at: '2026-02-01T09:00:00Z',
    first_forecast: { p: 0.2, at: '2026-02-01T09:00:00Z' },
  });
  await d.call('addForecast', { question_id: q.id, p: 0.4, at: '2026-02-20T10:00:00Z' });
  // Entered later but back-dated: not the latest.
  await d.call('addForecast', { question_id: q.id, p: 0.9, at: '2026-02-10T10:00:00Z' });
  let due = await d.call('due', { at: '2026-02-27T10:00:00Z' });
  assert.deepEqual(due.nudges.map((n: { kind: string; due_at: string; last_p: number; last_forecast_at: string }) => [n.kind, n.due_at, n.last_p, n.last_forecast_at]), [
    ['checkin', '2026-02-27T10:00:00.000Z', 0.4, '2026-02-20T10:00:00.000Z'],
  ]);
  assert.equal((await d.call('due', { at: '2026-02-27T09:59:59.999Z' })).nudges.length, 0, 'not a millisecond early');
  // Two revisions at one instant: the one entered last stands.
  await d.call('addForecast', { question_id: q.id, p: 0.45, at: '2026-02-20T10:00:00Z' });
  due = await d.call('due', { at: '2026-02-27T10:00:00Z' });
  assert.equal(due.nudges[0].last_p, 0.45);
  assert.equal(due.nudges[0].closes_at, '2026-06-30T17:00:00.000Z');
  assert.equal(due.nudges[0].time_zone, 'UTC');
});

test('the scheduler delivers each nudge once, across a restart of the app', async () => {
  const { d } = await diaryWithClosedQuestion();
  const sent: { title: string; body: string; question_id: string | null }[] = [];
  const notifier = { notify: (n: (typeof sent)[number]) => void sent.push(n) };
  d.clock.now = Date.parse('2026-03-10T17:30:00Z');
  const first = d.service.createScheduler(notifier);
  first.runOnce('tick');
  const afterFirst = sent.length;
  assert.ok(afterFirst >= 1);
  first.runOnce('tick');
  assert.equal(sent.length, afterFirst, 'nothing twice');

  // Restart: a new process opening the same file.
  d.service.close();
  const reopened = openDiary({ dbPath: d.dbPath, now: () => d.clock.now, timeZone: 'Europe/London' });
  try {
    reopened.createScheduler(notifier).runOnce('start');
    assert.equal(sent.length, afterFirst, 'the delivery log survived the restart');
  } finally {
    reopened.close();
  }
});

test('forelog due --json prints the documented shape', async () => {
  const { d } = await diaryWithClosedQuestion();
  const root = path.resolve(import.meta.dirname, '..', '..');
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'main', 'cli.ts'), 'due', '--at', '2026-03-11T00:00:00Z', '--json', '--db', d.dbPath], {
    cwd: root,
    encoding: 'utf8',
  });
  assert.equal(r.status, 0, r.stderr);
  const out = JSON.parse(r.stdout);
  assert.equal(out.at, '2026-03-11T00:00:00.000Z');
  assert.deepEqual(out.nudges.map((n: object) => Object.keys(n)), [
    ['id', 'title', 'kind', 'due_at'],
    ['id', 'title', 'kind', 'due_at'],
  ]);
  assert.deepEqual(out.nudges.map((n: { kind: string }) => n.kind), ['checkin', 'window_closed']);
  const bad = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'main', 'cli.ts'), 'due', '--at', 'tomorrow', '--db', d.dbPath], { cwd: root, encoding: 'utf8' });
  assert.equal(bad.status, 1);
  assert.match(bad.stderr, /--at tomorrow is not a time Forelog can read; write 2026-03-31T17:00 \(on the diary's clock, .*\) or 2026-03-31T17:00\+01:00/);
});
