/**
 * Databases a write must not replace. SQLite keeps files beside a database (`NAME-wal`,
 * `NAME-shm`, `NAME-journal`) and, when it opens `NAME`, applies a `-wal` or hot `-journal`
 * it finds there to whatever file `NAME` now is. So:
 * - a copy renamed over a database that has a `-wal` or `-journal` beside it (open in a
 *   running app or `serve`, or left by a process that was killed) is damaged the next time
 *   it is opened, and the program that had the old file open goes on writing into a file
 *   no longer in the folder;
 * - an export (text, a PDF) written over a database, or over one of the files beside it,
 *   destroys a diary (or a backup copy) that no command was asked to touch.
 * The writers check here before they write anything: writeFileAtomic for exports and the
 * app's save dialogs, writeCopy in main/service/backup.ts for backups.
 */
import fs from 'node:fs';

const SQLITE_HEADER = Buffer.from('SQLite format 3\0', 'latin1');
const BESIDE = ['-wal', '-shm', '-journal'] as const;

/**
 * Is `file` a regular file that starts as every SQLite database does? (False when it cannot
 * be read.) Only regular files are opened: reading a terminal or a named pipe would wait.
 */
export function isSqliteDatabase(file: string): boolean {
  let fd: number | undefined;
  try {
    if (!fs.statSync(file).isFile()) return false;
    fd = fs.openSync(file, 'r');
    const head = Buffer.alloc(SQLITE_HEADER.length);
    return fs.readSync(fd, head, 0, head.length, 0) === head.length && head.equals(SQLITE_HEADER);
  } catch {
    return false;
  } finally {
    if (fd !== undefined) fs.closeSync(fd);
  }
}

/** The database `file` sits beside as its -wal, -shm or -journal file, when there is one. */
function databaseBeside(file: string): string | null {
  const suffix = BESIDE.find((s) => file.endsWith(s));
  const database = suffix === undefined ? null : file.slice(0, -suffix.length);
  return database !== null && isSqliteDatabase(database) ? database : null;
}

const besideMessage = (database: string) => `it is a file SQLite keeps beside the database ${database}, and replacing it would damage that database; choose another file name.`;

/**
 * Why a copy of a database may not be renamed over `target`, or null: `target` is a file
 * SQLite keeps beside another database, or a -wal or -journal file sits beside `target`.
 * Reads after "Could not write TARGET: " and says what to do.
 */
export function copyOverProblem(target: string): string | null {
  const database = databaseBeside(target);
  if (database) return besideMessage(database);
  const pending = ['-wal', '-journal'].map((s) => target + s).find((f) => fs.existsSync(f));
  if (pending) {
    return (
      `${pending} is beside it (the database there is open in another program, such as a Forelog window or command, or was not closed cleanly), ` +
      'and SQLite would apply that file to a copy written in its place, damaging the copy; choose another file name, or close what has it open and try again.'
    );
  }
  return null;
}

/**
 * Why an export (text, a PDF) may not replace `target`, or null: it is a database, or a
 * file SQLite keeps beside one. Reads after "Could not write TARGET: ".
 */
export function exportOverProblem(target: string): string | null {
  const database = databaseBeside(target);
  if (database) return besideMessage(database);
  if (isSqliteDatabase(target)) return 'it is a SQLite database (a Forelog diary or a backup copy), which this file would replace; choose another file name (to copy a diary, make a backup).';
  return null;
}
