/**
 * Times written on a clock: what `forelog due` prints and how --from/--to/--at without an
 * offset are read (shared/time.ts), across a daylight-saving change.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { formatLocal, parseLocalInZone, wallTimeAt } from '../../shared/time';

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

test('the wall-clock reading is the one the formatter’s parts give, in every zone and era', () => {
  // The reference: the parts of the same formatter wallTimeAt uses (shared/time.ts).
  const byParts = (ms: number, zone: string) => {
    const parts = new Intl.DateTimeFormat('en-US', { timeZone: zone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' }).formatToParts(new Date(ms));
    const get = (type: string) => Number(parts.find((p) => p.type === type)!.value);
    return { year: get('year'), month: get('month'), day: get('day'), hour: get('hour') % 24, minute: get('minute'), second: get('second') };
  };
  const zones = ['UTC', 'Europe/London', 'America/New_York', 'Asia/Kolkata', 'Australia/Lord_Howe', 'Pacific/Kiritimati', 'America/St_Johns', 'Asia/Kathmandu'];
  let seed = 11;
  const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  // One-millisecond neighbours of midnight and of a DST change, the ends of the Date range, and random instants 1600–2400.
  const instants = [0, -1, 1, Date.UTC(2026, 2, 29, 1) - 1, Date.UTC(2026, 2, 29, 1), Date.UTC(2026, 9, 25, 1), -8.64e15, 8.64e15, Date.UTC(1, 0, 1), -62198755200000];
  for (let i = 0; i < 3000; i++) instants.push(Math.floor(Date.UTC(1600, 0, 1) + next() * (Date.UTC(2400, 0, 1) - Date.UTC(1600, 0, 1))));
  for (const zone of zones) for (const ms of instants) assert.deepEqual(wallTimeAt(ms, zone), byParts(ms, zone), `${zone} ${ms}`);
});
