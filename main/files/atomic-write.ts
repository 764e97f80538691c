/**
 * Files written whole or not at all. Every file Forelog writes for the user (exports, the
 * desktop app's save dialogs, the briefing PDF) goes through `writeFileAtomic`: the text is
 * written to a temporary file in the target's own folder, flushed to the disk (fsync),
 * then renamed over the target. A rename within one folder replaces the file in one step,
 * so a full disk, a crash or a failing export leaves either the old file or the new one,
 * never half of one, and no temporary file behind (one left by a killed process is removed
 * by the next write of the same file).
 *
 * Synchronous on purpose: an export reads the diary in one read snapshot while it writes,
 * and nothing else may run on that connection in between.
 */
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileNameProblem, NAME_MAX_BYTES } from './file-name';
import { exportOverProblem } from './sqlite-files';

export type Chunk = string | Uint8Array;
/** Whole content, or chunks in order (e.g. a generator that reads the diary batch by batch). */
export type FileContent = Chunk | Iterable<Chunk>;

/** A file that could not be written; says why, what to do, and that nothing was replaced. */
export class FileWriteError extends Error {
  constructor(
    message: string,
    readonly code: string | undefined,
  ) {
    super(message);
    this.name = 'FileWriteError';
  }
}

function isSystemError(err: unknown): err is NodeJS.ErrnoException {
  return err instanceof Error && typeof (err as NodeJS.ErrnoException).syscall === 'string';
}

function describe(err: NodeJS.ErrnoException, target: string, existed: boolean): FileWriteError {
  const folder = path.dirname(path.resolve(target));
  const fixes: Record<string, string> = {
    ENOSPC: 'the disk is full; free some space or choose another disk, then try again',
    EDQUOT: 'your disk quota is used up; free some space or choose another disk, then try again',
    EACCES: `you may not write in ${folder}; choose a folder you can write to`,
    EPERM: `you may not write in ${folder}; choose a folder you can write to`,
    EROFS: `${folder} is on a read-only disk; choose another folder`,
    ENOENT: `the folder ${folder} does not exist; create it or choose another`,
    ENOTDIR: `${folder} is not a folder; choose another place`,
    EISDIR: 'that is a folder; give a file name',
    EFBIG: 'the file is larger than this system allows files to be; choose another disk',
    EIO: 'the disk reported an error; check it and try again',
  };
  const reason = fixes[err.code ?? ''] ?? err.message;
  const outcome = existed ? 'The file that was there is unchanged.' : 'No file was written.';
  return new FileWriteError(`Could not write ${target}: ${reason} (${err.code ?? 'error'}). ${outcome}`, err.code);
}

function* chunksOf(content: FileContent): Iterable<Chunk> {
  if (typeof content === 'string' || content instanceof Uint8Array) yield content;
  else yield* content;
}

const pause = new Int32Array(new SharedArrayBuffer(4));

/**
 * Writes every byte of `data` to `fd`, however many calls that takes. A non-blocking pipe
 * (a slow reader of stdout) answers EAGAIN when full; the write waits briefly and retries.
 */
function writeAll(fd: number, data: Uint8Array): void {
  let offset = 0;
  while (offset < data.length) {
    try {
      offset += fs.writeSync(fd, data, offset, data.length - offset);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EAGAIN') throw err;
      Atomics.wait(pause, 0, 0, 5);
    }
  }
}

/** Text chunks are encoded into this one buffer rather than a new one each: an export writes hundreds. */
let scratch = Buffer.alloc(0);
const SCRATCH_LIMIT = 32 << 20;

/** Writes chunks to an open descriptor (stdout, a device, an open file), encoding text as UTF-8. */
export function writeToDescriptor(fd: number, content: FileContent): void {
  for (const chunk of chunksOf(content)) {
    if (typeof chunk !== 'string') {
      writeAll(fd, chunk);
      continue;
    }
    // UTF-8 takes at most three bytes per UTF-16 code unit. A text too large to keep a
    // buffer for (a whole file given as one string) is encoded on its own.
    const room = chunk.length * 3;
    if (room > SCRATCH_LIMIT) writeAll(fd, Buffer.from(chunk, 'utf8'));
    else {
      if (scratch.length < room) scratch = Buffer.allocUnsafe(Math.max(room, 1 << 20));
      writeAll(fd, scratch.subarray(0, scratch.write(chunk, 0, 'utf8')));
    }
  }
}

/** Flushes a folder's entry list, so the rename itself survives a power cut. Not possible everywhere (Windows); then skipped. */
export function syncFolder(folder: string): void {
  let fd: number | undefined;
  try {
    fd = fs.openSync(folder, 'r');
    fs.fsyncSync(fd);
  } catch {
    // The rename is done either way; only its durability across a power cut is at stake.
  } finally {
    if (fd !== undefined) fs.closeSync(fd);
  }
}

/** The new file gets the old one's permissions (the umask would otherwise decide); best effort, as on a file owned by someone else. */
function keepPermissions(fd: number, mode: number): void {
  try {
    fs.fchmodSync(fd, mode & 0o7777);
  } catch {
    // The content matters more than the mode bits; the file is still written.
  }
}

function removeQuietly(file: string): void {
  try {
    // Recursive: a leftover may be a working folder (main/files/work-folder.ts).
    fs.rmSync(file, { force: true, recursive: true });
  } catch {
    // The error that stopped the write is the one to report.
  }
}

/** True unless the process `pid` is known to have ended (a process of another user still counts). */
function processRuns(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code !== 'ESRCH';
  }
}

/**
 * Removes the temporary files (or folders) that writes of one target left in `folder` when
 * their process was killed half way (SIGKILL, a power cut): their names match `pattern`,
 * whose first group is the writer's process id, and that process has ended. A write still
 * under way in another process keeps its file. Best effort: a file that cannot be listed or
 * removed stays.
 */
export function clearLeftovers(folder: string, pattern: RegExp): void {
  let names: string[];
  try {
    names = fs.readdirSync(folder);
  } catch {
    return;
  }
  for (const name of names) {
    const pid = Number(pattern.exec(name)?.[1]);
    if (Number.isSafeInteger(pid) && pid > 0 && !processRuns(pid)) removeQuietly(path.join(folder, name));
  }
}

/**
 * How a temporary file beside `name` names it, given the `extraBytes` the temporary name adds
 * (process id, random part, suffix): `name` itself when it all fits in 255 bytes, otherwise
 * its first whole characters and a hash of the whole name, so a file whose own name fits can
 * always be written. The same `name` always gives the same stem, so leftovers are found again.
 */
export function temporaryStem(name: string, extraBytes: number): string {
  if (Buffer.byteLength(name) + extraBytes <= NAME_MAX_BYTES) return name;
  const hash = createHash('sha256').update(name).digest('hex').slice(0, 16);
  const characters = Array.from(name);
  let bytes = Buffer.byteLength(name);
  while (characters.length > 0 && bytes + 1 + hash.length + extraBytes > NAME_MAX_BYTES) bytes -= Buffer.byteLength(characters.pop()!);
  return `${characters.join('')}~${hash}`;
}

/** `text` matched literally inside a regular expression. */
export const escapeRegExp = (text: string): string => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * Writes `content` to `target` whole or not at all (see the module comment). An existing
 * target keeps its permissions; a symbolic link is followed and the file it points to is
 * replaced. A target that is not a regular file (a terminal, /dev/stdout, a named pipe) is
 * written straight through: there is nothing to replace. Errors from the file system
 * become FileWriteError; an error thrown by the content itself propagates unchanged,
 * after the temporary file is removed.
 */
export function writeFileAtomic(target: string, content: FileContent): void {
  const tooLong = fileNameProblem(target);
  if (tooLong) throw new FileWriteError(`Could not write ${tooLong} No file was written.`, 'ENAMETOOLONG');
  let destination = path.resolve(target);
  let existing: fs.Stats | undefined;
  try {
    existing = fs.statSync(destination);
    destination = fs.realpathSync(destination);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw describe(err as NodeJS.ErrnoException, target, true);
  }
  if (existing?.isDirectory()) throw describe(Object.assign(new Error('is a folder'), { code: 'EISDIR', syscall: 'open' }), target, true);
  const database = exportOverProblem(destination);
  if (database) throw new FileWriteError(`Could not write ${target}: ${database} ${existing ? 'The file that was there is unchanged.' : 'No file was written.'}`, 'EEXIST');

  if (existing && !existing.isFile()) {
    let fd: number;
    try {
      fd = fs.openSync(destination, 'w');
    } catch (err) {
      throw isSystemError(err) ? describe(err, target, true) : err;
    }
    try {
      writeToDescriptor(fd, content);
    } catch (err) {
      throw isSystemError(err) ? describe(err, target, true) : err;
    } finally {
      fs.closeSync(fd);
    }
    return;
  }

  const folder = path.dirname(destination);
  // ".NAME.<pid up to 7 digits>-<8 hex>.partial" adds at most 26 bytes to the name.
  const stem = temporaryStem(path.basename(destination), 26);
  clearLeftovers(folder, new RegExp(`^\\.${escapeRegExp(stem)}\\.(\\d+)-[0-9a-f]{8}\\.partial$`));
  const temporary = path.join(folder, `.${stem}.${process.pid}-${randomBytes(4).toString('hex')}.partial`);
  let fd: number | undefined;
  try {
    fd = fs.openSync(temporary, 'wx', 0o666);
    if (existing) keepPermissions(fd, existing.mode);
    writeToDescriptor(fd, content);
    fs.fsyncSync(fd);
    fs.closeSync(fd);
    fd = undefined;
    fs.renameSync(temporary, destination);
  } catch (err) {
    if (fd !== undefined) fs.closeSync(fd);
    removeQuietly(temporary);
    throw isSystemError(err) ? describe(err, target, existing !== undefined) : err;
  }
  syncFolder(folder);
}
