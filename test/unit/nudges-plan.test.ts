/**
 * Nudge planning on a fixed clock. DST transition instants below are those of the IANA
 * tz database as listed by `zdump -v` (e.g. Europe/London 2025-03-30 01:00Z GMT→BST);
 * the gap/repeat rules are RFC 5545 §3.3.5; calendar arithmetic is the Gregorian
 * calendar's (2028 is a leap year: divisible by 4, not by 100).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { defaultSettings, type Settings } from '../../shared/domain';
import { addCalendarDays } from '../../shared/time';
import { planQuestion } from '../support/builders';
import { checkinAt, countDueQuestions, dueQuestionCount, planNudges, type Nudge, type PlanQuestion, type Snooze } from '../../main/nudges/plan';

const ms = (iso: string): number => Date.parse(iso);


function settings(over: Partial<Settings> = {}): Settings {
  return { ...defaultSettings('UTC'), ...over };
}

const summary = (nudges: Nudge[]) => nudges.map((n) => `${n.question_id}:${n.kind}@${new Date(n.due_at).toISOString()}`);

/** The check-in instant for a question last revised at `revisedAt` in `zone` with a cadence of `days`. */
function checkinFrom(revisedAt: string, days: number, zone: string): string {
  const q = planQuestion({ id: 'q', time_zone: zone, checkin_days: days, last_forecast_at: revisedAt });
  const at = checkinAt(q, settings());
  assert.ok(at !== null);
  return new Date(at).toISOString();
}

test('addCalendarDays follows the Gregorian calendar across month ends and leap days', () => {
  const wall = (y: number, m: number, d: number) => ({ year: y, month: m, day: d, hour: 9, minute: 0, second: 0 });
  // Gregorian calendar: 2028 is a leap year, 2027 and 2100 are not.
  assert.deepEqual(addCalendarDays(wall(2028, 2, 28), 1), wall(2028, 2, 29));
  assert.deepEqual(addCalendarDays(wall(2028, 2, 29), 1), wall(2028, 3, 1));
  assert.deepEqual(addCalendarDays(wall(2027, 2, 28), 1), wall(2027, 3, 1));
  assert.deepEqual(addCalendarDays(wall(2100, 2, 28), 1), wall(2100, 3, 1));
  assert.deepEqual(addCalendarDays(wall(2028, 1, 29), 31), wall(2028, 2, 29));
  assert.deepEqual(addCalendarDays(wall(2028, 2, 29), 365), wall(2029, 2, 28));
  assert.deepEqual(addCalendarDays(wall(2028, 3, 1), -1), wall(2028, 2, 29));
  assert.deepEqual(addCalendarDays(wall(2025, 12, 31), 1), wall(2026, 1, 1));
});

test('RFC 5545 §3.3.5 examples, America/New_York: repeated 01:30 is the first, skipped 02:30 reads with the offset before', () => {
  // RFC 5545 §3.3.5: 2007-11-04 01:30 New York → 05:30Z (EDT, first occurrence; the second would be 06:30Z).
  assert.equal(checkinFrom('2007-11-03T05:30:00.000Z', 1, 'America/New_York'), '2007-11-04T05:30:00.000Z');
  // RFC 5545 §3.3.5: 2007-03-11 02:30 New York (in the gap) → 07:30Z, i.e. 03:30 EDT.
  assert.equal(checkinFrom('2007-03-10T07:30:00.000Z', 1, 'America/New_York'), '2007-03-11T07:30:00.000Z');
});

test('weekly check-in keeps the wall-clock time across DST in New York, London and Sydney', () => {
  // tzdata: New York EST→EDT 2025-03-09 07:00Z; 09:00 EST = 14:00Z, 09:00 EDT = 13:00Z (derived: 167 h apart).
  assert.equal(checkinFrom('2025-03-03T14:00:00.000Z', 7, 'America/New_York'), '2025-03-10T13:00:00.000Z');
  // tzdata: New York EDT→EST 2025-11-02 06:00Z; 09:00 EDT = 13:00Z → 09:00 EST = 14:00Z (169 h).
  assert.equal(checkinFrom('2025-10-27T13:00:00.000Z', 7, 'America/New_York'), '2025-11-03T14:00:00.000Z');
  // tzdata: London BST→GMT 2025-10-26 01:00Z; 09:00 BST = 08:00Z → 09:00 GMT = 09:00Z.
  assert.equal(checkinFrom('2025-10-20T08:00:00.000Z', 7, 'Europe/London'), '2025-10-27T09:00:00.000Z');
  // tzdata: London GMT→BST 2025-03-30 01:00Z; 09:00 GMT = 09:00Z → 09:00 BST = 08:00Z.
  assert.equal(checkinFrom('2025-03-24T09:00:00.000Z', 7, 'Europe/London'), '2025-03-31T08:00:00.000Z');
  // tzdata: Sydney AEST→AEDT 2025-10-04 16:00Z; 09:00 AEST (+10) = 23:00Z → 09:00 AEDT (+11) = 22:00Z.
  assert.equal(checkinFrom('2025-09-28T23:00:00.000Z', 7, 'Australia/Sydney'), '2025-10-05T22:00:00.000Z');
  // tzdata: Sydney AEDT→AEST 2025-04-05 16:00Z; 04-01 09:00 AEDT = 03-31 22:00Z → 04-08 09:00 AEST = 04-07 23:00Z.
  assert.equal(checkinFrom('2025-03-31T22:00:00.000Z', 7, 'Australia/Sydney'), '2025-04-07T23:00:00.000Z');
});

test('check-ins keep the wall-clock time to the second in a zone whose offset had seconds', () => {
  // tzdata: Kolkata (Madras time) +5:21:10 in 1901: 05:21:10 local is 00:00:00Z, three days on too.
  assert.equal(checkinFrom('1901-01-01T00:00:00.000Z', 3, 'Asia/Kolkata'), '1901-01-04T00:00:00.000Z');
  // tzdata: Monrovia −0:44:30 until 1972-01-07, then UTC: 09:00 local is 09:44:30Z, then 09:00Z.
  assert.equal(checkinFrom('1960-03-01T09:44:30.000Z', 7, 'Africa/Monrovia'), '1960-03-08T09:44:30.000Z');
  assert.equal(checkinFrom('1972-01-03T09:44:30.000Z', 7, 'Africa/Monrovia'), '1972-01-10T09:00:00.000Z');
});

test('check-ins landing in a gap or a repeated hour follow RFC 5545 §3.3.5 in London and Sydney', () => {
  // London 2025-03-30 01:00–02:00 is skipped; 01:30 reads with GMT (the offset before) → 01:30Z = 02:30 BST.
  assert.equal(checkinFrom('2025-03-29T01:30:00.000Z', 1, 'Europe/London'), '2025-03-30T01:30:00.000Z');
  // London 2025-10-26 01:00–02:00 happens twice: 01:30 BST (00:30Z) first, 01:30 GMT (01:30Z) second.
  assert.equal(checkinFrom('2025-10-25T00:30:00.000Z', 1, 'Europe/London'), '2025-10-26T00:30:00.000Z');
  // Sydney 2025-10-05 02:00–03:00 is skipped; 02:30 reads with AEST (+10) → 16:30Z = 03:30 AEDT.
  assert.equal(checkinFrom('2025-10-03T16:30:00.000Z', 1, 'Australia/Sydney'), '2025-10-04T16:30:00.000Z');
  // Sydney 2025-04-06 02:00–03:00 happens twice: 02:30 AEDT (15:30Z) first, 02:30 AEST (16:30Z) second.
  assert.equal(checkinFrom('2025-04-04T15:30:00.000Z', 1, 'Australia/Sydney'), '2025-04-05T15:30:00.000Z');
});

test('check-ins count calendar days through a leap day', () => {
  // Gregorian calendar; London is on GMT (UTC+0) in January–March before the last Sunday.
  assert.equal(checkinFrom('2028-02-28T09:00:00.000Z', 1, 'Europe/London'), '2028-02-29T09:00:00.000Z');
  assert.equal(checkinFrom('2028-01-29T09:00:00.000Z', 31, 'Europe/London'), '2028-02-29T09:00:00.000Z');
  assert.equal(checkinFrom('2028-02-29T09:00:00.000Z', 1, 'Europe/London'), '2028-03-01T09:00:00.000Z');
  assert.equal(checkinFrom('2027-02-28T09:00:00.000Z', 1, 'Europe/London'), '2027-03-01T09:00:00.000Z');
  // 2028-02-22 + 7 = 2028-02-29 (leap day), 09:00 New York EST = 14:00Z.
  assert.equal(checkinFrom('2028-02-22T14:00:00.000Z', 7, 'America/New_York'), '2028-02-29T14:00:00.000Z');
});

test('a check-in comes due at its instant, not a millisecond before, and stays due until a revision', () => {
  // Opened 2025-03-03 09:00 EST (14:00Z), default cadence 7 → 2025-03-10 09:00 EDT = 13:00Z (tzdata as above).
  const q = planQuestion({ id: 'ny', time_zone: 'America/New_York', opened_at: '2025-03-03T14:00:00.000Z' });
  const s = settings();
  assert.deepEqual(planNudges([q], s, [], ms('2025-03-10T12:59:59.999Z')), []);
  assert.deepEqual(summary(planNudges([q], s, [], ms('2025-03-10T13:00:00.000Z'))), ['ny:checkin@2025-03-10T13:00:00.000Z']);
  assert.deepEqual(summary(planNudges([q], s, [], ms('2025-05-01T00:00:00.000Z'))), ['ny:checkin@2025-03-10T13:00:00.000Z']);
  // A revision moves the anchor: the next one is 7 calendar days after it, not after the opening.
  const revised = { ...q, last_forecast_at: ms('2025-03-12T15:30:00.000Z') };
  assert.deepEqual(planNudges([revised], s, [], ms('2025-03-12T15:31:00.000Z')), []);
  assert.deepEqual(planNudges([revised], s, [], ms('2025-03-19T15:29:59.999Z')), []);
  assert.deepEqual(summary(planNudges([revised], s, [], ms('2025-03-19T15:30:00.000Z'))), ['ny:checkin@2025-03-19T15:30:00.000Z']);
});

test('cadence: the question overrides the default, 0 means never, null falls back to the diary default', () => {
  const now = ms('2025-02-01T00:00:00.000Z');
  assert.deepEqual(planNudges([planQuestion({ id: 'off', checkin_days: 0 })], settings(), [], now), []);
  assert.deepEqual(planNudges([planQuestion({ id: 'dflt' })], settings({ default_checkin_days: 0 }), [], now), []);
  // Opened 2025-01-06 09:00Z: default 7 → 01-13, own 30 → 02-05 (not yet due at 02-01).
  assert.deepEqual(summary(planNudges([planQuestion({ id: 'dflt' })], settings(), [], now)), ['dflt:checkin@2025-01-13T09:00:00.000Z']);
  assert.deepEqual(planNudges([planQuestion({ id: 'own', checkin_days: 30 })], settings(), [], now), []);
});

test('no check-in at or after the close, and none once the window has closed', () => {
  const s = settings({ closing_soon_hours: 0 });
  // Opened 01-06 09:00Z, cadence 7 → 01-13 09:00Z, which is exactly the close: never planned.
  const q = planQuestion({ id: 'q', closes_at: '2025-01-13T09:00:00.000Z' });
  for (const at of ['2025-01-13T08:59:59.999Z', '2025-01-13T09:00:00.000Z']) {
    assert.ok(!planNudges([q], s, [], ms(at)).some((n) => n.kind === 'checkin'), at);
  }
  // Cadence 2 → due 01-08; shown until the close, then the window-closed prompt replaces it.
  const due = { ...q, checkin_days: 2 };
  assert.deepEqual(summary(planNudges([due], s, [], ms('2025-01-13T08:59:59.999Z'))), ['q:checkin@2025-01-08T09:00:00.000Z']);
  assert.deepEqual(summary(planNudges([due], s, [], ms('2025-01-13T09:00:00.000Z'))), ['q:window_closed@2025-01-13T09:00:00.000Z']);
});

test('closing soon, window closed and overdue follow the settings, with overdue days on the calendar', () => {
  // Europe/London close 2025-03-28 12:00 GMT; 3 calendar days later is 2025-03-31 12:00 BST = 11:00Z
  // (tzdata: BST from 2025-03-30 01:00Z), i.e. 71 hours later, derived from the rules above.
  const q = planQuestion({ id: 'ldn', time_zone: 'Europe/London', checkin_days: 0, closes_at: '2025-03-28T12:00:00.000Z' });
  const s = settings();
  const at = (iso: string) => summary(planNudges([q], s, [], ms(iso)));
  assert.deepEqual(at('2025-03-27T11:59:59.999Z'), []);
  assert.deepEqual(at('2025-03-27T12:00:00.000Z'), ['ldn:closing_soon@2025-03-27T12:00:00.000Z']);
  assert.deepEqual(at('2025-03-28T11:59:59.999Z'), ['ldn:closing_soon@2025-03-27T12:00:00.000Z']);
  assert.deepEqual(at('2025-03-28T12:00:00.000Z'), ['ldn:window_closed@2025-03-28T12:00:00.000Z']);
  assert.deepEqual(at('2025-03-31T10:59:59.999Z'), ['ldn:window_closed@2025-03-28T12:00:00.000Z']);
  assert.deepEqual(at('2025-03-31T11:00:00.000Z'), ['ldn:overdue@2025-03-31T11:00:00.000Z']);
  assert.deepEqual(at('2026-01-01T00:00:00.000Z'), ['ldn:overdue@2025-03-31T11:00:00.000Z']);

  const other = settings({ closing_soon_hours: 48, overdue_after_days: 0 });
  assert.deepEqual(summary(planNudges([q], other, [], ms('2025-03-26T12:00:00.000Z'))), ['ldn:closing_soon@2025-03-26T12:00:00.000Z']);
  assert.deepEqual(summary(planNudges([q], other, [], ms('2025-03-28T12:00:00.000Z'))), ['ldn:overdue@2025-03-28T12:00:00.000Z']);
});

test('a check-in and the closing-soon warning can be due together', () => {
  const q = planQuestion({ id: 'q', checkin_days: 7, closes_at: '2025-01-14T00:00:00.000Z' });
  // Closing soon from 01-13 00:00Z (close − 24 h), check-in from 01-13 09:00Z: earliest first.
  assert.deepEqual(summary(planNudges([q], settings(), [], ms('2025-01-13T12:00:00.000Z'))), [
    'q:closing_soon@2025-01-13T00:00:00.000Z',
    'q:checkin@2025-01-13T09:00:00.000Z',
  ]);
});

test('a snooze hides its own nudge until `until`, and nothing else', () => {
  const q = planQuestion({ id: 'q', checkin_days: 7 });
  const other = planQuestion({ id: 'other', checkin_days: 7 });
  const until = ms('2025-01-20T08:00:00.000Z');
  const snoozes: Snooze[] = [{ question_id: 'q', kind: 'checkin', until }];
  const ids = (now: number) => summary(planNudges([q, other], settings(), snoozes, now));
  assert.deepEqual(ids(until - 1), ['other:checkin@2025-01-13T09:00:00.000Z']);
  // Back at `until`, with its original due instant.
  assert.deepEqual(ids(until), ['other:checkin@2025-01-13T09:00:00.000Z', 'q:checkin@2025-01-13T09:00:00.000Z']);
  // A snooze of another kind does not hide the check-in.
  const wrongKind: Snooze[] = [{ question_id: 'q', kind: 'overdue', until }];
  assert.equal(planNudges([q], settings(), wrongKind, until - 1).length, 1);
});

test('nudges are sorted by due instant, then title', () => {
  const s = settings({ closing_soon_hours: 0 });
  const close = '2025-01-10T00:00:00.000Z';
  const qs = [
    planQuestion({ id: '1', title: 'Zeta', checkin_days: 0, closes_at: close }),
    planQuestion({ id: '2', title: 'alpha', checkin_days: 0, closes_at: close }),
    planQuestion({ id: '3', title: 'Mid', checkin_days: 0, closes_at: '2025-01-09T00:00:00.000Z' }),
  ];
  const order = planNudges(qs, s, [], ms('2025-01-10T01:00:00.000Z')).map((n) => n.title);
  assert.deepEqual(order, ['Mid', 'alpha', 'Zeta']);
});

test("a question without a usable zone is placed in the diary's zone", () => {
  // Opened 2025-03-03 09:00 EST; in New York (the diary zone) a week later is 09:00 EDT = 13:00Z (tzdata).
  const q = planQuestion({ id: 'q', time_zone: '', opened_at: '2025-03-03T14:00:00.000Z' });
  assert.equal(checkinAt(q, settings({ time_zone: 'America/New_York' })), ms('2025-03-10T13:00:00.000Z'));
  // In UTC it would be exactly 7 × 24 h later.
  assert.equal(checkinAt(q, settings({ time_zone: 'UTC' })), ms('2025-03-10T14:00:00.000Z'));
});

test('the quick due count equals the number of questions planNudges finds, near every edge', () => {
  // A seeded walk over questions whose check-ins, warnings and closes fall within hours of
  // `now`, in zones with and without DST (including Lord Howe's 30-minute change and
  // Samoa's skipped day), with snoozes on some kinds; every case is checked, not sampled.
  let seed = 7;
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
  const zones = ['UTC', 'Europe/London', 'America/New_York', 'Australia/Sydney', 'Australia/Lord_Howe', 'Pacific/Apia', 'Asia/Kolkata', 'not/a-zone'];
  const HOUR = 3_600_000;
  const DAY = 24 * HOUR;
  const kinds = ['checkin', 'closing_soon', 'window_closed', 'overdue'] as const;
  let dueSomewhere = 0;
  for (const nowIso of ['2025-03-30T01:00:00.000Z', '2025-10-26T00:59:59.999Z', '2011-12-30T10:00:00.000Z', '2025-04-06T15:30:00.000Z', '2026-01-15T12:00:00.000Z']) {
    const now = ms(nowIso);
    for (let round = 0; round < 40; round++) {
      const s = settings({
        default_checkin_days: Math.floor(rand() * 4),
        closing_soon_hours: 1 + Math.floor(rand() * 48),
        overdue_after_days: Math.floor(rand() * 4),
        time_zone: zones[Math.floor(rand() * zones.length)]!,
      });
      const questions: PlanQuestion[] = [];
      const snoozes: Snooze[] = [];
      for (let i = 0; i < 12; i++) {
        const days = Math.floor(rand() * 4);
        const close = now + Math.round((rand() - 0.5) * 10 * DAY);
        const anchor = now - days * DAY + Math.round((rand() - 0.5) * 6 * DAY);
        questions.push({
          id: `q${i}`,
          title: `Question ${i}`,
          opened_at: Math.min(anchor, close - 1),
          closes_at: close,
          time_zone: zones[Math.floor(rand() * zones.length)]!,
          checkin_days: rand() < 0.3 ? null : days,
          last_forecast_at: rand() < 0.2 ? null : anchor,
        });
        for (const kind of kinds) {
          if (rand() < 0.15) snoozes.push({ question_id: `q${i}`, kind, until: now + Math.round((rand() - 0.3) * 4 * HOUR) });
        }
      }
      const exact = dueQuestionCount(planNudges(questions, s, snoozes, now));
      dueSomewhere += exact;
      assert.equal(countDueQuestions(questions, s, snoozes, now), exact, `${nowIso}, round ${round}`);
    }
  }
  assert.ok(dueSomewhere > 300, 'the cases include plenty that are due');
});
