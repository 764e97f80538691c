/**
 * The diary's operations: the only code that writes the store. Requests arrive already
 * validated against the contract (see dispatch.ts); the checks here are the ones that
 * need the diary's state (does the question exist, is the close still after the opening).
 */
import { randomUUID } from 'node:crypto';
import type { ExportedText, Handlers, QuestionList, ValidRequest } from '../../shared/contract';
import type { EXPORT_FORMATS, IMPORT_FORMATS } from '../../shared/contract';
import { ApiError } from '../../shared/contract';
import { parseDiaryFile, toDiaryFile, DiaryFileError, type FileQuestion } from '../../shared/diary-file';
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
import { CsvError, csvToDiary, diaryToCsv } from './csv';
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

export function createDiary(ctx: DiaryContext) {
  const { store, now } = ctx;
  const { read, write } = store;

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
    const firstAt = q.forecasts.length ? Math.min(...q.forecasts.map((f) => ms(f.at))) : null;
    const closes = ms(q.closes_at);
    const opened = q.opened_at !== undefined ? ms(q.opened_at) : Math.min(firstAt ?? stamp, closes - 1);
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
        id: randomUUID(),
        question_id: id,
        at: ms(f.at),
        p: f.p,
        note: f.note ?? '',
        lenses: (f.lenses ?? []) as Lens[],
      });
    }
    for (const r of q.references ?? []) {
      qs.insertReference(write, { id: randomUUID(), question_id: id, at: ms(r.at), p: r.p, source: r.source });
    }
    if (q.resolution) {
      qs.upsertResolution(write, {
        question_id: id,
        outcome: q.resolution.outcome as Outcome,
        at: ms(q.resolution.at),
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

  function importParsed(raw: unknown): { added: number } {
    let parsed;
    try {
      parsed = parseDiaryFile(raw);
    } catch (err) {
      if (err instanceof DiaryFileError) throw new ApiError('invalid', err.message, err.field ? [`${err.field}: ${err.message}`] : []);
      throw err;
    }
    const stamp = now();
    write.transaction(() => {
      const empty = qs.questionCount(write) === 0;
      // The file's settings come along only into an empty diary: importing a colleague's
      // file into a working diary must not change its defaults.
      if (empty && parsed.settings) {
        const { default_false_alarm_cost, default_miss_cost, default_checkin_days, closing_soon_hours, overdue_after_days, time_zone, quiet_hours } =
          parsed.settings;
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
      const s = readSettings(write, ctx.systemTimeZone);
      parsed.questions.forEach((q, index) => {
        if (q.id !== undefined && qs.questionRow(write, q.id)) {
          throw new ApiError(
            'conflict',
            `Question record ${index} is not valid: field id: "${q.id}" is already in this diary (was this file imported before?). Nothing was imported.`,
            [`questions[${index}].id: already in this diary`],
          );
        }
        try {
          insertWhole(q, s, stamp);
        } catch (err) {
          if (err instanceof ApiError) {
            throw new ApiError(err.code, `Question record ${index} is not valid: ${err.fields[0] ?? err.message}. Nothing was imported.`, err.fields);
          }
          throw err;
        }
      });
    })();
    return { added: parsed.questions.length };
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

  function exportText(format: ExportFormat): ExportedText {
    const day = toIso(now()).slice(0, 10);
    if (format === 'csv') return { text: diaryToCsv(exportDiary()), file_name: `forelog-diary-${day}.csv`, media_type: 'text/csv' };
    if (format === 'ics') {
      const text = toICalendar(unresolvedQuestions(store), { now: now(), alarmHours: settings().closing_soon_hours });
      return { text, file_name: `forelog-closes-${day}.ics`, media_type: 'text/calendar' };
    }
    return { text: `${JSON.stringify(exportDiary(), null, 2)}\n`, file_name: `forelog-diary-${day}.json`, media_type: 'application/json' };
  }

  function importText(format: ImportFormat, text: string): { added: number } {
    if (format === 'csv') {
      let diary: unknown;
      try {
        diary = csvToDiary(text);
      } catch (err) {
        if (err instanceof CsvError) throw new ApiError('invalid', err.message, err.column ? [`${err.column}: ${err.message}`] : []);
        throw err;
      }
      return importParsed(diary);
    }
    let parsed: unknown;
    try {
      parsed = JSON.parse(text);
    } catch (err) {
      throw new ApiError('invalid', `The file is not valid JSON (${(err as Error).message}); nothing was imported. Is it a Forelog diary file?`);
    }
    return importParsed(parsed);
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
      write.transaction(() => {
        id = insertWhole(
          {
            ...req,
            opened_at: toIso(opened),
            forecasts: req.first_forecast
              ? [{ at: req.first_forecast.at ?? toIso(Math.max(stamp, opened)), p: req.first_forecast.p, note: req.first_forecast.note, lenses: req.first_forecast.lenses }]
              : [],
          } as FileQuestion,
          s,
          stamp,
        );
      })();
      return getQuestion(id);
    },

    updateQuestion: (req) => {
      write.transaction(() => {
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
      })();
      return getQuestion(req.id);
    },

    deleteQuestion: (req) => {
      write.transaction(() => {
        if (!qs.deleteQuestionRow(write, req.id)) throw notFound('question', req.id);
      })();
      return { deleted: req.id };
    },

    addForecast: (req) => {
      write.transaction(() => {
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
      })();
      return getQuestion(req.question_id);
    },

    updateForecast: (req) => {
      let questionId = '';
      write.transaction(() => {
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
      })();
      return getQuestion(questionId);
    },

    deleteForecast: (req) => {
      let questionId = '';
      write.transaction(() => {
        const f = qs.forecastRow(write, req.id);
        if (!f) throw notFound('revision', req.id);
        questionId = f.question_id;
        qs.deleteForecastRow(write, req.id);
        qs.touchQuestion(write, f.question_id, now());
      })();
      return getQuestion(questionId);
    },

    addReference: (req) => {
      write.transaction(() => {
        requireQuestionRow(req.question_id);
        qs.insertReference(write, {
          id: randomUUID(),
          question_id: req.question_id,
          at: req.at !== undefined ? ms(req.at) : now(),
          p: req.p,
          source: req.source,
        });
        qs.touchQuestion(write, req.question_id, now());
      })();
      return getQuestion(req.question_id);
    },

    deleteReference: (req) => {
      let questionId = '';
      write.transaction(() => {
        const r = qs.referenceRow(write, req.id);
        if (!r) throw notFound('reference forecast', req.id);
        questionId = r.question_id;
        qs.deleteReferenceRow(write, req.id);
        qs.touchQuestion(write, r.question_id, now());
      })();
      return getQuestion(questionId);
    },

    resolveQuestion: (req) => {
      write.transaction(() => {
        const row = requireQuestionRow(req.id);
        const stamp = now();
        const at = req.at !== undefined ? ms(req.at) : stamp;
        if (at < row.opened_at) throw invalid('at', 'must not be before the question opened');
        qs.upsertResolution(write, { question_id: req.id, outcome: req.outcome as Outcome, at, note: req.note ?? '', recorded_at: stamp });
        nudgeStore.clearSnoozes(write, req.id);
        qs.touchQuestion(write, req.id, stamp);
      })();
      return getQuestion(req.id);
    },

    reopenQuestion: (req) => {
      write.transaction(() => {
        requireQuestionRow(req.id);
        qs.deleteResolution(write, req.id);
        qs.touchQuestion(write, req.id, now());
      })();
      return getQuestion(req.id);
    },

    getSettings: () => settings(),

    updateSettings: (req) => {
      write.transaction(() => writeSettings(write, req as Partial<Settings>))();
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
      write.transaction(() => {
        const row = requireQuestionRow(req.question_id);
        if (qs.loadBundles(write, [row.id])[0]?.resolution) throw invalid('question_id', 'this question is resolved; it has no nudges to snooze');
        nudgeStore.upsertSnooze(write, { question_id: req.question_id, kind: req.kind as nudgeStore.StoredNudgeKind, until });
      })();
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

  return { handlers, settings, getQuestion, exportDiary, exportText, importText, scoreReport: (req: ValidRequest<'score'>) => computeScoreReport(scoringInput(req), scoreOptions(req)) };
}

export type Diary = ReturnType<typeof createDiary>;
