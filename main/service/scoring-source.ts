/**
 * Reads the diary straight into the scoring engine's input. Numbers stay numbers from
 * SQLite to the engine, and the revisions — nearly all of the data — cross into
 * JavaScript as typed-array columns (`ScoringQuestion.forecast_columns`), with no row
 * array, object or text per revision; each question's `forecasts` list is built only if
 * something asks for it.
 *
 * Why a collecting SQL function: better-sqlite3 builds one JavaScript array per row, which
 * costs several times SQLite's own scan for 200,000 revisions; packing them into text in
 * SQL (group_concat + printf) is as slow and misreads a stored double by one unit in the
 * last place (SQLite's %g stops at 16 significant digits). A function called once per row
 * receives each value as the double SQLite holds and writes it into typed arrays.
 */
import type { ForecastColumns, ScoringForecast, ScoringQuestion } from '../../shared/scoring';
import type { Db } from '../store/open';

/** Revisions as parallel columns; row i belongs to the question at index `slot[i]` of the answer. */
interface RevisionRows {
  n: number;
  slot: Int32Array;
  at: Float64Array;
  p: Float64Array;
  seq: Float64Array;
}

/** Where the collecting function writes during one read; null between reads. */
interface Collector {
  slots: Map<string, number>;
  rows: RevisionRows;
}

const COLLECT_FN = 'forelog_collect_revision';
const collectors = new WeakMap<Db, { current: Collector | null }>();

function emptyRows(capacity: number): RevisionRows {
  return { n: 0, slot: new Int32Array(capacity), at: new Float64Array(capacity), p: new Float64Array(capacity), seq: new Float64Array(capacity) };
}

function grow(rows: RevisionRows): void {
  const bigger = emptyRows(rows.at.length * 2);
  bigger.slot.set(rows.slot);
  bigger.at.set(rows.at);
  bigger.p.set(rows.p);
  bigger.seq.set(rows.seq);
  Object.assign(rows, { slot: bigger.slot, at: bigger.at, p: bigger.p, seq: bigger.seq });
}

/** Registers the collecting function on this connection once (directOnly: no view or trigger can call it). */
function collectorFor(db: Db): { current: Collector | null } {
  const known = collectors.get(db);
  if (known) return known;
  const holder: { current: Collector | null } = { current: null };
  db.function(COLLECT_FN, { directOnly: true }, (questionId: unknown, at: unknown, p: unknown, seq: unknown) => {
    const c = holder.current;
    if (c === null) throw new Error(`${COLLECT_FN} belongs to the scoring reader and cannot be called on its own`);
    const { rows } = c;
    if (rows.n === rows.at.length) grow(rows);
    const i = rows.n++;
    // A revision without its question (impossible with foreign keys on) gets slot -1 and is left out.
    rows.slot[i] = c.slots.get(questionId as string) ?? -1;
    rows.at[i] = at as number;
    rows.p[i] = p as number;
    rows.seq[i] = seq as number;
    return null;
  });
  collectors.set(db, holder);
  return holder;
}

/** Every revision of the diary, in table order (the engine orders each question's own by time, then seq). */
function readRevisions(db: Db, slots: Map<string, number>): RevisionRows {
  const holder = collectorFor(db);
  const rows = emptyRows(4096);
  holder.current = { slots, rows };
  try {
    db.prepare(`SELECT count(${COLLECT_FN}(question_id, at, p, seq)) FROM forecasts`).pluck().get();
  } finally {
    holder.current = null;
  }
  return rows;
}

/** Regroups the rows by question (a counting sort, keeping table order within each): one column range per question. */
function columnsByQuestion(rows: RevisionRows, questionCount: number): ForecastColumns[] {
  const starts = new Int32Array(questionCount + 1);
  for (let i = 0; i < rows.n; i++) if (rows.slot[i]! >= 0) starts[rows.slot[i]! + 1]!++;
  for (let q = 0; q < questionCount; q++) starts[q + 1]! += starts[q]!;
  const total = starts[questionCount]!;
  const at = new Float64Array(total);
  const p = new Float64Array(total);
  const seq = new Float64Array(total);
  const next = starts.slice(0, questionCount);
  for (let i = 0; i < rows.n; i++) {
    const s = rows.slot[i]!;
    if (s < 0) continue;
    const to = next[s]!++;
    at[to] = rows.at[i]!;
    p[to] = rows.p[i]!;
    seq[to] = rows.seq[i]!;
  }
  const out: ForecastColumns[] = new Array(questionCount);
  for (let q = 0; q < questionCount; q++) out[q] = { at, p, seq, start: starts[q]!, end: starts[q + 1]! };
  return out;
}

function forecastList(c: ForecastColumns): ScoringForecast[] {
  const list: ScoringForecast[] = [];
  for (let r = c.start; r < c.end; r++) list.push({ at: c.at[r]!, p: c.p[r]!, seq: c.seq[r]! });
  return list;
}

type QuestionRow = [string, string, ScoringQuestion['kind'], number, number | null, number | null, number | null, 'yes' | 'no' | 'void' | null, number | null];

/**
 * One question for the engine. `forecasts` is built from the columns on first read and then
 * kept; assigning a new list drops the columns, so the engine never reads stale ones.
 */
function scoringQuestion(row: QuestionRow, columns: ForecastColumns): ScoringQuestion {
  const [id, title, kind, closes, baseRate, fa, miss, outcome, resolvedAt] = row;
  let list: ScoringForecast[] | null = null;
  return {
    id,
    title,
    tags: [],
    kind,
    closes_at: closes,
    resolution: outcome ? { outcome, at: resolvedAt! } : null,
    base_rate: baseRate,
    costs: fa !== null && miss !== null ? { false_alarm: fa, miss } : null,
    forecast_columns: columns,
    get forecasts(): ScoringForecast[] {
      return (list ??= forecastList(columns));
    },
    set forecasts(replacement: ScoringForecast[]) {
      list = replacement;
      delete this.forecast_columns;
    },
    references: [],
  };
}

/**
 * The whole diary as the engine's questions, from one consistent snapshot of the file.
 * References come in time order, because the engine lets the later of two same-time
 * references stand.
 */
export function loadScoringQuestions(db: Db): ScoringQuestion[] {
  return db.transaction(() => {
    const rows = db
      .prepare(
        `SELECT q.id, q.title, q.kind, q.closes_at, q.base_rate, q.false_alarm_cost, q.miss_cost, r.outcome, r.at AS resolved_at
         FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id`,
      )
      .raw()
      .all() as QuestionRow[];
    const slots = new Map<string, number>();
    rows.forEach((row, i) => slots.set(row[0], i));
    const columns = columnsByQuestion(readRevisions(db, slots), rows.length);
    const questions = rows.map((row, i) => scoringQuestion(row, columns[i]!));

    for (const [qid, tag] of db.prepare('SELECT question_id, tag FROM question_tags ORDER BY question_id, position').raw().all() as [string, string][]) {
      const i = slots.get(qid);
      if (i !== undefined) questions[i]!.tags.push(tag);
    }
    for (const [qid, at, p] of db.prepare('SELECT question_id, at, p FROM reference_forecasts ORDER BY question_id, at, seq').raw().all() as [string, number, number][]) {
      const i = slots.get(qid);
      if (i !== undefined) questions[i]!.references.push({ at, p });
    }
    return questions;
  })();
}
