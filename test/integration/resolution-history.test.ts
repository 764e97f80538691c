/**
 * Correcting a resolution, or reopening a question, keeps the resolution it replaces:
 * what it said, when it was recorded, when it was replaced and why. The question shows its
 * history, and the JSON diary file carries it as an optional field that round-trips byte
 * for byte (docs/diary-file.md, "Resolution history").
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { exportJson, openTestDiary } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

async function resolvedQuestion() {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await d.call('createQuestion', {
    title: 'Ashwell pilot reaches 500 weekly users',
    opened_at: iso(NOW - 60 * DAY),
    closes_at: iso(NOW - 5 * DAY),
    first_forecast: { p: 0.3, at: iso(NOW - 60 * DAY) },
  });
  await d.call('resolveQuestion', { id: q.id, outcome: 'no', at: iso(NOW - 5 * DAY), note: '480 users' });
  return { d, q };
}

test('a correction and a reopening each keep the resolution they replace, oldest first', async () => {
  const { d, q } = await resolvedQuestion();
  const recorded = d.clock.now;
  d.clock.now += 3 * DAY;
  let r = await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(NOW - 6 * DAY), note: '512 users', correction_note: 'the dashboard counted one site twice' });
  assert.deepEqual(r.resolution, { outcome: 'yes', at: iso(NOW - 6 * DAY), note: '512 users' });
  assert.deepEqual(r.resolution_history, [
    {
      outcome: 'no',
      at: iso(NOW - 5 * DAY),
      note: '480 users',
      recorded_at: iso(recorded),
      replaced_at: iso(recorded + 3 * DAY),
      change: 'corrected',
      change_note: 'the dashboard counted one site twice',
    },
  ]);
  d.clock.now += DAY;
  r = await d.call('reopenQuestion', { id: q.id, note: 'the client disputes the count' });
  assert.equal(r.resolution, null);
  assert.deepEqual(r.resolution_history.map((h: { outcome: string; change: string; change_note: string; recorded_at: string }) => [h.outcome, h.change, h.change_note, h.recorded_at]), [
    ['no', 'corrected', 'the dashboard counted one site twice', iso(recorded)],
    ['yes', 'reopened', 'the client disputes the count', iso(recorded + 3 * DAY)],
  ]);
  r = await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(NOW - 6 * DAY) });
  assert.equal(r.resolution_history.length, 2, 'resolving a reopened question replaces nothing');
  assert.deepEqual(await d.call('getQuestion', { id: q.id }), (({ undo: _u, ...rest }) => rest)(r));
});

test('resolving again exactly as before adds no history; the fields that make no sense are refused', async () => {
  const { d, q } = await resolvedQuestion();
  const again = await d.call('resolveQuestion', { id: q.id, outcome: 'no', at: iso(NOW - 5 * DAY), note: '480 users' });
  assert.deepEqual(again.resolution_history, [], 'a second click is not a correction');
  const open = await d.call('createQuestion', { title: 'Still open', opened_at: iso(NOW - DAY), closes_at: iso(NOW + DAY) });
  for (const [op, request, field] of [
    ['resolveQuestion', { id: open.id, outcome: 'yes', correction_note: 'why' }, /^correction_note: is for correcting a resolution/],
    ['reopenQuestion', { id: open.id }, /^id: this question is not resolved/],
  ] as const) {
    const before = exportJson(d.service);
    await assert.rejects(d.call(op, request as never), (err: unknown) => err instanceof ApiError && err.code === 'invalid' && err.fields.some((f) => field.test(f)));
    assert.equal(exportJson(d.service), before);
  }
});

test('the JSON file carries the history only where there is one, and export → import → export is byte-identical', async () => {
  const { d, q } = await resolvedQuestion();
  await d.call('createQuestion', { title: 'Never corrected', opened_at: iso(NOW - DAY), closes_at: iso(NOW + DAY) });
  d.clock.now += DAY;
  await d.call('resolveQuestion', { id: q.id, outcome: 'void', note: 'pilot cancelled', correction_note: 'scope changed' });
  const text = exportJson(d.service);
  const file = JSON.parse(text) as { questions: { title: string; resolution_history?: unknown[] }[] };
  const corrected = file.questions.find((x) => x.title.startsWith('Ashwell'))!;
  assert.deepEqual(corrected.resolution_history, [
    { outcome: 'no', at: iso(NOW - 5 * DAY), note: '480 users', recorded_at: iso(NOW), replaced_at: iso(NOW + DAY), change: 'corrected', change_note: 'scope changed' },
  ]);
  assert.equal(Object.keys(corrected).at(-1), 'resolution_history', 'written after the resolution');
  assert.ok(!('resolution_history' in file.questions.find((x) => x.title === 'Never corrected')!), 'absent when empty, as files were before');
  const again = openTestDiary({ now: iso(NOW + 10 * DAY) });
  await again.call('importText', { format: 'json', text });
  assert.equal(exportJson(again.service), text);
  const api = await again.call('exportDiary', {});
  assert.equal(`${JSON.stringify(api, null, 2)}\n`, text, 'the in-memory export writes the same');
});

test('a written history imports as given (notes optional), and a bad entry is named by its place', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const entry = { outcome: 'yes', at: '2026-03-01T10:00:00Z', recorded_at: '2026-03-01T11:00:00Z', replaced_at: '2026-03-04T09:00:00+01:00', change: 'corrected' };
  const question = { id: 'h1', title: 'Corrected elsewhere', closes_at: '2026-03-02T00:00:00Z', forecasts: [], resolution: { outcome: 'no', at: '2026-03-01T10:00:00Z' }, resolution_history: [entry] };
  await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [question] } });
  assert.deepEqual((await d.call('getQuestion', { id: 'h1' })).resolution_history, [
    { outcome: 'yes', at: '2026-03-01T10:00:00.000Z', note: '', recorded_at: '2026-03-01T11:00:00.000Z', replaced_at: '2026-03-04T08:00:00.000Z', change: 'corrected', change_note: '' },
  ]);
  const bad = { ...question, id: 'h2', resolution_history: [entry, { ...entry, change: 'edited' }] };
  await assert.rejects(
    d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [bad] } }),
    (err: unknown) => err instanceof ApiError && err.message === 'Question 1 (questions[0], “Corrected elsewhere”) is not valid: field resolution_history[1].change: must be corrected or reopened. Nothing was imported.',
  );
  // Deleting the question takes its history with it.
  await d.call('deleteQuestion', { id: 'h1' });
  assert.equal((d.service.store.read.prepare('SELECT count(*) AS n FROM resolution_history').get() as { n: number }).n, 0);
});
