/**
 * renderer/src/dates.ts: every date the window shows is written in the user's locale with
 * one zone label style (the offset in force, "GMT+1"), and dates typed in the user's own
 * order are read back exactly. Expected strings are what Intl's CLDR data writes for en-GB
 * and en-US; the UK summer-time rule (last Sunday of March to last Sunday of October, 01:00
 * UTC) is the Summer Time Order 2002.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  dateOrder,
  dayWord,
  formatCount,
  formatDateText,
  formatInstant,
  formatNearby,
  formatDay,
  formatTimeText,
  localToIso,
  plural,
  parseDateText,
  splitDateTimeText,
  parseTimeText,
  timePlaceholder,
  wallText,
  zoneLabel,
} from '../../renderer/src/dates';

// 2026-03-29 01:00:00Z: UK clocks go from 01:00 GMT to 02:00 BST.
const SPRING = Date.parse('2026-03-29T01:00:00.000Z');

test('a zone label is the offset in force at that instant, in one style for every zone', () => {
  assert.equal(zoneLabel(SPRING - 1, 'Europe/London', 'en-GB'), 'GMT', 'the last millisecond of winter time');
  assert.equal(zoneLabel(SPRING, 'Europe/London', 'en-GB'), 'GMT+1', 'the first of summer time');
  assert.equal(zoneLabel(SPRING, 'America/New_York', 'en-GB'), 'GMT\u22124', 'not "EDT", and a proper minus sign');
  assert.equal(zoneLabel(SPRING, 'America/New_York', 'en-US'), 'GMT\u22124', 'the same style in a US locale');
  assert.equal(zoneLabel(SPRING, 'Europe/London', 'en-US'), 'GMT+1', 'not "BST" in one locale and "GMT+1" in another');
  assert.equal(zoneLabel(SPRING, 'UTC', 'en-GB'), 'GMT');
  assert.equal(zoneLabel(SPRING, 'Asia/Kolkata', 'en-GB'), 'GMT+5:30');
});

test('an instant is written day, month, year in a UK locale and month first in a US one', () => {
  const closes = '2030-06-30T16:00:00.000Z'; // 17:00 in London (summer time)
  assert.equal(formatInstant(closes, 'Europe/London', {}, 'en-GB'), '30 Jun 2030, 17:00 GMT+1');
  assert.equal(formatInstant(closes, 'Europe/London', false, 'en-GB'), '30 Jun 2030, 17:00');
  assert.equal(formatInstant(closes, 'Europe/London', { weekday: true }, 'en-GB'), 'Sun, 30 Jun 2030, 17:00 GMT+1');
  // A 12-hour clock is written without a leading zero, as its time boxes write it (5:00 PM, not 05:00 PM).
  assert.match(formatInstant(closes, 'Europe/London', {}, 'en-US'), /^Jun 30, 2030, 5:00\sPM GMT\+1$/);
  assert.equal(formatInstant('2030-06-30T07:05:00.000Z', 'UTC', false, 'en-GB'), '30 Jun 2030, 07:05');
});

test('nearby instants are named by day on the zone’s own calendar', () => {
  const now = Date.parse('2026-03-31T22:30:00.000Z'); // 23:30 on 31 March in London
  const next = Date.parse('2026-03-31T23:30:00.000Z'); // 00:30 on 1 April in London
  assert.equal(dayWord(next, now, 'Europe/London', 'en-GB'), 'tomorrow');
  assert.equal(dayWord(next, now, 'UTC', 'en-GB'), 'today');
  assert.equal(formatNearby(next, now, 'Europe/London', 'en-GB'), 'tomorrow 00:30 GMT+1');
  assert.equal(dayWord(now + 8 * 86_400_000, now, 'Europe/London', 'en-GB'), '8 Apr');
  assert.equal(dayWord(now + 300 * 86_400_000, now, 'Europe/London', 'en-GB'), '25 Jan 2027');
});

test('the date box follows the locale’s order, and what it shows reads back', () => {
  assert.deepEqual(dateOrder('en-GB'), { order: ['day', 'month', 'year'], separator: '/', placeholder: 'dd/mm/yyyy' });
  assert.deepEqual(dateOrder('en-US'), { order: ['month', 'day', 'year'], separator: '/', placeholder: 'mm/dd/yyyy' });
  assert.equal(dateOrder('de-DE').placeholder, 'dd.mm.yyyy');
  assert.equal(dateOrder('sv-SE').placeholder, 'yyyy-mm-dd');
  for (const locale of ['en-GB', 'en-US', 'de-DE', 'sv-SE', 'ja-JP']) {
    const date = { year: 2026, month: 3, day: 4 };
    assert.deepEqual(parseDateText(formatDateText(date, locale), locale), { ok: true, value: date }, locale);
  }
  assert.equal(formatDateText({ year: 2026, month: 3, day: 4 }, 'en-GB'), '04/03/2026');
  assert.deepEqual(parseDateText('4/3/2026', 'en-GB'), { ok: true, value: { year: 2026, month: 3, day: 4 } }, 'the 4th of March in the UK');
  assert.deepEqual(parseDateText('4/3/2026', 'en-US'), { ok: true, value: { year: 2026, month: 4, day: 3 } }, 'the 3rd of April in the US');
  assert.deepEqual(parseDateText('2026-03-04', 'en-US'), { ok: true, value: { year: 2026, month: 3, day: 4 } }, 'ISO is read in every locale');
});

test('a date written with its month’s name, as the window writes dates, is read back in a date box', () => {
  const nov20 = { ok: true, value: { year: 2026, month: 11, day: 20 } };
  // As the window writes it: the lists and headings (formatDay, formatInstant), copied back.
  for (const locale of ['en-GB', 'en-US']) {
    const shown = formatDay(Date.UTC(2026, 10, 20, 12), 'UTC', {}, locale);
    assert.deepEqual(parseDateText(shown, locale), nov20, `${locale}: ${shown}`);
  }
  for (const text of ['20 Nov 2026', 'Nov 20, 2026', 'Fri, 20 Nov 2026', '20th November 2026', ' 20 nov. 2026 ']) {
    assert.deepEqual(parseDateText(text, 'en-GB'), nov20, text);
  }
  assert.deepEqual(parseDateText('4 Sept 2026', 'en-GB'), { ok: true, value: { year: 2026, month: 9, day: 4 } });
  assert.deepEqual(parseDateText('20. Nov. 2026', 'de-DE'), nov20, 'German short month');
  assert.deepEqual(parseDateText('20. November 2026', 'de-DE'), nov20, 'German long month');
  // Still refused: no year, a day the month lacks, a word that is no date.
  assert.deepEqual(parseDateText('20 Nov', 'en-GB'), { ok: false, error: 'write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('31 Nov 2026', 'en-GB'), { ok: false, error: 'that month has no day 31; write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('about 20 Nov 2026', 'en-GB'), { ok: false, error: 'write the date as dd/mm/yyyy' });
});

test('a date and time written in the date box split into the two boxes, as typed or as a read-back line writes them', () => {
  const both = { date: '04/12/2026', time: '14:30' };
  for (const text of ['04/12/2026 14:30', '4/12/2026, 14:30', '2026-12-04 14:30', '2026-12-04T14:30:00', ' 4 Dec 2026 14.30 ', '4 Dec 2026, 2:30 pm']) {
    assert.deepEqual(splitDateTimeText(text, 'UTC', 'en-GB'), both, text);
  }
  // What the read-back line under the boxes shows goes back in, zone label and all.
  const shown = formatInstant(Date.UTC(2026, 11, 4, 14, 30), 'UTC', { weekday: true }, 'en-GB');
  assert.equal(shown, 'Fri, 4 Dec 2026, 14:30 GMT');
  assert.deepEqual(splitDateTimeText(shown, 'UTC', 'en-GB'), both);
  const summer = formatInstant(Date.UTC(2026, 6, 1, 16), 'Europe/London', { weekday: true }, 'en-US');
  assert.deepEqual(splitDateTimeText(summer, 'Europe/London', 'en-US'), { date: '07/01/2026', time: '5:00 PM' }, summer);
  assert.deepEqual(splitDateTimeText('01/07/2026 17:00 Europe/London', 'Europe/London', 'en-GB'), { date: '01/07/2026', time: '17:00' });
  // Typed on a 12-hour clock, "2:30" waits for its am/pm; "14:30" cannot be the start of one.
  assert.equal(splitDateTimeText('12/04/2026 2:30', 'UTC', 'en-US'), null);
  assert.deepEqual(splitDateTimeText('12/04/2026 2:30 pm', 'UTC', 'en-US'), { date: '12/04/2026', time: '2:30 PM' });
  assert.deepEqual(splitDateTimeText('12/04/2026 14:30', 'UTC', 'en-US'), { date: '12/04/2026', time: '2:30 PM' });
  // Another zone's label is not this field's time: left as typed, never moved to another hour.
  assert.equal(splitDateTimeText('Wed 1 Jul 2026, 17:00 GMT+2', 'Europe/London', 'en-GB'), null);
  // A date alone, a time that is not one, or text that is no date stays in the date box.
  for (const text of ['04/12/2026', '4 Dec 2026', '04/12/2026 25:00', 'about 4 Dec 2026 14:30', '14:30']) {
    assert.equal(splitDateTimeText(text, 'UTC', 'en-GB'), null, text);
  }
});

test('a date that is not one says why, in the user’s terms', () => {
  assert.deepEqual(parseDateText('31/13/2026', 'en-GB'), { ok: false, error: '13 is not a month; write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('29/02/2027', 'en-GB'), { ok: false, error: 'that month has no day 29; write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('29/02/2028', 'en-GB'), { ok: true, value: { year: 2028, month: 2, day: 29 } }, 'a leap day');
  assert.deepEqual(parseDateText('1/0/2026', 'en-GB'), { ok: false, error: '0 is not a month; write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('0/1/2026', 'en-GB'), { ok: false, error: 'that month has no day 0; write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('03/04/26', 'en-GB'), { ok: false, error: 'write the year with four digits (dd/mm/yyyy)' });
  // Year first is read as year, month, day in any locale, not refused as a short year.
  for (const locale of ['en-GB', 'en-US']) {
    for (const text of ['2026/12/04', '2026.12.04', '2026-12-04', '2026/12/4']) {
      assert.deepEqual(parseDateText(text, locale), { ok: true, value: { year: 2026, month: 12, day: 4 } }, `${locale}: ${text}`);
    }
  }
  assert.deepEqual(parseDateText('2026/13/04', 'en-GB'), { ok: false, error: '13 is not a month; write the date as dd/mm/yyyy' });
  assert.deepEqual(parseDateText('next Tuesday', 'en-GB'), { ok: false, error: 'write the date as dd/mm/yyyy' });
});

test('times are read on a 24-hour clock or with am/pm, and refused past 23:59', () => {
  assert.deepEqual(parseTimeText('17:00', 'en-GB'), { ok: true, value: { hour: 17, minute: 0 } });
  assert.deepEqual(parseTimeText('1700', 'en-GB'), { ok: true, value: { hour: 17, minute: 0 } });
  assert.deepEqual(parseTimeText('5pm', 'en-GB'), { ok: true, value: { hour: 17, minute: 0 } });
  assert.deepEqual(parseTimeText('12:30 am', 'en-US'), { ok: true, value: { hour: 0, minute: 30 } });
  assert.deepEqual(parseTimeText('12:30 PM', 'en-US'), { ok: true, value: { hour: 12, minute: 30 } });
  assert.deepEqual(parseTimeText('23:59', 'en-GB'), { ok: true, value: { hour: 23, minute: 59 } });
  assert.equal(parseTimeText('24:00', 'en-GB').ok, false);
  assert.equal(parseTimeText('23:60', 'en-GB').ok, false);
  assert.equal(parseTimeText('13 pm', 'en-GB').ok, false);
  assert.equal(formatTimeText({ hour: 17, minute: 5 }, 'en-GB'), '17:05');
  // The box writes the locale's own am/pm marks when they are Latin letters, so it matches the
  // times displayed beside it (en-US "5:05 PM", en-AU "5:05 pm"); otherwise am/pm, which it reads.
  assert.equal(formatTimeText({ hour: 17, minute: 5 }, 'en-US'), '5:05 PM');
  assert.equal(formatTimeText({ hour: 0, minute: 0 }, 'en-US'), '12:00 AM');
  assert.equal(formatTimeText({ hour: 17, minute: 5 }, 'en-AU'), '5:05 pm');
  assert.equal(formatTimeText({ hour: 17, minute: 5 }, 'zh-TW'), '5:05 pm');
  assert.equal(formatTimeText({ hour: 17, minute: 5 }, 'de-DE'), '17:05');
  assert.equal(timePlaceholder('en-US'), 'hh:mm AM');
  assert.equal(timePlaceholder('en-GB'), 'hh:mm');
  const displayed = formatInstant('2030-06-30T17:05:00.000Z', 'UTC', false, 'en-US');
  assert.ok(displayed.replace(/\s/g, ' ').endsWith(formatTimeText({ hour: 17, minute: 5 }, 'en-US')), `${displayed} ends with the box's text`);
  for (const locale of ['en-GB', 'en-US', 'en-AU', 'zh-TW']) {
    for (const time of [{ hour: 0, minute: 0 }, { hour: 12, minute: 0 }, { hour: 23, minute: 59 }]) {
      assert.deepEqual(parseTimeText(formatTimeText(time, locale), locale), { ok: true, value: time }, `${locale} ${time.hour}:${time.minute}`);
    }
  }
});

test('a typed wall time becomes the instant the zone’s clocks show, skipped hours by RFC 5545', () => {
  const local = wallText({ year: 2026, month: 3, day: 29 }, { hour: 0, minute: 59 });
  assert.equal(localToIso(local, 'Europe/London'), '2026-03-29T00:59:00.000Z');
  // 01:30 does not exist in London that night; read with the offset before the gap (RFC 5545 §3.3.5).
  assert.equal(localToIso(wallText({ year: 2026, month: 3, day: 29 }, { hour: 1, minute: 30 }), 'Europe/London'), '2026-03-29T01:30:00.000Z');
  assert.equal(localToIso(wallText({ year: 2026, month: 3, day: 29 }, { hour: 2, minute: 0 }), 'Europe/London'), '2026-03-29T01:00:00.000Z');
  assert.equal(localToIso('31/03/2026 17:00', 'Europe/London'), null, 'only the form’s own YYYY-MM-DDTHH:MM text');
});

test('counts are grouped as the locale writes thousands', () => {
  assert.equal(formatCount(8988, 'en-GB'), '8,988');
  assert.equal(formatCount(100000, 'en-GB'), '100,000');
  assert.equal(formatCount(100000, 'de-DE'), '100.000');
  assert.equal(formatCount(100000, 'fr-FR'), '100\u202f000', 'a narrow no-break space');
  assert.equal(formatCount(999, 'en-GB'), '999');
  assert.equal(formatCount(0, 'en-GB'), '0');
});

test('a count with its noun is grouped the same way, singular only for exactly one', () => {
  assert.equal(plural(1, 'day'), '1 day');
  assert.equal(plural(0, 'day'), '0 days');
  assert.equal(plural(1012, 'scored question'), `${formatCount(1012)} scored questions`);
  assert.equal(plural(2, 'confident miss', 'confident misses'), '2 confident misses');
});
