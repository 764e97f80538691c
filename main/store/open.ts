/**
 * Opening the diary file: pragmas, migrations, and two handles — one for writes, one
 * read-only — so reads never hold the write lock and a read path cannot write by mistake.
 */
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { MIGRATIONS, SCHEMA_VERSION, type Migration } from './migrations';

export type Db = Database.Database;

export interface StoreHandles {
  /** The only handle that writes; every write goes through `transaction`. */
  write: Db;
  /** Read-only handle on the same file (WAL lets it read while a write is under way). */
  read: Db;
  path: string;
  close(): void;
}

export class NewerDatabaseError extends Error {
  constructor(file: string, found: number) {
    super(
      `The diary ${file} was written by a newer version of Forelog (schema ${found}; this version understands up to ${SCHEMA_VERSION}). ` +
        'Update Forelog to open it; the file was not changed.',
    );
    this.name = 'NewerDatabaseError';
  }
}

function configure(db: Db): void {
  db.pragma('foreign_keys = ON');
  db.pragma('busy_timeout = 5000');
}

/** Applies every migration above the file's `user_version`, each in its own transaction. */
export function migrate(db: Db, migrations: readonly Migration[] = MIGRATIONS): number {
  const current = db.pragma('user_version', { simple: true }) as number;
  const latest = migrations[migrations.length - 1]?.version ?? 0;
  if (current > latest) throw new NewerDatabaseError(db.name, current);
  for (const m of migrations) {
    if (m.version <= current) continue;
    db.transaction(() => {
      db.exec(m.sql);
      db.pragma(`user_version = ${m.version}`);
    })();
  }
  return db.pragma('user_version', { simple: true }) as number;
}

export function openStore(file: string, options: { nativeBinding?: string } = {}): StoreHandles {
  const resolved = path.resolve(file);
  fs.mkdirSync(path.dirname(resolved), { recursive: true });
  const native = options.nativeBinding ? { nativeBinding: options.nativeBinding } : {};
  const write = new Database(resolved, native);
  try {
    // Refuse before touching anything: a newer file is left exactly as it was.
    const version = write.pragma('user_version', { simple: true }) as number;
    if (version > SCHEMA_VERSION) throw new NewerDatabaseError(resolved, version);
    write.pragma('journal_mode = WAL');
    write.pragma('synchronous = FULL');
    configure(write);
    migrate(write);
  } catch (err) {
    write.close();
    throw err;
  }
  const read = new Database(resolved, { ...native, readonly: true, fileMustExist: true });
  configure(read);
  return {
    write,
    read,
    path: resolved,
    close() {
      read.close();
      write.close();
    },
  };
}
