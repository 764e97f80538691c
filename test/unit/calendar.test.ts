/**
 * The .ics export, read back with ical.js (an independent RFC 5545 parser) and checked
 * octet by octet against RFC 5545 §3.1 (CRLF, folding at 75 octets, UTF-8) and §3.3.11
 * (TEXT escaping).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import ICAL from 'ical.js';
import type { BinaryQuestion } from '../../shared/domain';
import { forecast, question as baseQuestion } from '../support/builders';
import { escapeText, foldLine, icalUtc, toICalendar } from '../../main/service/calendar';

/** The calendar tests' question: closes 2025-03-31 17:00 London time. */
function question(over: Partial<BinaryQuestion> & { id: string }): BinaryQuestion {
  return baseQuestion({ closes_at: '2025-03-31T16:00:00.000Z', time_zone: 'Europe/London', updated_at: '2025-02-01T10:00:00.000Z', ...over });
}

const NOW = Date.parse('2025-03-01T12:34:56.789Z');

function parse(text: string) {
  return new ICAL.Component(ICAL.parse(text));
}

function utcMs(value: unknown): number {
  assert.ok(value instanceof ICAL.Time, 'a date-time value');
  assert.equal(value.zone, ICAL.Timezone.utcTimezone, 'written in UTC form');
  return value.toJSDate().getTime();
}

test('calendar header and one event per unresolved question, read back by ical.js', () => {
  const questions = [
    question({
      id: 'q-northgate',
      title: 'Northgate phase 2 signed',
      rule: 'Yes if the client signs the phase 2 order by the close.',
      tags: ['client:northgate', 'renewals'],
      closes_at: '2025-03-31T16:00:00.000Z',
      base_rate: 0.3,
      base_rate_note: '6 of 20 renewals slipped',
      forecasts: [forecast('2025-02-10T09:00:00.000Z', 1, 0.55), forecast('2025-02-20T09:30:00.000Z', 2, 0.62)],
    }),
    question({ id: 'q-early', title: 'Pilot at 500 users', closes_at: '2025-03-15T12:00:00.000Z' }),
    question({ id: 'q-done', resolution: { outcome: 'yes', at: '2025-02-01T00:00:00.000Z', note: '' } }),
    question({ id: 'q-void', resolution: { outcome: 'void', at: '2025-02-01T00:00:00.000Z', note: '' } }),
  ];
  const cal = parse(toICalendar(questions, { now: NOW }));
  assert.equal(cal.name, 'vcalendar');
  // RFC 5545 §3.7: PRODID and VERSION required; CALSCALE and METHOD as asked.
  assert.equal(cal.getFirstPropertyValue('prodid'), '-//Forelog//Forelog diary//EN');
  assert.equal(cal.getFirstPropertyValue('version'), '2.0');
  assert.equal(cal.getFirstPropertyValue('calscale'), 'GREGORIAN');
  assert.equal(cal.getFirstPropertyValue('method'), 'PUBLISH');

  const events = cal.getAllSubcomponents('vevent');
  assert.deepEqual(events.map((e) => e.getFirstPropertyValue('uid')), ['q-early@forelog.local', 'q-northgate@forelog.local']);
  const ev = events[1]!;
  assert.equal(utcMs(ev.getFirstPropertyValue('dtstamp')), Date.parse('2025-03-01T12:34:56.000Z'));
  assert.equal(utcMs(ev.getFirstPropertyValue('dtstart')), Date.parse('2025-03-31T16:00:00.000Z'));
  assert.equal(utcMs(ev.getFirstPropertyValue('last-modified')), Date.parse('2025-02-01T10:00:00.000Z'));
  const duration = ev.getFirstPropertyValue('duration');
  assert.ok(duration instanceof ICAL.Duration);
  assert.equal(duration.toSeconds(), 15 * 60);
  assert.equal(ev.getFirstPropertyValue('summary'), 'Closes: Northgate phase 2 signed');
  assert.equal(
    ev.getFirstPropertyValue('description'),
    [
      'Resolution rule: Yes if the client signs the phase 2 order by the close.',
      'Closes: 2025-03-31 17:00 (Europe/London)', // 16:00Z is 17:00 BST (tzdata: BST from 2025-03-30)
      'Last probability: 62% (set 2025-02-20 09:30 (Europe/London))',
      'Base rate: 30% (6 of 20 renewals slipped)',
    ].join('\n'),
  );
  assert.deepEqual(ev.getFirstProperty('categories')?.getValues(), ['client:northgate', 'renewals']);
  assert.equal(ev.getFirstPropertyValue('transp'), 'TRANSPARENT');

  // RFC 5545 §3.6.6: a DISPLAY alarm needs ACTION, TRIGGER and DESCRIPTION.
  const [alarm, ...more] = ev.getAllSubcomponents('valarm');
  assert.equal(more.length, 0);
  assert.equal(alarm?.getFirstPropertyValue('action'), 'DISPLAY');
  const trigger = alarm?.getFirstPropertyValue('trigger');
  assert.ok(trigger instanceof ICAL.Duration);
  assert.equal(trigger.toSeconds(), -24 * 3600);
  assert.equal(alarm?.getFirstPropertyValue('description'), 'Forelog: Northgate phase 2 signed closes soon');

  // No forecasts, no tags: says so, and no empty CATEGORIES.
  const early = events[0]!;
  assert.match(String(early.getFirstPropertyValue('description')), /\nLast probability: none yet$/);
  assert.equal(early.getFirstProperty('categories'), null);
});

test('a custom PRODID and alarm lead are used; an empty diary is still a valid calendar', () => {
  const text = toICalendar([], { now: NOW, prodId: '-//Example//Test//EN', alarmHours: 36 });
  assert.equal(text, ['BEGIN:VCALENDAR', 'VERSION:2.0', 'PRODID:-//Example//Test//EN', 'CALSCALE:GREGORIAN', 'METHOD:PUBLISH', 'END:VCALENDAR', ''].join('\r\n'));
  const one = parse(toICalendar([question({ id: 'q' })], { now: NOW, alarmHours: 1.5 }));
  const trigger = one.getFirstSubcomponent('vevent')?.getFirstSubcomponent('valarm')?.getFirstPropertyValue('trigger');
  assert.ok(trigger instanceof ICAL.Duration);
  assert.equal(trigger.toSeconds(), -90 * 60);
});

test('RFC 5545 §3.3.11 TEXT escaping of comma, semicolon, backslash and line breaks round-trips', () => {
  const title = 'Renewal, phase 2; "big" C:\\deals\\north\r\nsecond line\nthird\rfourth\ttab';
  const text = toICalendar([question({ id: 'q', title, tags: ['a,b', 'c;d'] })], { now: NOW });
  const unfolded = text.replace(/\r\n /g, '');
  // §3.3.11: "\\" for backslash, "\;" "\," and "\n" for a line break; HTAB may stay as it is.
  assert.ok(
    unfolded.includes('SUMMARY:Closes: Renewal\\, phase 2\\; "big" C:\\\\deals\\\\north\\nsecond line\\nthird\\nfourth\ttab\r\n'),
    'escaped SUMMARY line',
  );
  assert.ok(unfolded.includes('CATEGORIES:a\\,b,c\\;d\r\n'));
  const ev = parse(text).getFirstSubcomponent('vevent')!;
  assert.equal(ev.getFirstPropertyValue('summary'), 'Closes: Renewal, phase 2; "big" C:\\deals\\north\nsecond line\nthird\nfourth\ttab');
  assert.deepEqual(ev.getFirstProperty('categories')?.getValues(), ['a,b', 'c;d']);
  // Controls other than HTAB are not TSAFE-CHARs (§3.3.11): dropped.
  assert.equal(escapeText('a\u0000b\u0007c\u007fd'), 'abcd');
});

test('RFC 5545 §3.1: CRLF everywhere, no line over 75 octets, and no UTF-8 character split by a fold', () => {
  const base = 'Prévision — 東京のデータセンター移転は年度末までに完了するか 🚚📦 Überprüfung ñandú ';
  // Shifting the text by 0–3 ASCII characters moves every fold point across the 2-, 3- and
  // 4-octet characters, so a fold that cut by octets would split one of them.
  for (let shift = 0; shift < 4; shift++) {
    const title = 'x'.repeat(shift) + base.repeat(3);
    const text = toICalendar([question({ id: 'q', title, rule: title })], { now: NOW });
    assert.ok(text.endsWith('\r\n'));
    assert.ok(!/[^\r]\n|\r[^\n]/.test(text), 'only CRLF line ends');
    const bytes = Buffer.from(text, 'utf8');
    const decoder = new TextDecoder('utf-8', { fatal: true });
    let start = 0;
    let longest = 0;
    for (let i = 0; i + 1 < bytes.length; i++) {
      if (bytes[i] !== 0x0d || bytes[i + 1] !== 0x0a) continue;
      const line = bytes.subarray(start, i);
      longest = Math.max(longest, line.length);
      assert.ok(line.length <= 75, `line of ${line.length} octets`);
      decoder.decode(line); // throws if the line starts or ends inside a multi-octet character
      start = i + 2;
    }
    assert.ok(longest >= 72, `folds fill lines (longest ${longest})`);
    // Read back the octets, as a calendar app reading the file would.
    const ev = parse(new TextDecoder('utf-8').decode(bytes)).getFirstSubcomponent('vevent')!;
    assert.equal(ev.getFirstPropertyValue('summary'), `Closes: ${title}`);
    assert.ok(String(ev.getFirstPropertyValue('description')).startsWith(`Resolution rule: ${title}\n`));
  }
});

test('foldLine: exactly 75 octets stays whole, one more folds with a leading space', () => {
  const a75 = 'A'.repeat(75);
  assert.equal(foldLine(a75), a75);
  assert.equal(foldLine(`${a75}B`), `${a75}\r\n B`);
  // 74 ASCII + a 2-octet "é" would be 76 octets: the é moves whole to the next line.
  assert.equal(foldLine(`${'A'.repeat(74)}é`), `${'A'.repeat(74)}\r\n é`);
  // Continuation lines carry 74 octets after their space (75 in all).
  const folded = foldLine('B'.repeat(75 + 74 + 1)).split('\r\n');
  assert.deepEqual(folded.map((l) => l.length), [75, 75, 2]);
});

test('UTC date-time form of RFC 5545 §3.3.5 (FORM #2), seconds precision', () => {
  assert.equal(icalUtc(Date.parse('2025-03-31T16:00:00.000Z')), '20250331T160000Z');
  assert.equal(icalUtc(Date.parse('1998-01-19T07:00:00.999Z')), '19980119T070000Z');
});
