/**
 * Undo through the service: every change to a question answers with a token, and `undo`
 * puts the question's rows back exactly — same ids, entry order (seq), stamps, lenses,
 * tags, resolution, history and snoozes, down to each value's SQLite type — as long as
 * the question has not changed since. Checked on the raw tables of a real diary file.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { recordUndo, snapshotQuestion, UNDO_KEEP_ENTRIES, UNDO_KEEP_MS } from '../../main/store/undo';
import { exportJson, openTestDiary, type TestDiary } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

/** Every row of every table that holds diary data, each value with its SQLite type, in a fixed order. */
function dump(d: TestDiary): Record<string, unknown[]> {
  const db = d.service.store.read;
  const tables = (
    db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' ESCAPE '\\' AND name NOT IN ('undo_log') ORDER BY name").all() as {
      name: string;
    }[]
  ).map((r) => r.name);
  const out: Record<string, unknown[]> = {};
  for (const table of tables) {
    const columns = (db.prepare('SELECT name FROM pragma_table_info(?)').all(table) as { name: string }[]).map((c) => `"${c.name}"`);
    const select = columns.flatMap((c) => [c, `typeof(${c})`]).join(', ');
    out[table] = db.prepare(`SELECT ${select} FROM "${table}" ORDER BY ${columns.join(', ')}`).raw().all();
  }
  return out;
}

/** A question with everything a question can hold: tags, costs, lenses, two sources, a corrected resolution. */
async function fullQuestion(d: TestDiary) {
  const q = await d.call('createQuestion', {
    title: 'Northgate signs the phase-2 statement of work',
    rule: 'Yes if a countersigned SOW arrives by the close.',
    tags: ['client:northgate', 'renewals'],
    opened_at: iso(NOW - 40 * DAY),
    closes_at: iso(NOW - 2 * DAY),
    time_zone: 'Europe/London',
    base_rate: 0.3,
    base_rate_note: '6 of 20 renewals',
    costs: { false_alarm: 1, miss: 4 },
    checkin_days: 14,
    first_forecast: { p: 0.123456789012345, note: 'first look', at: iso(NOW - 39 * DAY), lenses: [{ name: 'outside view', p: 0.3, weight: 1 }] },
  });
  await d.call('addForecast', { question_id: q.id, p: 0.55, at: iso(NOW - 20 * DAY), lenses: [{ name: 'inside view', p: 0.7, weight: 2.5 }] });
  await d.call('addReference', { question_id: q.id, p: 0.6, source: "client's account lead", at: iso(NOW - 50 * DAY) });
  await d.call('resolveQuestion', { id: q.id, outcome: 'no', at: iso(NOW - 2 * DAY), note: 'no signature' });
  d.clock.now += 1000;
  return d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: iso(NOW - 3 * DAY), note: 'signed after all', correction_note: 'the scan arrived late' });
}

test('each change undone gives back the question row for row, with every stamp, seq and type', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await fullQuestion(d);
  const other = await d.call('createQuestion', { title: 'An open neighbour', opened_at: iso(NOW - DAY), closes_at: iso(NOW + 30 * DAY), first_forecast: { p: 0.5, at: iso(NOW - DAY) } });
  const f = q.forecasts[1];
  const changes: [string, () => Promise<{ undo: string }>][] = [
    ['updateQuestion', () => d.call('updateQuestion', { id: q.id, changes: { title: 'Renamed', tags: ['other'], costs: null, base_rate: null, kind: 'state_at_deadline' } })],
    ['addForecast', () => d.call('addForecast', { question_id: other.id, p: 0.9, note: 'news', lenses: [{ name: 'l', p: 0.1, weight: 0 }, { name: 'm', p: 0.2, weight: 1 }] })],
    ['updateForecast', () => d.call('updateForecast', { id: f.id, p: 0.56, note: 'typo', at: iso(NOW - 21 * DAY), lenses: [] })],
    ['deleteForecast', () => d.call('deleteForecast', { id: f.id })],
    ['addReference', () => d.call('addReference', { question_id: q.id, p: 0.2, source: 'panel' })],
    ['deleteReference', () => d.call('deleteReference', { id: q.references[0].id })],
    ['resolveQuestion (a correction)', () => d.call('resolveQuestion', { id: q.id, outcome: 'void', note: 'scope changed', correction_note: 'not fair to score' })],
    ['resolveQuestion', () => d.call('resolveQuestion', { id: other.id, outcome: 'no' })],
    ['reopenQuestion', () => d.call('reopenQuestion', { id: q.id, note: 'the client disputes it' })],
    ['snooze', () => d.call('snooze', { question_id: other.id, kind: 'closing_soon', preset: 'next_week' })],
    ['deleteQuestion', () => d.call('deleteQuestion', { id: q.id })],
    ['createQuestion', () => d.call('createQuestion', { title: 'Made and taken back', closes_at: iso(NOW + DAY), first_forecast: { p: 0.2 } })],
  ];
  for (const [name, change] of changes) {
    const before = dump(d);
    const beforeExport = exportJson(d.service);
    d.clock.now += 60_000;
    const { undo } = await change();
    assert.notDeepEqual(dump(d), before, `${name} changed something`);
    d.clock.now += 60_000;
    const result = await d.call('undo', { token: undo });
    assert.deepEqual(dump(d), before, `${name}: undone row for row`);
    assert.equal(exportJson(d.service), beforeExport, `${name}: the export is as before`);
    assert.equal(result.operation, name.split(' ')[0]);
    if (name === 'createQuestion') assert.equal(result.question, null, 'undoing a creation leaves no question');
    else assert.deepEqual(result.question, await d.call('getQuestion', { id: result.question_id }));
  }
});

test('snoozing and unsnoozing are undone too, and a revision that cleared a snooze brings it back', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await d.call('createQuestion', { title: 'Check-in due', opened_at: iso(NOW - 20 * DAY), closes_at: iso(NOW + 20 * DAY), first_forecast: { p: 0.4, at: iso(NOW - 10 * DAY) } });
  await d.call('snooze', { question_id: q.id, kind: 'checkin', preset: 'tomorrow_morning' });
  const first = (await d.call('getQuestion', { id: q.id })).snoozes;
  const moved = await d.call('snooze', { question_id: q.id, kind: 'checkin', preset: 'next_week' });
  await d.call('undo', { token: moved.undo });
  assert.deepEqual((await d.call('getQuestion', { id: q.id })).snoozes, first, 'the earlier snooze is back, not none');
  const ended = await d.call('unsnooze', { question_id: q.id });
  assert.deepEqual(ended.kinds, ['checkin']);
  await d.call('undo', { token: ended.undo });
  assert.deepEqual((await d.call('getQuestion', { id: q.id })).snoozes, first);
  const revised = await d.call('addForecast', { question_id: q.id, p: 0.5 });
  assert.deepEqual(revised.snoozes, [], 'a revision answers the check-in');
  await d.call('undo', { token: revised.undo });
  assert.deepEqual((await d.call('getQuestion', { id: q.id })).snoozes, first);
});

test('a question changed since is not undone; undoing newest first works back through the changes', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await d.call('createQuestion', { title: 'Pilot reaches 500 users', opened_at: iso(NOW - 30 * DAY), closes_at: iso(NOW - DAY), first_forecast: { p: 0.3, at: iso(NOW - 30 * DAY) } });
  const original = dump(d);
  const resolved = await d.call('resolveQuestion', { id: q.id, outcome: 'yes', note: 'hit 512' });
  const revised = await d.call('addForecast', { question_id: q.id, p: 0.9, at: iso(NOW - 2 * DAY) });
  const afterBoth = exportJson(d.service);
  await assert.rejects(d.call('undo', { token: resolved.undo }), (err: unknown) => {
    assert.ok(err instanceof ApiError);
    assert.equal(err.code, 'conflict');
    assert.match(err.message, /^“Pilot reaches 500 users” changed since, so nothing was undone/);
    return true;
  });
  assert.equal(exportJson(d.service), afterBoth, 'a refused undo changes nothing');
  await d.call('undo', { token: revised.undo });
  await d.call('undo', { token: resolved.undo });
  assert.deepEqual(dump(d), original);
  await assert.rejects(d.call('undo', { token: resolved.undo }), (err: unknown) => err instanceof ApiError && err.code === 'not_found' && /can no longer be undone/.test(err.message), 'each change is undone once');
  await assert.rejects(d.call('undo', { token: 'made-up' }), (err: unknown) => err instanceof ApiError && err.code === 'not_found');
  // A question deleted, then another made with its id by an import, is not overwritten.
  const gone = await d.call('deleteQuestion', { id: q.id });
  await d.call('importDiary', { diary: { format: 'forelog-diary', version: 1, questions: [{ id: q.id, title: 'Someone else', closes_at: iso(NOW + DAY), forecasts: [] }] } });
  await assert.rejects(d.call('undo', { token: gone.undo }), (err: unknown) => err instanceof ApiError && err.code === 'conflict');
  assert.equal((await d.call('getQuestion', { id: q.id })).title, 'Someone else');
});

test('the log keeps 7 days and the last 200 changes: the edges, to the millisecond and to the entry', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const q = await d.call('createQuestion', { title: 'Kept a week', opened_at: iso(NOW - DAY), closes_at: iso(NOW + 30 * DAY) });
  const a = await d.call('snooze', { question_id: q.id, kind: 'checkin', until: iso(NOW + 30 * DAY) });
  d.clock.now = NOW + UNDO_KEEP_MS;
  await d.call('undo', { token: a.undo });
  const b = await d.call('snooze', { question_id: q.id, kind: 'checkin', until: iso(NOW + 30 * DAY) });
  d.clock.now += UNDO_KEEP_MS + 1;
  await assert.rejects(d.call('undo', { token: b.undo }), (err: unknown) => err instanceof ApiError && err.code === 'not_found' && /last 200 changes for 7 days/.test(err.message));

  const tokens: string[] = [];
  for (let i = 0; i <= UNDO_KEEP_ENTRIES; i++) {
    tokens.push((await d.call('updateQuestion', { id: q.id, changes: { rule: `version ${i}` } })).undo);
  }
  const count = () => (d.service.store.read.prepare('SELECT count(*) AS n FROM undo_log').get() as { n: number }).n;
  assert.equal(count(), UNDO_KEEP_ENTRIES);
  await assert.rejects(d.call('undo', { token: tokens[0]! }), (err: unknown) => err instanceof ApiError && err.code === 'not_found', 'the 201st change pushed the first out');
  await assert.rejects(d.call('undo', { token: tokens[1]! }), (err: unknown) => err instanceof ApiError && err.code === 'conflict', 'the second is still kept (later changes stand in its way)');
  await d.call('undo', { token: tokens.at(-1)! });
  assert.equal((await d.call('getQuestion', { id: q.id })).rule, `version ${UNDO_KEEP_ENTRIES - 1}`);
});

test('rows of a table added by a later migration come back too: the snapshot follows foreign keys, not a list', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  // Stands for what the question types' migration adds: per-revision rows keyed to forecasts.
  d.service.store.write.exec(`CREATE TABLE forecast_choice_p (
    forecast_id TEXT NOT NULL REFERENCES forecasts (id) ON DELETE CASCADE,
    position INTEGER NOT NULL, p REAL NOT NULL, PRIMARY KEY (forecast_id, position))`);
  const q = await d.call('createQuestion', { title: 'Which vendor wins', opened_at: iso(NOW - DAY), closes_at: iso(NOW + DAY), first_forecast: { p: 0.5, at: iso(NOW - DAY) } });
  const insert = d.service.store.write.prepare('INSERT INTO forecast_choice_p VALUES (?, ?, ?)');
  [0.1, 0.2, 0.7000000000000001].forEach((p, i) => insert.run(q.forecasts[0].id, i, p));
  const before = dump(d);
  const { undo } = await d.call('deleteQuestion', { id: q.id });
  assert.equal(dump(d).forecast_choice_p!.length, 0, 'the delete cascaded');
  await d.call('undo', { token: undo });
  assert.deepEqual(dump(d), before);
});

test('the log is bounded by size too, oldest first, always keeping the newest change', () => {
  const d = openTestDiary({ now: iso(NOW) });
  const db = d.service.store.write;
  db.exec(`INSERT INTO questions (id, title, rule, kind, opened_at, closes_at, time_zone, created_at, updated_at)
           VALUES ('big', 'Heavy', '${'r'.repeat(1000)}', 'event_by_deadline', 0, 1, 'UTC', 0, 0)`);
  const before = snapshotQuestion(db, 'big');
  const size = JSON.stringify(before).length;
  const limits = { entries: 200, ms: UNDO_KEEP_MS, size: 3 * size };
  const tokens = Array.from({ length: 5 }, () => d.service.store.transact(() => recordUndo(db, 'updateQuestion', 'big', before, NOW, limits)));
  const kept = (db.prepare('SELECT token FROM undo_log ORDER BY seq').all() as { token: string }[]).map((r) => r.token);
  assert.deepEqual(kept, tokens.slice(2), 'exactly three snapshots fit');
  const alone = d.service.store.transact(() => recordUndo(db, 'updateQuestion', 'big', before, NOW, { ...limits, size: size - 1 }));
  assert.deepEqual((db.prepare('SELECT token FROM undo_log').all() as { token: string }[]).map((r) => r.token), [alone], 'the newest stays even when it alone is over');
});
