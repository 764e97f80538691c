/**
 * Choice and numeric questions in the CSV diary (docs/csv-format.md, "Choice and numeric
 * questions"): the columns export writes, what import reads back, and each rule refused
 * with the row and the column a spreadsheet shows. Rules and messages come from the
 * shared type rules (shared/question-types.ts, INTERFACES.md "Question types").
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { CSV_ALL_COLUMNS, CSV_COLUMNS, CSV_HEADER, CsvError, diaryCsvBytes, readCsvDiary, type CsvColumn } from '../../main/service/csv';
import type { ExportedQuestion, FileQuestion } from '../../shared/diary-file';
import { openTestDiary } from '../support/temp-diary';

const HEADER = CSV_ALL_COLUMNS.join(',');

function line(cells: string[]): string {
  return cells.map((c) => `"${c.replaceAll('"', '""')}"`).join(',');
}

/** A full-width row of the typed layout: the given columns filled, the rest empty. */
function row(values: Partial<Record<CsvColumn, string>>): string {
  return line(CSV_ALL_COLUMNS.map((c) => values[c] ?? ''));
}

function csvText(...rows: string[]): string {
  return [HEADER, ...rows].join('\r\n') + '\r\n';
}

/** What import reads, loosely typed: the records carry every type's fields (shared/diary-file.ts). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Read = any;

function csvQuestions(text: string): Read[] {
  const questions: FileQuestion[] = [];
  for (const item of readCsvDiary([text])) {
    if (item.kind === 'question') questions[item.index] = structuredClone(item.question);
    else {
      const q = questions[item.index]!;
      if (item.forecast) q.forecasts.push(item.forecast);
      if (item.reference) q.references!.push(item.reference);
    }
  }
  return questions;
}

function refuses(text: string, message: string, rowNumber: number, column: string): void {
  assert.throws(
    () => csvQuestions(text),
    (err: unknown) => {
      assert.ok(err instanceof CsvError, `a CsvError, got ${String(err)}`);
      assert.equal(err.message, message);
      assert.equal(err.row, rowNumber);
      assert.equal(err.column, column);
      return true;
    },
  );
}

const t = (iso: string) => Date.parse(iso);

const CHOICE = {
  question_id: 'c1',
  title: 'Which supplier will the client pick?',
  closes_at: '2026-09-30T16:00:00.000Z',
  type: 'choice',
  options: '["Brackenfold","Orrin","Neither, re-tender"]',
  ordered: 'false',
};
const NUMERIC = {
  question_id: 'n1',
  title: 'Weeks from kickoff to go-live',
  closes_at: '2026-09-30T16:00:00.000Z',
  type: 'numeric',
  unit: 'weeks',
  value_kind: 'number',
  levels: '0.1 0.5 0.9',
};
const DATED = { ...NUMERIC, question_id: 'd1', title: 'When will the board sign?', unit: '', value_kind: 'date' };

test('a choice question reads back with its options, vectors and the option that came true (by its label)', () => {
  const resolved = { outcome: 'option', outcome_option: 'Orrin', resolved_at: '2026-09-20T10:00:00.000Z', resolution_note: 'Orrin won' };
  const [q] = csvQuestions(
    csvText(
      row({ ...CHOICE, ...resolved, option_base_rates: '0.45 0.35 0.2', base_rate_note: '20 awards', forecast_at: '2026-06-01T09:00:00.000Z', probs: '0.5 0.3 0.2', note: 'first' }),
      row({ ...CHOICE, ...resolved, option_base_rates: '0.45 0.35 0.2', base_rate_note: '20 awards', forecast_at: '2026-07-01T09:00:00.000Z', probs: '.85 0.12 3e-2' }),
      row({ ...CHOICE, ...resolved, option_base_rates: '0.45 0.35 0.2', base_rate_note: '20 awards', reference_at: '2026-06-15T12:00:00.000Z', reference_probs: '0.6 0.3 0.1', reference_source: "client's view" }),
    ),
  );
  assert.deepEqual(q, {
    id: 'c1',
    title: 'Which supplier will the client pick?',
    rule: '',
    tags: [],
    closes_at: t('2026-09-30T16:00:00.000Z'),
    type: 'choice',
    options: ['Brackenfold', 'Orrin', 'Neither, re-tender'],
    ordered: false,
    option_base_rates: [0.45, 0.35, 0.2],
    base_rate_note: '20 awards',
    forecasts: [
      { at: t('2026-06-01T09:00:00.000Z'), probs: [0.5, 0.3, 0.2], note: 'first' },
      { at: t('2026-07-01T09:00:00.000Z'), probs: [0.85, 0.12, 0.03], note: '' },
    ],
    references: [{ at: t('2026-06-15T12:00:00.000Z'), probs: [0.6, 0.3, 0.1], source: "client's view" }],
    resolution: { outcome: 'option', option: 1, at: t('2026-09-20T10:00:00.000Z'), note: 'Orrin won' },
  });
});

test('numeric questions read back with their levels and values, numbers or calendar dates', () => {
  const [n, d] = csvQuestions(
    csvText(
      row({ ...NUMERIC, forecast_at: '2026-06-01T09:00:00.000Z', quantiles: '10 14.5 2e1', outcome: 'VALUE', outcome_value: '29', resolved_at: '2026-09-01T09:00:00.000Z' }),
      row({ ...DATED, levels: '', forecast_at: '2026-06-01T09:00:00.000Z', quantiles: '2026-07-01  2026-07-15 2026-08-30' }),
      row({ ...DATED, levels: '', reference_at: '2026-06-02T09:00:00.000Z', reference_quantiles: '2026-07-01 2026-07-01 2026-07-02', reference_source: 'plan' }),
    ),
  );
  assert.equal(n!.type, 'numeric');
  assert.deepEqual([n!.unit, n!.value_kind, n!.levels], ['weeks', 'number', [0.1, 0.5, 0.9]]);
  assert.deepEqual(n!.forecasts, [{ at: t('2026-06-01T09:00:00.000Z'), quantiles: [10, 14.5, 20], note: '' }]);
  assert.deepEqual(n!.resolution, { outcome: 'value', value: 29, at: t('2026-09-01T09:00:00.000Z'), note: '' });
  // An empty unit cell and an empty levels cell read as absent: the defaults ('' and 0.1 0.5 0.9) apply.
  assert.equal(d!.unit, undefined);
  assert.equal(d!.levels, undefined);
  assert.deepEqual(d!.forecasts[0]!.quantiles, ['2026-07-01', '2026-07-15', '2026-08-30']);
  assert.deepEqual(d!.references![0]!.quantiles, ['2026-07-01', '2026-07-01', '2026-07-02']);
});

test('each type rule is refused with its row and column, and nothing is imported', () => {
  const F = { forecast_at: '2026-06-01T09:00:00.000Z' };
  const nothing = '. Nothing was imported.';
  // The vector's sum, one ulp either side of the 1e-6 tolerance: shared/choice-vector.ts, INTERFACES.md.
  refuses(csvText(row({ ...CHOICE, ...F, probs: '0.5 0.3 0.1' })), `Row 2, column probs: must sum to 100 %, they sum to 90 % (10 % short)${nothing}`, 2, 'probs');
  assert.equal(csvQuestions(csvText(row({ ...CHOICE, ...F, probs: '0.5 0.3 0.2000009' })))[0]!.forecasts.length, 1);
  refuses(csvText(row({ ...CHOICE, ...F, probs: '0.5 0.5' })), `Row 2, column probs: must give one probability per option (3), not 2${nothing}`, 2, 'probs');
  refuses(csvText(row({ ...CHOICE, ...F, probs: '50% 30% 20%' })), `Row 2, column probs: "50%" is not a number; separate the numbers with spaces and write each with a decimal point, e.g. 0.5 0.3 0.2${nothing}`, 2, 'probs');
  // A number beyond the largest double is refused as too large, not read as Infinity and called "not a number".
  refuses(csvText(row({ ...CHOICE, ...F, probs: '0.5 0.5 1e400' })), `Row 2, column probs: "1e400" is beyond about ±1.8e308, too large a number to hold; write a smaller one${nothing}`, 2, 'probs');
  refuses(
    csvText(row({ ...NUMERIC, outcome: 'value', outcome_value: '-1e400', resolved_at: '2026-09-01T09:00:00.000Z' })),
    `Row 2, column outcome_value: "-1e400" is beyond about ±1.8e308, too large a number to hold; write a smaller one${nothing}`,
    2,
    'outcome_value',
  );
  refuses(csvText(row({ ...CHOICE, ...F, p: '0.4' })), `Row 2, column p: does not apply: a choice question takes probs, one probability per option${nothing}`, 2, 'p');
  refuses(csvText(row({ ...CHOICE, ...F })), `Row 2, column probs: is empty, but a revision needs both its time (forecast_at) and its probabilities (probs)${nothing}`, 2, 'probs');
  refuses(csvText(row({ ...CHOICE, base_rate: '0.3' })), `Row 2, column base_rate: applies to yes/no questions only; this is a choice question${nothing}`, 2, 'base_rate');
  refuses(csvText(row({ ...CHOICE, options: '["A","A"]' })), `Row 2, column options: [1]: repeats option 0 ("A"); each option must be different${nothing}`, 2, 'options');
  refuses(
    csvText(row({ ...CHOICE, outcome: 'option', outcome_option: 'orrin', resolved_at: '2026-09-20T10:00:00.000Z' })),
    `Row 2, column outcome_option: "orrin" is not one of the options ("Brackenfold", "Orrin", "Neither, re-tender"); write the label exactly as in options${nothing}`,
    2,
    'outcome_option',
  );
  refuses(
    csvText(row({ ...CHOICE, outcome: 'yes', resolved_at: '2026-09-20T10:00:00.000Z' })),
    `Row 2, column outcome: must be option or void for a choice question (got yes)${nothing}`,
    2,
    'outcome',
  );
  refuses(
    csvText(row({ ...CHOICE, outcome: 'option', resolved_at: '2026-09-20T10:00:00.000Z' })),
    `Row 2, column outcome_option: is required with outcome option: the 0-based index of the option that came true${nothing}`,
    2,
    'outcome_option',
  );
  refuses(csvText(row({ ...CHOICE, ordered: 'yes' })), `Row 2, column ordered: "yes" is not true or false${nothing}`, 2, 'ordered');
  refuses(csvText(row({ question_id: 'b', title: 'Yes/no', closes_at: '2026-09-30T16:00:00.000Z', options: '["A","B"]' })), `Row 2, column options: applies to choice questions only; this is a yes/no question${nothing}`, 2, 'options');

  refuses(
    csvText(row({ ...NUMERIC, ...F, quantiles: '10 9.999999999999998 20' })),
    `Row 2, column quantiles: must not decrease from one level to the next: entry 1 (9.999999999999998) is below entry 0 (10)${nothing}`,
    2,
    'quantiles',
  );
  assert.equal(csvQuestions(csvText(row({ ...NUMERIC, ...F, quantiles: '10 10 20' })))[0]!.forecasts.length, 1, 'equal neighbours are allowed');
  refuses(csvText(row({ ...NUMERIC, ...F, quantiles: '10 20' })), `Row 2, column quantiles: must give one value per level (3), not 2${nothing}`, 2, 'quantiles');
  // A date question's cell names the bad value as written, not by a list position the sheet never shows ("[1]"), and a
  // number there is called what it is (it was called "must be a number, or a date", with got the text "1").
  const DATES_HINT = 'write each date as YYYY-MM-DD, separated by spaces, e.g. 2026-09-15 2026-10-20 2026-12-01';
  refuses(csvText(row({ ...DATED, ...F, quantiles: '2026-07-01 2026-02-30 2026-08-01' })), `Row 2, column quantiles: "2026-02-30" is not a real calendar date; ${DATES_HINT}${nothing}`, 2, 'quantiles');
  refuses(csvText(row({ ...DATED, ...F, quantiles: '1 2 3' })), `Row 2, column quantiles: "1" is not a date, and this question's values are dates; ${DATES_HINT}${nothing}`, 2, 'quantiles');
  refuses(csvText(row({ ...DATED, ...F, quantiles: '2026-07-01 2026-7-2 2026-08-01' })), `Row 2, column quantiles: "2026-7-2" is not a date, and this question's values are dates; ${DATES_HINT}${nothing}`, 2, 'quantiles');
  refuses(
    csvText(row({ ...DATED, reference_at: '2026-06-02T09:00:00.000Z', reference_source: 'plan', reference_quantiles: '2026-07-01 45000 2026-08-01' })),
    `Row 2, column reference_quantiles: "45000" is not a date, and this question's values are dates; ${DATES_HINT}${nothing}`,
    2,
    'reference_quantiles',
  );
  refuses(
    csvText(row({ ...DATED, outcome: 'value', outcome_value: '16.5', resolved_at: '2026-09-01T09:00:00.000Z' })),
    `Row 2, column outcome_value: "16.5" is not a date, and this question's values are dates; write the date as YYYY-MM-DD, e.g. 2026-09-15${nothing}`,
    2,
    'outcome_value',
  );
  refuses(csvText(row({ ...NUMERIC, ...F, quantiles: '2026-07-01 2026-07-02 2026-07-03' })), `Row 2, column quantiles: "2026-07-01" is not a number; separate the numbers with spaces and write each with a decimal point, e.g. 0.5 0.3 0.2${nothing}`, 2, 'quantiles');
  refuses(csvText(row({ ...NUMERIC, ...F, quantiles: '1 2 3', lenses: '[{"name":"outside view","p":0.3}]' })), `Row 2, column lenses: apply to yes/no questions only; this is a numeric question${nothing}`, 2, 'lenses');
  refuses(csvText(row({ ...NUMERIC, levels: '0.1 0.5' })), `Row 2, column levels: must be symmetric around 0.5: 0.1 needs 0.9${nothing}`, 2, 'levels');
  refuses(csvText(row({ ...NUMERIC, outcome_value: '12' })), `Row 2, column outcome_value: is given but outcome is empty; give the outcome (value or void) or clear outcome_value${nothing}`, 2, 'outcome_value');
  refuses(
    csvText(row({ ...NUMERIC, ...F, quantiles: '1 2 3' }), row({ ...NUMERIC, unit: 'days', reference_at: '2026-06-02T09:00:00.000Z', reference_quantiles: '1 2 3', reference_source: 'plan' })),
    `Row 3, column unit: differs from row 2, which belongs to the same question (question_id "n1"); a question's columns must hold the same value on each of its rows${nothing}`,
    3,
    'unit',
  );
  refuses(
    csvText(row({ ...NUMERIC, reference_at: '2026-06-02T09:00:00.000Z', reference_quantiles: '1 2 3' })),
    `Row 2, column reference_source: is empty, but a reference forecast needs its time, values and source${nothing}`,
    2,
    'reference_source',
  );
});

/** Questions as export hands them to the CSV writer. */
const EXPORTED: ExportedQuestion[] = [
  {
    id: 'b1',
    type: 'binary',
    title: 'Yes/no with a reference',
    rule: '',
    kind: 'event_by_deadline',
    tags: ['a'],
    opened_at: '2026-05-01T09:00:00.000Z',
    closes_at: '2026-09-30T16:00:00.000Z',
    time_zone: 'Europe/London',
    base_rate: 0.1 + 0.2,
    base_rate_note: '',
    costs: { false_alarm: 1, miss: 4 },
    checkin_days: null,
    forecasts: [{ at: '2026-05-01T09:05:00.000Z', p: 0.4, note: 'n', lenses: [] }],
    references: [{ at: '2026-05-02T09:05:00.000Z', p: 0.5, source: 'client' }],
    resolution: null,
    resolution_history: [],
  },
  {
    id: 'c1',
    type: 'choice',
    title: 'Which "supplier", really?',
    rule: 'Award notice',
    kind: 'event_by_deadline',
    tags: [],
    opened_at: '2026-05-01T09:00:00.000Z',
    closes_at: '2026-09-30T16:00:00.000Z',
    time_zone: 'Europe/London',
    base_rate_note: 'twenty awards',
    checkin_days: 7,
    options: ['Brackenfold', 'Orrin, "the cheap one"', 'Neither'],
    ordered: true,
    option_base_rates: [0.45, 0.35, 0.2],
    forecasts: [
      { at: '2026-05-01T09:05:00.000Z', probs: [0.1 + 0.2, 0.5, 0.19999999999999998], note: 'line one\nline two' },
      { at: '2026-06-01T09:05:00.000Z', probs: [0.85, 0.12, 0.03], note: '' },
    ],
    references: [{ at: '2026-05-03T09:05:00.000Z', probs: [0.6, 0.3, 0.1], source: "client's view" }],
    resolution: { outcome: 'option', option: 1, at: '2026-09-20T10:00:00.000Z', note: 'Orrin, "the cheap one", won' },
    resolution_history: [],
  },
  {
    id: 'n1',
    type: 'numeric',
    title: 'Weeks to go-live',
    rule: '',
    kind: 'event_by_deadline',
    tags: [],
    opened_at: '2026-05-01T09:00:00.000Z',
    closes_at: '2026-09-30T16:00:00.000Z',
    time_zone: 'Europe/London',
    base_rate_note: '',
    checkin_days: null,
    unit: '£k, net',
    value_kind: 'number',
    levels: [0.05, 0.25, 0.5, 0.75, 0.95],
    forecasts: [{ at: '2026-05-01T09:05:00.000Z', quantiles: [1e-7, 0.1 + 0.2, 14, 20, 1e21], note: '' }],
    references: [],
    resolution: { outcome: 'value', value: -0.5, at: '2026-09-20T10:00:00.000Z', note: '' },
    resolution_history: [],
  },
  {
    id: 'd1',
    type: 'numeric',
    title: 'When will the board sign?',
    rule: '',
    kind: 'event_by_deadline',
    tags: [],
    opened_at: '2026-05-01T09:00:00.000Z',
    closes_at: '2026-09-30T16:00:00.000Z',
    time_zone: 'Europe/London',
    base_rate_note: '',
    checkin_days: null,
    unit: '',
    value_kind: 'date',
    levels: [0.1, 0.5, 0.9],
    forecasts: [],
    references: [],
    resolution: null,
    resolution_history: [],
  },
];

/** The CSV export's text of these batches of questions (each held whole, none packed). */
function exportedCsv(batches: ExportedQuestion[][], withTypes?: boolean): string {
  let text = '';
  // Each piece decoded before the next is written over it.
  for (const piece of diaryCsvBytes(batches.map((questions) => ({ questions, packed: null })), withTypes)) text += Buffer.from(piece).toString('utf8');
  return text;
}

test('export writes the type columns only when asked, and every type reads back as written', () => {
  const plain = exportedCsv([[EXPORTED[0]!]]);
  assert.ok(plain.startsWith(CSV_HEADER), 'a diary of yes/no questions keeps the columns it always had');
  assert.equal(plain.split('\r\n')[1]!.split(',').length, CSV_COLUMNS.length);
  assert.throws(() => exportedCsv([EXPORTED]), /c1 is a choice question, but the export was started without the type columns/);

  const text = exportedCsv([EXPORTED.slice(0, 2), EXPORTED.slice(2)], true);
  assert.ok(text.startsWith(`${HEADER}\r\n`));
  // Full precision, and lists separated by spaces (docs/csv-format.md).
  // probs is followed by quantiles, reference_probs and reference_quantiles (empty on a revision's row).
  assert.ok(text.includes(',0.30000000000000004 0.5 0.19999999999999998,,,\r\n'), 'probs at full precision');
  assert.ok(text.includes(',1e-7 0.30000000000000004 14 20 1e+21,,\r\n'), 'quantiles at full precision');
  assert.ok(text.includes(',"[""Brackenfold"",""Orrin, \\""the cheap one\\"""",""Neither""]",true,0.45 0.35 0.2,'), 'options as JSON text');
  const [b, c, n, d] = csvQuestions(text);
  assert.equal(b!.base_rate, 0.30000000000000004);
  assert.equal(b!.type, 'binary');
  assert.deepEqual(c.forecasts.map((f: { probs: number[] }) => f.probs), [[0.30000000000000004, 0.5, 0.19999999999999998], [0.85, 0.12, 0.03]]);
  assert.deepEqual(c!.resolution, { outcome: 'option', option: 1, at: t('2026-09-20T10:00:00.000Z'), note: 'Orrin, "the cheap one", won' });
  assert.deepEqual([c!.options, c!.ordered, c!.option_base_rates, c!.base_rate_note, c!.checkin_days], [EXPORTED[1]!.type === 'choice' && EXPORTED[1]!.options, true, [0.45, 0.35, 0.2], 'twenty awards', 7]);
  assert.deepEqual(n!.forecasts[0], { at: t('2026-05-01T09:05:00.000Z'), quantiles: [1e-7, 0.30000000000000004, 14, 20, 1e21], note: '' });
  assert.deepEqual([n!.unit, n!.levels, n!.resolution], ['£k, net', [0.05, 0.25, 0.5, 0.75, 0.95], { outcome: 'value', value: -0.5, at: t('2026-09-20T10:00:00.000Z'), note: '' }]);
  assert.deepEqual([d!.value_kind, d!.levels, d!.forecasts, d!.references], ['date', [0.1, 0.5, 0.9], [], []]);
});

test('the choice and numeric example in docs/csv-format.md imports as documented and exports the same rows', async () => {
  const doc = fs.readFileSync(path.join(import.meta.dirname, '..', '..', 'docs', 'csv-format.md'), 'utf8');
  const example = [...doc.matchAll(/```csv\n([\s\S]*?)```/g)][1]![1]!;
  const d = openTestDiary();
  assert.equal((await d.call('importText', { format: 'csv', text: example })).added, 2);
  const choice = await d.call('getQuestion', { id: 'q2' });
  assert.deepEqual([choice.type, choice.options, choice.option_base_rates, choice.forecasts[0].probs], ['choice', ['Brackenfold', 'Orrin', 'Neither'], [0.45, 0.35, 0.2], [0.55, 0.3, 0.15]]);
  assert.deepEqual([choice.resolution.outcome, choice.resolution.option], ['option', 1]);
  const numeric = await d.call('getQuestion', { id: 'q3' });
  assert.deepEqual([numeric.unit, numeric.levels, numeric.forecasts[0].quantiles, numeric.references[0].quantiles], ['weeks', [0.1, 0.5, 0.9], [10, 14, 20], [11, 12, 14]]);
  // The documentation shows what export writes, line for line (with CRLF line ends).
  assert.equal((await d.call('exportText', { format: 'csv' })).text, example.replaceAll('\n', '\r\n'));
});

test('the example diary through CSV: merge skips every unchanged question of every type; a bad choice row imports nothing', async () => {
  const d = openTestDiary();
  await d.call('loadDemo', {});
  const csv = (await d.call('exportText', { format: 'csv' })).text as string;
  const before = (await d.call('exportDiary', {})) as { questions: { type?: string }[] };
  assert.ok(before.questions.some((q) => q.type === 'choice') && before.questions.some((q) => q.type === 'numeric'));
  assert.deepEqual(await d.call('importText', { format: 'csv', text: csv, merge: true }), { added: 0, skipped: before.questions.length });

  // One choice revision that does not sum to 100 %, in the middle of the file: nothing is imported.
  const fresh = openTestDiary();
  const lines = csv.split('\r\n');
  const at = lines.findIndex((l) => l.includes(',0.85 0.12 0.03,'));
  assert.ok(at > 1, 'the example diary has the Wendlebrook revision at 85 %');
  lines[at] = lines[at]!.replace(',0.85 0.12 0.03,', ',0.85 0.12 0.02,');
  await assert.rejects(fresh.call('importText', { format: 'csv', text: lines.join('\r\n') }), (err: Error) => {
    assert.equal(err.message, `Row ${at + 1}, column probs: must sum to 100 %, they sum to 99 % (1 % short). Nothing was imported.`);
    return true;
  });
  assert.equal((await fresh.call('listQuestions', {})).questions.length, 0);
});
