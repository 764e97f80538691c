/**
 * The pure parts of the forgiving screens: a change of several steps is undone newest first
 * (renderer/src/forgiving/undoSteps.ts); the diary's warning is shown without its advice to
 * API callers (warningText.ts); a typed time is checked as the diary checks it, at the
 * millisecond either side of each edge (timeChecks.ts, shared/time-rules.ts); the Desk's
 * snoozed section lists each question once, back when its first snooze ends (desk/snoozed.ts);
 * a merge's conflicts are counted as people count (settings/importConflicts.ts).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import type { UndoResult } from '../../shared/contract';
import type { SnoozedNudge } from '../../shared/domain';
import { CLOCK_SKEW_MS, earlyStateResolutionWarning } from '../../shared/time-rules';
import { typedTimeProblem } from '../../renderer/src/forgiving/timeChecks';
import { undoneMessage, undoSteps } from '../../renderer/src/forgiving/undoSteps';
import { warningText } from '../../renderer/src/forgiving/warningText';
import { snoozedItems } from '../../renderer/src/screens/desk/snoozed';
import { conflictLine } from '../../renderer/src/screens/settings/importConflicts';

const undone = (question_id: string): UndoResult => ({ question_id, operation: 'snooze', question: null });

test('the steps of one change are undone newest first, and the last answer is kept', async () => {
  const order: string[] = [];
  const result = await undoSteps(['first', 'second', 'third'], async (token) => {
    order.push(token);
    return undone(token);
  });
  assert.deepEqual(order, ['third', 'second', 'first']);
  assert.equal(result.question_id, 'first');
  await assert.rejects(undoSteps([], async () => undone('x')), /nothing to undo/);
});

test('a refused step stops the undo there: older steps are not tried', async () => {
  const order: string[] = [];
  await assert.rejects(
    undoSteps(['a', 'b', 'c'], async (token) => {
      order.push(token);
      if (token === 'b') throw new Error('changed since');
      return undone(token);
    }),
    /changed since/,
  );
  assert.deepEqual(order, ['c', 'b']);
});

test('after undoing, the toast names the question, or says it is gone when the change created it', () => {
  assert.equal(undoneMessage(undone('q'), 'Depot lease signed'), 'Undone: “Depot lease signed” is no longer in the diary.');
  const back = { ...undone('q'), question: { title: 'Depot lease signed (renamed)' } } as UndoResult;
  assert.equal(undoneMessage(back, 'Depot lease signed'), 'Undone: “Depot lease signed (renamed)” is back as it was.');
});

test('the warning dialog shows the diary’s reason without its advice to API callers', () => {
  const reason = earlyStateResolutionWarning('Backlog below 50', 'yes', Date.parse('2026-06-30T16:00:00Z'), 'Europe/London');
  const shown = warningText(reason);
  assert.ok(reason.includes('confirm: true'), 'the diary’s message carries the advice');
  assert.ok(!shown.includes('Nothing was changed.'));
  // The close is written as every date in the window is, not as the diary's neutral text.
  assert.match(shown, /^“Backlog below 50” asks about the state of things at its close, (30 Jun 2026, 17:00|Jun 30, 2026, 5:00 PM) GMT\+1, .* a Yes before the close is unusual\.$/);
  assert.ok(!shown.includes('2026-06-30 17:00 Europe/London'));
  assert.equal(warningText('Some other reason.'), 'Some other reason.', 'a message without the advice is shown whole');
});

test('a typed time: up to 5 minutes ahead of the clock counts as now, one millisecond more is refused', () => {
  const now = Date.parse('2026-12-02T12:00:00.000Z');
  const at = (ms: number) => new Date(ms).toISOString();
  assert.equal(typedTimeProblem(at(now + CLOCK_SKEW_MS), 'a revision', undefined, now), null);
  assert.match(typedTimeProblem(at(now + CLOCK_SKEW_MS + 1), 'a revision', undefined, now) ?? '', /^Must not be in the future: a revision records something that has already happened/);
  assert.match(typedTimeProblem(at(now + CLOCK_SKEW_MS + 1), 'a resolution', undefined, now) ?? '', /a resolution records/);
});

test('a typed time: at the opening is fine, one millisecond before is refused, naming the opening on its clock', () => {
  const now = Date.parse('2026-12-02T12:00:00.000Z');
  const opening = { opened_at: '2026-11-02T09:30:00.000Z', time_zone: 'Europe/London' };
  const opened = Date.parse(opening.opened_at);
  assert.equal(typedTimeProblem(new Date(opened).toISOString(), 'a revision', opening, now), null);
  // In the window's words: the opening as the window writes dates, no request name (opened_at).
  assert.equal(
    typedTimeProblem(new Date(opened - 1).toISOString(), 'a revision', opening, now, 'en-GB'),
    "Must not be before the question opened (2 Nov 2026, 09:30 GMT); if it happened earlier, first move the question's opening time back",
  );
  // A question opened "now" from a form has seconds; its opening is still written as a date of the window.
  const posed = { opened_at: '2026-11-23T14:50:46.120Z', time_zone: 'Europe/London' };
  assert.equal(
    typedTimeProblem('2020-01-01T14:57:00.000Z', 'a resolution', posed, now, 'en-US'),
    "Must not be before the question opened (Nov 23, 2026, 2:50 PM GMT); if it happened earlier, first move the question's opening time back",
  );
  // A reference forecast may be older than the question: only the future is checked.
  assert.equal(typedTimeProblem(new Date(opened - 86_400_000).toISOString(), 'a reference forecast', undefined, now), null);
});

test('the snoozed section lists each question once, back at its first snooze’s end, soonest first', () => {
  const nudge = (id: string, kind: SnoozedNudge['kind'], until: string): SnoozedNudge => ({
    id,
    title: `Question ${id}`,
    kind,
    due_at: '2026-12-01T09:00:00.000Z',
    closes_at: '2027-01-01T00:00:00.000Z',
    time_zone: 'Europe/London',
    type: 'binary',
    last_p: 0.5,
    last_forecast_at: null,
    stale: false,
    until,
  });
  const items = snoozedItems([
    nudge('a', 'checkin', '2026-12-09T09:00:00.000Z'),
    nudge('b', 'checkin', '2026-12-03T09:00:00.000Z'),
    nudge('a', 'closing_soon', '2026-12-03T09:00:00.001Z'),
  ]);
  assert.deepEqual(items, [
    { id: 'b', title: 'Question b', back: Date.parse('2026-12-03T09:00:00.000Z') },
    { id: 'a', title: 'Question a', back: Date.parse('2026-12-03T09:00:00.001Z') },
  ]);
  assert.deepEqual(snoozedItems([]), []);
});

test('a merge conflict is placed as people count: question 1 is the first; CSV by its row', () => {
  assert.equal(
    conflictLine({ index: 0, row: null, id: 'late-june', title: 'Signed in June', differs: ['resolution'] }),
    'Question 1, “Signed in June” (late-june): differs in resolution',
  );
  assert.equal(
    conflictLine({ index: 3, row: 9, id: 'x', title: 'Budget', differs: ['title', 'forecasts'] }),
    'The question on row 9, “Budget” (x): differs in title, forecasts',
  );
});
