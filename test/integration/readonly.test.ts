/**
 * Diaries Forelog may not write, and disks that fill up: reading still works, every write
 * is refused with a message saying what happened and what to do, and nothing changes.
 *
 * Tests run as root here, where file permissions do not stop writes; the real read-only
 * cases therefore run the command line as an unprivileged user (setpriv, as `nobody`)
 * when the test runs as root, and directly otherwise.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { storeFailure } from '../../main/service/dispatch';
import { openDiary } from '../../main/service/index';
import { startHttpServer } from '../../main/transport/http';
import { MIGRATIONS, SCHEMA_VERSION } from '../../main/store/migrations';
import { canWriteFile, migrate } from '../../main/store/open';
import { forelog, ROOT } from '../support/diary-process';
import { exportJson, openTestDiary, tempDir } from '../support/temp-diary';

const CLOSES = '2027-01-01T00:00:00Z';
const NOBODY = 65534;

/** A diary with two questions, closed cleanly (no -wal or -shm beside it), and the file it was imported from. */
function diaryIn(dir: string): { db: string; seed: string } {
  const db = path.join(dir, 'diary.sqlite');
  const seedDir = tempDir();
  fs.chmodSync(seedDir, 0o755);
  const seed = path.join(seedDir, 'seed.json');
  fs.writeFileSync(
    seed,
    JSON.stringify({
      format: 'forelog-diary',
      version: 1,
      questions: [
        { title: 'Will the board approve?', closes_at: CLOSES, forecasts: [{ at: '2026-05-01T09:00:00Z', p: 0.7 }], resolution: { outcome: 'yes', at: '2026-05-20T09:00:00Z' } },
        { title: 'Will the pilot ship?', closes_at: CLOSES, forecasts: [{ at: '2026-05-02T09:00:00Z', p: 0.2 }] },
      ],
    }),
  );
  const r = forelog('import', seed, '--db', db);
  assert.equal(r.status, 0, r.stderr);
  assert.deepEqual(fs.readdirSync(dir), ['diary.sqlite']);
  return { db, seed };
}

/** The command line as a user without write permission on files root made. */
function forelogUnprivileged(...args: string[]): { status: number; stdout: string; stderr: string } {
  const node = [process.execPath, '--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args];
  const asRoot = process.getuid?.() === 0;
  const [command, ...rest] = asRoot ? ['setpriv', `--reuid=${NOBODY}`, `--regid=${NOBODY}`, '--clear-groups', ...node] : node;
  const r = spawnSync(command!, rest, { cwd: ROOT, encoding: 'utf8', env: { ...process.env, TZ: 'UTC', HOME: '/tmp' } });
  if (r.error) throw r.error;
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

test('a diary in a folder the user may not write: reading commands work, writes are refused, nothing changes', () => {
  const dir = tempDir('forelog-ro-');
  fs.chmodSync(dir, 0o755); // root's folder: nobody may enter and read, not write
  const { db, seed } = diaryIn(dir);
  if (process.getuid?.() !== 0) fs.chmodSync(dir, 0o555);
  const bytes = fs.readFileSync(db);
  const expected = forelog('export', '--db', db).stdout;

  const exported = forelogUnprivileged('export', '--db', db);
  assert.equal(exported.status, 0, exported.stderr);
  assert.equal(exported.stdout, expected, 'the same diary file as its owner sees');
  const scored = forelogUnprivileged('score', '--json', '--db', db);
  assert.equal(scored.status, 0, scored.stderr);
  assert.equal(JSON.parse(scored.stdout).scored, 1);
  const due = forelogUnprivileged('due', '--at', '2026-12-31T12:00:00Z', '--db', db);
  assert.equal(due.status, 0, due.stderr);
  const elsewhere = tempDir();
  fs.chmodSync(elsewhere, 0o777);
  const backedUp = forelogUnprivileged('backup', path.join(elsewhere, 'copy.sqlite'), '--db', db);
  assert.equal(backedUp.status, 0, backedUp.stderr);
  assert.match(backedUp.stdout, /\(2 questions\)/);
  const beside = path.join(dir, 'copy.sqlite');
  const notBeside = forelogUnprivileged('backup', beside, '--db', db);
  assert.equal(notBeside.status, 1);
  assert.equal(
    notBeside.stderr,
    `forelog: Forelog may not write ${beside} (the file or its folder is read-only: EACCES), so nothing was written; the diary itself is unchanged. Choose a folder you can write to.\n`,
  );

  const refused = forelogUnprivileged('import', seed, '--db', db);
  assert.equal(refused.status, 1);
  assert.equal(
    refused.stderr,
    `forelog: The diary ${db} is read-only (Forelog may not write to the file or its folder), so nothing was changed. ` +
      'Reading, exporting and backing it up still work; to make changes, give yourself write permission on the file and its folder, or work on a copy.\n',
  );
  const fresh = path.join(dir, 'new.sqlite');
  const cannotCreate = forelogUnprivileged('demo', '--db', fresh);
  assert.equal(cannotCreate.status, 1);
  assert.equal(cannotCreate.stderr, `forelog: Forelog cannot create a diary at ${fresh}: its folder is read-only. Choose a folder you can write to.\n`);
  const nested = forelogUnprivileged('demo', '--db', path.join(dir, 'sub', 'new.sqlite'));
  assert.equal(nested.status, 1);
  assert.match(nested.stderr, /^forelog: Forelog cannot create a diary at .*: EACCES: permission denied.* Choose a folder you can write to\.\n$/);
  if (process.getuid?.() !== 0) fs.chmodSync(dir, 0o755);
  assert.deepEqual(fs.readFileSync(db), bytes, 'the file is unchanged');
  assert.deepEqual(fs.readdirSync(dir), ['diary.sqlite'], 'nothing was added beside it');
});

test('a read-only diary file in a writable folder: export works, writes are refused', () => {
  const dir = tempDir('forelog-ro-');
  fs.chmodSync(dir, 0o777);
  const { db, seed } = diaryIn(dir);
  fs.chmodSync(db, 0o444);
  const bytes = fs.readFileSync(db);
  const exported = forelogUnprivileged('export', '--db', db);
  assert.equal(exported.status, 0, exported.stderr);
  assert.match(exported.stdout, /Will the pilot ship\?/);
  const refused = forelogUnprivileged('import', seed, '--db', db);
  assert.equal(refused.status, 1);
  assert.match(refused.stderr, /^forelog: The diary .* is read-only .* so nothing was changed/);
  assert.deepEqual(fs.readFileSync(db), bytes);

  if (process.getuid?.() === 0) fs.chownSync(db, 0, 0); // the unprivileged user must not own it
  fs.chmodSync(db, 0o000);
  const unreadable = forelogUnprivileged('export', '--db', db);
  assert.equal(unreadable.status, 1);
  assert.equal(unreadable.stderr, `forelog: Forelog may not read the diary ${db} (no read permission), so nothing was changed. Give yourself read permission on it, or check the path (--db).\n`);
});

test('the read-only decision: a diary this process may not write opens read-only, reads and refuses writes by name', async () => {
  const dbPath = path.join(tempDir(), 'diary.sqlite');
  const owner = openTestDiary({ dbPath });
  const q = await owner.call('createQuestion', { title: 'Written by its owner', closes_at: CLOSES, first_forecast: { p: 0.35 } });
  owner.service.close();
  const bytes = fs.readFileSync(dbPath);

  let asked = '';
  const service = openDiary({
    dbPath,
    timeZone: 'UTC',
    canWrite: (file) => {
      asked = file;
      return false;
    },
  });
  try {
    assert.equal(asked, dbPath);
    assert.equal(service.store.readOnly, true);
    assert.equal(service.store.read.readonly, true, 'SQLite itself opened it read-only');
    assert.equal(service.store.write.readonly, true, 'so even a stray write cannot land');
    const list = await service.dispatch('listQuestions', {});
    assert.ok(list.ok);
    assert.match(exportJson(service), /Written by its owner/);
    assert.ok((await service.dispatch('score', {})).ok);

    for (const [op, request] of [
      ['addForecast', { question_id: q.id, p: 0.5 }],
      ['updateSettings', { closing_soon_hours: 12 }],
      ['loadDemo', {}],
    ] as const) {
      const answer = await service.dispatch(op, request);
      assert.equal(answer.ok, false, op);
      if (answer.ok) continue;
      if (op === 'loadDemo') continue; // refused earlier: the diary is not empty
      assert.equal(answer.error.code, 'read_only', op);
      assert.ok(answer.error.message.includes(`The diary ${dbPath} is read-only`), answer.error.message);
      assert.match(answer.error.message, /nothing was changed/);
    }
    // A direct write on the handle (as the nudge log does) is refused by SQLite too.
    assert.throws(() => service.store.write.prepare("INSERT INTO settings (key, value) VALUES ('x', '1')").run(), /readonly/);
  } finally {
    service.close();
  }
  assert.deepEqual(fs.readFileSync(dbPath), bytes, 'the diary file is unchanged');
  assert.equal(canWriteFile(dbPath), true, 'the real probe: root may write it here');
});

test('a read-only diary from an older Forelog is read through a migrated private copy; the file keeps its schema', async () => {
  const dbPath = path.join(tempDir(), 'old.sqlite');
  const v1 = new Database(dbPath);
  migrate(v1, MIGRATIONS.slice(0, 1));
  v1.prepare(
    `INSERT INTO questions (id, title, rule, kind, opened_at, closes_at, time_zone, created_at, updated_at)
     VALUES ('q-old', 'From schema 1', '', 'event_by_deadline', 0, 4102444800000, 'UTC', 0, 0)`,
  ).run();
  v1.close();
  const bytes = fs.readFileSync(dbPath);
  const service = openDiary({ dbPath, canWrite: () => false });
  try {
    assert.equal(service.store.readOnly, true);
    assert.equal(service.location, dbPath, 'messages still name the diary, not the copy');
    assert.match(exportJson(service), /From schema 1/);
    assert.ok((await service.dispatch('due', {})).ok, 'the nudge tables of schema 2 are there to read');
    const refused = await service.dispatch('deleteQuestion', { id: 'q-old' });
    assert.equal(refused.ok ? '' : refused.error.code, 'read_only');
  } finally {
    service.close();
  }
  assert.deepEqual(fs.readFileSync(dbPath), bytes);
  const check = new Database(dbPath, { readonly: true });
  assert.equal(check.pragma('user_version', { simple: true }), 1);
  check.close();

  const future = path.join(tempDir(), 'future.sqlite');
  const newer = new Database(future);
  newer.pragma(`user_version = ${SCHEMA_VERSION + 1}`);
  newer.close();
  assert.throws(() => openDiary({ dbPath: future, canWrite: () => false }), /newer version of Forelog/);
});

test('a full disk: the change is not saved, nothing is lost, and the message says to free space', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Already in the diary', closes_at: CLOSES, first_forecast: { p: 0.6 } });
  const before = exportJson(d.service);
  // SQLite answers SQLITE_FULL both for a full disk and for a database at its page limit.
  const pages = d.service.store.write.pragma('page_count', { simple: true }) as number;
  d.service.store.write.pragma(`max_page_count = ${pages}`);
  const questions = Array.from({ length: 400 }, (_, i) => ({ title: `Bulk ${i} ${'x'.repeat(200)}`, closes_at: CLOSES, forecasts: [] }));
  const answer = await d.service.dispatch('importText', { format: 'json', text: JSON.stringify({ format: 'forelog-diary', version: 1, questions }) });
  assert.equal(answer.ok, false);
  if (answer.ok) return;
  assert.equal(answer.error.code, 'disk_full');
  assert.equal(
    answer.error.message,
    `The disk holding the diary ${d.dbPath} is full, so this change was not saved; nothing already in the diary was lost. Free some disk space and try again.`,
  );
  assert.equal(exportJson(d.service), before, 'the diary is as it was');
});

test('a damaged diary: reading it says so and how to put a backup back', () => {
  const dir = tempDir();
  const db = path.join(dir, 'diary.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const file = fs.readFileSync(db);
  const pageSize = file.readUInt16BE(16);
  // Scribble over every page after the first (the schema page), as a failing disk might.
  for (let at = pageSize; at < file.length; at += pageSize) file.fill(0xa5, at, at + pageSize);
  fs.writeFileSync(db, file);
  const r = forelog('export', '--db', db);
  assert.equal(r.status, 1);
  assert.equal(r.stderr.trim().split('\n').length, 1);
  assert.match(r.stderr, new RegExp(`^forelog: The diary ${db.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} is damaged \\(SQLITE_CORRUPT[A-Z_]*\\); nothing was changed\\. Put back your latest backup with "forelog restore FILE"`));
});

test('every SQLite failure of the file maps to a clear, non-internal answer', () => {
  const location = '/diaries/work.sqlite';
  const cases: [string, string, RegExp][] = [
    ['SQLITE_BUSY', 'busy', /busy in another Forelog window or command; nothing was changed — try again/],
    ['SQLITE_BUSY_SNAPSHOT', 'busy', /try again/],
    ['SQLITE_READONLY', 'read_only', /is read-only/],
    ['SQLITE_READONLY_DIRECTORY', 'read_only', /is read-only/],
    ['SQLITE_FULL', 'disk_full', /is full, so this change was not saved; nothing already in the diary was lost\. Free some disk space/],
    ['ENOSPC', 'disk_full', /Free some disk space/],
    ['SQLITE_IOERR_WRITE', 'storage', /could not read or write the diary \/diaries\/work\.sqlite \(SQLITE_IOERR_WRITE\); nothing was changed\. Check that the disk/],
    ['SQLITE_IOERR_FSYNC', 'storage', /SQLITE_IOERR_FSYNC/],
    ['SQLITE_CORRUPT', 'storage', /is damaged \(SQLITE_CORRUPT\).*forelog restore/],
    ['SQLITE_NOTADB', 'storage', /is not a Forelog diary \(it is not a SQLite database\)/],
  ];
  for (const [code, apiCode, message] of cases) {
    const failure = storeFailure(Object.assign(new Error('low-level text'), { code }), location);
    assert.ok(failure instanceof ApiError, code);
    assert.equal(failure.code, apiCode, code);
    assert.match(failure.message, message, code);
  }
  assert.equal(storeFailure(new Error('a bug'), location), null, 'anything else stays an internal error');
  assert.equal(storeFailure(Object.assign(new Error('x'), { code: 'SQLITE_CONSTRAINT_CHECK' }), location), null);
});

test('over HTTP, the file failures carry their own status: busy 503, read-only 409, disk full 507', async () => {
  const dir = tempDir();
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Forelog</title>');
  const post = async (server: { port: number; token: string }, op: string, body: unknown) => {
    const res = await fetch(`http://127.0.0.1:${server.port}/api/${op}`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json' },
      body: JSON.stringify(body),
    });
    return { status: res.status, code: ((await res.json()) as { error?: { code: string } }).error?.code };
  };
  const question = { title: 'Over HTTP', closes_at: CLOSES };

  const dbPath = path.join(tempDir(), 'diary.sqlite');
  const busyService = openDiary({ dbPath, busyTimeoutMs: 20 });
  const holder = new Database(dbPath);
  holder.exec('BEGIN IMMEDIATE');
  const busyServer = await startHttpServer({ dispatch: busyService.dispatch, rendererDir: dir });
  try {
    assert.deepEqual(await post(busyServer, 'createQuestion', question), { status: 503, code: 'busy' });
  } finally {
    holder.exec('ROLLBACK');
    holder.close();
    await busyServer.close();
    busyService.close();
  }

  const readOnly = openDiary({ dbPath, canWrite: () => false });
  const readOnlyServer = await startHttpServer({ dispatch: readOnly.dispatch, rendererDir: dir });
  try {
    assert.deepEqual(await post(readOnlyServer, 'createQuestion', question), { status: 409, code: 'read_only' });
    assert.equal((await post(readOnlyServer, 'listQuestions', {})).status, 200);
  } finally {
    await readOnlyServer.close();
    readOnly.close();
  }

  const full = openDiary({ dbPath });
  full.store.write.pragma(`max_page_count = ${full.store.write.pragma('page_count', { simple: true }) as number}`);
  const fullServer = await startHttpServer({ dispatch: full.dispatch, rendererDir: dir });
  try {
    const questions = Array.from({ length: 400 }, (_, i) => ({ title: `Bulk ${i} ${'x'.repeat(200)}`, closes_at: CLOSES, forecasts: [] }));
    const text = JSON.stringify({ format: 'forelog-diary', version: 1, questions });
    assert.deepEqual(await post(fullServer, 'importText', { format: 'json', text }), { status: 507, code: 'disk_full' });
  } finally {
    await fullServer.close();
    full.close();
  }
});

test('nudges on a read-only diary are shown once per run, not again every minute', async () => {
  const dbPath = path.join(tempDir(), 'diary.sqlite');
  const owner = openTestDiary({ dbPath, now: '2026-03-02T09:00:00Z' });
  await owner.call('createQuestion', { title: 'Closed, waiting to be resolved', closes_at: '2026-03-10T17:00:00Z', first_forecast: { p: 0.6 } });
  owner.service.close();

  const clock = { now: Date.parse('2026-03-11T09:00:00Z') };
  const service = openDiary({ dbPath, now: () => clock.now, timeZone: 'UTC', canWrite: () => false });
  try {
    const sent: { title: string }[] = [];
    const scheduler = service.createScheduler({ notify: (n) => void sent.push(n) });
    scheduler.runOnce('tick');
    assert.equal(sent.length, 1, 'the due nudge is shown');
    clock.now += 60_000;
    scheduler.runOnce('tick');
    assert.equal(sent.length, 1, 'and not again a minute later');
  } finally {
    service.close();
  }
});
