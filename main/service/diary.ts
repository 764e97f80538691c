/**
 * The diary's operations: the only code that writes the store. Requests arrive already
 * validated against the contract (see dispatch.ts); the checks here are the ones that
 * need the diary's state (does the question exist, is the close still after the opening).
 */
import { randomUUID } from 'node:crypto';
import type { ExportedText, Handlers, QuestionList, ValidRequest } from '../../shared/contract';
import type { EXPORT_FORMATS, IMPORT_FORMATS } from '../../shared/contract';
import { ApiError } from '../../shared/contract';
import { diaryFileText, diaryItems, readDiaryText, toDiaryFile, DiaryFileError, type DiaryItem, type FileQuestion, type FileSettings } from '../../shared/diary-file';
import {
  questionStatus,
  type Lens,
  type Outcome,
  type Question,
  type QuestionKind,
  type QuestionSummary,
  type Settings,
} from '../../shared/domain';
import { computeScoreReport, computeScorecardDetail, isStale, type ScoreOptions, type ScoringQuestion } from '../../shared/scoring';
import { parseInstant, parseRangeBound, toIso } from '../../shared/time';
import type { StoreHandles } from '../store/open';
import * as nudgeStore from '../store/nudges';
import * as qs from '../store/questions';
import { readSettings, writeSettings } from '../store/settings';
import { confidentCalls, referenceLeads } from './hindsight';
import { toICalendar } from './calendar';
import { TextDecodingError } from '../../shared/text-decoding';
import { writeFileAtomic } from '../files/atomic-write';
import { readTextFile } from '../files/read-text';
import { CsvError, diaryCsvText, readCsvDiary, type CsvItem } from './csv';
import { exportBatches } from './export-batches';
import { orderedId } from './ordered-ids';
import { countDueAt, dueAt, snoozeUntil, unresolvedQuestions } from './nudges';
import { briefingTitle, renderBriefing } from './briefing';
import { loadScoringQuestions } from './scoring-source';

export interface DiaryContext {
  store: StoreHandles;
  now: () => number;
  systemTimeZone: string;
  /** Builds the example diary for an empty diary (injected so the service stays small). */
  demo: (now: number) => unknown;
}

const ms = (iso: string): number => parseInstant(iso)!;

function notFound(what: string, id: string): ApiError {
  return new ApiError('not_found', `No ${what} with id "${id}" in this diary. It may have been deleted; reload and try again.`);
}

function invalid(field: string, reason: string): ApiError {
  return new ApiError('invalid', `The request was not accepted: ${field}: ${reason}. Nothing was changed.`, [`${field}: ${reason}`]);
}

type ExportFormat = (typeof EXPORT_FORMATS)[number];
type ImportFormat = (typeof IMPORT_FORMATS)[number];

/** What an import reads, in file order: from a JSON diary file (or object) or from CSV. */
type ImportItem = DiaryItem | CsvItem;

/** Questions per batch when an export reads the diary: a few megabytes of text at a time. */
const EXPORT_BATCH = 500;

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
  if (err instanceof DiaryFileError) return new ApiError('invalid', err.message, err.field ? [`${err.field}: ${err.message}`] : []);
  if (err instanceof CsvError) return new ApiError('invalid', err.message, err.column ? [`${err.column}: ${err.message}`] : []);
  if (err instanceof TextDecodingError) return new ApiError('invalid', `${err.message} Nothing was imported.`);
  return err;
}

/** better-sqlite3's error for a row whose primary key is taken: here, a question id already in the diary. */
function isTakenQuestionId(err: unknown): boolean {
  return (err as { code?: string }).code === 'SQLITE_CONSTRAINT_PRIMARYKEY' && /\bquestions\.id\b/.test((err as Error).message);
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
    return qs.toQuestion(bundle);
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

  function requireQuestionRow(id: string): qs.QuestionRow {
    const row = qs.questionRow(write, id);
    if (!row) throw notFound('question', id);
    return row;
  }

  /** Inserts one question with its history; the caller holds the transaction. */
  function insertWhole(q: FileQuestion, s: Settings, stamp: number): string {
    const id = q.id ?? randomUUID();
    let firstAt: number | null = null;
    for (const f of q.forecasts) if (firstAt === null || f.at < firstAt) firstAt = f.at;
    const closes = q.closes_at;
    const opened = q.opened_at ?? defaultOpenedAt(firstAt, stamp, closes);
    if (closes <= opened) throw invalid('closes_at', 'must be after the opening time (opened_at)');
    qs.insertQuestion(
      write,
      {
        id,
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
    );
    for (const f of q.forecasts) {
      qs.insertForecast(write, {
        id: orderedId(),
        question_id: id,
        at: f.at,
        p: f.p,
        note: f.note ?? '',
        lenses: (f.lenses ?? []) as Lens[],
      });
    }
    for (const r of q.references ?? []) {
      qs.insertReference(write, { id: orderedId(), question_id: id, at: r.at, p: r.p, source: r.source });
    }
    if (q.resolution) {
      qs.upsertResolution(write, {
        question_id: id,
        outcome: q.resolution.outcome as Outcome,
        at: q.resolution.at,
        note: q.resolution.note ?? '',
        recorded_at: stamp,
      });
    }
    return id;
  }

  function listQuestions(req: ValidRequest<'listQuestions'>): QuestionList {
    const t = now();
    const s = settings();
    const where: string[] = [];
    const args: unknown[] = [];
    if (req.tag) {
      where.push('q.id IN (SELECT question_id FROM question_tags WHERE tag = ?)');
      args.push(req.tag);
    }
    const text = req.text?.trim();
    if (text) {
      // Search title, rule, tags and the notes written with revisions; LIKE's own wildcards
      // in the text are taken literally.
      const like = `%${text.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      where.push(
        `(lower(q.title) LIKE ? ESCAPE '\\' OR lower(q.rule) LIKE ? ESCAPE '\\'
          OR q.id IN (SELECT question_id FROM question_tags WHERE tag LIKE ? ESCAPE '\\')
          OR q.id IN (SELECT question_id FROM forecasts WHERE lower(note) LIKE ? ESCAPE '\\'))`,
      );
      args.push(like, like, like, like);
    }
    const rows = read
      .prepare(
        `SELECT q.id, q.title, q.kind, q.opened_at, q.closes_at, q.time_zone, q.base_rate, q.checkin_days, r.outcome,
           (SELECT json_group_array(tag) FROM (SELECT tag FROM question_tags WHERE question_id = q.id ORDER BY position)) AS tags,
           (SELECT p FROM forecasts f WHERE f.question_id = q.id ORDER BY f.at DESC, f.seq DESC LIMIT 1) AS last_p,
           (SELECT at FROM forecasts f WHERE f.question_id = q.id ORDER BY f.at DESC, f.seq DESC LIMIT 1) AS last_at,
           (SELECT count(*) FROM forecasts f WHERE f.question_id = q.id) AS forecast_count
         FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id
         ${where.length ? `WHERE ${where.join(' AND ')}` : ''}
         ORDER BY q.closes_at, q.title`,
      )
      .all(...args) as {
      id: string;
      title: string;
      kind: QuestionKind;
      opened_at: number;
      closes_at: number;
      time_zone: string;
      base_rate: number | null;
      checkin_days: number | null;
      outcome: Outcome | null;
      tags: string;
      last_p: number | null;
      last_at: number | null;
      forecast_count: number;
    }[];
    const questions: QuestionSummary[] = [];
    for (const r of rows) {
      const status = questionStatus(r.closes_at, r.outcome, t, s.closing_soon_hours);
      if (req.status && req.status !== status) continue;
      questions.push({
        id: r.id,
        title: r.title,
        kind: r.kind,
        tags: JSON.parse(r.tags) as string[],
        opened_at: toIso(r.opened_at),
        closes_at: toIso(r.closes_at),
        time_zone: r.time_zone,
        base_rate: r.base_rate,
        last_p: r.last_p,
        last_forecast_at: r.last_at === null ? null : toIso(r.last_at),
        forecast_count: r.forecast_count,
        status,
        outcome: r.outcome,
        stale: !r.outcome && stale(r, r.last_p !== null && r.last_at !== null ? { p: r.last_p, at: r.last_at } : null, s, t),
      });
    }
    return { questions, tags: qs.allTagCounts(read), total: qs.questionCount(read) };
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
  function recordError(item: { index: number; row?: number }, code: ApiError['code'], column: string, reason: string): ApiError {
    if (item.row !== undefined) {
      return new ApiError(code, `Row ${item.row}, column ${column}: ${reason}. Nothing was imported.`, [`${column}: ${reason}`]);
    }
    return new ApiError(code, `Question record ${item.index} is not valid: field ${column}: ${reason}. Nothing was imported.`, [`questions[${item.index}].${column}: ${reason}`]);
  }

  /**
   * Adds what a file holds, read as it streams, inside ONE immediate write transaction: the
   * first bad record rolls back everything, so the diary is left exactly as it was. Each
   * record costs the same however large the diary: no query per record grows with it (an
   * id already in the diary is found by the insert's own primary-key check).
   */
  function importItems(items: Iterable<ImportItem>): { added: number } {
    const stamp = now();
    let added = 0;
    const run = () => transact(() => {
      // The file's settings come along only into an empty diary: importing a colleague's
      // file into a working diary must not change its defaults.
      const empty = qs.questionCount(write) === 0;
      let s = readSettings(write, ctx.systemTimeZone);
      let settingsRead = false;
      // Questions that took the diary's zone before the file's settings (which may come after
      // the questions) named another one.
      const zoneDefaulted: string[] = [];
      // CSV only: each question's id and what its default opening time depends on, by index.
      const csvQuestions: { id: string; closes: number; firstAt: number | null; openedGiven: boolean }[] = [];
      const setOpenedAt = write.prepare('UPDATE questions SET opened_at = ? WHERE id = ?');
      for (const item of items) {
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
          let id: string;
          try {
            id = insertWhole(q, s, stamp);
          } catch (err) {
            if (isTakenQuestionId(err)) {
              throw recordError(item, 'conflict', 'row' in item ? 'question_id' : 'id', `"${q.id}" is already in this diary (was this file imported before?)`);
            }
            if (err instanceof ApiError) {
              throw new ApiError(err.code, `Question record ${item.index} is not valid: ${err.fields[0] ?? err.message}. Nothing was imported.`, err.fields);
            }
            throw err;
          }
          added++;
          if (empty && !settingsRead && q.time_zone === undefined) zoneDefaulted.push(detached(id));
          if ('row' in item) {
            const firstAt = q.forecasts[0]?.at ?? null;
            csvQuestions[item.index] = { id: detached(id), closes: q.closes_at, firstAt, openedGiven: q.opened_at !== undefined };
          }
        } else {
          // A later CSV row of a question already inserted: its revision or reference forecast.
          const target = csvQuestions[item.index]!;
          if (item.forecast) {
            const f = item.forecast;
            qs.insertForecast(write, { id: orderedId(), question_id: target.id, at: f.at, p: f.p, note: f.note ?? '', lenses: (f.lenses ?? []) as Lens[] });
            if (!target.openedGiven && (target.firstAt === null || f.at < target.firstAt)) {
              target.firstAt = f.at;
              setOpenedAt.run(defaultOpenedAt(f.at, stamp, target.closes), target.id);
            }
          }
          if (item.reference) {
            const r = item.reference;
            qs.insertReference(write, { id: orderedId(), question_id: target.id, at: r.at, p: r.p, source: r.source });
          }
        }
      }
    });
    const cache = write.pragma('cache_size', { simple: true }) as number;
    write.pragma(`cache_size = ${-IMPORT_CACHE_KIB}`);
    try {
      run();
    } catch (err) {
      throw asImportError(err);
    } finally {
      write.pragma(`cache_size = ${cache}`);
    }
    return { added };
  }

  /** A diary file already in memory (the API's importDiary, the example diary). */
  function importParsed(raw: unknown): { added: number } {
    return importItems(diaryItems(raw));
  }

  function readerFor(format: ImportFormat, chunks: Iterable<string>): Iterable<ImportItem> {
    return format === 'csv' ? readCsvDiary(chunks) : readDiaryText(chunks);
  }

  /**
   * Imports a file from disk, streaming: any size, in the memory of one record. The
   * command line and the desktop app's File menu come this way.
   */
  function importFile(file: string, format: ImportFormat): { added: number } {
    return importItems(readerFor(format, readTextFile(file)));
  }

  /**
   * The export's text, piece by piece, read in one snapshot of the diary: a read
   * transaction is open from the first piece to the last, so a change committed meanwhile
   * (by another connection or process) is either wholly in the file or not at all. Private,
   * and consumed synchronously (by exportTo and writeFileAtomic): nothing else may use the
   * read handle while the snapshot is open.
   */
  function* exportPieces(format: ExportFormat): Generator<string> {
    if (format === 'ics') {
      yield toICalendar(unresolvedQuestions(store), { now: now(), alarmHours: settings().closing_soon_hours });
      return;
    }
    read.exec('BEGIN');
    try {
      const batches = exportBatches(read, EXPORT_BATCH);
      yield* format === 'csv' ? diaryCsvText(batches) : diaryFileText(settings(), batches);
    } finally {
      read.exec('COMMIT');
    }
  }

  function exportDiary(): Record<string, unknown> {
    const questions = qs.loadBundles(read).map(qs.toQuestion);
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
  let scoringCache: { version: number; questions: ScoringQuestion[] } | null = null;

  /** The questions as the engine sees them; "what if" costs replace each question's own. */
  function scoringInput(req: { costs?: { false_alarm: number; miss: number } }): ScoringQuestion[] {
    const version = read.pragma('data_version', { simple: true }) as number;
    if (scoringCache?.version !== version) scoringCache = { version, questions: loadScoringQuestions(read) };
    const { questions } = scoringCache;
    const costs = req.costs;
    return costs ? questions.map((q) => ({ ...q, costs: { false_alarm: costs.false_alarm, miss: costs.miss } })) : questions;
  }

  const EXPORT_FILES: Record<ExportFormat, { name: string; extension: string; media_type: string }> = {
    json: { name: 'forelog-diary', extension: 'json', media_type: 'application/json' },
    csv: { name: 'forelog-diary', extension: 'csv', media_type: 'text/csv' },
    ics: { name: 'forelog-closes', extension: 'ics', media_type: 'text/calendar' },
  };

  /** Hands the export to `sink` piece by piece (a few megabytes each), synchronously, from one snapshot. */
  function exportTo(format: ExportFormat, sink: (piece: string) => void): void {
    for (const piece of exportPieces(format)) sink(piece);
  }

  /** The export as one text, for the API (browser mode, the app's Settings): the same writer as the files. */
  function exportText(format: ExportFormat): ExportedText {
    const day = toIso(now()).slice(0, 10);
    const { name, extension, media_type } = EXPORT_FILES[format];
    const pieces: string[] = [];
    exportTo(format, (piece) => pieces.push(piece));
    return { text: pieces.join(''), file_name: `${name}-${day}.${extension}`, media_type };
  }

  /** Writes the export to `file`, whole or not at all (main/files/atomic-write.ts). */
  function exportFile(file: string, format: ExportFormat): void {
    writeFileAtomic(file, exportPieces(format));
  }

  /** A file's text from the API (already decoded by the caller; a byte order mark it kept is dropped). */
  function importText(format: ImportFormat, text: string): { added: number } {
    return importItems(readerFor(format, [text.charCodeAt(0) === 0xfeff ? text.slice(1) : text]));
  }

  const handlers: Handlers = {
    diaryInfo: () => ({ question_count: qs.questionCount(read), location: store.path, time_zone: settings().time_zone }),

    listQuestions,

    getQuestion: (req) => getQuestion(req.id),

    listTags: () => ({ tags: qs.allTagCounts(read) }),

    createQuestion: (req) => {
      const stamp = now();
      const s = settings();
      const opened = req.opened_at !== undefined ? ms(req.opened_at) : stamp;
      if (ms(req.closes_at) <= opened) {
        throw invalid('closes_at', req.opened_at === undefined ? 'must be in the future (after now, when the question opens)' : 'must be after the opening time (opened_at)');
      }
      let id = '';
      transact(() => {
        const { first_forecast: first, ...fields } = req;
        id = insertWhole(
          {
            ...fields,
            opened_at: opened,
            closes_at: ms(req.closes_at),
            forecasts: first ? [{ at: first.at !== undefined ? ms(first.at) : Math.max(stamp, opened), p: first.p, note: first.note, lenses: first.lenses }] : [],
          },
          s,
          stamp,
        );
      });
      return getQuestion(id);
    },

    updateQuestion: (req) => {
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
        };
        if (next.closes_at <= next.opened_at) throw invalid('changes.closes_at', 'must be after the opening time (opened_at)');
        qs.updateQuestionRow(write, next);
        if (c.tags) qs.replaceTags(write, req.id, c.tags);
      });
      return getQuestion(req.id);
    },

    deleteQuestion: (req) => {
      transact(() => {
        if (!qs.deleteQuestionRow(write, req.id)) throw notFound('question', req.id);
      });
      return { deleted: req.id };
    },

    addForecast: (req) => {
      transact(() => {
        requireQuestionRow(req.question_id);
        const stamp = now();
        qs.insertForecast(write, {
          id: randomUUID(),
          question_id: req.question_id,
          at: req.at !== undefined ? ms(req.at) : stamp,
          p: req.p,
          note: req.note ?? '',
          lenses: (req.lenses ?? []) as Lens[],
        });
        // A revision answers any pending check-in, snoozed or not.
        nudgeStore.clearSnoozes(write, req.question_id, 'checkin');
        qs.touchQuestion(write, req.question_id, stamp);
      });
      return getQuestion(req.question_id);
    },

    updateForecast: (req) => {
      let questionId = '';
      transact(() => {
        const f = qs.forecastRow(write, req.id);
        if (!f) throw notFound('revision', req.id);
        questionId = f.question_id;
        qs.updateForecastRow(write, {
          id: f.id,
          at: req.at !== undefined ? ms(req.at) : f.at,
          p: req.p ?? f.p,
          note: req.note ?? f.note,
        });
        if (req.lenses) qs.replaceLenses(write, f.id, req.lenses as Lens[]);
        qs.touchQuestion(write, f.question_id, now());
      });
      return getQuestion(questionId);
    },

    deleteForecast: (req) => {
      let questionId = '';
      transact(() => {
        const f = qs.forecastRow(write, req.id);
        if (!f) throw notFound('revision', req.id);
        questionId = f.question_id;
        qs.deleteForecastRow(write, req.id);
        qs.touchQuestion(write, f.question_id, now());
      });
      return getQuestion(questionId);
    },

    addReference: (req) => {
      transact(() => {
        requireQuestionRow(req.question_id);
        qs.insertReference(write, {
          id: randomUUID(),
          question_id: req.question_id,
          at: req.at !== undefined ? ms(req.at) : now(),
          p: req.p,
          source: req.source,
        });
        qs.touchQuestion(write, req.question_id, now());
      });
      return getQuestion(req.question_id);
    },

    deleteReference: (req) => {
      let questionId = '';
      transact(() => {
        const r = qs.referenceRow(write, req.id);
        if (!r) throw notFound('reference forecast', req.id);
        questionId = r.question_id;
        qs.deleteReferenceRow(write, req.id);
        qs.touchQuestion(write, r.question_id, now());
      });
      return getQuestion(questionId);
    },

    resolveQuestion: (req) => {
      transact(() => {
        const row = requireQuestionRow(req.id);
        const stamp = now();
        const at = req.at !== undefined ? ms(req.at) : stamp;
        if (at < row.opened_at) throw invalid('at', 'must not be before the question opened');
        qs.upsertResolution(write, { question_id: req.id, outcome: req.outcome as Outcome, at, note: req.note ?? '', recorded_at: stamp });
        nudgeStore.clearSnoozes(write, req.id);
        qs.touchQuestion(write, req.id, stamp);
      });
      return getQuestion(req.id);
    },

    reopenQuestion: (req) => {
      transact(() => {
        requireQuestionRow(req.id);
        qs.deleteResolution(write, req.id);
        qs.touchQuestion(write, req.id, now());
      });
      return getQuestion(req.id);
    },

    getSettings: () => settings(),

    updateSettings: (req) => {
      transact(() => writeSettings(write, req as Partial<Settings>));
      return settings();
    },

    importDiary: (req) => importParsed(req.diary),

    exportDiary: () => exportDiary(),

    exportText: (req) => exportText(req.format),

    importText: (req) => importText(req.format, req.text),

    loadDemo: () => {
      if (qs.questionCount(read) > 0) {
        throw new ApiError(
          'conflict',
          'The example diary can only be loaded into an empty diary, and this one already has questions. Start a new diary file (--db) to explore the example.',
        );
      }
      return importParsed(ctx.demo(now()));
    },

    due: (req) => {
      const s = settings();
      const at = req.at !== undefined ? ms(req.at) : now();
      const { questions, nudges } = dueAt(store, s, at);
      const byId = new Map(questions.map((q) => [q.id, q]));
      return {
        at: toIso(at),
        nudges: nudges.map((n) => {
          const q = byId.get(n.question_id)!;
          const last = q.last_p !== null && q.last_forecast_at !== null ? { p: q.last_p, at: q.last_forecast_at } : null;
          return {
            id: q.id,
            title: q.title,
            kind: n.kind,
            due_at: toIso(n.due_at),
            closes_at: toIso(q.closes_at),
            time_zone: q.time_zone,
            last_p: last?.p ?? null,
            last_forecast_at: last ? toIso(last.at) : null,
            stale: stale(q, last, s, at),
          };
        }),
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
      transact(() => {
        const row = requireQuestionRow(req.question_id);
        if (qs.loadBundles(write, [row.id])[0]?.resolution) throw invalid('question_id', 'this question is resolved; it has no nudges to snooze');
        nudgeStore.upsertSnooze(write, { question_id: req.question_id, kind: req.kind as nudgeStore.StoredNudgeKind, until });
      });
      return { question_id: req.question_id, kind: req.kind, until: toIso(until) };
    },

    score: (req) => {
      const questions = scoringInput(req);
      const options = scoreOptions(req);
      const { per_question: _rows, ...detail } = computeScorecardDetail(questions, options);
      return { report: computeScoreReport(questions, options), detail, leads: referenceLeads(questions, options) };
    },

    hindsight: (req) => {
      const questions = scoringInput({});
      const options = scoreOptions(req);
      const details = (ids: string[]) => qs.loadBundles(read, ids).map(qs.toQuestion);
      return {
        threshold: req.threshold,
        entries: confidentCalls(questions, options, req.threshold, req.include_hits, details),
        report: computeScoreReport(questions, options),
      };
    },

    briefing: (req) => {
      const s = settings();
      const questions = scoringInput({});
      const options = scoreOptions({ tag: req.tag });
      const all = qs.loadBundles(read).map(qs.toQuestion);
      const html = renderBriefing({
        tag: req.tag ?? null,
        generated_at: now(),
        time_zone: s.time_zone,
        report: computeScoreReport(questions, options),
        questions: req.tag ? all.filter((q) => q.tags.includes(req.tag!)) : all,
        threshold: req.threshold,
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
    scoreReport: (req: ValidRequest<'score'>) => computeScoreReport(scoringInput(req), scoreOptions(req)),
  };
}

export type Diary = ReturnType<typeof createDiary>;
