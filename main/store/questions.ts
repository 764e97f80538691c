/**
 * Questions and everything hanging off them: tags, forecast revisions (with lenses),
 * reference forecasts and resolutions. Reads take the read handle; writes take the write
 * handle and are called by the service inside a transaction.
 */
import type {
  ActiveSnooze,
  AnyOutcome,
  AnyResolution,
  Costs,
  Forecast,
  Lens,
  NudgeKind,
  Question,
  QuestionBase,
  QuestionKind,
  QuestionType,
  ReferenceForecast,
  ResolutionChangeKind,
  ValueKind,
} from '../../shared/domain';
import { fromStoredValue } from '../../shared/numeric-value';
import { toIso } from '../../shared/time';
import type { Statement } from 'better-sqlite3';
import type { Db } from './open';

export interface QuestionRow {
  id: string;
  title: string;
  rule: string;
  kind: QuestionKind;
  opened_at: number;
  closes_at: number;
  time_zone: string;
  base_rate: number | null;
  base_rate_note: string;
  false_alarm_cost: number | null;
  miss_cost: number | null;
  checkin_days: number | null;
  created_at: number;
  updated_at: number;
  type: QuestionType;
  /** Choice questions: 1 when the options are ordered, else 0; null for other types. */
  ordered: number | null;
  /** Numeric questions: the unit ('' for none); null for other types. */
  unit: string | null;
  /** Numeric questions: number or date; null for other types. */
  value_kind: ValueKind | null;
}

/** A choice question's option as stored. */
export interface OptionRow {
  label: string;
  base_rate: number | null;
}

/**
 * What a question's type adds to its row: a choice question's options (labels and
 * base rates, in order), a numeric question's levels. Empty lists for a yes/no question.
 */
export interface TypeRows {
  options: OptionRow[];
  levels: number[];
}

export const NO_TYPE_ROWS: TypeRows = Object.freeze({ options: [], levels: [] }) as TypeRows;

/** A revision: `p` for a yes/no question, null for the others (their values are in `forecast_values`). */
export interface ForecastRow {
  seq: number;
  id: string;
  question_id: string;
  at: number;
  p: number | null;
  note: string;
}

export interface LensRow {
  forecast_id: string;
  position: number;
  name: string;
  p: number;
  weight: number;
}

export interface ReferenceRow {
  seq: number;
  id: string;
  question_id: string;
  at: number;
  p: number | null;
  source: string;
}

/** `option`: a choice question's option that came true; `value`: a numeric question's value (dates as days). */
export interface ResolutionRow {
  question_id: string;
  outcome: AnyOutcome;
  at: number;
  note: string;
  recorded_at: number;
  option: number | null;
  value: number | null;
}

export interface ResolutionHistoryRow {
  question_id: string;
  outcome: AnyOutcome;
  at: number;
  note: string;
  recorded_at: number;
  replaced_at: number;
  change: ResolutionChangeKind;
  change_note: string;
  option: number | null;
  value: number | null;
}

/**
 * A revision to write: `p` for a yes/no question (with its lenses), or `values` — a
 * choice question's probabilities or a numeric question's quantiles (dates as days).
 */
export interface NewForecast {
  id: string;
  question_id: string;
  at: number;
  p: number | null;
  values: readonly number[];
  note: string;
  lenses: Lens[];
}

/** How a cached statement returns rows: objects (the default), arrays, or the first column. */
type RowShape = 'object' | 'raw' | 'pluck';

const statements = new WeakMap<Db, Record<RowShape, Map<string, Statement>>>();

/**
 * Prepared statements are cached per handle: an import of many thousand rows prepares each
 * once. The row shape chooses the cache, and is set once at preparation, because
 * `.raw()` and `.pluck()` switch a statement for good: a shared statement switched by one
 * caller would hand arrays to another that expects objects. The SQL text alone is the key:
 * a key built from it (shape + text) is a new string each call, hashed again each time,
 * and an import looks statements up millions of times.
 */
function stmt(db: Db, sql: string, shape: RowShape = 'object'): Statement {
  let caches = statements.get(db);
  if (!caches) statements.set(db, (caches = { object: new Map(), raw: new Map(), pluck: new Map() }));
  const cache = caches[shape];
  let s = cache.get(sql);
  if (!s) {
    s = db.prepare(sql);
    if (shape === 'raw') s.raw(true);
    else if (shape === 'pluck') s.pluck(true);
    cache.set(sql, s);
  }
  return s;
}

const QUESTION_COLUMNS =
  'id, title, rule, kind, opened_at, closes_at, time_zone, base_rate, base_rate_note, false_alarm_cost, miss_cost, checkin_days, created_at, updated_at, type, ordered, unit, value_kind';

const INSERT_QUESTION = `INSERT INTO questions (${QUESTION_COLUMNS}) VALUES (${QUESTION_COLUMNS.split(',').map(() => '?').join(', ')})`;

// ---- writes -------------------------------------------------------------------------

export function insertQuestion(db: Db, row: QuestionRow, tags: string[], typeRows: TypeRows = NO_TYPE_ROWS): void {
  // Positional parameters: binding by name looks each one up in the row, per question.
  stmt(db, INSERT_QUESTION).run(
    row.id,
    row.title,
    row.rule,
    row.kind,
    row.opened_at,
    row.closes_at,
    row.time_zone,
    row.base_rate,
    row.base_rate_note,
    row.false_alarm_cost,
    row.miss_cost,
    row.checkin_days,
    row.created_at,
    row.updated_at,
    row.type,
    row.ordered,
    row.unit,
    row.value_kind,
  );
  // A new question has no tags or options to replace: inserted without the deletes.
  insertTags(db, row.id, tags);
  insertOptions(db, row.id, typeRows.options);
  const level = stmt(db, 'INSERT INTO question_levels (question_id, position, level) VALUES (?, ?, ?)');
  typeRows.levels.forEach((l, i) => level.run(row.id, i, l));
}

/** Writes the question's row; its type never changes (the store refuses it: migration 5). */
export function updateQuestionRow(db: Db, row: QuestionRow): void {
  stmt(db, 
    `UPDATE questions SET title = @title, rule = @rule, kind = @kind, opened_at = @opened_at, closes_at = @closes_at,
      time_zone = @time_zone, base_rate = @base_rate, base_rate_note = @base_rate_note,
      false_alarm_cost = @false_alarm_cost, miss_cost = @miss_cost, checkin_days = @checkin_days, updated_at = @updated_at,
      ordered = @ordered, unit = @unit
     WHERE id = @id`,
  ).run(row);
}

/** A choice question's options, in order (relabelling keeps their number: the service checks). */
export function replaceOptions(db: Db, questionId: string, options: readonly OptionRow[]): void {
  stmt(db, 'DELETE FROM question_options WHERE question_id = ?').run(questionId);
  insertOptions(db, questionId, options);
}

function insertOptions(db: Db, questionId: string, options: readonly OptionRow[]): void {
  if (options.length === 0) return;
  const insert = stmt(db, 'INSERT INTO question_options (question_id, position, label, base_rate) VALUES (?, ?, ?, ?)');
  options.forEach((o, i) => insert.run(questionId, i, o.label, o.base_rate));
}

export function touchQuestion(db: Db, id: string, at: number): void {
  stmt(db, 'UPDATE questions SET updated_at = ? WHERE id = ?').run(at, id);
}

export function replaceTags(db: Db, questionId: string, tags: string[]): void {
  stmt(db, 'DELETE FROM question_tags WHERE question_id = ?').run(questionId);
  insertTags(db, questionId, tags);
}

function insertTags(db: Db, questionId: string, tags: readonly string[]): void {
  if (tags.length === 0) return;
  const insert = stmt(db, 'INSERT INTO question_tags (question_id, tag, position) VALUES (?, ?, ?)');
  tags.forEach((tag, i) => insert.run(questionId, tag, i));
}

export function deleteQuestionRow(db: Db, id: string): boolean {
  return stmt(db, 'DELETE FROM questions WHERE id = ?').run(id).changes > 0;
}

export function insertForecast(db: Db, f: NewForecast): void {
  stmt(db, 'INSERT INTO forecasts (id, question_id, at, p, note) VALUES (?, ?, ?, ?, ?)').run(f.id, f.question_id, f.at, f.p, f.note);
  if (f.lenses.length) insertLenses(db, f.id, f.lenses);
  insertValues(db, 'forecast_values', f.id, f.values);
}

/** Revisions per INSERT statement when a question's history is written at once. */
const FORECAST_ROWS = 32;
/** The INSERT of n revisions, by n (built once each). */
const forecastInserts: string[] = [];

/**
 * A question's revisions in one INSERT per FORECAST_ROWS rows, in the order given (which
 * is their entry order, seq): an import writes millions, and a call per row costs more
 * than SQLite's own work for it.
 */
export function insertForecasts(db: Db, forecasts: NewForecast[]): void {
  for (let from = 0; from < forecasts.length; from += FORECAST_ROWS) {
    const rows = forecasts.slice(from, from + FORECAST_ROWS);
    const sql = (forecastInserts[rows.length] ??=
      `INSERT INTO forecasts (id, question_id, at, p, note) VALUES ${Array(rows.length).fill('(?, ?, ?, ?, ?)').join(', ')}`);
    const values: (string | number | null)[] = [];
    for (const f of rows) values.push(f.id, f.question_id, f.at, f.p, f.note);
    stmt(db, sql).run(values);
  }
  for (const f of forecasts) {
    if (f.lenses.length) insertLenses(db, f.id, f.lenses);
    insertValues(db, 'forecast_values', f.id, f.values);
  }
}

/** Rewrites a revision; `values` (choice and numeric questions) replace the old ones. */
export function updateForecastRow(db: Db, f: { id: string; at: number; p: number | null; values: readonly number[]; note: string }): void {
  stmt(db, 'UPDATE forecasts SET at = ?, p = ?, note = ? WHERE id = ?').run(f.at, f.p, f.note, f.id);
  stmt(db, 'DELETE FROM forecast_values WHERE forecast_id = ?').run(f.id);
  insertValues(db, 'forecast_values', f.id, f.values);
}

// Constant texts: a statement's text is its cache key (see stmt).
const VALUE_INSERTS = {
  forecast_values: 'INSERT INTO forecast_values (forecast_id, position, value) VALUES (?, ?, ?)',
  reference_values: 'INSERT INTO reference_values (reference_id, position, value) VALUES (?, ?, ?)',
} as const;

function insertValues(db: Db, table: keyof typeof VALUE_INSERTS, id: string, values: readonly number[]): void {
  if (values.length === 0) return;
  const insert = stmt(db, VALUE_INSERTS[table]);
  values.forEach((value, i) => insert.run(id, i, value));
}

export function replaceLenses(db: Db, forecastId: string, lenses: Lens[]): void {
  stmt(db, 'DELETE FROM forecast_lenses WHERE forecast_id = ?').run(forecastId);
  insertLenses(db, forecastId, lenses);
}

function insertLenses(db: Db, forecastId: string, lenses: Lens[]): void {
  const insert = stmt(db, 'INSERT INTO forecast_lenses (forecast_id, position, name, p, weight) VALUES (?, ?, ?, ?, ?)');
  lenses.forEach((l, i) => insert.run(forecastId, i, l.name, l.p, l.weight));
}

export function deleteForecastRow(db: Db, id: string): boolean {
  return stmt(db, 'DELETE FROM forecasts WHERE id = ?').run(id).changes > 0;
}

/** A reference forecast: `p` (yes/no) or `values` (a choice question's probabilities, a numeric question's quantiles). */
export function insertReference(db: Db, r: Omit<ReferenceRow, 'seq'> & { values: readonly number[] }): void {
  stmt(db, 'INSERT INTO reference_forecasts (id, question_id, at, p, source) VALUES (?, ?, ?, ?, ?)').run(r.id, r.question_id, r.at, r.p, r.source);
  insertValues(db, 'reference_values', r.id, r.values);
}

export function deleteReferenceRow(db: Db, id: string): boolean {
  return stmt(db, 'DELETE FROM reference_forecasts WHERE id = ?').run(id).changes > 0;
}

export function upsertResolution(db: Db, r: ResolutionRow): void {
  stmt(db, 
    `INSERT INTO resolutions (question_id, outcome, at, note, recorded_at, option, value)
     VALUES (?, ?, ?, ?, ?, ?, ?)
     ON CONFLICT (question_id) DO UPDATE SET outcome = excluded.outcome, at = excluded.at, note = excluded.note,
       recorded_at = excluded.recorded_at, option = excluded.option, value = excluded.value`,
  ).run(r.question_id, r.outcome, r.at, r.note, r.recorded_at, r.option, r.value);
}

export function deleteResolution(db: Db, questionId: string): void {
  stmt(db, 'DELETE FROM resolutions WHERE question_id = ?').run(questionId);
}

/**
 * Keeps the question's current resolution in its history before a correction or a
 * reopening replaces it; does nothing when it has none.
 */
export function archiveResolution(db: Db, questionId: string, change: ResolutionChangeKind, changeNote: string, replacedAt: number): void {
  stmt(
    db,
    `INSERT INTO resolution_history (question_id, outcome, at, note, recorded_at, replaced_at, change, change_note, option, value)
     SELECT question_id, outcome, at, note, recorded_at, ?, ?, ?, option, value FROM resolutions WHERE question_id = ?`,
  ).run(replacedAt, change, changeNote, questionId);
}

/** An earlier resolution as a diary file carries it (import). */
export function insertResolutionHistory(db: Db, r: ResolutionHistoryRow): void {
  stmt(
    db,
    `INSERT INTO resolution_history (question_id, outcome, at, note, recorded_at, replaced_at, change, change_note, option, value)
     VALUES (@question_id, @outcome, @at, @note, @recorded_at, @replaced_at, @change, @change_note, @option, @value)`,
  ).run(r);
}

// ---- reads --------------------------------------------------------------------------

export function questionRow(db: Db, id: string): QuestionRow | undefined {
  return stmt(db, `SELECT ${QUESTION_COLUMNS} FROM questions WHERE id = ?`).get(id) as QuestionRow | undefined;
}

export function forecastRow(db: Db, id: string): ForecastRow | undefined {
  return stmt(db, 'SELECT seq, id, question_id, at, p, note FROM forecasts WHERE id = ?').get(id) as ForecastRow | undefined;
}

export function referenceRow(db: Db, id: string): ReferenceRow | undefined {
  return stmt(db, 'SELECT seq, id, question_id, at, p, source FROM reference_forecasts WHERE id = ?').get(id) as
    | ReferenceRow
    | undefined;
}

/** The time of the question's earliest revision, or null when it has none. */
export function firstForecastAt(db: Db, questionId: string): number | null {
  return (stmt(db, 'SELECT min(at) AS at FROM forecasts WHERE question_id = ?').get(questionId) as { at: number | null }).at;
}

export function resolutionRow(db: Db, questionId: string): ResolutionRow | undefined {
  return stmt(db, 'SELECT question_id, outcome, at, note, recorded_at, option, value FROM resolutions WHERE question_id = ?').get(questionId) as
    | ResolutionRow
    | undefined;
}

/** What the question's type adds to its row (options, levels); empty for a yes/no question. */
export function typeRows(db: Db, questionId: string): TypeRows {
  return {
    options: stmt(db, 'SELECT label, base_rate FROM question_options WHERE question_id = ? ORDER BY position').all(questionId) as OptionRow[],
    levels: stmt(db, 'SELECT level FROM question_levels WHERE question_id = ? ORDER BY position', 'pluck').all(questionId) as number[],
  };
}

/** A choice or numeric revision's values in order (probabilities; quantiles with dates as days). */
export function forecastValues(db: Db, forecastId: string): number[] {
  return stmt(db, 'SELECT value FROM forecast_values WHERE forecast_id = ? ORDER BY position', 'pluck').all(forecastId) as number[];
}

/** Whether the diary holds no question: one row looked at, however large the diary. */
export function isEmpty(db: Db): boolean {
  return stmt(db, 'SELECT NOT EXISTS (SELECT 1 FROM questions)', 'pluck').get() === 1;
}

export function questionCount(db: Db): number {
  return (stmt(db, 'SELECT count(*) AS n FROM questions').get() as { n: number }).n;
}

export function allTagCounts(db: Db): { tag: string; count: number }[] {
  return stmt(db, 'SELECT tag, count(*) AS count FROM question_tags GROUP BY tag ORDER BY tag').all() as {
    tag: string;
    count: number;
  }[];
}

/**
 * For the question list: each choice or numeric question's option labels, levels and the
 * values of its latest revision (latest time; same time: entered last), in three queries.
 */
export function summaryTypeRows(db: Db, ids: string[]): Map<string, { options: string[]; levels: number[]; last: number[] }> {
  const out = new Map<string, { options: string[]; levels: number[]; last: number[] }>();
  if (ids.length === 0) return out;
  const list = JSON.stringify(ids);
  for (const id of ids) out.set(id, { options: [], levels: [], last: [] });
  type Pair = [string, string | number];
  for (const [id, label] of stmt(db, 'SELECT question_id, label FROM question_options WHERE question_id IN (SELECT value FROM json_each(?)) ORDER BY question_id, position', 'raw').all(list) as Pair[]) {
    out.get(id)!.options.push(label as string);
  }
  for (const [id, level] of stmt(db, 'SELECT question_id, level FROM question_levels WHERE question_id IN (SELECT value FROM json_each(?)) ORDER BY question_id, position', 'raw').all(list) as Pair[]) {
    out.get(id)!.levels.push(level as number);
  }
  const lastSql = `SELECT j.value, v.value FROM json_each(?) j
    JOIN forecast_values v ON v.forecast_id = (SELECT id FROM forecasts WHERE question_id = j.value ORDER BY at DESC, seq DESC LIMIT 1)
    ORDER BY j.value, v.position`;
  for (const [id, value] of stmt(db, lastSql, 'raw').all(list) as Pair[]) out.get(id)!.last.push(value as number);
  return out;
}

/** Raw rows of the questions asked for (all when `ids` is undefined), grouped by question. */
export interface QuestionBundle {
  row: QuestionRow;
  tags: string[];
  forecasts: ForecastRow[];
  lenses: Map<string, LensRow[]>;
  references: ReferenceRow[];
  resolution: ResolutionRow | null;
  history: ResolutionHistoryRow[];
  snoozes: { kind: NudgeKind; until: number }[];
  /** Choice and numeric questions: options, levels, and each revision's and reference's values by id. */
  typeRows: TypeRows;
  forecastValues: Map<string, number[]>;
  referenceValues: Map<string, number[]>;
}

/**
 * Loads whole questions in a fixed number of queries (twelve), whatever their number, so exporting or scoring a
 * large diary does not issue a query per question.
 */
/** The ids of the open questions (no resolution), of every type, of one tag or all (a briefing's open table). */
export function openQuestionIds(db: Db, tag?: string): string[] {
  const ofTag = tag === undefined ? '' : 'AND EXISTS (SELECT 1 FROM question_tags t WHERE t.question_id = q.id AND t.tag = ?)';
  return stmt(db, `SELECT q.id FROM questions q WHERE NOT EXISTS (SELECT 1 FROM resolutions r WHERE r.question_id = q.id) ${ofTag}`, 'pluck')
    .all(...(tag === undefined ? [] : [tag])) as string[];
}

export function loadBundles(db: Db, ids?: string[]): QuestionBundle[] {
  const filter = ids ? `WHERE question_id IN (SELECT value FROM json_each(?))` : '';
  const qFilter = ids ? `WHERE id IN (SELECT value FROM json_each(?))` : '';
  const args = ids ? [JSON.stringify(ids)] : [];
  const rows = stmt(db, `SELECT ${QUESTION_COLUMNS} FROM questions ${qFilter} ORDER BY closes_at, id`).all(...args) as QuestionRow[];
  const bundles = new Map<string, QuestionBundle>();
  for (const row of rows) {
    bundles.set(row.id, {
      row,
      tags: [],
      forecasts: [],
      lenses: new Map(),
      references: [],
      resolution: null,
      history: [],
      snoozes: [],
      typeRows: { options: [], levels: [] },
      forecastValues: new Map(),
      referenceValues: new Map(),
    });
  }
  for (const t of stmt(db, `SELECT question_id, tag FROM question_tags ${filter} ORDER BY question_id, position`).all(...args) as {
    question_id: string;
    tag: string;
  }[]) {
    bundles.get(t.question_id)?.tags.push(t.tag);
  }
  for (const f of db
    .prepare(`SELECT seq, id, question_id, at, p, note FROM forecasts ${filter} ORDER BY question_id, at, seq`)
    .all(...args) as ForecastRow[]) {
    bundles.get(f.question_id)?.forecasts.push(f);
  }
  const byForecast = new Map<string, QuestionBundle>();
  for (const b of bundles.values()) for (const f of b.forecasts) byForecast.set(f.id, b);
  const lensSql = `SELECT l.forecast_id, l.position, l.name, l.p, l.weight FROM forecast_lenses l
    ${ids ? 'JOIN forecasts f ON f.id = l.forecast_id WHERE f.question_id IN (SELECT value FROM json_each(?))' : ''}
    ORDER BY l.forecast_id, l.position`;
  for (const l of stmt(db, lensSql).all(...args) as LensRow[]) {
    const b = byForecast.get(l.forecast_id);
    if (!b) continue;
    const list = b.lenses.get(l.forecast_id) ?? [];
    list.push(l);
    b.lenses.set(l.forecast_id, list);
  }
  for (const r of db
    .prepare(`SELECT seq, id, question_id, at, p, source FROM reference_forecasts ${filter} ORDER BY question_id, at, seq`)
    .all(...args) as ReferenceRow[]) {
    bundles.get(r.question_id)?.references.push(r);
  }
  for (const o of stmt(db, `SELECT question_id, label, base_rate FROM question_options ${filter} ORDER BY question_id, position`).all(...args) as (OptionRow & {
    question_id: string;
  })[]) {
    bundles.get(o.question_id)?.typeRows.options.push({ label: o.label, base_rate: o.base_rate });
  }
  for (const l of stmt(db, `SELECT question_id, level FROM question_levels ${filter} ORDER BY question_id, position`).all(...args) as {
    question_id: string;
    level: number;
  }[]) {
    bundles.get(l.question_id)?.typeRows.levels.push(l.level);
  }
  const valuesSql = (table: string, key: string, parent: string) =>
    `SELECT x.${key} AS id, x.value FROM ${table} x
     ${ids ? `JOIN ${parent} p ON p.id = x.${key} WHERE p.question_id IN (SELECT value FROM json_each(?))` : ''}
     ORDER BY x.${key}, x.position`;
  const byReference = new Map<string, QuestionBundle>();
  for (const b of bundles.values()) for (const r of b.references) byReference.set(r.id, b);
  const collect = (rows: { id: string; value: number }[], owner: Map<string, QuestionBundle>, pick: (b: QuestionBundle) => Map<string, number[]>) => {
    for (const { id, value } of rows) {
      const b = owner.get(id);
      if (!b) continue;
      const map = pick(b);
      const list = map.get(id);
      if (list) list.push(value);
      else map.set(id, [value]);
    }
  };
  collect(stmt(db, valuesSql('forecast_values', 'forecast_id', 'forecasts')).all(...args) as { id: string; value: number }[], byForecast, (b) => b.forecastValues);
  collect(
    stmt(db, valuesSql('reference_values', 'reference_id', 'reference_forecasts')).all(...args) as { id: string; value: number }[],
    byReference,
    (b) => b.referenceValues,
  );
  for (const r of stmt(db, `SELECT question_id, outcome, at, note, recorded_at, option, value FROM resolutions ${filter}`).all(...args) as ResolutionRow[]) {
    const b = bundles.get(r.question_id);
    if (b) b.resolution = r;
  }
  const historySql = `SELECT question_id, outcome, at, note, recorded_at, replaced_at, change, change_note, option, value FROM resolution_history ${filter} ORDER BY question_id, seq`;
  for (const h of stmt(db, historySql).all(...args) as ResolutionHistoryRow[]) bundles.get(h.question_id)?.history.push(h);
  const snoozeSql = `SELECT question_id, kind, until FROM snoozes ${filter} ORDER BY question_id, kind`;
  for (const z of stmt(db, snoozeSql).all(...args) as { question_id: string; kind: NudgeKind; until: number }[]) {
    bundles.get(z.question_id)?.snoozes.push({ kind: z.kind, until: z.until });
  }
  return [...bundles.values()];
}

type StoredResolution = Pick<ResolutionRow, 'outcome' | 'at' | 'note' | 'option' | 'value'>;

/** A stored resolution as the API gives it (a date question's value as a date). */
function apiResolution(r: StoredResolution, kind: ValueKind): AnyResolution {
  const at = toIso(r.at);
  if (r.outcome === 'option') return { outcome: 'option', option: r.option!, at, note: r.note };
  if (r.outcome === 'value') return { outcome: 'value', value: fromStoredValue(r.value!, kind), at, note: r.note };
  return { outcome: r.outcome, at, note: r.note };
}

/** The question as the API gives it; `now` decides which snoozes are still running. */
export function toQuestion(b: QuestionBundle, now: number): Question {
  const { row } = b;
  const kind: ValueKind = row.value_kind ?? 'number';
  // Each type's resolutions carry only that type's outcomes (the service and the file reader make sure).
  const resolution = (b.resolution ? apiResolution(b.resolution, kind) : null) as never;
  const resolution_history = b.history.map((h) => ({
    ...apiResolution(h, kind),
    recorded_at: toIso(h.recorded_at),
    replaced_at: toIso(h.replaced_at),
    change: h.change,
    change_note: h.change_note,
  })) as never;
  const base: QuestionBase = {
    id: row.id,
    title: row.title,
    rule: row.rule,
    kind: row.kind,
    tags: b.tags,
    opened_at: toIso(row.opened_at),
    closes_at: toIso(row.closes_at),
    time_zone: row.time_zone,
    base_rate_note: row.base_rate_note,
    checkin_days: row.checkin_days,
    snoozes: b.snoozes.filter((z) => z.until > now).map((z): ActiveSnooze => ({ kind: z.kind, until: toIso(z.until) })),
    created_at: toIso(row.created_at),
    updated_at: toIso(row.updated_at),
  };
  const forecastValues = (id: string) => b.forecastValues.get(id) ?? [];
  const referenceValues = (id: string) => b.referenceValues.get(id) ?? [];
  if (row.type === 'choice') {
    const rates = b.typeRows.options.map((o) => o.base_rate);
    return {
      type: 'choice',
      ...base,
      options: b.typeRows.options.map((o) => o.label),
      ordered: row.ordered === 1,
      option_base_rates: rates.length > 0 && rates.every((r) => r !== null) ? (rates as number[]) : null,
      forecasts: b.forecasts.map((f) => ({ id: f.id, at: toIso(f.at), probs: forecastValues(f.id), note: f.note, seq: f.seq })),
      references: b.references.map((r) => ({ id: r.id, at: toIso(r.at), probs: referenceValues(r.id), source: r.source })),
      resolution,
      resolution_history,
    };
  }
  if (row.type === 'numeric') {
    const values = (list: number[]) => list.map((x) => fromStoredValue(x, kind));
    return {
      type: 'numeric',
      ...base,
      unit: row.unit ?? '',
      value_kind: kind,
      levels: b.typeRows.levels,
      forecasts: b.forecasts.map((f) => ({ id: f.id, at: toIso(f.at), quantiles: values(forecastValues(f.id)), note: f.note, seq: f.seq })),
      references: b.references.map((r) => ({ id: r.id, at: toIso(r.at), quantiles: values(referenceValues(r.id)), source: r.source })),
      resolution,
      resolution_history,
    };
  }
  const costs: Costs | null =
    row.false_alarm_cost !== null && row.miss_cost !== null ? { false_alarm: row.false_alarm_cost, miss: row.miss_cost } : null;
  // A yes/no question's revisions and references always carry p (the service writes it).
  const forecasts: Forecast[] = b.forecasts.map((f) => ({
    id: f.id,
    at: toIso(f.at),
    p: f.p!,
    note: f.note,
    seq: f.seq,
    lenses: (b.lenses.get(f.id) ?? []).map((l) => ({ name: l.name, p: l.p, weight: l.weight })),
  }));
  const references: ReferenceForecast[] = b.references.map((r) => ({ id: r.id, at: toIso(r.at), p: r.p!, source: r.source }));
  return { type: 'binary', ...base, base_rate: row.base_rate, costs, forecasts, references, resolution, resolution_history };
}

/** The tags of each question asked for, in their order. */
export function tagsOf(db: Db, ids: readonly string[]): Map<string, string[]> {
  const byId = new Map<string, string[]>();
  if (!ids.length) return byId;
  const rows = stmt(db, 'SELECT question_id, tag FROM question_tags WHERE question_id IN (SELECT value FROM json_each(?)) ORDER BY question_id, position').all(
    JSON.stringify(ids),
  ) as { question_id: string; tag: string }[];
  for (const { question_id: id, tag } of rows) {
    const list = byId.get(id);
    if (list) list.push(tag);
    else byId.set(id, [tag]);
  }
  return byId;
}

/** How many revisions each question asked for has (absent: none). */
export function forecastCountsOf(db: Db, ids: readonly string[]): Map<string, number> {
  if (!ids.length) return new Map();
  const rows = stmt(db, 'SELECT question_id, count(*) AS n FROM forecasts WHERE question_id IN (SELECT value FROM json_each(?)) GROUP BY question_id').all(
    JSON.stringify(ids),
  ) as { question_id: string; n: number }[];
  return new Map(rows.map((r) => [r.question_id, r.n]));
}
