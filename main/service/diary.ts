/**
 * The diary's operations: the only code that writes the store. Requests arrive already
 * validated against the contract (see dispatch.ts); the checks here are the ones that
 * need the diary's state (does the question exist, is the close still after the opening).
 */
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import type { ExportedText, Handlers, ImportConflict, ImportResult, QuestionList, ScoreJson, UndoableOperation, ValidRequest } from '../../shared/contract';
import type { EXPORT_FORMATS, IMPORT_FORMATS } from '../../shared/contract';
import { ApiError, notAccepted } from '../../shared/contract';
import { utf8 } from '../../shared/byte-text';
import {
  diaryFileBytes,
  diaryItems,
  questionRecordName,
  readDiaryText,
  toDiaryFile,
  toFileQuestion,
  DiaryFileError,
  type DiaryItem,
  type ExportBatch,
  type FileQuestion,
  type FileSettings,
} from '../../shared/diary-file';
import {
  NUDGE_KIND_NAMES,
  isBinary,
  isChoice,
  isNumeric,
  type Lens,
  type NudgeKind,
  type AnyOutcome,
  type Question,
  type QuestionKind,
  type QuestionType,
  type ResolutionChangeKind,
  type Settings,
} from '../../shared/domain';
import {
  entryIssues,
  questionTypeIssues,
  resolutionIssues,
  shapeOf,
  typeOf,
  type EntryFields,
  type ResolutionFields,
  type TypeIssue,
  type TypeShape,
} from '../../shared/question-types';
import { toStoredValue } from '../../shared/numeric-value';
import { beforeOpeningProblem, earlyStateResolutionWarning, futureProblem, isEarlyStateResolution, onClock } from '../../shared/time-rules';
import {
  computeChoiceConfidentCalls,
  computeChoiceDetail,
  computeChoiceReport,
  computeNumericDetail,
  computeNumericReport,
  computeNumericSurprises,
  computeScoreReport,
  computeScorecardDetail,
  CONFIDENT_THRESHOLD,
  brierIntervalOf,
  isStale,
  prepareScoredSet,
  type ChoiceConfidentCall,
  type ScoreOptions,
  type ScoreReport,
  type ScoredSet,
  type ScoringQuestion,
  type SurpriseDetail,
} from '../../shared/scoring';
import { INSTANT_RANGE, isInstantInRange, parseInstant, parseRangeBound, toIso } from '../../shared/time';
import * as v from '../../shared/validation';
import type { StoreHandles } from '../store/open';
import * as nudgeStore from '../store/nudges';
import * as qs from '../store/questions';
import { readSettings, writeSettings } from '../store/settings';
import * as undoStore from '../store/undo';
import { confidentCalls, referenceLeads } from './hindsight';
import { listQuestionPage } from './question-list';
import { choiceHindsight, numericHindsight } from './hindsight-types';
import { toICalendar } from './calendar';
import { TextDecodingError } from '../../shared/text-decoding';
import { writeFileAtomic } from '../files/atomic-write';
import { isDiaryFile } from '../files/file-name';
import { readTextFile } from '../files/read-text';
import { CsvError, diaryCsvBytes, readCsvDiary, type CsvItem } from './csv';
import { exportBatches, exportedQuestionReader } from './export-batches';
import { orderedId } from './ordered-ids';
import { countDueAt, dueAt, snoozeUntil, unresolvedQuestions } from './nudges';
import { briefingTitle, renderBriefing } from './briefing';
import { dataVersion, loadScoringInput, startStepwiseRead, type ScoringInput, type StepwiseRead } from './scoring-source';

export interface DiaryContext {
  store: StoreHandles;
  now: () => number;
  /** The system's zone, for a diary without one of its own (asked only then). */
  systemTimeZone: () => string;
  /** Builds the example diary for an empty diary (injected so the service stays small). */
  demo: (now: number) => unknown;
}

const ms = (iso: string): number => parseInstant(iso)!;

function notFound(what: string, id: string): ApiError {
  return new ApiError('not_found', `No ${what} with id "${id}" in this diary. It may have been deleted; reload and try again.`);
}

function invalid(field: string, reason: string): ApiError {
  return notAccepted([`${field}: ${reason}`]);
}

/** Every `field: reason` line a request broke, refused at once (a form shows them all), or nothing. */
function refuseAll(lines: string[]): void {
  if (lines.length) throw notAccepted(lines);
}

/** Type-rule issues (shared/question-types.ts) as `field: reason` lines, the fields under `prefix`. */
function issueLines(issues: TypeIssue[], prefix = ''): string[] {
  return issues.map((i) => {
    const path = v.formatPath(i.path);
    return `${prefix && path ? `${prefix}.${path}` : prefix || path}: ${i.message}`;
  });
}

/**
 * A forecast's or reference's value as the store keeps it, once it fits the question
 * (refused, naming the field, when it does not): `p` for a yes/no question; the
 * probabilities, or the quantiles with dates as days, for the others.
 */
function storedEntry(shape: TypeShape, entry: EntryFields, prefix = ''): { p: number | null; values: number[] } {
  refuseAll(issueLines(entryIssues(shape, entry), prefix));
  return storedValuesOf(shape, entry);
}

/** `storedEntry` for an entry already checked (a validated diary file's). */
function storedValuesOf(shape: TypeShape, entry: EntryFields): { p: number | null; values: number[] } {
  if (shape.type === 'binary') return { p: entry.p!, values: [] };
  if (shape.type === 'choice') return { p: null, values: entry.probs! };
  return { p: null, values: entry.quantiles!.map((x) => toStoredValue(x, shape.value_kind)) };
}

/** A checked resolution's option and value as the store keeps them (a date as days). */
function storedOutcome(shape: TypeShape, r: ResolutionFields): { option: number | null; value: number | null } {
  return {
    option: r.outcome === 'option' ? r.option! : null,
    value: r.outcome === 'value' ? (shape.type === 'numeric' ? toStoredValue(r.value!, shape.value_kind) : null) : null,
  };
}

const TYPE_WORDS: Record<QuestionType, string> = { binary: 'yes/no', choice: 'choice', numeric: 'numeric' };

const sameList = (a: readonly unknown[], b: readonly unknown[]) => a.length === b.length && a.every((x, i) => x === b[i]);

/**
 * What an edit may not change, because the question's revisions depend on it: its type, a
 * numeric question's value kind and levels, the number of a choice question's options.
 * Giving them unchanged is fine (a form may send every field).
 */
function fixedFieldIssues(
  row: qs.QuestionRow,
  stored: qs.TypeRows,
  c: { type?: string; value_kind?: string; levels?: number[]; options?: string[] },
): TypeIssue[] {
  const issues: TypeIssue[] = [];
  const fixed = `is fixed when the question is created (this is a ${TYPE_WORDS[row.type]} question); to ask it another way, add a new question`;
  if (c.type !== undefined && c.type !== row.type) issues.push({ path: ['type'], message: fixed });
  if (row.type === 'choice' && c.options !== undefined && c.options.length !== stored.options.length) {
    issues.push({
      path: ['options'],
      message: `must keep the question's ${stored.options.length} options (they may be relabelled): every revision gives one probability per option`,
    });
  }
  if (row.type !== 'numeric') return issues;
  if (c.value_kind !== undefined && c.value_kind !== row.value_kind) issues.push({ path: ['value_kind'], message: fixed.replace('is fixed', `is fixed (${row.value_kind})`) });
  if (c.levels !== undefined && !sameList(c.levels, stored.levels)) {
    issues.push({ path: ['levels'], message: `are fixed when the question is created (${stored.levels.join(', ')}): every revision gives one value per level` });
  }
  return issues;
}

/**
 * Where a merging import puts the file's version of a question already in the diary while
 * it compares the two: an id no file or request can give (ids refuse control characters),
 * removed before the import ends.
 */
const MERGE_SHADOW = '\u0001merge:';

/** How many conflicts a refused merge lists (the message gives the total). */
const MAX_LISTED_CONFLICTS = 100;

type ExportFormat = (typeof EXPORT_FORMATS)[number];
type ImportFormat = (typeof IMPORT_FORMATS)[number];

/** What an import reads, in file order: from a JSON diary file (or object) or from CSV. */
type ImportItem = DiaryItem | CsvItem;

/** Questions per batch when an export reads the diary: a few megabytes of text at a time. */
const EXPORT_BATCH = 500;

/**
 * SQLite's page cache during an export, in KiB. Each batch looks up its questions' rows at
 * random places in every table; with the default 2 MiB the revisions' pages push out the
 * pages of the smaller tables (questions, tags, resolutions) between one batch and the
 * next, and each visit is a read from the operating system again.
 */
const EXPORT_CACHE_KIB = 64 * 1024;

/** SQLite's page cache during an import, in KiB: enough for the indexes' working pages. */
const IMPORT_CACHE_KIB = 64 * 1024;

/** Without an opening time, a question opens at its first revision (or now), and always before its close. */
function defaultOpenedAt(firstAt: number | null, stamp: number, closes: number): number {
  return Math.min(firstAt ?? stamp, closes - 1);
}

/** An id from a file, copied: a slice of a chunk of text would keep the whole chunk in memory. */
const detached = (id: string): string => (' ' + id).slice(1);

/** A reader's refusal as the API error the user sees; anything else (a file that cannot be read) passes through. */
function asImportError(err: unknown): unknown {
  // The `field: reason` line names the place once: the reason with its record or row, not the whole message again.
  if (err instanceof DiaryFileError) {
    const line = err.reason !== null && err.record !== null ? `${err.reason} (question ${err.record + 1})` : err.message;
    return new ApiError('invalid', err.message, err.field ? [`${err.field}: ${line}`] : []);
  }
  if (err instanceof CsvError) {
    const line = err.reason !== null && err.row !== null ? `${err.reason} (row ${err.row})` : err.message;
    return new ApiError('invalid', err.message, err.column ? [`${err.column}: ${line}`] : []);
  }
  if (err instanceof TextDecodingError) return new ApiError('invalid', `${err.message} Nothing was imported.`);
  return err;
}

/** better-sqlite3's error for a row whose primary key is taken: here, a question id already in the diary. */
function isTakenQuestionId(err: unknown): boolean {
  return (err as { code?: string }).code === 'SQLITE_CONSTRAINT_PRIMARYKEY' && /\bquestions\.id\b/.test((err as Error).message);
}

/** The export's batches, telling `onProgress` the questions written so far after each one. */
function* counted(batches: Iterable<ExportBatch>, total: number, onProgress: (questions: number, total: number) => void): Generator<ExportBatch> {
  let done = 0;
  for (const batch of batches) {
    yield batch;
    done += batch.questions.length;
    onProgress(done, total);
  }
}

export function createDiary(ctx: DiaryContext) {
  const { store, now } = ctx;
  const { read, write } = store;
  // Every write is one immediate transaction (see writeTransaction in main/store/open.ts).
  const transact = <T>(fn: () => T): T => store.transact(fn);

  const settings = (): Settings => readSettings(read, ctx.systemTimeZone);

  function getQuestion(id: string): Question {
    const bundle = qs.loadBundles(read, [id])[0];
    if (!bundle) throw notFound('question', id);
    return qs.toQuestion(bundle, now());
  }

  /** The stale flag (glide path) for an unresolved question's latest forecast. */
  function stale(
    q: { kind: QuestionKind; opened_at: number; closes_at: number; checkin_days: number | null },
    last: { p: number; at: number } | null,
    s: Settings,
    t: number,
  ): boolean {
    if (!last) return false;
    return isStale({
      kind: q.kind,
      p: last.p,
      lastRevisedAt: last.at,
      openedAt: q.opened_at,
      closesAt: q.closes_at,
      now: t,
      checkinDays: q.checkin_days ?? s.default_checkin_days,
    });
  }

  /** The ids of the example diary's questions (they are fixed: "demo-…"), read once. */
  let exampleIdList: string[] | null = null;
  function exampleIds(): string[] {
    exampleIdList ??= ((ctx.demo(now()) as { questions?: { id?: unknown }[] }).questions ?? [])
      .map((q) => q.id)
      .filter((id): id is string => typeof id === 'string');
    return exampleIdList;
  }

  function requireQuestionRow(id: string): qs.QuestionRow {
    const row = qs.questionRow(write, id);
    if (!row) throw notFound('question', id);
    return row;
  }

  /** What stored question `row`'s type makes of its forecasts and resolution (its option count or levels). */
  function shapeOfRow(row: qs.QuestionRow): TypeShape {
    if (row.type === 'binary') return { type: 'binary' };
    const rows = qs.typeRows(write, row.id);
    if (row.type === 'choice') return { type: 'choice', option_count: rows.options.length };
    return { type: 'numeric', levels: rows.levels, value_kind: row.value_kind ?? 'number' };
  }

  /** Inserts one question with its history; the caller holds the transaction. */
  function insertWhole(q: FileQuestion, s: Settings, stamp: number): string {
    const id = q.id ?? randomUUID();
    let firstAt: number | null = null;
    for (const f of q.forecasts) if (firstAt === null || f.at < firstAt) firstAt = f.at;
    const closes = q.closes_at;
    const opened = q.opened_at ?? defaultOpenedAt(firstAt, stamp, closes);
    // A close at the range's first instant leaves no earlier instant for a default opening;
    // storing one before 1900 would make the diary's export a file it refuses.
    if (!isInstantInRange(opened)) {
      throw invalid('closes_at', `must be after ${toIso(INSTANT_RANGE.earliest)} when the question has no opened_at: it opens at least 1 ms before it closes, and every time must be between 1900 and 2199`);
    }
    if (closes <= opened) throw invalid('closes_at', 'must be after the opening time (opened_at)');
    // The record passed the type rules (the contract or the diary file's schema): its fields fit its type.
    const shape = shapeOf(q);
    const type = typeOf(q);
    qs.insertQuestion(
      write,
      {
        id,
        type,
        ordered: type === 'choice' ? (q.ordered ? 1 : 0) : null,
        unit: type === 'numeric' ? (q.unit ?? '') : null,
        value_kind: shape.type === 'numeric' ? shape.value_kind : null,
        title: q.title,
        rule: q.rule ?? '',
        kind: (q.kind ?? 'event_by_deadline') as QuestionKind,
        opened_at: opened,
        closes_at: closes,
        time_zone: q.time_zone ?? s.time_zone,
        base_rate: q.base_rate ?? null,
        base_rate_note: q.base_rate_note ?? '',
        false_alarm_cost: q.costs?.false_alarm ?? null,
        miss_cost: q.costs?.miss ?? null,
        checkin_days: q.checkin_days ?? null,
        created_at: stamp,
        updated_at: stamp,
      },
      q.tags ?? [],
      {
        options: (q.options ?? []).map((label, k) => ({ label, base_rate: q.option_base_rates?.[k] ?? null })),
        levels: shape.type === 'numeric' ? [...shape.levels] : [],
      },
    );
    qs.insertForecasts(
      write,
      q.forecasts.map((f) => ({ id: orderedId(), question_id: id, at: f.at, ...storedValuesOf(shape, f), note: f.note ?? '', lenses: (f.lenses ?? []) as Lens[] })),
    );
    for (const r of q.references ?? []) {
      qs.insertReference(write, { id: orderedId(), question_id: id, at: r.at, ...storedValuesOf(shape, r), source: r.source });
    }
    if (q.resolution) {
      qs.upsertResolution(write, {
        question_id: id,
        outcome: q.resolution.outcome as AnyOutcome,
        at: q.resolution.at,
        note: q.resolution.note ?? '',
        recorded_at: stamp,
        ...storedOutcome(shape, q.resolution),
      });
    }
    for (const h of q.resolution_history ?? []) {
      qs.insertResolutionHistory(write, {
        question_id: id,
        ...storedOutcome(shape, h),
        outcome: h.outcome as AnyOutcome,
        at: h.at,
        note: h.note ?? '',
        recorded_at: h.recorded_at,
        replaced_at: h.replaced_at,
        change: h.change as ResolutionChangeKind,
        change_note: h.change_note ?? '',
      });
    }
    return id;
  }

  function listQuestions(req: ValidRequest<'listQuestions'>): QuestionList {
    const s = settings();
    const t = now();
    return listQuestionPage({ read, settings: s, now: t, stale: (q, last) => stale(q, last, s, t) }, req);
  }

  /** The file's settings, written into an empty diary (the caller holds the transaction). */
  function adoptSettings(file: FileSettings): void {
    const { default_false_alarm_cost, default_miss_cost, default_checkin_days, closing_soon_hours, overdue_after_days, time_zone, quiet_hours } = file;
    writeSettings(write, {
      default_false_alarm_cost,
      default_miss_cost,
      default_checkin_days,
      closing_soon_hours,
      overdue_after_days,
      time_zone,
      quiet_hours: quiet_hours === undefined ? undefined : quiet_hours,
    } as Partial<Settings>);
  }

  /** The place of a record in its file, as its error messages name it. */
  function recordError(item: { index: number; row?: number; question: FileQuestion }, code: ApiError['code'], column: string, reason: string): ApiError {
    if (item.row !== undefined) {
      return new ApiError(code, `Row ${item.row}, column ${column}: ${reason}. Nothing was imported.`, [`${column}: ${reason}`]);
    }
    return new ApiError(code, `${questionRecordName(item.index, item.question)} is not valid: field ${column}: ${reason}. Nothing was imported.`, [
      `questions[${item.index}].${column}: ${reason}`,
    ]);
  }

  /** A question of the file that a merge compares with the diary's question of the same id. */
  interface MergeCandidate {
    /** Where the file's version sits meanwhile (MERGE_SHADOW). */
    shadow: string;
    id: string;
    title: string;
    index: number;
    row: number | null;
    /** False when the file left opened_at out: its default depends on the moment of import, so it is not compared. */
    openedGiven: boolean;
  }

  /** Where a conflict is in its file, as people count. */
  function conflictPlace(c: ImportConflict): string {
    return c.row === null ? questionRecordName(c.index) : `The question on row ${c.row}`;
  }

  function mergeRefusal(conflicts: ImportConflict[], total: number): ApiError {
    const lines = conflicts.map((c) => `${conflictPlace(c)}: "${c.id}" (“${c.title}”) differs in ${c.differs.join(', ')}`);
    const shown = lines.slice(0, 5).join('; ');
    const more = total > 5 ? `; and ${total - 5} more` : '';
    return new ApiError(
      'conflict',
      `${total} question${total === 1 ? ' is' : 's are'} already in this diary with different contents, so nothing was imported: ${shown}${more}. ` +
        'For each, remove it from the file to keep the diary’s version, or delete it from the diary (or give it a new id in the file) to take the file’s; then import again with merge.',
      lines,
      conflicts,
    );
  }

  /**
   * Adds what a file holds, read as it streams, inside ONE immediate write transaction: the
   * first bad record rolls back everything, so the diary is left exactly as it was. Each
   * record costs the same however large the diary: no query per record grows with it (an
   * id already in the diary is found by the insert's own primary-key check, or with
   * `merge` by one lookup of its id).
   *
   * With `merge`, a question whose id is already in the diary is written under a stand-in
   * id (MERGE_SHADOW) and compared with the diary's as the export writes both, field by
   * field, then removed: the same defaults, order and numbers decide "unchanged" as decide
   * the file an export writes. JSON compares each at once; CSV, whose rows of a question
   * may be anywhere in the file, at the end.
   */
  /** `onlyIntoEmpty`: refused (with that error) unless the diary is empty when the write begins. */
  function importItems(items: Iterable<ImportItem>, options: { merge?: boolean; onlyIntoEmpty?: () => Error } = {}): ImportResult {
    const stamp = now();
    let added = 0;
    let skipped = 0;
    const conflicts: ImportConflict[] = [];
    let conflictCount = 0;
    const run = () => transact(() => {
      // The file's settings come along only into an empty diary: importing a colleague's
      // file into a working diary must not change its defaults.
      const empty = qs.isEmpty(write);
      // Checked again here, holding the write lock: another process may have filled the diary since.
      if (options.onlyIntoEmpty && !empty) throw options.onlyIntoEmpty();
      let s = readSettings(write, ctx.systemTimeZone);
      let settingsRead = false;
      // Questions that took the diary's zone before the file's settings (which may come after
      // the questions) named another one.
      const zoneDefaulted: string[] = [];
      // CSV only: each question's id and what its default opening time depends on, by index.
      const csvQuestions: { id: string; closes: number; firstAt: number | null; openedGiven: boolean; shape: TypeShape }[] = [];
      const setOpenedAt = write.prepare('UPDATE questions SET opened_at = ? WHERE id = ?');
      const merging = options.merge === true && !empty;
      const present = merging ? write.prepare('SELECT 1 FROM questions WHERE id = ?').pluck() : null;
      const exported = merging ? exportedQuestionReader(write) : null;
      const removeShadow = write.prepare('DELETE FROM questions WHERE id = ?');
      const csvCandidates: MergeCandidate[] = [];

      const compare = (c: MergeCandidate, csv: boolean) => {
        const theirs = toFileQuestion(exported!(c.shadow)!);
        const ours = toFileQuestion(exported!(c.id)!);
        removeShadow.run(c.shadow);
        const differs: string[] = [];
        for (const key of new Set([...Object.keys(theirs), ...Object.keys(ours)])) {
          if (key === 'id' || (key === 'opened_at' && !c.openedGiven) || (key === 'resolution_history' && csv)) continue;
          if (JSON.stringify(theirs[key]) !== JSON.stringify(ours[key])) differs.push(key);
        }
        if (differs.length === 0) skipped++;
        else if (++conflictCount <= MAX_LISTED_CONFLICTS) conflicts.push({ index: c.index, row: c.row, id: c.id, title: c.title, differs });
      };

      // CSV: the revisions on consecutive rows of one question, written together (several
      // to a statement, see insertForecasts) before anything else is written, so each keeps
      // its place in the entry order. Nothing a row holds can make these inserts fail: every
      // value was checked as it was read.
      let revisions: qs.NewForecast[] = [];
      let revisionsOf = -1;
      const writeRevisions = () => {
        if (revisions.length) qs.insertForecasts(write, revisions);
        revisions = [];
      };

      for (const item of items) {
        if (item.kind !== 'addition' || item.index !== revisionsOf) writeRevisions();
        if (item.kind === 'settings') {
          settingsRead = true;
          if (!empty) continue;
          adoptSettings(item.settings);
          s = readSettings(write, ctx.systemTimeZone);
          if (zoneDefaulted.length) {
            write.prepare('UPDATE questions SET time_zone = ? WHERE id IN (SELECT value FROM json_each(?))').run(s.time_zone, JSON.stringify(zoneDefaulted));
          }
        } else if (item.kind === 'question') {
          const q = item.question;
          const csv = 'row' in item;
          const candidate: MergeCandidate | null =
            present && q.id !== undefined && present.get(q.id) !== undefined
              ? {
                  shadow: `${MERGE_SHADOW}${item.index}`,
                  id: detached(q.id),
                  title: detached(q.title),
                  index: item.index,
                  row: csv ? item.row : null,
                  openedGiven: q.opened_at !== undefined,
                }
              : null;
          let id: string;
          try {
            id = insertWhole(candidate ? { ...q, id: candidate.shadow } : q, s, stamp);
          } catch (err) {
            if (isTakenQuestionId(err)) {
              throw recordError(
                item,
                'conflict',
                csv ? 'question_id' : 'id',
                `"${q.id}" is already in this diary (was this file imported before? Import it with merge to add only the questions that are new)`,
              );
            }
            if (err instanceof ApiError) {
              throw new ApiError(err.code, `${questionRecordName(item.index, q)} is not valid: ${err.fields[0] ?? err.message}. Nothing was imported.`, err.fields);
            }
            throw err;
          }
          if (candidate && !csv) compare(candidate, false);
          else if (candidate) csvCandidates.push(candidate);
          else added++;
          if (empty && !settingsRead && q.time_zone === undefined) zoneDefaulted.push(detached(id));
          if (csv) {
            const firstAt = q.forecasts[0]?.at ?? null;
            csvQuestions[item.index] = { id: detached(id), closes: q.closes_at, firstAt, openedGiven: q.opened_at !== undefined, shape: shapeOf(q) };
          }
        } else {
          // A later CSV row of a question already inserted: its revision or reference forecast.
          const target = csvQuestions[item.index]!;
          revisionsOf = item.index;
          if (item.forecast) {
            const f = item.forecast;
            revisions.push({
              id: orderedId(),
              question_id: target.id,
              at: f.at,
              ...storedValuesOf(target.shape, f),
              note: f.note ?? '',
              lenses: (f.lenses ?? []) as Lens[],
            });
            if (!target.openedGiven && (target.firstAt === null || f.at < target.firstAt)) {
              target.firstAt = f.at;
              setOpenedAt.run(defaultOpenedAt(f.at, stamp, target.closes), target.id);
            }
          }
          if (item.reference) {
            writeRevisions();
            const r = item.reference;
            qs.insertReference(write, { id: orderedId(), question_id: target.id, at: r.at, ...storedValuesOf(target.shape, r), source: r.source });
          }
        }
      }
      writeRevisions();
      for (const c of csvCandidates) compare(c, true);
      // All or nothing: any conflict rolls the whole import back.
      if (conflictCount) throw mergeRefusal(conflicts, conflictCount);
    });
    const cache = write.pragma('cache_size', { simple: true }) as number;
    const temp = write.pragma('temp_store', { simple: true }) as number;
    write.pragma(`cache_size = ${-IMPORT_CACHE_KIB}`);
    // Each statement that writes several rows under a constraint keeps, until it ends, the
    // pages it changes so it can undo itself alone (SQLite's statement journal). On a file,
    // that is a write to disk per page per statement: an import of 10,000 questions wrote
    // 500 MB there. In memory it costs a copy. It holds one statement's pages at a time, so
    // it stays small; a crash loses nothing, since the transaction itself is in the WAL.
    write.pragma('temp_store = MEMORY');
    try {
      run();
    } catch (err) {
      throw asImportError(err);
    } finally {
      write.pragma(`cache_size = ${cache}`);
      write.pragma(`temp_store = ${temp}`);
    }
    return { added, skipped };
  }

  /** A diary file already in memory (the API's importDiary, the example diary). */
  function importParsed(raw: unknown, options: { merge?: boolean; onlyIntoEmpty?: () => Error } = {}): ImportResult {
    return importItems(diaryItems(raw), options);
  }

  function readerFor(format: ImportFormat, chunks: Iterable<string>): Iterable<ImportItem> {
    return format === 'csv' ? readCsvDiary(chunks) : readDiaryText(chunks);
  }

  /**
   * Imports a file from disk, streaming: any size, in the memory of one record. The
   * command line and the desktop app's File menu come this way.
   */
  /** `onRead` hears the bytes read of the file's size as the import goes (then the commit follows). */
  function importFile(file: string, format: ImportFormat, options: { merge?: boolean; onRead?: (bytes: number, total: number) => void } = {}): ImportResult {
    return importItems(readerFor(format, readTextFile(file, undefined, options.onRead)), options);
  }

  /**
   * The export's text, piece by piece, read in one snapshot of the diary: a read
   * transaction is open from the first piece to the last, so a change committed meanwhile
   * (by another connection or process) is either wholly in the file or not at all. Private,
   * and consumed synchronously (by exportTo and writeFileAtomic): nothing else may use the
   * read handle while the snapshot is open.
   */
  function* exportPieces(format: ExportFormat, onProgress?: (questions: number, total: number) => void): Generator<Uint8Array> {
    if (format === 'ics') {
      yield utf8(toICalendar(unresolvedQuestions(store, now()), { now: now(), alarmHours: settings().closing_soon_hours }));
      return;
    }
    const cache = read.pragma('cache_size', { simple: true }) as number;
    read.pragma(`cache_size = ${-EXPORT_CACHE_KIB}`);
    read.exec('BEGIN');
    try {
      const batches = onProgress ? counted(exportBatches(read, EXPORT_BATCH), read.prepare('SELECT count(*) FROM questions').pluck().get() as number, onProgress) : exportBatches(read, EXPORT_BATCH);
      if (format === 'csv') {
        // The CSV header comes first: it has the type columns only when some question needs them (docs/csv-format.md).
        const withTypes = read.prepare("SELECT EXISTS (SELECT 1 FROM questions WHERE type <> 'binary')").pluck().get() === 1;
        yield* diaryCsvBytes(batches, withTypes);
      } else {
        yield* diaryFileBytes(settings(), batches);
      }
    } finally {
      read.exec('COMMIT');
      read.pragma(`cache_size = ${cache}`);
    }
  }

  function exportDiary(): Record<string, unknown> {
    const t = now();
    const questions = qs.loadBundles(read).map((b) => qs.toQuestion(b, t));
    return toDiaryFile(settings(), questions);
  }

  function scoreOptions(req: { tag?: string; from?: string; to?: string }): ScoreOptions {
    const s = settings();
    return {
      tag: req.tag,
      from: req.from !== undefined ? parseRangeBound(req.from, 'from')! : undefined,
      to: req.to !== undefined ? parseRangeBound(req.to, 'to')! : undefined,
      default_costs: { false_alarm: s.default_false_alarm_cost, miss: s.default_miss_cost },
    };
  }

  // The engine's input is re-read only when the diary changed: SQLite's data_version on the
  // read handle moves whenever any other connection (our write handle, or another process)
  // commits. A filter change on the Scorecard then costs the engine's time alone.
  let scoringCache: { version: number; input: ScoringInput } | null = null;
  // A read of that input in steps, between requests (warmScoringInput), when one is under way;
  // and the diary state at which reading ahead last failed, not to be tried again.
  let stepwise: StepwiseRead | null = null;
  let warmingFailedAt: number | null = null;

  /** Every question as the engine sees it, by type, re-read only when the diary changed. */
  function typedScoringInput(): ScoringInput {
    const version = dataVersion(read);
    if (scoringCache?.version === version) return scoringCache.input;
    // A read begun in the background for this same state is finished now rather than begun again.
    if (stepwise?.version === version) {
      while (!stepwise.step());
      const { input } = stepwise;
      stepwise = null;
      if (input !== null) return (scoringCache = { version, input }).input;
    }
    stepwise = null;
    return (scoringCache = { version, input: loadScoringInput(read) }).input;
  }

  /**
   * One step of reading the scoring input ahead of need (a long-running app calls this while
   * idle): the first visit to the Scorecard or Hindsight then finds it read, and scored with
   * no filter. True when all of that is up to date and nothing is left to do.
   */
  function warmScoringInput(): boolean {
    const version = dataVersion(read);
    if (warmingFailedAt === version) return true;
    try {
      return warmStep(version);
    } catch (err) {
      // The request that needs the input will meet the same failure and say what it is;
      // until the diary changes, reading ahead would only fail again.
      warmingFailedAt = version;
      throw err;
    }
  }

  function warmStep(version: number): boolean {
    if (scoringCache?.version === version) {
      // Then what a first visit to the Scorecard and Hindsight asks for (no filter, the
      // default threshold), one figure per step: on a diary of every type the Scorecard's
      // choice and numeric figures alone took 0.3 s of its first visit.
      if (warmed?.version !== version) warmed = { version, done: 0 };
      if (warmed.done === WARM_FIGURES.length) return true;
      WARM_FIGURES[warmed.done++]!();
      return false;
    }
    if (stepwise?.version !== version) stepwise = startStepwiseRead(read);
    if (!stepwise.step()) return false;
    const { input } = stepwise;
    stepwise = null;
    if (input !== null) scoringCache = { version, input };
    return false; // the caller looks again: either the input is now current, or the diary moved on
  }

  /** The figures reading ahead computes after the input, in this order (see warmStep); each is kept by `remembered`. */
  const WARM_FIGURES: (() => unknown)[] = [
    () => scoredSet({}),
    () => scoreJson({}),
    () => handlers.score({}),
    () => choiceCalls({}, CONFIDENT_THRESHOLD, false),
    () => surprises({}),
  ];
  /** How many of them are computed for the diary state `version`. */
  let warmed: { version: number; done: number } | null = null;

  /** The yes/no questions as the engine sees them; "what if" costs replace each question's own. */
  function scoringInput(req: { costs?: { false_alarm: number; miss: number } }): ScoringQuestion[] {
    const questions = typedScoringInput().binary;
    const costs = req.costs;
    return costs ? questions.map((q) => ({ ...q, costs: { false_alarm: costs.false_alarm, miss: costs.miss } })) : questions;
  }

  // Figures computed from that input are kept until the diary changes too (same data_version):
  // opening the Scorecard or Hindsight again, or going back to an earlier filter, then costs
  // nothing, and the two screens share the yes/no report. Everything a figure depends on is
  // in the diary (settings included) or in its key.
  let figures: { version: number; byKey: Map<string, unknown> } | null = null;
  // A scored set of 100,000 questions is several megabytes; a filter keeps four entries (set, report,
  // `score --json` object, Scorecard answer), so the last six filters are kept, the oldest dropped first.
  const FIGURES_KEPT = 24;

  function remembered<T>(key: string, compute: () => T): T {
    typedScoringInput(); // brings the input, and its version, up to date
    const version = scoringCache!.version;
    if (figures?.version !== version) figures = { version, byKey: new Map() };
    if (figures.byKey.has(key)) return figures.byKey.get(key) as T;
    const value = compute();
    if (figures.byKey.size >= FIGURES_KEPT) figures.byKey.delete(figures.byKey.keys().next().value!);
    figures.byKey.set(key, value);
    return value;
  }

  /** The choice confident calls of a selection, kept like the other figures: Hindsight's pages ask for them again and again. */
  function choiceCalls(filter: Filter, threshold: number, includeHits: boolean): ChoiceConfidentCall[] {
    return remembered(`choice-calls|${filterKey(filter)}|${threshold}|${includeHits}`, () =>
      computeChoiceConfidentCalls(typedScoringInput().choice, scoreOptions(filter), threshold, includeHits),
    );
  }

  /** The numeric surprises of a selection, kept like the other figures. */
  function surprises(filter: Filter): SurpriseDetail[] {
    return remembered(`surprises|${filterKey(filter)}`, () => computeNumericSurprises(typedScoringInput().numeric, scoreOptions(filter)));
  }

  const filterKey = (req: Filter) =>
    JSON.stringify([req.tag ?? null, req.from ?? null, req.to ?? null, req.costs?.false_alarm ?? null, req.costs?.miss ?? null]);

  type Filter = { tag?: string; from?: string; to?: string; costs?: { false_alarm: number; miss: number } };

  /** The scored yes/no questions of a filter, which every yes/no figure is built from, once per diary state. */
  function scoredSet(req: Filter): ScoredSet {
    return remembered(`set|${filterKey(req)}`, () => prepareScoredSet(scoringInput(req), scoreOptions(req)));
  }

  /** The yes/no report for a filter (and "what if" costs), computed once per diary state. */
  function binaryReport(req: Filter): ScoreReport {
    return remembered(`report|${filterKey(req)}`, () => computeScoreReport(scoringInput(req), scoreOptions(req), scoredSet(req)));
  }

  /** The `score --json` object: the yes/no report with the choice and numeric members (INTERFACES.md §2). */
  function scoreJson(req: ValidRequest<'score'>): ScoreJson {
    return remembered(`json|${filterKey(req)}`, () => {
      const options = scoreOptions(req);
      const { choice, numeric } = typedScoringInput();
      return { ...binaryReport(req), choice: computeChoiceReport(choice, options), numeric: computeNumericReport(numeric, options) };
    });
  }

  /** Some questions of one type by id, as the service returns them (Hindsight's entries show their notes and labels). */
  function detailsOf<Q extends Question>(is: (q: Question) => q is Q, t: number): (ids: string[]) => Q[] {
    return (ids) => (ids.length ? qs.loadBundles(read, ids).map((b) => qs.toQuestion(b, t)).filter(is) : []);
  }

  const EXPORT_FILES: Record<ExportFormat, { name: string; extension: string; media_type: string }> = {
    json: { name: 'forelog-diary', extension: 'json', media_type: 'application/json' },
    csv: { name: 'forelog-diary', extension: 'csv', media_type: 'text/csv' },
    ics: { name: 'forelog-closes', extension: 'ics', media_type: 'text/calendar' },
  };

  /**
   * Hands the export to `sink` as UTF-8 bytes, piece by piece (a megabyte or so each),
   * synchronously, from one snapshot. A piece's memory is reused for the next: the sink
   * writes it out or copies it before it returns.
   */
  function exportTo(format: ExportFormat, sink: (piece: Uint8Array) => void): void {
    for (const piece of exportPieces(format)) sink(piece);
  }

  /** The export as one text, for the API (browser mode, the app's Settings): the same writer as the files. */
  function exportText(format: ExportFormat): ExportedText {
    const day = toIso(now()).slice(0, 10);
    const { name, extension, media_type } = EXPORT_FILES[format];
    // Each piece ends where a record does, so none splits a character; a piece may begin
    // with U+FEFF (an id's first character), which is text here, not a byte order mark.
    const decoder = new TextDecoder('utf-8', { ignoreBOM: true });
    const pieces: string[] = [];
    exportTo(format, (piece) => pieces.push(decoder.decode(piece)));
    return { text: pieces.join(''), file_name: `${name}-${day}.${extension}`, media_type };
  }

  /** Writes the export to `file`, whole or not at all (main/files/atomic-write.ts). */
  /** `onProgress` hears how many questions of how many have been written as the export goes. */
  function exportFile(file: string, format: ExportFormat, onProgress?: (questions: number, total: number) => void): void {
    if (isDiaryFile(file, store.path)) {
      throw new Error(`${path.resolve(file)} is the diary itself (or a file SQLite keeps beside it); export to another file name. Nothing was written; the diary is unchanged.`);
    }
    writeFileAtomic(file, exportPieces(format, onProgress));
  }

  /** A file's text from the API (already decoded by the caller; a byte order mark it kept is dropped). */
  function importText(format: ImportFormat, text: string, options: { merge?: boolean } = {}): ImportResult {
    return importItems(readerFor(format, [text.charCodeAt(0) === 0xfeff ? text.slice(1) : text]), options);
  }

  /**
   * Runs `change` on question `questionId` (the caller holds the transaction) and keeps the
   * question's rows as they were before it; returns the token that undoes it.
   */
  function tracked(operation: UndoableOperation, questionId: string, change: () => void): string {
    const before = undoStore.snapshotQuestion(write, questionId);
    change();
    return undoStore.recordUndo(write, operation, questionId, before, now());
  }

  /** A `field: reason` line when `at` lies in the future (shared/time-rules.ts), else none. */
  function pastLine(at: number, field: string, what: string): string[] {
    const problem = futureProblem(at, now(), what);
    return problem ? [`${field}: ${problem}`] : [];
  }

  /** A `field: reason` line when `at` is before the question opened, else none. */
  function openingLine(at: number, openedAt: number, timeZone: string, field: string): string[] {
    const problem = beforeOpeningProblem(at, openedAt, timeZone);
    return problem ? [`${field}: ${problem}`] : [];
  }

  const handlers: Handlers = {
    diaryInfo: () => ({
      question_count: qs.questionCount(read),
      example_questions: exampleIds().filter((id) => qs.questionRow(read, id) !== undefined).length,
      location: store.path,
      time_zone: settings().time_zone,
    }),

    listQuestions,

    getQuestion: (req) => getQuestion(req.id),

    listTags: () => ({ tags: qs.allTagCounts(read) }),

    createQuestion: (req) => {
      const stamp = now();
      const s = settings();
      const opened = req.opened_at !== undefined ? ms(req.opened_at) : stamp;
      const closes = ms(req.closes_at);
      const zone = req.time_zone ?? s.time_zone;
      const first = req.first_forecast;
      // Without a time of its own the first revision is made now (or at the opening, when that is a moment ahead).
      const firstAt = first?.at !== undefined ? ms(first.at) : Math.max(stamp, opened);
      const problems: string[] = [];
      if (req.opened_at !== undefined) problems.push(...pastLine(opened, 'opened_at', 'the opening time (when the question was posed)'));
      if (closes <= opened) {
        problems.push(
          req.opened_at === undefined
            ? 'closes_at: must be in the future (after now, when the question opens); to record a question whose window has already closed, give the time it was posed as opened_at'
            : `closes_at: ${v.CLOSES_AFTER_OPENS_RULE}`,
        );
      }
      if (first?.at !== undefined) problems.push(...pastLine(firstAt, 'first_forecast.at', 'a revision'), ...openingLine(firstAt, opened, zone, 'first_forecast.at'));
      refuseAll(problems);
      const id = randomUUID();
      let undo = '';
      transact(() => {
        const { first_forecast: _first, ...fields } = req;
        const question: FileQuestion = {
          ...fields,
          id,
          opened_at: opened,
          closes_at: closes,
          // The contract checked the first forecast against the question's type.
          forecasts: first ? [{ ...first, at: firstAt }] : [],
        };
        undo = tracked('createQuestion', id, () => insertWhole(question, s, stamp));
      });
      return { ...getQuestion(id), undo };
    },

    updateQuestion: (req) => {
      let undo = '';
      transact(() => {
        const row = requireQuestionRow(req.id);
        const c = req.changes;
        const next: qs.QuestionRow = {
          ...row,
          title: c.title ?? row.title,
          rule: c.rule ?? row.rule,
          kind: (c.kind as QuestionKind | undefined) ?? row.kind,
          opened_at: c.opened_at !== undefined ? ms(c.opened_at) : row.opened_at,
          closes_at: c.closes_at !== undefined ? ms(c.closes_at) : row.closes_at,
          time_zone: c.time_zone ?? row.time_zone,
          base_rate: c.base_rate !== undefined ? c.base_rate : row.base_rate,
          base_rate_note: c.base_rate_note ?? row.base_rate_note,
          false_alarm_cost: c.costs !== undefined ? (c.costs?.false_alarm ?? null) : row.false_alarm_cost,
          miss_cost: c.costs !== undefined ? (c.costs?.miss ?? null) : row.miss_cost,
          checkin_days: c.checkin_days !== undefined ? c.checkin_days : row.checkin_days,
          updated_at: now(),
          ordered: row.type === 'choice' && c.ordered !== undefined ? (c.ordered ? 1 : 0) : row.ordered,
          unit: row.type === 'numeric' && c.unit !== undefined ? c.unit : row.unit,
        };
        const stored = qs.typeRows(write, req.id);
        const options = c.options ?? (row.type === 'choice' ? stored.options.map((o) => o.label) : undefined);
        const storedRates = stored.options.map((o) => o.base_rate);
        const rates = c.option_base_rates !== undefined ? c.option_base_rates : storedRates.every((r) => r !== null) ? (storedRates as number[]) : null;
        const problems = issueLines(fixedFieldIssues(row, stored, c), 'changes');
        // Fields of another type are refused as at creation; the options and their base rates must still agree.
        problems.push(...issueLines(questionTypeIssues({ ...c, type: row.type, options, option_base_rates: c.options !== undefined || c.option_base_rates !== undefined ? rates : undefined }), 'changes'));
        if (c.opened_at !== undefined) {
          problems.push(...pastLine(next.opened_at, 'changes.opened_at', 'the opening time (when the question was posed)'));
          // The history must still start at or after the opening: a revision or a resolution before it could not have been made.
          const firstAt = qs.firstForecastAt(write, req.id);
          if (firstAt !== null && firstAt < next.opened_at) {
            problems.push(`changes.opened_at: must not be after the question's first revision (${onClock(firstAt, next.time_zone)}); move or delete that revision first`);
          }
          const resolution = qs.resolutionRow(write, req.id);
          if (resolution && resolution.at < next.opened_at) {
            problems.push(`changes.opened_at: must not be after the question's resolution time (${onClock(resolution.at, next.time_zone)})`);
          }
        }
        if (next.closes_at <= next.opened_at) problems.push(`changes.closes_at: ${v.CLOSES_AFTER_OPENS_RULE}`);
        refuseAll(problems);
        undo = tracked('updateQuestion', req.id, () => {
          qs.updateQuestionRow(write, next);
          if (c.tags) qs.replaceTags(write, req.id, c.tags);
          if (row.type === 'choice' && (c.options !== undefined || c.option_base_rates !== undefined)) {
            qs.replaceOptions(write, req.id, options!.map((label, k) => ({ label, base_rate: rates?.[k] ?? null })));
          }
        });
      });
      return { ...getQuestion(req.id), undo };
    },

    deleteQuestion: (req) => {
      let undo = '';
      transact(() => {
        requireQuestionRow(req.id);
        undo = tracked('deleteQuestion', req.id, () => qs.deleteQuestionRow(write, req.id));
      });
      return { deleted: req.id, undo };
    },

    addForecast: (req) => {
      let undo = '';
      transact(() => {
        const row = requireQuestionRow(req.question_id);
        const stamp = now();
        const at = req.at !== undefined ? ms(req.at) : Math.max(stamp, row.opened_at);
        if (req.at !== undefined) refuseAll([...pastLine(at, 'at', 'a revision'), ...openingLine(at, row.opened_at, row.time_zone, 'at')]);
        undo = tracked('addForecast', row.id, () => {
          qs.insertForecast(write, {
            id: randomUUID(),
            question_id: row.id,
            at,
            ...storedEntry(shapeOfRow(row), req),
            note: req.note ?? '',
            lenses: (req.lenses ?? []) as Lens[],
          });
          // A revision answers any pending check-in, snoozed or not.
          nudgeStore.clearSnoozes(write, row.id, 'checkin');
          qs.touchQuestion(write, row.id, stamp);
        });
      });
      return { ...getQuestion(req.question_id), undo };
    },

    updateForecast: (req) => {
      let questionId = '';
      let undo = '';
      transact(() => {
        const f = qs.forecastRow(write, req.id);
        if (!f) throw notFound('revision', req.id);
        questionId = f.question_id;
        const at = req.at !== undefined ? ms(req.at) : f.at;
        const row = requireQuestionRow(f.question_id);
        const shape = shapeOfRow(row);
        const problems = issueLines(entryIssues(shape, req, false));
        if (req.at !== undefined) problems.push(...pastLine(at, 'at', 'a revision'), ...openingLine(at, row.opened_at, row.time_zone, 'at'));
        refuseAll(problems);
        // A value left out stays as it was.
        const given = req.p !== undefined || req.probs !== undefined || req.quantiles !== undefined;
        const value = given ? storedValuesOf(shape, req) : { p: f.p, values: shape.type === 'binary' ? [] : qs.forecastValues(write, f.id) };
        undo = tracked('updateForecast', questionId, () => {
          qs.updateForecastRow(write, { id: f.id, at, ...value, note: req.note ?? f.note });
          if (req.lenses) qs.replaceLenses(write, f.id, req.lenses as Lens[]);
          qs.touchQuestion(write, f.question_id, now());
        });
      });
      return { ...getQuestion(questionId), undo };
    },

    deleteForecast: (req) => {
      let questionId = '';
      let undo = '';
      transact(() => {
        const f = qs.forecastRow(write, req.id);
        if (!f) throw notFound('revision', req.id);
        questionId = f.question_id;
        undo = tracked('deleteForecast', questionId, () => {
          qs.deleteForecastRow(write, req.id);
          qs.touchQuestion(write, f.question_id, now());
        });
      });
      return { ...getQuestion(questionId), undo };
    },

    addReference: (req) => {
      let undo = '';
      transact(() => {
        const row = requireQuestionRow(req.question_id);
        const at = req.at !== undefined ? ms(req.at) : now();
        const problems = issueLines(entryIssues(shapeOfRow(row), req));
        // An outside view may be older than the question (the client's number from last year): only the future is refused.
        if (req.at !== undefined) problems.push(...pastLine(at, 'at', 'a reference forecast'));
        refuseAll(problems);
        const value = storedValuesOf(shapeOfRow(row), req);
        undo = tracked('addReference', req.question_id, () => {
          qs.insertReference(write, { id: randomUUID(), question_id: req.question_id, at, ...value, source: req.source });
          qs.touchQuestion(write, req.question_id, now());
        });
      });
      return { ...getQuestion(req.question_id), undo };
    },

    deleteReference: (req) => {
      let questionId = '';
      let undo = '';
      transact(() => {
        const r = qs.referenceRow(write, req.id);
        if (!r) throw notFound('reference forecast', req.id);
        questionId = r.question_id;
        undo = tracked('deleteReference', questionId, () => {
          qs.deleteReferenceRow(write, req.id);
          qs.touchQuestion(write, r.question_id, now());
        });
      });
      return { ...getQuestion(questionId), undo };
    },

    resolveQuestion: (req) => {
      let undo = '';
      transact(() => {
        const row = requireQuestionRow(req.id);
        const stamp = now();
        const at = req.at !== undefined ? ms(req.at) : stamp;
        const outcome = req.outcome as AnyOutcome;
        const note = req.note ?? '';
        const current = qs.resolutionRow(write, req.id);
        const shape = shapeOfRow(row);
        const problems = issueLines(resolutionIssues(shape, req));
        if (req.at !== undefined) problems.push(...pastLine(at, 'at', 'a resolution'));
        problems.push(...openingLine(at, row.opened_at, row.time_zone, 'at'));
        if (req.correction_note !== undefined && !current) {
          problems.push('correction_note: is for correcting a resolution, and this question is not resolved yet; leave it out');
        }
        refuseAll(problems);
        if (req.confirm !== true && isEarlyStateResolution(row.kind, outcome, at, row.closes_at)) {
          throw new ApiError('confirm', earlyStateResolutionWarning(row.title, outcome, row.closes_at, row.time_zone), [
            `at: is before the close (${onClock(row.closes_at, row.time_zone)}) of a question about the state at its close; confirm to resolve it anyway`,
          ]);
        }
        undo = tracked('resolveQuestion', req.id, () => {
          // Resolving again with the same outcome, time and note and no reason changes nothing (a second click).
          const { option, value } = storedOutcome(shape, req);
          const same =
            current !== undefined &&
            current.outcome === outcome &&
            current.option === option &&
            current.value === value &&
            current.at === at &&
            current.note === note;
          if (!same || req.correction_note) {
            // A correction keeps the resolution it replaces.
            if (current) qs.archiveResolution(write, req.id, 'corrected', req.correction_note ?? '', stamp);
            qs.upsertResolution(write, { question_id: req.id, outcome, at, note, recorded_at: stamp, option, value });
          }
          nudgeStore.clearSnoozes(write, req.id);
          qs.touchQuestion(write, req.id, stamp);
        });
      });
      return { ...getQuestion(req.id), undo };
    },

    reopenQuestion: (req) => {
      let undo = '';
      transact(() => {
        requireQuestionRow(req.id);
        if (!qs.resolutionRow(write, req.id)) throw invalid('id', 'this question is not resolved, so there is nothing to reopen');
        const stamp = now();
        undo = tracked('reopenQuestion', req.id, () => {
          qs.archiveResolution(write, req.id, 'reopened', req.note ?? '', stamp);
          qs.deleteResolution(write, req.id);
          qs.touchQuestion(write, req.id, stamp);
        });
      });
      return { ...getQuestion(req.id), undo };
    },

    getSettings: () => settings(),

    updateSettings: (req) => {
      transact(() => writeSettings(write, req as Partial<Settings>));
      return settings();
    },

    importDiary: (req) => importParsed(req.diary, { merge: req.merge }),

    exportDiary: () => exportDiary(),

    exportText: (req) => exportText(req.format),

    importText: (req) => importText(req.format, req.text, { merge: req.merge }),

    loadDemo: () => {
      const notEmpty = () =>
        new ApiError(
          'conflict',
          'The example diary can only be loaded into an empty diary, and this one already has questions. Start a new diary file (--db) to explore the example.',
        );
      if (qs.questionCount(read) > 0) throw notEmpty();
      return importParsed(ctx.demo(now()), { onlyIntoEmpty: notEmpty });
    },

    removeDemo: () => {
      // Each example question goes as deleteQuestion takes one, so each comes back with its own undo.
      const undo: string[] = [];
      transact(() => {
        for (const id of exampleIds()) {
          if (qs.questionRow(write, id) === undefined) continue;
          undo.push(tracked('deleteQuestion', id, () => qs.deleteQuestionRow(write, id)));
        }
      });
      return { removed: undo.length, undo };
    },

    due: (req) => {
      const s = settings();
      const at = req.at !== undefined ? ms(req.at) : now();
      const { questions, nudges, snoozed } = dueAt(store, s, at);
      const byId = new Map(questions.map((q) => [q.id, q]));
      const entry = (n: { question_id: string; kind: NudgeKind; due_at: number }) => {
        const q = byId.get(n.question_id)!;
        const last = q.last_p !== null && q.last_forecast_at !== null ? { p: q.last_p, at: q.last_forecast_at } : null;
        return {
          id: q.id,
          title: q.title,
          kind: n.kind,
          due_at: toIso(n.due_at),
          closes_at: toIso(q.closes_at),
          time_zone: q.time_zone,
          type: q.type,
          last_p: last?.p ?? null,
          last_forecast_at: last ? toIso(last.at) : null,
          stale: stale(q, last, s, at),
        };
      };
      return {
        at: toIso(at),
        nudges: nudges.map(entry),
        snoozed: snoozed.map(({ nudge, until }) => ({ ...entry(nudge), until: toIso(until) })),
      };
    },

    dueCount: (req) => {
      const at = req.at !== undefined ? ms(req.at) : now();
      return { at: toIso(at), count: countDueAt(store, settings(), at) };
    },

    snooze: (req) => {
      const t = now();
      const until = req.until !== undefined ? ms(req.until) : snoozeUntil(req.preset!, t, settings().time_zone);
      if (until <= t) throw invalid('until', 'must be in the future');
      // A preset counts on from now, and near the end of 2199 it can land past the range every stored time keeps to.
      if (!isInstantInRange(until)) {
        throw invalid('preset', `would end at ${toIso(until)}, after 2199, the last year Forelog keeps; give an until time before ${toIso(INSTANT_RANGE.end)} instead`);
      }
      let undo = '';
      transact(() => {
        const row = requireQuestionRow(req.question_id);
        if (qs.resolutionRow(write, row.id)) throw invalid('question_id', 'this question is resolved; it has no nudges to snooze');
        undo = tracked('snooze', row.id, () => nudgeStore.upsertSnooze(write, { question_id: row.id, kind: req.kind as NudgeKind, until }));
      });
      return { question_id: req.question_id, kind: req.kind, until: toIso(until), undo };
    },

    unsnooze: (req) => {
      const kind = req.kind as NudgeKind | undefined;
      let kinds: NudgeKind[] = [];
      let undo = '';
      transact(() => {
        const row = requireQuestionRow(req.question_id);
        kinds = nudgeStore.activeSnoozes(write, row.id, now(), kind).map((z) => z.kind);
        if (kinds.length === 0) {
          throw new ApiError(
            'not_found',
            `“${row.title}” has no snooze running${kind ? ` on its ${NUDGE_KIND_NAMES[kind]} nudge` : ''}, so nothing was changed. Reload to see its nudges as they are.`,
          );
        }
        undo = tracked('unsnooze', row.id, () => nudgeStore.clearSnoozes(write, row.id, kind));
      });
      return { question_id: req.question_id, kinds, undo };
    },

    undo: (req) => {
      let entry: undoStore.UndoEntry | undefined;
      transact(() => {
        entry = undoStore.findUndo(write, req.token);
        if (!entry || !undoStore.isUndoFresh(entry.recorded_at, now())) {
          throw new ApiError(
            'not_found',
            `This change can no longer be undone: Forelog keeps the last ${undoStore.UNDO_KEEP_ENTRIES} changes for 7 days, and undoes each once. Nothing was changed.`,
          );
        }
        const id = entry.question_id;
        if (undoStore.snapshotHash(undoStore.snapshotQuestion(write, id)) !== entry.after_hash) {
          const title = qs.questionRow(write, id)?.title ?? undoStore.snapshotTitle(entry.before);
          throw new ApiError(
            'conflict',
            `“${title}” changed since, so nothing was undone: undoing would throw away the later change. Undo the later changes first (newest first), or change it back by hand.`,
          );
        }
        undoStore.restoreQuestion(write, id, entry.before);
        undoStore.removeUndo(write, entry.token);
      });
      const { question_id, operation } = entry!;
      return {
        question_id,
        operation: operation as UndoableOperation,
        question: qs.questionRow(read, question_id) ? getQuestion(question_id) : null,
      };
    },

    score: (req) =>
      remembered(`scorecard|${filterKey(req)}`, () => {
        const questions = scoringInput(req);
        const options = scoreOptions(req);
        const set = scoredSet(req);
        const { per_question: _rows, ...detail } = computeScorecardDetail(questions, options, set);
        const { choice, numeric } = typedScoringInput();
        return {
          report: scoreJson(req),
          detail,
          leads: referenceLeads(set),
          choice_detail: computeChoiceDetail(choice, options),
          numeric_detail: computeNumericDetail(numeric, options),
        };
      }),

    hindsight: (req) => {
      const t = now();
      const offset = req.offset ?? 0;
      const filter = { tag: req.tag, from: req.from, to: req.to };
      const page = confidentCalls(scoredSet(filter), req.threshold, req.include_hits, detailsOf(isBinary, t), { offset, limit: req.limit });
      const choice = choiceHindsight(choiceCalls(filter, req.threshold, req.include_hits), detailsOf(isChoice, t), req.choice_limit);
      const numeric = numericHindsight(surprises(filter), detailsOf(isNumeric, t), req.numeric_limit);
      return {
        threshold: req.threshold,
        offset,
        ...page,
        choice_entries: choice.entries,
        choice_miss_count: choice.misses,
        choice_hit_count: choice.hits,
        numeric_surprises: numeric.entries,
        numeric_surprise_count: numeric.count,
        report: binaryReport(filter),
        brier_interval: brierIntervalOf(scoredSet(filter)),
      };
    },

    briefing: (req) => {
      const s = settings();
      const filter = { tag: req.tag };
      const options = scoreOptions(filter);
      const t = now();
      // From the scoring input a running app has read ahead; only the calls shown and the
      // open questions are loaded in full (at 100,000 questions, loading every question took
      // a minute and gigabytes).
      const scoring = scoringInput({});
      const html = renderBriefing({
        tag: req.tag ?? null,
        generated_at: now(),
        time_zone: s.time_zone,
        report: binaryReport(filter),
        scored: { detail: computeScorecardDetail(scoring, options, scoredSet(filter)), questions: scoring },
        details: detailsOf(isBinary, t),
        open: qs.loadBundles(read, qs.openQuestionIds(read, req.tag)).map((b) => qs.toQuestion(b, t)),
        threshold: req.threshold,
        choice_misses: choiceHindsight(choiceCalls(filter, req.threshold, false), detailsOf(isChoice, t)).entries,
        numeric_surprises: numericHindsight(surprises(filter), detailsOf(isNumeric, t)).entries,
      });
      return { html, title: briefingTitle(req.tag ?? null) };
    },
  };

  return {
    handlers,
    settings,
    getQuestion,
    exportDiary,
    exportText,
    exportTo,
    exportFile,
    importText,
    importFile,
    scoreReport: scoreJson,
    warmScoringInput,
  };
}

export type Diary = ReturnType<typeof createDiary>;
