/**
 * The limit most file systems put on one name in a path (NAME_MAX on Linux and macOS, in
 * bytes of UTF-8), checked before a file is opened or created, so a name that is too long
 * is called that instead of "there is no diary" or the system's ENAMETOOLONG.
 */
import fs from 'node:fs';
import path from 'node:path';
import { groupedDigits } from '../../shared/grouped-digits';

export const NAME_MAX_BYTES = 255;

/**
 * Why `file` cannot name a file, or null: its own name, or a folder's on the way to it,
 * is longer than NAME_MAX_BYTES. Reads as a sentence ending in what to do.
 */
export function fileNameProblem(file: string): string | null {
  const resolved = path.resolve(file);
  const parts = resolved.split(path.sep);
  for (let i = 0; i < parts.length; i++) {
    const bytes = Buffer.byteLength(parts[i]!);
    if (bytes <= NAME_MAX_BYTES) continue;
    const whose = i === parts.length - 1 ? 'its name' : `the name of its folder ${parts[i]!.slice(0, 40)}…`;
    return `${resolved}: ${whose} is ${groupedDigits(bytes)} bytes long, more than the ${NAME_MAX_BYTES} a file name may have; choose a shorter name.`;
  }
  return null;
}

/** `file` with every link on its way resolved, or as given when it does not exist yet. */
function realPathOf(file: string): string {
  try {
    return fs.realpathSync(file);
  } catch {
    // Not there yet: its folder may still be a link.
    try {
      return path.join(fs.realpathSync(path.dirname(file)), path.basename(file));
    } catch {
      return path.resolve(file);
    }
  }
}

/**
 * True when writing `file` would write over the diary at `diaryPath` or one of the files
 * SQLite keeps beside it (its -wal, -shm or -journal file), by any name: a link, or a path
 * through a linked folder. Writing a copy or an export there would destroy the diary it
 * was taken from.
 */
export function isDiaryFile(file: string, diaryPath: string): boolean {
  const target = realPathOf(file);
  const diaries = [path.resolve(diaryPath), realPathOf(diaryPath)];
  return diaries.some((diary) => ['', '-wal', '-shm', '-journal'].some((suffix) => target === diary + suffix));
}
