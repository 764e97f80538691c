/**
 * Automatic rolling backups on real files: one a day, the newest seven kept, each a
 * complete diary that `restore` accepts.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { inspectBackup, rollingBackup } from '../../main/service/backup';
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
