/**
 * Working copies of a diary in the system's temporary folder (main/files/work-folder.ts):
 * a restore's copy of the backup, and the private copy through which a read-only diary of
 * an older Forelog is read. A process killed while it held one (kill -9 mid-restore) left a
 * whole copy of the diary there for good; the next restore or private copy removes those of
 * ended processes, and leaves those of running ones.
 *
 * The temporary folder is pointed at a folder of this test (os.tmpdir() reads TMPDIR), so
 * the work of other processes on the machine is not in sight.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { backupTo, restoreFrom } from '../../main/service/backup';
import { openDiary } from '../../main/service/index';
import { MIGRATIONS } from '../../main/store/migrations';
import { migrate } from '../../main/store/open';
import { openTestDiary, tempDir } from '../support/temp-diary';

const CLOSES = '2027-01-01T00:00:00Z';

/** The pid of a process that has ended. */
function endedPid(): number {
  return Number(spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' }).stdout);
}

/** A fresh temporary folder holding what a killed process (and a running one) left there for `purpose`. */
function temporaryFolderWithLeftovers(purpose: string): { tmp: string; killed: string; running: string } {
  const tmp = tempDir('forelog-tmpdir-');
  process.env.TMPDIR = tmp;
  const killed = path.join(tmp, `forelog-${purpose}-${endedPid()}-aB3xYz`);
  // The test runner that started this file is still running.
  const running = path.join(tmp, `forelog-${purpose}-${process.ppid}-Qr7sTu`);
  for (const dir of [killed, running]) {
    fs.mkdirSync(dir);
    fs.writeFileSync(path.join(dir, `${purpose}.sqlite`), 'a whole copy of somebody’s diary');
  }
  return { tmp, killed, running };
}

test('a restore removes the copies that killed restores left in the temporary folder, and leaves none of its own', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Kept in the backup', closes_at: CLOSES, first_forecast: { p: 0.4 } });
  const backup = path.join(tempDir(), 'backup.sqlite');
  await backupTo(d.service.store, backup);
  const { tmp, killed, running } = temporaryFolderWithLeftovers('restore');

  await restoreFrom(backup, d.dbPath, Date.parse('2026-06-01T12:00:00Z'));

  assert.equal(fs.existsSync(killed), false, 'the killed restore’s copy is gone');
  assert.equal(fs.existsSync(running), true, 'a restore still under way keeps its copy');
  assert.deepEqual(fs.readdirSync(tmp), [path.basename(running)], 'this restore’s own copy is removed when it ends');
  delete process.env.TMPDIR;
});

test('reading an older read-only diary through a private copy removes the copies killed readers left', () => {
  const dbPath = path.join(tempDir(), 'old.sqlite');
  const v1 = new Database(dbPath);
  migrate(v1, MIGRATIONS.slice(0, 1));
  v1.close();
  const { tmp, killed, running } = temporaryFolderWithLeftovers('read-only');

  const service = openDiary({ dbPath, canWrite: () => false });
  try {
    assert.equal(service.store.readOnly, true);
    assert.equal(fs.existsSync(killed), false, 'the killed reader’s copy is gone');
    assert.equal(fs.existsSync(running), true, 'a reader still running keeps its copy');
  } finally {
    service.close();
  }
  assert.deepEqual(fs.readdirSync(tmp), [path.basename(running)], 'this reader’s own copy is removed when it closes');
  delete process.env.TMPDIR;
});
