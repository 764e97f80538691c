/**
 * Revision and reference ids are UUID version 7 (RFC 9562 §5.7) and strictly increasing as
 * text, also within one millisecond and when the clock steps back (§6.2), so a large
 * import appends to the end of the id index.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { orderedId } from '../../main/service/ordered-ids';

const UUID_V7 = /^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

test('ids are UUIDv7 carrying the millisecond, and each is greater than the one before', () => {
  const at = Date.UTC(2026, 5, 1, 12);
  let last = '';
  // Many in one millisecond, then the clock stepping back, then forward again.
  const clock = [...Array<number>(50_000).fill(at), at - 5_000, at - 5_000, at + 1, at + 1, at + 2];
  for (const ms of clock) {
    const id = orderedId(ms);
    assert.match(id, UUID_V7);
    assert.ok(id > last, `${id} after ${last}`);
    last = id;
  }
  const first = orderedId(at + 10);
  assert.equal(Number.parseInt(first.slice(0, 8) + first.slice(9, 13), 16), at + 10, 'the first 48 bits are the Unix time in ms');
});
