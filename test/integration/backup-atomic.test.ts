/**
 * Backups are written atomically: a copy cut short — the command killed, the copy failing
 * half-way — never sits under the target's name, and a good file already there survives.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { backupTo, inspectBackup } from '../../main/service/backup';
import { callOrThrow } from '../../main/service/dispatch';
import { openDiary } from '../../main/service/index';
import { startDiaryProcess } from '../support/diary-process';
import { openTestDiary, tempDir } from '../support/temp-diary';

/** A diary of several megabytes, so a backup takes many steps. */
async function largeDiary(dir: string): Promise<string> {
  const db = path.join(dir, 'diary.sqlite');
  const service = openDiary({ dbPath: db, timeZone: 'UTC' });
  await callOrThrow(service.dispatch, 'createQuestion', { title: 'In every copy', closes_at: '2027-01-01T00:00:00Z' });
  service.close();
  // Padding under a settings key Forelog does not read: about 8 MB of pages.
  const raw = new Database(db);
  raw.prepare("INSERT INTO settings (key, value) VALUES ('test_padding', ?)").run(JSON.stringify('x'.repeat(8 * 1_048_576)));
  raw.close();
  return db;
}

function killedMidBackup(db: string, target: string): Promise<void> {
  return (async () => {
    const app = await startDiaryProcess(db);
    const reply = await app.send({ backup: target, pauseMidway: true });
    assert.deepEqual(reply, { paused: true }, 'the backup is under way');
    const gone = new Promise<void>((resolve) => app.child.once('exit', () => resolve()));
    app.child.kill('SIGKILL');
    await gone;
  })();
}

test('a backup killed half-way leaves the earlier good copy under the target name, or no file at all', async () => {
  const dir = tempDir();
  const db = await largeDiary(dir);

  const kept = path.join(dir, 'kept.sqlite');
  const first = openDiary({ dbPath: db });
  await first.backupTo(kept);
  first.close();
  const good = fs.readFileSync(kept);
  await killedMidBackup(db, kept);
  assert.deepEqual(fs.readFileSync(kept), good, 'the good copy is untouched');
  assert.equal(inspectBackup(kept).questions, 1);

  const fresh = path.join(dir, 'fresh.sqlite');
  await killedMidBackup(db, fresh);
  assert.equal(fs.existsSync(fresh), false, 'no partial file under the target name');
  assert.ok(!fs.readdirSync(dir).some((name) => name.endsWith('.sqlite') && name.startsWith('fresh')), fs.readdirSync(dir).join(', '));

  // The killed copies' partial files (megabytes each) are cleared by the next backup to the same name.
  assert.ok(fs.readdirSync(dir).some((name) => name.startsWith('fresh.sqlite.partial-')), 'the killed backup left its partial file');
  const again = openDiary({ dbPath: db });
  await again.backupTo(fresh);
  await again.backupTo(kept);
  again.close();
  assert.deepEqual(
    fs.readdirSync(dir).filter((name) => name.includes('.partial')),
    [],
    'no partial file is left once each target has been written again',
  );
});

test('a backup that fails half-way leaves the target as it was and cleans up after itself', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Only question', closes_at: '2027-01-01T00:00:00Z' });
  const raw = d.service.store.write;
  raw.prepare("INSERT INTO settings (key, value) VALUES ('test_padding', ?)").run(JSON.stringify('x'.repeat(4 * 1_048_576)));
  const dir = tempDir();
  const target = path.join(dir, 'copy.sqlite');
  fs.writeFileSync(target, 'the previous copy');

  await assert.rejects(
    backupTo(d.service.store, target, (percent) => {
      if (percent > 0 && percent < 100) throw new Error('copy interrupted');
    }),
    /copy interrupted/,
  );
  assert.equal(fs.readFileSync(target, 'utf8'), 'the previous copy');
  assert.deepEqual(fs.readdirSync(dir), ['copy.sqlite'], 'no temporary file left behind');

  await backupTo(d.service.store, target);
  assert.equal(inspectBackup(target).questions, 1, 'the next backup replaces it whole');
  assert.deepEqual(fs.readdirSync(dir), ['copy.sqlite']);
});

test('a backup onto a symbolic link replaces the file it points to; onto a named pipe or a folder it is refused and the pipe stays', async (t) => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Only question', closes_at: '2027-01-01T00:00:00Z' });
  const dir = tempDir();
  const real = path.join(dir, 'real.sqlite');
  fs.writeFileSync(real, 'the previous copy');
  const link = path.join(dir, 'link.sqlite');
  fs.symlinkSync(real, link);
  await backupTo(d.service.store, link);
  assert.ok(fs.lstatSync(link).isSymbolicLink(), 'the link is still a link');
  assert.equal(inspectBackup(real).questions, 1, 'the file it points to holds the copy');
  const toDiary = path.join(dir, 'diary-link.sqlite');
  fs.symlinkSync(d.service.store.path, toDiary);
  await assert.rejects(backupTo(d.service.store, toDiary), /cannot be the diary itself/);
  fs.rmSync(toDiary);
  assert.equal((await d.call('listQuestions', {})).total, 1, 'the diary is untouched');

  const folder = path.join(dir, 'folder.sqlite');
  fs.mkdirSync(folder);
  await assert.rejects(backupTo(d.service.store, folder), /is not a regular file/);
  assert.ok(fs.statSync(folder).isDirectory());

  if (process.platform === 'win32') return t.skip('no named pipes in the file system');
  const pipe = path.join(dir, 'pipe.sqlite');
  assert.equal(spawnSync('mkfifo', [pipe]).status, 0);
  await assert.rejects(backupTo(d.service.store, pipe), (err: Error) => {
    assert.match(err.message, /^.*pipe\.sqlite is not a regular file .*; choose a file name\b/);
    return true;
  });
  assert.ok(fs.lstatSync(pipe).isFIFO(), 'the pipe was not replaced by a file');
  assert.deepEqual(fs.readdirSync(dir).sort(), ['folder.sqlite', 'link.sqlite', 'pipe.sqlite', 'real.sqlite']);
});

test('a backup onto a file whose name is as long as the file system allows is written, and nothing else is left beside it', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'In the copy', closes_at: '2027-01-01T00:00:00Z' });
  const dir = tempDir();
  const name = `${'b'.repeat(248)}.sqlite`;
  await backupTo(d.service.store, path.join(dir, name));
  assert.deepEqual(fs.readdirSync(dir), [name]);
  assert.equal(inspectBackup(path.join(dir, name)).questions, 1);
});
