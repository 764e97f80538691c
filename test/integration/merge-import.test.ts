/**
 * Importing with merge: questions already in the diary exactly as the file has them are
 * skipped, new ones are added, and any that are in the diary with different contents are
 * reported — what differs, where in the file — and then nothing is imported at all.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError, type ImportConflict } from '../../shared/contract';
import { exportJson, openTestDiary, type TestDiary } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

/** A diary with the shapes a comparison must get right: lenses, same-time revisions, references, a corrected resolution. */
async function source(): Promise<TestDiary> {
  const d = openTestDiary({ now: iso(NOW), timeZone: 'Europe/London' });
  const a = await d.call('createQuestion', {
    title: 'Northgate signs phase 2',
    tags: ['client:northgate'],
    opened_at: iso(NOW - 40 * DAY),
    closes_at: iso(NOW - 2 * DAY),
    costs: { false_alarm: 1, miss: 4 },
    first_forecast: { p: 0.4, at: iso(NOW - 39 * DAY), lenses: [{ name: 'outside view', p: 0.3, weight: 1 }] },
  });
  await d.call('addForecast', { question_id: a.id, p: 0.6, at: iso(NOW - 20 * DAY) });
  await d.call('addForecast', { question_id: a.id, p: 0.65, at: iso(NOW - 20 * DAY), note: 'same minute, entered later' });
  await d.call('addReference', { question_id: a.id, p: 0.5, source: 'client', at: iso(NOW - 45 * DAY) });
  await d.call('resolveQuestion', { id: a.id, outcome: 'no', at: iso(NOW - 2 * DAY) });
  await d.call('resolveQuestion', { id: a.id, outcome: 'yes', at: iso(NOW - 3 * DAY), correction_note: 'late scan' });
  await d.call('createQuestion', { title: 'Ashwell pilot reaches 500 users', opened_at: iso(NOW - 5 * DAY), closes_at: iso(NOW + 30 * DAY), base_rate: 0.25 });
  return d;
}

function refusedMerge(err: unknown): ApiError & { conflicts: ImportConflict[] } {
  assert.ok(err instanceof ApiError, String(err));
  assert.equal(err.code, 'conflict', err.message);
  assert.ok(err.conflicts, 'the conflicts come as a list too');
  return err as ApiError & { conflicts: ImportConflict[] };
}

test('re-importing your own export with merge skips what is there and adds what is new', async () => {
  const a = await source();
  const first = exportJson(a.service);
  const b = openTestDiary({ now: iso(NOW + DAY) });
  assert.deepEqual(await b.call('importText', { format: 'json', text: first, merge: true }), { added: 2, skipped: 0 }, 'into an empty diary merge is a plain import');
  await a.call('createQuestion', { title: 'Halloway signs a diagnostic', opened_at: iso(NOW - DAY), closes_at: iso(NOW + 9 * DAY), first_forecast: { p: 0.45, at: iso(NOW - DAY) } });
  const second = exportJson(a.service);
  assert.deepEqual(await b.call('importText', { format: 'json', text: second, merge: true }), { added: 1, skipped: 2 });
  assert.equal(exportJson(b.service), second, 'the diary now holds exactly the newer export');
  assert.deepEqual(await b.call('importText', { format: 'json', text: second, merge: true }), { added: 0, skipped: 3 }, 'and again: nothing new');
  assert.equal(exportJson(b.service), second);
  // The same through CSV, which carries no resolution history: that is not a difference.
  const csv = (await a.call('exportText', { format: 'csv' })).text;
  assert.deepEqual(await b.call('importText', { format: 'csv', text: csv, merge: true }), { added: 0, skipped: 3 });
  // Without merge the same file is refused whole, and the message names the way forward.
  await assert.rejects(b.call('importText', { format: 'json', text: second }), (err: unknown) => err instanceof ApiError && err.code === 'conflict' && /Import it with merge/.test(err.message));
});

test('a question present with different contents is a conflict: what differs, where, and nothing imported', async () => {
  const a = await source();
  const b = openTestDiary({ now: iso(NOW + DAY) });
  await b.call('importText', { format: 'json', text: exportJson(a.service) });
  const before = exportJson(b.service);
  const file = JSON.parse(exportJson(a.service)) as { questions: Record<string, any>[] };
  const [northgate, ashwell] = file.questions;
  northgate!.title = 'Northgate signs phase 2 (renamed)';
  // Two revisions at the same time in the other order: the later-entered one no longer stands.
  [northgate!.forecasts[1], northgate!.forecasts[2]] = [northgate!.forecasts[2], northgate!.forecasts[1]];
  ashwell!.base_rate = 0.25000000000000006; // one ulp away
  file.questions.push({ title: 'A new one', closes_at: iso(NOW + DAY), forecasts: [] });
  const err = refusedMerge(await b.call('importDiary', { diary: file, merge: true }).catch((e: unknown) => e));
  assert.deepEqual(err.conflicts, [
    { index: 0, row: null, id: northgate!.id, title: 'Northgate signs phase 2 (renamed)', differs: ['title', 'forecasts'] },
    { index: 1, row: null, id: ashwell!.id, title: 'Ashwell pilot reaches 500 users', differs: ['base_rate'] },
  ]);
  assert.deepEqual(err.fields, [
    `Question 1 (questions[0]): "${northgate!.id}" (“Northgate signs phase 2 (renamed)”) differs in title, forecasts`,
    `Question 2 (questions[1]): "${ashwell!.id}" (“Ashwell pilot reaches 500 users”) differs in base_rate`,
  ]);
  assert.match(err.message, /^2 questions are already in this diary with different contents, so nothing was imported: Question 1 \(questions\[0\]\)/);
  assert.match(err.message, /remove it from the file to keep the diary’s version, or delete it from the diary \(or give it a new id in the file\) to take the file’s; then import again with merge\.$/);
  assert.equal(exportJson(b.service), before, 'the new question was not added either');
  // Over the wire the list travels in the error body.
  const envelope = await b.service.dispatch('importDiary', { diary: file, merge: true });
  assert.equal(envelope.ok, false);
  if (!envelope.ok) assert.equal(envelope.error.conflicts?.length, 2);
});

test('fields the file leaves to their defaults compare as those defaults; an opening left out is not compared', async () => {
  const d = openTestDiary({ now: iso(NOW), timeZone: 'Europe/London' });
  const q = { id: 'q1', title: 'Written by a script', closes_at: iso(NOW + 10 * DAY), forecasts: [] };
  await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [q] } });
  d.clock.now += DAY; // an opening left out would now default to a later time
  assert.deepEqual(await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [q] }, merge: true }), { added: 0, skipped: 1 });
  const zoned = { ...q, time_zone: 'Asia/Tokyo' };
  const err = refusedMerge(await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [zoned] }, merge: true }).catch((e: unknown) => e));
  assert.deepEqual(err.conflicts[0]!.differs, ['time_zone']);
  const opened = { ...q, opened_at: iso(NOW - 3 * DAY) };
  assert.deepEqual(refusedMerge(await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [opened] }, merge: true }).catch((e: unknown) => e)).conflicts[0]!.differs, ['opened_at']);
});

test('CSV conflicts name the question’s first row; rows of one question may be anywhere in the file', async () => {
  const a = await source();
  const b = openTestDiary({ now: iso(NOW + DAY) });
  await b.call('importText', { format: 'json', text: exportJson(a.service) });
  const csv = (await a.call('exportText', { format: 'csv' })).text;
  const [header, ...rows] = csv.trimEnd().split('\r\n');
  // The Ashwell question (the last row), with another base rate, put between Northgate's rows.
  // (Northgate's own rows keep their order: two of its revisions share a time, and their
  // order is which one stands.)
  const between = (ashwell: string) => [header, rows[0], ashwell, ...rows.slice(1, -1)].join('\r\n') + '\r\n';
  const text = between(rows.at(-1)!.replace(',0.25,,', ',0.3,,'));
  const before = exportJson(b.service);
  const err = refusedMerge(await b.call('importText', { format: 'csv', text, merge: true }).catch((e: unknown) => e));
  assert.deepEqual(err.conflicts.map((c) => [c.row, c.title, c.differs]), [[3, 'Ashwell pilot reaches 500 users', ['base_rate']]]);
  assert.match(err.message, /^1 question is already in this diary with different contents, so nothing was imported: The question on row 3:/);
  assert.equal(exportJson(b.service), before);
  assert.deepEqual(await b.call('importText', { format: 'csv', text: between(rows.at(-1)!), merge: true }), { added: 0, skipped: 2 });
  // Northgate's same-time revisions in the other order: its forecasts differ.
  const swapped = [header, rows[0], rows[2], rows[1], ...rows.slice(3)].join('\r\n') + '\r\n';
  assert.deepEqual(refusedMerge(await b.call('importText', { format: 'csv', text: swapped, merge: true }).catch((e: unknown) => e)).conflicts.map((c) => c.differs), [['forecasts']]);
});

test('a long list of conflicts is counted whole and listed up to 100', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const questions = Array.from({ length: 101 }, (_, i) => ({ id: `q${i}`, title: `Question ${i}`, closes_at: iso(NOW + DAY), forecasts: [] }));
  await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions } });
  const renamed = questions.map((q) => ({ ...q, title: `${q.title}!` }));
  const err = refusedMerge(await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: renamed }, merge: true }).catch((e: unknown) => e));
  assert.equal(err.conflicts.length, 100);
  assert.equal(err.fields.length, 100);
  assert.match(err.message, /^101 questions are already in this diary with different contents.*; and 96 more\. For each/);
});
