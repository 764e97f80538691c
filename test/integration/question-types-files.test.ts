/**
 * Choice and numeric questions in the diary file, `score --json`, nudges and the calendar
 * export, on real diary files. The file format and the score members are INTERFACES.md
 * ("Question types"; §2); import is all-or-nothing and a round trip is byte-identical.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import ICAL from 'ical.js';
import { loadScoringInput } from '../../main/service/scoring-source';
import { ApiError } from '../../shared/contract';
import { exportJson, openTestDiary, tempDir, type TestDiary } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

/** A diary with one question of each type, forecast, referenced, resolved and corrected. */
async function mixedDiary(d: TestDiary): Promise<{ yes: string; choice: string; weeks: string; date: string }> {
  const yes = await d.call('createQuestion', {
    title: 'Northgate renews',
    closes_at: iso(NOW - 5 * DAY),
    opened_at: iso(NOW - 60 * DAY),
    base_rate: 0.3,
    first_forecast: { p: 0.8, at: iso(NOW - 50 * DAY), lenses: [{ name: 'outside view', p: 0.3, weight: 1 }] },
  });
  await d.call('resolveQuestion', { id: yes.id, outcome: 'no', at: iso(NOW - 5 * DAY) });
  const choice = await d.call('createQuestion', {
    type: 'choice',
    title: 'Which supplier will the client pick?',
    tags: ['client:northgate'],
    options: ['Kestrowe', 'Ambledene', 'Neither'],
    ordered: false,
    option_base_rates: [0.45, 0.35, 0.2],
    base_rate_note: 'last twenty tenders',
    opened_at: iso(NOW - 60 * DAY),
    closes_at: iso(NOW - 10 * DAY),
    first_forecast: { probs: [0.1, 0.2, 0.7], note: 'first look', at: iso(NOW - 50 * DAY) },
  });
  await d.call('addForecast', { question_id: choice.id, probs: [0.85, 0.1, 0.05], at: iso(NOW - 20 * DAY) });
  await d.call('addReference', { question_id: choice.id, probs: [0.6, 0.3, 0.1], source: 'account lead', at: iso(NOW - 55 * DAY) });
  await d.call('resolveQuestion', { id: choice.id, outcome: 'option', option: 0, at: iso(NOW - 10 * DAY) });
  await d.call('resolveQuestion', { id: choice.id, outcome: 'option', option: 2, at: iso(NOW - 10 * DAY), correction_note: 'misread the letter' });
  const weeks = await d.call('createQuestion', {
    type: 'numeric',
    title: 'Weeks from kickoff to go-live',
    unit: 'weeks',
    opened_at: iso(NOW - 60 * DAY),
    closes_at: iso(NOW - 3 * DAY),
    first_forecast: { quantiles: [9, 13, 20], at: iso(NOW - 50 * DAY) },
  });
  await d.call('addReference', { question_id: weeks.id, quantiles: [8, 10, 12], source: 'vendor plan', at: iso(NOW - 50 * DAY) });
  await d.call('resolveQuestion', { id: weeks.id, outcome: 'value', value: 24.5, at: iso(NOW - 3 * DAY) });
  const date = await d.call('createQuestion', {
    type: 'numeric',
    title: 'When will the board sign?',
    value_kind: 'date',
    levels: [0.25, 0.5, 0.75],
    opened_at: iso(NOW - 60 * DAY),
    closes_at: iso(NOW + 40 * DAY),
    checkin_days: 7,
    first_forecast: { quantiles: ['2026-06-20', '2026-07-01', '2026-07-15'], at: iso(NOW - 30 * DAY) },
  });
  return { yes: yes.id, choice: choice.id, weeks: weeks.id, date: date.id };
}

test('JSON export of every type reads back into an empty diary and exports byte for byte the same', async () => {
  const a = openTestDiary({ now: iso(NOW) });
  const ids = await mixedDiary(a);
  const text = exportJson(a.service);
  const file = JSON.parse(text);
  const byId = new Map(file.questions.map((q: { id: string }) => [q.id, q]));
  // As INTERFACES.md "Question types" writes them: type first, values as numbers, dates as dates.
  assert.equal('type' in (byId.get(ids.yes) as object), false, 'a yes/no question has no type field');
  assert.deepEqual(byId.get(ids.choice), {
    id: ids.choice,
    type: 'choice',
    title: 'Which supplier will the client pick?',
    rule: '',
    kind: 'event_by_deadline',
    tags: ['client:northgate'],
    opened_at: iso(NOW - 60 * DAY),
    closes_at: iso(NOW - 10 * DAY),
    time_zone: 'UTC',
    options: ['Kestrowe', 'Ambledene', 'Neither'],
    ordered: false,
    option_base_rates: [0.45, 0.35, 0.2],
    base_rate_note: 'last twenty tenders',
    forecasts: [
      { at: iso(NOW - 50 * DAY), probs: [0.1, 0.2, 0.7], note: 'first look' },
      { at: iso(NOW - 20 * DAY), probs: [0.85, 0.1, 0.05], note: '' },
    ],
    references: [{ at: iso(NOW - 55 * DAY), probs: [0.6, 0.3, 0.1], source: 'account lead' }],
    resolution: { outcome: 'option', option: 2, at: iso(NOW - 10 * DAY), note: '' },
    resolution_history: [
      { outcome: 'option', option: 0, at: iso(NOW - 10 * DAY), note: '', recorded_at: iso(NOW), replaced_at: iso(NOW), change: 'corrected', change_note: 'misread the letter' },
    ],
  });
  const date = byId.get(ids.date) as { unit: string; value_kind: string; levels: number[]; forecasts: { quantiles: unknown[] }[] };
  assert.deepEqual([date.unit, date.value_kind, date.levels, date.forecasts[0]!.quantiles], ['', 'date', [0.25, 0.5, 0.75], ['2026-06-20', '2026-07-01', '2026-07-15']]);
  assert.deepEqual((byId.get(ids.weeks) as { resolution: unknown }).resolution, { outcome: 'value', value: 24.5, at: iso(NOW - 3 * DAY), note: '' });

  const b = openTestDiary({ now: iso(NOW) });
  assert.deepEqual(await b.call('importText', { format: 'json', text }), { added: 4, skipped: 0 });
  assert.equal(exportJson(b.service), text, 'round trip is byte-identical');
  // Merging the same file again finds every question as it is.
  assert.deepEqual(await b.call('importText', { format: 'json', text, merge: true }), { added: 0, skipped: 4 });
  // A changed vector is a conflict naming the field; nothing is imported.
  const changed = JSON.parse(text);
  const choice = changed.questions.find((q: { id: string }) => q.id === ids.choice);
  choice.forecasts[1].probs = [0.8, 0.15, 0.05];
  try {
    await b.call('importText', { format: 'json', text: JSON.stringify(changed), merge: true });
    assert.fail('a conflicting merge was accepted');
  } catch (err) {
    assert.ok(err instanceof ApiError);
    assert.equal(err.code, 'conflict');
    assert.deepEqual(err.conflicts?.map((c) => [c.id, c.differs]), [[ids.choice, ['forecasts']]]);
  }
  assert.equal(exportJson(b.service), text, 'nothing changed');
});

test('a field of another type in a file is an error naming the record and the field, and nothing is imported', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const good = { title: 'A yes/no question', closes_at: iso(NOW + DAY), forecasts: [{ at: iso(NOW - DAY), p: 0.4 }] };
  const cases: [object, string][] = [
    [
      { type: 'choice', title: 'Which?', options: ['A', 'B'], closes_at: iso(NOW + DAY), forecasts: [{ at: iso(NOW - DAY), p: 0.4 }] },
      'Question 2 (questions[1], “Which?”) is not valid: field forecasts[0].p: does not apply: a choice question takes probs, one probability per option',
    ],
    [
      { title: 'Yes or no', closes_at: iso(NOW + DAY), forecasts: [], resolution: { outcome: 'option', option: 0, at: iso(NOW - DAY) } },
      'Question 2 (questions[1], “Yes or no”) is not valid: field resolution.outcome: must be yes or no or void for a yes/no question (got option)',
    ],
    [
      { type: 'numeric', title: 'How many?', value_kind: 'date', closes_at: iso(NOW + DAY), forecasts: [{ at: iso(NOW - DAY), quantiles: [1, 2, 3] }] },
      "Question 2 (questions[1], “How many?”) is not valid: field forecasts[0].quantiles[0]: must be a date YYYY-MM-DD (this question's values are dates), not 1",
    ],
    [
      { type: 'numeric', title: 'How many?', unit: 'weeks', base_rate: 0.2, closes_at: iso(NOW + DAY), forecasts: [] },
      'Question 2 (questions[1], “How many?”) is not valid: field base_rate: applies to yes/no questions only; this is a numeric question',
    ],
    [
      { type: 'choice', title: 'Which?', options: ['A', 'B'], closes_at: iso(NOW + DAY), forecasts: [{ at: iso(NOW - DAY), probs: [0.5, 0.4] }] },
      'Question 2 (questions[1], “Which?”) is not valid: field forecasts[0].probs: must sum to 100 %, they sum to 90 % (10 % short)',
    ],
    [
      // A number written as text is not taken for a broken date: the value is meant as a number.
      { type: 'numeric', title: 'How many?', closes_at: iso(NOW + DAY), forecasts: [], resolution: { outcome: 'value', value: '5', at: iso(NOW - DAY) } },
      'Question 2 (questions[1], “How many?”) is not valid: field resolution.value: must be a number, or a date YYYY-MM-DD for a question about a date (got the text "5")',
    ],
    [
      { type: 'numeric', title: 'How many?', closes_at: iso(NOW + DAY), forecasts: [{ at: iso(NOW - DAY), quantiles: ['1', '2', 'x'.repeat(5000)] }] },
      'Question 2 (questions[1], “How many?”) is not valid: field forecasts[0].quantiles[0]: must be a number, or a date YYYY-MM-DD for a question about a date (got the text "1")',
    ],
    [
      { type: 'numeric', title: 'When?', value_kind: 'date', closes_at: iso(NOW + DAY), forecasts: [], resolution: { outcome: 'value', value: '2026-02-30', at: iso(NOW - DAY) } },
      'Question 2 (questions[1], “When?”) is not valid: field resolution.value: must be a real calendar date YYYY-MM-DD (got "2026-02-30")',
    ],
    [
      // Written -1e400 in the file (JSON.stringify cannot): a number, too large to hold, not "not a number".
      { type: 'numeric', title: 'How many?', closes_at: iso(NOW + DAY), forecasts: [], resolution: { outcome: 'value', value: 'written -1e400', at: iso(NOW - DAY) } },
      'Question 2 (questions[1], “How many?”) is not valid: field resolution.value: must be a number, or a date YYYY-MM-DD for a question about a date: the one given is beyond about ±1.8e308, too large to hold',
    ],
  ];
  for (const [bad, message] of cases) {
    const text = JSON.stringify({ format: 'forelog-diary', version: 1, questions: [good, bad] }).replace('"written -1e400"', '-1e400');
    try {
      await d.call('importText', { format: 'json', text });
      assert.fail('the file was accepted');
    } catch (err) {
      assert.ok(err instanceof ApiError);
      assert.ok(err.message.startsWith(message), err.message);
      assert.ok(err.message.length < 1000, 'a long value is not repeated whole in the message');
    }
    assert.equal((await d.call('listQuestions', {})).total, 0, 'all or nothing');
  }
});

test('score --json gains choice and numeric members, always present; the top level stays yes/no only', async () => {
  const empty = openTestDiary({ now: iso(NOW) });
  const none = empty.service.diary.scoreReport({});
  assert.deepEqual(Object.keys(none).slice(-2), ['choice', 'numeric']);
  assert.deepEqual(
    [none.choice.scored, none.choice.brier, none.choice.log_score, none.choice.rps, none.choice.skill, none.choice.top_choice.hit_rate],
    [0, null, null, null, { vs_uniform: null, vs_base_rate: null, vs_first: null }, null],
  );
  assert.deepEqual([none.numeric.scored, none.numeric.coverage, none.numeric.relative_wis_vs_first, none.numeric.surprises], [0, [], null, []]);

  const d = openTestDiary({ now: iso(NOW) });
  const ids = await mixedDiary(d);
  const report = d.service.diary.scoreReport({});
  // Yes/no only at the top: one resolved yes/no question scored, nothing open.
  assert.deepEqual([report.scored, report.open, report.void, report.unscored], [1, 0, 0, 0]);
  assert.deepEqual([report.choice.scored, report.choice.open], [1, 0]);
  // Final forecast [0.85, 0.1, 0.05], outcome option 2: Brier (0.85² + 0.1² + 0.95²) (SCORING.md, multi-category), log −ln 0.05.
  assert.equal(report.choice.brier, 0.85 ** 2 + 0.1 ** 2 + (0.05 - 1) ** 2);
  assert.equal(report.choice.log_score, -Math.log(0.05));
  assert.deepEqual(report.choice.confident_misses, [{ id: ids.choice, title: 'Which supplier will the client pick?', option: 0, p: 0.85, outcome_option: 2 }]);
  // Numeric: 24.5 weeks fell above the 80 % range [9, 20]; the date question is open.
  assert.deepEqual([report.numeric.scored, report.numeric.open], [1, 1]);
  assert.deepEqual(report.numeric.coverage.map((c) => [c.level, c.n, c.inside]), [[0.8, 1, 0]]);
  assert.deepEqual(report.numeric.surprises.map((s) => [s.id, s.value, s.low, s.high, s.level, s.size]), [[ids.weeks, 24.5, 9, 20, 0.8, 4.5 / 11]]);
  // The Scorecard answer carries the same report and each type's rows.
  const card = await d.call('score', {});
  assert.deepEqual(card.report, JSON.parse(JSON.stringify(report)));
  assert.deepEqual(card.choice_detail.per_question.map((r: { id: string }) => r.id), [ids.choice]);
  assert.deepEqual(card.numeric_detail.per_question.map((r: { id: string }) => r.id), [ids.weeks]);
  // --tag filters every section alike.
  const tagged = d.service.diary.scoreReport({ tag: 'client:northgate' });
  assert.deepEqual([tagged.scored, tagged.choice.scored, tagged.numeric.scored, tagged.numeric.open], [0, 1, 0, 0]);
});

test('nudges and the calendar export treat every type alike', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const ids = await mixedDiary(d);
  const soon = await d.call('createQuestion', {
    type: 'choice',
    title: 'Which venue?',
    options: ['North', 'South'],
    closes_at: iso(NOW + 12 * 3_600_000),
    first_forecast: { probs: [0.5, 0.5] },
  });
  const lapsed = await d.call('createQuestion', {
    type: 'numeric',
    title: 'Final headcount',
    unit: 'people',
    opened_at: iso(NOW - 20 * DAY),
    closes_at: iso(NOW - 2 * DAY),
    first_forecast: { quantiles: [40, 50, 60], at: iso(NOW - 19 * DAY) },
  });
  const due = await d.call('due', { at: iso(NOW) });
  const kinds = new Map(due.nudges.map((n: { id: string; kind: string; type: string }) => [n.id, [n.kind, n.type]]));
  // The date question's last revision is 30 days old with a 7-day cadence: a check-in.
  assert.deepEqual(kinds.get(ids.date), ['checkin', 'numeric']);
  assert.deepEqual(kinds.get(soon.id), ['closing_soon', 'choice']);
  assert.deepEqual(kinds.get(lapsed.id), ['window_closed', 'numeric']);
  // A revision answers the check-in, whatever the type.
  await d.call('addForecast', { question_id: ids.date, quantiles: ['2026-06-25', '2026-07-05', '2026-07-20'] });
  const after = await d.call('due', { at: iso(NOW) });
  assert.equal(after.nudges.some((n: { id: string }) => n.id === ids.date), false);

  const ics = (await d.call('exportText', { format: 'ics' })).text;
  const events = new ICAL.Component(ICAL.parse(ics)).getAllSubcomponents('vevent');
  const byTitle = new Map(events.map((e) => [String(e.getFirstPropertyValue('summary')), String(e.getFirstPropertyValue('description'))]));
  assert.match(byTitle.get('Closes: Which venue?') ?? '', /Last forecast: North 50%, South 50%/);
  assert.match(byTitle.get('Closes: When will the board sign?') ?? '', /Last forecast: P25 2026-06-25 · P50 2026-07-05 · P75 2026-07-20 \(set/);
  assert.match(byTitle.get('Closes: Final headcount') ?? '', /Last forecast: P10 40 · P50 50 · P90 60 people/);
});

test('the command line imports, exports and scores every type (forelog import / export / score --json)', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const ids = await mixedDiary(d);
  const text = exportJson(d.service);
  const dir = tempDir();
  const file = path.join(dir, 'mixed.json');
  fs.writeFileSync(file, text);
  const db = path.join(dir, 'cli.sqlite');
  const run = (...args: string[]) => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, TZ: 'UTC' } });
    assert.equal(r.status, 0, r.stderr);
    return r.stdout;
  };
  run('import', file, '--db', db);
  assert.equal(run('export', '--db', db), text, 'export → import → export is identical');
  const score = JSON.parse(run('score', '--json', '--db', db));
  assert.deepEqual(Object.keys(score).slice(-2), ['choice', 'numeric']);
  assert.deepEqual([score.scored, score.choice.scored, score.numeric.scored, score.numeric.open], [1, 1, 1, 1]);
  assert.deepEqual(score.choice.confident_misses.map((m: { id: string }) => m.id), [ids.choice]);
  assert.deepEqual(score, JSON.parse(JSON.stringify(d.service.diary.scoreReport({}))), 'the same report as the app');
  // The readable form has a section per type present.
  const table = run('score', '--db', db);
  for (const line of ['Yes/no questions', 'Multiple-choice questions', 'Top choice came true', 'Numeric questions', '80% ranges (n=1)']) {
    assert.ok(table.includes(line), `${line} in:\n${table}`);
  }
});

test('the scoring reader loads choice and numeric revisions as the numbers stored, dates as days', async () => {
  const d = openTestDiary({ now: iso(NOW) });
  const ids = await mixedDiary(d);
  const awkward = [0.1 + 0.2, 1 / 3, 1 - (0.1 + 0.2) - 1 / 3];
  await d.call('addForecast', { question_id: ids.choice, probs: awkward, at: iso(NOW - 15 * DAY) });
  const input = loadScoringInput(d.service.store.read);
  assert.deepEqual(input.binary.map((q) => q.id), [ids.yes]);
  const choice = input.choice.find((q) => q.id === ids.choice)!;
  assert.deepEqual([choice.option_count, choice.ordered, choice.option_base_rates, choice.resolution], [3, false, [0.45, 0.35, 0.2], { outcome: 'option', option: 2, at: NOW - 10 * DAY }]);
  assert.deepEqual(
    choice.forecasts.map((f) => [f.at, [...f.probs]]),
    [
      [NOW - 50 * DAY, [0.1, 0.2, 0.7]],
      [NOW - 20 * DAY, [0.85, 0.1, 0.05]],
      [NOW - 15 * DAY, awkward],
    ],
  );
  const date = input.numeric.find((q) => q.id === ids.date)!;
  // 2026-06-20 is day 20624 since 1970-01-01.
  assert.deepEqual([date.value_kind, date.levels, [...date.forecasts[0]!.quantiles], date.resolution], ['date', [0.25, 0.5, 0.75], [20624, 20635, 20649], null]);
  const weeks = input.numeric.find((q) => q.id === ids.weeks)!;
  assert.deepEqual([weeks.unit, weeks.resolution], ['weeks', { outcome: 'value', value: 24.5, at: NOW - 3 * DAY }]);
});

test('a negative zero in a file (-0, -0.0) is kept as 0: export writes 0, and the same file merges again as unchanged', async () => {
  // JSON and CSV allow "-0", but the diary keeps -0 and 0 as one number (they are equal, and
  // SQLite stores them alike), so export writes 0 and a file from Forelog round-trips bit for
  // bit; docs/diary-file.md says so. A merge must not call the hand-written file different.
  const d = openTestDiary({ now: iso(NOW) });
  const file = `{"format":"forelog-diary","version":1,"questions":[
    {"id":"margin","type":"numeric","title":"Margin change","opened_at":"2026-01-01T00:00:00Z","closes_at":"2026-03-01T00:00:00Z",
     "forecasts":[{"at":"2026-01-02T00:00:00Z","quantiles":[-1,-0,0.0]}],
     "references":[{"at":"2026-01-02T00:00:00Z","quantiles":[-0.0,-0,1],"source":"plan"}],
     "resolution":{"outcome":"value","value":-0,"at":"2026-02-01T00:00:00Z"}},
    {"id":"renews","title":"Northgate renews","opened_at":"2026-01-01T00:00:00Z","closes_at":"2026-03-01T00:00:00Z","base_rate":-0,
     "forecasts":[{"at":"2026-01-02T00:00:00Z","p":-0.0}]}]}`;
  assert.deepEqual(await d.call('importText', { format: 'json', text: file }), { added: 2, skipped: 0 });
  const text = exportJson(d.service);
  const out = JSON.parse(text, (_key, value: unknown) => {
    assert.ok(!Object.is(value, -0), 'export wrote a -0');
    return value;
  }) as { questions: { id: string; forecasts: { quantiles?: number[]; p?: number }[]; resolution: { value?: number } }[] };
  const byId = new Map(out.questions.map((q) => [q.id, q]));
  assert.deepEqual(byId.get('margin')!.forecasts[0]!.quantiles, [-1, 0, 0]);
  assert.equal(byId.get('margin')!.resolution.value, 0);
  assert.equal(byId.get('renews')!.forecasts[0]!.p, 0);
  assert.deepEqual(await d.call('importText', { format: 'json', text: file, merge: true }), { added: 0, skipped: 2 });

  const csv = (await d.call('exportText', { format: 'csv' })).text.replaceAll(',0,', ',-0,').replace('-1 0 0', '-1 -0 0.0');
  assert.match(csv, /-1 -0 0\.0/);
  assert.deepEqual(await d.call('importText', { format: 'csv', text: csv, merge: true }), { added: 0, skipped: 2 });
  assert.equal(exportJson(d.service), text, 'nothing changed');
});
