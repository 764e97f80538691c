/**
 * Times written on a clock: what `forelog due` prints and how --from/--to/--at without an
 * offset are read (shared/time.ts), across a daylight-saving change.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { formatLocal, parseInstant, parseLocalInZone, toIso, wallTimeAt, wallTimeToInstant, type WallTime } from '../../shared/time';

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

test('an instant in the export’s own spelling reads as the same instant spelled with an offset', () => {
  // "+00:00" takes the general reading (regular expressions, Date.parse); "Z" with milliseconds the short one.
  const general = (text: string) => parseInstant(text.replace(/Z$/, '+00:00'));
  const texts = [
    '2026-03-31T16:00:00.000Z', '1900-01-01T00:00:00.000Z', '2199-12-31T23:59:59.999Z', '1000-01-01T00:00:00.000Z', '0999-12-31T23:59:59.999Z',
    '2024-02-29T12:00:00.000Z', '2023-02-29T12:00:00.000Z', '2100-02-29T12:00:00.000Z', '2000-02-29T12:00:00.000Z', '2026-04-31T00:00:00.000Z',
    '2026-13-01T00:00:00.000Z', '2026-00-01T00:00:00.000Z', '2026-01-00T00:00:00.000Z', '2026-01-32T00:00:00.000Z',
    '2026-01-01T24:00:00.000Z', '2026-01-01T23:60:00.000Z', '2026-01-01T23:59:60.000Z', '2026-01-01T23:59:59.99Z', '2026-01-01t23:59:59.999Z',
    '2026-01-01T23:59:59.999z', '2026-1-01T23:59:59.999ZZ', '2026-01-01 23:59:59.999Z', '+026-01-01T23:59:59.999Z', '2026-01-01T23:59:59,999Z',
  ];
  let seed = 5;
  const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  for (let i = 0; i < 5000; i++) texts.push(toIso(Math.floor(Date.UTC(1000, 0, 1) + next() * (Date.UTC(2400, 0, 1) - Date.UTC(1000, 0, 1)))));
  for (const text of texts) assert.equal(parseInstant(text), general(text), text);
  assert.equal(parseInstant('2024-02-29T12:00:00.000Z'), Date.UTC(2024, 1, 29, 12));
  assert.equal(parseInstant('2023-02-29T12:00:00.000Z'), null);
  assert.equal(parseInstant('2026-01-01T23:59:59.999z'), Date.UTC(2026, 0, 1, 23, 59, 59, 999), 'a lower-case z, read the general way');
});

test('wall times become the same instants with remembered day offsets as when Intl is asked each time, across every transition', () => {
  // The oracle: the RFC 5545 resolution of wallTimeToInstant with every offset asked afresh.
  const offsetAt = (ms: number, zone: string) => {
    const w = wallTimeAt(ms, zone);
    return Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - Math.floor(ms / 1000) * 1000;
  };
  const oracle = (w: WallTime, zone: string) => {
    const naive = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
    const before = offsetAt(naive - 86_400_000, zone);
    const after = offsetAt(naive + 86_400_000, zone);
    for (const t of [naive - before, naive - after].sort((a, b) => a - b)) {
      if (offsetAt(t, zone) === naive - t) return t;
    }
    return naive - before;
  };
  // Zones with an hour's change, half an hour's (Lord Howe), a negative summer offset (Dublin),
  // a skipped calendar day (Apia, end of 2011), changes at odd times (Casablanca, St John's).
  const zones = ['Europe/London', 'America/New_York', 'Australia/Lord_Howe', 'Europe/Dublin', 'Pacific/Apia', 'Africa/Casablanca', 'America/St_Johns', 'Asia/Kathmandu'];
  let checked = 0;
  for (const zone of zones) {
    for (let day = Date.UTC(2011, 0, 1); day < Date.UTC(2014, 0, 1); day += 86_400_000) {
      const d = new Date(day);
      for (const [hour, minute] of [[0, 30], [1, 30], [2, 0], [2, 30], [3, 0], [23, 59]] as const) {
        const wall = { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate(), hour, minute, second: 0 };
        assert.equal(wallTimeToInstant(wall, zone), oracle(wall, zone), `${zone} ${JSON.stringify(wall)}`);
        checked++;
      }
    }
  }
  assert.ok(checked > 50_000);
});

test('a wall time in a zone whose offset had seconds (local mean time) is read to the second, and reads back the same', () => {
  // tzdata: Monrovia kept −0:44:30 until 1972-01-07; Kolkata (Madras time) +5:21:10 until 1906.
  assert.equal(toIso(parseLocalInZone('1960-06-01T12:00', 'Africa/Monrovia')!), '1960-06-01T12:44:30.000Z');
  assert.equal(toIso(parseLocalInZone('1901-01-01T05:21:10', 'Asia/Kolkata')!), '1901-01-01T00:00:00.000Z');
  assert.equal(formatLocal(Date.parse('1960-06-01T12:44:30Z'), 'Africa/Monrovia'), '1960-06-01 12:00');
  // Every noon (never in a gap) from 1900 to 1975 comes back as the same wall time.
  for (const zone of ['Africa/Monrovia', 'Asia/Kolkata', 'Europe/Dublin', 'Africa/Abidjan', 'Asia/Kathmandu', 'Europe/Moscow']) {
    for (let day = Date.UTC(1900, 0, 1); day < Date.UTC(1975, 0, 1); day += 86_400_000) {
      const d = new Date(day);
      const wall: WallTime = { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate(), hour: 12, minute: 0, second: 0 };
      assert.deepEqual(wallTimeAt(wallTimeToInstant(wall, zone), zone), wall, `${zone} ${toIso(day).slice(0, 10)}`);
    }
  }
});
