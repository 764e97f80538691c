/**
 * A text file read as it comes off the disk: chunk by chunk, each decoded by the shared
 * decoder (UTF-8, or UTF-16 with a byte order mark; anything else refused with the line
 * and column of the first bad byte). Memory stays at one chunk whatever the file's size.
 * Synchronous, so an import can read inside its one write transaction.
 */
import fs from 'node:fs';
import { createTextDecoder } from '../../shared/text-decoding';

export const READ_CHUNK_BYTES = 1 << 20;

/** A file that could not be opened or read; says what to do. */
export class FileReadError extends Error {
  constructor(
    message: string,
    readonly code: string | undefined,
  ) {
    super(message);
    this.name = 'FileReadError';
  }
}

function describe(err: NodeJS.ErrnoException, file: string): FileReadError {
  const reasons: Record<string, string> = {
    ENOENT: `there is no file at ${file}; check the path`,
    EACCES: `you may not read ${file}; check its permissions`,
    EPERM: `you may not read ${file}; check its permissions`,
    EISDIR: `${file} is a folder; give the path of a file`,
    EIO: `the disk reported an error while reading ${file}; check it and try again`,
  };
  return new FileReadError(reasons[err.code ?? ''] ?? `could not read ${file}: ${err.message}`, err.code);
}

/**
 * The decoded text of `file`, in chunks; throws FileReadError or TextDecodingError.
 * `onRead` hears how many bytes of how many have been read after each chunk (for progress).
 */
export function* readTextFile(file: string, chunkBytes = READ_CHUNK_BYTES, onRead?: (bytes: number, total: number) => void): Generator<string> {
  let fd: number;
  try {
    fd = fs.openSync(file, 'r');
    if (fs.fstatSync(fd).isDirectory()) {
      fs.closeSync(fd);
      throw Object.assign(new Error('is a folder'), { code: 'EISDIR', syscall: 'open' });
    }
  } catch (err) {
    throw describe(err as NodeJS.ErrnoException, file);
  }
  try {
    const decoder = createTextDecoder();
    const buffer = Buffer.allocUnsafe(chunkBytes);
    const total = onRead ? fs.fstatSync(fd).size : 0;
    let read = 0;
    for (;;) {
      let n: number;
      try {
        n = fs.readSync(fd, buffer, 0, chunkBytes, null);
      } catch (err) {
        throw describe(err as NodeJS.ErrnoException, file);
      }
      if (n === 0) break;
      read += n;
      onRead?.(read, Math.max(total, read));
      const text = decoder.write(buffer.subarray(0, n));
      if (text) yield text;
    }
    const rest = decoder.end();
    if (rest) yield rest;
  } finally {
    fs.closeSync(fd);
  }
}
