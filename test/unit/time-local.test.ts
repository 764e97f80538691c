/**
 * Times written on a clock: what `forelog due` prints and how --from/--to/--at without an
 * offset are read (shared/time.ts), across a daylight-saving change.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { formatLocal, parseLocalInZone } from '../../shared/time';

test('a date and time without offset is read on the given clock, by RFC 5545 in a gap or a repeat', () => {
  const at = (text: string, zone = 'Europe/London') => {
    const ms = parseLocalInZone(text, zone);
    return ms === null ? null : new Date(ms).toISOString();
  };
  assert.equal(at('2026-07-01T00:00'), '2026-06-30T23:00:00.000Z');
  assert.equal(at('2026-01-15T09:30:15'), '2026-01-15T09:30:15.000Z');
  assert.equal(at('2026-03-29T01:30'), '2026-03-29T01:30:00.000Z', 'skipped when the clocks go forward: an hour later, 02:30 BST');
  assert.equal(at('2026-10-25T01:30'), '2026-10-25T00:30:00.000Z', 'repeated when they go back: the first one, BST');
  assert.equal(at('2026-07-01T00:00', 'Asia/Kolkata'), '2026-06-30T18:30:00.000Z');
  for (const other of ['2026-07-01', '2026-07-01T00:00Z', '2026-07-01T00:00+01:00', '2026-02-30T10:00', '2026-07-01T24:00', 'tomorrow']) {
    assert.equal(at(other), null, other);
  }
});

test('a time in a sentence is on the clock to the minute, with seconds only when there are some', () => {
  const ms = Date.parse('2026-07-08T08:00:00Z');
  assert.equal(formatLocal(ms, 'Europe/London'), '2026-07-08 09:00');
  assert.equal(formatLocal(ms + 1000, 'Europe/London'), '2026-07-08 09:00:01');
  assert.equal(formatLocal(ms + 999, 'Europe/London'), '2026-07-08 09:00', 'milliseconds are not shown');
  assert.equal(formatLocal(Date.parse('2026-12-31T23:59:59Z'), 'Pacific/Kiritimati'), '2027-01-01 13:59:59');
});
