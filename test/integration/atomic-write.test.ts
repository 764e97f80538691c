/**
 * Files are written whole or not at all (main/files/atomic-write.ts): whatever stops a
 * write half way — the content failing, the disk refusing more bytes — the file that was
 * there is left exactly as it was and no temporary file is left beside it.
 */
import assert from 'node:assert/strict';
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { FileWriteError, writeFileAtomic } from '../../main/files/atomic-write';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');
const OLD = '{"format":"forelog-diary","version":1,"questions":[]}\n';

test('a string, bytes, or chunks of either are written exactly, and nothing else is left in the folder', () => {
  const dir = tempDir();
  const file = path.join(dir, 'diary.json');
  writeFileAtomic(file, 'Zürich ≥ ½\n');
  assert.equal(fs.readFileSync(file, 'utf8'), 'Zürich ≥ ½\n');
  writeFileAtomic(file, ['a,', new TextEncoder().encode('b,'), '', 'ü\r\n']);
  assert.equal(fs.readFileSync(file, 'utf8'), 'a,b,ü\r\n');
  writeFileAtomic(file, Uint8Array.of(0x25, 0x50, 0x44, 0x46));
  assert.equal(fs.readFileSync(file, 'latin1'), '%PDF');
  // A whole file given as one large string, of three-byte characters.
  const large = '€'.repeat(11_500_000);
  writeFileAtomic(file, ['(', large, ')']);
  assert.equal(fs.readFileSync(file, 'utf8'), `(${large})`);
  assert.deepEqual(fs.readdirSync(dir), ['diary.json']);
});

test('a chunk source that fails half way leaves the old file intact and no temporary file', () => {
  const dir = tempDir();
  const file = path.join(dir, 'diary.json');
  fs.writeFileSync(file, OLD);
  const failure = new Error('the diary could not be read');
  function* chunks() {
    yield '{"format":"forelog-diary",';
    yield 'x'.repeat(3 << 20);
    throw failure;
  }
  assert.throws(() => writeFileAtomic(file, chunks()), (err) => err === failure, 'the source’s own error comes through unchanged');
  assert.equal(fs.readFileSync(file, 'utf8'), OLD);
  assert.deepEqual(fs.readdirSync(dir), ['diary.json']);

  // Into a folder with no file yet: nothing appears.
  const fresh = path.join(dir, 'new.csv');
  assert.throws(() => writeFileAtomic(fresh, chunks()), (err) => err === failure);
  assert.deepEqual(fs.readdirSync(dir), ['diary.json']);
});

test('when the system refuses more bytes mid-write (file size limit), the old file is intact and no temporary file is left', () => {
  // `ulimit -f 8` lets a process write 8 KiB per file; the next write fails with EFBIG
  // after part of the data is on disk — a real failure half way, like a full disk.
  const dir = tempDir();
  const file = path.join(dir, 'diary.json');
  fs.writeFileSync(file, OLD);
  const script = `
    import { writeFileAtomic } from ${JSON.stringify(path.join(ROOT, 'main', 'files', 'atomic-write.ts'))};
    try { writeFileAtomic(process.argv[1], 'y'.repeat(64 * 1024)); console.log('written'); }
    catch (err) { console.log(err.name + ': ' + err.message); }`;
  const r = spawnSync('bash', ['-c', 'ulimit -f 8 && exec "$0" --import tsx --input-type=module -e "$1" "$2"', process.execPath, script, file], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  assert.equal(r.status, 0, r.stderr);
  assert.equal(
    r.stdout.trim(),
    `FileWriteError: Could not write ${file}: the file is larger than this system allows files to be; choose another disk (EFBIG). The file that was there is unchanged.`,
  );
  assert.equal(fs.readFileSync(file, 'utf8'), OLD);
  assert.deepEqual(fs.readdirSync(dir), ['diary.json']);
});

test('the temporary file of a write killed half way (SIGKILL) is cleared by the next write of that file; one still being written is not', async () => {
  const dir = tempDir();
  const file = path.join(dir, 'diary.json');
  fs.writeFileSync(file, OLD);
  // A writer that stalls after its first chunk, so it is killed with its temporary file on disk.
  const script = `
    import { writeFileAtomic } from ${JSON.stringify(path.join(ROOT, 'main', 'files', 'atomic-write.ts'))};
    writeFileAtomic(process.argv[1], (function* () { yield 'x'.repeat(1 << 20); console.log('started'); Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 60000); yield 'never'; })());`;
  const stalled = () => {
    const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script, file], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] });
    return new Promise<typeof child>((resolve) => child.stdout!.once('data', () => resolve(child)));
  };
  const killed = await stalled();
  const exited = new Promise((resolve) => killed.once('exit', resolve));
  killed.kill('SIGKILL');
  await exited;
  assert.equal(fs.readdirSync(dir).length, 2, 'the killed write left its temporary file (and the old file intact)');
  assert.equal(fs.readFileSync(file, 'utf8'), OLD);

  const running = await stalled();
  try {
    const live = fs.readdirSync(dir).filter((name) => name.includes(`.${running.pid}-`));
    assert.equal(live.length, 1);
    writeFileAtomic(file, 'new\n');
    assert.equal(fs.readFileSync(file, 'utf8'), 'new\n');
    assert.deepEqual(fs.readdirSync(dir).sort(), [...live, 'diary.json'].sort(), 'only the live writer’s file is left');
  } finally {
    running.kill('SIGKILL');
  }
});

test('the replaced file keeps its permissions; a symbolic link keeps pointing at the new content', () => {
  const dir = tempDir();
  const file = path.join(dir, 'private.json');
  fs.writeFileSync(file, OLD, { mode: 0o600 });
  fs.chmodSync(file, 0o600);
  writeFileAtomic(file, '{}\n');
  assert.equal(fs.statSync(file).mode & 0o777, 0o600);

  const link = path.join(dir, 'latest.json');
  fs.symlinkSync(file, link);
  writeFileAtomic(link, 'new\n');
  assert.ok(fs.lstatSync(link).isSymbolicLink(), 'the link is still a link');
  assert.equal(fs.readFileSync(file, 'utf8'), 'new\n');
  assert.deepEqual(fs.readdirSync(dir).sort(), ['latest.json', 'private.json']);
});

test('a missing folder or a folder as the target is refused with what to do; a device is written straight through', () => {
  const dir = tempDir();
  assert.throws(
    () => writeFileAtomic(path.join(dir, 'missing', 'd.json'), OLD),
    (err: unknown) =>
      err instanceof FileWriteError &&
      err.code === 'ENOENT' &&
      err.message === `Could not write ${path.join(dir, 'missing', 'd.json')}: the folder ${path.join(dir, 'missing')} does not exist; create it or choose another (ENOENT). No file was written.`,
  );
  assert.throws(() => writeFileAtomic(dir, OLD), (err: unknown) => err instanceof FileWriteError && err.code === 'EISDIR' && /that is a folder; give a file name/.test(err.message));
  assert.deepEqual(fs.readdirSync(dir), []);
  writeFileAtomic('/dev/null', OLD);
  assert.ok(fs.statSync('/dev/null').isCharacterDevice(), '/dev/null was written to, not replaced');
});

test('a file whose name is as long as the file system allows (up to 255 bytes) is written; the temporary file’s name is shortened to fit', () => {
  const dir = tempDir();
  // 251 bytes of name with two-byte characters in it: the temporary name shortens by whole characters.
  const name = `${'é'.repeat(20)}${'n'.repeat(206)}.json`;
  assert.equal(Buffer.byteLength(name), 251);
  const file = path.join(dir, name);
  writeFileAtomic(file, OLD);
  writeFileAtomic(file, 'new\n');
  assert.equal(fs.readFileSync(file, 'utf8'), 'new\n');
  assert.deepEqual(fs.readdirSync(dir), [name], 'nothing else is left in the folder');
});
