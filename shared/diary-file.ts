/**
 * The diary file, JSON version 1 (INTERFACES.md §1): its schema for import and its shape
 * for export. Import is all-or-nothing, so a reader either yields every record or throws
 * naming the first bad record's index, the field and the reason.
 *
 * Two ways in, one set of rules: `readDiaryText` reads the file's text as it streams in
 * (a question record at a time, so a file of any size is read in bounded memory) and
 * `diaryItems` reads an object already in memory (the API's importDiary, the example
 * diary). Both check the same things in the same words; a validated question carries its
 * times as epoch milliseconds, parsed once.
 */
import { z } from 'zod';
import { entryIssues, questionTypeIssues, resolutionIssues, shapeOf } from './question-types';
import {
  ANY_OUTCOMES,
  RESOLUTION_CHANGE_KINDS,
  type AnyResolution,
  type BinaryQuestion,
  type ChoiceQuestion,
  type NumericQuestion,
  type Question,
  type ResolutionChange,
  type Settings,
} from './domain';
import { ByteText, copyInto, numberBytes, utf8 } from './byte-text';
import { JsonStreamError, readObjectStream } from './json-stream';
import { ISO_MAX_BYTES, writeIso, zoneName } from './time';
import * as v from './validation';

export const DIARY_FORMAT = 'forelog-diary';
export const DIARY_VERSION = 1;

/** A revision: `p` (yes/no, with optional lenses), `probs` (choice) or `quantiles` (numeric), as its question's type says. */
const fileForecast = z.object({
  at: v.instantMs,
  ...v.entryValue,
  note: v.note.optional(),
  lenses: v.lenses.optional(),
});

const fileReference = z.object({
  at: v.instantMs,
  ...v.entryValue,
  source: v.source,
});

/** How the question resolved: yes, no or void; option (with `option`) or void for choice; value (with `value`) or void for numeric. */
const fileResolution = z.object({
  outcome: z.enum(ANY_OUTCOMES as [string, ...string[]], { error: 'must be yes, no, void, option or value' }),
  option: v.optionIndex.optional(),
  value: v.numericValue.optional(),
  at: v.instantMs,
  note: v.note.optional(),
});

/** An earlier resolution, replaced by a correction or a reopening (docs/diary-file.md, "Resolution history"). */
const fileResolutionChange = z.object({
  outcome: fileResolution.shape.outcome,
  option: fileResolution.shape.option,
  value: fileResolution.shape.value,
  at: v.instantMs,
  note: v.note.optional(),
  recorded_at: v.instantMs,
  replaced_at: v.instantMs,
  change: z.enum(RESOLUTION_CHANGE_KINDS as [string, ...string[]], { error: 'must be corrected or reopened' }),
  change_note: v.note.optional(),
});

export const fileQuestion = z
  .object({
    id: v.id().optional(),
    ...v.questionFields,
    ...v.typeFields,
    opened_at: v.instantMs.optional(),
    closes_at: v.instantMs,
    forecasts: z.array(fileForecast, { error: 'must be a list of forecasts' }),
    references: z.array(fileReference, { error: 'must be a list of reference forecasts' }).optional(),
    resolution: fileResolution.nullable().optional(),
    resolution_history: z.array(fileResolutionChange, { error: 'must be a list of earlier resolutions' }).optional(),
  })
  .refine(...v.closesAfterOpens)
  .superRefine((q, ctx) => {
    // A field of another type is an error naming the record and the field (INTERFACES.md "Question types").
    const issues = questionTypeIssues(q);
    v.addIssues(ctx, issues);
    if (issues.length > 0) return;
    const shape = shapeOf(q);
    q.forecasts.forEach((f, i) => v.addIssues(ctx, entryIssues(shape, f), ['forecasts', i]));
    (q.references ?? []).forEach((r, i) => v.addIssues(ctx, entryIssues(shape, r), ['references', i]));
    if (q.resolution) v.addIssues(ctx, resolutionIssues(shape, q.resolution), ['resolution']);
    (q.resolution_history ?? []).forEach((h, i) => v.addIssues(ctx, resolutionIssues(shape, h), ['resolution_history', i]));
  });

/** A validated question record; every time in it is epoch milliseconds. */
export type FileQuestion = z.output<typeof fileQuestion>;
export type FileForecast = z.output<typeof fileForecast>;
export type FileReference = z.output<typeof fileReference>;
export type FileResolutionChange = z.output<typeof fileResolutionChange>;

/** How much of a title a message quotes; enough to find the record with the editor's search. */
const TITLE_QUOTED = 60;

/**
 * What a message says to find a record by, after its place: its title in curly quotes
 * (“Depot lease renewed”, the first 60 characters and "…" when longer), or, when the record
 * has no title a message can show (missing, not text, blank, or with control characters),
 * its id as `id "q7"`; nothing when it has neither.
 */
function recordLabel(record: unknown): string | null {
  if (typeof record !== 'object' || record === null || Array.isArray(record)) return null;
  const { title, id } = record as { title?: unknown; id?: unknown };
  const shown = (text: unknown): string | null =>
    typeof text === 'string' && v.showsSomething(text) && v.controlCharacterProblem(text, 'one') === null ? text.trim() : null;
  const t = shown(title);
  if (t !== null) {
    const chars = [...t];
    return `“${chars.length > TITLE_QUOTED ? `${chars.slice(0, TITLE_QUOTED).join('').trimEnd()}…` : t}”`;
  }
  const i = shown(id);
  return i === null ? null : `id "${i}"`;
}

/**
 * How messages name question record `index` of a file: counted as people count, with the
 * index a program uses beside it, then — given the record — its title (or else its id), so
 * the user can find it in the file: "Question 2 (questions[1], “Depot lease renewed”)",
 * "Question 4 (questions[3], id "q7")", or "Question 2 (questions[1])" for a record with
 * neither. docs/diary-file.md states the form.
 */
export function questionRecordName(index: number, record?: unknown): string {
  const label = record === undefined ? null : recordLabel(record);
  return `Question ${index + 1} (questions[${index}]${label === null ? '' : `, ${label}`})`;
}

// The same rules and messages as the API's updateSettings; keys Forelog does not know are ignored.
const fileSettings = z.object(v.settingsFields).partial().passthrough();

export type FileSettings = z.output<typeof fileSettings>;

export interface ParsedDiary {
  settings: FileSettings | null;
  questions: FileQuestion[];
}

/** What a reader yields, in file order: the settings (when the file has them) and each question. */
export type DiaryItem =
  | { kind: 'settings'; settings: FileSettings }
  | { kind: 'question'; index: number; question: FileQuestion };

export class DiaryFileError extends Error {
  constructor(
    message: string,
    readonly record: number | null,
    readonly field: string | null,
    /** What is wrong with the field, without which record it is in (the API's `field: reason` line); null when the message says it all. */
    readonly reason: string | null = null,
  ) {
    super(message);
    this.name = 'DiaryFileError';
  }
}

const NOT_A_DIARY = 'This is not a Forelog diary file: expected a JSON object with "format": "forelog-diary".';

function checkFormat(format: unknown): void {
  if (format !== DIARY_FORMAT) {
    throw new DiaryFileError(`This is not a Forelog diary file: "format" must be "${DIARY_FORMAT}". Nothing was imported.`, null, 'format');
  }
}

function checkVersion(version: unknown): void {
  if (version === undefined) {
    throw new DiaryFileError(`This diary file has no "version"; this Forelog reads version ${DIARY_VERSION} (written "version": ${DIARY_VERSION}). Nothing was imported.`, null, 'version');
  }
  if (version !== DIARY_VERSION) {
    // Only a later version number is a newer Forelog's file; "1" (text) or 0.5 is a mistake in this one.
    const later = typeof version === 'number' && Number.isInteger(version) && version > DIARY_VERSION;
    throw new DiaryFileError(
      later
        ? `This diary file is version ${version}; this Forelog reads version ${DIARY_VERSION}. Nothing was imported; update Forelog to import it.`
        : `This diary file's "version" is ${JSON.stringify(version)}; this Forelog reads version ${DIARY_VERSION}, written "version": ${DIARY_VERSION} (a number). Nothing was imported.`,
      null,
      'version',
    );
  }
}

function questionsNotAList(): DiaryFileError {
  return new DiaryFileError('"questions" must be a list (it may be empty). Nothing was imported.', null, 'questions');
}

function readSettings(raw: unknown): FileSettings | null {
  if (raw === undefined || raw === null) return null;
  const s = fileSettings.safeParse(raw, { reportInput: true });
  if (!s.success) {
    const line = v.describeIssues(s.error, 'settings', true)[0]!;
    throw new DiaryFileError(`The settings are not valid: ${line}. Nothing was imported.`, null, line.split(':')[0]!);
  }
  return s.data;
}

/**
 * A yes/no revision as nearly every record holds it — `at` and `p`, perhaps `note`, and
 * nothing else — read by hand with fileForecast's rules into what fileForecast makes of
 * it; null for anything else, which zod then reads (and words any problem). Revisions are
 * nearly all of a file, and zod's cost per object and per field was a third of reading it.
 */
function plainRevision(raw: unknown): FileForecast | null {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return null;
  const r = raw as Record<string, unknown>;
  for (const key in r) if (key !== 'at' && key !== 'p' && key !== 'note') return null;
  const { at: text, p, note } = r;
  if (typeof text !== 'string' || typeof p !== 'number' || !(p >= 0 && p <= 1)) return null;
  const at = v.readInstant(text);
  if (typeof at !== 'number') return null;
  if (note === undefined) return { at, p };
  if (typeof note !== 'string' || note.length > v.NOTE_MAX || v.controlCharacterProblem(note, 'many') !== null) return null;
  return { at, p, note };
}

/**
 * The revisions of a yes/no record when every one is plain (see plainRevision); null when
 * the record may be of another type or any revision is not plain.
 */
function plainRevisions(raw: unknown): FileForecast[] | null {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return null;
  const { type, forecasts } = raw as Record<string, unknown>;
  if ((type !== undefined && type !== 'binary') || !Array.isArray(forecasts) || forecasts.length === 0) return null;
  const out: FileForecast[] = [];
  for (const f of forecasts) {
    const read = plainRevision(f);
    if (read === null) return null;
    out.push(read);
  }
  return out;
}

const isRecord = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null && !Array.isArray(x);
const hasOnly = (x: Record<string, unknown>, keys: ReadonlySet<string>): boolean => {
  for (const key in x) if (!keys.has(key)) return false;
  return true;
};
const isProbability = (x: unknown): x is number => typeof x === 'number' && x >= 0 && x <= 1;
/** The note rule (v.note). */
const isNote = (x: unknown): x is string => typeof x === 'string' && x.length <= v.NOTE_MAX && v.controlCharacterProblem(x, 'many') === null;
/** A one-line text, trimmed, of 1 to `max` characters (v.title, v.source); null when it is not one. */
function filledLine(x: unknown, max: number): string | null {
  if (typeof x !== 'string' || v.controlCharacterProblem(x, 'one') !== null) return null;
  const t = x.trim();
  return t.length >= 1 && t.length <= max && v.showsSomething(t) ? t : null;
}
/** The instant rule (v.instantMs) as epoch ms; null when it is not one. */
function instantOf(x: unknown): number | null {
  if (typeof x !== 'string') return null;
  const ms = v.readInstant(x);
  return typeof ms === 'number' ? ms : null;
}

const PLAIN_QUESTION_KEYS: ReadonlySet<string> = new Set([
  'id',
  'title',
  'rule',
  'kind',
  'tags',
  'opened_at',
  'closes_at',
  'time_zone',
  'base_rate',
  'base_rate_note',
  'costs',
  'checkin_days',
  'type',
  'forecasts',
  'references',
  'resolution',
]);
const COSTS_KEYS: ReadonlySet<string> = new Set(['false_alarm', 'miss']);
const REFERENCE_KEYS: ReadonlySet<string> = new Set(['at', 'p', 'source']);
const RESOLUTION_KEYS: ReadonlySet<string> = new Set(['outcome', 'at', 'note']);

/**
 * A yes/no question record as export writes it — the question's own fields, plain
 * revisions and references, a yes, no or void resolution, nothing else — read by hand
 * with fileQuestion's rules into exactly what fileQuestion makes of it (fields in the
 * schema's order, titles and sources trimmed, times as epoch ms). Null for anything else
 * or anything wrong: zod then reads the record and words the problem. Most records of
 * a large file are this, and zod's cost per field was a tenth of an import.
 */
function plainQuestion(raw: unknown): FileQuestion | null {
  if (!isRecord(raw) || !hasOnly(raw, PLAIN_QUESTION_KEYS)) return null;
  const r = raw;
  if (r.type !== undefined && r.type !== 'binary') return null;
  const out: Record<string, unknown> = {};
  if (r.id !== undefined) {
    if (typeof r.id !== 'string' || r.id.length < 1 || r.id.length > 200 || v.controlCharacterProblem(r.id, 'one') !== null) return null;
    out.id = r.id;
  }
  const title = filledLine(r.title, 300);
  if (title === null) return null;
  out.title = title;
  if (r.rule !== undefined) {
    if (!isNote(r.rule)) return null;
    out.rule = r.rule;
  }
  if (r.kind !== undefined) {
    if (r.kind !== 'event_by_deadline' && r.kind !== 'state_at_deadline') return null;
    out.kind = r.kind;
  }
  if (r.tags !== undefined) {
    const tags = r.tags;
    if (!Array.isArray(tags) || tags.length > 32 || !tags.every((t) => typeof t === 'string' && v.TAG_PATTERN.test(t)) || new Set(tags).size !== tags.length) return null;
    out.tags = tags.slice();
  }
  let opened: number | null = null;
  if (r.opened_at !== undefined) {
    if ((opened = instantOf(r.opened_at)) === null) return null;
    out.opened_at = opened;
  }
  const closes = instantOf(r.closes_at);
  if (closes === null || (opened !== null && !(closes > opened))) return null;
  out.closes_at = closes;
  if (r.time_zone !== undefined) {
    const zone = typeof r.time_zone === 'string' ? zoneName(r.time_zone) : null;
    if (zone === null) return null;
    out.time_zone = zone;
  }
  if (r.base_rate !== undefined) {
    if (r.base_rate !== null && !isProbability(r.base_rate)) return null;
    out.base_rate = r.base_rate;
  }
  if (r.base_rate_note !== undefined) {
    if (!isNote(r.base_rate_note)) return null;
    out.base_rate_note = r.base_rate_note;
  }
  if (r.costs !== undefined) {
    const c = r.costs;
    if (c === null) out.costs = null;
    else {
      const positive = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0;
      if (!isRecord(c) || !hasOnly(c, COSTS_KEYS) || !positive(c.false_alarm) || !positive(c.miss)) return null;
      out.costs = { false_alarm: c.false_alarm, miss: c.miss };
    }
  }
  if (r.checkin_days !== undefined) {
    const d = r.checkin_days;
    if (d !== null && !(typeof d === 'number' && Number.isInteger(d) && d >= 0 && d <= 365)) return null;
    out.checkin_days = d;
  }
  if (r.type !== undefined) out.type = r.type;
  if (!Array.isArray(r.forecasts)) return null;
  const forecasts: FileForecast[] = [];
  for (const f of r.forecasts) {
    const read = plainRevision(f);
    if (read === null) return null;
    forecasts.push(read);
  }
  out.forecasts = forecasts;
  if (r.references !== undefined) {
    if (!Array.isArray(r.references)) return null;
    const references: FileReference[] = [];
    for (const x of r.references) {
      if (!isRecord(x) || !hasOnly(x, REFERENCE_KEYS) || !isProbability(x.p)) return null;
      const at = instantOf(x.at);
      const source = filledLine(x.source, 200);
      if (at === null || source === null) return null;
      references.push({ at, p: x.p, source });
    }
    out.references = references;
  }
  if (r.resolution !== undefined) {
    const res = r.resolution;
    if (res === null) out.resolution = null;
    else {
      if (!isRecord(res) || !hasOnly(res, RESOLUTION_KEYS) || (res.outcome !== 'yes' && res.outcome !== 'no' && res.outcome !== 'void')) return null;
      const at = instantOf(res.at);
      if (at === null) return null;
      if (res.note === undefined) out.resolution = { outcome: res.outcome, at };
      else if (isNote(res.note)) out.resolution = { outcome: res.outcome, at, note: res.note };
      else return null;
    }
  }
  return out as FileQuestion;
}

/**
 * A record through fileQuestion. Plain yes/no revisions are read by hand and zod reads the
 * rest: they pass the record's own checks too (a yes/no question takes `p`), so the result
 * is what zod makes of the whole record. Any problem sends the whole record back to zod,
 * so the message is the one it always gave.
 */
function parseQuestion(raw: unknown): ReturnType<typeof fileQuestion.safeParse> {
  const plain = plainQuestion(raw);
  if (plain) return { success: true, data: plain } as ReturnType<typeof fileQuestion.safeParse>;
  const revisions = plainRevisions(raw);
  if (revisions) {
    const rest = fileQuestion.safeParse({ ...(raw as object), forecasts: [] }, { reportInput: true });
    if (rest.success) {
      rest.data.forecasts = revisions;
      return rest;
    }
  }
  return fileQuestion.safeParse(raw, { reportInput: true });
}

/**
 * Validates question record `index`; `ids` holds the ids of the records before it. `line`,
 * when the record was read from text, is where it starts (for finding it in a large file).
 */
function readQuestion(raw: unknown, index: number, ids: Set<string>, line?: number): FileQuestion {
  const where = line === undefined ? '' : ` (the record starts on line ${line})`;
  const r = parseQuestion(raw);
  if (!r.success) {
    const issue = r.error.issues[0]!;
    const field = v.formatPath(issue.path) || '(record)';
    const reason = v.issueReason(issue, true);
    throw new DiaryFileError(`${questionRecordName(index, raw)} is not valid: field ${field}: ${reason}${where}. Nothing was imported.`, index, field, reason);
  }
  if (r.data.id !== undefined) {
    if (ids.has(r.data.id)) {
      throw new DiaryFileError(
        `${questionRecordName(index, raw)} is not valid: field id: "${r.data.id}" is used by an earlier record${where}. Nothing was imported.`,
        index,
        'id',
      );
    }
    ids.add(r.data.id);
  }
  return r.data;
}

/** Reads a diary file already in memory (JSON-parsed). Throws DiaryFileError on the first problem. */
export function* diaryItems(raw: unknown): Generator<DiaryItem> {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) throw new DiaryFileError(`${NOT_A_DIARY} Nothing was imported.`, null, null);
  const top = raw as Record<string, unknown>;
  checkFormat(top.format);
  checkVersion(top.version);
  const settings = readSettings(top.settings);
  if (settings) yield { kind: 'settings', settings };
  if (!Array.isArray(top.questions)) throw questionsNotAList();
  const ids = new Set<string>();
  for (let index = 0; index < top.questions.length; index++) {
    yield { kind: 'question', index, question: readQuestion(top.questions[index], index, ids) };
  }
}

/** Validates a whole diary file (already JSON-parsed). Throws DiaryFileError on the first bad record. */
export function parseDiaryFile(raw: unknown): ParsedDiary {
  const parsed: ParsedDiary = { settings: null, questions: [] };
  for (const item of diaryItems(raw)) {
    if (item.kind === 'settings') parsed.settings = item.settings;
    else parsed.questions.push(item.question);
  }
  return parsed;
}

function unreadable(err: JsonStreamError): DiaryFileError {
  switch (err.kind) {
    case 'not-object':
      return new DiaryFileError(`${NOT_A_DIARY} (${err.message}) Nothing was imported.`, null, null);
    case 'depth':
      return new DiaryFileError(`The file cannot be read at ${err.message}; a diary file never nests that deep. Nothing was imported.`, null, null);
    case 'duplicate':
      return new DiaryFileError(`The file cannot be read at ${err.message}. Nothing was imported.`, null, null);
    case 'too-long':
      // A question's record holds all its revisions, so it is the value that grows.
      return new DiaryFileError(
        `The file cannot be read at ${err.message}; a question's record (with all its revisions and notes) must fit in that. Nothing was imported.`,
        null,
        null,
      );
    default:
      return new DiaryFileError(`The file is not valid JSON at ${err.message}; nothing was imported. Is it a Forelog diary file?`, null, null);
  }
}

/**
 * Reads a diary file's text as it arrives, chunk by chunk, yielding each question as soon
 * as its record is read and valid. The members may come in any order (`settings` before or
 * after `questions`); a file without `format`, `version` or `questions` is refused at its
 * end. Throws DiaryFileError on the first problem; a consumer that stops early (or fails)
 * stops the reading too.
 */
export function* readDiaryText(chunks: Iterable<string>): Generator<DiaryItem> {
  const seen = { format: false, version: false, questions: false };
  let version: unknown;
  const ids = new Set<string>();
  try {
    for (const part of readObjectStream(chunks, { streamed: 'questions', maxDepth: v.MAX_NESTING })) {
      if (part.kind === 'element') {
        yield { kind: 'question', index: part.index, question: readQuestion(part.value, part.index, ids, part.line) };
      } else if (part.kind === 'array') seen.questions = true;
      else if (part.key === 'format') {
        checkFormat(part.value);
        seen.format = true;
        if (seen.version) checkVersion(version);
      } else if (part.key === 'version') {
        // Judged once the file is known to be a diary: another program's JSON with a
        // "version" of its own ("1.0.0" in a package.json) is "not a Forelog diary file",
        // not a diary from a newer Forelog.
        version = part.value;
        seen.version = true;
        if (seen.format) checkVersion(version);
      } else if (part.key === 'settings') {
        const settings = readSettings(part.value);
        if (settings) yield { kind: 'settings', settings };
      } else if (part.key === 'questions') throw questionsNotAList();
    }
  } catch (err) {
    throw err instanceof JsonStreamError ? unreadable(err) : err;
  }
  if (!seen.format) checkFormat(undefined);
  if (!seen.version) checkVersion(undefined);
  // (A version seen before the format was checked when the format came.)
  if (!seen.questions) throw questionsNotAList();
}

/** What the export writes of a question of one type: the question without its internal ids and stamps. */
type Exported<Q extends Question> = Omit<Q, 'forecasts' | 'references' | 'snoozes' | 'created_at' | 'updated_at'> & {
  forecasts: Omit<Q['forecasts'][number], 'id' | 'seq'>[];
  references: Omit<Q['references'][number], 'id'>[];
};

/** What the export writes of a question, of any type. */
export type ExportedQuestion = Exported<BinaryQuestion> | Exported<ChoiceQuestion> | Exported<NumericQuestion>;

/** A resolution as the file writes it: the outcome, a choice question's option or a numeric question's value, then when and the note. */
function fileResolutionOf(r: AnyResolution): Record<string, unknown> {
  const out: Record<string, unknown> = { outcome: r.outcome };
  if (r.outcome === 'option') out.option = r.option;
  if (r.outcome === 'value') out.value = r.value;
  out.at = r.at;
  out.note = r.note;
  return out;
}

/**
 * The export shape of one question; optional fields are written only when set. A yes/no
 * question is written exactly as before question types existed (no `type` field), so a
 * diary of yes/no questions exports byte for byte as it did.
 */
export function toFileQuestion(q: ExportedQuestion): Record<string, unknown> {
  const out: Record<string, unknown> = { id: q.id };
  if (q.type !== 'binary') out.type = q.type;
  Object.assign(out, {
    title: q.title,
    rule: q.rule,
    kind: q.kind,
    tags: q.tags,
    opened_at: q.opened_at,
    closes_at: q.closes_at,
    time_zone: q.time_zone,
  });
  if (q.type === 'binary' && q.base_rate !== null) out.base_rate = q.base_rate;
  if (q.type === 'choice') {
    out.options = q.options;
    out.ordered = q.ordered;
    if (q.option_base_rates) out.option_base_rates = q.option_base_rates;
  }
  if (q.type === 'numeric') {
    out.unit = q.unit;
    out.value_kind = q.value_kind;
    out.levels = q.levels;
  }
  if (q.base_rate_note) out.base_rate_note = q.base_rate_note;
  if (q.type === 'binary' && q.costs) out.costs = { false_alarm: q.costs.false_alarm, miss: q.costs.miss };
  if (q.checkin_days !== null) out.checkin_days = q.checkin_days;
  if (q.type === 'binary') {
    out.forecasts = q.forecasts.map((f) => {
      const item: Record<string, unknown> = { at: f.at, p: f.p, note: f.note };
      if (f.lenses.length) item.lenses = f.lenses.map((l) => ({ name: l.name, p: l.p, weight: l.weight }));
      return item;
    });
    out.references = q.references.map((r) => ({ at: r.at, p: r.p, source: r.source }));
  } else if (q.type === 'choice') {
    out.forecasts = q.forecasts.map((f) => ({ at: f.at, probs: f.probs, note: f.note }));
    out.references = q.references.map((r) => ({ at: r.at, probs: r.probs, source: r.source }));
  } else {
    out.forecasts = q.forecasts.map((f) => ({ at: f.at, quantiles: f.quantiles, note: f.note }));
    out.references = q.references.map((r) => ({ at: r.at, quantiles: r.quantiles, source: r.source }));
  }
  out.resolution = q.resolution ? fileResolutionOf(q.resolution) : null;
  // Only when there is one: a file of questions never corrected reads as before.
  if (q.resolution_history.length) {
    out.resolution_history = q.resolution_history.map((h: ResolutionChange<AnyResolution>) => ({
      ...fileResolutionOf(h),
      recorded_at: h.recorded_at,
      replaced_at: h.replaced_at,
      change: h.change,
      change_note: h.change_note,
    }));
  }
  return out;
}

export function toDiaryFile(settings: Settings, questions: Question[]): Record<string, unknown> {
  return {
    format: DIARY_FORMAT,
    version: DIARY_VERSION,
    settings: { ...settings },
    questions: questions.map(toFileQuestion),
  };
}

/**
 * Yes/no revisions without lenses (nearly all of an export) held column by column, with no
 * object each: question k of a batch has those at [from[k], to[k]) of `at`, `p` and `note`,
 * and then an empty `forecasts` list. Any other revision is in its question's `forecasts`.
 */
export interface PackedRevisions {
  from: number[];
  to: number[];
  at: number[];
  p: number[];
  note: string[];
}

/** Questions in export order, as the export writers take them. */
export interface ExportBatch {
  questions: ExportedQuestion[];
  packed: PackedRevisions | null;
}

// How JSON.stringify(…, null, 2) frames the records of a `questions` list one level down.
const LIST_OPEN = '{\n  "questions": [\n';
const LIST_CLOSE = '\n  ]\n}';

// A record's empty revision list as JSON.stringify lays it out: a key at the record's own
// depth (six spaces) after a line break, which no string value can hold unescaped.
const EMPTY_FORECASTS = '\n      "forecasts": []';

// A revision `{ at, p, note }` (toFileQuestion's item for one without lenses) as
// JSON.stringify(…, null, 2) lays it out inside a record of the file, around its values.
const FIRST_REVISION = utf8('[\n        {\n          "at": "');
const NEXT_REVISION = utf8(',\n        {\n          "at": "');
const AFTER_AT = utf8('",\n          "p": ');
const AFTER_P = utf8(',\n          "note": ');
const REVISION_CLOSE = utf8('\n        }');
const LIST_END = utf8('\n      ]');
/** What follows the probability of a revision without a note, to the end of the revision. */
const EMPTY_NOTE_AND_CLOSE = utf8(',\n          "note": ""\n        }');

/** The most bytes a revision without a note takes but for its probability's text. */
const PLAIN_REVISION_BYTES = NEXT_REVISION.length + ISO_MAX_BYTES + AFTER_AT.length + EMPTY_NOTE_AND_CLOSE.length;

/**
 * Question k's packed revisions as JSON.stringify(…, null, 2) writes its revision list
 * inside a record: by hand, because revisions are nearly all of an export, and bytes
 * written in place cost far less than an object each for JSON.stringify to walk.
 */
function writePackedRevisions(out: ByteText, r: PackedRevisions, k: number): void {
  const from = r.from[k]!;
  const to = r.to[k]!;
  for (let i = from; i < to; i++) {
    // A finite number's JSON text is its String(); p is always finite.
    const p = numberBytes(r.p[i]!);
    const buffer = out.reserve(PLAIN_REVISION_BYTES + p.length);
    let at = copyInto(i === from ? FIRST_REVISION : NEXT_REVISION, buffer, out.written);
    at = writeIso(r.at[i]!, buffer, at);
    at = copyInto(AFTER_AT, buffer, at);
    at = copyInto(p, buffer, at);
    const note = r.note[i]!;
    if (note === '') out.advance(copyInto(EMPTY_NOTE_AND_CLOSE, buffer, at));
    else {
      out.advance(copyInto(AFTER_P, buffer, at));
      out.text(JSON.stringify(note));
      out.raw(REVISION_CLOSE);
    }
  }
  out.raw(LIST_END);
}

/**
 * A batch's records, laid out as JSON.stringify lays out the `questions` list one level
 * down. JSON.stringify writes each record with the revisions in its `forecasts` list;
 * packed revisions are written into its text where the record's list is empty.
 */
function writeBatch(out: ByteText, { questions, packed }: ExportBatch): void {
  const framed = JSON.stringify({ questions: questions.map(toFileQuestion) }, null, 2);
  let from = LIST_OPEN.length;
  let search = from;
  for (let k = 0; k < questions.length; k++) {
    if (questions[k]!.forecasts.length > 0) continue; // written by JSON.stringify
    // The "[]" of this record's revision list (the records come in order, one list each).
    const at = framed.indexOf(EMPTY_FORECASTS, search) + EMPTY_FORECASTS.length - 2;
    search = at + 2;
    if (packed === null || packed.to[k] === packed.from[k]) continue; // no revisions: "[]" is right
    out.text(framed.slice(from, at));
    writePackedRevisions(out, packed, k);
    from = at + 2;
  }
  out.text(framed.slice(from, framed.length - LIST_CLOSE.length));
}

/**
 * The diary file as UTF-8 bytes, one piece per batch of questions, so an export of any
 * size is written without holding the diary in memory. Each piece is valid until the next
 * is asked for (one buffer is reused, see ByteText.take): write it out or copy it. The bytes are exactly those of
 * `JSON.stringify(toDiaryFile(settings, questions), null, 2) + "\n"` for the same questions
 * in the same order: each batch is laid out by JSON.stringify itself, one level down.
 */
export function* diaryFileBytes(settings: Settings, batches: Iterable<ExportBatch>): Generator<Uint8Array> {
  const empty = JSON.stringify({ format: DIARY_FORMAT, version: DIARY_VERSION, settings: { ...settings }, questions: [] }, null, 2);
  const head = empty.slice(0, empty.length - '[]\n}'.length);
  const out = new ByteText();
  let first = true;
  for (const batch of batches) {
    if (batch.questions.length === 0) continue;
    out.text(first ? `${head}[\n` : ',\n');
    writeBatch(out, batch);
    first = false;
    yield out.take();
  }
  out.text(first ? `${empty}\n` : `${LIST_CLOSE}\n`);
  yield out.take();
}
