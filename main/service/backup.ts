/**
 * Copies of the diary: an online backup (SQLite's backup API, safe while the diary is in
 * use) and a restore that checks the copy before it replaces anything.
 */
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { SCHEMA_VERSION } from '../store/migrations';
import { openStore, type StoreHandles } from '../store/open';

export async function backupTo(store: StoreHandles, file: string, onProgress?: (percent: number) => void): Promise<void> {
  const target = path.resolve(file);
  if (target === store.path) throw new Error('The backup file cannot be the diary itself; choose another file name.');
  fs.mkdirSync(path.dirname(target), { recursive: true });
  await store.write.backup(target, {
    progress({ totalPages, remainingPages }) {
      if (totalPages > 0) onProgress?.(Math.round(((totalPages - remainingPages) / totalPages) * 100));
      return 256;
    },
  });
  // A copy is one self-contained file: out of WAL mode, so opening it later (even
  // read-only) leaves no -wal/-shm files beside it.
  const copy = new Database(target);
  try {
    copy.pragma('journal_mode = DELETE');
  } finally {
    copy.close();
  }
}

/** Checks that `file` is a Forelog diary this version can open; returns its question count. */
export function inspectBackup(file: string): { questions: number; version: number } {
  if (!fs.existsSync(file)) throw new Error(`There is no file at ${file}. Check the path.`);
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
    throw err;
  } finally {
    db?.close();
  }
}

/**
 * Puts `backupFile` in place of the diary at `dbPath` (which must not be open). The
 * current diary is first copied beside itself as `<name>.before-restore-<time>.sqlite`,
 * so a wrong restore can be undone. Returns that safety copy's path (null if there was no diary).
 */
export async function restoreFrom(backupFile: string, dbPath: string, stamp: number): Promise<{ questions: number; safetyCopy: string | null }> {
  const source = path.resolve(backupFile);
  const target = path.resolve(dbPath);
  if (source === target) throw new Error('The backup file is the diary itself; choose a backup copy.');
  const { questions } = inspectBackup(source);
  let safetyCopy: string | null = null;
  if (fs.existsSync(target)) {
    const current = openStore(target);
    try {
      safetyCopy = target.replace(/(\.sqlite)?$/, `.before-restore-${new Date(stamp).toISOString().replace(/[:.]/g, '-')}.sqlite`);
      await backupTo(current, safetyCopy);
    } finally {
      current.close();
    }
  }
  const src = new Database(source, { readonly: true, fileMustExist: true });
  try {
    for (const suffix of ['-wal', '-shm']) fs.rmSync(target + suffix, { force: true });
    await src.backup(target);
  } finally {
    src.close();
  }
  // Opening migrates an older copy forward and checks it once more.
  openStore(target).close();
  return { questions, safetyCopy };
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
  const day = new Date(now).toISOString().slice(0, 10);
  const existing = () =>
    fs
      .readdirSync(dir)
      .filter((name) => name.startsWith(ROLLING_BACKUP_PREFIX) && name.endsWith('.sqlite'))
      .sort();
  let created: string | null = null;
  if (!existing().some((name) => name.startsWith(`${ROLLING_BACKUP_PREFIX}${day}`))) {
    created = path.join(dir, `${ROLLING_BACKUP_PREFIX}${new Date(now).toISOString().replace(/[:.]/g, '-')}.sqlite`);
    // Written under a temporary name first, so a copy cut short never looks complete.
    const partial = `${created}.partial`;
    await backupTo(store, partial);
    fs.renameSync(partial, created);
  }
  const all = existing();
  const removed = all.slice(0, Math.max(0, all.length - keep)).map((name) => path.join(dir, name));
  for (const file of removed) for (const suffix of ['', '-wal', '-shm']) fs.rmSync(file + suffix, { force: true });
  return { created, removed };
}
