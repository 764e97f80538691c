/**
 * The unresolved questions the schema's triggers keep apart (migration 8), which the due
 * list and the top-bar count read: after every kind of write — through the service, undo,
 * a restore, an import, plain SQL from another program, a migration of an older diary —
 * the table holds exactly the questions without a resolution, with their current fields and
 * latest revision.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import path from 'node:path';
import { test } from 'node:test';
import { backupTo, restoreFrom } from '../../main/service/backup';
import { openDiary } from '../../main/service/index';
import { callOrThrow } from '../../main/service/dispatch';
import { unresolvedQuestions } from '../../main/service/nudges';
import { MIGRATIONS, SCHEMA_VERSION } from '../../main/store/migrations';
import { migrate } from '../../main/store/open';
import { mulberry32 } from '../bench/make-diary';
import { exportJson, openTestDiary, tempDir } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();
const FIELDS = 'id, title, kind, type, opened_at, closes_at, time_zone, checkin_days';
// The latest revision: latest time, and of revisions at the same time the one entered last.
const LATEST = (column: string) => `(SELECT ${column} FROM forecasts WHERE question_id = q.id ORDER BY at DESC, seq DESC LIMIT 1)`;

/** What the table holds, and what it must hold (derived from the questions, resolutions and revisions themselves). */
function kept(db: Database.Database): { held: unknown[]; truth: unknown[] } {
  return {
    held: db.prepare(`SELECT ${FIELDS}, last_at, last_seq, last_p FROM unresolved_questions ORDER BY id`).raw().all(),
    truth: db
      .prepare(
        `SELECT ${FIELDS}, ${LATEST('at')}, ${LATEST('seq')}, ${LATEST('p')} FROM questions q
         WHERE NOT EXISTS (SELECT 1 FROM resolutions WHERE question_id = q.id) ORDER BY id`,
      )
      .raw()
      .all(),
  };
}

function assertKept(db: Database.Database, step: string): void {
  const { held, truth } = kept(db);
  assert.deepEqual(held, truth, `after ${step}`);
}

test('every change through the service, and each one undone, leaves exactly the unresolved questions in the table', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const db = d.service.store.read;
  const next = mulberry32(20261203); // seeded, so a failure names a reproducible sequence
  const pick = <T>(list: readonly T[]): T => list[Math.floor(next() * list.length)]!;
  const ids: string[] = [];
  const undos: string[] = [];
  const remember = (answer: { undo?: string }) => {
    if (answer?.undo) undos.push(answer.undo);
  };
  for (let step = 0; step < 240; step++) {
    d.clock.now += 1000;
    const action = ids.length < 4 ? 'create' : pick(['create', 'resolve', 'resolve', 'correct', 'reopen', 'edit', 'forecast', 'forecast', 'forecast', 'delete', 'undo', 'undo']);
    const id = ids.length ? pick(ids) : '';
    let label = `${action} ${id}`;
    try {
      switch (action) {
        case 'create': {
          const type = pick(['binary', 'choice', 'numeric'] as const);
          const base = { title: `Question ${step}`, opened_at: iso(NOW - 10 * DAY), closes_at: iso(NOW + Math.floor(next() * 20 - 5) * DAY), checkin_days: pick([null, 0, 7]) };
          const q =
            type === 'binary'
              ? await d.call('createQuestion', { ...base, first_forecast: { p: 0.4, at: iso(NOW - 9 * DAY) } })
              : type === 'choice'
                ? await d.call('createQuestion', { ...base, type, options: ['Kestrowe', 'Ambledene', 'Neither'] })
                : await d.call('createQuestion', { ...base, type: 'numeric', unit: 'k', value_kind: 'number' });
          ids.push(q.id);
          remember(q);
          label = `create ${type} ${q.id}`;
          break;
        }
        case 'resolve':
        case 'correct': {
          const q = await d.call('getQuestion', { id });
          const outcome = q.type === 'binary' ? { outcome: pick(['yes', 'no', 'void']) } : q.type === 'choice' ? { outcome: 'option', option: 1 } : { outcome: 'value', value: 12.5 };
          remember(await d.call('resolveQuestion', { id, ...outcome, at: iso(NOW - 6 * DAY), confirm: true, ...(q.resolution ? { correction_note: 'checked again' } : {}) }));
          break;
        }
        case 'reopen':
          remember(await d.call('reopenQuestion', { id, note: 'not settled after all' }));
          break;
        case 'edit':
          remember(await d.call('updateQuestion', { id, changes: { title: `Renamed at step ${step}`, closes_at: iso(NOW + 40 * DAY), checkin_days: pick([null, 3]) } }));
          break;
        case 'forecast': {
          // A new revision now or back-dated (possibly to the same instant as another), or
          // an existing one moved in time or removed: each can change which one is latest.
          const q = await d.call('getQuestion', { id });
          const revisions: { id: string; at: string }[] = q.forecasts;
          const choice = next();
          if (revisions.length && choice < 0.25) {
            remember(await d.call('deleteForecast', { id: pick(revisions).id }));
            label = `delete a revision of ${id}`;
          } else if (revisions.length && choice < 0.5) {
            remember(await d.call('updateForecast', { id: pick(revisions).id, at: pick([iso(NOW - 8 * DAY), pick(revisions).at]) }));
            label = `move a revision of ${id}`;
          } else {
            const value = q.type === 'binary' ? { p: next() } : q.type === 'choice' ? { probs: [0.5, 0.3, 0.2] } : { quantiles: [10, 20, 30] };
            remember(await d.call('addForecast', { question_id: id, ...value, at: pick([undefined, iso(NOW - 8 * DAY), revisions[0]?.at]) }));
            label = `add a revision to ${id}`;
          }
          break;
        }
        case 'delete':
          remember(await d.call('deleteQuestion', { id }));
          ids.splice(ids.indexOf(id), 1);
          break;
        case 'undo': {
          const token = undos.pop();
          if (token) {
            const answer = await d.call('undo', { token });
            if (answer.question && !ids.includes(answer.question_id)) ids.push(answer.question_id);
            if (!answer.question && ids.includes(answer.question_id)) ids.splice(ids.indexOf(answer.question_id), 1);
          }
          break;
        }
      }
    } catch (err) {
      // A refused request (resolving a resolved question without a change, reopening an open
      // one, an undo overtaken by a later change) must change nothing; the table is checked below.
      label += ` (refused: ${(err as Error).message.slice(0, 60)})`;
    }
    assertKept(db, `step ${step}: ${label}`);
  }
  const { truth } = kept(db);
  assert.ok(truth.length > 0 && truth.length < ids.length, `the run left open and resolved questions (${truth.length} open of ${ids.length})`);
});

test('a merge import and a restore from a backup keep the table exact', async () => {
  const dir = tempDir();
  const d = openTestDiary({ now: iso(NOW), dbPath: path.join(dir, 'diary.sqlite') });
  const open = await d.call('createQuestion', { title: 'Still open', closes_at: iso(NOW + 30 * DAY), first_forecast: { p: 0.3 } });
  const done = await d.call('createQuestion', { title: 'Settled', opened_at: iso(NOW - 20 * DAY), closes_at: iso(NOW - DAY), first_forecast: { p: 0.8, at: iso(NOW - 19 * DAY) } });
  await d.call('resolveQuestion', { id: done.id, outcome: 'yes', at: iso(NOW - DAY) });
  const backup = path.join(dir, 'backup.sqlite');
  await backupTo(d.service.store, backup);

  // Into a second diary: the file's resolved question arrives with its resolution, the open one without.
  const other = openTestDiary({ now: iso(NOW), dbPath: path.join(dir, 'other.sqlite') });
  await other.call('createQuestion', { title: 'Already here', closes_at: iso(NOW + 5 * DAY) });
  await other.call('importText', { format: 'json', text: exportJson(d.service), merge: true });
  assertKept(other.service.store.read, 'the import');
  assert.equal(kept(other.service.store.read).held.length, 2);
  // Again: every question is already there, so each is written under a stand-in id, compared and removed.
  const again = await other.call('importText', { format: 'json', text: exportJson(d.service), merge: true });
  assert.equal(again.added, 0);
  assertKept(other.service.store.read, 'a merge of questions already in the diary');
  assert.equal(kept(other.service.store.read).held.length, 2);

  // Change the diary, then restore the backup over it: the table is the backup's again.
  await d.call('reopenQuestion', { id: done.id });
  await d.call('resolveQuestion', { id: open.id, outcome: 'no', at: iso(NOW), confirm: true });
  await d.call('createQuestion', { title: 'Made after the backup', closes_at: iso(NOW + 9 * DAY) });
  await restoreFrom(backup, d.dbPath, NOW);
  const after = new Database(d.dbPath, { readonly: true });
  try {
    assertKept(after, 'the restore');
    assert.deepEqual(
      (after.prepare('SELECT id FROM unresolved_questions').raw().all() as string[][]).map(([id]) => id),
      [open.id],
    );
  } finally {
    after.close();
  }
});

test('plain SQL from another program, rows in any order within a transaction, keeps the table exact', () => {
  const dir = tempDir();
  const service = openDiary({ dbPath: path.join(dir, 'diary.sqlite'), timeZone: 'UTC' });
  const db = service.store.write;
  const question = (id: string) =>
    db
      .prepare(`INSERT INTO questions (id, title, kind, opened_at, closes_at, time_zone, created_at, updated_at) VALUES (?, ?, 'event_by_deadline', 1, 2, 'UTC', 1, 1)`)
      .run(id, `Title ${id}`);
  const resolution = (id: string) => db.prepare(`INSERT INTO resolutions (question_id, outcome, at, recorded_at) VALUES (?, 'yes', 2, 2)`).run(id);
  try {
    question('a');
    question('b');
    resolution('a');
    assertKept(db, 'a question resolved by SQL');
    // With foreign keys deferred, a resolution may go in before its question.
    db.transaction(() => {
      db.pragma('defer_foreign_keys = ON');
      resolution('c');
      question('c');
      question('d');
    })();
    assertKept(db, 'a resolution written before its question');
    db.prepare('UPDATE questions SET title = ?, closes_at = 5 WHERE id = ?').run('Renamed d', 'd');
    db.prepare(`UPDATE resolutions SET outcome = 'no' WHERE question_id = 'a'`).run();
    db.prepare(`DELETE FROM resolutions WHERE question_id = 'c'`).run();
    db.prepare(`DELETE FROM questions WHERE id = 'b'`).run();
    db.prepare(`DELETE FROM questions WHERE id = 'a'`).run(); // its resolution goes by cascade
    assertKept(db, 'edits, a reopening and deletions by SQL');
    const revision = (id: string, question: string, at: number, p: number) =>
      db.prepare('INSERT INTO forecasts (id, question_id, at, p) VALUES (?, ?, ?, ?)').run(id, question, at, p);
    revision('r1', 'd', 1, 0.1);
    revision('r2', 'd', 1, 0.2); // same time, entered later: the latest
    revision('r3', 'c', 2, 0.3);
    revision('r4', 'c', 1, 0.4); // entered later but earlier in time: not the latest
    assertKept(db, 'revisions by SQL');
    db.prepare(`UPDATE forecasts SET at = 3 WHERE id = 'r1'`).run();
    db.prepare(`UPDATE forecasts SET question_id = 'd' WHERE id = 'r3'`).run();
    assertKept(db, 'revisions moved in time and to another question by SQL');
    assert.deepEqual(kept(db).held, [
      ['c', 'Title c', 'event_by_deadline', 'binary', 1, 2, 'UTC', null, 1, 4, 0.4],
      ['d', 'Renamed d', 'event_by_deadline', 'binary', 1, 5, 'UTC', null, 3, 1, 0.1],
    ]);
    db.prepare(`DELETE FROM forecasts WHERE id IN ('r1', 'r4')`).run();
    assertKept(db, 'the latest revisions deleted by SQL');
  } finally {
    service.close();
  }
});

test('a resolution moved from one question to another by SQL: the one it left is open again, the one it now settles is not', () => {
  const service = openDiary({ dbPath: path.join(tempDir(), 'diary.sqlite'), timeZone: 'UTC' });
  const db = service.store.write;
  try {
    for (const id of ['settled', 'open']) {
      db.prepare(`INSERT INTO questions (id, title, kind, opened_at, closes_at, time_zone, created_at, updated_at) VALUES (?, ?, 'event_by_deadline', 1, 9, 'UTC', 1, 1)`).run(id, `Title ${id}`);
      db.prepare('INSERT INTO forecasts (id, question_id, at, p) VALUES (?, ?, 2, 0.5)').run(`r-${id}`, id);
    }
    db.prepare(`INSERT INTO resolutions (question_id, outcome, at, recorded_at) VALUES ('settled', 'yes', 3, 3)`).run();
    assertKept(db, 'the resolution');
    db.prepare(`UPDATE resolutions SET question_id = 'open' WHERE question_id = 'settled'`).run();
    assertKept(db, 'the resolution moved to the other question');
    assert.deepEqual(
      (db.prepare('SELECT id, last_p FROM unresolved_questions').raw().all() as unknown[][]),
      [['settled', 0.5]],
    );
  } finally {
    service.close();
  }
});

test('a question given another id by SQL stands under it as the rows filed there say, whether its revisions and resolution moved first, follow, or went', () => {
  const service = openDiary({ dbPath: path.join(tempDir(), 'diary.sqlite'), timeZone: 'UTC' });
  const db = service.store.write;
  const question = (id: string) =>
    db.prepare(`INSERT INTO questions (id, title, kind, opened_at, closes_at, time_zone, created_at, updated_at) VALUES (?, ?, 'event_by_deadline', 1, 9, 'UTC', 1, 1)`).run(id, `Title ${id}`);
  const revision = (id: string, q: string, at: number, p: number) => db.prepare('INSERT INTO forecasts (id, question_id, at, p) VALUES (?, ?, ?, ?)').run(id, q, at, p);
  const rename = (from: string, to: string) => db.prepare('UPDATE questions SET id = ? WHERE id = ?').run(to, from);
  const deferred = (write: () => void) =>
    db.transaction(() => {
      db.pragma('defer_foreign_keys = ON');
      write();
    })();
  try {
    question('a');
    revision('ra', 'a', 2, 0.5);
    question('b');
    revision('rb', 'b', 3, 0.6);
    question('c');
    revision('rc', 'c', 4, 0.7);
    db.prepare(`INSERT INTO resolutions (question_id, outcome, at, recorded_at) VALUES ('c', 'no', 5, 5)`).run();
    // Renamed, then its revisions deleted from under the old id.
    deferred(() => {
      rename('a', 'a2');
      db.prepare(`DELETE FROM forecasts WHERE question_id = 'a'`).run();
    });
    assertKept(db, 'a question renamed and its revisions deleted');
    // Its revisions moved to the new id first, then the question renamed.
    deferred(() => {
      db.prepare(`UPDATE forecasts SET question_id = 'b2' WHERE question_id = 'b'`).run();
      rename('b', 'b2');
    });
    assertKept(db, 'revisions moved ahead of their question');
    // A resolved question renamed, its resolution following: still resolved.
    deferred(() => {
      rename('c', 'c2');
      db.prepare(`UPDATE forecasts SET question_id = 'c2' WHERE question_id = 'c'`).run();
      db.prepare(`UPDATE resolutions SET question_id = 'c2' WHERE question_id = 'c'`).run();
    });
    assertKept(db, 'a resolved question renamed with its rows');
    // A resolution filed under the new id ahead of the renaming: the question is settled.
    question('d');
    deferred(() => {
      db.prepare(`INSERT INTO resolutions (question_id, outcome, at, recorded_at) VALUES ('d2', 'yes', 5, 5)`).run();
      rename('d', 'd2');
    });
    assertKept(db, 'a question renamed to where its resolution already was');
    assert.deepEqual(db.prepare('SELECT id, last_p FROM unresolved_questions ORDER BY id').raw().all(), [
      ['a2', null],
      ['b2', 0.6],
    ]);
  } finally {
    service.close();
  }
});

test('migrating a schema-7 diary fills the table with its unresolved questions, and the due list reads them', async () => {
  const file = path.join(tempDir(), 'old.sqlite');
  const old = new Database(file);
  old.pragma('journal_mode = WAL');
  old.pragma('foreign_keys = ON');
  assert.equal(
    migrate(
      old,
      MIGRATIONS.filter((m) => m.version <= 7),
    ),
    7,
  );
  old.exec(`
    INSERT INTO questions (id, title, kind, opened_at, closes_at, time_zone, checkin_days, created_at, updated_at, type) VALUES
      ('open', 'Open and overdue', 'event_by_deadline', ${NOW - 30 * DAY}, ${NOW - 10 * DAY}, 'Europe/London', 7, 1, 1, 'binary'),
      ('done', 'Resolved', 'state_at_deadline', ${NOW - 30 * DAY}, ${NOW - 10 * DAY}, 'UTC', NULL, 1, 1, 'binary');
    INSERT INTO forecasts (id, question_id, at, p, note) VALUES ('f1', 'open', ${NOW - 20 * DAY}, 0.25, ''), ('f2', 'done', ${NOW - 20 * DAY}, 0.5, '');
    INSERT INTO resolutions (question_id, outcome, at, recorded_at) VALUES ('done', 'no', ${NOW - 10 * DAY}, ${NOW - 9 * DAY});
  `);
  old.close();

  const service = openDiary({ dbPath: file, now: () => NOW, timeZone: 'UTC' });
  try {
    const db = service.store.read;
    assert.equal(db.pragma('user_version', { simple: true }), SCHEMA_VERSION);
    assertKept(db, 'the migration');
    assert.deepEqual(kept(db).held, [['open', 'Open and overdue', 'event_by_deadline', 'binary', NOW - 30 * DAY, NOW - 10 * DAY, 'Europe/London', 7, NOW - 20 * DAY, 1, 0.25]]);
    const due = (await callOrThrow(service.dispatch, 'due', {})) as { nudges: { id: string; kind: string; last_p: number | null }[] };
    assert.deepEqual(
      due.nudges.map((n) => [n.id, n.kind, n.last_p]),
      [['open', 'overdue', 0.25]],
    );
  } finally {
    service.close();
  }
});

test('the calendar export reads the open questions and their contents from one state of the diary', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const a = await d.call('createQuestion', { title: 'Kept open', closes_at: iso(NOW + 30 * DAY), first_forecast: { p: 0.3 } });
  const b = await d.call('createQuestion', { title: 'Deleted meanwhile', closes_at: iso(NOW + 20 * DAY), first_forecast: { p: 0.6 } });
  // Another writer commits just after the open ids are read: the reader must still see the
  // state it began with, both questions whole, not an id whose question has gone.
  const read = d.service.store.read;
  const interrupting = new Proxy(read, {
    get(target, key) {
      if (key !== 'prepare') return Reflect.get(target, key, target);
      return (sql: string) => {
        const statement = target.prepare(sql);
        if (!sql.includes('FROM unresolved_questions')) return statement;
        return {
          raw: () => ({
            all: () => {
              const rows = statement.raw().all();
              d.service.store.write.prepare('DELETE FROM questions WHERE id = ?').run(b.id);
              return rows;
            },
          }),
        };
      };
    },
  });
  const seen = unresolvedQuestions({ ...d.service.store, read: interrupting }, NOW);
  assert.deepEqual(seen.map((q) => q.title).sort(), ['Deleted meanwhile', 'Kept open']);
  assert.deepEqual(
    unresolvedQuestions(d.service.store, NOW).map((q) => q.id),
    [a.id],
  );
});
