/**
 * What the lists keep in the address: the Questions list's search, status, tag and order
 * (renderer/src/screens/questions/listQuery.ts), the Scorecard's filter
 * (scorecard/filterRequest.ts) and Hindsight's selection (hindsight/selection.ts) read back
 * exactly as written, leave defaults out of the address, and fall back to the defaults on
 * an address edited by hand.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { DEFAULT_QUERY, countCaption, decodeListQuery, encodeListQuery, nextSort, type ListQuery } from '../../renderer/src/screens/questions/listQuery';
import { decodeFilter, encodeFilter } from '../../renderer/src/screens/scorecard/filterRequest';
import { INITIAL_SELECTION, decodeSelection, encodeSelection } from '../../renderer/src/screens/hindsight/selection';

/** The query string the address would carry (replaceQuery leaves empty values out). */
function address(fields: Record<string, string>): URLSearchParams {
  return new URLSearchParams(Object.entries(fields).filter(([, v]) => v !== ''));
}

test('the Questions list state reads back as written, defaults left out of the address', () => {
  assert.equal(address(encodeListQuery(DEFAULT_QUERY)).toString(), '');
  assert.deepEqual(decodeListQuery(new URLSearchParams()), DEFAULT_QUERY);
  const state: ListQuery = { text: 'harbour & co?', status: 'awaiting', tag: 'client:northgate', sort: 'last_p', direction: 'desc' };
  assert.deepEqual(decodeListQuery(address(encodeListQuery(state))), state);
  // Edited by hand: an unknown status or order falls back to the default.
  assert.deepEqual(decodeListQuery(new URLSearchParams('status=nope&sort=colour&dir=up')), DEFAULT_QUERY);
});

test('a column header sorts ascending first, and again reverses', () => {
  assert.deepEqual(nextSort(DEFAULT_QUERY, 'title'), { sort: 'title', direction: 'asc' });
  assert.deepEqual(nextSort({ ...DEFAULT_QUERY, sort: 'title' }, 'title'), { sort: 'title', direction: 'desc' });
  assert.deepEqual(nextSort({ ...DEFAULT_QUERY, sort: 'title', direction: 'desc' }, 'title'), { sort: 'title', direction: 'asc' });
  assert.deepEqual(nextSort({ ...DEFAULT_QUERY, sort: 'title', direction: 'desc' }, 'closes'), { sort: 'closes', direction: 'asc' });
});

test('the Scorecard filter and Hindsight selection read back as written', () => {
  const filter = { tag: 'renewals', from: '2026-03-01', to: '2026-03-31', whatIfFalseAlarm: '1', whatIfMiss: '4.5' };
  assert.deepEqual(decodeFilter(address(encodeFilter(filter))), filter);
  const none = { tag: '', from: '', to: '', whatIfFalseAlarm: '', whatIfMiss: '' };
  assert.equal(address(encodeFilter(none)).toString(), '');
  assert.deepEqual(decodeFilter(new URLSearchParams()), none);

  assert.equal(address(encodeSelection(INITIAL_SELECTION)).toString(), '');
  assert.deepEqual(decodeSelection(new URLSearchParams()), INITIAL_SELECTION);
  // A half-typed threshold is kept as typed: the screen shows it with its problem.
  const selection = { tag: 'delivery', threshold: '8', from: '2026-01-01', to: '', includeHits: true };
  assert.deepEqual(decodeSelection(address(encodeSelection(selection))), selection);
});

test('the Questions list counts in words that agree with the number, digits grouped', () => {
  assert.equal(countCaption(1, 1, 'en-GB'), '1 question');
  assert.equal(countCaption(45, 45, 'en-GB'), '45 questions');
  assert.equal(countCaption(0, 1, 'en-GB'), '0 of 1 question');
  assert.equal(countCaption(1, 12_345, 'en-GB'), '1 of 12,345 questions');
});
