/**
 * Replacing a diary's whole contents while other processes may have it open (`forelog
 * restore` beside `forelog serve` or the desktop app in the tray).
 */
import { DERIVED_TABLES } from './migrations';
import type { Db, StoreHandles } from './open';

function quote(name: string): string {
  return `"${name.replace(/"/g, '""')}"`;
}

/** The schema's own tables (not SQLite's), in a stable order. */
function tables(db: Db, schema: string): string[] {
  return (
    db.prepare(`SELECT name FROM ${schema}.sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' ESCAPE '\\' ORDER BY name`).all() as {
      name: string;
    }[]
  ).map((r) => r.name);
}

function columns(db: Db, schema: string, table: string): string[] {
  return (db.prepare(`SELECT name FROM pragma_table_info(?, ?)`).all(table, schema) as { name: string }[]).map((r) => r.name);
}

/**
 * Replaces every row of the diary behind `store` with the rows of the diary file `source`,
 * which must have exactly the same schema (open it with the normal opener first, so it is
 * migrated). It is ONE write transaction on an ordinary connection: every other connection
 * sees an ordinary commit — its next read shows the new contents, and its data_version
 * moves, so cached figures are recomputed — and nothing is removed behind its back (no
 * -wal/-shm file deleted, no file swapped under an open handle), so what it writes next
 * is kept.
 *
 * `beforeReplace` runs while this transaction holds the write lock and has changed
 * nothing yet: a safety copy taken there is exactly the diary being replaced, with no
 * write slipping in between.
 */
export async function replaceContents(store: StoreHandles, source: string, beforeReplace: () => Promise<void>): Promise<void> {
  const db = store.write;
  db.prepare('ATTACH DATABASE ? AS restored').run(source);
  try {
    const ours = tables(db, 'main');
    const theirs = tables(db, 'restored');
    const ourVersion = db.pragma('main.user_version', { simple: true }) as number;
    const theirVersion = db.pragma('restored.user_version', { simple: true }) as number;
    if (ourVersion !== theirVersion || ours.join('\n') !== theirs.join('\n')) {
      throw new Error(`the copy to restore has schema ${theirVersion} and the diary ${ourVersion}; open both with this version of Forelog first`);
    }
    db.exec('BEGIN IMMEDIATE');
    try {
      await beforeReplace();
      // Rows go in parent-first or not, as the tables sort; the keys are checked at COMMIT.
      db.pragma('defer_foreign_keys = ON');
      for (const table of ours) db.exec(`DELETE FROM main.${quote(table)}`);
      for (const table of ours) {
        if (DERIVED_TABLES.has(table)) continue; // the triggers filled it as the rows went in
        const list = columns(db, 'main', table).map(quote).join(', ');
        db.exec(`INSERT INTO main.${quote(table)} (${list}) SELECT ${list} FROM restored.${quote(table)}`);
      }
      // AUTOINCREMENT counters come along, so the restored diary numbers new entries as the copy would.
      if (db.prepare("SELECT 1 FROM main.sqlite_master WHERE name = 'sqlite_sequence'").get()) {
        db.exec('DELETE FROM main.sqlite_sequence');
        if (db.prepare("SELECT 1 FROM restored.sqlite_master WHERE name = 'sqlite_sequence'").get()) {
          db.exec('INSERT INTO main.sqlite_sequence (name, seq) SELECT name, seq FROM restored.sqlite_sequence');
        }
      }
      db.exec('COMMIT');
    } catch (err) {
      if (db.inTransaction) db.exec('ROLLBACK');
      throw err;
    }
  } finally {
    db.exec('DETACH DATABASE restored');
  }
}
