/**
 * Every instant Forelog accepts lies in INSTANT_RANGE (shared/time.ts): from
 * 1900-01-01T00:00:00Z up to, not including, 2200-01-01T00:00:00Z, wherever it comes in (the
 * API, the diary file, CSV, the command line). The one-millisecond neighbours of both ends
 * are checked, also written with ±14:00 offsets that carry a wall time across an edge, and
 * a diary using both extremes works everywhere and round-trips through JSON and CSV.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { test } from 'node:test';
import { INSTANT_RANGE, INSTANT_RANGE_RULE, isInstantInRange, parseInstant, toIso } from '../../shared/time';
import * as v from '../../shared/validation';
import { CLOCK_SKEW_MS } from '../../shared/time-rules';
import { exportJson, openTestDiary, tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

/** Instants on both sides of each edge, with the epoch ms each one means. */
const INSIDE = [
  ['1900-01-01T00:00:00.000Z', -2208988800000],
  ['1899-12-31T10:00:00.000-14:00', -2208988800000],
  ['1900-01-01T14:00:00.000+14:00', -2208988800000],
  ['1900-01-01T00:00:00.001Z', -2208988799999],
  ['2199-12-31T23:59:59.999Z', 7258118399999],
  ['2200-01-01T13:59:59.999+14:00', 7258118399999],
  ['2199-12-31T09:59:59.999-14:00', 7258118399999],
  ['2199-12-31T23:59:59.998Z', 7258118399998],
] as const;

const OUTSIDE = [
  ['1899-12-31T23:59:59.999Z', -2208988800001],
  ['1899-12-31T09:59:59.999-14:00', -2208988800001],
  ['1900-01-01T13:59:59.999+14:00', -2208988800001],
  ['2200-01-01T00:00:00.000Z', 7258118400000],
  ['2200-01-01T14:00:00.000+14:00', 7258118400000],
  ['2199-12-31T10:00:00.000-14:00', 7258118400000],
  ['9999-12-31T23:59:59.999-14:00', 253402351199999],
  ['0000-01-01T00:00:00.000Z', -62167219200000],
] as const;

test('the range is 1900-01-01T00:00:00Z inclusive to 2200-01-01T00:00:00Z exclusive, compared by its own inequality', () => {
  assert.equal(INSTANT_RANGE.earliest, Date.parse('1900-01-01T00:00:00.000Z'));
  assert.equal(INSTANT_RANGE.end, Date.parse('2200-01-01T00:00:00.000Z'));
  assert.equal(isInstantInRange(INSTANT_RANGE.earliest), true);
  assert.equal(isInstantInRange(INSTANT_RANGE.earliest - 1), false);
  assert.equal(isInstantInRange(INSTANT_RANGE.end - 1), true);
  assert.equal(isInstantInRange(INSTANT_RANGE.end), false);
  assert.equal(isInstantInRange(Number.NaN), false);
});

test('the instant rule accepts the edge neighbours inside and refuses those outside, offsets included', () => {
  for (const [text, ms] of INSIDE) {
    assert.equal(parseInstant(text), ms, text);
    assert.equal(v.instant.safeParse(text).success, true, text);
  }
  for (const [text, ms] of OUTSIDE) {
    assert.equal(parseInstant(text), ms, `${text} is well-formed; the range is the validator's question`);
    const r = v.instant.safeParse(text);
    assert.equal(r.success, false, text);
    assert.deepEqual(
      r.error!.issues.map((i) => i.message),
      [INSTANT_RANGE_RULE],
      text,
    );
  }
  assert.match(INSTANT_RANGE_RULE, /must be between 1900 and 2199/);
});

test('filter bounds: bare dates cover whole days in UTC, and a day outside the range is refused', () => {
  const ok = (end: 'from' | 'to', text: string) => v.rangeBound(end).safeParse(text).success;
  assert.equal(ok('from', '1900-01-01'), true);
  assert.equal(ok('to', '1900-01-01'), true);
  assert.equal(ok('from', '1899-12-31'), false);
  assert.equal(ok('to', '1899-12-31'), false, 'ends at 1899-12-31T23:59:59.999Z');
  assert.equal(ok('to', '2199-12-31'), true, 'ends at 2199-12-31T23:59:59.999Z');
  assert.equal(ok('from', '2200-01-01'), false);
  // Date.UTC would read these years as 1999 and 1900; they are years 99 and 0.
  assert.equal(ok('from', '0099-06-01'), false);
  assert.equal(ok('to', '0000-01-01'), false);
  for (const [text] of INSIDE) assert.equal(ok('from', text), true, text);
  for (const [text] of OUTSIDE) assert.equal(ok('to', text), false, text);
});

const BEFORE = OUTSIDE[1][0];
const AFTER = OUTSIDE[5][0];

test('every operation taking an instant refuses one outside the range with the rule, and changes nothing', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', { title: 'Edge', closes_at: '2030-01-01T00:00:00Z', first_forecast: { p: 0.5 } });
  const before = exportJson(d.service);
  const requests: [string, unknown, string][] = [
    ['createQuestion', { title: 'x', closes_at: AFTER }, 'closes_at'],
    ['createQuestion', { title: 'x', opened_at: BEFORE, closes_at: '2030-01-01T00:00:00Z' }, 'opened_at'],
    ['createQuestion', { title: 'x', closes_at: '2030-01-01T00:00:00Z', first_forecast: { p: 0.5, at: BEFORE } }, 'first_forecast.at'],
    ['updateQuestion', { id: q.id, changes: { closes_at: AFTER } }, 'changes.closes_at'],
    ['updateQuestion', { id: q.id, changes: { opened_at: BEFORE } }, 'changes.opened_at'],
    ['addForecast', { question_id: q.id, p: 0.4, at: AFTER }, 'at'],
    ['updateForecast', { id: q.forecasts[0].id, at: BEFORE }, 'at'],
    ['addReference', { question_id: q.id, p: 0.4, source: 'desk', at: AFTER }, 'at'],
    ['resolveQuestion', { id: q.id, outcome: 'yes', at: AFTER }, 'at'],
    ['snooze', { question_id: q.id, kind: 'checkin', until: AFTER }, 'until'],
    ['due', { at: AFTER }, 'at'],
    ['due', { at: BEFORE }, 'at'],
    ['score', { from: '1899-12-31' }, 'from'],
    ['score', { to: AFTER }, 'to'],
    ['hindsight', { from: BEFORE }, 'from'],
  ];
  for (const [op, request, field] of requests) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, `${op} ${JSON.stringify(request)}`);
    if (answer.ok) continue;
    assert.equal(answer.error.code, 'invalid');
    assert.deepEqual(answer.error.fields, [`${field}: ${INSTANT_RANGE_RULE}`], op);
  }
  assert.equal(exportJson(d.service), before);
});

test('a diary file or CSV holding an instant outside the range is refused, naming the record and field', async () => {
  const d = openTestDiary();
  const file = (at: string) =>
    JSON.stringify({
      format: 'forelog-diary',
      version: 1,
      questions: [{ title: 'Far', opened_at: '2026-01-01T00:00:00Z', closes_at: '2027-01-01T00:00:00Z', forecasts: [{ at, p: 0.5 }] }],
    });
  const json = await d.service.dispatch('importText', { format: 'json', text: file('9999-12-31T23:59:59.999-14:00') });
  assert.equal(json.ok, false);
  if (!json.ok) assert.match(json.error.message, /Question 1 \(questions\[0\], “Far”\) is not valid: field forecasts\[0\]\.at: must be between 1900 and 2199/);
  const csv = [
    'title,opened_at,closes_at,forecast_at,p',
    `Far,2026-01-01T00:00:00Z,2027-01-01T00:00:00Z,${BEFORE},0.5`,
  ].join('\r\n');
  const fromCsv = await d.service.dispatch('importText', { format: 'csv', text: csv });
  assert.equal(fromCsv.ok, false);
  if (!fromCsv.ok) assert.match(fromCsv.error.message, /must be between 1900 and 2199/);
  assert.equal((await d.call('listQuestions', {})).total, 0);
});

test('a file question closing at the first instant, with no opening time, is refused: its default opening would fall before 1900', async () => {
  // Without opened_at a question opens at its first revision, or now, but always at least 1 ms
  // before its close; for a close at the range's first instant that millisecond is outside
  // the range, and a diary holding it would export a file it could not import again.
  const d = openTestDiary();
  const earliest = toIso(INSTANT_RANGE.earliest);
  const before = exportJson(d.service);
  const json = JSON.stringify({ format: 'forelog-diary', version: 1, questions: [{ title: 'First instant', closes_at: earliest, forecasts: [] }] });
  const fromJson = await d.service.dispatch('importText', { format: 'json', text: json });
  assert.equal(fromJson.ok, false);
  if (!fromJson.ok) {
    assert.equal(fromJson.error.code, 'invalid');
    assert.match(fromJson.error.message, /Question 1 \(questions\[0\], “First instant”\) is not valid: closes_at: must be after 1900-01-01T00:00:00.000Z when the question has no opened_at/);
  }
  const csv = ['title,closes_at', `First instant,${earliest}`].join('\r\n');
  const fromCsv = await d.service.dispatch('importText', { format: 'csv', text: csv });
  assert.equal(fromCsv.ok, false);
  if (!fromCsv.ok) assert.match(fromCsv.error.message, /closes_at: .*1900.*opened_at/);
  assert.equal(exportJson(d.service), before);

  // One millisecond later the default opening is the first instant itself, and the question round-trips.
  const later = toIso(INSTANT_RANGE.earliest + 1);
  await d.call('importText', { format: 'json', text: json.replace(earliest, later) });
  const exported = exportJson(d.service);
  assert.equal((JSON.parse(exported) as { questions: { opened_at: string }[] }).questions[0]!.opened_at, earliest);
  const again = openTestDiary();
  await again.call('importText', { format: 'json', text: exported });
  assert.equal(exportJson(again.service), exported);
});

test('a diary at both extremes works everywhere and re-imports exactly through JSON and CSV', async () => {
  // The clock stands near the range's end, so nothing below lies in the future (the last
  // instant is exactly as far ahead as clock differences allow), and a snooze still can.
  const d = openTestDiary({ now: toIso(INSTANT_RANGE.end - 1 - CLOCK_SKEW_MS) });
  const earliest = toIso(INSTANT_RANGE.earliest);
  const last = toIso(INSTANT_RANGE.end - 1);
  const open = await d.call('createQuestion', {
    title: 'Opens at the first instant, closes at the last',
    opened_at: INSIDE[1][0],
    closes_at: INSIDE[5][0],
    first_forecast: { p: 0.3, at: INSIDE[2][0] },
    checkin_days: 365,
  });
  assert.equal(open.opened_at, earliest);
  assert.equal(open.closes_at, last);
  await d.call('addForecast', { question_id: open.id, p: 0.6, at: INSIDE[6][0] });
  await d.call('addReference', { question_id: open.id, p: 0.5, source: 'desk', at: INSIDE[4][0] });
  const resolved = await d.call('createQuestion', {
    title: 'Resolved at the last instant',
    opened_at: earliest,
    closes_at: INSIDE[7][0],
    first_forecast: { p: 0.9, at: earliest },
  });
  await d.call('resolveQuestion', { id: resolved.id, outcome: 'yes', at: last });
  await d.call('snooze', { question_id: open.id, kind: 'checkin', until: last });

  for (const at of [earliest, last]) {
    const due = await d.call('due', { at });
    assert.equal(due.at, at);
  }
  await d.call('score', { from: '1900-01-01', to: '2199-12-31' });
  await d.call('hindsight', { from: earliest, to: last, include_hits: true });
  assert.match((await d.call('briefing', {})).html, /Resolved at the last instant/);
  assert.match((await d.call('exportText', { format: 'ics' })).text, /BEGIN:VCALENDAR/);

  const json = exportJson(d.service);
  const again = openTestDiary();
  await again.call('importText', { format: 'json', text: json });
  assert.equal(exportJson(again.service), json);
  const csv = (await d.call('exportText', { format: 'csv' })).text;
  const fromCsv = openTestDiary();
  await fromCsv.call('importText', { format: 'csv', text: csv });
  const questions = (text: string) => (JSON.parse(text) as { questions: unknown[] }).questions;
  assert.deepEqual(questions(exportJson(fromCsv.service)), questions(json));
});

test('a snooze preset that would end after 2199 is refused, naming the preset, and nothing is snoozed', async () => {
  const d = openTestDiary({ now: '2199-12-30T12:00:00Z' });
  const q = await d.call('createQuestion', { title: 'Late', closes_at: toIso(INSTANT_RANGE.end - 1), first_forecast: { p: 0.5 }, checkin_days: 1 });
  const before = exportJson(d.service);
  const answer = await d.service.dispatch('snooze', { question_id: q.id, kind: 'checkin', preset: 'next_week' });
  assert.equal(answer.ok, false);
  if (!answer.ok) {
    assert.equal(answer.error.code, 'invalid');
    assert.deepEqual(answer.error.fields, ['preset: would end at 2200-01-06T09:00:00.000Z, after 2199, the last year Forelog keeps; give an until time before 2200-01-01T00:00:00.000Z instead']);
  }
  assert.equal(exportJson(d.service), before);
  assert.deepEqual(d.service.store.read.prepare('SELECT count(*) AS n FROM snoozes').get(), { n: 0 });
  // A preset that ends inside the range still snoozes.
  assert.equal((await d.call('snooze', { question_id: q.id, kind: 'checkin', preset: 'tomorrow_morning' })).until, '2199-12-31T09:00:00.000Z');
});

test('the command line refuses --at, --from and --to outside the range with the rule', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  openTestDiary({ dbPath: db }).service.close();
  const run = (...args: string[]) =>
    spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args, '--db', db], { cwd: ROOT, encoding: 'utf8' });
  const due = run('due', '--at', '2200-01-01T00:00:00Z');
  assert.equal(due.status, 1);
  assert.match(due.stderr, /at: must be between 1900 and 2199/);
  const score = run('score', '--from', '1899-12-31', '--to', '2200-01-01');
  assert.equal(score.status, 1);
  assert.match(score.stderr, /from: must be between 1900 and 2199.*to: must be between 1900 and 2199/);
  const inside = run('due', '--at', '2199-12-31T23:59:59.999Z', '--json');
  assert.equal(inside.status, 0, inside.stderr);
  assert.equal(JSON.parse(inside.stdout).at, '2199-12-31T23:59:59.999Z');
});

test('a filter whose to is before its from is refused as invalid by score and hindsight alike', async () => {
  const d = openTestDiary();
  for (const op of ['score', 'hindsight'] as const) {
    const answer = await d.service.dispatch(op, { from: '2200-01-01T13:59:59.999+14:00', to: '2026-12-31' });
    assert.equal(answer.ok, false, op);
    if (!answer.ok) assert.deepEqual(answer.error.fields, ['to: must not be before from'], op);
    const sameDay = await d.service.dispatch(op, { from: '2026-12-31', to: '2026-12-31' });
    assert.equal(sameDay.ok, true, `${op}: a single day is a valid range`);
  }
});
