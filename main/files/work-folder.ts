/**
 * Private working folders in the system's temporary folder: a restore's checked copy of the
 * backup (main/service/backup.ts) and the migrated copy of a diary this process may only
 * read (main/store/open.ts). Each holds a whole copy of a diary, so one left behind by a
 * process killed half way (kill -9, a power cut) kept a copy of the user's data, and its
 * disk space, for good. The folder's name carries its process id, and making a folder for
 * the same purpose removes those whose process has ended (one still in use by a running
 * process, of this user or another, stays).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { clearLeftovers, escapeRegExp } from './atomic-write';

/** A new private folder `forelog-<purpose>-<pid>-XXXXXX` in the system's temporary folder. */
export function makeWorkFolder(purpose: string): string {
  const prefix = `forelog-${purpose}-`;
  // mkdtemp replaces six X's with letters and digits.
  clearLeftovers(os.tmpdir(), new RegExp(`^${escapeRegExp(prefix)}(\\d+)-[A-Za-z0-9]{6}$`));
  return fs.mkdtempSync(path.join(os.tmpdir(), `${prefix}${process.pid}-`));
}
