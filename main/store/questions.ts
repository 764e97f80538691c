/**
 * Questions and everything hanging off them: tags, forecast revisions (with lenses),
 * reference forecasts and resolutions. Reads take the read handle; writes take the write
 * handle and are called by the service inside a transaction.
 */
import type { ActiveSnooze, Costs, Forecast, Lens, NudgeKind, Outcome, Question, QuestionKind, ReferenceForecast, ResolutionChangeKind } from '../../shared/domain';
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
}

export interface ForecastRow {
  seq: number;
  id: string;
  question_id: string;
  at: number;
  p: number;
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
  p: number;
  source: string;
}

export interface ResolutionRow {
  question_id: string;
  outcome: Outcome;
  at: number;
  note: string;
  recorded_at: number;
}

export interface ResolutionHistoryRow {
  question_id: string;
  outcome: Outcome;
  at: number;
  note: string;
  recorded_at: number;
  replaced_at: number;
  change: ResolutionChangeKind;
  change_note: string;
}

export interface NewForecast {
  id: string;
  question_id: string;
  at: number;
  p: number;
  note: string;
  lenses: Lens[];
}

const statements = new WeakMap<Db, Map<string, Statement>>();

/** Prepared statements are cached per handle: an import of many thousand rows prepares each once. */
function stmt(db: Db, sql: string): Statement {
  let cache = statements.get(db);
  if (!cache) statements.set(db, (cache = new Map()));
  let s = cache.get(sql);
  if (!s) cache.set(sql, (s = db.prepare(sql)));
  return s;
}

const QUESTION_COLUMNS =
  'id, title, rule, kind, opened_at, closes_at, time_zone, base_rate, base_rate_note, false_alarm_cost, miss_cost, checkin_days, created_at, updated_at';

// ---- writes -------------------------------------------------------------------------

export function insertQuestion(db: Db, row: QuestionRow, tags: string[]): void {
  stmt(db, 
    `INSERT INTO questions (${QUESTION_COLUMNS}) VALUES (@id, @title, @rule, @kind, @opened_at, @closes_at, @time_zone,
      @base_rate, @base_rate_note, @false_alarm_cost, @miss_cost, @checkin_days, @created_at, @updated_at)`,
  ).run(row);
  replaceTags(db, row.id, tags);
}

export function updateQuestionRow(db: Db, row: QuestionRow): void {
  stmt(db, 
    `UPDATE questions SET title = @title, rule = @rule, kind = @kind, opened_at = @opened_at, closes_at = @closes_at,
      time_zone = @time_zone, base_rate = @base_rate, base_rate_note = @base_rate_note,
      false_alarm_cost = @false_alarm_cost, miss_cost = @miss_cost, checkin_days = @checkin_days, updated_at = @updated_at
     WHERE id = @id`,
  ).run(row);
}

export function touchQuestion(db: Db, id: string, at: number): void {
  stmt(db, 'UPDATE questions SET updated_at = ? WHERE id = ?').run(at, id);
}

export function replaceTags(db: Db, questionId: string, tags: string[]): void {
  stmt(db, 'DELETE FROM question_tags WHERE question_id = ?').run(questionId);
  const insert = stmt(db, 'INSERT INTO question_tags (question_id, tag, position) VALUES (?, ?, ?)');
  tags.forEach((tag, i) => insert.run(questionId, tag, i));
}

export function deleteQuestionRow(db: Db, id: string): boolean {
  return stmt(db, 'DELETE FROM questions WHERE id = ?').run(id).changes > 0;
}

export function insertForecast(db: Db, f: NewForecast): void {
  stmt(db, 'INSERT INTO forecasts (id, question_id, at, p, note) VALUES (@id, @question_id, @at, @p, @note)').run(f);
  insertLenses(db, f.id, f.lenses);
}

export function updateForecastRow(db: Db, f: { id: string; at: number; p: number; note: string }): void {
  stmt(db, 'UPDATE forecasts SET at = @at, p = @p, note = @note WHERE id = @id').run(f);
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

export function insertReference(db: Db, r: Omit<ReferenceRow, 'seq'>): void {
  stmt(db, 'INSERT INTO reference_forecasts (id, question_id, at, p, source) VALUES (@id, @question_id, @at, @p, @source)').run(r);
}

export function deleteReferenceRow(db: Db, id: string): boolean {
  return stmt(db, 'DELETE FROM reference_forecasts WHERE id = ?').run(id).changes > 0;
}

export function upsertResolution(db: Db, r: ResolutionRow): void {
  stmt(db, 
    `INSERT INTO resolutions (question_id, outcome, at, note, recorded_at) VALUES (@question_id, @outcome, @at, @note, @recorded_at)
     ON CONFLICT (question_id) DO UPDATE SET outcome = excluded.outcome, at = excluded.at, note = excluded.note,
       recorded_at = excluded.recorded_at`,
  ).run(r);
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
    `INSERT INTO resolution_history (question_id, outcome, at, note, recorded_at, replaced_at, change, change_note)
     SELECT question_id, outcome, at, note, recorded_at, ?, ?, ? FROM resolutions WHERE question_id = ?`,
  ).run(replacedAt, change, changeNote, questionId);
}

/** An earlier resolution as a diary file carries it (import). */
export function insertResolutionHistory(db: Db, r: ResolutionHistoryRow): void {
  stmt(
    db,
    `INSERT INTO resolution_history (question_id, outcome, at, note, recorded_at, replaced_at, change, change_note)
     VALUES (@question_id, @outcome, @at, @note, @recorded_at, @replaced_at, @change, @change_note)`,
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
  return stmt(db, 'SELECT question_id, outcome, at, note, recorded_at FROM resolutions WHERE question_id = ?').get(questionId) as ResolutionRow | undefined;
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
}

/**
 * Loads whole questions in a fixed number of queries (eight), whatever their number, so exporting or scoring a
 * large diary does not issue a query per question.
 */
export function loadBundles(db: Db, ids?: string[]): QuestionBundle[] {
  const filter = ids ? `WHERE question_id IN (SELECT value FROM json_each(?))` : '';
  const qFilter = ids ? `WHERE id IN (SELECT value FROM json_each(?))` : '';
  const args = ids ? [JSON.stringify(ids)] : [];
  const rows = stmt(db, `SELECT ${QUESTION_COLUMNS} FROM questions ${qFilter} ORDER BY closes_at, id`).all(...args) as QuestionRow[];
  const bundles = new Map<string, QuestionBundle>();
  for (const row of rows) {
    bundles.set(row.id, { row, tags: [], forecasts: [], lenses: new Map(), references: [], resolution: null, history: [], snoozes: [] });
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
  for (const r of stmt(db, `SELECT question_id, outcome, at, note, recorded_at FROM resolutions ${filter}`).all(...args) as ResolutionRow[]) {
    const b = bundles.get(r.question_id);
    if (b) b.resolution = r;
  }
  const historySql = `SELECT question_id, outcome, at, note, recorded_at, replaced_at, change, change_note FROM resolution_history ${filter} ORDER BY question_id, seq`;
  for (const h of stmt(db, historySql).all(...args) as ResolutionHistoryRow[]) bundles.get(h.question_id)?.history.push(h);
  const snoozeSql = `SELECT question_id, kind, until FROM snoozes ${filter} ORDER BY question_id, kind`;
  for (const z of stmt(db, snoozeSql).all(...args) as { question_id: string; kind: NudgeKind; until: number }[]) {
    bundles.get(z.question_id)?.snoozes.push({ kind: z.kind, until: z.until });
  }
  return [...bundles.values()];
}

/** The question as the API gives it; `now` decides which snoozes are still running. */
export function toQuestion(b: QuestionBundle, now: number): Question {
  const { row } = b;
  const costs: Costs | null =
    row.false_alarm_cost !== null && row.miss_cost !== null ? { false_alarm: row.false_alarm_cost, miss: row.miss_cost } : null;
  const forecasts: Forecast[] = b.forecasts.map((f) => ({
    id: f.id,
    at: toIso(f.at),
    p: f.p,
    note: f.note,
    seq: f.seq,
    lenses: (b.lenses.get(f.id) ?? []).map((l) => ({ name: l.name, p: l.p, weight: l.weight })),
  }));
  const references: ReferenceForecast[] = b.references.map((r) => ({ id: r.id, at: toIso(r.at), p: r.p, source: r.source }));
  return {
    id: row.id,
    title: row.title,
    rule: row.rule,
    kind: row.kind,
    tags: b.tags,
    opened_at: toIso(row.opened_at),
    closes_at: toIso(row.closes_at),
    time_zone: row.time_zone,
    base_rate: row.base_rate,
    base_rate_note: row.base_rate_note,
    costs,
    checkin_days: row.checkin_days,
    forecasts,
    references,
    resolution: b.resolution ? { outcome: b.resolution.outcome, at: toIso(b.resolution.at), note: b.resolution.note } : null,
    resolution_history: b.history.map((h) => ({
      outcome: h.outcome,
      at: toIso(h.at),
      note: h.note,
      recorded_at: toIso(h.recorded_at),
      replaced_at: toIso(h.replaced_at),
      change: h.change,
      change_note: h.change_note,
    })),
    snoozes: b.snoozes.filter((z) => z.until > now).map((z): ActiveSnooze => ({ kind: z.kind, until: toIso(z.until) })),
    created_at: toIso(row.created_at),
    updated_at: toIso(row.updated_at),
  };
}

/** The tags of each question asked for, in their order. */
export function tagsOf(db: Db, ids: readonly string[]): Map<string, string[]> {
  const byId = new Map<string, string[]>();
  if (!ids.length) return byId;
  // Row objects, not .raw(): statements are cached per SQL text and shared, and loadBundles runs this same text.
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
