/**
 * Which file `--db` names: a mistyped path must not quietly become a new empty diary for a
 * command that only reads; commands that add data may start one, and say so. A file that
 * is not a diary is refused and left as it was.
 */
import assert from 'node:assert/strict';
import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { forelog } from '../support/diary-process';
import { tempDir } from '../support/temp-diary';

test('reading commands on a missing diary fail naming the path and create nothing', () => {
  const dir = tempDir();
  const missing = path.join(dir, 'typo', 'diary.sqlite');
  const backup = path.join(dir, 'out', 'copy.sqlite');
  for (const args of [['score'], ['score', '--json'], ['due'], ['export'], ['export', path.join(dir, 'out.json')], ['backup', backup]]) {
    const r = forelog(...args, '--db', missing);
    assert.equal(r.status, 1, args.join(' '));
    assert.equal(r.stderr.trim().split('\n').length, 1, 'one line');
    assert.ok(r.stderr.includes(`There is no diary at ${missing}`), r.stderr);
    assert.match(r.stderr, /nothing was created/);
    assert.equal(r.stdout, '');
  }
  assert.deepEqual(fs.readdirSync(dir), [], 'no file and no folder was made');
  // An empty --db (a variable that was not set) names no file; it was read as the current folder.
  for (const args of [['score', '--db', ''], ['import', path.join(dir, 'x.json'), '--db='], ['due', '--at', '', '--db', missing]]) {
    const r = forelog(...args);
    assert.equal(r.status, 1, args.join(' '));
    const option = args.find((a) => a.startsWith('--') && a !== '--db') ?? '--db';
    assert.equal(r.stderr, `forelog: ${option.replace('=', '')} is given an empty value; write ${option.replace('=', '')} VALUE. See forelog --help.\n`);
  }
  for (const command of ['export', 'backup', 'import', 'restore']) {
    const r = forelog(command, '', '--db', missing);
    assert.equal(r.stderr, 'forelog: an argument is empty (""); give the path of a file. See forelog --help.\n', command);
  }
  assert.deepEqual(fs.readdirSync(dir), [], 'still nothing made');
});

test('reading commands on an empty file refuse it as no diary and leave it as it was, 0 bytes or an empty SQLite file', () => {
  const dir = tempDir();
  const empty = path.join(dir, 'notes.txt');
  fs.writeFileSync(empty, '');
  const blank = path.join(dir, 'blank.sqlite');
  new Database(blank).exec('CREATE TABLE t (x); DROP TABLE t').close(); // a SQLite file with nothing left in it
  const blankBytes = fs.readFileSync(blank);
  for (const [file, bytes] of [[empty, Buffer.alloc(0)], [blank, blankBytes]] as const) {
    for (const args of [['score', '--json'], ['due'], ['export'], ['backup', path.join(dir, 'copy.sqlite')]]) {
      const r = forelog(...args, '--db', file);
      assert.equal(r.status, 1, args.join(' '));
      assert.equal(r.stderr, `forelog: There is no diary at ${file}: the file is empty. Forelog left it unchanged. Check the path (--db).\n`);
      assert.equal(r.stdout, '');
      assert.deepEqual(fs.readFileSync(file), bytes, `${args[0]} left ${path.basename(file)} as it was`);
    }
  }
  assert.deepEqual(fs.readdirSync(dir).sort(), ['blank.sqlite', 'notes.txt'], 'no copy, -wal or -shm was made');
});

test('commands that add data may start a new diary, and say so on stderr', () => {
  const dir = tempDir();
  const seed = path.join(dir, 'seed.json');
  fs.writeFileSync(seed, JSON.stringify({ format: 'forelog-diary', version: 1, questions: [{ title: 'First call', closes_at: '2027-01-01T00:00:00Z', forecasts: [] }] }));

  const imported = path.join(dir, 'new', 'imported.sqlite');
  // What an import killed half way through a new diary leaves (its process, 4,194,303, has ended):
  // the next new diary in that folder clears it.
  fs.mkdirSync(path.join(dir, 'new'));
  for (const suffix of ['', '-wal', '-shm']) fs.writeFileSync(path.join(dir, 'new', `.forelog-new-4194303-0badf00d.sqlite${suffix}`), 'left');
  const first = forelog('import', seed, '--db', imported);
  assert.equal(first.status, 0, first.stderr);
  assert.equal(first.stderr, `Created a new diary at ${imported}.\n`);
  assert.deepEqual(fs.readdirSync(path.join(dir, 'new')), ['imported.sqlite'], 'only the diary: no temporary copy, old or new');
  const again = forelog('import', seed, '--db', imported);
  assert.equal(again.status, 0, again.stderr);
  assert.equal(again.stderr, '', 'an existing diary is not announced');

  const demo = path.join(dir, 'demo.sqlite');
  const d = forelog('demo', '--db', demo);
  assert.equal(d.status, 0, d.stderr);
  assert.equal(d.stderr, `Created a new diary at ${demo}.\n`);

  const copy = path.join(dir, 'copy.sqlite');
  assert.equal(forelog('backup', copy, '--db', imported).status, 0);
  const restored = path.join(dir, 'restored.sqlite');
  const r = forelog('restore', copy, '--db', restored);
  assert.equal(r.status, 0, r.stderr);
  assert.equal(r.stderr, `Created a new diary at ${restored}.\n`);
  assert.doesNotMatch(r.stdout, /kept at/, 'no safety copy of a diary that did not exist');
  assert.match(forelog('export', '--db', restored).stdout, /First call/);
});

test('a file that is not a diary is refused with a clear message and left unchanged', () => {
  const dir = tempDir();
  const readme = path.join(dir, 'README.md');
  fs.writeFileSync(readme, '# Notes\n\nNot a diary at all, but long enough to be mistaken for a file of pages.\n'.repeat(20));
  const before = fs.readFileSync(readme);
  for (const args of [['export'], ['score'], ['import', readme], ['demo']]) {
    const r = forelog(...args, '--db', readme);
    assert.equal(r.status, 1, args.join(' '));
    assert.equal(r.stderr, `forelog: ${readme} is not a Forelog diary (it is not a SQLite database), so Forelog left it unchanged. Check the path (--db).\n`);
  }
  assert.deepEqual(fs.readFileSync(readme), before);
  assert.deepEqual(fs.readdirSync(dir), ['README.md'], 'no -wal or -shm beside it');

  // A SQLite database of some other program is not taken over either.
  const other = path.join(dir, 'other.sqlite');
  const db = new Database(other);
  db.exec("CREATE TABLE contacts (name TEXT); INSERT INTO contacts VALUES ('someone')");
  db.close();
  const otherBefore = fs.readFileSync(other);
  const r = forelog('demo', '--db', other);
  assert.equal(r.status, 1);
  assert.match(r.stderr, /is a SQLite database of some other program, not a Forelog diary, so Forelog left it unchanged/);
  assert.deepEqual(fs.readFileSync(other), otherBefore);

  const folder = forelog('export', '--db', dir);
  assert.equal(folder.status, 1);
  assert.match(folder.stderr, /is a folder, not a diary file/);

  // A device or a named pipe is no diary either: refused at once, in those words, not as a disk failure.
  const devices = [...(fs.existsSync('/dev/null') ? [['/dev/null', 'a device']] : [])];
  const pipe = path.join(dir, 'pipe.sqlite');
  if (process.platform !== 'win32' && spawnSync('mkfifo', [pipe]).status === 0) devices.push([pipe, 'a named pipe']);
  const emptyFile = path.join(dir, 'empty.json');
  fs.writeFileSync(emptyFile, '{"format":"forelog-diary","version":1,"questions":[]}');
  for (const [file, what] of devices) {
    for (const args of [['score'], ['import', emptyFile]]) {
      const r = forelog(...args, '--db', file!);
      assert.equal(r.status, 1, `${args[0]} --db ${file}`);
      assert.equal(r.stderr, `forelog: ${file} is not a regular file (it is ${what}), not a diary file. Check the path (--db).\n`);
    }
  }
});
