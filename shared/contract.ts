/**
 * The API contract: every operation the renderer (or a script) can ask of the diary,
 * with the runtime schema of its request and the type of its response. Both transports
 * (Electron IPC and browser-mode HTTP) and the command line validate requests against
 * these schemas before the service runs, so a bad request changes nothing.
 */
import { z } from 'zod';
import type { DueNudge, NudgeKind, Question, QuestionSummary, Settings, SnoozedNudge } from './domain';
import { ANY_OUTCOMES, NUDGE_KINDS, QUESTION_STATUSES } from './domain';
import type { ChoiceHindsightEntry, NumericHindsightEntry } from './hindsight-entries';
import { entryIssues, questionTypeIssues, resolutionPairingIssues, shapeOf } from './question-types';
import type { ChoiceDetail, ChoiceReport, NumericDetail, NumericReport, ScorecardDetail, ScoreReport } from './scoring/types';
import * as v from './validation';
import { CONFIDENT_THRESHOLD } from './scoring/confidence';
import { groupedDigits } from './grouped-digits';

const id = v.id('must be an id');

/**
 * A forecast's value: `p` for a yes/no question, `probs` (one probability per option,
 * summing to 100 % within 1e-6) for a choice question, `quantiles` (one value per level,
 * non-decreasing; dates as YYYY-MM-DD) for a numeric question. Lenses: yes/no only.
 */
const forecastValue = v.entryValue;

const firstForecast = z.object({
  ...forecastValue,
  note: v.note.optional(),
  at: v.instant.optional(),
  lenses: v.lenses.optional(),
});

const { questionFields, typeFields } = v;

export const createQuestionRequest = z
  .object({ ...questionFields, ...typeFields, first_forecast: firstForecast.optional() })
  .refine(...v.closesAfterOpens)
  .superRefine((r, ctx) => {
    const issues = questionTypeIssues(r);
    v.addIssues(ctx, issues);
    if (issues.length === 0 && r.first_forecast) v.addIssues(ctx, entryIssues(shapeOf(r), r.first_forecast), ['first_forecast']);
  });

/**
 * Changes to a question. Its type, a numeric question's `value_kind` and `levels` and the
 * number of a choice question's options are fixed at creation (the revisions depend on
 * them): giving them unchanged is fine, changing them is refused by the service with a
 * message naming the field. Options may be relabelled.
 */
export const updateQuestionRequest = z.object({
  id,
  changes: z
    .object({
      title: questionFields.title.optional(),
      rule: questionFields.rule,
      kind: questionFields.kind,
      tags: questionFields.tags,
      opened_at: questionFields.opened_at,
      closes_at: questionFields.closes_at.optional(),
      time_zone: questionFields.time_zone,
      base_rate: questionFields.base_rate,
      base_rate_note: questionFields.base_rate_note,
      costs: questionFields.costs,
      checkin_days: questionFields.checkin_days,
      ...typeFields,
    })
    .strict(),
});

/** A new revision: the value its question's type takes (see `forecastValue`); the service checks it against the question. */
export const forecastRequest = z.object({
  question_id: id,
  ...forecastValue,
  note: v.note.optional(),
  at: v.instant.optional(),
  lenses: v.lenses.optional(),
});

export const updateForecastRequest = z.object({
  id,
  ...forecastValue,
  note: v.note.optional(),
  at: v.instant.optional(),
  lenses: v.lenses.optional(),
});

export const referenceRequest = z.object({
  question_id: id,
  ...forecastValue,
  source: v.source,
  at: v.instant.optional(),
});

const confirmed = z.boolean({ error: 'must be true or false' });

/**
 * Resolving a resolved question again is a correction: the resolution it replaces is kept
 * in the question's `resolution_history`, with `correction_note` as the reason.
 */
export const resolveRequest = z
  .object({
    id,
    /** yes, no or void (yes/no questions); option or void (choice); value or void (numeric). */
    outcome: z.enum(ANY_OUTCOMES as [string, ...string[]], { error: 'must be yes, no, void, option or value' }),
    /** With outcome option: the 0-based index of the option that came true. */
    option: v.optionIndex.optional(),
    /** With outcome value: the value the question took (a number, or a date YYYY-MM-DD). */
    value: v.numericValue.optional(),
    at: v.instant.optional(),
    note: v.note.optional(),
    /** Why the earlier resolution was wrong; only when correcting. */
    correction_note: v.note.optional(),
    /**
     * The user saw the warning (error code `confirm`) and means it: a question about the
     * state at its close resolved before that close.
     */
    confirm: confirmed.optional(),
  })
  // Which outcomes fit is the question's business (the service checks its type); here: option and value go with their outcomes.
  .superRefine((r, ctx) => v.addIssues(ctx, resolutionPairingIssues(r)));

/** Reopening keeps the resolution it removes in the history, with `note` as the reason. */
export const reopenRequest = z.object({ id, note: v.note.optional() });

/**
 * How the question list can be ordered. `attention` (the default) puts first what needs the
 * user: closed questions waiting for their outcome, then check-ins due, then windows closing
 * soon, then the other open questions, then resolved and void ones (see docs/api.md).
 */
export const LIST_SORTS = ['attention', 'title', 'status', 'closes', 'last_p', 'base_rate'] as const;
export type ListSort = (typeof LIST_SORTS)[number];
export const SORT_DIRECTIONS = ['asc', 'desc'] as const;
export type SortDirection = (typeof SORT_DIRECTIONS)[number];
/** The most questions one `listQuestions` page holds. */
export const LIST_PAGE_MAX = 1000;

export const listRequest = z.object({
  status: z.enum(QUESTION_STATUSES as [string, ...string[]], { error: `must be one of ${QUESTION_STATUSES.join(', ')}` }).optional(),
  tag: v.tag.optional(),
  text: v.searchText.optional(),
  sort: z.enum(LIST_SORTS, { error: `must be one of ${LIST_SORTS.join(', ')}` }).optional(),
  direction: z.enum(SORT_DIRECTIONS, { error: 'must be asc or desc' }).optional(),
  /** How many matching questions to skip (paging); 0 when left out. */
  offset: v.count(Number.MAX_SAFE_INTEGER).optional(),
  /** The most questions to return, 1 to LIST_PAGE_MAX; every match when left out. */
  limit: v.count(LIST_PAGE_MAX, 1).optional(),
});

export const settingsPatch = z.object(v.settingsFields).partial().strict();

export const scoreRequest = z
  .object({
    tag: v.tag.optional(),
    from: v.rangeBound('from').optional(),
    to: v.rangeBound('to').optional(),
    /** "What if" costs applied to every question in the filter, overriding their own. */
    costs: v.costs.optional(),
  })
  .refine(...v.toNotBeforeFrom);

export const hindsightRequest = z
  .object({
    tag: v.tag.optional(),
    from: v.rangeBound('from').optional(),
    to: v.rangeBound('to').optional(),
    /** A call is confident when its final forecast is at least this far towards one side. */
    threshold: z
      .number({ error: 'must be a number' })
      .refine((t) => t >= 0.5 && t <= 1, { message: 'must be between 0.5 and 1' })
      .default(CONFIDENT_THRESHOLD),
    include_hits: z.boolean({ error: 'must be true or false' }).default(false),
    /** How many entries to skip (paging); 0 when left out. */
    offset: v.count(Number.MAX_SAFE_INTEGER).optional(),
    /** The most entries to return, 1 to LIST_PAGE_MAX; every one when left out. */
    limit: v.count(LIST_PAGE_MAX, 1).optional(),
    /** The most `choice_entries` to return, from the first, 1 to LIST_PAGE_MAX; every one when left out. */
    choice_limit: v.count(LIST_PAGE_MAX, 1).optional(),
    /** The most `numeric_surprises` to return, from the first, 1 to LIST_PAGE_MAX; every one when left out. */
    numeric_limit: v.count(LIST_PAGE_MAX, 1).optional(),
  })
  .refine(...v.toNotBeforeFrom);

export const briefingRequest = z.object({
  tag: v.tag.optional(),
  threshold: hindsightRequest.shape.threshold,
});

export const SNOOZE_PRESETS = ['hour', 'tomorrow_morning', 'next_week'] as const;

export const dueRequest = z.object({ at: v.instant.optional() });

export const snoozeRequest = z
  .object({
    question_id: id,
    kind: z.enum(NUDGE_KINDS as [string, ...string[]], { error: `must be one of ${NUDGE_KINDS.join(', ')}` }),
    preset: z.enum(SNOOZE_PRESETS, { error: `must be one of ${SNOOZE_PRESETS.join(', ')}` }).optional(),
    until: v.instant.optional(),
  })
  .refine((r) => (r.preset === undefined) !== (r.until === undefined), {
    message: 'give either a preset or an until time, not both',
    path: ['preset'],
  });

/** Ends the question's running snoozes: of one kind, or every kind when `kind` is left out. */
export const unsnoozeRequest = z.object({
  question_id: id,
  kind: snoozeRequest.shape.kind.optional(),
});

/** Takes back the change that answered with `token` (see `Undoable`). */
export const undoRequest = z.object({ token: v.id('must be the undo token a change answered with') });

export const EXPORT_FORMATS = ['json', 'csv', 'ics'] as const;
export const IMPORT_FORMATS = ['json', 'csv'] as const;

export const exportTextRequest = z.object({
  format: z.enum(EXPORT_FORMATS, { error: 'must be json, csv or ics' }),
});

/**
 * The largest file the app imports in one request: browser mode's request cap (64 MB).
 * `forelog import FILE` reads a file as it streams, with no limit.
 */
export const APP_IMPORT_MAX_BYTES = 64 * 1_048_576;
export const APP_IMPORT_TOO_LARGE =
  'is larger than 64 MB, the most the app imports at once; import it with the command line instead, which takes files of any size: forelog import FILE';

/**
 * `merge`: questions already in the diary exactly as the file has them are skipped and the
 * rest added; any that are in the diary with different contents refuse the whole import
 * (error code `conflict`, with the list in `conflicts`). Without it, any question id
 * already in the diary refuses the import.
 */
const merge = z.boolean({ error: 'must be true or false' }).optional();

export const importTextRequest = z.object({
  format: z.enum(IMPORT_FORMATS, { error: 'must be json or csv' }),
  text: z.string({ error: 'must be the file’s text' }).max(APP_IMPORT_MAX_BYTES, { message: APP_IMPORT_TOO_LARGE }),
  merge,
});

export const importDiaryRequest = z.object({ diary: z.unknown(), merge });

const empty = z.object({}).strict();
const byId = z.object({ id });

export interface TagCount {
  tag: string;
  count: number;
}

export interface QuestionList {
  /** The page asked for: `limit` questions (all when no limit) from `offset`, in the order asked for. */
  questions: QuestionSummary[];
  tags: TagCount[];
  /** Number of questions in the whole diary, before filters. */
  total: number;
  /** Number of questions the filters match, over all pages. */
  matched: number;
  /** Where this page starts among the matches (0: the first). */
  offset: number;
  /** The order the page is in (the default filled in). */
  sort: ListSort;
  direction: SortDirection;
}

/** A whole-diary export as text, ready to save: JSON v1, CSV (one row per revision) or iCalendar. */
export interface ExportedText {
  text: string;
  file_name: string;
  media_type: string;
}

/**
 * Every change to a question answers with an `undo` token: passed to the `undo` operation,
 * it puts the question back exactly as it was before the change (same ids, entry order,
 * times, lenses, tags, resolution and history), as long as the question has not changed
 * since. The last 200 changes of the last 7 days can be undone, each once.
 */
export interface Undoable {
  undo: string;
}

/** The operations whose answers carry an `undo` token. */
export const UNDOABLE_OPERATIONS = [
  'createQuestion',
  'updateQuestion',
  'deleteQuestion',
  'addForecast',
  'updateForecast',
  'deleteForecast',
  'addReference',
  'deleteReference',
  'resolveQuestion',
  'reopenQuestion',
  'snooze',
  'unsnooze',
] as const;
export type UndoableOperation = (typeof UNDOABLE_OPERATIONS)[number];

export interface UndoResult {
  question_id: string;
  /** The operation that was undone. */
  operation: UndoableOperation;
  /** The question as it is again; null when the undone change created it. */
  question: Question | null;
}

export interface ImportResult {
  /** Questions added to the diary. */
  added: number;
  /** With `merge`: questions already in the diary exactly as in the file, left alone. */
  skipped: number;
}

/** A question a merging import found in the diary with different contents. */
export interface ImportConflict {
  /** Its place in the file: the index in `questions` (JSON) or the order of first rows (CSV), from 0. */
  index: number;
  /** CSV: the question's first row (the header is row 1); null for JSON. */
  row: number | null;
  id: string;
  /** The title in the file. */
  title: string;
  /** What differs, by the diary file's field names (title, forecasts, resolution, …), in file order. */
  differs: string[];
}

export interface DiaryInfo {
  question_count: number;
  /** How many of the example diary's questions (loadDemo) are in the diary; removeDemo takes them out. */
  example_questions: number;
  /** Where the diary file lives, for the about box; null in tests. */
  location: string | null;
  time_zone: string;
}

/** Operation name → request schema. The response type is in `Responses`. */
export const operations = {
  diaryInfo: empty,
  listQuestions: listRequest,
  getQuestion: byId,
  listTags: empty,
  createQuestion: createQuestionRequest,
  updateQuestion: updateQuestionRequest,
  deleteQuestion: byId,
  addForecast: forecastRequest,
  updateForecast: updateForecastRequest,
  deleteForecast: byId,
  addReference: referenceRequest,
  deleteReference: byId,
  resolveQuestion: resolveRequest,
  reopenQuestion: reopenRequest,
  getSettings: empty,
  updateSettings: settingsPatch,
  importDiary: importDiaryRequest,
  exportDiary: empty,
  importText: importTextRequest,
  exportText: exportTextRequest,
  loadDemo: empty,
  removeDemo: empty,
  score: scoreRequest,
  due: dueRequest,
  dueCount: dueRequest,
  snooze: snoozeRequest,
  unsnooze: unsnoozeRequest,
  undo: undoRequest,
  hindsight: hindsightRequest,
  briefing: briefingRequest,
} as const;

export type OperationName = keyof typeof operations;

export interface Responses {
  diaryInfo: DiaryInfo;
  listQuestions: QuestionList;
  getQuestion: Question;
  listTags: { tags: TagCount[] };
  createQuestion: Question & Undoable;
  updateQuestion: Question & Undoable;
  deleteQuestion: { deleted: string } & Undoable;
  addForecast: Question & Undoable;
  updateForecast: Question & Undoable;
  deleteForecast: Question & Undoable;
  addReference: Question & Undoable;
  deleteReference: Question & Undoable;
  resolveQuestion: Question & Undoable;
  reopenQuestion: Question & Undoable;
  getSettings: Settings;
  updateSettings: Settings;
  importDiary: ImportResult;
  exportDiary: unknown;
  importText: ImportResult;
  exportText: ExportedText;
  loadDemo: { added: number };
  /**
   * The example diary's questions taken out in one step, the user's own left as they are;
   * one `undo` token per question removed (undo them newest first, like any several steps).
   */
  removeDemo: { removed: number; undo: string[] };
  score: Scorecard;
  due: DueList;
  dueCount: DueCount;
  snooze: { question_id: string; kind: string; until: string } & Undoable;
  /** The kinds whose snoozes ended. */
  unsnooze: { question_id: string; kinds: NudgeKind[] } & Undoable;
  undo: UndoResult;
  hindsight: Hindsight;
  briefing: { html: string; title: string };
}

/** A scored question whose final forecast was confident, with what was written at the time. */
export interface HindsightEntry {
  id: string;
  title: string;
  rule: string;
  tags: string[];
  /** 'miss': confident and wrong; 'hit': confident and right. */
  verdict: 'miss' | 'hit';
  outcome: 'yes' | 'no';
  final_p: number;
  /** Window end T (ISO). */
  window_end: string;
  base_rate: number | null;
  resolution: { at: string; note: string };
  /** Every revision, oldest first; `counted` is false for ones after the window end. */
  forecasts: { at: string; p: number; note: string; counted: boolean }[];
}

export interface Hindsight {
  threshold: number;
  /** Yes/no questions: the page asked for (all when no limit), misses first, the most confident first; then hits. */
  entries: HindsightEntry[];
  /** Where `entries` starts in the whole yes/no list (0: the first). */
  offset: number;
  /** Yes/no confident misses in the whole selection, over all pages. */
  misses: number;
  /** Yes/no confident hits in the whole selection (0 unless `include_hits`). */
  hits: number;
  /**
   * Choice questions whose top choice was held at the threshold: misses, and hits with
   * include_hits (shared/hindsight-entries.ts); the first `choice_limit`, or all.
   */
  choice_entries: ChoiceHindsightEntry[];
  /** Choice confident misses in the whole selection, however many `choice_entries` holds. */
  choice_miss_count: number;
  /** Choice confident hits in the whole selection (0 unless `include_hits`). */
  choice_hit_count: number;
  /** Numeric questions whose outcome fell outside the final forecast's widest range, the largest surprise first; the first `numeric_limit`, or all. */
  numeric_surprises: NumericHindsightEntry[];
  /** Numeric surprises in the whole selection, however many `numeric_surprises` holds. */
  numeric_surprise_count: number;
  /** The same filter's scorecard, for the calibration summary beside the entries. */
  report: ScoreReport;
  /** 95 % interval around `report.brier`, exactly the Scorecard's `detail.brier_interval`; null with fewer than two scored. */
  brier_interval: [number, number] | null;
}

export interface DueList {
  at: string;
  nudges: DueNudge[];
  /** Nudges due at `at` but hidden by a running snooze, with when each comes back; same order as `nudges`. */
  snoozed: SnoozedNudge[];
}

/** How many questions the Desk would list at `at` (what the top bar and the tray show), without the list. */
export interface DueCount {
  at: string;
  count: number;
}

/**
 * The `score --json` object (INTERFACES.md §2): the yes/no figures at the top level (their
 * counts included), and the `choice` and `numeric` members, always present (counts 0 and
 * figures null when the filter holds no such questions).
 */
export type ScoreJson = ScoreReport & { choice: ChoiceReport; numeric: NumericReport };

/** The scorecard: the `score --json` report plus what the Scorecard screen draws. */
export interface Scorecard {
  report: ScoreJson;
  /** Per scored choice and numeric question, sorted by window end (ties by id): what their sections draw. */
  choice_detail: ChoiceDetail;
  numeric_detail: NumericDetail;
  /** What the charts need; the per-question rows stay on the server (the briefing uses them). */
  detail: Omit<ScorecardDetail, 'per_question'>;
  /** Days the user's calls got to the right side of 50% before the reference's, per tag. */
  leads: ReferenceLeadSummary[];
}

export interface ReferenceLeadSummary {
  /** null: every question in the filter. */
  tag: string | null;
  /** Questions where both sides reached the right side and stayed there. */
  n: number;
  mean_days: number | null;
}

export type Request<K extends OperationName> = z.input<(typeof operations)[K]>;
export type ValidRequest<K extends OperationName> = z.output<(typeof operations)[K]>;

/** What the renderer holds: one async function per operation. */
export type Api = { [K in OperationName]: (request: Request<K>) => Promise<Responses[K]> };

/** The handlers behind the API; they receive requests already validated. */
export type Handlers = { [K in OperationName]: (request: ValidRequest<K>) => Responses[K] | Promise<Responses[K]> };

export function isOperationName(name: string): name is OperationName {
  return Object.prototype.hasOwnProperty.call(operations, name);
}

/**
 * An error a user can act on; `fields` lists `field: reason` lines. Carried by both
 * transports. `conflicts` comes only with a merging import's `conflict`.
 */
export interface ApiErrorBody {
  error: { code: ApiErrorCode; message: string; fields: string[]; conflicts?: ImportConflict[] };
}

/**
 * `confirm`: the request is allowed but unusual (the message says why); nothing was
 * changed, and sending it again with `confirm: true` goes ahead.
 * `busy` (another window or command is writing; retry), `read_only` (the diary file may not
 * be written), `disk_full` and `storage` (the file could not be read or written, or is
 * damaged) describe the diary file rather than the request; each message says what to do.
 */
export type ApiErrorCode =
  | 'invalid'
  | 'not_found'
  | 'conflict'
  | 'confirm'
  | 'busy'
  | 'read_only'
  | 'disk_full'
  | 'storage'
  | 'internal';

export class ApiError extends Error {
  constructor(
    readonly code: ApiErrorCode,
    message: string,
    readonly fields: string[] = [],
    readonly conflicts?: ImportConflict[],
  ) {
    super(message);
    this.name = 'ApiError';
  }

  toBody(): ApiErrorBody {
    const error: ApiErrorBody['error'] = { code: this.code, message: this.message, fields: this.fields };
    if (this.conflicts) error.conflicts = this.conflicts;
    return { error };
  }
}

/**
 * How many of a refused request's problems its message names: `fields` keeps every one
 * (a form shows each beside its field), but a sentence for a person naming thousands (a
 * script's request with a field misspelt in each of 10,000 entries) would run to megabytes.
 */
export const MESSAGE_PROBLEMS = 10;

/** The `invalid` error for a request that broke the rules in `lines` (`field: reason` each). */
export function notAccepted(lines: string[]): ApiError {
  const named = lines.slice(0, MESSAGE_PROBLEMS).join('; ');
  const more = lines.length - MESSAGE_PROBLEMS;
  const rest = more > 0 ? `; and ${groupedDigits(more)} more (each is listed in fields)` : '';
  return new ApiError('invalid', `The request was not accepted: ${named}${rest}. Nothing was changed.`, lines);
}

/**
 * Validates `raw` against the operation's schema; throws an `invalid` ApiError listing each
 * field and reason.
 */
export function parseRequest<K extends OperationName>(name: K, raw: unknown): ValidRequest<K> {
  if (v.nestedDeeperThan(raw)) {
    throw new ApiError('invalid', `The request is nested too deeply: ${v.NESTING_RULE}. Nothing was changed.`);
  }
  // No request at all (an IPC call without one) is an empty one; a JSON null is a value of the wrong shape.
  const result = operations[name].safeParse(raw === undefined ? {} : raw, { reportInput: true });
  if (!result.success) {
    throw notAccepted(v.describeIssues(result.error, '', true));
  }
  // The schemas drop fields they do not know; a request naming one (a misspelt "base_rat")
  // would otherwise be carried out without what the user meant to give.
  const unknown = v.droppedFields(raw, result.data).map((field) => `${field}: is not a field of this request; check its spelling, or leave it out`);
  if (unknown.length > 0) {
    throw notAccepted(unknown);
  }
  return result.data as ValidRequest<K>;
}
