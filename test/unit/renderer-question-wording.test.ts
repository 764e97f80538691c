/** What the question page says it did: words that match the question's state. */
import assert from 'node:assert/strict';
import test from 'node:test';
import { reopenWording } from '../../renderer/src/screens/question/questionFacts';

test('reopening a question whose window is still open says it is open again, not awaiting a resolution', () => {
  const now = Date.parse('2026-12-03T13:00:00Z');
  const open = reopenWording({ closes_at: '2027-01-27T17:00:00Z', time_zone: 'Europe/London' }, now);
  assert.match(open.done, /^Reopened; it is open again until its close, (Jan 27, 2027|27 Jan 2027)/);
  assert.doesNotMatch(open.effect, /waits for a resolution/);
  const closed = reopenWording({ closes_at: '2026-11-27T17:00:00Z', time_zone: 'Europe/London' }, now);
  assert.equal(closed.done, 'Reopened; the question awaits a resolution again.');
  assert.equal(closed.effect, 'the question waits for a resolution again');
});

test('a revision that repeats the latest numbers of a choice or numeric question counts as keeping them', async () => {
  const { repeatsLatest } = await import('../../renderer/src/screens/question/typedFacts');
  const entry = (at: string, seq: number) => ({ id: `f${seq}`, at, note: '', seq });
  const choice = {
    type: 'choice',
    options: ['Alder', 'Birch'],
    forecasts: [
      { ...entry('2026-11-01T09:00:00Z', 1), probs: [0.3, 0.7] },
      { ...entry('2026-11-20T09:00:00Z', 2), probs: [0.6, 0.4] },
    ],
  } as unknown as Parameters<typeof repeatsLatest>[0];
  assert.equal(repeatsLatest(choice, { probs: [0.6, 0.4] }), true, 'the latest, not the first');
  assert.equal(repeatsLatest(choice, { probs: [0.3, 0.7] }), false);
  const numeric = {
    type: 'numeric',
    levels: [0.1, 0.5, 0.9],
    forecasts: [{ ...entry('2026-11-01T09:00:00Z', 1), quantiles: ['2027-01-10', '2027-01-20', '2027-02-01'] }],
  } as unknown as Parameters<typeof repeatsLatest>[0];
  assert.equal(repeatsLatest(numeric, { quantiles: ['2027-01-10', '2027-01-20', '2027-02-01'] }), true);
  assert.equal(repeatsLatest(numeric, { quantiles: ['2027-01-10', '2027-01-21', '2027-02-01'] }), false);
  assert.equal(repeatsLatest({ ...numeric, forecasts: [] } as typeof numeric, { quantiles: [1, 2, 3] }), false, 'a first forecast keeps nothing');
});
