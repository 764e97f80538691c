/**
 * Copies of the diary: an online backup (SQLite's backup API, safe while the diary is in
 * use, written atomically) and a restore that checks the copy before it replaces anything
 * and works while other processes have the diary open.
 */
import Database from 'better-sqlite3';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { clearLeftovers, escapeRegExp, temporaryStem } from '../files/atomic-write';
import { fileNameProblem, isDiaryFile } from '../files/file-name';
import { copyOverProblem } from '../files/sqlite-files';
import { makeWorkFolder } from '../files/work-folder';
import { describeProblem, problemOf, StoreError, toStoreError } from '../store/errors';
import { SCHEMA_VERSION } from '../store/migrations';
import { openStore, type Db, type StoreHandles } from '../store/open';
import { replaceContents } from '../store/replace';

/** Flushes a file's (or, where the system allows it, a folder's) contents to the disk. */
function fsyncPath(target: string, flags: string): void {
  const fd = fs.openSync(target, flags);
  try {
    fs.fsyncSync(fd);
  } finally {
    fs.closeSync(fd);
  }
}

/**
 * Where a copy named `file` goes: the file itself, or the file a symbolic link there
 * points to (the link stays a link, as an export's does). Something there that is not a
 * regular file — a folder, a named pipe, a device — is refused: the rename that finishes a
 * copy would put a file in its place.
 */
function copyTarget(file: string): string {
  const named = path.resolve(file);
  const tooLong = fileNameProblem(named);
  if (tooLong) throw new Error(`${tooLong} No copy was written; the diary is unchanged.`);
  let stats: fs.Stats;
  try {
    stats = fs.statSync(named);
  } catch {
    return named; // nothing there yet (or a dangling link, which the copy replaces)
  }
  if (!stats.isFile()) {
    const what = stats.isDirectory() ? 'a folder' : stats.isFIFO() ? 'a named pipe' : stats.isSocket() ? 'a socket' : 'a device';
    throw new Error(`${named} is not a regular file (it is ${what}), so no copy was written there; choose a file name such as backup.sqlite. The diary is unchanged.`);
  }
  return fs.realpathSync(named);
}

/**
 * Writes an online copy of the database behind `source` (the diary at `sourcePath`) to
 * `file`, atomically: SQLite's backup API writes a temporary file in the target folder,
 * which is made self-contained, flushed to the disk and only then renamed over `file`.
 * A copy cut short — a crash, a full disk, a killed command — never sits under the
 * target's name, and a file that was there stays as it was.
 */
async function writeCopy(source: Db, sourcePath: string, file: string, onProgress?: (percent: number) => void): Promise<void> {
  const target = copyTarget(file);
  const unsafe = copyOverProblem(target);
  if (unsafe) throw new Error(`Could not write ${target}: ${unsafe} No copy was written; the diary is unchanged.`);
  // Not ending in .sqlite, so a partial copy is never taken for one of the rolling backups.
  // "NAME.partial-<pid up to 7 digits>-<8 hex>-journal" adds at most 33 bytes to the name.
  const stem = temporaryStem(path.basename(target), 33);
  const partial = path.join(path.dirname(target), `${stem}.partial-${process.pid}-${randomBytes(4).toString('hex')}`);
  try {
    fs.mkdirSync(path.dirname(target), { recursive: true });
    // SQLite says only "cannot open" for a folder we may not write; the OS says why.
    fs.accessSync(path.dirname(target), fs.constants.W_OK);
    // Partial copies of this target left by a killed earlier backup (with their journals).
    clearLeftovers(path.dirname(target), new RegExp(`^${escapeRegExp(stem)}\\.partial-(\\d+)-[0-9a-f]{8}(?:-journal|-wal|-shm)?$`));
    await source.backup(partial, {
      progress({ totalPages, remainingPages }) {
        if (totalPages > 0) onProgress?.(Math.round(((totalPages - remainingPages) / totalPages) * 100));
        return 256;
      },
    });
    // A copy is one self-contained file: out of WAL mode, so opening it later (even
    // read-only) leaves no -wal/-shm files beside it.
    const copy = new Database(partial);
    try {
      copy.pragma('journal_mode = DELETE');
    } finally {
      copy.close();
    }
    fsyncPath(partial, 'r+');
    fs.renameSync(partial, target);
    try {
      fsyncPath(path.dirname(target), 'r'); // makes the rename itself durable (POSIX)
    } catch {
      // Windows cannot open a folder to flush it; its rename is already recorded by NTFS.
    }
  } catch (err) {
    for (const suffix of ['', '-journal', '-wal', '-shm']) fs.rmSync(partial + suffix, { force: true });
    const problem = problemOf(err);
    // A full disk or a folder we may not write concerns the copy; anything else, the diary read from.
    if (problem === 'disk_full' || problem === 'read_only' || problem === 'io_error') throw toStoreError(err, target, 'copy');
    throw toStoreError(err, sourcePath) ?? err;
  }
}

/**
 * Removes the partial copies (with their journals) that backups killed half way left in
 * `dir` under names starting with `prefix`. writeCopy clears a target's own leftovers, but
 * copies named by the time they are taken (the daily copies, restore's safety copies) are
 * never written to the same name again, so theirs are cleared here, by the name's start.
 */
function clearPartialCopies(dir: string, prefix: string): void {
  clearLeftovers(dir, new RegExp(`^${escapeRegExp(prefix)}.*\\.partial-(\\d+)-[0-9a-f]{8}(?:-journal|-wal|-shm)?$`));
}

export async function backupTo(store: StoreHandles, file: string, onProgress?: (percent: number) => void): Promise<void> {
  const target = copyTarget(file);
  if (isDiaryFile(target, store.path)) throw new Error('The backup file cannot be the diary itself (or a file SQLite keeps beside it); choose another file name.');
  await writeCopy(store.write, store.path, target, onProgress);
}

/** Checks that `file` is a Forelog diary this version can open; returns its question count. */
export function inspectBackup(file: string): { questions: number; version: number } {
  const tooLong = fileNameProblem(file);
  if (tooLong) throw new Error(`${tooLong} The diary is unchanged.`);
  if (!fs.existsSync(file)) throw new Error(`There is no file at ${file}. Check the path.`);
  const stats = fs.statSync(file);
  if (stats.isDirectory()) throw new Error(`${file} is a folder, not a backup copy; give the path of a backup file. Nothing was restored.`);
  if (!stats.isFile()) {
    // SQLite would wait on a named pipe for ever, or fail on a device in words about the diary.
    const what = stats.isFIFO() ? 'a named pipe' : stats.isSocket() ? 'a socket' : 'a device';
    throw new Error(`${file} is not a regular file (it is ${what}), not a backup copy; give the path of a backup file. Nothing was restored.`);
  }
  let db: Database.Database | undefined;
  try {
    db = new Database(file, { readonly: true, fileMustExist: true });
    const version = db.pragma('user_version', { simple: true }) as number;
    if (version > SCHEMA_VERSION) {
      throw new Error(`${file} was written by a newer Forelog (schema ${version}); update Forelog to restore it.`);
    }
    const ok = db.pragma('quick_check', { simple: true });
    if (ok !== 'ok') throw new Error(`${file} is damaged (SQLite quick_check: ${String(ok)}); choose another backup.`);
    const hasQuestions = db.prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'questions'").get();
    if (!hasQuestions) throw new Error(`${file} is a SQLite file but not a Forelog diary.`);
    const n = (db.prepare('SELECT count(*) AS n FROM questions').get() as { n: number }).n;
    return { questions: n, version };
  } catch (err) {
    if (err instanceof Error && /file is not a database|SQLITE_NOTADB/i.test(err.message)) {
      throw new Error(`${file} is not a Forelog diary (not a SQLite database).`);
    }
    // SQLite's codes would otherwise be read as the diary's own trouble ("the diary is damaged").
    const code = (err as { code?: unknown }).code;
    if (typeof code === 'string' && code.startsWith('SQLITE_')) {
      const what = /^SQLITE_(CORRUPT|IOERR_SHORT_READ)/.test(code) ? 'is damaged or incomplete' : 'could not be read';
      throw new Error(`The backup copy ${file} ${what} (${code}); choose another backup. Nothing was restored; the diary is unchanged.`);
    }
    throw err;
  } finally {
    db?.close();
  }
}

export interface RestoreResult {
  questions: number;
  /** Where the replaced diary is kept (null when there was no diary before). */
  safetyCopy: string | null;
  /** True when there was no diary at the path and the restore made one. */
  created: boolean;
}

/**
 * Puts `backupFile` in place of the diary at `dbPath`, which other processes may have
 * open: the contents are replaced in one ordinary write transaction (see
 * replaceContents), so they read the restored diary and keep what they write next. The
 * current diary is first copied beside itself as `<name>.before-restore-<time>.sqlite`, so
 * a wrong restore can be undone. An older backup is migrated forward on a private copy (the
 * backup file is never written); a newer one is refused before anything changes.
 */
export async function restoreFrom(backupFile: string, dbPath: string, stamp: number): Promise<RestoreResult> {
  const source = path.resolve(backupFile);
  const target = path.resolve(dbPath);
  if (source === target) throw new Error('The backup file is the diary itself; choose a backup copy.');
  const { questions } = inspectBackup(source);
  // The normal opener: a newer diary or another program's file is refused untouched.
  const live = openStore(target);
  const work = makeWorkFolder('restore');
  try {
    if (live.readOnly) throw new StoreError('read_only', target, describeProblem('read_only', target));
    const copy = path.join(work, 'restore.sqlite');
    const backup = new Database(source, { readonly: true, fileMustExist: true });
    try {
      await backup.backup(copy);
    } finally {
      backup.close();
    }
    openStore(copy).close(); // migrates an older copy to this version's schema
    const safetyCopy = live.created
      ? null
      : target.replace(/(\.sqlite)?$/, `.before-restore-${new Date(stamp).toISOString().replace(/[:.]/g, '-')}.sqlite`);
    if (safetyCopy) clearPartialCopies(path.dirname(target), path.basename(target).replace(/(\.sqlite)?$/, '.before-restore-'));
    await replaceContents(live, copy, async () => {
      if (safetyCopy) await writeCopy(live.read, target, safetyCopy);
    });
    return { questions, safetyCopy, created: live.created };
  } finally {
    live.close();
    fs.rmSync(work, { recursive: true, force: true });
  }
}

export const ROLLING_BACKUP_PREFIX = 'forelog-';

/**
 * Automatic rolling backups: at most one a day into `dir` (named by the UTC time), keeping
 * the `keep` newest. Returns the new copy's path, or null when today's already exists.
 * The desktop app calls it at start and once a day, so a damaged or mistaken diary can
 * be put back from yesterday's copy with `forelog restore`.
 */
export async function rollingBackup(
  store: StoreHandles,
  dir: string,
  now: number,
  keep = 7,
): Promise<{ created: string | null; removed: string[] }> {
  if (!Number.isInteger(keep) || keep < 1) throw new RangeError(`keep must be a whole number of copies, at least 1 (got ${keep}).`);
  fs.mkdirSync(dir, { recursive: true });
  clearPartialCopies(dir, ROLLING_BACKUP_PREFIX);
  const day = new Date(now).toISOString().slice(0, 10);
  const existing = () =>
    fs
      .readdirSync(dir)
      .filter((name) => name.startsWith(ROLLING_BACKUP_PREFIX) && name.endsWith('.sqlite'))
      .sort();
  let created: string | null = null;
  if (!existing().some((name) => name.startsWith(`${ROLLING_BACKUP_PREFIX}${day}`))) {
    created = path.join(dir, `${ROLLING_BACKUP_PREFIX}${new Date(now).toISOString().replace(/[:.]/g, '-')}.sqlite`);
    await backupTo(store, created);
  }
  const all = existing();
  const removed = all.slice(0, Math.max(0, all.length - keep)).map((name) => path.join(dir, name));
  for (const file of removed) for (const suffix of ['', '-wal', '-shm']) fs.rmSync(file + suffix, { force: true });
  return { created, removed };
}
