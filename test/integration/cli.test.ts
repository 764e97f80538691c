/**
 * The `forelog` command line (INTERFACES.md §2) run as a user runs it, on real diary
 * files: import is all-or-nothing, export → import → export is identical, backup and
 * restore round-trip, and failures exit non-zero with one line on stderr.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { randomDiaryFile } from '../support/random-diary';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

function forelog(...args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], {
    timeout: 60_000,
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, TZ: 'UTC' },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

function diaryFile(questions: unknown[]): string {
  return JSON.stringify({
    format: 'forelog-diary',
    version: 1,
    settings: { default_false_alarm_cost: 1, default_miss_cost: 4, default_checkin_days: 7, closing_soon_hours: 24, overdue_after_days: 3, time_zone: 'Europe/London' },
    questions,
  });
}

const good = (n: number) => ({
  id: `q${n}`,
  title: `Question ${n}`,
  rule: 'Yes if it happens.',
  kind: 'event_by_deadline',
  tags: ['client:northgate'],
  opened_at: '2026-01-05T09:00:00Z',
  closes_at: '2026-03-31T17:00:00+01:00',
  forecasts: [{ at: '2026-01-05T09:05:00Z', p: 0.4, note: 'first' }],
});

test('import is all-or-nothing: a bad record in the middle names itself and leaves the diary as it was', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  const seed = path.join(dir, 'seed.json');
  fs.writeFileSync(seed, diaryFile([good(1)]));
  assert.equal(forelog('import', seed, '--db', db).status, 0);
  const before = forelog('export', '--db', db).stdout;

  const bad = path.join(dir, 'bad.json');
  const broken = { ...good(3), forecasts: [{ at: '2026-01-05T09:05:00Z', p: 1.7 }] };
  fs.writeFileSync(bad, diaryFile([good(2), broken, good(4)]));
  const r = forelog('import', bad, '--db', db);
  assert.equal(r.status, 1);
  assert.equal(r.stderr.trim().split('\n').length, 1, 'one line on stderr');
  assert.match(r.stderr, /Question 2 \(questions\[1\], “Question 3”\) is not valid: field forecasts\[0\]\.p: must be a probability between 0 and 1/);
  assert.equal(forelog('export', '--db', db).stdout, before, 'content unchanged');
});

test('export → import → export is identical', () => {
  const dir = tempDir();
  const a = path.join(dir, 'a.sqlite');
  const b = path.join(dir, 'b.sqlite');
  assert.equal(forelog('demo', '--db', a).status, 0);
  const first = path.join(dir, 'first.json');
  assert.equal(forelog('export', first, '--db', a).status, 0);
  const imported = forelog('import', first, '--db', b);
  assert.equal(imported.status, 0, imported.stderr);
  const second = forelog('export', '--db', b).stdout;
  assert.equal(second, fs.readFileSync(first, 'utf8'));
  const parsed = JSON.parse(second);
  assert.equal(parsed.format, 'forelog-diary');
  assert.equal(parsed.version, 1);
  assert.ok(parsed.questions.length >= 24);
});

test('export FILE without --format writes what the name says, like import reads it: diary.csv is CSV and imports again', () => {
  const dir = tempDir();
  const a = path.join(dir, 'a.sqlite');
  const b = path.join(dir, 'b.sqlite');
  assert.equal(forelog('demo', '--db', a).status, 0);
  const csv = path.join(dir, 'diary.CSV');
  assert.equal(forelog('export', csv, '--db', a).status, 0);
  assert.equal(fs.readFileSync(csv, 'utf8'), forelog('export', '--format', 'csv', '--db', a).stdout);
  const imported = forelog('import', csv, '--db', b);
  assert.equal(imported.status, 0, imported.stderr);
  assert.equal(forelog('export', '--format', 'csv', '--db', b).stdout, fs.readFileSync(csv, 'utf8'));
  const ics = path.join(dir, 'diary.ics');
  assert.equal(forelog('export', ics, '--db', a).status, 0);
  assert.match(fs.readFileSync(ics, 'utf8'), /^BEGIN:VCALENDAR/);
  const other = path.join(dir, 'diary.txt');
  assert.equal(forelog('export', other, '--db', a).status, 0);
  assert.equal(JSON.parse(fs.readFileSync(other, 'utf8')).format, 'forelog-diary');
  const forced = path.join(dir, 'forced.csv');
  assert.equal(forelog('export', forced, '--format', 'json', '--db', a).status, 0);
  assert.equal(JSON.parse(fs.readFileSync(forced, 'utf8')).format, 'forelog-diary', '--format still decides');
});

test('export --format csv and ics: one row per revision; one calendar event per open question', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const diary = JSON.parse(forelog('export', '--db', db).stdout);
  const revisions = diary.questions.reduce((n: number, q: { forecasts: unknown[]; references: unknown[] }) => n + q.forecasts.length + q.references.length, 0);
  const csv = forelog('export', '--format', 'csv', '--db', db);
  assert.equal(csv.status, 0, csv.stderr);
  assert.ok(csv.stdout.startsWith('question_id,title,rule,kind,tags,'));
  // RFC 4180: records end in CRLF; quoted fields may hold line breaks, so count records by parsing.
  const ics = forelog('export', '--format', 'ics', '--db', db);
  assert.equal(ics.status, 0, ics.stderr);
  const open = diary.questions.filter((q: { resolution: unknown }) => !q.resolution).length;
  assert.equal(ics.stdout.match(/^BEGIN:VEVENT\r$/gm)?.length, open);
  assert.match(ics.stdout, /^BEGIN:VCALENDAR\r\nVERSION:2\.0\r\n/);
  assert.ok(revisions > 0);
  const back = path.join(tempDir(), 'back.sqlite');
  const file = path.join(tempDir(), 'diary.csv');
  fs.writeFileSync(file, csv.stdout);
  const imported = forelog('import', file, '--db', back);
  assert.equal(imported.status, 0, imported.stderr);
  assert.match(imported.stdout, new RegExp(`Imported ${diary.questions.length} questions`));
});

test('demo fills only an empty diary', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  const r = forelog('demo', '--db', db);
  assert.equal(r.status, 0, r.stderr);
  assert.match(r.stdout, /Added the example diary: \d+ invented questions/);
  const again = forelog('demo', '--db', db);
  assert.equal(again.status, 1);
  assert.match(again.stderr, /only be loaded into an empty diary/);
});

test('score without --json prints the headline scores with their 95 % intervals, as the Scorecard does', () => {
  const dir = tempDir();
  const file = path.join(dir, 'three.json');
  const q = (id: string, p: number, outcome: 'yes' | 'no') => ({
    id,
    title: `Question ${id}`,
    opened_at: '2026-01-05T09:00:00Z',
    closes_at: '2026-03-31T17:00:00Z',
    forecasts: [{ at: '2026-01-06T09:00:00Z', p }],
    resolution: { outcome, at: '2026-03-31T17:00:00Z' },
  });
  fs.writeFileSync(file, JSON.stringify({ format: 'forelog-diary', version: 1, questions: [q('a', 0.9, 'yes'), q('b', 0.7, 'yes'), q('c', 0.4, 'no')] }));
  const db = path.join(dir, 'd.sqlite');
  assert.equal(forelog('import', file, '--db', db).status, 0);
  const r = forelog('score', '--db', db);
  assert.equal(r.status, 0, r.stderr);
  // Worked by hand (mean ± 1.96·s/√n, s the sample standard deviation; common practice, see
  // docs/scoring.md): Brier scores 0.01, 0.09, 0.16 → 0.0867 ± 0.0849; log scores −ln 0.9,
  // −ln 0.7, −ln 0.6 → 0.3243 ± 0.2316.
  assert.match(r.stdout, /Brier score \(final\) +0\.087 +0 perfect · 0\.25 always 50% · 95% interval 0\.002–0\.172\n/);
  assert.match(r.stdout, /Log score +0\.324 +natural log · 95% interval 0\.093–0\.556\n/);
});

test('backup and restore round-trip, keeping a safety copy of the replaced diary', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  const seed = path.join(dir, 'seed.json');
  fs.writeFileSync(seed, diaryFile([good(1), good(2)]));
  forelog('import', seed, '--db', db);
  const copy = path.join(dir, 'copy.sqlite');
  const b = forelog('backup', copy, '--db', db);
  assert.equal(b.status, 0, b.stderr);
  assert.match(b.stdout, /2 questions/);
  const snapshot = forelog('export', '--db', db).stdout;

  fs.writeFileSync(seed, diaryFile([good(3)]));
  forelog('import', seed, '--db', db);
  assert.notEqual(forelog('export', '--db', db).stdout, snapshot);

  const r = forelog('restore', copy, '--db', db);
  assert.equal(r.status, 0, r.stderr);
  assert.match(r.stdout, /Restored 2 questions/);
  assert.equal(forelog('export', '--db', db).stdout, snapshot);
  const safety = /kept at (.+\.sqlite)\./.exec(r.stdout)?.[1];
  assert.ok(safety && fs.existsSync(safety), 'the replaced diary is kept');

  const notADiary = path.join(dir, 'x.sqlite');
  fs.writeFileSync(notADiary, 'hello');
  const refused = forelog('restore', notADiary, '--db', db);
  assert.equal(refused.status, 1);
  assert.match(refused.stderr, /not a Forelog diary/);
  assert.equal(forelog('export', '--db', db).stdout, snapshot);
});

test('failures exit non-zero with one line: unknown command, missing file, not a diary file', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  for (const args of [['frobnicate'], ['import', '/no/such/file.json'], ['export', '--format', 'xml']]) {
    const r = forelog(...args, '--db', db);
    assert.equal(r.status, 1, args.join(' '));
    assert.equal(r.stderr.trim().split('\n').length, 1);
    assert.match(r.stderr, /^forelog: /);
  }
  const file = path.join(tempDir(), 'other.json');
  fs.writeFileSync(file, JSON.stringify({ format: 'something-else', version: 1, questions: [] }));
  const r = forelog('import', file, '--db', db);
  assert.equal(r.status, 1);
  assert.match(r.stderr, /not a Forelog diary file/);
});

test('a mistyped command or option names the one probably meant; a word close to none, or to two, gets no guess', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  const cases: [string[], string][] = [
    [['scor'], 'forelog: unknown command "scor" (did you mean "score"?). See forelog --help.'],
    [['Export'], 'forelog: unknown command "Export" (did you mean "export"?). See forelog --help.'],
    [['imoprt', 'x.json'], 'forelog: unknown command "imoprt" (did you mean "import"?). See forelog --help.'],
    [['frobnicate'], 'forelog: unknown command "frobnicate". See forelog --help.'],
    [['score', '--jsno'], 'forelog: there is no option --jsno (did you mean --json?). See forelog --help.'],
    [['due', '--at=2026-01-01', '--jason'], 'forelog: there is no option --jason (did you mean --json?). See forelog --help.'],
    // Two letters from both --at and --db, and a two-letter name is too short to guess from.
    [['score', '--ab'], 'forelog: there is no option --ab. See forelog --help.'],
  ];
  for (const [args, line] of cases) {
    const r = forelog(...args, '--db', db);
    assert.equal(r.status, 1, args.join(' '));
    assert.equal(r.stderr, `${line}\n`, args.join(' '));
  }
  assert.equal(fs.existsSync(db), false, 'no diary was created');
});

test('--version prints the version from package.json and touches no diary; with a command it is refused', () => {
  const { version } = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { version: string };
  const db = path.join(tempDir(), 'd.sqlite');
  for (const flag of ['--version', '-V']) {
    const r = forelog(flag, '--db', db);
    assert.equal(r.status, 0, flag);
    assert.equal(r.stdout, `forelog ${version}\n`);
  }
  assert.equal(fs.existsSync(db), false, 'no diary was created');
  const r = forelog('score', '--version', '--db', db);
  assert.equal(r.status, 1);
  assert.match(r.stderr, /^forelog: --version takes no command\. See forelog --help\.\n$/);
});

/** `forelog …args` in a shell whose processes may write at most `kib` KiB per file (`ulimit -f`). */
function forelogLimited(kib: number, ...args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync('bash', ['-c', `ulimit -f ${kib} && exec "$0" "$@"`, process.execPath, '--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, TZ: 'UTC' },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

test('export FILE is written whole or not at all: when the system refuses more bytes half way, the old file stays and nothing else appears', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  const seed = path.join(dir, 'seed.json');
  fs.writeFileSync(seed, JSON.stringify(randomDiaryFile(1000, 4)));
  assert.equal(forelog('import', seed, '--db', db).status, 0);
  const out = path.join(dir, 'out');
  fs.mkdirSync(out);
  const target = path.join(out, 'diary.json');
  assert.equal(forelog('export', target, '--db', db).status, 0);
  const old = fs.readFileSync(target);
  assert.ok(forelog('export', '--format', 'csv', '--db', db).stdout.length > 512 * 1024, 'both exports are larger than the limit below');
  fs.writeFileSync(seed, diaryFile([good(1)]));
  assert.equal(forelog('import', seed, '--db', db).status, 0);

  for (const format of ['json', 'csv']) {
    const r = forelogLimited(512, 'export', target, '--format', format, '--db', db);
    assert.equal(r.status, 1, r.stderr);
    assert.equal(
      r.stderr,
      `forelog: Could not write ${target}: the file is larger than this system allows files to be; choose another disk (EFBIG). The file that was there is unchanged.\n`,
    );
    assert.ok(fs.readFileSync(target).equals(old), `${format}: the old export is intact`);
    assert.deepEqual(fs.readdirSync(out), ['diary.json'], `${format}: no temporary file is left`);
  }
});

test('import reads files as people have them: UTF-8 with a BOM, UTF-16; a Latin-1 file is refused at its line and column', () => {
  const dir = tempDir();
  const json = diaryFile([{ ...good(1), title: 'Zürich ≥ ½' }]);
  const csv = 'title,closes_at,forecast_at,p\r\nCafé opens,2027-01-01T00:00:00Z,2026-01-01T00:00:00Z,0.4\r\n';
  const cases: [string, Buffer][] = [
    ['bom.json', Buffer.concat([Buffer.of(0xef, 0xbb, 0xbf), Buffer.from(json)])],
    ['le.json', Buffer.from(`\ufeff${json}`, 'utf16le')],
    ['be.csv', Buffer.from(`\ufeff${csv}`, 'utf16le').swap16()],
  ];
  for (const [name, bytes] of cases) {
    const file = path.join(dir, name);
    fs.writeFileSync(file, bytes);
    const r = forelog('import', file, '--db', path.join(dir, `${name}.sqlite`));
    assert.equal(r.status, 0, `${name}: ${r.stderr}`);
    assert.match(r.stdout, /^Imported 1 question into /);
  }
  assert.match(forelog('export', '--db', path.join(dir, 'le.json.sqlite')).stdout, /"title": "Zürich ≥ ½"/);
  assert.match(forelog('export', '--format', 'csv', '--db', path.join(dir, 'be.csv.sqlite')).stdout, /\r\nq?[^,]*,Café opens,/);

  const latin1 = path.join(dir, 'latin1.csv');
  fs.writeFileSync(latin1, Buffer.from(csv, 'latin1'));
  const db = path.join(dir, 'latin1.sqlite');
  const r = forelog('import', latin1, '--db', db);
  assert.equal(r.status, 1);
  assert.equal(
    r.stderr,
    'forelog: This file is not UTF-8 text: at line 2, column 4 (byte offset 34) it holds the byte 0xE9, which UTF-8 does not allow there. It was probably saved in another encoding (such as Windows-1252 or Latin-1). Save the file as UTF-8 (in a spreadsheet: "CSV UTF-8") and try again. Nothing was imported.\n',
  );
  assert.equal(fs.existsSync(db), false, 'the diary made for the refused import is not left behind');
});

test('import reads a file larger than the app’s 64 MB request cap (the command line has no limit)', () => {
  const dir = tempDir();
  const file = path.join(dir, 'large.json');
  // 3,500 revisions with 20,000-character notes (the longest a note may be): about 70 MB.
  const note = 'Notes from the steering meeting. '.repeat(607).slice(0, 20_000);
  const fd = fs.openSync(file, 'w');
  fs.writeSync(fd, '{"format":"forelog-diary","version":1,"questions":[');
  for (let q = 0; q < 35; q++) {
    const forecasts = Array.from({ length: 100 }, (_, i) => ({ at: new Date(Date.UTC(2026, 0, 1) + (q * 100 + i) * 60_000).toISOString(), p: i / 100, note }));
    fs.writeSync(fd, `${q ? ',' : ''}${JSON.stringify({ id: `large-${q}`, title: `Large ${q}`, closes_at: '2027-01-01T00:00:00Z', forecasts })}`);
  }
  fs.writeSync(fd, ']}');
  fs.closeSync(fd);
  assert.ok(fs.statSync(file).size > 64 * 1_048_576);
  const db = path.join(dir, 'd.sqlite');
  const r = forelog('import', file, '--db', db);
  assert.equal(r.status, 0, r.stderr);
  assert.match(r.stdout, /^Imported 35 questions into /);
  const exported = path.join(dir, 'back.json');
  assert.equal(forelog('export', exported, '--db', db).status, 0);
  assert.ok(fs.statSync(exported).size > 64 * 1_048_576);
});

test('import and export show their progress at a terminal, and nothing extra when a script reads their output', () => {
  const dir = tempDir();
  const file = path.join(dir, 'progress.json');
  // About 3 MB, so the file is read in several chunks.
  const note = 'Read across the quarter. '.repeat(40);
  fs.writeFileSync(file, diaryFile(Array.from({ length: 3000 }, (_, n) => ({ ...good(n), forecasts: [{ at: '2026-01-05T09:05:00Z', p: 0.4, note }] }))));
  assert.ok(fs.statSync(file).size > 2 * 1_048_576);
  const piped = forelog('import', file, '--db', path.join(dir, 'a.sqlite'));
  assert.equal(piped.status, 0, piped.stderr);
  assert.doesNotMatch(piped.stderr, /Importing/, 'no progress line in a pipe');
  // A terminal: util-linux `script` runs the command on a pseudo-terminal (stdout and stderr both go there).
  const command = [process.execPath, '--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), 'import', file, '--db', path.join(dir, 'b.sqlite')]
    .map((a) => `'${a.replaceAll("'", "'\\''")}'`)
    .join(' ');
  const tty = spawnSync('script', ['-qec', command, '/dev/null'], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, TZ: 'UTC' } });
  assert.equal(tty.status, 0, tty.stdout + tty.stderr);
  const percents = [...tty.stdout.matchAll(/Importing [^\r]*… (\d+) %/g)].map((m) => Number(m[1]));
  assert.ok(percents.length >= 2, `several progress steps: ${JSON.stringify(tty.stdout.slice(0, 300))}`);
  assert.deepEqual([...percents].sort((a, b) => a - b), percents, 'the percentage only grows');
  assert.equal(percents.at(-1), 100);
  assert.match(tty.stdout, /100 % — saving/);
  assert.match(tty.stdout, /\x1b\[KImported 3000 questions into /, 'the progress line is cleared before the result');

  // Export to a file likewise, by questions written; the bytes are those of an export in a pipe.
  const [atTerminal, inPipe] = [path.join(dir, 'at-terminal.json'), path.join(dir, 'in-pipe.json')];
  const exportCommand = [process.execPath, '--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), 'export', atTerminal, '--db', path.join(dir, 'b.sqlite')]
    .map((a) => `'${a.replaceAll("'", "'\\''")}'`)
    .join(' ');
  const ttyExport = spawnSync('script', ['-qec', exportCommand, '/dev/null'], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, TZ: 'UTC' } });
  assert.equal(ttyExport.status, 0, ttyExport.stdout);
  assert.match(ttyExport.stdout, /Exporting to [^\r]*… 100 % — saving\r\x1b\[KWrote /);
  const pipedExport = forelog('export', inPipe, '--db', path.join(dir, 'b.sqlite'));
  assert.equal(pipedExport.status, 0, pipedExport.stderr);
  assert.doesNotMatch(pipedExport.stderr, /Exporting/);
  assert.ok(fs.readFileSync(atTerminal).equals(fs.readFileSync(inPipe)));
});

test('export to a reader that stops early (| head) ends quietly', () => {
  const db = path.join(tempDir(), 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const r = spawnSync('bash', ['-c', 'set -o pipefail; "$0" --import tsx "$1" export --format csv --db "$2" | head -c 10', process.execPath, path.join(ROOT, 'main', 'cli.ts'), db], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  assert.equal(r.stdout, 'question_i');
  assert.equal(r.stderr, '');
  assert.equal(r.status, 0);
});

test('score: costs too large to add up are null in --json and say so in the summary; large costs and counts are digit-grouped', () => {
  const dir = tempDir();
  const resolved = (n: number, outcome: 'yes' | 'no', miss: number) => ({
    ...good(n),
    costs: { false_alarm: 1_234_567, miss },
    resolution: { outcome, at: '2026-03-01T12:00:00Z', note: '' },
  });
  // Two Yes questions whose miss costs are each near the largest double: never acting costs
  // more than a double holds (1e308 + 1e308 is Infinity), which JSON cannot write.
  const huge = path.join(dir, 'huge.sqlite');
  const hugeFile = path.join(dir, 'huge.json');
  fs.writeFileSync(hugeFile, diaryFile([resolved(1, 'yes', 1e308), resolved(2, 'yes', 1e308), resolved(3, 'no', 1e308)]));
  assert.equal(forelog('import', hugeFile, '--db', huge).status, 0);
  const json = forelog('score', '--json', '--db', huge);
  assert.equal(json.status, 0, json.stderr);
  const decisions = JSON.parse(json.stdout).decisions;
  assert.equal(decisions.cost_never, null, 'an overflowing total is null, not a number JSON turned into null by accident');
  assert.equal(decisions.cost_always, 1_234_567);
  const text = forelog('score', '--db', huge);
  assert.equal(text.status, 0, text.stderr);
  assert.doesNotMatch(text.stdout, /Infinity|NaN/);
  assert.match(text.stdout, /never too large to add up/);
  assert.match(text.stdout, /always act 1,234,567\.00/);
});

test('an option given twice, a --port that is not plain digits, and a bare date for --at are refused with what to write instead', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const twice = forelog('score', '--tag', 'renewals', '--tag', 'delivery', '--db', db);
  assert.equal(twice.status, 1);
  assert.equal(twice.stdout, '');
  assert.match(twice.stderr, /^forelog: --tag is given twice/);
  assert.equal(twice.stderr.trim().split('\n').length, 1);
  const otherDb = forelog('score', '--db', db, '--db', path.join(dir, 'other.sqlite'));
  assert.equal(otherDb.status, 1);
  assert.match(otherDb.stderr, /--db is given twice/);
  assert.equal(fs.existsSync(path.join(dir, 'other.sqlite')), false);
  for (const port of ['1e3', '0x50', ' 80', '', '+80', '80.0']) {
    const r = forelog('serve', '--port', port, '--db', db);
    assert.equal(r.status, 1, `--port "${port}" must be refused, not served: ${r.stdout}`);
    // An empty value is refused as such, like every option's (an unset variable).
    assert.match(r.stderr, port === '' ? /^forelog: --port is given an empty value; write --port VALUE/ : /^forelog: --port must be a whole number from 0 to 65535/);
  }
  const bare = forelog('due', '--at', '2026-01-01', '--db', db);
  assert.equal(bare.status, 1);
  assert.match(bare.stderr, /^forelog: --at takes a time, not a bare date/);
});

test('an export that cannot be written because its output is full blames the output, not the diary', { skip: !fs.existsSync('/dev/full') && 'needs /dev/full' }, () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const before = forelog('export', '--db', db).stdout;
  // A file on a full disk: /dev/full refuses every write with ENOSPC.
  const toFile = forelog('export', '/dev/full', '--db', db);
  assert.equal(toFile.status, 1);
  assert.match(toFile.stderr, /^forelog: Could not write \/dev\/full: the disk is full/);
  assert.doesNotMatch(toFile.stderr, /disk holding the diary/);
  // Standard output redirected to a full disk.
  const full = fs.openSync('/dev/full', 'w');
  try {
    const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), 'export', '--db', db], {
      cwd: ROOT,
      encoding: 'utf8',
      stdio: ['ignore', full, 'pipe'],
    });
    assert.equal(r.status, 1);
    assert.match(r.stderr, /^forelog: Could not write to standard output: the disk is full/);
    assert.doesNotMatch(r.stderr, /disk holding the diary/);
    assert.equal(r.stderr.trim().split('\n').length, 1);
  } finally {
    fs.closeSync(full);
  }
  assert.equal(forelog('export', '--db', db).stdout, before, 'the diary is unchanged');
  // score and due print their result: when it cannot be written, they fail rather than report success.
  for (const args of [['score'], ['score', '--json'], ['due', '--at', '2026-12-01T09:00Z'], ['due', '--json']]) {
    const out = fs.openSync('/dev/full', 'w');
    try {
      const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args, '--db', db], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', out, 'pipe'] });
      assert.equal(r.status, 1, `${args.join(' ')}: ${r.stderr}`);
      assert.match(r.stderr, /^forelog: Could not write to standard output: the disk is full/);
    } finally {
      fs.closeSync(out);
    }
  }
});

test('restore from a folder or a pipe names the backup path, not the diary, and leaves the diary as it was', { skip: process.platform === 'win32' && 'no named pipes' }, () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const before = forelog('export', '--db', db).stdout;
  const folder = path.join(dir, 'copies');
  fs.mkdirSync(folder);
  const fromFolder = forelog('restore', folder, '--db', db);
  assert.equal(fromFolder.status, 1);
  assert.equal(fromFolder.stderr, `forelog: ${folder} is a folder, not a backup copy; give the path of a backup file. Nothing was restored.\n`);
  const pipe = path.join(dir, 'pipe.sqlite');
  assert.equal(spawnSync('mkfifo', [pipe]).status, 0);
  const fromPipe = forelog('restore', pipe, '--db', db);
  assert.equal(fromPipe.status, 1, 'refused at once rather than waiting on the pipe');
  assert.match(fromPipe.stderr, /is not a regular file \(it is a named pipe\), not a backup copy/);
  assert.equal(forelog('export', '--db', db).stdout, before);

  // A backup cut short (a copy truncated on a full USB stick): the backup is damaged, not the diary.
  const copy = path.join(dir, 'copy.sqlite');
  assert.equal(forelog('backup', copy, '--db', db).status, 0);
  fs.truncateSync(copy, Math.floor(fs.statSync(copy).size / 3));
  const damaged = forelog('restore', copy, '--db', db);
  assert.equal(damaged.status, 1);
  assert.match(damaged.stderr, new RegExp(`^forelog: The backup copy ${copy.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} is damaged or incomplete \\(SQLITE_CORRUPT\\); choose another backup\\. Nothing was restored; the diary is unchanged\\.\n$`));
  assert.doesNotMatch(damaged.stderr, /The diary .* is damaged/);
  assert.equal(forelog('export', '--db', db).stdout, before);
});

test('a file name longer than the file system allows (255 bytes) is named as too long, for the diary and for every file read or written, and nothing is created', () => {
  const dir = tempDir();
  const db = path.join(dir, 'd.sqlite');
  assert.equal(forelog('demo', '--db', db).status, 0);
  const long = 'n'.repeat(300);
  const cases: string[][] = [
    ['score', '--db', path.join(dir, `${long}.sqlite`)],
    ['demo', '--db', path.join(dir, `${long}.sqlite`)],
    ['export', path.join(dir, `${long}.json`), '--db', db],
    ['backup', path.join(dir, `${long}.sqlite`), '--db', db],
    ['import', path.join(dir, `${long}.json`), '--db', db],
    ['restore', path.join(dir, `${long}.sqlite`), '--db', db],
  ];
  for (const args of cases) {
    const r = forelog(...args);
    assert.equal(r.status, 1, args[0]);
    assert.match(r.stderr, /^forelog: .*: its name is 30[57] bytes long, more than the 255 a file name may have; choose a shorter name\./, args[0]);
    assert.doesNotMatch(r.stderr, /ENAMETOOLONG|There is no diary|that was there/, args[0]);
  }
  assert.deepEqual(fs.readdirSync(dir).sort(), ['d.sqlite']);
});
