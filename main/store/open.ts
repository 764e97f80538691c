/**
 * Opening the diary file: pragmas, migrations, and two handles — one for writes, one
 * read-only — so reads never hold the write lock and a read path cannot write by mistake.
 * A file this process may not write is opened for reading only, and every write is then
 * refused with a clear message instead of failing half-way.
 */
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { fileNameProblem } from '../files/file-name';
import { makeWorkFolder } from '../files/work-folder';
import { describeProblem, StoreError, toStoreError } from './errors';
import { MIGRATIONS, SCHEMA_VERSION, type Migration } from './migrations';

export type Db = Database.Database;

export interface StoreHandles {
  /** The only handle that writes; every write goes through `transact`. */
  write: Db;
  /** Read-only handle on the same file (WAL lets it read while a write is under way). */
  read: Db;
  path: string;
  /** True when the file could be opened for reading only: `transact` refuses every write. */
  readOnly: boolean;
  /** True when this open made a new, empty diary (the file did not exist). */
  created: boolean;
  /** Runs `fn` as one write transaction on `write` (see `writeTransaction`). */
  transact<T>(fn: () => T): T;
  close(): void;
}

export interface OpenStoreOptions {
  /** Path of better-sqlite3's native module when it is not the default (Electron's own build). */
  nativeBinding?: string;
  /** false: a missing file is an error naming the path, and nothing is created. Default true. */
  create?: boolean;
  /** Whether this process may write the file and its folder; tests inject the answer. */
  canWrite?: (file: string) => boolean;
  /** How long a write waits for another connection's write to finish, in ms. */
  busyTimeoutMs?: number;
  /**
   * Told before an existing diary is brought up to this version's format (once per file;
   * a diary of a million revisions takes a minute), so a command can say why it waits.
   */
  onMigrating?: (from: number, to: number) => void;
}

export const DEFAULT_BUSY_TIMEOUT_MS = 5000;

export class NewerDatabaseError extends Error {
  constructor(file: string, found: number) {
    super(
      `The diary ${file} was written by a newer version of Forelog (schema ${found}; this version understands up to ${SCHEMA_VERSION}). ` +
        'Update Forelog to open it; the file was not changed.',
    );
    this.name = 'NewerDatabaseError';
  }
}

/**
 * Runs `fn` in a transaction that takes the write lock when it begins (BEGIN IMMEDIATE).
 * A deferred transaction that has read and then writes cannot wait for another
 * connection's write — SQLite refuses the upgrade at once with SQLITE_BUSY, whatever the
 * busy timeout — so every write transaction in Forelog starts here, and waits its turn.
 */
export function writeTransaction<T>(db: Db, fn: () => T): T {
  return db.transaction(fn).immediate();
}

/**
 * Runs `fn` in one read transaction on a read-only handle, so every query inside sees the
 * same snapshot of the diary even while another connection commits. Read-only handles
 * only: a read that later writes must use `writeTransaction`.
 */
export function readSnapshot<T>(db: Db, fn: () => T): T {
  if (!db.readonly) throw new Error('readSnapshot takes the read-only handle; writes go through writeTransaction.');
  return db.transaction(fn)();
}

function configure(db: Db, busyTimeoutMs: number): void {
  db.pragma('foreign_keys = ON');
  db.pragma(`busy_timeout = ${busyTimeoutMs}`);
}

/** SQLite's page cache while a migration rebuilds tables, in KiB. */
const MIGRATION_CACHE_KIB = 64 * 1024;

/** Applies every migration above the file's `user_version`, each in its own write transaction. */
export function migrate(db: Db, migrations: readonly Migration[] = MIGRATIONS, onMigrating?: (from: number, to: number) => void): number {
  const current = db.pragma('user_version', { simple: true }) as number;
  const latest = migrations[migrations.length - 1]?.version ?? 0;
  if (current > latest) throw new NewerDatabaseError(db.name, current);
  // A new file (version 0) has nothing to bring up to date: only an existing diary is announced.
  if (current > 0 && current < latest) onMigrating?.(current, latest);
  for (const m of migrations) {
    if (m.version <= current) continue;
    // foreign_keys can be switched only outside a transaction (SQLite's table-rebuild procedure).
    const keys = db.pragma('foreign_keys', { simple: true }) as number;
    const cache = db.pragma('cache_size', { simple: true }) as number;
    if (m.rebuildsTables) {
      db.pragma('foreign_keys = OFF');
      // Copying a table rebuilds its indexes: with a larger page cache a diary of a million revisions migrates in a third less time.
      db.pragma(`cache_size = ${-MIGRATION_CACHE_KIB}`);
    }
    try {
      writeTransaction(db, () => {
        // Another process opening the same new file may have applied it while we waited.
        if ((db.pragma('user_version', { simple: true }) as number) >= m.version) return;
        db.exec(m.sql);
        if (m.rebuildsTables) {
          const broken = db.pragma('foreign_key_check') as { table: string }[];
          if (broken.length) throw new Error(`migration ${m.version} left ${broken.length} rows whose parent is missing (first in ${broken[0]!.table}); nothing was changed`);
        }
        db.pragma(`user_version = ${m.version}`);
      });
    } finally {
      if (m.rebuildsTables) {
        db.pragma(`foreign_keys = ${keys ? 'ON' : 'OFF'}`);
        db.pragma(`cache_size = ${cache}`);
      }
    }
  }
  return db.pragma('user_version', { simple: true }) as number;
}

/** The file (when it exists) and its folder (for SQLite's -wal and -shm files) are writable. */
export function canWriteFile(file: string): boolean {
  try {
    fs.accessSync(path.dirname(file), fs.constants.W_OK);
    if (fs.existsSync(file)) fs.accessSync(file, fs.constants.W_OK);
    return true;
  } catch {
    return false;
  }
}

function canRead(file: string): boolean {
  try {
    fs.accessSync(file, fs.constants.R_OK);
    return true;
  } catch {
    return false;
  }
}

/**
 * Refuses a file that holds a newer schema, or tables of some other program. The version
 * and the tables are read in one statement, so from one snapshot: read one after the
 * other, another process creating the same new diary could commit its first migration in
 * between (version 0, then Forelog's tables), and its diary was called another program's.
 */
function checkVersion(db: Db, file: string): number {
  const { version, tables } = db
    .prepare("SELECT (SELECT user_version FROM pragma_user_version) AS version, EXISTS (SELECT 1 FROM sqlite_master WHERE type = 'table') AS tables")
    .get() as { version: number; tables: number };
  if (version > SCHEMA_VERSION) throw new NewerDatabaseError(file, version);
  if (version === 0 && tables) {
    throw new StoreError(
      'not_a_diary',
      file,
      `${file} is a SQLite database of some other program, not a Forelog diary, so Forelog left it unchanged. Check the path (--db).`,
    );
  }
  return version;
}

/**
 * Makes the empty file a new diary starts as, only if nothing is there: true when this
 * process made it. Two processes racing to create one diary then agree on which of them
 * did (an empty file is a valid empty SQLite database), where checking for the file first
 * would let both believe it.
 */
function createdHere(file: string): boolean {
  try {
    fs.closeSync(fs.openSync(file, 'wx'));
    return true;
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw err;
  }
}

export function openStore(file: string, options: OpenStoreOptions = {}): StoreHandles {
  const resolved = path.resolve(file);
  const tooLong = fileNameProblem(resolved);
  if (tooLong) throw new StoreError('not_a_diary', resolved, `${tooLong} Nothing was created or changed (--db).`);
  const canWrite = options.canWrite ?? canWriteFile;
  const exists = fs.existsSync(resolved);
  if (!exists && options.create === false) throw new StoreError('missing', resolved, describeProblem('missing', resolved));
  const stats = exists ? fs.statSync(resolved) : null;
  if (stats?.isDirectory()) {
    throw new StoreError('not_a_diary', resolved, `${resolved} is a folder, not a diary file. Check the path (--db).`);
  }
  if (stats && !stats.isFile()) {
    // SQLite would fail on it in words about the disk ("could not read or write").
    const what = stats.isFIFO() ? 'a named pipe' : stats.isSocket() ? 'a socket' : 'a device';
    throw new StoreError('not_a_diary', resolved, `${resolved} is not a regular file (it is ${what}), not a diary file. Check the path (--db).`);
  }
  if (exists && !canRead(resolved)) {
    throw new StoreError(
      'io_error',
      resolved,
      `Forelog may not read the diary ${resolved} (no read permission), so nothing was changed. Give yourself read permission on it, or check the path (--db).`,
    );
  }
  try {
    if (!exists) {
      try {
        fs.mkdirSync(path.dirname(resolved), { recursive: true });
      } catch (err) {
        throw new StoreError('read_only', resolved, `Forelog cannot create a diary at ${resolved}: ${(err as Error).message}. Choose a folder you can write to.`);
      }
      if (!canWrite(resolved)) {
        throw new StoreError('read_only', resolved, `Forelog cannot create a diary at ${resolved}: its folder is read-only. Choose a folder you can write to.`);
      }
    }
    return exists && !canWrite(resolved) ? openReadOnly(resolved, options) : openWritable(resolved, !exists && createdHere(resolved), options);
  } catch (err) {
    throw toStoreError(err, resolved) ?? err;
  }
}

function handles(file: string, write: Db, read: Db, flags: { readOnly: boolean; created: boolean }, onClose = () => {}): StoreHandles {
  return {
    write,
    read,
    path: file,
    ...flags,
    transact(fn) {
      if (flags.readOnly) throw new StoreError('read_only', file, describeProblem('read_only', file));
      return writeTransaction(write, fn);
    },
    close() {
      read.close();
      write.close();
      onClose();
    },
  };
}

function nativeOf(options: OpenStoreOptions): { nativeBinding?: string } {
  return options.nativeBinding ? { nativeBinding: options.nativeBinding } : {};
}

/**
 * An empty file (0 bytes, or a SQLite database with nothing in it) holds no diary. A command
 * that only reads (`create: false`) refuses it as it refuses a missing one: it used to make
 * the file a whole new diary (175 KB of tables) while saying nothing, so `forelog export
 * --db notes.txt` turned an empty text file into a database.
 */
function refuseEmpty(version: number, file: string, options: OpenStoreOptions): void {
  if (version === 0 && options.create === false) {
    throw new StoreError('missing', file, `There is no diary at ${file}: the file is empty. Forelog left it unchanged. Check the path (--db).`);
  }
}

function openWritable(file: string, created: boolean, options: OpenStoreOptions): StoreHandles {
  const busy = options.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS;
  const write = new Database(file, nativeOf(options));
  try {
    configure(write, busy);
    // Refuse before touching anything: a newer, foreign or (for reading) empty file is left exactly as it was.
    refuseEmpty(checkVersion(write, file), file, options);
    write.pragma('journal_mode = WAL');
    write.pragma('synchronous = FULL');
    migrate(write, MIGRATIONS, options.onMigrating);
  } catch (err) {
    write.close();
    throw err;
  }
  const read = new Database(file, { ...nativeOf(options), readonly: true, fileMustExist: true });
  configure(read, busy);
  return handles(file, write, read, { readOnly: false, created });
}

/** SQLite could not read the file where it is (see openReadOnly): worth a private copy. */
function needsPrivateCopy(err: unknown): boolean {
  const code = (err as { code?: unknown }).code;
  return typeof code === 'string' && /^SQLITE_(READONLY|CANTOPEN)/.test(code);
}

/**
 * A diary this process may only read. Read in place when SQLite can (the -wal/-shm files
 * exist or can be made beside it), so another process's writes stay visible. SQLite cannot
 * read a WAL-mode file in place in a read-only folder with no -shm file, and cannot
 * migrate an older schema without writing: then Forelog reads a private copy, taken as it
 * opens, in the system's temporary folder.
 */
function openReadOnly(file: string, options: OpenStoreOptions): StoreHandles {
  const busy = options.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS;
  const readOnlyHandle = (target: string) => {
    const db = new Database(target, { ...nativeOf(options), readonly: true, fileMustExist: true });
    try {
      configure(db, busy);
    } catch (err) {
      db.close();
      throw err;
    }
    return db;
  };
  let read: Db | undefined;
  try {
    read = readOnlyHandle(file);
    const version = checkVersion(read, file);
    refuseEmpty(version, file, options);
    if (version === SCHEMA_VERSION) return handles(file, readOnlyHandle(file), read, { readOnly: true, created: false });
    read.close();
  } catch (err) {
    read?.close();
    if (!needsPrivateCopy(err)) throw err;
  }

  const dir = makeWorkFolder('read-only');
  const removeDir = () => fs.rmSync(dir, { recursive: true, force: true });
  try {
    const copy = path.join(dir, path.basename(file));
    fs.copyFileSync(file, copy);
    // Committed changes not yet folded into the file live in the -wal; SQLite replays it.
    if (fs.existsSync(`${file}-wal`)) fs.copyFileSync(`${file}-wal`, `${copy}-wal`);
    const prepare = new Database(copy, nativeOf(options));
    try {
      refuseEmpty(checkVersion(prepare, file), file, options);
      migrate(prepare, MIGRATIONS, options.onMigrating);
    } finally {
      prepare.close();
    }
    const copyRead = readOnlyHandle(copy);
    try {
      return handles(file, readOnlyHandle(copy), copyRead, { readOnly: true, created: false }, removeDir);
    } catch (err) {
      copyRead.close();
      throw err;
    }
  } catch (err) {
    removeDir();
    throw err;
  }
}
