/**
 * A snoozed nudge does not vanish: `due` lists it apart with when it comes back, the
 * question shows its running snoozes, and `unsnooze` ends them.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { exportJson, openTestDiary } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

async function setup() {
  const d = openTestDiary({ now: iso(NOW) });
  // A check-in (7 days after the last revision) and closing soon (within 24 h) are both due.
  const q = await d.call('createQuestion', {
    title: 'Canal bridge reopens before the festival',
    opened_at: iso(NOW - 20 * DAY),
    closes_at: iso(NOW + 12 * 3_600_000),
    first_forecast: { p: 0.4, at: iso(NOW - 9 * DAY) },
  });
  return { d, q };
}

const kinds = (list: { kind: string }[]) => list.map((n) => n.kind);

test('a snoozed nudge is listed apart, with when it comes back, until the moment it does', async () => {
  const { d, q } = await setup();
  assert.deepEqual(kinds((await d.call('due', {})).nudges), ['checkin', 'closing_soon']);
  const until = NOW + 3 * 3_600_000;
  await d.call('snooze', { question_id: q.id, kind: 'checkin', until: iso(until) });
  const due = await d.call('due', {});
  assert.deepEqual(kinds(due.nudges), ['closing_soon']);
  assert.equal(due.snoozed.length, 1);
  assert.deepEqual(
    (({ id, kind, until: back, due_at, title }) => ({ id, kind, until: back, due_at, title }))(due.snoozed[0]),
    { id: q.id, kind: 'checkin', until: iso(until), due_at: iso(NOW - 2 * DAY), title: q.title },
  );
  assert.equal(due.snoozed[0].last_p, 0.4, 'with what the Desk shows beside a nudge');
  assert.deepEqual((await d.call('getQuestion', { id: q.id })).snoozes, [{ kind: 'checkin', until: iso(until) }]);
  // One millisecond before the snooze ends it still hides the nudge; at its end the nudge is back.
  assert.deepEqual(kinds((await d.call('due', { at: iso(until - 1) })).snoozed), ['checkin']);
  const back = await d.call('due', { at: iso(until) });
  assert.deepEqual([kinds(back.nudges), back.snoozed], [['checkin', 'closing_soon'], []]);
  d.clock.now = until;
  assert.deepEqual((await d.call('getQuestion', { id: q.id })).snoozes, [], 'a snooze that has run out is not shown');
});

test('unsnooze ends one kind or all, and refuses when nothing is snoozed, changing nothing', async () => {
  const { d, q } = await setup();
  await d.call('snooze', { question_id: q.id, kind: 'checkin', preset: 'hour' });
  await d.call('snooze', { question_id: q.id, kind: 'closing_soon', preset: 'hour' });
  assert.deepEqual(kinds((await d.call('due', {})).snoozed), ['checkin', 'closing_soon']);
  const one = await d.call('unsnooze', { question_id: q.id, kind: 'checkin' });
  assert.deepEqual(one.kinds, ['checkin']);
  assert.deepEqual(kinds((await d.call('due', {})).nudges), ['checkin']);
  const rest = await d.call('unsnooze', { question_id: q.id });
  assert.deepEqual(rest.kinds, ['closing_soon']);
  assert.deepEqual([kinds((await d.call('due', {})).nudges), (await d.call('getQuestion', { id: q.id })).snoozes], [['checkin', 'closing_soon'], []]);
  const before = exportJson(d.service);
  await assert.rejects(d.call('unsnooze', { question_id: q.id, kind: 'overdue' }), (err: unknown) => {
    assert.ok(err instanceof ApiError);
    assert.equal(err.code, 'not_found');
    assert.equal(err.message, '“Canal bridge reopens before the festival” has no snooze running on its overdue nudge, so nothing was changed. Reload to see its nudges as they are.');
    return true;
  });
  await assert.rejects(d.call('unsnooze', { question_id: 'nope' }), (err: unknown) => err instanceof ApiError && err.code === 'not_found');
  await assert.rejects(d.call('unsnooze', { question_id: q.id, kind: 'later' as never }), (err: unknown) => err instanceof ApiError && err.code === 'invalid' && /kind: must be one of/.test(err.message));
  assert.equal(exportJson(d.service), before);
});
