/**
 * Writes that would damage another database (main/files/sqlite-files.ts): a backup renamed
 * over a diary that still has its -wal beside it (open in another process, or left by one
 * that was killed) came out damaged when next opened, and the diary it replaced was lost; an
 * export over a diary replaced it with text. Each is refused, naming what is in the way, and
 * nothing is written.
 */
import assert from 'node:assert/strict';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { inspectBackup } from '../../main/service/backup';
import { callOrThrow } from '../../main/service/dispatch';
import { openDiary } from '../../main/service/index';
import { ROOT } from '../support/diary-process';
import { setTimeout as sleep } from 'node:timers/promises';
import { openTestDiary, tempDir } from '../support/temp-diary';

const CLOSES = '2027-01-01T00:00:00Z';

/** A second diary whose last writer was killed (kill -9) after committing a change that is still only in its -wal. */
async function diaryLeftByKilledWriter(): Promise<string> {
  const db = path.join(tempDir(), 'other.sqlite');
  const service = openDiary({ dbPath: db, timeZone: 'UTC' });
  await callOrThrow(service.dispatch, 'createQuestion', { title: 'In the other diary', closes_at: CLOSES });
  service.close();
  const killed = spawnSync(
    process.execPath,
    [
      '-e',
      `const db = new (require('better-sqlite3'))(process.argv[1]);
       db.pragma('wal_autocheckpoint = 0');
       db.prepare("UPDATE questions SET title = 'Changed just before the kill'").run();
       process.kill(process.pid, 'SIGKILL');`,
      db,
    ],
    { cwd: ROOT },
  );
  assert.equal(killed.signal, 'SIGKILL');
  assert.ok(fs.statSync(`${db}-wal`).size > 0, 'the change is still in the -wal');
  return db;
}

function titlesIn(db: string): string[] {
  const service = openDiary({ dbPath: db, timeZone: 'UTC', create: false });
  try {
    return (service.store.read.prepare('SELECT title FROM questions ORDER BY title').all() as { title: string }[]).map((r) => r.title);
  } finally {
    service.close();
  }
}

test('a backup over a diary whose -wal is beside it is refused, and that diary keeps everything', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'In the diary backed up', closes_at: CLOSES });
  const other = await diaryLeftByKilledWriter();
  const before = fs.readFileSync(other);

  await assert.rejects(d.service.backupTo(other), {
    message: `Could not write ${other}: ${other}-wal is beside it (the database there is open in another program, such as a Forelog window or command, or was not closed cleanly), and SQLite would apply that file to a copy written in its place, damaging the copy; choose another file name, or close what has it open and try again. No copy was written; the diary is unchanged.`,
  });
  assert.deepEqual(fs.readFileSync(other), before);
  assert.deepEqual(titlesIn(other), ['Changed just before the kill'], 'the other diary opens whole, with its last change');

  // Opened and closed cleanly, it has no -wal left: replacing it with a copy is an ordinary backup.
  assert.equal(fs.existsSync(`${other}-wal`), false);
  await d.service.backupTo(other);
  assert.deepEqual(titlesIn(other), ['In the diary backed up']);
  assert.equal(inspectBackup(other).questions, 1);
});

test('a backup over a diary open in another process is refused while it is open', async () => {
  const d = openTestDiary();
  const otherPath = path.join(tempDir(), 'open.sqlite');
  const other = openDiary({ dbPath: otherPath, timeZone: 'UTC' });
  try {
    await callOrThrow(other.dispatch, 'createQuestion', { title: 'Written while open', closes_at: CLOSES });
    await assert.rejects(d.service.backupTo(otherPath), /open\.sqlite-wal is beside it/);
    await callOrThrow(other.dispatch, 'createQuestion', { title: 'Written after the refusal', closes_at: CLOSES });
  } finally {
    other.close();
  }
  assert.deepEqual(titlesIn(otherPath), ['Written after the refusal', 'Written while open']);
});

test('an export over a diary, or over a file SQLite keeps beside one, is refused and changes nothing', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Exported', closes_at: CLOSES });
  const other = await diaryLeftByKilledWriter();
  const files = [other, `${other}-wal`, `${other}-shm`];
  const before = files.map((f) => fs.readFileSync(f));

  assert.throws(() => d.service.exportDiaryFile(other, 'json'), {
    message: `Could not write ${other}: it is a SQLite database (a Forelog diary or a backup copy), which this file would replace; choose another file name (to copy a diary, make a backup). The file that was there is unchanged.`,
  });
  assert.throws(() => d.service.exportDiaryFile(`${other}-wal`, 'csv'), {
    message: `Could not write ${other}-wal: it is a file SQLite keeps beside the database ${other}, and replacing it would damage that database; choose another file name. The file that was there is unchanged.`,
  });
  assert.throws(() => d.service.exportDiaryFile(`${other}-journal`, 'ics'), /it is a file SQLite keeps beside the database .* No file was written\.$/);
  await assert.rejects(d.service.backupTo(`${other}-shm`), /it is a file SQLite keeps beside the database/);
  assert.deepEqual(
    files.map((f) => fs.readFileSync(f)),
    before,
  );
  assert.equal(fs.existsSync(`${other}-journal`), false);
  assert.deepEqual(titlesIn(other), ['Changed just before the kill']);

  // Text files are replaced as before.
  const json = path.join(path.dirname(other), 'diary.json');
  d.service.exportDiaryFile(json, 'json');
  d.service.exportDiaryFile(json, 'json');
  assert.match(fs.readFileSync(json, 'utf8'), /"Exported"/);
});

test('an export to a named pipe still goes straight to its reader: the check for a database never opens it', { skip: process.platform === 'win32' && 'no named pipes' }, async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Through the pipe', closes_at: CLOSES });
  const pipe = path.join(tempDir(), 'pipe');
  assert.equal(spawnSync('mkfifo', [pipe]).status, 0);
  const ends = (child: ChildProcess) => new Promise<number | null>((resolve) => child.on('close', resolve));
  const reader = spawn('cat', [pipe]);
  let read = '';
  reader.stdout.on('data', (c: Buffer) => (read += c.toString()));
  const readerEnded = ends(reader);
  const writer = spawn(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), 'export', pipe, '--db', d.dbPath], { cwd: ROOT });
  const writerEnded = ends(writer);
  // Opening the pipe to read it as well waited for a second writer for ever: give up after a minute.
  const giveUp = new AbortController();
  const status = await Promise.race([writerEnded, sleep(60_000, 'still waiting', { signal: giveUp.signal }).catch(() => 'ended')]);
  giveUp.abort();
  if (status === 'still waiting') {
    writer.kill('SIGKILL');
    reader.kill('SIGKILL');
  }
  assert.equal(status, 0);
  assert.equal(await readerEnded, 0);
  assert.match(read, /"title": "Through the pipe"/);
});
