/**
 * Migration 5 (question types) on a real diary file of schema 4, as the shipped code made
 * them: every row of every table comes through with every value and its SQLite type, the
 * entry-order counters are kept, the old foreign keys still cascade, and the diary then
 * takes choice and numeric questions.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import path from 'node:path';
import { test } from 'node:test';
import { MIGRATIONS, SCHEMA_VERSION } from '../../main/store/migrations';
import { migrate, openStore } from '../../main/store/open';
import { callOrThrow } from '../../main/service/dispatch';
import { openDiary } from '../../main/service/index';
import type { Question } from '../../shared/domain';
import { forelog } from '../support/diary-process';
import { exportJson, tempDir } from '../support/temp-diary';

const V4 = MIGRATIONS.filter((m) => m.version <= 4);

/** Every row of `table` (all columns, each with its SQLite type), ordered by every column. */
function rows(db: Database.Database, table: string, columns: string[]): unknown[] {
  const quoted = columns.map((c) => `"${c}"`);
  return db.prepare(`SELECT ${quoted.flatMap((c) => [c, `typeof(${c})`]).join(', ')} FROM "${table}" ORDER BY ${quoted.join(', ')}`).raw().all();
}

function columnsOf(db: Database.Database, table: string): string[] {
  return (db.prepare('SELECT name FROM pragma_table_info(?)').all(table) as { name: string }[]).map((c) => c.name);
}

function tablesOf(db: Database.Database): string[] {
  return (db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name").all() as { name: string }[]).map((r) => r.name);
}

/** A schema-4 diary with a row in every table, awkward values included (0.1 + 0.2, a NUL-free note with line breaks, a gap in seq). */
function makeV4Diary(file: string): void {
  const db = new Database(file);
  db.pragma('journal_mode = WAL');
  db.pragma('foreign_keys = ON');
  assert.equal(migrate(db, V4), 4);
  db.exec(`
    INSERT INTO questions (id, title, rule, kind, opened_at, closes_at, time_zone, base_rate, base_rate_note, false_alarm_cost, miss_cost, checkin_days, created_at, updated_at)
    VALUES ('q1', 'Northgate renews', 'Yes if signed
by the close', 'event_by_deadline', 1700000000000, 1800000000000, 'Europe/London', ${0.1 + 0.2}, '6 of 20', 1, 4, 14, 1700000000001, 1700000000002),
           ('q2', 'Office still open', '', 'state_at_deadline', 1700000000000, 1750000000000, 'UTC', NULL, '', NULL, NULL, NULL, 1700000000003, 1700000000004);
    INSERT INTO question_tags VALUES ('q1', 'client:northgate', 0), ('q1', 'renewals', 1), ('q2', 'ops', 0);
    INSERT INTO forecasts (id, question_id, at, p, note) VALUES
      ('f1', 'q1', 1700000000000, 0.123456789012345, 'first'), ('f2', 'q1', 1700000000000, 0.5, ''),
      ('f3', 'q2', 1710000000000, 1, 'sure'), ('f4', 'q2', 1710000000001, 0.9, 'gone');
    DELETE FROM forecasts WHERE id = 'f4';
    INSERT INTO forecast_lenses VALUES ('f1', 0, 'outside view', 0.3, 1), ('f1', 1, 'inside view', ${1 / 3}, 2.5);
    INSERT INTO reference_forecasts (id, question_id, at, p, source) VALUES ('r1', 'q1', 1690000000000, 0.6, 'client'), ('r2', 'q1', 1690000000000, 0, 'desk');
    INSERT INTO resolutions VALUES ('q2', 'no', 1740000000000, 'closed', 1740000000005);
    INSERT INTO resolution_history (question_id, outcome, at, note, recorded_at, replaced_at, change, change_note)
      VALUES ('q2', 'yes', 1739000000000, '', 1739000000001, 1740000000005, 'corrected', 'misread');
    INSERT INTO settings VALUES ('time_zone', '"Europe/London"');
    INSERT INTO nudge_log VALUES ('checkin:q1:1', 'q1', 'checkin', 1750000000000);
    INSERT INTO snoozes VALUES ('q1', 'checkin', 1760000000000);
    INSERT INTO undo_log (token, question_id, operation, recorded_at, before, size, after_hash) VALUES ('t1', 'q1', 'addForecast', 1700000000000, '{}', 2, 'abc');
  `);
  db.close();
}

test('a schema-4 diary migrates through 5 (question types) and on with every byte of its data kept', () => {
  const file = path.join(tempDir(), 'v4.sqlite');
  makeV4Diary(file);
  const old = new Database(file, { readonly: true });
  const before = new Map(tablesOf(old).map((t) => [t, { columns: columnsOf(old, t), rows: rows(old, t, columnsOf(old, t)) }]));
  old.close();

  const store = openStore(file);
  try {
    const db = store.read;
    assert.equal(db.pragma('user_version', { simple: true }), SCHEMA_VERSION);
    assert.ok(SCHEMA_VERSION >= 5, 'the question-types migration (5) has run');
    for (const [table, { columns, rows: expected }] of before) {
      // The columns a schema-4 diary had, read back exactly (new columns are compared below).
      assert.deepEqual(rows(db, table, columns), expected, `${table}: every row kept`);
    }
    // The entry-order counters survive the rebuilt tables: a deleted revision's seq is never reused.
    assert.deepEqual(db.prepare('SELECT name, seq FROM sqlite_sequence ORDER BY name').raw().all(), [
      ['forecasts', 4],
      ['reference_forecasts', 2],
      ['resolution_history', 1],
      ['undo_log', 1],
    ]);
    assert.deepEqual(db.prepare('SELECT DISTINCT type, ordered, unit, value_kind FROM questions').raw().all(), [['binary', null, null, null]]);
    assert.deepEqual(db.prepare('SELECT DISTINCT option, value FROM resolutions').raw().all(), [[null, null]]);
    assert.deepEqual(db.prepare('SELECT DISTINCT option, value FROM resolution_history').raw().all(), [[null, null]]);
    for (const t of ['question_options', 'question_levels', 'forecast_values', 'reference_values']) {
      assert.equal(db.prepare(`SELECT count(*) FROM ${t}`).pluck().get(), 0, `${t} starts empty`);
    }
    assert.deepEqual(db.pragma('foreign_key_check'), []);
    assert.equal(db.pragma('foreign_keys', { simple: true }), 1);
    // The rebuilt tables keep their indexes and their children's cascades.
    const indexes = db.prepare("SELECT name FROM sqlite_master WHERE type = 'index' AND name NOT LIKE 'sqlite_%' ORDER BY name").pluck().all();
    assert.deepEqual(indexes, ['forecasts_noted', 'forecasts_question', 'nudge_log_question', 'question_tags_tag', 'questions_closes_at', 'reference_forecasts_question', 'resolution_history_question', 'undo_log_recorded']);
    store.write.prepare("DELETE FROM forecasts WHERE id = 'f1'").run();
    assert.equal(db.prepare("SELECT count(*) FROM forecast_lenses WHERE forecast_id = 'f1'").pluck().get(), 0, 'lenses go with their revision');
  } finally {
    store.close();
  }
});

test('a migrated diary reads as before, exports its yes/no questions without a type, and takes the new types', async () => {
  const file = path.join(tempDir(), 'v4.sqlite');
  makeV4Diary(file);
  const service = openDiary({ dbPath: file, now: () => 1760000000000, timeZone: 'UTC' });
  try {
    const q1 = (await callOrThrow(service.dispatch, 'getQuestion', { id: 'q1' })) as Question;
    assert.equal(q1.type, 'binary');
    assert.deepEqual(
      q1.type === 'binary' ? q1.forecasts.map((f) => [f.id, f.p, f.seq, f.lenses.length]) : null,
      [
        ['f1', 0.123456789012345, 1, 2],
        ['f2', 0.5, 2, 0],
      ],
    );
    const text = exportJson(service);
    assert.equal(text.includes('"type"'), false, 'a diary of yes/no questions exports as before');
    const c = (await callOrThrow(service.dispatch, 'createQuestion', {
      type: 'choice',
      title: 'Which supplier?',
      options: ['A', 'B'],
      closes_at: '2030-01-01T00:00:00Z',
      first_forecast: { probs: [0.25, 0.75] },
    })) as Question;
    assert.equal(c.type, 'choice');
    // The next revision continues the old counter (5, after the deleted 4).
    assert.equal(c.forecasts[0]!.seq, 5);
  } finally {
    service.close();
  }
});

test('a command that opens an older diary says on stderr that it is updating it, once; a current diary says nothing', () => {
  const file = path.join(tempDir(), 'older.sqlite');
  makeV4Diary(file);
  const first = forelog('due', '--json', '--at', '2026-01-01T00:00:00Z', '--db', file);
  assert.equal(first.status, 0, first.stderr);
  assert.match(first.stderr, new RegExp(`^Updating the diary at .*older\\.sqlite to this version's format \\(4 → ${SCHEMA_VERSION}\\)`));
  JSON.parse(first.stdout); // the command's own answer is untouched on stdout
  const again = forelog('due', '--json', '--at', '2026-01-01T00:00:00Z', '--db', file);
  assert.equal(again.status, 0, again.stderr);
  assert.equal(again.stderr, '');
});
