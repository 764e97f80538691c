/**
 * What can go wrong with the diary file itself, in words a user can act on. SQLite's result
 * codes (and the operating system's, for the copies Forelog writes) are sorted into a few
 * problems here, once: the service's dispatch turns them into API error codes and the
 * command line prints the same sentences.
 */

export type StoreProblem = 'missing' | 'busy' | 'read_only' | 'disk_full' | 'damaged' | 'io_error' | 'not_a_diary';

/** A failure of the diary file (or of a copy being written), with its user-facing sentence. */
export class StoreError extends Error {
  constructor(
    readonly problem: StoreProblem,
    readonly file: string,
    message: string,
  ) {
    super(message);
    this.name = 'StoreError';
  }
}

/** SQLite's extended result code (e.g. `SQLITE_BUSY_SNAPSHOT`) or Node's errno code (e.g. `ENOSPC`). */
function codeOf(err: unknown): string | null {
  const code = (err as { code?: unknown } | null)?.code;
  return typeof code === 'string' ? code : null;
}

export function problemOf(err: unknown): StoreProblem | null {
  if (err instanceof StoreError) return err.problem;
  const code = codeOf(err);
  if (code === null) return null;
  // LOCKED is BUSY within one process (a shared cache); both mean "someone else is writing".
  if (/^SQLITE_(BUSY|LOCKED)/.test(code)) return 'busy';
  // SQLite reports ENOSPC (and a reached max_page_count) as SQLITE_FULL.
  if (code === 'SQLITE_FULL' || code === 'ENOSPC' || code === 'EDQUOT') return 'disk_full';
  if (/^SQLITE_READONLY/.test(code) || code === 'EROFS' || code === 'EACCES' || code === 'EPERM') return 'read_only';
  if (/^SQLITE_CORRUPT/.test(code)) return 'damaged';
  if (code === 'SQLITE_NOTADB') return 'not_a_diary';
  if (/^SQLITE_(IOERR|CANTOPEN)/.test(code) || code === 'EIO') return 'io_error';
  return null;
}

/** What the failing file is to the user: the diary itself, or a copy Forelog was writing. */
export type FileRole = 'diary' | 'copy';

export function describeProblem(problem: StoreProblem, file: string, role: FileRole = 'diary', detail = ''): string {
  const why = detail ? ` (${detail})` : '';
  if (role === 'copy') {
    switch (problem) {
      case 'disk_full':
        return `The disk is full, so ${file} was not written; the diary itself is unchanged. Free some disk space (or choose another disk) and try again.`;
      case 'read_only':
        return `Forelog may not write ${file} (the file or its folder is read-only${detail ? `: ${detail}` : ''}), so nothing was written; the diary itself is unchanged. Choose a folder you can write to.`;
      case 'io_error':
        return `Forelog could not write ${file}${why}, so nothing was written; the diary itself is unchanged. Check that the disk is available and try again.`;
      default:
        break;
    }
  }
  switch (problem) {
    case 'missing':
      return `There is no diary at ${file}. Check the path (--db); nothing was created.`;
    case 'busy':
      return 'The diary is busy in another Forelog window or command; nothing was changed — try again in a moment.';
    case 'read_only':
      return (
        `The diary ${file} is read-only (Forelog may not write to the file or its folder), so nothing was changed. ` +
        'Reading, exporting and backing it up still work; to make changes, give yourself write permission on the file and its folder, or work on a copy.'
      );
    case 'disk_full':
      return `The disk holding the diary ${file} is full, so this change was not saved; nothing already in the diary was lost. Free some disk space and try again.`;
    case 'damaged':
      return (
        `The diary ${file} is damaged${why}; nothing was changed. ` +
        'Put back your latest backup with "forelog restore FILE" (the desktop app keeps a copy a day in the backups folder beside its diary).'
      );
    case 'io_error':
      return `Forelog could not read or write the diary ${file}${why}; nothing was changed. Check that the disk or network drive holding it is available and try again.`;
    case 'not_a_diary':
      return `${file} is not a Forelog diary (it is not a SQLite database), so Forelog left it unchanged. Check the path (--db).`;
  }
}

/**
 * The StoreError for `err` if it is a failure of the file `file`, or null for anything else
 * (a bug, a refused request), which the caller reports as it would have.
 */
export function toStoreError(err: unknown, file: string, role: FileRole = 'diary'): StoreError | null {
  if (err instanceof StoreError) return err;
  const problem = problemOf(err);
  if (problem === null) return null;
  const code = codeOf(err);
  const detail = problem === 'damaged' || problem === 'io_error' || (role === 'copy' && problem === 'read_only') ? `${code}` : '';
  const wrapped = new StoreError(problem, file, describeProblem(problem, file, role, detail));
  wrapped.cause = err;
  return wrapped;
}
