/**
 * Toasts on screen (renderer/src/components/toastList.ts): the same message shown again —
 * Undo pressed several times in a row — is one toast shown again, not a pile of twins; a
 * toast with an Undo button is always its own, since each undoes a different change.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { MOST_TOASTS, withToast, type ToastItem } from '../../renderer/src/components/toastList';

const undone = 'Undone: “Depot lease signed” is back as it was.';

test('the same message without an action shown three times is one toast, shown three times', () => {
  let list: ToastItem[] = [];
  for (let id = 1; id <= 3; id++) list = withToast(list, { message: undone }, id);
  assert.equal(list.length, 1);
  assert.equal(list[0]?.id, 1);
  assert.equal(list[0]?.shown, 3);
});

test('a different message, tone or link is a toast of its own', () => {
  let list: ToastItem[] = withToast([], { message: undone }, 1);
  list = withToast(list, { message: 'Undone: “Harbour pilot” is back as it was.' }, 2);
  list = withToast(list, { message: undone, tone: 'error' }, 3);
  list = withToast(list, { message: undone, action: { label: 'Open question', href: '#/questions/a' } }, 4);
  assert.deepEqual(list.map((t) => t.id), [1, 2, 3, 4]);
  // The same link again is a repeat; another question's link is not.
  list = withToast(list, { message: undone, action: { label: 'Open question', href: '#/questions/a' } }, 5);
  assert.deepEqual(list.map((t) => [t.id, t.shown]), [[1, 1], [2, 1], [3, 1], [4, 2]]);
});

test('a toast with a button is always new: each Undo belongs to its own change', () => {
  let list: ToastItem[] = [];
  for (let id = 1; id <= 2; id++) list = withToast(list, { message: 'Revision saved.', action: { label: 'Undo', onClick: () => {} } }, id);
  assert.deepEqual(list.map((t) => t.id), [1, 2]);
});

test('at most a few toasts stay; the oldest goes first', () => {
  let list: ToastItem[] = [];
  for (let id = 1; id <= MOST_TOASTS + 2; id++) list = withToast(list, { message: `Message ${id}` }, id);
  assert.equal(list.length, MOST_TOASTS);
  assert.equal(list[0]?.id, 3);
  assert.equal(list.at(-1)?.id, MOST_TOASTS + 2);
});
