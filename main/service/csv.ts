/**
 * The whole diary as CSV, one row per revision (docs/csv-format.md), for people who keep
 * their numbers in a spreadsheet. CSV is a second spelling of the diary file (JSON v1,
 * INTERFACES.md §1): export writes the JSON export's fields, and import checks every cell
 * with the JSON schema's own rules, so the schema stays the single home of every field
 * rule. Import is all-or-nothing and every error names the CSV row (the header is row 1,
 * as a spreadsheet numbers them) and the column, because a record index means nothing to
 * someone looking at a spreadsheet.
 *
 * Both directions stream: export writes a batch of questions at a time, import reads a row
 * at a time and hands each question over at its first row, with the rows that follow as
 * additions to it, so neither holds the file or the diary in memory.
 */
import { z } from 'zod';
import { OUTCOMES } from '../../shared/domain';
import { fileQuestion, type ExportedQuestion, type FileForecast, type FileQuestion, type FileReference } from '../../shared/diary-file';
import * as v from '../../shared/validation';
import { ApiError } from '../../shared/contract';
import { CsvSyntaxError, readCsvRecords } from '../files/csv-records';

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

// The same rules the JSON import applies, taken from its schema so the two cannot drift apart.
const Q = fileQuestion.shape;
const F = Q.forecasts.element.shape;
const REF = Q.references.unwrap().element.shape;
const RES = Q.resolution.unwrap().unwrap().shape;
/** The CSV columns hold yes/no questions, so their outcomes: yes, no or void. */
const YES_NO_OUTCOME = z.enum(OUTCOMES as [string, ...string[]], { error: 'must be yes, no or void' });
const COST = v.costs.shape;

/** The columns that describe a revision or a reference forecast, not the question. */
const POINT_COLUMNS = ['forecast_at', 'p', 'note', 'lenses', 'reference_at', 'reference_p', 'reference_source'] as const satisfies readonly CsvColumn[];
type PointColumn = (typeof POINT_COLUMNS)[number];
type QuestionColumn = Exclude<CsvColumn, PointColumn>;

const isPointColumn = (c: CsvColumn): c is PointColumn => (POINT_COLUMNS as readonly CsvColumn[]).includes(c);

/** The columns a question's rows must agree on: every other one, in export order. */
const QUESTION_COLUMNS: readonly QuestionColumn[] = CSV_COLUMNS.filter((c): c is QuestionColumn => !isPointColumn(c));

// ---------------------------------------------------------------------------------------
// Export

/** The header row, as export writes it. */
export const CSV_HEADER = `${CSV_COLUMNS.join(',')}\r\n`;

/**
 * A field as RFC 4180 §2 rules 6 and 7 write it: enclosed in double quotes when it holds a
 * comma, a double quote, CR or LF (a bare CR or LF too, so a note's line break never splits
 * the row), with each double quote inside doubled.
 */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** A revision's cells, in the order questionRows writes them. */
const FORECAST_COLUMNS = ['forecast_at', 'p', 'note', 'lenses'] as const satisfies readonly PointColumn[];
const REFERENCE_COLUMNS = ['reference_at', 'reference_p', 'reference_source'] as const satisfies readonly PointColumn[];

/**
 * A row as the text around a run of neighbouring point columns: the question's cells (and
 * empty point cells) before the run, and after it. Rows are written by the million, so the
 * surrounding text is made once per question and each row only adds its own cells.
 */
function around(columns: readonly PointColumn[]): (cells: Record<QuestionColumn, string>) => { before: string; after: string } {
  const first = CSV_COLUMNS.indexOf(columns[0]!);
  if (columns.some((c, i) => CSV_COLUMNS[first + i] !== c)) throw new Error(`the CSV columns ${columns.join(', ')} must stand together`);
  const cell = (cells: Record<QuestionColumn, string>, c: CsvColumn) => (isPointColumn(c) ? '' : csvField(cells[c]));
  const before = CSV_COLUMNS.slice(0, first);
  const after = CSV_COLUMNS.slice(first + columns.length);
  return (cells) => ({
    before: before.map((c) => `${cell(cells, c)},`).join(''),
    after: after.map((c) => `,${cell(cells, c)}`).join(''),
  });
}

type BinaryExport = Extract<ExportedQuestion, { type: 'binary' }>;

const aroundForecast = around(FORECAST_COLUMNS);
const aroundReference = around(REFERENCE_COLUMNS);

/** The question's own cells, repeated on each of its rows (as the JSON export writes the fields). */
function questionCells(q: BinaryExport): Record<QuestionColumn, string> {
  return {
    question_id: q.id,
    title: q.title,
    rule: q.rule,
    kind: q.kind,
    tags: q.tags.join(' '),
    opened_at: q.opened_at,
    closes_at: q.closes_at,
    time_zone: q.time_zone,
    base_rate: q.base_rate === null ? '' : String(q.base_rate),
    base_rate_note: q.base_rate_note,
    false_alarm_cost: q.costs ? String(q.costs.false_alarm) : '',
    miss_cost: q.costs ? String(q.costs.miss) : '',
    checkin_days: q.checkin_days === null ? '' : String(q.checkin_days),
    outcome: q.resolution?.outcome ?? '',
    resolved_at: q.resolution?.at ?? '',
    resolution_note: q.resolution?.note ?? '',
  };
}

/**
 * One question's rows: one per revision, then one per reference forecast, or one row when
 * it has neither. Times and numbers never need quoting; text does (csvField).
 */
function questionRows(q: ExportedQuestion): string {
  if (q.type !== 'binary') {
    throw new ApiError(
      'invalid',
      `The CSV format holds yes/no questions only, and "${q.title}" is a ${q.type} question. Nothing was exported; export the diary as JSON to keep every question.`,
    );
  }
  const cells = questionCells(q);
  let out = '';
  if (q.forecasts.length) {
    const { before, after } = aroundForecast(cells);
    for (const f of q.forecasts) {
      const lenses = f.lenses.length ? csvField(JSON.stringify(f.lenses.map((l) => ({ name: l.name, p: l.p, weight: l.weight })))) : '';
      out += `${before}${f.at},${String(f.p)},${csvField(f.note)},${lenses}${after}\r\n`;
    }
  }
  if (q.references.length) {
    const { before, after } = aroundReference(cells);
    for (const r of q.references) out += `${before}${r.at},${String(r.p)},${csvField(r.source)}${after}\r\n`;
  }
  if (out === '') {
    const { before, after } = aroundForecast(cells);
    out = `${before}${','.repeat(FORECAST_COLUMNS.length - 1)}${after}\r\n`;
  }
  return out;
}

/**
 * The diary as CSV text, one piece per batch of questions: the header row, then per
 * question one row per revision, then one row per reference forecast, or a single row when
 * it has neither. Numbers keep full precision (`String(number)` reads back to the same
 * double); every line ends in CRLF (RFC 4180 §2 rule 1).
 */
export function* diaryCsvText(batches: Iterable<ExportedQuestion[]>): Generator<string> {
  yield CSV_HEADER;
  for (const batch of batches) {
    // Joined once, flat: a string grown row by row would be copied again to be written.
    const text = batch.map(questionRows).join('');
    if (text) yield text;
  }
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

type Cell = (c: CsvColumn) => string;

/**
 * The question's columns on one row, checked with the diary file's rules: each value as
 * read (times in epoch ms, numbers as numbers), undefined when the cell is empty.
 */
function readQuestionCells(cell: Cell, row: number): Record<QuestionColumn, unknown> {
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
    outcome: optional('outcome', YES_NO_OUTCOME, (t) => t.toLowerCase()),
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
  return question;
}

/** The revision or the reference forecast a row holds (or neither). */
function readPoint(cell: Cell, row: number): { forecast: FileForecast | null; reference: FileReference | null } {
  const trimmed = (c: CsvColumn): string | undefined => cell(c).trim() || undefined;
  const forecastGiven = trimmed('forecast_at') !== undefined || trimmed('p') !== undefined;
  const referenceGiven = trimmed('reference_at') !== undefined || trimmed('reference_p') !== undefined || trimmed('reference_source') !== undefined;
  if (forecastGiven && referenceGiven) {
    throw nothingImported(row, 'reference_at', 'a row holds either a revision (forecast_at, p) or a reference forecast (reference_at, reference_p, reference_source), not both; put the reference forecast on a row of its own');
  }
  let forecast: FileForecast | null = null;
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
  let reference: FileReference | null = null;
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
  return { forecast, reference };
}

/** A question record from its first row's question columns and the revision or reference forecast on that row. */
function toRecord(q: Record<QuestionColumn, unknown>, point: ReturnType<typeof readPoint>): FileQuestion {
  const record: FileQuestion = {
    title: q.title as string,
    rule: q.rule as string,
    tags: q.tags as string[],
    closes_at: q.closes_at as number,
    forecasts: point.forecast ? [point.forecast] : [],
    references: point.reference ? [point.reference] : [],
    resolution: q.outcome === undefined ? null : { outcome: q.outcome as string, at: q.resolved_at as number, note: q.resolution_note as string },
  };
  if (q.question_id !== undefined) record.id = q.question_id as string;
  if (q.kind !== undefined) record.kind = q.kind as FileQuestion['kind'];
  if (q.opened_at !== undefined) record.opened_at = q.opened_at as number;
  if (q.time_zone !== undefined) record.time_zone = q.time_zone as string;
  if (q.base_rate !== undefined) record.base_rate = q.base_rate as number;
  if (q.base_rate_note !== undefined) record.base_rate_note = q.base_rate_note as string;
  if (q.checkin_days !== undefined) record.checkin_days = q.checkin_days as number;
  if (q.false_alarm_cost !== undefined) record.costs = { false_alarm: q.false_alarm_cost as number, miss: q.miss_cost as number };
  return record;
}

/**
 * What `readCsvDiary` yields: a question at its first row (with that row's revision or
 * reference forecast), then each later row of it as an addition. `index` numbers the
 * questions in the order of their first rows.
 */
export type CsvItem =
  | { kind: 'question'; index: number; row: number; question: FileQuestion }
  | { kind: 'addition'; index: number; row: number; forecast: FileForecast | null; reference: FileReference | null };

/**
 * A row's question cells as written, in one new string (so no chunk of the file stays in
 * memory), each prefixed with its length so no text inside a cell can make two different
 * rows look alike.
 */
function joinCells(cells: readonly string[]): string {
  return cells.map((c) => `${c.length}:${c}`).join('');
}

function splitCells(joined: string): string[] {
  const cells: string[] = [];
  for (let at = 0; at < joined.length; ) {
    const colon = joined.indexOf(':', at);
    const end = colon + 1 + Number(joined.slice(at, colon));
    cells.push(joined.slice(colon + 1, end));
    at = end;
  }
  return cells;
}

interface Group {
  index: number;
  row: number;
  /** The first row's question cells as written (joinCells). */
  raw: string;
}

/**
 * Reads CSV text (as export writes it, or as a spreadsheet saves it) as it arrives, chunk
 * by chunk. Columns are matched by name in any order; rows with the same question_id (or,
 * without one, the same title) form one question, wherever they are in the file, and must
 * agree on its columns. Accepts CRLF, LF or CR line ends and line breaks inside quoted
 * fields; blank rows are skipped. Throws CsvError naming the row and column of the first
 * problem (or CsvError with the row and line, when the text is not CSV at all).
 */
export function* readCsvDiary(chunks: Iterable<string>): Generator<CsvItem> {
  let positions: Map<CsvColumn, number> | null = null;
  let width = 0;
  const groups = new Map<string, Group>();
  try {
    for (const { fields, row } of readCsvRecords(chunks)) {
      if (positions === null) {
        positions = readHeader(fields);
        width = fields.length;
        continue;
      }
      if (fields.every((c) => c.trim() === '')) continue;
      if (fields.length !== width) {
        throw new CsvError(
          `Row ${row} has ${fields.length} fields but the header names ${width} columns; check for a missing or extra comma, or an unquoted comma inside a field. Nothing was imported.`,
          row,
          null,
        );
      }
      const at = positions;
      const cell: Cell = (c) => {
        const i = at.get(c);
        return i === undefined ? '' : fields[i]!;
      };
      const raw = joinCells(QUESTION_COLUMNS.map(cell));
      const id = cell('question_id');
      // Joined rather than concatenated: a new string, so the map does not keep a chunk of the file alive.
      const key = id.trim() !== '' ? ['id', id].join('\u0000') : ['title', cell('title').trim()].join('\u0000');
      const group = groups.get(key);
      if (!group) {
        const question = readQuestionCells(cell, row);
        const record = toRecord(question, readPoint(cell, row));
        // The rule spanning the question's fields, at its first row (the file schema's own).
        if (!v.closesAfterOpening(record)) throw nothingImported(row, 'closes_at', v.CLOSES_AFTER_OPENS_RULE);
        const index = groups.size;
        groups.set(key, { index, row, raw });
        yield { kind: 'question', index, row, question: record };
        continue;
      }
      // Rows repeating the first row's cells exactly need no second reading.
      if (raw !== group.raw) agree(group, readQuestionCells(cell, row), row);
      yield { kind: 'addition', index: group.index, row, ...readPoint(cell, row) };
    }
  } catch (err) {
    if (err instanceof CsvSyntaxError) throw new CsvError(`${err.message} Nothing was imported.`, err.row, null);
    throw err;
  }
  if (positions === null) readHeader(undefined);
}

/** A later row of a question must hold the same values as its first row (compared as read: 0.30 and .3 agree). */
function agree(group: Group, values: Record<QuestionColumn, unknown>, row: number): void {
  const cells = splitCells(group.raw);
  const first = readQuestionCells((c) => cells[QUESTION_COLUMNS.indexOf(c as QuestionColumn)] ?? '', group.row);
  for (const c of QUESTION_COLUMNS) {
    if (JSON.stringify(values[c]) !== JSON.stringify(first[c])) {
      const which = first.question_id !== undefined ? `question_id "${String(first.question_id)}"` : `title "${String(first.title)}"`;
      throw nothingImported(
        row,
        c,
        `differs from row ${group.row}, which belongs to the same question (${which}); a question's columns must hold the same value on each of its rows`,
      );
    }
  }
}
