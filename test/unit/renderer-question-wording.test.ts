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
