/**
 * The diary as CSV (docs/csv-format.md): export → CSV → import gives back the same diary,
 * quoting follows RFC 4180 §2 (checked against an independent reader, Python's csv module),
 * and a bad file is refused whole with the row and column a spreadsheet shows.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import { buildDemoDiary } from '../../main/service/demo';
import { CSV_ALL_COLUMNS, CSV_COLUMNS, CsvError, readCsvDiary, type CsvColumn } from '../../main/service/csv';
import type { FileQuestion } from '../../shared/diary-file';
import { openTestDiary, type TestDiary } from '../support/temp-diary';

/** A note using everything RFC 4180 §2 rules 6–7 say must be quoted, plus non-ASCII text. */
const TRICKY_NOTE = 'Client said "maybe, later", then:\nline two\r\nline three — Zürich ≥ ½ 日本 🙂';

/** Cells of one row, every field quoted with inner quotes doubled (RFC 4180 §2 rules 5 and 7). */
function line(cells: string[]): string {
  return cells.map((c) => `"${c.replaceAll('"', '""')}"`).join(',');
}

/** A full-width row: the given columns filled, the rest empty. */
function row(values: Partial<Record<CsvColumn, string>>): string {
  return line(CSV_COLUMNS.map((c) => values[c] ?? ''));
}

const HEADER = CSV_COLUMNS.join(',');
const Q1 = { question_id: 'q1', title: 'Northgate renews', closes_at: '2026-09-30T16:00:00.000Z' };
const Q2 = { question_id: 'q2', title: 'Harbour office opens', closes_at: '2026-10-31T17:00:00.000Z' };
const F1 = { forecast_at: '2026-06-01T09:00:00.000Z', p: '0.4' };

function csvText(...rows: string[]): string {
  return [HEADER, ...rows].join('\r\n') + '\r\n';
}

/** What import reads from CSV text: each question with the rows that follow it gathered in (times in epoch ms). */
function csvQuestions(text: string, chunkSize = text.length || 1): FileQuestion[] {
  const chunks: string[] = [];
  for (let i = 0; i < text.length; i += chunkSize) chunks.push(text.slice(i, i + chunkSize));
  const questions: FileQuestion[] = [];
  for (const item of readCsvDiary(chunks)) {
    if (item.kind === 'question') questions[item.index] = structuredClone(item.question);
    else {
      const q = questions[item.index]!;
      if (item.forecast) q.forecasts.push(item.forecast);
      if (item.reference) q.references!.push(item.reference);
    }
  }
  return questions;
}

const t = (iso: string) => Date.parse(iso);

/** Asserts that reading `text` fails with exactly this message (and its row and column). */
function refuses(text: string, message: string | RegExp, rowNumber: number | null, column: string | null): void {
  assert.throws(
    () => csvQuestions(text),
    (err: unknown) => {
      assert.ok(err instanceof CsvError, `a CsvError, got ${String(err)}`);
      if (typeof message === 'string') assert.equal(err.message, message);
      else assert.match(err.message, message);
      assert.equal(err.row, rowNumber);
      assert.equal(err.column, column);
      return true;
    },
  );
}

/** Rows as Python's csv module (an independent RFC 4180 reader) reads them. */
function pythonRows(text: string): string[][] {
  const script = 'import csv, io, json, sys\nprint(json.dumps(list(csv.reader(io.StringIO(sys.stdin.buffer.read().decode("utf-8"), newline="")))))';
  const r = spawnSync('/usr/bin/python3', ['-c', script], { input: Buffer.from(text, 'utf8'), encoding: 'utf8' });
  assert.equal(r.status, 0, r.stderr);
  return JSON.parse(r.stdout) as string[][];
}

/** The example diary plus the shapes it lacks: a question with no revisions, one with only a reference, tricky text and numbers. */
async function fullDiary(): Promise<TestDiary> {
  const d = openTestDiary();
  await d.call('importDiary', { diary: buildDemoDiary(d.clock.now) });
  await d.call('createQuestion', { title: 'Bare question, no revisions yet', closes_at: '2026-09-30T17:00:00+01:00', tags: [] });
  const refOnly = await d.call('createQuestion', { title: 'Only the client has a view', closes_at: '2026-10-30T17:00:00Z' });
  await d.call('addReference', { question_id: refOnly.id, p: 0.6, source: 'client\'s "gut", not ours' });
  const tricky = await d.call('createQuestion', {
    title: 'Tender, "phase 3", won — Zürich office',
    rule: 'Yes if the award letter arrives,\nsigned.',
    closes_at: '2026-12-01T12:00:00Z',
    tags: ['client:zurich', 'tenders'],
    base_rate: 0.1 + 0.2,
    base_rate_note: '1 in 10\rper the tender log',
    costs: { false_alarm: 1.5, miss: 4 },
    checkin_days: 0,
    first_forecast: { p: 0.123456789012345, note: TRICKY_NOTE },
  });
  d.clock.now += 3_600_000;
  await d.call('addForecast', {
    question_id: tricky.id,
    p: 1e-7,
    note: 'no comma or quote\nonly a line break',
    lenses: [
      { name: 'outside view, "base"', p: 0.3, weight: 2 },
      { name: 'inside view', p: 1 / 3, weight: 0 },
    ],
  });
  await d.call('resolveQuestion', { id: tricky.id, outcome: 'void', note: 'Tender withdrawn, "for now"' });
  return d;
}

test('export → CSV → import into a fresh diary → export gives identical questions (example diary and edge shapes)', async () => {
  const d = await fullDiary();
  const first = (await d.call('exportDiary', {})) as { questions: { forecasts: unknown[]; references: unknown[] }[] };
  const csv = (await d.call('exportText', { format: 'csv' })).text as string;

  // One header row, then one row per revision and per reference, or one row for a question with neither (docs/csv-format.md).
  const expectedRows = 1 + first.questions.reduce((n, q) => n + Math.max(1, q.forecasts.length + q.references.length), 0);
  assert.equal(pythonRows(csv).length, expectedRows);
  // The example diary holds choice and numeric questions, so the type columns follow the others.
  assert.ok(csv.startsWith(`${CSV_ALL_COLUMNS.join(',')}\r\n`), 'the header row comes first, in the documented order');
  assert.ok(csv.endsWith('\r\n'), 'RFC 4180 §2 rule 1: each record ends in CRLF');
  // Full precision, derived from String(number): these read back to the same double.
  assert.ok(csv.includes(',0.123456789012345,'));
  assert.ok(csv.includes(',1e-7,'));
  assert.ok(csv.includes(',0.30000000000000004,'));

  const d2 = openTestDiary();
  const added = await d2.call('importText', { format: 'csv', text: csv });
  assert.equal(added.added, first.questions.length);
  const second = (await d2.call('exportDiary', {})) as { questions: unknown[] };
  assert.equal(JSON.stringify(second.questions, null, 2), JSON.stringify(first.questions, null, 2));
  assert.equal((await d2.call('exportText', { format: 'csv' })).text, csv, 'the CSV export is stable across the round trip');
});

test('exported quoting reads back exactly with an independent RFC 4180 reader (Python csv)', async () => {
  const d = await fullDiary();
  const rows = pythonRows((await d.call('exportText', { format: 'csv' })).text);
  assert.deepEqual(rows[0], [...CSV_ALL_COLUMNS]);
  const col = (name: CsvColumn) => (CSV_ALL_COLUMNS as readonly CsvColumn[]).indexOf(name);
  const tricky = rows.filter((r) => r[col('title')] === 'Tender, "phase 3", won — Zürich office');
  assert.equal(tricky.length, 2, 'one row per revision');
  const [firstRev, secondRev] = tricky as [string[], string[]];
  assert.equal(firstRev[col('note')], TRICKY_NOTE);
  assert.equal(firstRev[col('rule')], 'Yes if the award letter arrives,\nsigned.');
  assert.equal(firstRev[col('tags')], 'client:zurich tenders');
  assert.equal(firstRev[col('p')], '0.123456789012345');
  assert.equal(firstRev[col('lenses')], '');
  assert.equal(firstRev[col('checkin_days')], '0');
  // A bare LF or CR must be quoted too (RFC 4180 §2 rule 6), even with no comma or quote beside it.
  assert.equal(firstRev[col('base_rate_note')], '1 in 10\rper the tender log');
  assert.equal(secondRev[col('note')], 'no comma or quote\nonly a line break');
  assert.equal(firstRev[col('false_alarm_cost')], '1.5');
  assert.equal(firstRev[col('outcome')], 'void');
  assert.equal(firstRev[col('resolution_note')], 'Tender withdrawn, "for now"');
  assert.deepEqual(JSON.parse(secondRev[col('lenses')]!), [
    { name: 'outside view, "base"', p: 0.3, weight: 2 },
    { name: 'inside view', p: 1 / 3, weight: 0 },
  ]);
  const refRow = rows.find((r) => r[col('title')] === 'Only the client has a view')!;
  assert.deepEqual([refRow[col('forecast_at')], refRow[col('p')], refRow[col('reference_p')], refRow[col('reference_source')]], ['', '', '0.6', 'client\'s "gut", not ours']);
  const bare = rows.filter((r) => r[col('title')] === 'Bare question, no revisions yet');
  assert.equal(bare.length, 1);
  assert.equal(bare[0]![col('forecast_at')]! + bare[0]![col('reference_at')]!, '');
});

test('a hand-written CSV with a BOM, LF line ends, reordered columns and tricky quoting is read exactly', async () => {
  // RFC 4180 §2 rule 6 (line breaks, quotes and commas inside quoted fields) and rule 7
  // (a quote inside a quoted field is doubled), e.g. "b""bb" reads as b"bb.
  const text =
    'note,p,forecast_at,title,closes_at,tags,question_id,reference_at,reference_p,reference_source\n' +
    '"Client said ""maybe, later"", then:\nline two\r\nline three — Zürich ≥ ½ 日本 🙂",0.25,2026-06-01T09:00:00Z,"Tender, ""phase 3"", won",2026-12-01T12:00:00+01:00,client:zurich tenders,t-1,,,\n' +
    '\n' +
    '"b""bb",.5,2026-06-02T09:00:00Z,"Tender, ""phase 3"", won",2026-12-01T12:00:00+01:00,client:zurich tenders,t-1,,,\n' +
    ',,,"Tender, ""phase 3"", won",2026-12-01T12:00:00+01:00,client:zurich tenders,t-1,2026-06-03T10:00:00Z,7.5e-1,"Ölberg & Co, Zürich"\n' +
    '\n';
  const expected: FileQuestion[] = [
    {
      id: 't-1',
      title: 'Tender, "phase 3", won',
      rule: '',
      tags: ['client:zurich', 'tenders'],
      closes_at: t('2026-12-01T12:00:00+01:00'),
      forecasts: [
        { at: t('2026-06-01T09:00:00Z'), p: 0.25, note: TRICKY_NOTE },
        { at: t('2026-06-02T09:00:00Z'), p: 0.5, note: 'b"bb' },
      ],
      references: [{ at: t('2026-06-03T10:00:00Z'), p: 0.75, source: 'Ölberg & Co, Zürich' }],
      resolution: null,
    },
  ];
  // In one piece, and in chunks that split quoted fields, doubled quotes and CRLF pairs.
  for (const size of [text.length, 1, 2, 3, 7]) assert.deepEqual(csvQuestions(text, size), expected, `chunks of ${size}`);
  // Text that kept its byte order mark (the file decoder drops it; an API caller may not).
  const d = openTestDiary();
  assert.equal((await d.call('importText', { format: 'csv', text: `\ufeff${text}` })).added, 1);
  assert.equal((await d.call('getQuestion', { id: 't-1' })).forecasts.length, 2);
});

test('the example in docs/csv-format.md imports as documented', async () => {
  const doc = fs.readFileSync(path.join(import.meta.dirname, '..', '..', 'docs', 'csv-format.md'), 'utf8');
  const example = /```csv\n([\s\S]*?)```/.exec(doc)![1]!;
  assert.equal(csvQuestions(example).length, 1);
  const d = openTestDiary();
  await d.call('importText', { format: 'csv', text: example });
  const q = await d.call('getQuestion', { id: 'q1' });
  assert.deepEqual(
    q.forecasts.map((f: { p: number; note: string; lenses: unknown[] }) => [f.p, f.note, f.lenses.length]),
    [
      [0.4, 'Sponsor keen, procurement "not yet"', 0],
      [0.55, 'Budget approved.\nLegal still reviewing.', 1],
    ],
  );
  assert.deepEqual(q.references.map((r: { p: number; source: string }) => [r.p, r.source]), [[0.6, "client's view"]]);
  assert.deepEqual(q.costs, { false_alarm: 1, miss: 4 });
  assert.equal(q.resolution.outcome, 'yes');
});

test('CRLF and LF line ends read the same; a quoted line break is kept exactly as written', () => {
  const rows = [line(['title', 'closes_at', 'forecast_at', 'p', 'note']), line(['Q', '2026-09-30T16:00:00Z', '2026-06-01T09:00:00Z', '0.4', 'a\r\nb\nc'])];
  const crlf = csvQuestions(rows.join('\r\n'));
  const lf = csvQuestions(rows.join('\n') + '\n');
  const cr = csvQuestions(rows.join('\r') + '\r');
  assert.deepEqual(crlf, lf);
  assert.deepEqual(cr, lf);
  assert.equal(crlf[0]!.forecasts[0]!.note, 'a\r\nb\nc');
});

test('rows without a question_id are grouped by title, and each group gets a new id on import', async () => {
  const text = csvText(
    row({ title: 'Pilot extended', closes_at: '2026-09-30T16:00:00Z', ...F1 }),
    row({ title: 'Pilot extended', closes_at: '2026-09-30T16:00:00Z', forecast_at: '2026-06-02T09:00:00Z', p: '0.45' }),
    row({ title: 'Second pilot', closes_at: '2026-10-30T16:00:00Z' }),
  );
  const questions = csvQuestions(text);
  assert.equal(questions.length, 2);
  assert.equal('id' in questions[0]!, false);
  const d = openTestDiary();
  await d.call('importText', { format: 'csv', text });
  const list = await d.call('listQuestions', {});
  assert.deepEqual(
    list.questions.map((q: { title: string; forecast_count: number }) => [q.title, q.forecast_count]),
    [
      ['Pilot extended', 2],
      ['Second pilot', 0],
    ],
  );
});

test('resolution, costs, base rate and lenses are read from their columns', () => {
  const [question] = csvQuestions(
    csvText(
      row({
        ...Q1,
        kind: 'State_At_Deadline',
        opened_at: '2026-05-01T09:00:00Z',
        time_zone: 'Europe/London',
        base_rate: '0.3',
        base_rate_note: '6 of 20',
        false_alarm_cost: '1',
        miss_cost: '4',
        checkin_days: '14',
        ...F1,
        lenses: '[{"name":"outside view","p":0.3}]',
        outcome: 'Yes',
        resolved_at: '2026-09-29T12:00:00Z',
        resolution_note: 'signed',
      }),
    ),
  );
  assert.deepEqual(question, {
    id: 'q1',
    title: 'Northgate renews',
    rule: '',
    kind: 'state_at_deadline',
    tags: [],
    opened_at: t('2026-05-01T09:00:00Z'),
    closes_at: t('2026-09-30T16:00:00.000Z'),
    time_zone: 'Europe/London',
    base_rate: 0.3,
    base_rate_note: '6 of 20',
    costs: { false_alarm: 1, miss: 4 },
    checkin_days: 14,
    // The lens weight defaults to 1, as in the JSON file.
    forecasts: [{ at: t('2026-06-01T09:00:00.000Z'), p: 0.4, note: '', lenses: [{ name: 'outside view', p: 0.3, weight: 1 }] }],
    references: [],
    resolution: { outcome: 'yes', at: t('2026-09-29T12:00:00Z'), note: 'signed' },
  });
});

test('a bad row in the middle rejects the whole file, naming its row and column; the diary is unchanged', async () => {
  const d = openTestDiary();
  await d.call('importDiary', { diary: buildDemoDiary(d.clock.now) });
  const before = d.service.diary.exportText('json').text;
  const text = csvText(
    row({ ...Q1, ...F1 }),
    row({ ...Q1, forecast_at: '2026-06-02T09:00:00.000Z', p: '0.5' }),
    row({ ...Q1, forecast_at: '2026-06-03T09:00:00.000Z', p: '1.5' }),
    row({ ...Q2, ...F1 }),
  );
  const message = 'Row 4, column p: must be a probability between 0 and 1. Nothing was imported.';
  refuses(text, message, 4, 'p');
  // Rows 2 and 3 were already written when row 4 was read: the one transaction takes them back.
  await assert.rejects(d.call('importText', { format: 'csv', text }), (err: unknown) => {
    assert.ok(err instanceof ApiError && err.code === 'invalid' && err.message === message);
    // The column's line says what is wrong and on which row, not the whole message again.
    assert.deepEqual(err.fields, ['p: must be a probability between 0 and 1 (row 4)']);
    return true;
  });
  assert.equal(d.service.diary.exportText('json').text, before);
});

test('a bad revision on a later row is refused in the same words as on any row: time, probability, note', () => {
  const later = (cells: Record<string, string>) => csvText(row({ ...Q1, ...F1 }), row({ ...Q1, forecast_at: '2026-06-02T09:00:00.000Z', p: '0.5', ...cells }));
  refuses(later({ forecast_at: 'soon' }), 'Row 3, column forecast_at: must be an ISO 8601 date-time with an offset or Z, e.g. 2026-03-31T17:00:00+01:00. Nothing was imported.', 3, 'forecast_at');
  refuses(later({ p: '0.5x' }), 'Row 3, column p: "0.5x" is not a number; write it with a decimal point and nothing else, e.g. 0.35. Nothing was imported.', 3, 'p');
  refuses(later({ p: '' }), /^Row 3, column p: is empty, but a revision needs both its time \(forecast_at\) and its/, 3, 'p');
  refuses(later({ note: 'ring\u0007' }), 'Row 3, column note: must not contain control characters other than tab and line breaks (found U+0007 at character 5). Nothing was imported.', 3, 'note');
  refuses(later({ reference_p: '0.3' }), /^Row 3, column reference_at: a row holds either a revision/, 3, 'reference_at');
});

test('a CSV whose later question is already in the diary adds none of its questions', async () => {
  // All-or-nothing (INTERFACES.md §1): the first question is valid and new, the second's id exists.
  const d = openTestDiary();
  await d.call('importText', { format: 'csv', text: csvText(row({ ...Q2, ...F1 })) });
  const before = d.service.diary.exportText('json').text;
  const again = csvText(row({ ...Q1, ...F1 }), row({ ...Q2, ...F1 }));
  await assert.rejects(
    d.call('importText', { format: 'csv', text: again }),
    (err: unknown) =>
      err instanceof ApiError &&
      err.code === 'conflict' &&
      err.message === 'Row 3, column question_id: "q2" is already in this diary (was this file imported before? Import it with merge to add only the questions that are new). Nothing was imported.',
  );
  assert.equal(d.service.diary.exportText('json').text, before);
});

test('header problems name the column', () => {
  refuses('', /^The CSV file has no header row/, 1, null);
  refuses('title,closes_at,probability\r\nQ,2026-09-30T16:00:00Z,0.4\r\n', /^Row 1 \(the header\): unknown column "probability"\. The columns are: question_id, title, /, 1, 'probability');
  refuses('title;closes_at\r\n', /semicolons or tabs between fields; save it as comma-separated CSV\. Nothing was imported\.$/, 1, 'title;closes_at');
  refuses('title,closes_at,p,P\r\n', 'Row 1 (the header): column "p" appears twice; keep one of them. Nothing was imported.', 1, 'p');
  refuses('title,forecast_at,p\r\n', 'Row 1 (the header): the required column "closes_at" is missing; add it. Nothing was imported.', 1, 'closes_at');
  assert.deepEqual(csvQuestions(`${HEADER}\r\n`), [], 'a header alone is an empty diary');
});

test('malformed CSV is refused with the row and the line of the problem', () => {
  // The quote opened in row 3 (line 3) is never closed; everything after it is inside it.
  refuses(
    'title,closes_at\n"Q one",2026-09-30T16:00:00Z\n"Q two,2026-09-30T16:00:00Z\nQ three,2026-09-30T16:00:00Z\n',
    'The file is not valid CSV: the quoted field that starts in row 3, line 3 is never closed. Add the missing closing double quote and import it again. Nothing was imported.',
    3,
    null,
  );
  refuses(
    'title,closes_at\n"Q "one",2026-09-30T16:00:00Z\n',
    'The file is not valid CSV at row 2, line 2: in a quoted field, the double quote before "o" ends the field early (a comma or the end of the line should follow it). A double quote inside a quoted field must be written twice (""); correct it and import again. Nothing was imported.',
    2,
    null,
  );
  refuses(
    'title,rule,closes_at\r\nQ one,"multi\nline",2026-09-30T16:00:00Z\r\nQ "two",,2026-09-30T16:00:00Z\r\n',
    'The file is not valid CSV at row 3, line 4: field 1 ("Q "") holds a double quote but does not start with one. A field holding commas, double quotes or line breaks must be enclosed in double quotes, with each double quote inside it doubled (""); correct it and import again. Nothing was imported.',
    3,
    null,
  );
  refuses(`${HEADER}\r\n"Q",2026-09-30T16:00:00Z\r\n`, `Row 2 has 2 fields but the header names ${CSV_COLUMNS.length} columns; check for a missing or extra comma, or an unquoted comma inside a field. Nothing was imported.`, 2, null);
});

test('each cell is checked with the diary file rules, and the message names row and column', () => {
  const cases: [Partial<Record<CsvColumn, string>>, string | RegExp, CsvColumn][] = [
    [{ ...Q1, title: '  ' }, 'must not be empty', 'title'],
    [{ ...Q1, closes_at: '30/09/2026' }, 'must be an ISO 8601 date-time with an offset or Z, e.g. 2026-03-31T17:00:00+01:00', 'closes_at'],
    [{ ...Q1, ...F1, p: '0,4' }, '"0,4" is not a number; write it with a decimal point and nothing else, e.g. 0.35', 'p'],
    [{ ...Q1, ...F1, p: '40%' }, '"40%" is not a number; write it with a decimal point and nothing else, e.g. 0.35', 'p'],
    [{ ...Q1, tags: 'renewals Client:North' }, '“Client:North” is not a valid tag: a tag is 1–64 lower-case letters, digits or - _ : . / starting with a letter or digit (e.g. client:northgate)', 'tags'],
    [{ ...Q1, tags: 'client:north, renewals' }, '“client:north,” is not a valid tag: a tag is 1–64 lower-case letters, digits or - _ : . / starting with a letter or digit (e.g. client:northgate); separate tags with spaces, not commas', 'tags'],
    [{ ...Q1, kind: 'sometime' }, 'must be event_by_deadline or state_at_deadline', 'kind'],
    [{ ...Q1, time_zone: 'Mars/Olympus' }, 'is not a time zone this system knows (use an IANA name such as Europe/London)', 'time_zone'],
    [{ ...Q1, checkin_days: '2.5' }, 'must be a whole number of days', 'checkin_days'],
    [{ ...Q1, false_alarm_cost: '1' }, 'is empty but the other cost is given; give both costs or neither (neither uses the diary defaults)', 'miss_cost'],
    [{ ...Q1, outcome: 'maybe', resolved_at: '2026-09-29T12:00:00Z' }, 'must be yes, no or void', 'outcome'],
    [{ ...Q1, outcome: 'yes' }, 'is empty, but outcome is set; give the time the question was resolved', 'resolved_at'],
    [{ ...Q1, resolution_note: 'done' }, 'is given but outcome is empty; give the outcome (yes, no or void) or clear the note', 'resolution_note'],
    [{ ...Q1, forecast_at: F1.forecast_at }, 'is empty, but a revision needs both its time (forecast_at) and its probability (p)', 'p'],
    [{ ...Q1, note: 'orphan note' }, 'belongs to a revision, but forecast_at and p are empty on this row; fill them in or clear this cell', 'note'],
    [{ ...Q1, ...F1, lenses: '[{name: "outside"}]' }, /^is not valid JSON \(.+\); write a list such as/, 'lenses'],
    [{ ...Q1, ...F1, lenses: '[{"name":"outside view","p":1.2,"weight":1}]' }, '[0].p: must be a probability between 0 and 1', 'lenses'],
    [{ ...Q1, ...F1, lenses: '[{"name":"outside view","p":1.2,"p":0.3}]' }, 'names "p" twice in one lens; keep one of them', 'lenses'],
    [{ ...Q1, ...F1, reference_at: F1.forecast_at, reference_p: '0.5', reference_source: 'client' }, /^a row holds either a revision \(forecast_at, p\) or a reference forecast/, 'reference_at'],
    [{ ...Q1, reference_at: F1.forecast_at, reference_p: '0.5' }, 'is empty, but a reference forecast needs its time, probability and source', 'reference_source'],
  ];
  for (const [values, reason, column] of cases) {
    const expected = typeof reason === 'string' ? `Row 3, column ${column}: ${reason}. Nothing was imported.` : new RegExp(`^Row 3, column ${column}: ${reason.source.slice(1)}`);
    refuses(csvText(row({ ...Q2, ...F1 }), row(values)), expected, 3, column);
  }
});

test("a question's rows must agree: the error names both rows and the column", () => {
  refuses(
    csvText(row({ ...Q2, ...F1 }), row({ ...Q1, ...F1 }), row({ ...Q2, ...F1 }), row({ ...Q1, base_rate: '0.3', forecast_at: '2026-06-02T09:00:00Z', p: '0.5' })),
    'Row 5, column base_rate: differs from row 3, which belongs to the same question (question_id "q1"); a question\'s columns must hold the same value on each of its rows. Nothing was imported.',
    5,
    'base_rate',
  );
  // Values are compared as read, so 0.30 and .3 agree.
  const same = csvQuestions(csvText(row({ ...Q1, base_rate: '0.30', ...F1 }), row({ ...Q1, base_rate: '.3', forecast_at: '2026-06-02T09:00:00Z', p: '0.5' })));
  assert.equal(same.length, 1);
  assert.equal(same[0]!.forecasts.length, 2);
});

test("a problem spanning a question's fields is reported at the question's first row", () => {
  refuses(
    csvText(row({ ...Q2, ...F1 }), row({ ...Q1, opened_at: '2026-10-01T00:00:00Z', ...F1 }), row({ ...Q1, opened_at: '2026-10-01T00:00:00Z', forecast_at: '2026-06-02T09:00:00Z', p: '0.5' })),
    'Row 3, column closes_at: must be after the opening time (opened_at). Nothing was imported.',
    3,
    'closes_at',
  );
});

test('rows of a question may be anywhere in the file (a sheet sorted by date), and read as if they stood together', async () => {
  const rows = {
    a1: row({ ...Q1, forecast_at: '2026-06-03T09:00:00.000Z', p: '0.3' }),
    b1: row({ ...Q2, forecast_at: '2026-06-02T09:00:00.000Z', p: '0.6' }),
    a2: row({ ...Q1, forecast_at: '2026-06-01T09:00:00.000Z', p: '0.2', note: 'earlier, written later' }),
    b2: row({ ...Q2, reference_at: '2026-06-04T09:00:00.000Z', reference_p: '0.5', reference_source: 'client' }),
    a3: row({ ...Q1, forecast_at: '2026-06-05T09:00:00.000Z', p: '0.35' }),
  };
  const interleaved = openTestDiary();
  await interleaved.call('importText', { format: 'csv', text: csvText(rows.a1, rows.b1, rows.a2, rows.b2, rows.a3) });
  const grouped = openTestDiary();
  await grouped.call('importText', { format: 'csv', text: csvText(rows.a1, rows.a2, rows.a3, rows.b1, rows.b2) });
  assert.equal(interleaved.service.diary.exportText('json').text, grouped.service.diary.exportText('json').text);
  // Without an opened_at column the question opens at its earliest revision, wherever its row is.
  const q1 = await interleaved.call('getQuestion', { id: 'q1' });
  assert.equal(q1.opened_at, '2026-06-01T09:00:00.000Z');
  assert.deepEqual(q1.forecasts.map((f: { p: number }) => f.p), [0.2, 0.3, 0.35]);
});
