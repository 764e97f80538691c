/**
 * The limit most file systems put on one name in a path (NAME_MAX on Linux and macOS, in
 * bytes of UTF-8), checked before a file is opened or created, so a name that is too long
 * is called that instead of "there is no diary" or the system's ENAMETOOLONG.
 */
import path from 'node:path';

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
    return `${resolved}: ${whose} is ${bytes.toLocaleString('en-GB')} bytes long, more than the ${NAME_MAX_BYTES} a file name may have; choose a shorter name.`;
  }
  return null;
}
