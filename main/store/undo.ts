/**
 * Undo: every row that belongs to one question, taken as a snapshot before a change and
 * put back exactly (same ids, same entry order `seq`, same stamps) when the change is
 * undone — but only while the question is still as the change left it.
 *
 * Which rows belong to a question is read from the schema, not listed here: the
 * `questions` row, then every table whose foreign key leads to it, directly or through
 * another such table (tags, revisions and their lenses, reference forecasts, the
 * resolution and its history, snoozes, and whatever a later migration hangs off them).
 * A table that holds a question's data must therefore reference `questions` (or a table
 * that does) with a foreign key; `undo_log` and `nudge_log` have none on purpose.
 *
 * Callers hold the write transaction (main/service/diary.ts).
 */
import { createHash, randomUUID } from 'node:crypto';
import type { Statement } from 'better-sqlite3';
import type { Db } from './open';

/** How many changes can be undone, and for how long. */
export const UNDO_KEEP_ENTRIES = 200;
export const UNDO_KEEP_MS = 7 * 86_400_000;
/**
 * And how much the kept snapshots may weigh together (in characters of JSON): a question
 * with a hundred thousand revisions makes a snapshot of megabytes, and 200 of them must
 * not fill the disk. The newest entry is always kept.
 */
export const UNDO_KEEP_SIZE = 64 * 1_048_576;

export interface UndoLimits {
  entries: number;
  ms: number;
  size: number;
}

const LIMITS: UndoLimits = { entries: UNDO_KEEP_ENTRIES, ms: UNDO_KEEP_MS, size: UNDO_KEEP_SIZE };

/** A table of the question's rows and how to find them: `where` holds one `?`, the question's id. */
interface TablePlan {
  table: string;
  where: string;
}

/** The rows of each table, as read (`SELECT *`), in a fixed order. */
export interface QuestionSnapshot {
  tables: { table: string; columns: string[]; rows: unknown[][] }[];
}

const quote = (name: string): string => `"${name.replace(/"/g, '""')}"`;

const plans = new WeakMap<Db, TablePlan[]>();

/**
 * The question's tables, parents before children, found by walking foreign keys from
 * `questions`. Read once per handle: the schema does not change while a diary is open.
 */
function tablePlan(db: Db): TablePlan[] {
  const known = plans.get(db);
  if (known) return known;
  const tables = (
    db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' ESCAPE '\\' ORDER BY name").all() as { name: string }[]
  ).map((r) => r.name);
  const primaryKey = (table: string): string[] =>
    (db.prepare('SELECT name, pk FROM pragma_table_info(?) WHERE pk > 0 ORDER BY pk').all(table) as { name: string }[]).map((r) => r.name);
  const foreignKeys = new Map(
    tables.map((t) => {
      const rows = db.prepare('SELECT id, seq, "table" AS parent, "from", "to" FROM pragma_foreign_key_list(?) ORDER BY id, seq').all(t) as {
        id: number;
        parent: string;
        from: string;
        to: string | null;
      }[];
      const byId = new Map<number, { parent: string; from: string[]; to: (string | null)[] }>();
      for (const r of rows) {
        const fk = byId.get(r.id) ?? { parent: r.parent, from: [], to: [] };
        fk.from.push(r.from);
        fk.to.push(r.to);
        byId.set(r.id, fk);
      }
      return [t, [...byId.values()]] as const;
    }),
  );
  const plan: TablePlan[] = [{ table: 'questions', where: `${primaryKey('questions').map(quote).join(', ')} = ?` }];
  const whereOf = new Map([['questions', plan[0]!.where]]);
  for (let grew = true; grew; ) {
    grew = false;
    for (const t of tables) {
      if (whereOf.has(t)) continue;
      const fk = foreignKeys.get(t)!.find((k) => whereOf.has(k.parent));
      if (!fk) continue;
      const to = fk.to.some((c) => c === null) ? primaryKey(fk.parent) : (fk.to as string[]);
      const list = (cols: string[]) => (cols.length === 1 ? quote(cols[0]!) : `(${cols.map(quote).join(', ')})`);
      const where = `${list(fk.from)} IN (SELECT ${to.map(quote).join(', ')} FROM ${quote(fk.parent)} WHERE ${whereOf.get(fk.parent)!})`;
      whereOf.set(t, where);
      plan.push({ table: t, where });
      grew = true;
    }
  }
  plans.set(db, plan);
  return plan;
}

const statements = new WeakMap<Db, Map<string, Statement>>();

function stmt(db: Db, sql: string): Statement {
  let cache = statements.get(db);
  if (!cache) statements.set(db, (cache = new Map()));
  let s = cache.get(sql);
  if (!s) cache.set(sql, (s = db.prepare(sql)));
  return s;
}

/**
 * A value as JSON keeps it: text, null and numbers as themselves (JSON writes a double's
 * shortest exact form, so REAL values come back bit for bit; SQLite keeps no −0), and the
 * odd blob as base64.
 */
function encode(value: unknown): unknown {
  return value instanceof Uint8Array ? { blob: Buffer.from(value).toString('base64') } : value;
}

function decode(value: unknown): unknown {
  return value !== null && typeof value === 'object' ? Buffer.from((value as { blob: string }).blob, 'base64') : value;
}

/** Every row of question `id` (none when there is no such question), in a fixed order. */
export function snapshotQuestion(db: Db, id: string): QuestionSnapshot {
  return {
    tables: tablePlan(db).map(({ table, where }) => {
      const columnCount = (stmt(db, `SELECT count(*) AS n FROM pragma_table_info(?)`).get(table) as { n: number }).n;
      const order = Array.from({ length: columnCount }, (_, i) => i + 1).join(', ');
      const select = stmt(db, `SELECT * FROM ${quote(table)} WHERE ${where} ORDER BY ${order}`);
      const columns = select.columns().map((c) => c.name);
      const rows = (select.raw(true).all(id) as unknown[][]).map((row) => row.map(encode));
      select.raw(false);
      return { table, columns, rows };
    }),
  };
}

/** A fingerprint of a snapshot: equal exactly when every row is. */
export function snapshotHash(snapshot: QuestionSnapshot): string {
  return createHash('sha256').update(JSON.stringify(snapshot)).digest('hex');
}

/**
 * Replaces question `id`'s rows with those of `snapshot`: its current rows go (children
 * first), the snapshot's come back with every column as it was. Foreign keys are checked
 * at the commit, so the order of the inserts does not matter.
 */
export function restoreQuestion(db: Db, id: string, snapshot: QuestionSnapshot): void {
  db.pragma('defer_foreign_keys = ON');
  for (const { table, where } of [...tablePlan(db)].reverse()) stmt(db, `DELETE FROM ${quote(table)} WHERE ${where}`).run(id);
  for (const { table, columns, rows } of snapshot.tables) {
    if (rows.length === 0) continue;
    const insert = stmt(db, `INSERT INTO ${quote(table)} (${columns.map(quote).join(', ')}) VALUES (${columns.map(() => '?').join(', ')})`);
    for (const row of rows) insert.run(...row.map(decode));
  }
}

export interface UndoEntry {
  token: string;
  question_id: string;
  operation: string;
  recorded_at: number;
  before: QuestionSnapshot;
  after_hash: string;
}

/** True while an entry recorded at `recordedAt` may still be undone at `now`. */
export function isUndoFresh(recordedAt: number, now: number): boolean {
  return now - recordedAt <= UNDO_KEEP_MS;
}

/**
 * Records that `operation` changed question `questionId` from `before` to what its rows
 * are now; returns the token that undoes it. Keeps the log bounded: entries older than
 * `limits.ms`, beyond the newest `limits.entries`, or beyond `limits.size` together are
 * dropped, oldest first.
 */
export function recordUndo(db: Db, operation: string, questionId: string, before: QuestionSnapshot, now: number, limits: UndoLimits = LIMITS): string {
  const token = randomUUID();
  const text = JSON.stringify(before);
  stmt(db, 'INSERT INTO undo_log (token, question_id, operation, recorded_at, before, size, after_hash) VALUES (?, ?, ?, ?, ?, ?, ?)').run(
    token,
    questionId,
    operation,
    now,
    text,
    text.length,
    snapshotHash(snapshotQuestion(db, questionId)),
  );
  stmt(db, 'DELETE FROM undo_log WHERE recorded_at < ? OR seq <= (SELECT seq FROM undo_log ORDER BY seq DESC LIMIT 1 OFFSET ?)').run(now - limits.ms, limits.entries);
  let total = 0;
  for (const [i, { seq, size }] of (stmt(db, 'SELECT seq, size FROM undo_log ORDER BY seq DESC').all() as { seq: number; size: number }[]).entries()) {
    total += size;
    if (i > 0 && total > limits.size) {
      stmt(db, 'DELETE FROM undo_log WHERE seq <= ?').run(seq);
      break;
    }
  }
  return token;
}

export function findUndo(db: Db, token: string): UndoEntry | undefined {
  const row = stmt(db, 'SELECT token, question_id, operation, recorded_at, before, after_hash FROM undo_log WHERE token = ?').get(token) as
    | (Omit<UndoEntry, 'before'> & { before: string })
    | undefined;
  return row && { ...row, before: JSON.parse(row.before) as QuestionSnapshot };
}

export function removeUndo(db: Db, token: string): void {
  stmt(db, 'DELETE FROM undo_log WHERE token = ?').run(token);
}

/** The question's title as a snapshot holds it (for messages), or '' when it held no question. */
export function snapshotTitle(snapshot: QuestionSnapshot): string {
  const questions = snapshot.tables.find((t) => t.table === 'questions');
  const column = questions?.columns.indexOf('title') ?? -1;
  const title = column >= 0 ? questions?.rows[0]?.[column] : undefined;
  return typeof title === 'string' ? title : '';
}
