/**
 * The whole diary as CSV, one row per revision (docs/csv-format.md), for people who keep
 * their numbers in a spreadsheet. CSV is a second spelling of the diary file (JSON v1,
 * INTERFACES.md §1): export writes the JSON export's fields, and import checks every cell
 * with the JSON schema's own rules, so the schema stays the single home of every field
 * rule. Import is all-or-nothing and every error names the CSV row (the header is row 1,
 * as a spreadsheet numbers them) and the column, because a record index means nothing to
 * someone looking at a spreadsheet. Choice and numeric questions have columns of their
 * own, written only when the diary holds such a question (a diary of yes/no questions
 * exports as it always did), and checked with the shared type rules
 * (shared/question-types.ts), the JSON import's own.
 *
 * Both directions stream: export writes a batch of questions at a time, import reads a row
 * at a time and hands each question over at its first row, with the rows that follow as
 * additions to it, so neither holds the file or the diary in memory.
 */
import { z } from 'zod';
import { ByteText, copyInto, numberBytes, utf8 } from '../../shared/byte-text';
import { ISO_MAX_BYTES, writeIso } from '../../shared/time';
import { fileQuestion, type ExportBatch, type ExportedQuestion, type FileForecast, type FileQuestion, type FileReference, type PackedRevisions } from '../../shared/diary-file';
import { ANY_OUTCOMES, OUTCOMES } from '../../shared/domain';
import {
  entryIssues,
  questionTypeIssues,
  resolutionIssues,
  shapeOf,
  typeOf,
  type EntryFields,
  type TypeFields,
  type TypeIssue,
  type TypeShape,
} from '../../shared/question-types';
import { duplicateMember } from '../../shared/json-duplicates';
import { DECIMAL_NUMBER, dateToDays } from '../../shared/numeric-value';
import * as v from '../../shared/validation';
import { CsvSyntaxError, readCsvRecords } from '../files/csv-records';

/** The columns, in the order export writes them: all of them for a diary of yes/no questions. */
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

/**
 * The columns of choice and numeric questions (docs/csv-format.md), written after the
 * others only when the diary holds such a question, so a diary of yes/no questions
 * exports exactly as it did before question types existed.
 */
export const CSV_TYPE_COLUMNS = [
  'type',
  'options',
  'ordered',
  'option_base_rates',
  'unit',
  'value_kind',
  'levels',
  'outcome_option',
  'outcome_value',
  'probs',
  'quantiles',
  'reference_probs',
  'reference_quantiles',
] as const;

/** Every column import knows, in the order export writes them. */
export const CSV_ALL_COLUMNS = [...CSV_COLUMNS, ...CSV_TYPE_COLUMNS] as const;

export type CsvColumn = (typeof CSV_ALL_COLUMNS)[number];

/** A CSV file that cannot be imported; `row` counts the header as row 1. */
export class CsvError extends Error {
  constructor(
    message: string,
    readonly row: number | null,
    readonly column: string | null,
    /** What is wrong with the cell, without where it is (the API's `column: reason` line); null when the message says it all. */
    readonly reason: string | null = null,
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
const COST = v.costs.shape;
/** A yes/no question's outcomes, with the message a yes/no row has always had. */
const YES_NO_OUTCOME = z.enum(OUTCOMES as [string, ...string[]], { error: 'must be yes, no or void' });
/** Every type's outcomes; which fit the question is checked with its type (checkTypeRules). */
const ANY_OUTCOME = z.enum(ANY_OUTCOMES as [string, ...string[]], { error: 'must be option or void (choice questions), or value or void (numeric questions)' });

/** The columns that describe a revision or a reference forecast, not the question. */
const POINT_COLUMNS = [
  'forecast_at',
  'p',
  'note',
  'lenses',
  'reference_at',
  'reference_p',
  'reference_source',
  'probs',
  'quantiles',
  'reference_probs',
  'reference_quantiles',
] as const satisfies readonly CsvColumn[];
type PointColumn = (typeof POINT_COLUMNS)[number];
type QuestionColumn = Exclude<CsvColumn, PointColumn>;

const POINT_COLUMN_SET: ReadonlySet<CsvColumn> = new Set(POINT_COLUMNS);
const isPointColumn = (c: CsvColumn): c is PointColumn => POINT_COLUMN_SET.has(c);

/** The columns a question's rows must agree on: every other one, in export order. */
const QUESTION_COLUMNS: readonly QuestionColumn[] = CSV_ALL_COLUMNS.filter((c): c is QuestionColumn => !isPointColumn(c));

// ---------------------------------------------------------------------------------------
// Export

/** The header row of a diary of yes/no questions, as export writes it. */
export const CSV_HEADER = `${CSV_COLUMNS.join(',')}\r\n`;

/** The header row of a diary that holds a choice or numeric question. */
export const CSV_TYPES_HEADER = `${CSV_ALL_COLUMNS.join(',')}\r\n`;

/**
 * A field as RFC 4180 §2 rules 6 and 7 write it: enclosed in double quotes when it holds a
 * comma, a double quote, CR or LF (a bare CR or LF too, so a note's line break never splits
 * the row), with each double quote inside doubled.
 */
function csvField(text: string): string {
  return text !== '' && /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/**
 * A row as the fixed text around the cells that change from row to row: `pieces[k]` stands
 * before the k-th varying cell and `pieces[n]` after the last. Rows are written by the
 * million, so the question's cells are joined once per question and each row only adds
 * its own. `varying` must follow the order of `columns`.
 */
function rowPieces(columns: readonly CsvColumn[], cells: Record<QuestionColumn, string>, varying: readonly PointColumn[]): string[] {
  // A row with no varying cell (a question without revisions or references) is one piece.
  const at = varying.length === 0 ? [] : varyingPlaces(columns, varying);
  // The row is its cells joined by commas; the text between varying cells becomes a piece.
  const pieces: string[] = [];
  let piece = '';
  let next = 0;
  for (let i = 0; i < columns.length; i++) {
    if (i > 0) piece += ',';
    if (i === at[next]) {
      pieces.push(piece);
      piece = '';
      next++;
      continue;
    }
    const c = columns[i]!;
    if (!isPointColumn(c)) piece += csvField(cells[c]);
  }
  pieces.push(piece);
  return pieces;
}

/** Where each of `varying` stands in `columns`, worked out once per pair (both are constants: CSV_*COLUMNS and VARYING's lists). */
const varyingPlacesMemo = new WeakMap<readonly CsvColumn[], Map<readonly PointColumn[], readonly number[]>>();

function varyingPlaces(columns: readonly CsvColumn[], varying: readonly PointColumn[]): readonly number[] {
  let byVarying = varyingPlacesMemo.get(columns);
  if (byVarying === undefined) varyingPlacesMemo.set(columns, (byVarying = new Map()));
  let at = byVarying.get(varying);
  if (at === undefined) {
    const places = varying.map((c) => columns.indexOf(c));
    if (places.some((i, k) => i < 0 || (k > 0 && i <= places[k - 1]!))) throw new Error(`the CSV columns ${varying.join(', ')} are not in the header's order`);
    byVarying.set(varying, (at = places));
  }
  return at;
}

/** The row made of `pieces` (rowPieces) with `values` in the varying cells. */
function fill(pieces: readonly string[], values: readonly string[]): string {
  let out = pieces[0]!;
  for (let k = 0; k < values.length; k++) out += values[k]! + pieces[k + 1]!;
  return `${out}\r\n`;
}

/** A list of numbers (or dates) in one cell, separated by spaces; numbers in full precision. */
const spaced = (values: readonly (number | string)[]): string => values.map(String).join(' ');

/** The question's own cells, repeated on each of its rows (as the JSON export writes the fields). */
function questionCells(q: ExportedQuestion): Record<QuestionColumn, string> {
  const binary = q.type === 'binary' ? q : null;
  const choice = q.type === 'choice' ? q : null;
  const numeric = q.type === 'numeric' ? q : null;
  const r = q.resolution;
  return {
    question_id: q.id,
    title: q.title,
    rule: q.rule,
    kind: q.kind,
    tags: q.tags.join(' '),
    opened_at: q.opened_at,
    closes_at: q.closes_at,
    time_zone: q.time_zone,
    base_rate: binary === null || binary.base_rate === null ? '' : String(binary.base_rate),
    base_rate_note: q.base_rate_note,
    false_alarm_cost: binary?.costs ? String(binary.costs.false_alarm) : '',
    miss_cost: binary?.costs ? String(binary.costs.miss) : '',
    checkin_days: q.checkin_days === null ? '' : String(q.checkin_days),
    outcome: r?.outcome ?? '',
    resolved_at: r?.at ?? '',
    resolution_note: r?.note ?? '',
    type: q.type,
    options: choice ? JSON.stringify(choice.options) : '',
    ordered: choice ? String(choice.ordered) : '',
    option_base_rates: choice?.option_base_rates ? spaced(choice.option_base_rates) : '',
    unit: numeric ? numeric.unit : '',
    value_kind: numeric ? numeric.value_kind : '',
    levels: numeric ? spaced(numeric.levels) : '',
    outcome_option: choice && r?.outcome === 'option' ? choice.options[r.option]! : '',
    outcome_value: numeric && r?.outcome === 'value' ? String(r.value) : '',
  };
}

/** The cells a revision and a reference forecast fill, per type, in the header's order. */
const VARYING: Record<ExportedQuestion['type'], { forecast: readonly PointColumn[]; reference: readonly PointColumn[] }> = {
  binary: { forecast: ['forecast_at', 'p', 'note', 'lenses'], reference: ['reference_at', 'reference_p', 'reference_source'] },
  choice: { forecast: ['forecast_at', 'note', 'probs'], reference: ['reference_at', 'reference_source', 'reference_probs'] },
  numeric: { forecast: ['forecast_at', 'note', 'quantiles'], reference: ['reference_at', 'reference_source', 'reference_quantiles'] },
};

/** The rows of a question's revisions held as objects (all but the packed ones). */
function forecastRows(q: ExportedQuestion, cells: Record<QuestionColumn, string>, columns: readonly CsvColumn[]): string {
  if (q.forecasts.length === 0) return '';
  const pieces = rowPieces(columns, cells, VARYING[q.type].forecast);
  let out = '';
  if (q.type === 'binary') {
    for (const f of q.forecasts) {
      const lenses = f.lenses.length ? csvField(JSON.stringify(f.lenses.map((l) => ({ name: l.name, p: l.p, weight: l.weight })))) : '';
      out += fill(pieces, [f.at, String(f.p), csvField(f.note), lenses]);
    }
  } else if (q.type === 'choice') {
    for (const f of q.forecasts) out += fill(pieces, [f.at, csvField(f.note), spaced(f.probs)]);
  } else {
    for (const f of q.forecasts) out += fill(pieces, [f.at, csvField(f.note), spaced(f.quantiles)]);
  }
  return out;
}

/** The rows of a question's reference forecasts. */
function referenceRows(q: ExportedQuestion, cells: Record<QuestionColumn, string>, columns: readonly CsvColumn[]): string {
  if (q.references.length === 0) return '';
  const pieces = rowPieces(columns, cells, VARYING[q.type].reference);
  let out = '';
  if (q.type === 'binary') {
    for (const r of q.references) out += fill(pieces, [r.at, String(r.p), csvField(r.source)]);
  } else if (q.type === 'choice') {
    for (const r of q.references) out += fill(pieces, [r.at, csvField(r.source), spaced(r.probs)]);
  } else {
    for (const r of q.references) out += fill(pieces, [r.at, csvField(r.source), spaced(r.quantiles)]);
  }
  return out;
}

const COMMA = utf8(',');

/** The bytes between two cells of a row: a comma, unless the header puts other columns between them. */
const separatorBytes = (text: string): Uint8Array => (text === ',' ? COMMA : utf8(text));

/**
 * Question k's packed revisions (yes/no, without lenses) as rows, written as bytes in
 * place: they are nearly all of an export's rows. The question's cells before and after
 * the revision's are encoded on its first row and copied from there to the others; each
 * row adds its time, probability and note.
 */
function writePackedRows(out: ByteText, r: PackedRevisions, k: number, cells: Record<QuestionColumn, string>, columns: readonly CsvColumn[]): void {
  const [beforeAt, beforeP, beforeNote, beforeLenses, afterLenses] = rowPieces(columns, cells, VARYING.binary.forecast);
  const betweenAtAndP = separatorBytes(beforeP!);
  const betweenPAndNote = separatorBytes(beforeNote!);
  const first = r.from[k]!;
  const to = r.to[k]!;
  // The first row's cells before the time, and after the note (the lenses cell is empty:
  // no revision packed has lenses), where the other rows copy them from.
  let headStart = 0;
  let headEnd = 0;
  let tailStart = 0;
  let tailEnd = 0;
  for (let i = first; i < to; i++) {
    if (i === first) {
      headStart = out.written;
      out.text(beforeAt!);
      headEnd = out.written;
    } else out.again(headStart, headEnd);
    const p = numberBytes(r.p[i]!);
    const buffer = out.reserve(ISO_MAX_BYTES + betweenAtAndP.length + p.length + betweenPAndNote.length);
    let at = writeIso(r.at[i]!, buffer, out.written);
    at = copyInto(betweenAtAndP, buffer, at);
    at = copyInto(p, buffer, at);
    out.advance(copyInto(betweenPAndNote, buffer, at));
    const note = r.note[i]!;
    if (note !== '') out.text(csvField(note));
    if (i === first) {
      tailStart = out.written;
      out.text(`${beforeLenses!}${afterLenses!}\r\n`);
      tailEnd = out.written;
    } else out.again(tailStart, tailEnd);
  }
}

/** Refuses a question the header has no columns for. */
function checkColumns(q: ExportedQuestion, columns: readonly CsvColumn[]): void {
  if (q.type !== 'binary' && columns.length === CSV_COLUMNS.length) {
    // The caller chose the header from the diary's types; reaching this is a bug, not a user's mistake.
    throw new Error(`diaryCsvBytes: question ${q.id} is a ${q.type} question, but the export was started without the type columns`);
  }
}

/**
 * Question k's rows: one per revision, then one per reference forecast, or one row when it
 * has neither. Times and numbers never need quoting; text does (csvField).
 */
function writeQuestionRows(out: ByteText, batch: ExportBatch, k: number, columns: readonly CsvColumn[]): void {
  const q = batch.questions[k]!;
  checkColumns(q, columns);
  const cells = questionCells(q);
  const packed = batch.packed;
  const anyPacked = packed !== null && packed.to[k]! > packed.from[k]!;
  if (anyPacked) writePackedRows(out, packed, k, cells, columns);
  const rows = forecastRows(q, cells, columns) + referenceRows(q, cells, columns);
  if (rows !== '') out.text(rows);
  else if (!anyPacked) out.text(fill(rowPieces(columns, cells, []), []));
}

/**
 * The diary as CSV, UTF-8 bytes, one piece per batch of questions (each valid until the next
 * is asked for, as diaryFileBytes's): the header row, then per
 * question one row per revision, then one row per reference forecast, or a single row when
 * it has neither. Numbers keep full precision (`String(number)` reads back to the same
 * double); every line ends in CRLF (RFC 4180 §2 rule 1).
 *
 * @param batches the questions, a batch at a time
 * @param withTypes write the columns of choice and numeric questions: true when the diary
 *   holds any (the header comes first, so the caller says); false keeps the columns a
 *   diary of yes/no questions has always had
 */
export function* diaryCsvBytes(batches: Iterable<ExportBatch>, withTypes = false): Generator<Uint8Array> {
  const columns: readonly CsvColumn[] = withTypes ? CSV_ALL_COLUMNS : CSV_COLUMNS;
  const out = new ByteText();
  out.text(withTypes ? CSV_TYPES_HEADER : CSV_HEADER);
  yield out.take();
  for (const batch of batches) {
    for (let k = 0; k < batch.questions.length; k++) writeQuestionRows(out, batch, k, columns);
    if (batch.questions.length) yield out.take();
  }
}

// ---------------------------------------------------------------------------------------
// Import

function nothingImported(row: number, column: string, reason: string): CsvError {
  return new CsvError(`Row ${row}, column ${column}: ${reason}. Nothing was imported.`, row, column, reason);
}

/** Applies a schema to one cell's value; the first problem becomes a row-and-column error. */
function check<T>(schema: z.ZodType<T>, value: unknown, row: number, column: string): T {
  const r = schema.safeParse(value);
  if (r.success) return r.data;
  const issue = r.error.issues[0]!;
  const inner = v.formatPath(issue.path);
  throw nothingImported(row, column, inner ? `${inner}: ${issue.message}` : issue.message);
}

/**
 * The tags cell's tags, separated by spaces. A bad one is named as written, not by its place
 * in a list the user never sees ("[1]"); a comma gets its own hint, as spreadsheets and the
 * app's own tag box use commas between tags.
 */
function tagsCell(text: string, row: number): string[] {
  const tags = text === '' ? [] : text.split(/\s+/);
  const bad = tags.find((tag) => !v.TAG_PATTERN.test(tag));
  if (bad === undefined) return tags;
  const commas = bad.includes(',') ? '; separate tags with spaces, not commas' : '';
  throw nothingImported(row, 'tags', `“${bad}” is not a valid tag: ${v.TAG_RULE}${commas}`);
}

/**
 * A revision's or a reference's time as epoch ms: the instant rule read directly (every
 * row has one); zod, with the same rule, words a refusal.
 */
function instantCell(text: string, row: number, column: 'forecast_at' | 'reference_at'): number {
  const ms = v.readInstant(text);
  return typeof ms === 'number' ? ms : check(column === 'forecast_at' ? F.at : REF.at, text, row, column);
}

/** A revision's note: the note rule read directly (every revision row has one); zod words a refusal. */
function noteCell(text: string, row: number): string {
  if (text.length <= v.NOTE_MAX && v.controlCharacterProblem(text, 'many') === null) return text;
  return check(F.note, text, row, 'note') ?? '';
}


function numberCell(text: string, row: number, column: string): number {
  const t = text.trim();
  if (!DECIMAL_NUMBER.test(t)) {
    throw nothingImported(row, column, `"${t}" is not a number; write it with a decimal point and nothing else, e.g. 0.35`);
  }
  return finite(t, row, column);
}

/** A number in plain notation as its double; one beyond ±Number.MAX_VALUE ("1e400") is refused rather than read as Infinity. */
function finite(t: string, row: number, column: string): number {
  const n = Number(t);
  if (!Number.isFinite(n)) throw nothingImported(row, column, `"${t}" is beyond about ±1.8e308, too large a number to hold; write a smaller one`);
  return n;
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
  const known = new Set<string>(CSV_ALL_COLUMNS);
  const positions = new Map<CsvColumn, number>();
  header.forEach((cell, index) => {
    const name = cell.trim().toLowerCase();
    if (!known.has(name)) {
      const hint = /[;\t]/.test(cell) ? ' The file seems to use semicolons or tabs between fields; save it as comma-separated CSV.' : '';
      const shown = name === '' ? `column ${index + 1} has no name` : `unknown column "${cell.trim()}"`;
      throw new CsvError(`Row 1 (the header): ${shown}. The columns are: ${CSV_ALL_COLUMNS.join(', ')}.${hint} Nothing was imported.`, 1, cell.trim());
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
    tags: check(Q.tags, tagsCell(tags, row), row, 'tags'),
    opened_at: optional('opened_at', Q.opened_at),
    closes_at: check(Q.closes_at, cell('closes_at').trim(), row, 'closes_at'),
    time_zone: optional('time_zone', Q.time_zone),
    base_rate: optional('base_rate', Q.base_rate, num('base_rate')),
    base_rate_note: cell('base_rate_note') === '' ? undefined : text('base_rate_note', Q.base_rate_note),
    false_alarm_cost: optional('false_alarm_cost', COST.false_alarm, num('false_alarm_cost')),
    miss_cost: optional('miss_cost', COST.miss, num('miss_cost')),
    checkin_days: optional('checkin_days', Q.checkin_days, num('checkin_days')),
    // A yes/no row keeps the yes/no message; another type's outcome is checked against its type (checkTypeRules).
    outcome: optional('outcome', ['', 'binary'].includes(cell('type').trim().toLowerCase()) ? YES_NO_OUTCOME : ANY_OUTCOME, (t) => t.toLowerCase()),
    resolved_at: optional('resolved_at', RES.at),
    resolution_note: text('resolution_note', RES.note),
    ...readTypeCells(cell, row),
  };
  if ((question.false_alarm_cost === undefined) !== (question.miss_cost === undefined)) {
    const empty = question.false_alarm_cost === undefined ? 'false_alarm_cost' : 'miss_cost';
    throw nothingImported(row, empty, 'is empty but the other cost is given; give both costs or neither (neither uses the diary defaults)');
  }
  checkTypeRules(question, row);
  if (question.outcome === undefined) {
    if (question.resolved_at !== undefined) throw nothingImported(row, 'resolved_at', 'is given but outcome is empty; give the outcome (yes, no or void) or clear resolved_at');
    if (question.resolution_note !== '') throw nothingImported(row, 'resolution_note', 'is given but outcome is empty; give the outcome (yes, no or void) or clear the note');
  } else if (question.resolved_at === undefined) {
    throw nothingImported(row, 'resolved_at', 'is empty, but outcome is set; give the time the question was resolved');
  }
  return question;
}

// ── Choice and numeric questions ─────────────────────────────────────────────────────────

/** A cell holding several numbers separated by spaces (docs/csv-format.md), each read as `numberCell` reads one. */
function numberList(text: string, row: number, column: string): number[] {
  return text
    .trim()
    .split(/\s+/)
    .map((t) => {
      if (!DECIMAL_NUMBER.test(t)) {
        throw nothingImported(row, column, `"${t}" is not a number; separate the numbers with spaces and write each with a decimal point, e.g. 0.5 0.3 0.2`);
      }
      return finite(t, row, column);
    });
}

/**
 * Why one value of a date question's cell is not a date, naming it as written: the schema's
 * message would give its place in a list the sheet never shows ("[1]") and call a number
 * such as 16.5 "the text", since every cell is text.
 */
function dateCellProblem(t: string, hint: string): string | null {
  if (dateToDays(t) !== null) return null;
  const shown = t.length > 40 ? `${t.slice(0, 40)}…` : t;
  return /^\d{4}-\d{2}-\d{2}$/.test(t)
    ? `"${shown}" is not a real calendar date; ${hint}`
    : `"${shown}" is not a date, and this question's values are dates; ${hint}`;
}

/** A cell of numeric values: numbers for a question about a number, dates YYYY-MM-DD for one about a date. */
function valueList(text: string, row: number, column: string, shape: TypeShape): (number | string)[] {
  if (shape.type === 'numeric' && shape.value_kind === 'number') return numberList(text, row, column);
  const tokens = text.trim().split(/\s+/);
  if (shape.type !== 'numeric') return tokens.map((t) => (DECIMAL_NUMBER.test(t) ? Number(t) : t));
  for (const t of tokens) {
    const problem = dateCellProblem(t, 'write each date as YYYY-MM-DD, separated by spaces, e.g. 2026-09-15 2026-10-20 2026-12-01');
    if (problem) throw nothingImported(row, column, problem);
  }
  return tokens;
}

/** The type columns of one row, each checked with the diary file's rule for the field; undefined when empty. */
function readTypeCells(cell: Cell, row: number): Record<Extract<QuestionColumn, (typeof CSV_TYPE_COLUMNS)[number]>, unknown> {
  const trimmed = (c: CsvColumn): string | undefined => cell(c).trim() || undefined;
  const options = trimmed('options');
  let optionList: unknown;
  if (options !== undefined) {
    try {
      optionList = JSON.parse(options);
    } catch (err) {
      throw nothingImported(row, 'options', `is not valid JSON (${(err as Error).message}); write the labels as a list such as ["Brackenfold","Orrin","Neither"] or leave it empty`);
    }
  }
  const ordered = trimmed('ordered')?.toLowerCase();
  if (ordered !== undefined && ordered !== 'true' && ordered !== 'false') throw nothingImported(row, 'ordered', `"${cell('ordered').trim()}" is not true or false`);
  const valueKind = trimmed('value_kind') === undefined ? undefined : check(v.valueKind, trimmed('value_kind')!.toLowerCase(), row, 'value_kind');
  const outcomeValue = trimmed('outcome_value');
  const outcomeDateProblem = valueKind === 'date' && outcomeValue !== undefined ? dateCellProblem(outcomeValue, 'write the date as YYYY-MM-DD, e.g. 2026-09-15') : null;
  if (outcomeDateProblem) throw nothingImported(row, 'outcome_value', outcomeDateProblem);
  return {
    type: trimmed('type') === undefined ? undefined : check(v.questionType, trimmed('type')!.toLowerCase(), row, 'type'),
    options: options === undefined ? undefined : check(v.options, optionList, row, 'options'),
    ordered: ordered === undefined ? undefined : ordered === 'true',
    option_base_rates: trimmed('option_base_rates') === undefined ? undefined : check(v.probs, numberList(cell('option_base_rates'), row, 'option_base_rates'), row, 'option_base_rates'),
    unit: cell('unit') === '' ? undefined : check(v.unit, cell('unit'), row, 'unit'),
    value_kind: valueKind,
    levels: trimmed('levels') === undefined ? undefined : check(v.levels, numberList(cell('levels'), row, 'levels'), row, 'levels'),
    outcome_option: trimmed('outcome_option'),
    outcome_value:
      outcomeValue === undefined ? undefined : check(v.numericValue, valueKind === 'date' ? outcomeValue : numberCell(outcomeValue, row, 'outcome_value'), row, 'outcome_value'),
  };
}

/** The columns a type rule's field is written in. */
const COLUMN_OF_FIELD: Record<string, CsvColumn> = { costs: 'false_alarm_cost', option: 'outcome_option', value: 'outcome_value' };

function typeIssue(issue: TypeIssue, row: number, columnOf: (field: string) => CsvColumn = (f) => COLUMN_OF_FIELD[f] ?? (f as CsvColumn)): CsvError {
  const [field, ...rest] = issue.path;
  return nothingImported(row, columnOf(String(field)), rest.length ? `${v.formatPath(rest)}: ${issue.message}` : issue.message);
}

/** The type fields of a row's question cells, as shared/question-types.ts reads them. */
function typeFields(q: Record<QuestionColumn, unknown>): TypeFields {
  return {
    type: q.type as string | undefined,
    base_rate: q.base_rate as number | undefined,
    costs: q.false_alarm_cost === undefined ? undefined : { false_alarm: q.false_alarm_cost, miss: q.miss_cost },
    options: q.options as string[] | undefined,
    ordered: q.ordered as boolean | undefined,
    option_base_rates: q.option_base_rates as number[] | undefined,
    unit: q.unit as string | undefined,
    value_kind: q.value_kind as string | undefined,
    levels: q.levels as number[] | undefined,
  };
}

/**
 * The rules spanning a question's type columns (shared/question-types.ts, the JSON
 * import's own): no field of another type, options and option base rates that agree, and
 * an outcome of the question's type with its option (by label) or value.
 */
function checkTypeRules(q: Record<QuestionColumn, unknown>, row: number): void {
  const fields = typeFields(q);
  const issue = questionTypeIssues(fields)[0];
  if (issue) throw typeIssue(issue, row);
  const type = typeOf(fields);
  if (q.outcome_option !== undefined && type !== 'choice') throw nothingImported(row, 'outcome_option', `applies to choice questions only; this is ${TYPE_WORDS[type]}`);
  if (q.outcome_value !== undefined && type !== 'numeric') throw nothingImported(row, 'outcome_value', `applies to numeric questions only; this is ${TYPE_WORDS[type]}`);
  if (q.outcome === undefined) {
    for (const c of ['outcome_option', 'outcome_value'] as const) {
      if (q[c] !== undefined) throw nothingImported(row, c, `is given but outcome is empty; give the outcome (${c === 'outcome_option' ? 'option' : 'value'} or void) or clear ${c}`);
    }
    return;
  }
  let option: number | undefined;
  if (q.outcome_option !== undefined) {
    const labels = q.options as string[];
    option = labels.indexOf(q.outcome_option as string);
    if (option < 0) {
      throw nothingImported(row, 'outcome_option', `"${String(q.outcome_option)}" is not one of the options (${labels.map((l) => JSON.stringify(l)).join(', ')}); write the label exactly as in options`);
    }
  }
  const resolutionIssue = resolutionIssues(shapeOf(fields), { outcome: q.outcome as string, option, value: q.outcome_value as number | string | undefined })[0];
  if (resolutionIssue) throw typeIssue(resolutionIssue, row);
}

const TYPE_WORDS: Record<string, string> = { binary: 'a yes/no question', choice: 'a choice question', numeric: 'a numeric question' };

/** The columns of a revision's or a reference forecast's value, per type, and how a message names the value. */
const VALUE_COLUMNS = {
  binary: { forecast: 'p', reference: 'reference_p', word: 'probability' },
  choice: { forecast: 'probs', reference: 'reference_probs', word: 'probabilities' },
  numeric: { forecast: 'quantiles', reference: 'reference_quantiles', word: 'values' },
} as const satisfies Record<string, { forecast: PointColumn; reference: PointColumn; word: string }>;

/** A revision's or a reference forecast's value cells, read (p, probs, quantiles); undefined when empty. */
function readEntry(cell: Cell, row: number, shape: TypeShape, columns: { p: PointColumn; probs: PointColumn; quantiles: PointColumn }): EntryFields {
  const trimmed = (c: CsvColumn): string | undefined => cell(c).trim() || undefined;
  const entry: EntryFields = {};
  if (trimmed(columns.p) !== undefined) {
    const p = numberCell(cell(columns.p), row, columns.p);
    // The probability rule (shared/validation.ts) without zod on the common path; zod words a refusal.
    entry.p = p >= 0 && p <= 1 ? p : (check(F.p, p, row, columns.p) as number);
  }
  if (trimmed(columns.probs) !== undefined) entry.probs = check(v.probs, numberList(cell(columns.probs), row, columns.probs), row, columns.probs);
  if (trimmed(columns.quantiles) !== undefined) {
    entry.quantiles = check(v.quantiles, valueList(cell(columns.quantiles), row, columns.quantiles, shape), row, columns.quantiles);
  }
  return entry;
}

/**
 * An entry's type issues in the order a person fixes them: a value of another type's
 * column first, then `missing` (the cells a revision or a reference forecast needs), then
 * the value's own problems (the count per option or level, the kind of value).
 */
function checkEntry(shape: TypeShape, entry: EntryFields, row: number, own: PointColumn, columnOf: (field: string) => CsvColumn, missing: () => void): void {
  const issues = entryIssues(shape, entry);
  const misplaced = issues.find((i) => columnOf(String(i.path[0])) !== own);
  if (misplaced) throw typeIssue(misplaced, row, columnOf);
  missing();
  if (issues[0]) throw typeIssue(issues[0], row, columnOf);
}

/** The point columns a plain yes/no revision row leaves empty. */
const NOT_IN_PLAIN_ROWS = ['probs', 'quantiles', 'lenses', 'reference_at', 'reference_p', 'reference_source', 'reference_probs', 'reference_quantiles'] as const;

/**
 * A yes/no revision as nearly every row holds it — a time, a probability, a note, no
 * lenses, no reference forecast — read with readPoint's rules into what readPoint makes of
 * it; null for anything else or anything wrong, which readPoint then reads and words.
 */
function plainRevisionRow(cell: Cell): FileForecast | null {
  for (const c of NOT_IN_PLAIN_ROWS) if (cell(c).trim() !== '') return null;
  const pText = cell('p').trim();
  if (!DECIMAL_NUMBER.test(pText)) return null;
  const p = Number(pText);
  if (!(p >= 0 && p <= 1)) return null;
  const at = v.readInstant(cell('forecast_at').trim());
  const note = cell('note');
  if (typeof at !== 'number' || note.length > v.NOTE_MAX || v.controlCharacterProblem(note, 'many') !== null) return null;
  return { at, p, note };
}

/** The revision or the reference forecast a row holds (or neither), for a question of this shape. */
function readPoint(cell: Cell, row: number, shape: TypeShape): { forecast: FileForecast | null; reference: FileReference | null } {
  const plain = shape.type === 'binary' ? plainRevisionRow(cell) : null;
  if (plain) return { forecast: plain, reference: null };
  const trimmed = (c: CsvColumn): string | undefined => cell(c).trim() || undefined;
  const forecastGiven = (['forecast_at', 'p', 'probs', 'quantiles'] as const).some((c) => trimmed(c) !== undefined);
  const referenceGiven = (['reference_at', 'reference_p', 'reference_source', 'reference_probs', 'reference_quantiles'] as const).some((c) => trimmed(c) !== undefined);
  const value = VALUE_COLUMNS[shape.type];
  if (forecastGiven && referenceGiven) {
    throw nothingImported(
      row,
      'reference_at',
      `a row holds either a revision (forecast_at, ${value.forecast}) or a reference forecast (reference_at, ${value.reference}, reference_source), not both; put the reference forecast on a row of its own`,
    );
  }
  let forecast: FileForecast | null = null;
  if (forecastGiven) {
    const entry = readEntry(cell, row, shape, { p: 'p', probs: 'probs', quantiles: 'quantiles' });
    const lenses = trimmed('lenses');
    if (lenses !== undefined) {
      let raw: unknown;
      try {
        raw = JSON.parse(lenses);
      } catch (err) {
        throw nothingImported(row, 'lenses', `is not valid JSON (${(err as Error).message}); write a list such as [{"name":"outside view","p":0.3,"weight":1}] or leave it empty`);
      }
      const twice = duplicateMember(lenses);
      if (twice) throw nothingImported(row, 'lenses', `names "${twice.key}" twice in one lens; keep one of them`);
      const list = check(F.lenses, raw, row, 'lenses') ?? [];
      if (list.length) entry.lenses = list;
    }
    checkEntry(shape, entry, row, value.forecast, (f) => f as CsvColumn, () => {
      for (const c of ['forecast_at', value.forecast] as const) {
        if (trimmed(c) === undefined) throw nothingImported(row, c, `is empty, but a revision needs both its time (forecast_at) and its ${value.word} (${value.forecast})`);
      }
    });
    forecast = { at: instantCell(cell('forecast_at').trim(), row, 'forecast_at'), ...entry, note: noteCell(cell('note'), row) } as FileForecast;
  } else {
    for (const c of ['note', 'lenses'] as const) {
      if (cell(c) !== '') throw nothingImported(row, c, `belongs to a revision, but forecast_at and ${value.forecast} are empty on this row; fill them in or clear this cell`);
    }
  }
  let reference: FileReference | null = null;
  if (referenceGiven) {
    const entry = readEntry(cell, row, shape, { p: 'reference_p', probs: 'reference_probs', quantiles: 'reference_quantiles' });
    const columnOf = (f: string) => (`reference_${f}` as CsvColumn);
    checkEntry(shape, entry, row, value.reference, columnOf, () => {
      for (const c of ['reference_at', value.reference, 'reference_source'] as const) {
        if (trimmed(c) === undefined) throw nothingImported(row, c, `is empty, but a reference forecast needs its time, ${value.word} and source`);
      }
    });
    reference = { at: instantCell(cell('reference_at').trim(), row, 'reference_at'), ...entry, source: check(REF.source, cell('reference_source'), row, 'reference_source') } as FileReference;
  }
  return { forecast, reference };
}

/** A question record from its first row's question columns and the revision or reference forecast on that row. */
function toRecord(q: Record<QuestionColumn, unknown>, point: ReturnType<typeof readPoint>): FileQuestion {
  let resolution: Record<string, unknown> | null = null;
  if (q.outcome !== undefined) {
    resolution = { outcome: q.outcome, at: q.resolved_at, note: q.resolution_note };
    if (q.outcome === 'option') resolution.option = (q.options as string[]).indexOf(q.outcome_option as string);
    if (q.outcome === 'value') resolution.value = q.outcome_value;
  }
  const record = {
    title: q.title as string,
    rule: q.rule as string,
    tags: q.tags as string[],
    closes_at: q.closes_at as number,
    forecasts: point.forecast ? [point.forecast] : [],
    references: point.reference ? [point.reference] : [],
    resolution,
  } as FileQuestion;
  if (q.question_id !== undefined) record.id = q.question_id as string;
  if (q.kind !== undefined) record.kind = q.kind as FileQuestion['kind'];
  if (q.opened_at !== undefined) record.opened_at = q.opened_at as number;
  if (q.time_zone !== undefined) record.time_zone = q.time_zone as string;
  if (q.base_rate !== undefined) record.base_rate = q.base_rate as number;
  if (q.base_rate_note !== undefined) record.base_rate_note = q.base_rate_note as string;
  if (q.checkin_days !== undefined) record.checkin_days = q.checkin_days as number;
  if (q.false_alarm_cost !== undefined) record.costs = { false_alarm: q.false_alarm_cost as number, miss: q.miss_cost as number };
  // The type's own fields, as the JSON file spells them (absent: the default).
  const typed = record as Record<string, unknown>;
  for (const field of ['type', 'options', 'ordered', 'option_base_rates', 'unit', 'value_kind', 'levels'] as const) {
    if (q[field] !== undefined) typed[field] = q[field];
  }
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
 * rows look alike. One string per question: a diary of 100,000 questions keeps 100,000.
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

/** A row's question cells, in QUESTION_COLUMNS' order ('' for a column the file lacks). */
function questionCellsOf(fields: readonly string[], positions: readonly number[]): string[] {
  return positions.map((at) => (at === -1 ? '' : fields[at]!));
}

interface Group {
  index: number;
  row: number;
  /** The first row's question cells as written (joinCells). */
  raw: string;
  /** What the question's type makes of its revisions (the same on every row: `agree`). */
  shape: TypeShape;
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
  /** Where each of QUESTION_COLUMNS is in a row (-1: not in the file). */
  let questionPositions: number[] = [];
  let width = 0;
  const groups = new Map<string, Group>();
  // The question of the previous row, with its first row's cells at hand: a question's rows
  // usually follow one another (export writes them so), and are compared cell by cell.
  let current: Group | undefined;
  let currentCells: string[] = [];
  /** The previous row's question_id, when its question is found by id. */
  let lastId: string | null = null;
  try {
    for (const { fields, row } of readCsvRecords(chunks)) {
      if (positions === null) {
        positions = readHeader(fields);
        const at = positions;
        questionPositions = QUESTION_COLUMNS.map((c) => at.get(c) ?? -1);
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
      const id = cell('question_id');
      const byId = id.trim() !== '';
      // Joined rather than concatenated: a new string, so the map does not keep a chunk of the file alive.
      const group =
        byId && id === lastId ? current : groups.get(byId ? ['id', id].join('\u0000') : ['title', cell('title').trim()].join('\u0000'));
      lastId = byId ? id : null;
      if (!group) {
        const question = readQuestionCells(cell, row);
        const shape = shapeOf(typeFields(question));
        const record = toRecord(question, readPoint(cell, row, shape));
        // The rule spanning the question's fields, at its first row (the file schema's own).
        if (!v.closesAfterOpening(record)) throw nothingImported(row, 'closes_at', v.CLOSES_AFTER_OPENS_RULE);
        const index = groups.size;
        currentCells = questionCellsOf(fields, questionPositions);
        current = { index, row, raw: joinCells(currentCells), shape };
        groups.set(byId ? ['id', id].join('\u0000') : ['title', cell('title').trim()].join('\u0000'), current);
        yield { kind: 'question', index, row, question: record };
        continue;
      }
      // Rows repeating the first row's cells exactly need no second reading.
      if (group !== current) {
        // A question's rows resumed after another's.
        current = group;
        currentCells = splitCells(group.raw);
      }
      if (!sameCells(currentCells, fields, questionPositions)) agree(group, readQuestionCells(cell, row), row);
      yield { kind: 'addition', index: group.index, row, ...readPoint(cell, row, group.shape) };
    }
  } catch (err) {
    if (err instanceof CsvSyntaxError) throw new CsvError(`${err.message} Nothing was imported.`, err.row, null);
    throw err;
  }
  if (positions === null) readHeader(undefined);
}

/** Whether a row's question cells are exactly the first row's. */
function sameCells(first: readonly string[], fields: readonly string[], positions: readonly number[]): boolean {
  for (let i = 0; i < positions.length; i++) {
    const at = positions[i]!;
    if ((at === -1 ? '' : fields[at]!) !== first[i]) return false;
  }
  return true;
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
