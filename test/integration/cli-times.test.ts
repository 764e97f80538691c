/**
 * The command line on the diary's own clock: `due` prints local times (its --json keeps
 * UTC instants, exactly as documented), --from/--to/--at take a date and time without
 * offset on the diary's clock while a bare date stays a UTC day; an option a command does
 * not use is refused; the help hint comes once; import --merge.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { openDiary } from '../../main/service/index';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

function forelog(...args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, TZ: 'Asia/Tokyo' },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** A London diary: a check-in due from 2026-07-08 09:00 BST (08:00Z), a window ending 2026-06-30T23:30Z. */
function londonDiary(): { db: string; file: string } {
  const dir = tempDir();
  const file = path.join(dir, 'diary.json');
  fs.writeFileSync(
    file,
    JSON.stringify({
      format: 'forelog-diary',
      version: 1,
      settings: { time_zone: 'Europe/London', default_checkin_days: 7 },
      questions: [
        {
          id: 'checkin',
          title: 'Harbour bridge reopens',
          opened_at: '2026-06-20T08:00:00Z',
          closes_at: '2026-09-01T16:00:00Z',
          forecasts: [{ at: '2026-07-01T08:00:00Z', p: 0.4 }],
        },
        {
          id: 'late-june',
          title: 'Signed in the last half hour of June, London time',
          opened_at: '2026-06-01T08:00:00Z',
          closes_at: '2026-06-30T23:30:00Z',
          tags: ['harbour', 'leases'],
          forecasts: [{ at: '2026-06-02T08:00:00Z', p: 0.8 }],
          resolution: { outcome: 'yes', at: '2026-06-30T23:30:00Z' },
        },
      ],
    }),
  );
  const db = path.join(dir, 'd.sqlite');
  assert.equal(forelog('import', file, '--db', db).status, 0);
  return { db, file };
}

test('due prints times on the diary’s clock, snoozed nudges apart; --json keeps the documented UTC object', () => {
  const { db } = londonDiary();
  const text = forelog('due', '--at', '2026-07-10T09:30:00Z', '--db', db);
  assert.equal(text.status, 0, text.stderr);
  assert.equal(text.stdout, 'Due at 2026-07-10 10:30 (Europe/London):\ncheck-in      since 2026-07-08 09:00  Harbour bridge reopens\n');
  const none = forelog('due', '--at', '2026-07-01T09:00', '--db', db);
  assert.equal(none.stdout, 'Nothing due at 2026-07-01 09:00 (Europe/London).\n', 'a time without offset is read on the diary’s clock');

  const service = openDiary({ dbPath: db, now: () => Date.parse('2026-07-10T09:30:00Z') });
  try {
    service.diary.handlers.snooze({ question_id: 'checkin', kind: 'checkin', until: '2026-07-11T08:00:00Z' });
  } finally {
    service.close();
  }
  const snoozed = forelog('due', '--at', '2026-07-10T10:30', '--db', db);
  assert.equal(snoozed.stdout, 'Nothing due at 2026-07-10 10:30 (Europe/London).\nSnoozed:\ncheck-in      until 2026-07-11 09:00  Harbour bridge reopens\n');
  const json = forelog('due', '--at', '2026-07-10T10:30', '--json', '--db', db);
  assert.deepEqual(JSON.parse(json.stdout), { at: '2026-07-10T09:30:00.000Z', nudges: [] }, 'exactly the documented members');
  const after = JSON.parse(forelog('due', '--at', '2026-07-11T09:00', '--json', '--db', db).stdout);
  assert.deepEqual(after, {
    at: '2026-07-11T08:00:00.000Z',
    nudges: [{ id: 'checkin', title: 'Harbour bridge reopens', kind: 'checkin', due_at: '2026-07-08T08:00:00.000Z' }],
  });
});

test('--from and --to: a bare date is that UTC day, a date and time without offset is on the diary’s clock', () => {
  const { db } = londonDiary();
  const scored = (...args: string[]) => {
    const r = forelog('score', '--json', '--db', db, ...args);
    assert.equal(r.status, 0, r.stderr);
    return (JSON.parse(r.stdout) as { scored: number }).scored;
  };
  // 23:30Z on 30 June is 00:30 on 1 July in London.
  assert.equal(scored('--from', '2026-07-01'), 0, 'the UTC day of 1 July starts after it');
  assert.equal(scored('--from', '2026-07-01T00:00'), 1, 'London’s 1 July starts before it');
  assert.equal(scored('--from', '2026-07-01T00:30'), 1, 'the window end itself is included');
  assert.equal(scored('--from', '2026-07-01T00:30:01'), 0);
  assert.equal(scored('--to', '2026-06-30'), 1);
  assert.equal(scored('--to', '2026-07-01T00:29:59'), 0);
  assert.equal(scored('--from', '2026-06-30T23:30:00Z', '--to', '2026-06-30T23:30:00Z'), 1);
  // A fraction of a second is read on the diary's clock too, to the millisecond (before, the
  // time was sent on unread and refused as lacking an offset).
  assert.equal(scored('--to', '2026-07-01T00:29:59.999'), 0);
  assert.equal(scored('--to', '2026-07-01T00:30:00.000'), 1);
  assert.equal(scored('--from', '2026-07-01T00:30:00.0009'), 1, 'cut to the millisecond, as a time with an offset is');
  assert.equal(scored('--from', '2026-07-01T00:30:00.001'), 0);
  const due = forelog('due', '--at', '2026-07-01T09:00:00.25', '--json', '--db', db);
  assert.equal(JSON.parse(due.stdout).at, '2026-07-01T08:00:00.250Z', due.stderr);
  const bad = forelog('score', '--from', '2026-02-30T10:00', '--db', db);
  assert.equal(bad.status, 1);
  assert.equal(
    bad.stderr,
    "forelog: --from 2026-02-30T10:00 is not a date and time that exists; write it as 2026-03-31 (a UTC day), 2026-03-31T17:00 (on the diary's clock, Europe/London) or 2026-03-31T17:00+01:00. See forelog --help.\n",
  );
  // A form the command line cannot read is refused in its own terms (the diary's clock
  // included), not with the API's message, which names only forms with an offset.
  for (const [option, text] of [['--from', '31/03/2026'], ['--to', '2026-13-01'], ['--from', 'yesterday']]) {
    const r = forelog('score', option!, text!, '--db', db);
    assert.equal(r.status, 1, text);
    assert.equal(
      r.stderr,
      `forelog: ${option} ${text} is not a date or time Forelog can read; write 2026-03-31 (a UTC day), 2026-03-31T17:00 (on the diary's clock, Europe/London) or 2026-03-31T17:00+01:00 (year first, 24-hour clock). See forelog --help.\n`,
    );
  }
  const tomorrow = forelog('due', '--at', 'tomorrow', '--db', db);
  assert.equal(
    tomorrow.stderr,
    "forelog: --at tomorrow is not a time Forelog can read; write 2026-03-31T17:00 (on the diary's clock, Europe/London) or 2026-03-31T17:00+01:00 (year first, 24-hour clock). See forelog --help.\n",
  );
  const help = forelog('--help');
  assert.match(help.stdout, /2026-03-31 {18}a bare date: that whole day in UTC/);
  assert.match(help.stdout, /2026-03-31T17:00 {12}a date and time without offset: on the diary's clock/);
});

test('score --tag with a tag no question has says so on stderr with the diary’s tags; the answer on stdout stays as it was', () => {
  const { db } = londonDiary();
  const typo = forelog('score', '--json', '--tag', 'harbor', '--db', db);
  assert.equal(typo.status, 0);
  assert.equal((JSON.parse(typo.stdout) as { scored: number }).scored, 0);
  assert.equal(typo.stderr, 'forelog: no question in this diary has the tag "harbor" (tags match exactly); its tags: harbour, leases.\n');
  const known = forelog('score', '--json', '--tag', 'harbour', '--db', db);
  assert.equal(known.stderr, '');
  assert.equal((JSON.parse(known.stdout) as { scored: number }).scored, 1);
});

test('an option the command does not use is refused, and the help hint comes once; a missing import file is named', () => {
  const { db } = londonDiary();
  const cases: [string[], string][] = [
    [['score', '--port', '3'], 'forelog: score does not use --port; it takes --tag, --from, --to, --json. See forelog --help.\n'],
    [['demo', '--json'], 'forelog: demo does not use --json; it takes no options besides --db. See forelog --help.\n'],
    [['export', '--merge'], 'forelog: export does not use --merge; it takes --format. See forelog --help.\n'],
    [['frobnicate'], 'forelog: unknown command "frobnicate". See forelog --help.\n'],
    [['due', '--bogus'], 'forelog: there is no option --bogus. See forelog --help.\n'],
    [['score', '--tag'], 'forelog: --tag needs a value: write --tag VALUE (or --tag=VALUE for one that starts with a dash). See forelog --help.\n'],
    [['score', '--tag', '-x'], 'forelog: --tag needs a value: write --tag VALUE (or --tag=VALUE for one that starts with a dash). See forelog --help.\n'],
    [['score', '--json=1'], 'forelog: --json takes no value; write --json alone. See forelog --help.\n'],
    [['import', 'no-such-export.json'], 'forelog: There is no file at no-such-export.json. Check the path; nothing was imported.\n'],
  ];
  for (const [args, stderr] of cases) {
    const r = forelog(...args, '--db', db);
    assert.equal(r.status, 1, args.join(' '));
    assert.equal(r.stderr, stderr, args.join(' '));
    assert.equal(r.stdout, '');
  }
});

test('import --merge skips what is there unchanged, and a conflict is one line that says what to do', () => {
  const { db, file } = londonDiary();
  const plain = forelog('import', file, '--db', db);
  assert.equal(plain.status, 1);
  assert.match(plain.stderr, /^forelog: Question 1 \(questions\[0\], “Harbour bridge reopens”\) is not valid: field id: "checkin" is already in this diary \(was this file imported before\? Import it with merge/);
  const merged = forelog('import', '--merge', file, '--db', db);
  assert.equal(merged.status, 0, merged.stderr);
  assert.equal(merged.stdout, `Imported 0 questions into ${db}; skipped 2 questions already in it unchanged.\n`);
  const diary = JSON.parse(fs.readFileSync(file, 'utf8'));
  diary.questions[1].resolution.outcome = 'no';
  diary.questions.push({ id: 'new', title: 'New', closes_at: '2027-01-01T00:00:00Z', forecasts: [] });
  fs.writeFileSync(file, JSON.stringify(diary));
  const before = forelog('export', '--db', db).stdout;
  const conflict = forelog('import', file, '--merge', '--db', db);
  assert.equal(conflict.status, 1);
  assert.equal(conflict.stderr.split('\n').length, 2, 'one line');
  assert.match(conflict.stderr, /^forelog: 1 question is already in this diary with different contents, so nothing was imported: Question 2 \(questions\[1\]\): "late-june" \(“Signed in the last half hour of June, London time”\) differs in resolution\. For each, /);
  assert.equal(forelog('export', '--db', db).stdout, before);
});
