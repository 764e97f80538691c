/**
 * Automatic rolling backups on real files: one a day, the newest seven kept, each a
 * complete diary that `restore` accepts.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { backupTo, inspectBackup, restoreFrom, rollingBackup } from '../../main/service/backup';
import { SCHEMA_VERSION } from '../../main/store/migrations';
import { openTestDiary, tempDir } from '../support/temp-diary';

const DAY = 86_400_000;

test('one copy a day, the newest seven kept, each a restorable diary', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Kept in every copy', closes_at: '2027-01-01T00:00:00Z', first_forecast: { p: 0.3 } });
  const dir = path.join(tempDir(), 'backups');
  const start = Date.parse('2026-06-01T08:00:00Z');
  const first = await rollingBackup(d.service.store, dir, start);
  assert.ok(first.created && fs.existsSync(first.created));
  assert.deepEqual(inspectBackup(first.created), { questions: 1, version: SCHEMA_VERSION });
  const sameDay = await rollingBackup(d.service.store, dir, start + 6 * 3_600_000);
  assert.equal(sameDay.created, null, 'at most one a day');
  for (let day = 1; day <= 9; day++) await rollingBackup(d.service.store, dir, start + day * DAY);
  const names = fs.readdirSync(dir).sort();
  assert.equal(names.length, 7);
  assert.ok(names[0]!.startsWith('forelog-2026-06-04'), `oldest kept: ${names[0]}`);
  assert.ok(names.at(-1)!.startsWith('forelog-2026-06-10'));
  assert.ok(names.every((n) => !n.endsWith('.partial')));
  await assert.rejects(rollingBackup(d.service.store, dir, start, 0), /at least 1/);
});

/** Partial copies (and a journal) as a backup killed half way leaves them, by one ended process and one still running. */
function leavePartialCopies(dir: string, name: string): { killed: string[]; running: string } {
  const ended = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' }).stdout;
  const killed = [`${name}.partial-${ended}-0a1b2c3d`, `${name}.partial-${ended}-0a1b2c3d-journal`].map((f) => path.join(dir, f));
  // The test runner that started this file is still running: its copy may be under way.
  const running = path.join(dir, `${name}.partial-${process.ppid}-4e5f6a7b`);
  for (const file of [...killed, running]) fs.writeFileSync(file, 'part of a copy of the diary');
  return { killed, running };
}

test('partial copies left by killed daily backups and safety copies, named by their time, are removed by the next one', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Backed up', closes_at: '2027-01-01T00:00:00Z' });
  const dir = path.join(tempDir(), 'backups');
  fs.mkdirSync(dir);
  const daily = leavePartialCopies(dir, 'forelog-2026-05-31T08-00-00-000Z.sqlite');
  await rollingBackup(d.service.store, dir, Date.parse('2026-06-01T08:00:00Z'));
  for (const file of daily.killed) assert.equal(fs.existsSync(file), false, `${path.basename(file)} is removed`);
  assert.equal(fs.existsSync(daily.running), true, 'a copy still being written stays');

  const backup = path.join(tempDir(), 'backup.sqlite');
  await backupTo(d.service.store, backup);
  const folder = path.dirname(d.dbPath);
  const safety = leavePartialCopies(folder, `${path.basename(d.dbPath, '.sqlite')}.before-restore-2026-05-31T08-00-00-000Z.sqlite`);
  const result = await restoreFrom(backup, d.dbPath, Date.parse('2026-06-01T08:00:00Z'));
  assert.ok(result.safetyCopy && fs.existsSync(result.safetyCopy));
  for (const file of safety.killed) assert.equal(fs.existsSync(file), false, `${path.basename(file)} is removed`);
  assert.equal(fs.existsSync(safety.running), true);
});
