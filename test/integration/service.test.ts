/**
 * The diary's operations on a real SQLite file: what a user relies on when they write,
 * revise, resolve and correct questions, and the refusals that leave the diary unchanged.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { exportJson, openTestDiary } from '../support/temp-diary';

const base = {
  title: 'Northgate signs the phase-2 statement of work',
  rule: 'Yes if a countersigned SOW is received by the close.',
  closes_at: '2026-09-30T17:00:00+01:00',
  tags: ['client:northgate', 'renewals'],
  base_rate: 0.3,
  base_rate_note: '6 of 20 comparable renewals',
  first_forecast: { p: 0.4, note: 'first look' },
};

async function rejects(promise: Promise<unknown>, code: string, field: RegExp): Promise<void> {
  await assert.rejects(promise, (err: unknown) => {
    assert.ok(err instanceof ApiError, 'an ApiError');
    assert.equal(err.code, code);
    assert.match(err.message, field);
    return true;
  });
}

test('a question keeps every field, its first forecast and stores times as UTC instants', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', { ...base, costs: { false_alarm: 1, miss: 4 }, checkin_days: 14, time_zone: 'Europe/London' });
  assert.equal(q.title, base.title);
  assert.equal(q.closes_at, '2026-09-30T16:00:00.000Z');
  assert.equal(q.opened_at, '2026-06-01T12:00:00.000Z');
  assert.deepEqual(q.tags, ['client:northgate', 'renewals']);
  assert.deepEqual(q.costs, { false_alarm: 1, miss: 4 });
  assert.equal(q.checkin_days, 14);
  assert.equal(q.time_zone, 'Europe/London');
  assert.equal(q.forecasts.length, 1);
  assert.equal(q.forecasts[0].p, 0.4);
  assert.equal(q.resolution, null);
  const again = await d.call('getQuestion', { id: q.id });
  const { undo, ...created } = q;
  assert.equal(typeof undo, 'string', 'the answer carries its undo token');
  assert.deepEqual(again, created);
});

test('probabilities are stored exactly as given, never rounded', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', { ...base, first_forecast: { p: 0.123456789012345 } });
  assert.equal(q.forecasts[0].p, 0.123456789012345);
});

test('revisions, references and resolution build the history; correction and reopening work', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', base);
  d.clock.now += 86_400_000;
  await d.call('addForecast', { question_id: q.id, p: 0.55, note: 'procurement signed off', lenses: [{ name: 'outside view', p: 0.3, weight: 1 }] });
  await d.call('addReference', { question_id: q.id, p: 0.7, source: "client's view" });
  d.clock.now += 86_400_000;
  let r = await d.call('resolveQuestion', { id: q.id, outcome: 'yes', note: 'SOW arrived' });
  assert.equal(r.forecasts.length, 2);
  assert.deepEqual(r.forecasts[1].lenses, [{ name: 'outside view', p: 0.3, weight: 1 }]);
  assert.equal(r.references[0].source, "client's view");
  assert.equal(r.resolution.outcome, 'yes');
  r = await d.call('resolveQuestion', { id: q.id, outcome: 'void', note: 'scope changed; not fair to score' });
  assert.equal(r.resolution.outcome, 'void');
  r = await d.call('reopenQuestion', { id: q.id });
  assert.equal(r.resolution, null);
});

test('editing and deleting a revision', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', base);
  const f = q.forecasts[0];
  let r = await d.call('updateForecast', { id: f.id, p: 0.45, note: 'typo fixed' });
  assert.equal(r.forecasts[0].p, 0.45);
  assert.equal(r.forecasts[0].note, 'typo fixed');
  r = await d.call('deleteForecast', { id: f.id });
  assert.equal(r.forecasts.length, 0);
  await rejects(d.call('deleteForecast', { id: f.id }), 'not_found', /No revision/);
});

test('invalid requests name the field and change nothing', async () => {
  const d = openTestDiary();
  await rejects(d.call('createQuestion', { ...base, title: '   ' }), 'invalid', /title: must not be empty/);
  await rejects(d.call('createQuestion', { ...base, first_forecast: { p: 1.5 } }), 'invalid', /first_forecast\.p: must be a probability/);
  await rejects(d.call('createQuestion', { ...base, base_rate: -0.1 }), 'invalid', /base_rate: must be a probability/);
  await rejects(d.call('createQuestion', { ...base, tags: ['Client Northgate'] }), 'invalid', /tags\[0\]: is not a valid tag/);
  await rejects(d.call('createQuestion', { ...base, closes_at: '31/03/2026' }), 'invalid', /closes_at: must be an ISO 8601/);
  await rejects(d.call('createQuestion', { ...base, closes_at: '2026-03-31T17:00:00' }), 'invalid', /closes_at: must be an ISO 8601/);
  await rejects(
    d.call('createQuestion', { ...base, opened_at: '2026-05-01T00:00:00Z', closes_at: '2026-04-01T00:00:00Z' }),
    'invalid',
    /closes_at: must be after the opening time/,
  );
  await rejects(d.call('createQuestion', { ...base, closes_at: '2026-01-01T00:00:00Z' }), 'invalid', /closes_at: must be in the future/);
  await rejects(d.call('createQuestion', { ...base, time_zone: 'Mars/Olympus' }), 'invalid', /time_zone: is not a time zone/);
  const list = await d.call('listQuestions', {});
  assert.equal(list.total, 0, 'nothing was written');

  const q = await d.call('createQuestion', base);
  await rejects(d.call('addForecast', { question_id: q.id, p: Number.NaN }), 'invalid', /p: /);
  await rejects(d.call('updateQuestion', { id: q.id, changes: { closes_at: '2026-05-01T00:00:00Z' } }), 'invalid', /closes_at: must be after/);
  await rejects(d.call('addForecast', { question_id: 'nope', p: 0.5 }), 'not_found', /No question with id "nope"/);
  const after = await d.call('getQuestion', { id: q.id });
  assert.equal(after.forecasts.length, 1);
  assert.equal(after.closes_at, q.closes_at);
});

test('list filters by status, tag and text', async () => {
  const d = openTestDiary();
  const a = await d.call('createQuestion', { ...base, title: 'Alpha renewal', closes_at: '2026-06-01T20:00:00Z' });
  const b = await d.call('createQuestion', { ...base, title: 'Beta pilot reaches 500 users', tags: ['pilots'], closes_at: '2026-12-01T00:00:00Z' });
  const c = await d.call('createQuestion', { ...base, title: 'Gamma ruling', tags: ['regulation'], closes_at: '2026-06-10T00:00:00Z' });
  await d.call('resolveQuestion', { id: c.id, outcome: 'no' });
  d.clock.now = Date.parse('2026-06-05T00:00:00Z');
  const v = await d.call('createQuestion', { ...base, title: 'Delta void', closes_at: '2026-07-01T00:00:00Z' });
  await d.call('resolveQuestion', { id: v.id, outcome: 'void' });
  const ids = async (req: object) => (await d.call('listQuestions', req)).questions.map((q: { id: string }) => q.id);
  assert.deepEqual(await ids({ status: 'awaiting' }), [a.id]);
  assert.deepEqual(await ids({ status: 'open' }), [b.id]);
  assert.deepEqual(await ids({ status: 'resolved' }), [c.id]);
  assert.deepEqual(await ids({ status: 'void' }), [v.id]);
  assert.deepEqual(await ids({ tag: 'pilots' }), [b.id]);
  assert.deepEqual(await ids({ text: 'PILOT' }), [b.id]);
  await d.call('addForecast', { question_id: c.id, p: 0.2, note: 'The Harbour hearing slipped again' });
  assert.deepEqual(await ids({ text: 'harbour hearing' }), [c.id], 'notes written with revisions are searched too');
  assert.deepEqual(await ids({ text: '100%' }), []);
  d.clock.now = Date.parse('2026-11-30T12:00:00Z');
  assert.deepEqual(await ids({ status: 'closing' }), [b.id]);
  const list = await d.call('listQuestions', {});
  assert.equal(list.total, 4);
  assert.deepEqual(
    list.tags.find((t: { tag: string }) => t.tag === 'renewals'),
    { tag: 'renewals', count: 2 },
  );
});

test('deleting a question removes its whole history', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', base);
  await d.call('addReference', { question_id: q.id, p: 0.5, source: 'steering committee' });
  await d.call('deleteQuestion', { id: q.id });
  await rejects(d.call('getQuestion', { id: q.id }), 'not_found', /No question/);
  const counts = d.service.store.read
    .prepare('SELECT (SELECT count(*) FROM forecasts) f, (SELECT count(*) FROM reference_forecasts) r, (SELECT count(*) FROM question_tags) t')
    .get();
  assert.deepEqual({ ...(counts as object) }, { f: 0, r: 0, t: 0 });
});

test('settings default, update with validation, and persist', async () => {
  const d = openTestDiary({ timeZone: 'Europe/London' });
  const s = await d.call('getSettings', {});
  assert.equal(s.default_checkin_days, 7);
  assert.equal(s.closing_soon_hours, 24);
  assert.equal(s.time_zone, 'Europe/London');
  const updated = await d.call('updateSettings', { default_checkin_days: 14, quiet_hours: { start: '22:00', end: '07:00' } });
  assert.equal(updated.default_checkin_days, 14);
  assert.deepEqual(updated.quiet_hours, { start: '22:00', end: '07:00' });
  await rejects(d.call('updateSettings', { quiet_hours: { start: '25:00', end: '07:00' } }), 'invalid', /quiet_hours\.start/);
  await rejects(d.call('updateSettings', { closing_soon_hours: 0 }), 'invalid', /closing_soon_hours/);
  await rejects(d.call('updateSettings', { bogus: 1 } as never), 'invalid', /bogus|Unrecognized/i);
});

test('a request with a field the operation does not take is refused, naming it, and changes nothing', async () => {
  // A misspelt optional field ("base_rat") would otherwise be dropped without a word and the
  // question saved without what the user meant to give it.
  const d = openTestDiary();
  const q = await d.call('createQuestion', { ...base, first_forecast: { p: 0.4 } });
  const before = exportJson(d.service);
  const refused: [string, unknown, RegExp][] = [
    ['createQuestion', { ...base, base_rat: 0.3 }, /^base_rat: is not a field of this request/],
    ['createQuestion', { ...base, first_forecast: { p: 0.4, nte: 'x' } }, /^first_forecast\.nte: is not a field/],
    ['createQuestion', { ...base, costs: { false_alarm: 1, miss: 2, extra: 3 } }, /^costs\.extra: is not a field/],
    ['addForecast', { question_id: q.id, p: 0.5, lenses: [{ name: 'a', p: 0.5, wieght: 2 }] }, /^lenses\[0\]\.wieght: is not a field/],
    ['resolveQuestion', { id: q.id, outcome: 'yes', when: '2026-05-01T00:00:00Z' }, /^when: is not a field/],
    ['getQuestion', { id: q.id, verbose: true }, /^verbose: is not a field/],
    ['score', { tags: 'x' }, /^tags: is not a field/],
  ];
  for (const [op, request, field] of refused) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, op);
    if (!answer.ok) {
      assert.equal(answer.error.code, 'invalid', op);
      assert.match(answer.error.fields[0] ?? '', field, op);
      assert.match(answer.error.message, /check its spelling.*Nothing was changed\.$/, op);
    }
  }
  assert.equal(exportJson(d.service), before);
  // The diary inside importDiary is a diary file, whose unknown fields are ignored as the format says.
  const file = { format: 'forelog-diary', version: 1, comment: 'from a script', questions: [{ title: 'Q', closes_at: '2027-01-01T00:00:00Z', forecasts: [], colour: 'red' }] };
  assert.equal((await d.call('importDiary', { diary: file })).added, 1);
});

test('a request breaking thousands of rules is refused with every problem in fields, and a message that names the first ten and counts the rest', async () => {
  // A script's request with a misspelt field in each of many entries: the sentence for a
  // person stays a sentence rather than megabytes of text.
  const d = openTestDiary();
  const q = await d.call('createQuestion', { ...base });
  const before = exportJson(d.service);
  const request = { id: q.id, ...Object.fromEntries(Array.from({ length: 2500 }, (_, i) => [`extra${i}`, i])) };
  const answer = await d.service.dispatch('getQuestion', request as never);
  assert.equal(answer.ok, false);
  if (!answer.ok) {
    assert.equal(answer.error.code, 'invalid');
    assert.equal(answer.error.fields.length, 2500);
    assert.equal(answer.error.fields[2499], 'extra2499: is not a field of this request; check its spelling, or leave it out');
    assert.match(answer.error.message, /^The request was not accepted: extra0: .*; extra9: is not a field of this request; check its spelling, or leave it out; and 2,490 more \(each is listed in fields\)\. Nothing was changed\.$/);
    assert.doesNotMatch(answer.error.message, /extra10:/);
  }
  // Ten problems are all named.
  const ten = await d.service.dispatch('getQuestion', { id: q.id, ...Object.fromEntries(Array.from({ length: 10 }, (_, i) => [`extra${i}`, i])) } as never);
  assert.ok(!ten.ok && ten.error.message.includes('extra9: is not a field') && !ten.error.message.includes('more ('));
  assert.equal(exportJson(d.service), before);
});

test('a request of the wrong shape, or missing a field, is told so in plain words, not in the validator\'s', async () => {
  const d = openTestDiary();
  const cases: [string, unknown, string][] = [
    ['diaryInfo', [], 'must be an object of named fields ({ … }), not a list'],
    // A JSON null (an HTTP body of `null`) is not an empty request: it was run as one.
    ['due', null, 'must be an object of named fields ({ … }), not null'],
    ['updateQuestion', { id: 'x' }, 'changes: is required'],
    ['addForecast', { question_id: 'x', p: 0.5, lenses: [null] }, 'lenses[0]: must be an object of named fields ({ … }), not null'],
    ['createQuestion', { title: 'x', closes_at: '2030-01-01T00:00:00Z', first_forecast: [0.5] }, 'first_forecast: must be an object of named fields ({ … }), not a list'],
    ['importDiary', {}, 'diary: is required'],
    ['updateSettings', { bogus: 1 }, 'names "bogus", which is not a field here; check the spelling, or leave it out'],
  ];
  for (const [op, request, line] of cases) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, op);
    if (!answer.ok) {
      assert.deepEqual(answer.error.fields, [line], op);
      assert.doesNotMatch(answer.error.message, /Invalid input|Unrecognized|expected|received/, op);
    }
  }
  // A field left out is called missing; one of the wrong type keeps its own rule.
  const empty = await d.service.dispatch('createQuestion', {});
  assert.ok(!empty.ok);
  if (!empty.ok) assert.deepEqual(empty.error.fields, ['title: is required (it must be text)', 'closes_at: is required (it must be an ISO 8601 date-time text)']);
  const wrong = await d.service.dispatch('createQuestion', { title: 3, closes_at: null });
  assert.ok(!wrong.ok);
  if (!wrong.ok) assert.deepEqual(wrong.error.fields, ['title: must be text', 'closes_at: must be an ISO 8601 date-time text']);
  await assert.rejects(d.call('importText', { format: 'json', text: '{"format":"forelog-diary","version":1,"questions":[{"title":"No close","forecasts":[]}]}' }), {
    message: 'Question 1 (questions[0], “No close”) is not valid: field closes_at: is required (it must be an ISO 8601 date-time text) (the record starts on line 1). Nothing was imported.',
    // The field's line says what is wrong and in which question, not the whole message again.
    fields: ['closes_at: is required (it must be an ISO 8601 date-time text) (question 1)'],
  });
  const file = '{"format":"forelog-diary","version":1,"questions":[null]}';
  await assert.rejects(d.call('importText', { format: 'json', text: file }), {
    message: 'Question 1 (questions[0]) is not valid: field (record): must be an object of named fields ({ … }), not null (the record starts on line 1). Nothing was imported.',
  });
});

test('the scorecard follows every change at once (its cached input is dropped on each write)', async () => {
  const d = openTestDiary();
  const a = await d.call('createQuestion', { ...base, title: 'A', first_forecast: { p: 0.9 } });
  const b = await d.call('createQuestion', { ...base, title: 'B', first_forecast: { p: 0.2 } });
  await d.call('resolveQuestion', { id: a.id, outcome: 'yes' });
  let { report } = await d.call('score', {});
  assert.equal(report.scored, 1);
  assert.ok(Math.abs(report.brier - 0.01) < 1e-12, 'Brier of 0.9 on a Yes');
  await d.call('resolveQuestion', { id: b.id, outcome: 'yes' });
  ({ report } = await d.call('score', {}));
  assert.equal(report.scored, 2);
  assert.ok(Math.abs(report.brier - (0.01 + 0.64) / 2) < 1e-12);
  await d.call('updateForecast', { id: a.forecasts[0].id, p: 0.5 });
  ({ report } = await d.call('score', {}));
  assert.ok(Math.abs(report.brier - (0.25 + 0.64) / 2) < 1e-12, 'an edited revision is seen');
  const whatIf = await d.call('score', { costs: { false_alarm: 1, miss: 9 } });
  assert.equal(whatIf.report.decisions.hits, 2, 'what-if costs: act above 10%');
  ({ report } = await d.call('score', {}));
  assert.equal(report.decisions.hits, 0, 'what-if costs do not leak into the next answer (act above 50%)');
});

test('kept figures follow the diary: settings, a new resolution and each filter get their own answer', async () => {
  const d = openTestDiary();
  const a = await d.call('createQuestion', { ...base, title: 'A', tags: ['x'], first_forecast: { p: 0.3 } });
  const b = await d.call('createQuestion', { ...base, title: 'B', first_forecast: { p: 0.95 } });
  await d.call('resolveQuestion', { id: a.id, outcome: 'yes' });
  let { report } = await d.call('score', {});
  assert.equal(report.decisions.misses, 1, 'costs 1:1 act above 50 %: 0.3 on a Yes is a miss');
  await d.call('updateSettings', { default_false_alarm_cost: 1, default_miss_cost: 9 });
  ({ report } = await d.call('score', {}));
  assert.equal(report.decisions.misses, 0, 'costs 1:9 act above 10 %: 0.3 on a Yes is acted on');
  assert.equal(report.decisions.hits, 1);
  let hindsight = await d.call('hindsight', { threshold: 0.9 });
  assert.equal(hindsight.report.scored, 1);
  assert.equal(hindsight.misses, 0);
  await d.call('resolveQuestion', { id: b.id, outcome: 'no' });
  hindsight = await d.call('hindsight', { threshold: 0.9 });
  assert.equal(hindsight.report.scored, 2, 'Hindsight sees the new resolution');
  assert.equal(hindsight.misses, 1, '0.95 on a No is a confident miss');
  assert.equal((await d.call('score', { tag: 'x' })).report.scored, 1, 'a tag filter is its own answer');
  assert.equal((await d.call('score', {})).report.scored, 2);
  assert.equal((await d.call('hindsight', { threshold: 0.9, tag: 'x' })).report.scored, 1);
});

test('unknown operations are refused', async () => {
  const d = openTestDiary();
  const answer = await d.service.dispatch('dropEverything', {});
  assert.equal(answer.ok, false);
  assert.match(!answer.ok ? answer.error.message : '', /Unknown operation "dropEverything"/);
});
