/**
 * Import of any size, streaming, still all-or-nothing (INTERFACES.md §1): the diary file is
 * read as its text arrives, a question record at a time, and written inside one
 * transaction that the first bad record rolls back. Reading in chunks of any size gives
 * what reading the whole object gives; members may come in any order; numbers read exactly
 * as JSON.parse reads them; a file nested absurdly deep, or not JSON at all, is refused with
 * its line and column; files as people have them (BOM, UTF-16) read, other bytes are refused.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { buildDemoDiary } from '../../main/service/demo';
import { ApiError } from '../../shared/contract';
import { diaryItems, DiaryFileError, readDiaryText, type DiaryItem } from '../../shared/diary-file';
import { randomDiaryFile } from '../support/random-diary';
import { openTestDiary, tempDir, type TestDiary } from '../support/temp-diary';

const DIARY = { format: 'forelog-diary', version: 1 };

const question = (n: number, extra: Record<string, unknown> = {}) => ({
  id: `q${n}`,
  title: `Question ${n}`,
  closes_at: '2027-03-31T17:00:00+01:00',
  forecasts: [{ at: '2026-01-05T09:05:00Z', p: 0.4, note: 'first' }],
  ...extra,
});

function chunksOf(text: string, size: number): string[] {
  const out: string[] = [];
  for (let i = 0; i < text.length; i += size) out.push(text.slice(i, i + size));
  return out;
}

const collect = (items: Iterable<DiaryItem>) => [...items];

/** Asserts that importing `text` is refused with exactly this message (or pattern), and changes nothing. */
async function refusesText(d: TestDiary, text: string, message: string | RegExp, code = 'invalid'): Promise<void> {
  const before = d.service.diary.exportText('json').text;
  await assert.rejects(d.call('importText', { format: 'json', text }), (err: unknown) => {
    assert.ok(err instanceof ApiError, String(err));
    assert.equal(err.code, code);
    if (typeof message === 'string') assert.equal(err.message, message);
    else assert.match(err.message, message);
    return true;
  });
  assert.equal(d.service.diary.exportText('json').text, before, 'the diary is exactly as it was');
}

test('a diary file read as it streams, in chunks of any size, gives what reading the whole object gives', () => {
  const file = { ...randomDiaryFile(60, 5), questions: [...randomDiaryFile(60, 5).questions, ...buildDemoDiary(Date.UTC(2026, 5, 1)).questions] };
  const whole = collect(diaryItems(file));
  for (const text of [JSON.stringify(file), JSON.stringify(file, null, 2)]) {
    for (const size of [1, 2, 3, 7, 64, 4096, text.length]) {
      assert.deepEqual(collect(readDiaryText(chunksOf(text, size))), whole, `chunks of ${size}`);
    }
  }
});

test('a member named twice in one object is refused at any depth, with its line and column, and nothing is imported', async () => {
  // JSON.parse keeps the last of the two; the file's writer, or another reader, may mean the first.
  const d = openTestDiary();
  const cases: [string, string][] = [
    ['{"title":"A","title":"B","closes_at":"2027-01-01T00:00:00Z","forecasts":[]}', 'title'],
    ['{"title":"A","closes_at":"2027-01-01T00:00:00Z",\n "forecasts":[{"at":"2026-01-01T00:00:00Z","p":2,"p":0.3}]}', 'p'],
    ['{"title":"A","closes_at":"2027-01-01T00:00:00Z","forecasts":[{"at":"2026-01-01T00:00:00Z","p":0.3,"lenses":[{"name":"x","p":0.1,"\\u006eame":"y"}]}]}', 'name'],
  ];
  for (const [record, key] of cases) {
    const text = `{"format":"forelog-diary","version":1,"questions":[${record}]}`;
    const lines = text.slice(0, text.lastIndexOf(`"${key}"`) + 1).split('\n');
    const column = lines.at(-1)!.length;
    const at = lines.length === 1 ? text.lastIndexOf(`"${key}"`) + 1 : column;
    // The \u escape spells the name differently; find its place by the escape instead.
    const place = record.includes('\\u006e') ? text.indexOf('"\\u006eame"') + 1 : at;
    await refusesText(d, text, `The file cannot be read at line ${lines.length}, column ${place}: the member "${key}" appears a second time in its object; keep one of them. Nothing was imported.`);
  }
  await refusesText(
    d,
    '{"format":"forelog-diary","version":1,"settings":{"time_zone":"UTC","time_zone":"Europe/London"},"questions":[]}',
    'The file cannot be read at line 1, column 69: the member "time_zone" appears a second time in its object; keep one of them. Nothing was imported.',
  );
  // A name repeated in different objects, or inside a text, is no duplicate.
  await d.call('importText', { format: 'json', text: JSON.stringify({ ...DIARY, questions: [question(1, { note: 'a "p": here', forecasts: [{ at: '2026-01-05T09:05:00Z', p: 0.4, note: '"p":1' }, { at: '2026-01-06T09:05:00Z', p: 0.5 }] })] }) });
  assert.equal((await d.call('listQuestions', {})).total, 1);
});

test('an invisible character where the file should start is named by its code point, not written as itself', async () => {
  const d = openTestDiary();
  for (const [text, name] of [['\u0000\u0000', 'U+0000'], ['\u0001{}', 'U+0001'], ['\u00a0{}', 'U+00A0']] as const) {
    await refusesText(d, text, `This is not a Forelog diary file: expected a JSON object with "format": "forelog-diary". (line 1, column 1: expected a JSON object ("{") but found the character ${name}) Nothing was imported.`);
  }
});

test('members may come in any order: settings after the questions import as if they came first', async () => {
  const settings = { default_checkin_days: 3, time_zone: 'Asia/Tokyo' };
  const questions = [question(1), question(2, { time_zone: 'Europe/London' })];
  const first = openTestDiary();
  await first.call('importText', { format: 'json', text: JSON.stringify({ ...DIARY, settings, questions }) });
  const last = openTestDiary();
  await last.call('importText', { format: 'json', text: JSON.stringify({ questions, settings, version: 1, format: 'forelog-diary' }) });
  assert.equal(last.service.diary.exportText('json').text, first.service.diary.exportText('json').text);
  // The question without a zone of its own takes the file's, as it does with settings first.
  assert.equal((await last.call('getQuestion', { id: 'q1' })).time_zone, 'Asia/Tokyo');
  assert.equal((await last.call('getQuestion', { id: 'q2' })).time_zone, 'Europe/London');
  assert.equal((await last.call('getSettings', {})).default_checkin_days, 3);

  // Into a diary that has questions, the file's settings are ignored wherever they stand.
  const working = openTestDiary();
  await working.call('importText', { format: 'json', text: JSON.stringify({ ...DIARY, questions: [question(9)] }) });
  await working.call('importText', { format: 'json', text: JSON.stringify({ questions: [question(1)], settings, ...DIARY }) });
  assert.equal((await working.call('getQuestion', { id: 'q1' })).time_zone, 'UTC');
  assert.equal((await working.call('getSettings', {})).default_checkin_days, 7);
});

test('format, version and questions are checked wherever they stand; the records read before are taken back', async () => {
  const d = openTestDiary();
  await d.call('importText', { format: 'json', text: JSON.stringify({ ...DIARY, questions: [question(0)] }) });
  const many = Array.from({ length: 30 }, (_, i) => question(i + 1));
  await refusesText(d, JSON.stringify({ questions: many, version: 1, format: 'something-else' }), 'This is not a Forelog diary file: "format" must be "forelog-diary". Nothing was imported.');
  await refusesText(d, JSON.stringify({ questions: many, format: 'forelog-diary' }), 'This diary file has no "version"; this Forelog reads version 1 (written "version": 1). Nothing was imported.');
  // Another program's JSON with a version of its own is not a diary, not one from a newer Forelog.
  await refusesText(d, JSON.stringify({ name: 'quarterly-model', version: '1.0.0' }), 'This is not a Forelog diary file: "format" must be "forelog-diary". Nothing was imported.');
  await refusesText(d, JSON.stringify({ version: 2, format: 'forelog-diary', questions: [] }), /^This diary file is version 2; this Forelog reads version 1\. Nothing was imported; update Forelog/);
  await refusesText(d, JSON.stringify({ format: 'forelog-diary', version: 2, questions: [] }), /^This diary file is version 2; this Forelog reads version 1\. Nothing was imported; update Forelog/);
  // A version written as text or as a fraction is a slip in this file, not a newer Forelog's: updating would not help.
  for (const version of ['1', 0.5, 0, null]) {
    await refusesText(d, JSON.stringify({ format: 'forelog-diary', version, questions: [] }), `This diary file's "version" is ${JSON.stringify(version)}; this Forelog reads version 1, written "version": 1 (a number). Nothing was imported.`);
  }
  await refusesText(d, JSON.stringify({ ...DIARY }), '"questions" must be a list (it may be empty). Nothing was imported.');
  await refusesText(d, JSON.stringify({ ...DIARY, questions: { q: 1 } }), '"questions" must be a list (it may be empty). Nothing was imported.');
  await refusesText(d, '[1, 2]', 'This is not a Forelog diary file: expected a JSON object with "format": "forelog-diary". (line 1, column 1: expected a JSON object ("{") but found "[") Nothing was imported.');
  await refusesText(d, '', /^This is not a Forelog diary file: .*the file is empty/);
});

test('the first bad record is named with its index, line and field, after thousands were already written', async () => {
  const d = openTestDiary();
  await d.call('loadDemo', {});
  const good = Array.from({ length: 2500 }, (_, i) => question(i));
  const bad = question(2500, { forecasts: [{ at: '2026-01-05T09:05:00Z', p: 1.5 }] });
  const text = JSON.stringify({ ...DIARY, questions: [...good, bad, question(2501)] }, null, 2);
  const line = text.split('\n').findIndex((l) => l.includes('"id": "q2500"'));
  await refusesText(d, text, `Question 2501 (questions[2500], “Question 2500”) is not valid: field forecasts[0].p: must be a probability between 0 and 1 (the record starts on line ${line}). Nothing was imported.`);
  // An id already in the diary is found by the insert itself, and named the same way.
  const again = JSON.stringify({ ...DIARY, questions: [question(90_000), buildDemoDiary(d.clock.now).questions[3]] });
  await refusesText(d, again, /^Question 2 \(questions\[1\], “.+”\) is not valid: field id: ".+" is already in this diary \(was this file imported before\? Import it with merge to add only the questions that are new\)\. Nothing was imported\.$/, 'conflict');
});

test('numbers read exactly as JSON.parse reads them, down to the last bit, through import and export', async () => {
  const written = ['0.1', '0.30000000000000004', '0.3', '1e-7', '1E-7', '5e-324', '4.9406564584124654e-324', '0.9999999999999999', '0.99999999999999994', '0.49999999999999994', '0.5000000000000001', '1.0', '0', '1', '0.1000000000000000055511151231257827', '2.5e-1'];
  const records = written.map((p, i) => `{"id":"n${i}","title":"n${i}","closes_at":"2027-01-01T00:00:00Z","base_rate":${p},"forecasts":[{"at":"2026-01-01T00:00:00Z","p":${p}}]}`);
  const text = `{"format":"forelog-diary","version":1,"questions":[${records.join(',')}]}`;
  const d = openTestDiary();
  await d.call('importText', { format: 'json', text });
  for (const [i, p] of written.entries()) {
    const q = await d.call('getQuestion', { id: `n${i}` });
    assert.ok(Object.is(q.forecasts[0].p, JSON.parse(p)), `${p} → ${q.forecasts[0].p}`);
    assert.ok(Object.is(q.base_rate, JSON.parse(p)));
  }
  const exported = JSON.parse(d.service.diary.exportText('json').text) as { questions: { id: string; forecasts: { p: number }[] }[] };
  for (const q of exported.questions) assert.ok(Object.is(q.forecasts[0]!.p, JSON.parse(written[Number(q.id.slice(1))]!)));
});

test('a file nested 20,000 levels deep is refused with its position, not a stack overflow', async () => {
  const d = openTestDiary();
  const deep = (n: number) => '['.repeat(n) + ']'.repeat(n);
  // The file's object is level 1 and settings level 2, so the 63rd bracket is level 65.
  const prefix = '{"format":"forelog-diary","version":1,"settings":{"x":';
  await refusesText(
    d,
    `${prefix}${deep(20_000)}},"questions":[]}`,
    `The file cannot be read at line 1, column ${prefix.length + 63}: the data is nested more than 64 levels deep here; a diary file never nests that deep. Nothing was imported.`,
  );
  // In a question record (level 3): the 62nd bracket on the record's second line is level 65.
  await refusesText(
    d,
    `{"format":"forelog-diary","version":1,"questions":[{"title":"t","closes_at":"2027-01-01T00:00:00Z","forecasts":[],"x":\n${deep(20_000)}}]}`,
    /^The file cannot be read at line 2, column 62: the data is nested more than 64 levels deep here/,
  );
  // One level less is read (the settings keep unknown members), and the import goes on.
  const d2 = openTestDiary();
  await d2.call('importText', { format: 'json', text: `${prefix}${deep(62)}},"questions":[]}` });
});

test('text that is not JSON is refused with the line and column of the problem', async () => {
  const d = openTestDiary();
  const one = JSON.stringify(question(1), null, 2);
  const text = `{\n  "format": "forelog-diary",\n  "version": 1,\n  "questions": [\n${one}\n${one}\n  ]\n}\n`;
  const line = text.split('\n').findIndex((l, i) => i > 5 && l === '{') + 1;
  await refusesText(d, text, `The file is not valid JSON at line ${line}, column 1: expected "," or "]" after element 0 of "questions" but found "{"; nothing was imported. Is it a Forelog diary file?`);
  const column = (text: string, part: string) => text.indexOf(part) + 1;
  const head = '{"format": "forelog-diary", "version": 1, "questions": [';
  // JSON.parse names no position here: the record that holds the problem is named.
  const token = `${head}{"title": tru}]}`;
  await refusesText(d, token, `The file is not valid JSON at line 1, column ${column(token, '{"title"')}: unexpected "}" in the value that starts here; nothing was imported. Is it a Forelog diary file?`);
  const control = `${head}{"title": "a\nb"}]}`;
  await refusesText(d, control, new RegExp(`^The file is not valid JSON at line 1, column ${column(control, '\n')}: bad control character in string literal;`));
  const trailing = `${head}]} trailing`;
  await refusesText(d, trailing, new RegExp(`^The file is not valid JSON at line 1, column ${column(trailing, 'trailing')}: expected the end of the file after the closing "}" but found "t"`));
  await refusesText(d, head, new RegExp(`^The file is not valid JSON at line 1, column ${head.length + 1}: the file ends where a value should be`));
  const twice = '{"format": "forelog-diary", "format": "forelog-diary", "version": 1, "questions": []}';
  await refusesText(d, twice, `The file cannot be read at line 1, column ${column(twice, '"format": "forelog-diary", "v')}: the member "format" appears a second time; keep one of them. Nothing was imported.`);
});

test('files as people have them: UTF-8 with a byte order mark and UTF-16 read the same; Latin-1 is refused where it breaks', async () => {
  const dir = tempDir();
  const json = JSON.stringify({ ...DIARY, questions: [question(1, { title: 'Zürich ≥ ½ 🙂' })] }, null, 2);
  const csv = 'title,closes_at,forecast_at,p,note\r\nZürich café,2027-01-01T00:00:00Z,2026-01-01T00:00:00Z,0.4,naïve 🙂\r\n';
  const utf16 = (text: string, order: 'le' | 'be') => {
    const le = Buffer.from(`\ufeff${text}`, 'utf16le');
    return order === 'le' ? le : le.swap16();
  };
  const files: [string, Buffer][] = [
    ['plain.json', Buffer.from(json)],
    ['bom.json', Buffer.concat([Buffer.of(0xef, 0xbb, 0xbf), Buffer.from(json)])],
    ['le.json', utf16(json, 'le')],
    ['be.json', utf16(json, 'be')],
    ['plain.csv', Buffer.from(csv)],
    ['bom.csv', Buffer.concat([Buffer.of(0xef, 0xbb, 0xbf), Buffer.from(csv)])],
    ['le.csv', utf16(csv, 'le')],
    ['be.csv', utf16(csv, 'be')],
  ];
  const exports = new Map<string, string>();
  for (const [name, bytes] of files) {
    fs.writeFileSync(path.join(dir, name), bytes);
    const d = openTestDiary();
    assert.deepEqual(d.service.importDiaryFile(path.join(dir, name), name.endsWith('.csv') ? 'csv' : 'json'), { added: 1, skipped: 0 }, name);
    const text = d.service.diary.exportText('json').text.replace(/"id": "[^"]+"/, '"id": "…"');
    const kind = name.split('.')[1]!;
    if (!exports.has(kind)) exports.set(kind, text);
    assert.equal(text, exports.get(kind), `${name} reads as the plain file does`);
  }
  assert.match(exports.get('csv')!, /"Zürich café"[\s\S]*"naïve 🙂"/);

  // The same CSV saved by a spreadsheet in Latin-1: é is the single byte 0xE9.
  const latin1 = path.join(dir, 'latin1.csv');
  fs.writeFileSync(latin1, Buffer.from(csv.replace(' 🙂', ''), 'latin1'));
  const d = openTestDiary();
  assert.throws(
    () => d.service.importDiaryFile(latin1, 'csv'),
    (err: unknown) =>
      err instanceof ApiError &&
      err.message ===
        'This file is not UTF-8 text: at line 2, column 2 (byte offset 37) it holds the byte 0xFC, which UTF-8 does not allow there. It was probably saved in another encoding (such as Windows-1252 or Latin-1). Save the file as UTF-8 (in a spreadsheet: "CSV UTF-8") and try again. Nothing was imported.',
  );
  assert.equal((await d.call('diaryInfo', {})).question_count, 0);
});

test('the reader stops reading when a record is refused, and a diary file error names itself', () => {
  let pulled = 0;
  function* chunks() {
    yield '{"format":"forelog-diary","version":1,"questions":[{"title":""},';
    pulled++;
    yield '{"title":"never read"}]}';
  }
  assert.throws(() => collect(readDiaryText(chunks())), (err: unknown) => err instanceof DiaryFileError && err.record === 0 && err.field === 'title');
  assert.equal(pulled, 0, 'nothing after the bad record was read');
});

test('a setting in a file is held to the app’s rules in the app’s words', async () => {
  const d = openTestDiary();
  const cases: [Record<string, unknown>, string][] = [
    [{ closing_soon_hours: 0 }, 'closing_soon_hours: must be at least 1 hour'],
    [{ closing_soon_hours: 337 }, 'closing_soon_hours: must be at most 336 hours (14 days)'],
    [{ overdue_after_days: 1.5 }, 'overdue_after_days: must be whole days'],
    [{ overdue_after_days: '3' }, 'overdue_after_days: must be whole days'],
    [{ quiet_hours: { start: 2200, end: '07:00' } }, 'quiet_hours.start: must be a time of day HH:MM (24-hour)'],
    [{ quiet_hours: '22:00-07:00' }, 'quiet_hours: must be { "start": "HH:MM", "end": "HH:MM" } or null'],
  ];
  for (const [settings, reason] of cases) {
    await refusesText(d, JSON.stringify({ ...DIARY, settings, questions: [] }), `The settings are not valid: settings.${reason}. Nothing was imported.`);
    // The same rule, in the same words, when the app changes a setting.
    await assert.rejects(d.call('updateSettings', settings as never), (err: unknown) => err instanceof ApiError && err.fields[0] === reason);
  }
});

test('a long history imports whole and in order: revisions at the same time keep the order the file gives them', async () => {
  // 75 revisions: more than one statement's worth (main/store/questions.ts writes 32 at a time),
  // with runs of equal times across the statements' boundaries, and lenses on some.
  const forecasts = Array.from({ length: 75 }, (_, i) => ({
    at: new Date(Date.UTC(2026, 0, 5) + Math.floor(i / 5) * 3_600_000).toISOString(),
    p: (i % 10) / 10 + 0.05,
    note: `revision ${i}`,
    ...(i % 7 === 0 ? { lenses: [{ name: `lens ${i}`, p: 0.5, weight: 1 }] } : {}),
  }));
  const d = openTestDiary({ now: '2026-06-01T00:00:00Z' });
  await d.call('importDiary', { diary: { ...DIARY, questions: [question(1, { forecasts })] } });
  const exported = JSON.parse(d.service.diary.exportText('json').text);
  assert.deepEqual(
    exported.questions[0].forecasts.map((f: { note: string; lenses?: unknown[] }) => [f.note, f.lenses?.length ?? 0]),
    forecasts.map((f) => [f.note, f.lenses ? 1 : 0]),
  );
});

test('a time zone name in the wrong case is kept in its usual spelling, in requests, settings, diary files and CSV; an alias stays as written', async () => {
  const d = openTestDiary();
  const created = await d.call('createQuestion', { title: 'Typed zone', closes_at: '2030-01-01T00:00:00Z', time_zone: 'europe/london' });
  assert.equal(created.time_zone, 'Europe/London');
  await d.call('updateQuestion', { id: created.id, changes: { time_zone: 'AMERICA/NEW_YORK' } });
  assert.equal((await d.call('getQuestion', { id: created.id })).time_zone, 'America/New_York');
  await d.call('updateSettings', { time_zone: 'asia/tokyo' });
  assert.equal(d.service.diary.settings().time_zone, 'Asia/Tokyo');

  const file = JSON.stringify({
    ...DIARY,
    settings: { time_zone: 'pacific/auckland' },
    questions: [
      { id: 'plain', title: 'Plain', closes_at: '2030-01-01T00:00:00Z', time_zone: 'europe/paris', forecasts: [{ at: '2026-01-01T00:00:00Z', p: 0.5 }] },
      { id: 'alias', title: 'Alias', closes_at: '2030-01-01T00:00:00Z', time_zone: 'US/Pacific', forecasts: [] },
      { id: 'lenses', title: 'Lenses', closes_at: '2030-01-01T00:00:00Z', time_zone: 'africa/lagos', forecasts: [{ at: '2026-01-01T00:00:00Z', p: 0.5, lenses: [{ name: 'outside view', p: 0.5 }] }] },
    ],
  });
  const into = openTestDiary();
  await into.call('importText', { format: 'json', text: file });
  const exported = JSON.parse(into.service.diary.exportText('json').text) as { settings: { time_zone: string }; questions: { id: string; time_zone: string }[] };
  assert.equal(exported.settings.time_zone, 'Pacific/Auckland');
  assert.deepEqual(Object.fromEntries(exported.questions.map((q) => [q.id, q.time_zone])), { plain: 'Europe/Paris', alias: 'US/Pacific', lenses: 'Africa/Lagos' });

  const csv = openTestDiary();
  await csv.call('importText', { format: 'csv', text: 'question_id,title,closes_at,time_zone\r\nc1,From CSV,2030-01-01T00:00:00Z,australia/sydney\r\n' });
  assert.equal((await csv.call('getQuestion', { id: 'c1' })).time_zone, 'Australia/Sydney');
  await refusesText(d, JSON.stringify({ ...DIARY, questions: [{ title: 'Nowhere', closes_at: '2030-01-01T00:00:00Z', time_zone: 'europe/nowhere', forecasts: [] }] }), /field time_zone: is not a time zone this system knows/);
});
