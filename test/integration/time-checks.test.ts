/**
 * Time is checked wherever a user types one (shared/time-rules.ts): nothing recorded as
 * having happened may lie in the future (beyond 5 minutes of clock difference) or before
 * the question opened; a question about the state at its close resolved Yes or No before
 * that close needs a confirmation. Each edge is tested with its one-millisecond
 * neighbours on a fixed clock. Importing a file is a record kept elsewhere: exempt.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { CLOCK_SKEW_MS } from '../../shared/time-rules';
import { exportJson, openTestDiary, type TestDiary } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();
/** The last instant that still counts as now, and the first that is the future. */
const LATEST = NOW + CLOCK_SKEW_MS;

/** Asserts a refusal with this code whose field lines match `field`, and that the diary did not change. */
async function refused(d: TestDiary, call: Promise<unknown>, code: string, field: RegExp): Promise<ApiError> {
  const before = exportJson(d.service);
  let caught: ApiError | undefined;
  await assert.rejects(call, (err: unknown) => {
    assert.ok(err instanceof ApiError, String(err));
    assert.equal(err.code, code, err.message);
    assert.ok(err.fields.some((f) => field.test(f)), `${err.fields.join(' | ')} should match ${field}`);
    caught = err;
    return true;
  });
  assert.equal(exportJson(d.service), before, 'nothing was changed');
  return caught!;
}

async function openQuestion(d: TestDiary, over: Record<string, unknown> = {}) {
  return d.call('createQuestion', {
    title: 'Harbourside lease is renewed',
    opened_at: iso(NOW - 30 * DAY),
    closes_at: iso(NOW + 30 * DAY),
    first_forecast: { p: 0.4, at: iso(NOW - 29 * DAY) },
    ...over,
  });
}

test('a question may open up to now (with 5 minutes for clock differences), never later', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await d.call('createQuestion', { title: 'Opens at the edge', opened_at: iso(LATEST), closes_at: iso(NOW + DAY) });
  assert.equal(q.opened_at, iso(LATEST));
  assert.equal(q.forecasts.length, 0);
  const err = await refused(
    d,
    d.call('createQuestion', { title: 'Opens tomorrow', opened_at: iso(LATEST + 1), closes_at: iso(NOW + DAY) }),
    'invalid',
    /^opened_at: must not be in the future/,
  );
  assert.match(err.message, /5 minutes/);
  // A first revision without a time of its own is made at the opening when that is a moment ahead.
  const edge = await d.call('createQuestion', { title: 'Edge with a call', opened_at: iso(LATEST), closes_at: iso(NOW + DAY), first_forecast: { p: 0.5 } });
  assert.equal(edge.forecasts[0].at, iso(LATEST));
});

test('a call already made, on a window already closed, is recorded honestly and scored', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await d.call('createQuestion', {
    title: 'Quayside tenant signs before the summer break',
    opened_at: iso(NOW - 60 * DAY),
    closes_at: iso(NOW - 10 * DAY),
    first_forecast: { p: 0.7, at: iso(NOW - 50 * DAY), note: 'written down at the time, entered now' },
  });
  assert.equal(q.forecasts[0].at, iso(NOW - 50 * DAY));
  const [row] = (await d.call('listQuestions', {})).questions;
  assert.equal(row.status, 'awaiting', 'its window has closed; it waits for a resolution');
  await d.call('addForecast', { question_id: q.id, p: 0.8, at: iso(NOW - 20 * DAY) });
  await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(NOW - 12 * DAY) });
  const { report } = await d.call('score', {});
  assert.equal(report.scored, 1);
  assert.ok(Math.abs(report.brier - 0.04) < 1e-12, 'the final forecast before the close, 0.8, is scored');
});

test('a first forecast must lie between the opening and now; all problems are named at once', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const opened = NOW - 10 * DAY;
  const at = await openQuestion(d, { opened_at: iso(opened), first_forecast: { p: 0.3, at: iso(opened) } });
  assert.equal(at.forecasts[0].at, iso(opened), 'at the opening itself');
  await refused(
    d,
    openQuestion(d, { opened_at: iso(opened), first_forecast: { p: 0.3, at: iso(opened - 1) } }),
    'invalid',
    /^first_forecast\.at: must not be before the question opened \(2026-05-22 12:00 UTC\)/,
  );
  await refused(d, openQuestion(d, { first_forecast: { p: 0.3, at: iso(LATEST + 1) } }), 'invalid', /^first_forecast\.at: must not be in the future/);
  const edge = await openQuestion(d, { first_forecast: { p: 0.3, at: iso(LATEST) } });
  assert.equal(edge.forecasts[0].at, iso(LATEST));
  // Without an opening time the question opens now, so an earlier first forecast is refused with the way out.
  await refused(
    d,
    d.call('createQuestion', { title: 'No opening given', closes_at: iso(NOW + DAY), first_forecast: { p: 0.3, at: iso(NOW - DAY) } }),
    'invalid',
    /^first_forecast\.at: must not be before the question opened.*opened_at/,
  );
  const both = await refused(
    d,
    openQuestion(d, { opened_at: iso(LATEST + 1), closes_at: iso(NOW + 2 * DAY), first_forecast: { p: 0.3, at: iso(LATEST + 2) } }),
    'invalid',
    /^opened_at:/,
  );
  assert.deepEqual(
    both.fields.map((f) => f.split(':')[0]),
    ['opened_at', 'first_forecast.at'],
    'every problem in one answer',
  );
});

test('a revision, added or moved, lies between the opening and now', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await openQuestion(d);
  const opened = Date.parse(q.opened_at);
  await refused(d, d.call('addForecast', { question_id: q.id, p: 0.5, at: iso(opened - 1) }), 'invalid', /^at: must not be before the question opened/);
  await refused(d, d.call('addForecast', { question_id: q.id, p: 0.5, at: iso(LATEST + 1) }), 'invalid', /^at: must not be in the future/);
  let r = await d.call('addForecast', { question_id: q.id, p: 0.5, at: iso(opened) });
  r = await d.call('addForecast', { question_id: q.id, p: 0.55, at: iso(LATEST) });
  r = await d.call('addForecast', { question_id: q.id, p: 0.6 });
  assert.deepEqual(
    r.forecasts.map((f: { at: string }) => f.at),
    [iso(opened), iso(NOW - 29 * DAY), iso(NOW), iso(LATEST)],
  );
  const id = r.forecasts[1].id;
  await refused(d, d.call('updateForecast', { id, at: iso(opened - 1) }), 'invalid', /^at: must not be before the question opened/);
  await refused(d, d.call('updateForecast', { id, at: iso(LATEST + 1) }), 'invalid', /^at: must not be in the future/);
  r = await d.call('updateForecast', { id, at: iso(LATEST), p: 0.65 });
  const moved = r.forecasts.find((f: { id: string }) => f.id === id);
  assert.deepEqual([moved.at, moved.p], [iso(LATEST), 0.65]);
});

test('a reference forecast may predate the question (an older outside view) but not lie in the future', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await openQuestion(d);
  const old = await d.call('addReference', { question_id: q.id, p: 0.25, source: 'last year’s sector survey', at: iso(NOW - 400 * DAY) });
  assert.equal(old.references[0].at, iso(NOW - 400 * DAY));
  const edge = await d.call('addReference', { question_id: q.id, p: 0.3, source: 'client', at: iso(LATEST) });
  assert.equal(edge.references.at(-1).at, iso(LATEST));
  await refused(d, d.call('addReference', { question_id: q.id, p: 0.3, source: 'client', at: iso(LATEST + 1) }), 'invalid', /^at: must not be in the future/);
});

test('a resolution lies between the opening and now', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await openQuestion(d);
  const opened = Date.parse(q.opened_at);
  await refused(d, d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(LATEST + 1) }), 'invalid', /^at: must not be in the future/);
  await refused(d, d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(opened - 1) }), 'invalid', /^at: must not be before the question opened/);
  const r = await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(LATEST) });
  assert.equal(r.resolution.at, iso(LATEST));
  const early = await openQuestion(d, { title: 'Resolved at its opening' });
  assert.equal((await d.call('resolveQuestion', { id: early.id, outcome: 'no', at: iso(opened) })).resolution.at, iso(opened));
});

test('a state-at-deadline question resolved Yes or No before its close asks for a confirmation first', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const close = NOW - DAY;
  const q = await openQuestion(d, { kind: 'state_at_deadline', closes_at: iso(close), time_zone: 'Europe/London', title: 'Backlog below 50 at the review' });
  const warning = await refused(d, d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(close - 1) }), 'confirm', /^at: is before the close/);
  assert.match(warning.message, /“Backlog below 50 at the review” asks about the state of things at its close, 2026-05-31 13:00 Europe\/London/);
  assert.match(warning.message, /Nothing was changed/);
  assert.match(warning.message, /confirm/);
  await refused(d, d.call('resolveQuestion', { id: q.id, outcome: 'no', at: iso(close - 1), confirm: false }), 'confirm', /^at:/);
  const confirmed = await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(close - 1), confirm: true });
  assert.equal(confirmed.resolution.outcome, 'yes');

  // At the close itself, or void, or an event-by-deadline question: no question asked.
  const atClose = await openQuestion(d, { kind: 'state_at_deadline', closes_at: iso(close) });
  assert.equal((await d.call('resolveQuestion', { id: atClose.id, outcome: 'no', at: iso(close) })).resolution.outcome, 'no');
  const voided = await openQuestion(d, { kind: 'state_at_deadline', closes_at: iso(close) });
  assert.equal((await d.call('resolveQuestion', { id: voided.id, outcome: 'void', at: iso(close - 1) })).resolution.outcome, 'void');
  const event = await openQuestion(d, { closes_at: iso(NOW + 10 * DAY) });
  assert.equal((await d.call('resolveQuestion', { id: event.id, outcome: 'yes' })).resolution.outcome, 'yes');
  // Over HTTP the warning is a 409 like other refusals of the diary's state (main/transport/http.ts).
  const envelope = await d.service.dispatch('resolveQuestion', { id: (await openQuestion(d, { kind: 'state_at_deadline' })).id, outcome: 'yes' });
  assert.equal(envelope.ok ? 'ok' : envelope.error.code, 'confirm');
});

test('editing the opening may not leave a revision or the resolution before it, nor lie in the future', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await openQuestion(d);
  const first = Date.parse(q.forecasts[0].at);
  const err = await refused(d, d.call('updateQuestion', { id: q.id, changes: { opened_at: iso(first + 1) } }), 'invalid', /^changes\.opened_at: must not be after the question's first revision \(2026-05-03 12:00 UTC\)/);
  assert.match(err.message, /move or delete that revision first/);
  const moved = await d.call('updateQuestion', { id: q.id, changes: { opened_at: iso(first) } });
  assert.equal(moved.opened_at, iso(first));
  await refused(d, d.call('updateQuestion', { id: q.id, changes: { opened_at: iso(LATEST + 1) } }), 'invalid', /^changes\.opened_at: must not be in the future/);

  const bare = await d.call('createQuestion', { title: 'No revisions yet', opened_at: iso(NOW - 20 * DAY), closes_at: iso(NOW - DAY) });
  await d.call('resolveQuestion', { id: bare.id, outcome: 'no', at: iso(NOW - 5 * DAY) });
  await refused(d, d.call('updateQuestion', { id: bare.id, changes: { opened_at: iso(NOW - 5 * DAY + 1) } }), 'invalid', /^changes\.opened_at: must not be after the question's resolution time/);
  assert.equal((await d.call('updateQuestion', { id: bare.id, changes: { opened_at: iso(NOW - 5 * DAY) } })).opened_at, iso(NOW - 5 * DAY));
});

test('an imported file keeps its own times: revisions before the opening or past this clock are a record from elsewhere', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const file = {
    format: 'forelog-diary',
    version: 1,
    questions: [
      {
        id: 'elsewhere',
        title: 'Written on a laptop whose clock ran a day ahead',
        kind: 'state_at_deadline',
        opened_at: iso(NOW - 10 * DAY),
        closes_at: iso(NOW + 20 * DAY),
        forecasts: [
          { at: iso(NOW - 11 * DAY), p: 0.4 },
          { at: iso(NOW + DAY), p: 0.5 },
        ],
        references: [{ at: iso(NOW + DAY), p: 0.3, source: 'desk' }],
        resolution: { outcome: 'yes', at: iso(NOW + 2 * DAY), note: 'early, on that clock' },
      },
    ],
  };
  assert.deepEqual(await d.call('importDiary', { diary: file }), { added: 1, skipped: 0 });
  const q = await d.call('getQuestion', { id: 'elsewhere' });
  assert.deepEqual(q.forecasts.map((f: { at: string }) => f.at), [iso(NOW - 11 * DAY), iso(NOW + DAY)]);
  // Editing such a revision's number alone does not trip over the time it came with.
  const edited = await d.call('updateForecast', { id: q.forecasts[0].id, p: 0.45 });
  assert.equal(edited.forecasts[0].p, 0.45);
});
