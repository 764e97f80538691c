/**
 * The `forelog` command line (INTERFACES.md §2) run as a user runs it, on real diary
 * files: import is all-or-nothing, export → import → export is identical, backup and
 * restore round-trip, and failures exit non-zero with one line on stderr.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

function forelog(...args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, TZ: 'UTC' },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

function diaryFile(questions: unknown[]): string {
  return JSON.stringify({
    format: 'forelog-diary',
    version: 1,
    settings: { default_false_alarm_cost: 1, default_miss_cost: 4, default_checkin_days: 7, closing_soon_hours: 24, overdue_after_days: 3, time_zone: 'Europe/London' },
    questions,
  });
}

const good = (n: number) => ({
  id: `q${n}`,
  title: `Question ${n}`,
  rule: 'Yes if it happens.',
  kind: 'event_by_deadline',
  tags: ['client:northgate'],
  opened_at: '2026-01-05T09:00:00Z',
  closes_at: '2026-03-31T17:00:00+01:00',
  forecasts: [{ at: '2026-01-05T09:05:00Z', p: 0.4, note: 'first' }],
});

test('import is all-or-nothing: a bad record in the middle names itself and leaves the diary as it was', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  const seed = path.join(dir, 'seed.json');
  fs.writeFileSync(seed, diaryFile([good(1)]));
  assert.equal(forelog('import', seed, '--db', db).status, 0);
  const before = forelog('export', '--db', db).stdout;

  const bad = path.join(dir, 'bad.json');
  const broken = { ...good(3), forecasts: [{ at: '2026-01-05T09:05:00Z', p: 1.7 }] };
  fs.writeFileSync(bad, diaryFile([good(2), broken, good(4)]));
  const r = forelog('import', bad, '--db', db);
  assert.equal(r.status, 1);
  assert.equal(r.stderr.trim().split('\n').length, 1, 'one line on stderr');
  assert.match(r.stderr, /record 1 .*field forecasts\[0\]\.p: must be a probability between 0 and 1/);
  assert.equal(forelog('export', '--db', db).stdout, before, 'content unchanged');
});

test('export → import → export is identical', () => {
  const dir = tempDir();
  const a = path.join(dir, 'a.sqlite');
  const b = path.join(dir, 'b.sqlite');
  assert.equal(forelog('demo', '--db', a).status, 0);
  const first = path.join(dir, 'first.json');
  assert.equal(forelog('export', first, '--db', a).status, 0);
  const imported = forelog('import', first, '--db', b);
  assert.equal(imported.status, 0, imported.stderr);
  const second = forelog('export', '--db', b).stdout;
  assert.equal(second, fs.readFileSync(first, 'utf8'));
  const parsed = JSON.parse(second);
  assert.equal(parsed.format, 'forelog-diary');
  assert.equal(parsed.version, 1);
  assert.ok(parsed.questions.length >= 24);
});

test('export --format csv and ics: one row per revision; one calendar event per open question', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const diary = JSON.parse(forelog('export', '--db', db).stdout);
  const revisions = diary.questions.reduce((n: number, q: { forecasts: unknown[]; references: unknown[] }) => n + q.forecasts.length + q.references.length, 0);
  const csv = forelog('export', '--format', 'csv', '--db', db);
  assert.equal(csv.status, 0, csv.stderr);
  assert.ok(csv.stdout.startsWith('question_id,title,rule,kind,tags,'));
  // RFC 4180: records end in CRLF; quoted fields may hold line breaks, so count records by parsing.
  const ics = forelog('export', '--format', 'ics', '--db', db);
  assert.equal(ics.status, 0, ics.stderr);
  const open = diary.questions.filter((q: { resolution: unknown }) => !q.resolution).length;
  assert.equal(ics.stdout.match(/^BEGIN:VEVENT\r$/gm)?.length, open);
  assert.match(ics.stdout, /^BEGIN:VCALENDAR\r\nVERSION:2\.0\r\n/);
  assert.ok(revisions > 0);
  const back = path.join(tempDir(), 'back.sqlite');
  const file = path.join(tempDir(), 'diary.csv');
  fs.writeFileSync(file, csv.stdout);
  const imported = forelog('import', file, '--db', back);
  assert.equal(imported.status, 0, imported.stderr);
  assert.match(imported.stdout, new RegExp(`Imported ${diary.questions.length} questions`));
});

test('demo fills only an empty diary', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  const r = forelog('demo', '--db', db);
  assert.equal(r.status, 0, r.stderr);
  assert.match(r.stdout, /Added the example diary: \d+ invented questions/);
  const again = forelog('demo', '--db', db);
  assert.equal(again.status, 1);
  assert.match(again.stderr, /only be loaded into an empty diary/);
});

test('backup and restore round-trip, keeping a safety copy of the replaced diary', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  const seed = path.join(dir, 'seed.json');
  fs.writeFileSync(seed, diaryFile([good(1), good(2)]));
  forelog('import', seed, '--db', db);
  const copy = path.join(dir, 'copy.sqlite');
  const b = forelog('backup', copy, '--db', db);
  assert.equal(b.status, 0, b.stderr);
  assert.match(b.stdout, /2 questions/);
  const snapshot = forelog('export', '--db', db).stdout;

  fs.writeFileSync(seed, diaryFile([good(3)]));
  forelog('import', seed, '--db', db);
  assert.notEqual(forelog('export', '--db', db).stdout, snapshot);

  const r = forelog('restore', copy, '--db', db);
  assert.equal(r.status, 0, r.stderr);
  assert.match(r.stdout, /Restored 2 questions/);
  assert.equal(forelog('export', '--db', db).stdout, snapshot);
  const safety = /kept at (.+\.sqlite)\./.exec(r.stdout)?.[1];
  assert.ok(safety && fs.existsSync(safety), 'the replaced diary is kept');

  const notADiary = path.join(dir, 'x.sqlite');
  fs.writeFileSync(notADiary, 'hello');
  const refused = forelog('restore', notADiary, '--db', db);
  assert.equal(refused.status, 1);
  assert.match(refused.stderr, /not a Forelog diary/);
  assert.equal(forelog('export', '--db', db).stdout, snapshot);
});

test('failures exit non-zero with one line: unknown command, missing file, not a diary file', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  for (const args of [['frobnicate'], ['import', '/no/such/file.json'], ['export', '--format', 'xml']]) {
    const r = forelog(...args, '--db', db);
    assert.equal(r.status, 1, args.join(' '));
    assert.equal(r.stderr.trim().split('\n').length, 1);
    assert.match(r.stderr, /^forelog: /);
  }
  const file = path.join(tempDir(), 'other.json');
  fs.writeFileSync(file, JSON.stringify({ format: 'something-else', version: 1, questions: [] }));
  const r = forelog('import', file, '--db', db);
  assert.equal(r.status, 1);
  assert.match(r.stderr, /not a Forelog diary file/);
});
