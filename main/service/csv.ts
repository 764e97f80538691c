/**
 * The whole diary as CSV, one row per revision (docs/csv-format.md), for people who keep
 * their numbers in a spreadsheet. CSV is a second spelling of the diary file (JSON v1,
 * INTERFACES.md §1): export starts from the JSON export object and import ends in one, so
 * the JSON schema stays the single home of every field rule. Import is all-or-nothing and
 * every error names the CSV row (the header is row 1, as a spreadsheet numbers them) and
 * the column, because a record index means nothing to someone looking at a spreadsheet.
 */
import { parse, CsvError as CsvSyntaxError } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import type { z } from 'zod';
import { DIARY_FORMAT, DIARY_VERSION, DiaryFileError, fileQuestion, parseDiaryFile, type FileQuestion } from '../../shared/diary-file';
import * as v from '../../shared/validation';

/** The columns, in the order export writes them. */
export const CSV_COLUMNS = [
  'question_id',
  'title',
  'rule',
  'kind',
  'tags',
  'opened_at',
  'closes_at',
  'time_zone',
  'base_rate',
  'base_rate_note',
  'false_alarm_cost',
  'miss_cost',
  'checkin_days',
  'forecast_at',
  'p',
  'note',
  'lenses',
  'outcome',
  'resolved_at',
  'resolution_note',
  'reference_at',
  'reference_p',
  'reference_source',
] as const;

export type CsvColumn = (typeof CSV_COLUMNS)[number];

/** A CSV file that cannot be imported; `row` counts the header as row 1. */
export class CsvError extends Error {
  constructor(
    message: string,
    readonly row: number | null,
    readonly column: string | null,
  ) {
    super(message);
    this.name = 'CsvError';
  }
}

/** The JSON v1 diary file that `csvToDiary` produces (no settings: CSV does not carry them). */
export interface CsvDiaryFile {
  format: typeof DIARY_FORMAT;
  version: typeof DIARY_VERSION;
  questions: Record<string, unknown>[];
}

// The same rules the JSON import applies, taken from its schema so the two cannot drift apart.
const Q = fileQuestion.shape;
const F = Q.forecasts.element.shape;
const REF = Q.references.unwrap().element.shape;
const RES = Q.resolution.unwrap().unwrap().shape;
const COST = v.costs.shape;

// ---------------------------------------------------------------------------------------
// Export

type Cells = Partial<Record<CsvColumn, string>>;

/** The columns describing the question itself, repeated on each of its rows. */
function questionCells(q: FileQuestion): Cells {
  return {
    question_id: q.id ?? '',
    title: q.title,
    rule: q.rule ?? '',
    kind: q.kind ?? '',
    tags: (q.tags ?? []).join(' '),
    opened_at: q.opened_at ?? '',
    closes_at: q.closes_at,
    time_zone: q.time_zone ?? '',
    base_rate: q.base_rate == null ? '' : String(q.base_rate),
    base_rate_note: q.base_rate_note ?? '',
    false_alarm_cost: q.costs ? String(q.costs.false_alarm) : '',
    miss_cost: q.costs ? String(q.costs.miss) : '',
    checkin_days: q.checkin_days == null ? '' : String(q.checkin_days),
    outcome: q.resolution?.outcome ?? '',
    resolved_at: q.resolution?.at ?? '',
    resolution_note: q.resolution?.note ?? '',
  };
}

/**
 * Writes a diary file object (what `exportDiary` returns) as CSV text: a header row, then
 * per question one row per revision, then one row per reference forecast, or a single row
 * when it has neither. Numbers keep full precision (`String(number)` reads back to the
 * same double); lines end in CRLF and fields holding a comma, a double quote, CR or LF
 * are quoted, as RFC 4180 §2 prescribes.
 */
export function diaryToCsv(diary: Record<string, unknown>): string {
  const { questions } = parseDiaryFile(diary);
  const rows: string[][] = [[...CSV_COLUMNS]];
  for (const q of questions) {
    const base = questionCells(q);
    const lines: Cells[] = [
      ...q.forecasts.map((f) => ({
        ...base,
        forecast_at: f.at,
        p: String(f.p),
        note: f.note ?? '',
        lenses: f.lenses?.length ? JSON.stringify(f.lenses.map((l) => ({ name: l.name, p: l.p, weight: l.weight }))) : '',
      })),
      ...(q.references ?? []).map((r) => ({ ...base, reference_at: r.at, reference_p: String(r.p), reference_source: r.source })),
    ];
    if (lines.length === 0) lines.push(base);
    for (const cells of lines) rows.push(CSV_COLUMNS.map((c) => cells[c] ?? ''));
  }
  // csv-stringify quotes a lone CR or LF only when told to: it looks for the whole record
  // delimiter (CRLF), and a note's bare LF would otherwise split the row.
  return stringify(rows, { record_delimiter: 'windows', quoted_match: /[\r\n]/ });
}

// ---------------------------------------------------------------------------------------
// Import

function nothingImported(row: number, column: string, reason: string): CsvError {
  return new CsvError(`Row ${row}, column ${column}: ${reason}. Nothing was imported.`, row, column);
}

/** Applies a schema to one cell's value; the first problem becomes a row-and-column error. */
function check<T>(schema: z.ZodType<T>, value: unknown, row: number, column: string): T {
  const r = schema.safeParse(value);
  if (r.success) return r.data;
  const issue = r.error.issues[0]!;
  const inner = v.formatPath(issue.path);
  throw nothingImported(row, column, inner ? `${inner}: ${issue.message}` : issue.message);
}

// Plain decimal notation with an optional exponent: what String(number) writes and what a
// spreadsheet saves. Number() alone would also take "", "0x1A" and "Infinity".
const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

function numberCell(text: string, row: number, column: string): number {
  const t = text.trim();
  if (!NUMBER.test(t)) {
    throw nothingImported(row, column, `"${t}" is not a number; write it with a decimal point and nothing else, e.g. 0.35`);
  }
  return Number(t);
}

/** Reads the text into records, turning csv-parse's syntax errors into ones that say what to fix. */
function readRecords(text: string): string[][] {
  try {
    // No skip_empty_lines: an empty line is a row a spreadsheet numbers too, so keeping it
    // keeps row numbers right; empty rows are dropped later. Uneven rows are let through so
    // the field-count error can name the row.
    return parse(text, { bom: true, relax_column_count: true, record_delimiter: ['\r\n', '\n', '\r'] });
  } catch (err) {
    if (!(err instanceof CsvSyntaxError)) throw err;
    // Syntax errors carry the line where parsing stopped and the count of complete records.
    const line = Number(err.lines);
    const row = Number(err.records) + 1;
    const message =
      err.code === 'CSV_QUOTE_NOT_CLOSED'
        ? `The file is not valid CSV: a quoted field in row ${row} is never closed (the file ends at line ${line} still inside the quotes). Add the missing closing double quote and import it again. Nothing was imported.`
        : `The file is not valid CSV at row ${row}, line ${line}: ${err.message}. A field holding commas, double quotes or line breaks must be enclosed in double quotes, with each double quote inside it doubled (""); correct it and import again. Nothing was imported.`;
    throw new CsvError(message, row, null);
  }
}

/** Maps the header's names to positions: every name must be a documented column, once. */
function readHeader(header: string[] | undefined): Map<CsvColumn, number> {
  if (!header || header.every((cell) => cell.trim() === '')) {
    throw new CsvError(
      'The CSV file has no header row: its first row must name the columns (question_id, title, closes_at, …; see the CSV format in the documentation). Nothing was imported.',
      1,
      null,
    );
  }
  const known = new Set<string>(CSV_COLUMNS);
  const positions = new Map<CsvColumn, number>();
  header.forEach((cell, index) => {
    const name = cell.trim().toLowerCase();
    if (!known.has(name)) {
      const hint = /[;\t]/.test(cell) ? ' The file seems to use semicolons or tabs between fields; save it as comma-separated CSV.' : '';
      const shown = name === '' ? `column ${index + 1} has no name` : `unknown column "${cell.trim()}"`;
      throw new CsvError(`Row 1 (the header): ${shown}. The columns are: ${CSV_COLUMNS.join(', ')}.${hint} Nothing was imported.`, 1, cell.trim());
    }
    if (positions.has(name as CsvColumn)) {
      throw new CsvError(`Row 1 (the header): column "${name}" appears twice; keep one of them. Nothing was imported.`, 1, name);
    }
    positions.set(name as CsvColumn, index);
  });
  for (const required of ['title', 'closes_at'] as const) {
    if (!positions.has(required)) {
      throw new CsvError(`Row 1 (the header): the required column "${required}" is missing; add it. Nothing was imported.`, 1, required);
    }
  }
  return positions;
}

/** The columns that describe a revision or a reference forecast, not the question. */
const POINT_COLUMNS = ['forecast_at', 'p', 'note', 'lenses', 'reference_at', 'reference_p', 'reference_source'] as const satisfies readonly CsvColumn[];
type QuestionColumn = Exclude<CsvColumn, (typeof POINT_COLUMNS)[number]>;

/** The columns a question's rows must agree on: every other one, in export order. */
const QUESTION_COLUMNS: readonly QuestionColumn[] = CSV_COLUMNS.filter(
  (c): c is QuestionColumn => !(POINT_COLUMNS as readonly CsvColumn[]).includes(c),
);


interface CsvRow {
  row: number;
  /** Each question column's value as read (undefined when empty), compared across a question's rows. */
  question: Record<QuestionColumn, unknown>;
  forecast: { at: string; p: number; note: string; lenses?: unknown[] } | null;
  reference: { at: string; p: number; source: string } | null;
}

function readRow(cell: (c: CsvColumn) => string, row: number): CsvRow {
  const trimmed = (c: CsvColumn): string | undefined => cell(c).trim() || undefined;
  const text = (c: CsvColumn, schema: z.ZodType<unknown>): unknown => check(schema, cell(c), row, c);
  const optional = (c: CsvColumn, schema: z.ZodType<unknown>, read: (t: string) => unknown = (t) => t) => {
    const t = trimmed(c);
    return t === undefined ? undefined : check(schema, read(t), row, c);
  };
  const num = (c: CsvColumn) => (t: string) => numberCell(t, row, c);

  const tags = cell('tags').trim();
  const question: Record<QuestionColumn, unknown> = {
    // An id is any text, kept exactly; only an empty cell means "no id".
    question_id: cell('question_id').trim() === '' ? undefined : check(Q.id, cell('question_id'), row, 'question_id'),
    title: text('title', Q.title),
    rule: text('rule', Q.rule),
    kind: optional('kind', Q.kind, (t) => t.toLowerCase()),
    tags: check(Q.tags, tags === '' ? [] : tags.split(/\s+/), row, 'tags'),
    opened_at: optional('opened_at', Q.opened_at),
    closes_at: check(Q.closes_at, cell('closes_at').trim(), row, 'closes_at'),
    time_zone: optional('time_zone', Q.time_zone),
    base_rate: optional('base_rate', Q.base_rate, num('base_rate')),
    base_rate_note: cell('base_rate_note') === '' ? undefined : text('base_rate_note', Q.base_rate_note),
    false_alarm_cost: optional('false_alarm_cost', COST.false_alarm, num('false_alarm_cost')),
    miss_cost: optional('miss_cost', COST.miss, num('miss_cost')),
    checkin_days: optional('checkin_days', Q.checkin_days, num('checkin_days')),
    outcome: optional('outcome', RES.outcome, (t) => t.toLowerCase()),
    resolved_at: optional('resolved_at', RES.at),
    resolution_note: text('resolution_note', RES.note),
  };
  if ((question.false_alarm_cost === undefined) !== (question.miss_cost === undefined)) {
    const empty = question.false_alarm_cost === undefined ? 'false_alarm_cost' : 'miss_cost';
    throw nothingImported(row, empty, 'is empty but the other cost is given; give both costs or neither (neither uses the diary defaults)');
  }
  if (question.outcome === undefined) {
    if (question.resolved_at !== undefined) throw nothingImported(row, 'resolved_at', 'is given but outcome is empty; give the outcome (yes, no or void) or clear resolved_at');
    if (question.resolution_note !== '') throw nothingImported(row, 'resolution_note', 'is given but outcome is empty; give the outcome (yes, no or void) or clear the note');
  } else if (question.resolved_at === undefined) {
    throw nothingImported(row, 'resolved_at', 'is empty, but outcome is set; give the time the question was resolved');
  }

  const forecastGiven = trimmed('forecast_at') !== undefined || trimmed('p') !== undefined;
  const referenceGiven = trimmed('reference_at') !== undefined || trimmed('reference_p') !== undefined || trimmed('reference_source') !== undefined;
  if (forecastGiven && referenceGiven) {
    throw nothingImported(row, 'reference_at', 'a row holds either a revision (forecast_at, p) or a reference forecast (reference_at, reference_p, reference_source), not both; put the reference forecast on a row of its own');
  }
  let forecast: CsvRow['forecast'] = null;
  if (forecastGiven) {
    for (const c of ['forecast_at', 'p'] as const) {
      if (trimmed(c) === undefined) throw nothingImported(row, c, 'is empty, but a revision needs both its time (forecast_at) and its probability (p)');
    }
    forecast = {
      at: check(F.at, cell('forecast_at').trim(), row, 'forecast_at'),
      p: check(F.p, numberCell(cell('p'), row, 'p'), row, 'p'),
      note: check(F.note, cell('note'), row, 'note') ?? '',
    };
    const lenses = trimmed('lenses');
    if (lenses !== undefined) {
      let raw: unknown;
      try {
        raw = JSON.parse(lenses);
      } catch (err) {
        throw nothingImported(row, 'lenses', `is not valid JSON (${(err as Error).message}); write a list such as [{"name":"outside view","p":0.3,"weight":1}] or leave it empty`);
      }
      const list = check(F.lenses, raw, row, 'lenses') ?? [];
      if (list.length) forecast.lenses = list;
    }
  } else {
    for (const c of ['note', 'lenses'] as const) {
      if (cell(c) !== '') throw nothingImported(row, c, 'belongs to a revision, but forecast_at and p are empty on this row; fill them in or clear this cell');
    }
  }
  let reference: CsvRow['reference'] = null;
  if (referenceGiven) {
    for (const c of ['reference_at', 'reference_p', 'reference_source'] as const) {
      if (trimmed(c) === undefined) throw nothingImported(row, c, 'is empty, but a reference forecast needs its time, probability and source');
    }
    reference = {
      at: check(REF.at, cell('reference_at').trim(), row, 'reference_at'),
      p: check(REF.p, numberCell(cell('reference_p'), row, 'reference_p'), row, 'reference_p'),
      source: check(REF.source, cell('reference_source'), row, 'reference_source'),
    };
  }
  return { row, question, forecast, reference };
}

/** One question's rows gathered into a JSON v1 question record. */
function toRecord(rows: CsvRow[]): Record<string, unknown> {
  const q = rows[0]!.question;
  const record: Record<string, unknown> = {
    title: q.title,
    rule: q.rule,
    tags: q.tags,
    closes_at: q.closes_at,
    forecasts: rows.flatMap((r) => (r.forecast ? [r.forecast] : [])),
    references: rows.flatMap((r) => (r.reference ? [r.reference] : [])),
    resolution: q.outcome === undefined ? null : { outcome: q.outcome, at: q.resolved_at, note: q.resolution_note },
  };
  if (q.question_id !== undefined) record.id = q.question_id;
  for (const key of ['kind', 'opened_at', 'time_zone', 'base_rate', 'base_rate_note', 'checkin_days'] as const) {
    if (q[key] !== undefined) record[key] = q[key];
  }
  if (q.false_alarm_cost !== undefined) record.costs = { false_alarm: q.false_alarm_cost, miss: q.miss_cost };
  return record;
}

/**
 * Reads CSV text (as `diaryToCsv` writes it, or as a spreadsheet saves it) into a diary
 * file object (JSON v1, without settings) for the normal import. Columns are matched by
 * name in any order; rows with the same question_id (or, without one, the same title)
 * form one question and must agree on its columns. Accepts a UTF-8 byte order mark, CRLF
 * or LF line ends and line breaks inside quoted fields; blank rows are skipped.
 * Throws CsvError naming the row and column of the first problem.
 */
export function csvToDiary(text: string): CsvDiaryFile {
  const records = readRecords(text);
  const positions = readHeader(records[0]);
  const width = records[0]!.length;

  const groups = new Map<string, CsvRow[]>();
  records.forEach((cells, index) => {
    const row = index + 1;
    if (index === 0 || cells.every((c) => c.trim() === '')) return;
    if (cells.length !== width) {
      throw new CsvError(
        `Row ${row} has ${cells.length} fields but the header names ${width} columns; check for a missing or extra comma, or an unquoted comma inside a field. Nothing was imported.`,
        row,
        null,
      );
    }
    const read = readRow((c) => {
      const at = positions.get(c);
      return at === undefined ? '' : cells[at]!;
    }, row);
    const key = read.question.question_id !== undefined ? `id\u0000${String(read.question.question_id)}` : `title\u0000${String(read.question.title)}`;
    const group = groups.get(key);
    if (!group) {
      groups.set(key, [read]);
      return;
    }
    const first = group[0]!;
    for (const c of QUESTION_COLUMNS) {
      if (JSON.stringify(read.question[c]) !== JSON.stringify(first.question[c])) {
        const which = first.question.question_id !== undefined ? `question_id "${String(first.question.question_id)}"` : `title "${String(first.question.title)}"`;
        throw nothingImported(
          row,
          c,
          `differs from row ${first.row}, which belongs to the same question (${which}); a question's columns must hold the same value on each of its rows`,
        );
      }
    }
    group.push(read);
  });

  const grouped = [...groups.values()];
  const diary: CsvDiaryFile = { format: DIARY_FORMAT, version: DIARY_VERSION, questions: grouped.map(toRecord) };
  // Rules that span a question's fields (the close after the opening) live in the file
  // schema; a problem there is reported at the question's first row.
  try {
    parseDiaryFile(diary);
  } catch (err) {
    if (!(err instanceof DiaryFileError) || err.record === null) throw err;
    const row = grouped[err.record]![0]!.row;
    const reason = err.message.replace(`Question record ${err.record} is not valid: field ${err.field}: `, '');
    throw new CsvError(`Row ${row}, column ${err.field}: ${reason}`, row, err.field);
  }
  return diary;
}
