/**
 * Ordinary concurrency on one diary file: the desktop app or `forelog serve` writing while
 * another window or a command writes too. Every write must wait its turn (up to the busy
 * timeout) instead of failing with "database is locked"; a write that still cannot get
 * the diary in time gets the retryable `busy` answer and changes nothing.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { callOrThrow } from '../../main/service/dispatch';
import { openDiary } from '../../main/service/index';
import { forelogAsync, startDiaryProcess } from '../support/diary-process';
import { openTestDiary, tempDir } from '../support/temp-diary';

const CLOSES = '2027-01-01T00:00:00Z';
const REVISIONS_PER_PROCESS = 150;
const IMPORTS = 4;

test('two processes revising and a command importing at the same time: every write lands, none fails', async () => {
  const dir = tempDir();
  const db = path.join(dir, 'diary.sqlite');
  const seed = openDiary({ dbPath: db, timeZone: 'UTC' });
  const q = (await callOrThrow(seed.dispatch, 'createQuestion', { title: 'Shared question', closes_at: CLOSES })) as { id: string };
  seed.close();

  const [one, two] = await Promise.all([startDiaryProcess(db), startDiaryProcess(db)]);
  const importFile = (n: number) => {
    const file = path.join(dir, `import-${n}.json`);
    const questions = Array.from({ length: 20 }, (_, i) => ({
      title: `Imported ${n}.${i}`,
      closes_at: CLOSES,
      forecasts: [{ at: '2026-05-01T09:00:00Z', p: 0.25 }],
    }));
    fs.writeFileSync(file, JSON.stringify({ format: 'forelog-diary', version: 1, questions }));
    return file;
  };
  const imports = (async () => {
    const results = [];
    for (let n = 0; n < IMPORTS; n++) results.push(await forelogAsync('import', importFile(n), '--db', db));
    return results;
  })();
  const revise = (p: number) => ({ loop: 'addForecast', request: { question_id: q.id, p }, count: REVISIONS_PER_PROCESS });
  const [a, b, imported] = await Promise.all([one.send(revise(0.4)), two.send(revise(0.6)), imports]);

  assert.equal(a.failures.length, 0, `first process: ${a.failures.length} writes failed, e.g. ${a.failures[0]}`);
  assert.equal(b.failures.length, 0, `second process: ${b.failures.length} writes failed, e.g. ${b.failures[0]}`);
  for (const r of imported) assert.equal(r.status, 0, r.stderr);
  await Promise.all([one.close(), two.close()]);

  const check = new Database(db, { readonly: true });
  try {
    assert.equal((check.prepare('SELECT count(*) AS n FROM forecasts WHERE question_id = ?').get(q.id) as { n: number }).n, 2 * REVISIONS_PER_PROCESS);
    assert.equal((check.prepare('SELECT count(*) AS n FROM questions').get() as { n: number }).n, 1 + IMPORTS * 20);
  } finally {
    check.close();
  }
});

test('a write that cannot get the diary in time answers busy, retryable, and changes nothing', async () => {
  const dbPath = path.join(tempDir(), 'diary.sqlite');
  const d = openTestDiary({ dbPath });
  const q = await d.call('createQuestion', { title: 'Held elsewhere', closes_at: CLOSES });

  // Another connection holds the write lock, as a long import in another window would.
  const other = new Database(dbPath);
  other.pragma('busy_timeout = 0');
  other.exec('BEGIN IMMEDIATE');
  const app = await startDiaryProcess(dbPath, { busyTimeoutMs: 50 });
  try {
    const answer = await app.call('addForecast', { question_id: q.id, p: 0.7 });
    assert.equal(answer.ok, false);
    if (answer.ok) return;
    assert.equal(answer.error.code, 'busy');
    assert.match(answer.error.message, /busy in another Forelog window or command/);
    assert.match(answer.error.message, /nothing was changed/i);
    assert.match(answer.error.message, /try again/i);
    // Reading still works while another connection writes (WAL).
    assert.ok((await app.call('getQuestion', { id: q.id })).ok);
  } finally {
    other.exec('ROLLBACK');
    other.close();
  }
  const retried = await app.call('addForecast', { question_id: q.id, p: 0.7 });
  assert.ok(retried.ok, 'the same write succeeds once the diary is free');
  await app.close();
  assert.equal((await d.call('getQuestion', { id: q.id })).forecasts.length, 1, 'only the retried write landed');
});

test('every write transaction in the app begins IMMEDIATE: none is opened any other way', () => {
  // A deferred transaction would bring "database is locked" back under concurrency (see
  // writeTransaction); this finds one before a user does.
  const root = path.resolve(import.meta.dirname, '..', '..', 'main');
  const offenders: string[] = [];
  for (const entry of fs.readdirSync(root, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile() || !entry.name.endsWith('.ts')) continue;
    const file = path.join(entry.parentPath, entry.name);
    const rel = path.relative(root, file).split(path.sep).join('/');
    const text = fs.readFileSync(file, 'utf8');
    // A BEGIN on the read-only handle (`read.exec`) opens a read snapshot, which cannot write.
    const opens = [...text.matchAll(/\.transaction\(|(?<!\bread\.)(?:exec|prepare)\(\s*['"`]BEGIN(?! IMMEDIATE)/gi)].length;
    const allowed = rel === 'store/open.ts' ? 2 : 0; // writeTransaction and readSnapshot themselves
    if (opens > allowed) offenders.push(`main/${rel}`);
  }
  assert.deepEqual(offenders, []);
});

test('commands racing to create the same new diary: the one that succeeds keeps its questions; a failing one never removes the diary', async () => {
  // Three `demo`s at once on a path with no diary: one fills it, the others are refused. A
  // refused command removes a diary only when it made the file itself, nothing is in it, and
  // no other process has it open; before, a loser could delete the winner's diary.
  for (let round = 0; round < 6; round++) {
    const dir = tempDir();
    const db = path.join(dir, 'new.sqlite');
    const runs = await Promise.all([0, 1, 2].map(() => forelogAsync('demo', '--db', db)));
    const winners = runs.filter((r) => r.status === 0);
    assert.equal(winners.length, 1, runs.map((r) => r.stderr).join('\n'));
    for (const loser of runs.filter((r) => r.status !== 0)) assert.match(loser.stderr, /only be loaded into an empty diary/);
    assert.ok(fs.existsSync(db), `round ${round}: the diary is still there`);
    const check = new Database(db, { readonly: true });
    try {
      assert.equal((check.prepare('SELECT count(*) AS n FROM questions').get() as { n: number }).n, 45, `round ${round}`);
    } finally {
      check.close();
    }
  }
});

test('a refused import into a new path never removes a diary another process has opened there', async () => {
  // The import reads a named pipe, so the test holds it at the moment it reads its file.
  // Meanwhile another process opens the same path and has not read it yet (a starting app
  // or command). Before, the refused import then deleted "its" empty diary, and everything
  // the other process wrote afterwards went into a file that no longer had a name.
  const dir = tempDir();
  const db = path.join(dir, 'new.sqlite');
  const pipe = path.join(dir, 'incoming.json');
  spawnSync('mkfifo', [pipe]);
  const importing = forelogAsync('import', pipe, '--db', db);
  const writer = await fs.promises.open(pipe, 'w'); // resolves once the import reads the pipe
  const other = new Database(db);
  await writer.write('{"format": "forelog-diary", "version": 1, "questions": [{"title": "No close"}]}');
  await writer.close();
  const refused = await importing;
  assert.equal(refused.status, 1);
  assert.match(refused.stderr, /Nothing was imported/);

  other.exec("CREATE TABLE kept (note TEXT); INSERT INTO kept VALUES ('written after the refusal')");
  other.close();
  assert.ok(fs.existsSync(db), 'the file the other process opened is still there');
  const check = new Database(db, { readonly: true });
  try {
    assert.deepEqual(check.prepare('SELECT note FROM kept').pluck().all(), ['written after the refusal']);
  } finally {
    check.close();
  }
  assert.deepEqual(fs.readdirSync(dir).sort(), ['incoming.json', 'new.sqlite'], 'the refused import left no file of its own');
});
