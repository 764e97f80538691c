/**
 * `forelog restore` while another process (browser mode, the desktop app in the tray) has
 * the diary open: that process must read the restored diary, and nothing it writes after
 * the restore may vanish. The replaced diary is kept as a safety copy.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { MIGRATIONS, SCHEMA_VERSION } from '../../main/store/migrations';
import { migrate } from '../../main/store/open';
import { openDiary } from '../../main/service/index';
import { callOrThrow } from '../../main/service/dispatch';
import { forelog, startDiaryProcess } from '../support/diary-process';
import { tempDir } from '../support/temp-diary';

const CLOSES = '2027-01-01T00:00:00Z';

function titlesIn(dbPath: string): string[] {
  const db = new Database(dbPath, { readonly: true, fileMustExist: true });
  try {
    return (db.prepare('SELECT title FROM questions ORDER BY title').all() as { title: string }[]).map((r) => r.title);
  } finally {
    db.close();
  }
}

async function titlesSeenBy(proc: Awaited<ReturnType<typeof startDiaryProcess>>): Promise<string[]> {
  const answer = await proc.call('listQuestions', {});
  assert.ok(answer.ok, JSON.stringify(answer));
  return (answer.value as { questions: { title: string }[] }).questions.map((q) => q.title).sort();
}

/** A diary holding `titles`, and a backup copy of it taken with `forelog backup`. */
async function diaryWithBackup(dir: string, titles: string[]): Promise<{ db: string; backup: string }> {
  const db = path.join(dir, 'diary.sqlite');
  const service = openDiary({ dbPath: db, timeZone: 'UTC' });
  for (const title of titles) await callOrThrow(service.dispatch, 'createQuestion', { title, closes_at: CLOSES, first_forecast: { p: 0.3 } });
  service.close();
  const backup = path.join(dir, 'backup.sqlite');
  const made = forelog('backup', backup, '--db', db);
  assert.equal(made.status, 0, made.stderr);
  return { db, backup };
}

test('restore while another process has the diary open: it reads the restored diary and keeps what it writes next', async () => {
  const dir = tempDir();
  const { db, backup } = await diaryWithBackup(dir, ['A kept', 'B kept']);

  const app = await startDiaryProcess(db);
  assert.ok((await app.call('createQuestion', { title: 'C written before the restore', closes_at: CLOSES })).ok);
  // The open process has scored the diary, so its cached engine input must notice the restore.
  const before = await app.call('score', {});
  assert.ok(before.ok);

  const restored = forelog('restore', backup, '--db', db);
  assert.equal(restored.status, 0, restored.stderr);
  assert.match(restored.stdout, /Restored 2 questions/);

  assert.deepEqual(await titlesSeenBy(app), ['A kept', 'B kept'], 'the open process reads the restored diary');
  const info = await app.call('diaryInfo', {});
  assert.equal((info as { value: { question_count: number } }).value.question_count, 2);
  const after = await app.call('score', {});
  assert.ok(after.ok);
  assert.equal((after.value as { report: { open: number } }).report.open, 2, 'the open process scores the restored diary');

  assert.ok((await app.call('createQuestion', { title: 'D written after the restore', closes_at: CLOSES })).ok);
  assert.deepEqual(titlesIn(db), ['A kept', 'B kept', 'D written after the restore'], 'another reader sees the write at once');
  await app.close();
  assert.deepEqual(titlesIn(db), ['A kept', 'B kept', 'D written after the restore'], 'nothing written after the restore vanished');

  const safety = /kept at (.+\.sqlite)\./.exec(restored.stdout)?.[1];
  assert.ok(safety && fs.existsSync(safety), restored.stdout);
  assert.deepEqual(titlesIn(safety), ['A kept', 'B kept', 'C written before the restore'], 'the replaced diary is kept whole');
});

test('an older-schema backup restored under an open process is migrated; a newer one is refused and changes nothing', async () => {
  const dir = tempDir();
  const db = path.join(dir, 'diary.sqlite');
  const app = await startDiaryProcess(db);
  assert.ok((await app.call('createQuestion', { title: 'Current', closes_at: CLOSES })).ok);

  const old = path.join(dir, 'old.sqlite');
  const v1 = new Database(old);
  migrate(v1, MIGRATIONS.slice(0, 1));
  v1.prepare(
    `INSERT INTO questions (id, title, rule, kind, opened_at, closes_at, time_zone, created_at, updated_at)
     VALUES ('q-old', 'From schema 1', '', 'event_by_deadline', 0, 4102444800000, 'UTC', 0, 0)`,
  ).run();
  v1.close();
  const oldBytes = fs.readFileSync(old);

  const restored = forelog('restore', old, '--db', db);
  assert.equal(restored.status, 0, restored.stderr);
  assert.deepEqual(await titlesSeenBy(app), ['From schema 1']);
  assert.deepEqual(fs.readFileSync(old), oldBytes, 'the backup file itself is not changed');
  const check = new Database(db, { readonly: true });
  assert.equal(check.pragma('user_version', { simple: true }), SCHEMA_VERSION);
  check.close();

  const future = path.join(dir, 'future.sqlite');
  const newer = new Database(future);
  newer.exec('CREATE TABLE questions (id TEXT)');
  newer.pragma(`user_version = ${SCHEMA_VERSION + 1}`);
  newer.close();
  const refused = forelog('restore', future, '--db', db);
  assert.equal(refused.status, 1);
  assert.match(refused.stderr, /newer Forelog/);
  assert.deepEqual(await titlesSeenBy(app), ['From schema 1'], 'a refused restore changes nothing');
  assert.ok((await app.call('createQuestion', { title: 'Still writable', closes_at: CLOSES })).ok);
  await app.close();
  assert.deepEqual(titlesIn(db), ['From schema 1', 'Still writable']);
});
