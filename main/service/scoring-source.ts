/**
 * Reads the diary straight into the scoring engine's input. Numbers stay numbers from
 * SQLite to the engine, and the revisions — nearly all of the data — cross into
 * JavaScript as typed-array columns (`ScoringQuestion.forecast_columns`), with no row
 * array, object or text per revision; each question's `forecasts` list is built only if
 * something asks for it.
 *
 * Why a collecting SQL function: better-sqlite3 builds one JavaScript array per row, which
 * costs several times SQLite's own scan for 200,000 revisions; packing them into text in
 * SQL (group_concat + printf) is as slow and misreads some stored doubles (SQLite prints
 * 0.1 + 0.2 as 0.3). A function called once per row receives each value as the double
 * SQLite holds and writes it into typed arrays.
 */
import type { ForecastColumns, ScoringChoiceForecast, ScoringChoiceQuestion, ScoringForecast, ScoringNumericForecast, ScoringNumericQuestion, ScoringQuestion } from '../../shared/scoring';
import { readSnapshot, type Db } from '../store/open';

/** Revisions as parallel columns; row i belongs to the question at index `slot[i]` of the answer. */
interface RevisionRows {
  n: number;
  slot: Int32Array;
  at: Float64Array;
  /** The probability; for a choice or numeric revision (readTypedRevisions), one of its values. */
  p: Float64Array;
  seq: Float64Array;
}

/** Where the collecting function writes during one read; null between reads. */
interface Collector {
  slotOf: SlotOf;
  rows: RevisionRows;
}

/** A question's rowid → its index in the answer being read. */
type SlotOf = (rowid: number) => number;

/**
 * The lookup from rowid to index for questions read in this order: an array indexed by
 * rowid where the rowids lie close together (as SQLite assigns them), a map where they do
 * not (a rowid can be any 64-bit integer, and an array that long cannot be made).
 */
function slotLookup(rowids: readonly number[]): SlotOf {
  let low = Infinity;
  let high = -Infinity;
  for (const r of rowids) {
    low = Math.min(low, r);
    high = Math.max(high, r);
  }
  if (high - low < 4 * rowids.length + 1024) {
    const slots = new Int32Array(high - low + 1);
    rowids.forEach((r, i) => (slots[r - low] = i));
    return (rowid) => slots[rowid - low]!;
  }
  const slots = new Map(rowids.map((r, i) => [r, i]));
  return (rowid) => slots.get(rowid)!;
}

const COLLECT_FN = 'forelog_collect_revision';
const collectors = new WeakMap<Db, { current: Collector | null }>();

function emptyRows(capacity: number): RevisionRows {
  return { n: 0, slot: new Int32Array(capacity), at: new Float64Array(capacity), p: new Float64Array(capacity), seq: new Float64Array(capacity) };
}

/** Doubles the columns; only reached if the row bound taken before the read were ever short. */
function grow(rows: RevisionRows): void {
  const bigger = emptyRows(Math.max(16, rows.at.length * 2));
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
  db.function(COLLECT_FN, { directOnly: true }, (questionRowid: unknown, at: unknown, p: unknown, seq: unknown) => {
    const c = holder.current;
    if (c === null) throw new Error(`${COLLECT_FN} belongs to the scoring reader and cannot be called on its own`);
    const { rows } = c;
    if (rows.n === rows.at.length) grow(rows);
    const i = rows.n++;
    rows.slot[i] = c.slotOf(questionRowid as number);
    rows.at[i] = at as number;
    rows.p[i] = p as number;
    rows.seq[i] = seq as number;
    return null;
  });
  collectors.set(db, holder);
  return holder;
}

/**
 * Every revision of the yes/no questions whose rowids lie in `range`, question by question
 * (the engine orders each question's own by time, then seq). The question is named by its
 * rowid, so no text crosses per revision. `capacity` is a first guess at the row count.
 */
function readRevisions(db: Db, range: RowidRange, slotOf: SlotOf, capacity: number): RevisionRows {
  // Question by question (CROSS JOIN keeps questions the outer loop), each one's revisions
  // from the (question_id, at, seq, p) index alone: no lookup per revision.
  return collectRows(
    db,
    `SELECT count(${COLLECT_FN}(q.rowid, f.at, f.p, f.seq)) FROM questions q CROSS JOIN forecasts f ON f.question_id = q.id
     WHERE q.type = 'binary' AND q.rowid BETWEEN ? AND ?`,
    [range.from, range.to],
    slotOf,
    capacity,
  );
}

/**
 * Runs `sql`, a query that calls the collecting function once per row as
 * (question rowid, at, p, seq), and returns the rows it collected, in the order SQLite gave them.
 */
function collectRows(db: Db, sql: string, params: readonly number[], slotOf: SlotOf, capacity: number): RevisionRows {
  const holder = collectorFor(db);
  const rows = emptyRows(capacity);
  holder.current = { slotOf, rows };
  try {
    db.prepare(sql).pluck().get(...params);
  } finally {
    holder.current = null;
  }
  return rows;
}

/**
 * One column range per question. When each question's revisions already sit together (as
 * readRevisions' plan gives them) the rows are used as they are; otherwise (a plan SQLite
 * chose differently) they are regrouped by a counting sort that keeps their order within
 * each question.
 */
function columnsByQuestion(rows: RevisionRows, questionCount: number): ForecastColumns[] {
  const start = new Int32Array(questionCount).fill(-1);
  const end = new Int32Array(questionCount);
  let together = true;
  for (let i = 0; i < rows.n; i++) {
    const s = rows.slot[i]!;
    if (start[s] === -1) start[s] = i;
    else if (end[s] !== i) together = false;
    end[s] = i + 1;
  }
  if (together) {
    const { at, p, seq } = rows;
    return Array.from({ length: questionCount }, (_, q) => (start[q] === -1 ? { at, p, seq, start: 0, end: 0 } : { at, p, seq, start: start[q]!, end: end[q]! }));
  }
  const offsets = new Int32Array(questionCount + 1);
  for (let i = 0; i < rows.n; i++) offsets[rows.slot[i]! + 1]!++;
  for (let q = 0; q < questionCount; q++) offsets[q + 1]! += offsets[q]!;
  const at = new Float64Array(rows.n);
  const p = new Float64Array(rows.n);
  const seq = new Float64Array(rows.n);
  const next = offsets.slice(0, questionCount);
  for (let i = 0; i < rows.n; i++) {
    const to = next[rows.slot[i]!]!++;
    at[to] = rows.at[i]!;
    p[to] = rows.p[i]!;
    seq[to] = rows.seq[i]!;
  }
  return Array.from({ length: questionCount }, (_, q) => ({ at, p, seq, start: offsets[q]!, end: offsets[q + 1]! }));
}

const LIST = Symbol('forecast list');

/**
 * `forecasts` as an own, enumerable accessor (so a spread copy still carries the list) whose
 * functions are shared by every question, which keeps the objects small and fast.
 */
const FORECASTS: PropertyDescriptor & ThisType<StoredQuestion> = {
  get(): ScoringForecast[] {
    let list = this[LIST];
    if (list === null) {
      const c = this.forecast_columns!;
      list = [];
      for (let r = c.start; r < c.end; r++) list.push({ at: c.at[r]!, p: c.p[r]!, seq: c.seq[r]! });
      this[LIST] = list;
    }
    return list;
  },
  set(list: ScoringForecast[]) {
    this[LIST] = list;
    this.forecast_columns = undefined; // no longer the same revisions
  },
  enumerable: true,
  configurable: true,
};

/** A question as the engine reads it; `forecasts` is built from the columns on first read. */
class StoredQuestion {
  declare forecasts: ScoringForecast[];
  declare [LIST]: ScoringForecast[] | null;
  tags: string[];
  resolution: ScoringQuestion['resolution'];
  costs: ScoringQuestion['costs'];
  references: ScoringQuestion['references'] = [];

  constructor(
    readonly id: string,
    readonly title: string,
    readonly kind: ScoringQuestion['kind'],
    readonly closes_at: number,
    readonly base_rate: number | null,
    costs: ScoringQuestion['costs'],
    resolution: ScoringQuestion['resolution'],
    tags: string[],
    public forecast_columns: ForecastColumns | undefined,
  ) {
    this.costs = costs;
    this.resolution = resolution;
    this.tags = tags;
    Object.defineProperty(this, LIST, { value: null, writable: true, enumerable: false });
    Object.defineProperty(this, 'forecasts', FORECASTS);
  }
}

type QuestionRow = [
  rowid: number,
  id: string,
  title: string,
  kind: ScoringQuestion['kind'],
  closes_at: number,
  base_rate: number | null,
  false_alarm_cost: number | null,
  miss_cost: number | null,
  outcome: 'yes' | 'no' | 'void' | null,
  resolved_at: number | null,
  /** The question's tags in its order, joined by line breaks (which the tag rule excludes); null when it has none. */
  tags: string | null,
];

/** Question rowids from `from` to `to`, both included. */
interface RowidRange {
  from: number;
  to: number;
}

const EVERY_ROWID: RowidRange = { from: Number.MIN_SAFE_INTEGER, to: Number.MAX_SAFE_INTEGER };

/**
 * The diary's yes/no questions as the engine's questions, from one consistent snapshot of
 * the file, in export order. Tags come in the question's order; references in time order,
 * because the engine lets the later of two same-time references stand.
 */
export function loadScoringQuestions(db: Db): ScoringQuestion[] {
  return readSnapshot(db, () => {
    const part = readBinaryRange(db, EVERY_ROWID, revisionBound(db));
    return finishBinary(db, [part]);
  });
}

/** Every question of the diary as the engine reads it, by type, from one snapshot. */
export interface ScoringInput {
  binary: ScoringQuestion[];
  choice: ScoringChoiceQuestion[];
  numeric: ScoringNumericQuestion[];
}

export function loadScoringInput(db: Db): ScoringInput {
  return readSnapshot(db, () => ({ binary: finishBinary(db, [readBinaryRange(db, EVERY_ROWID, revisionBound(db))]), ...readTyped(db, EVERY_ROWID) }));
}

/** seq only grows (AUTOINCREMENT), so the largest is a bound on the revision count, found in one step. */
function revisionBound(db: Db): number {
  return ((db.prepare('SELECT max(seq) FROM forecasts').pluck().get() as number | null) ?? 0) + 1;
}

/** The questions per background step (about 50 ms each at 20 yes/no revisions per question here). */
export const QUESTIONS_PER_STEP = 2_000;

/**
 * The scoring input read a few thousand questions at a time, each step in its own snapshot,
 * so a long-running app can read a large diary between requests instead of making one wait
 * seconds for it. The steps together stand for one state of the diary only if no commit
 * came between them: SQLite's data_version on the read handle moves on any other
 * connection's commit, so when it still reads as it did before the first step, every step
 * saw the same file. Otherwise `input` is null and the caller reads again.
 */
export interface StepwiseRead {
  /** The read handle's data_version when the read began: the diary state it reads. */
  readonly version: number;
  /** Reads one more part; true once the read is over (`input` then holds the answer, or null). */
  step(): boolean;
  input: ScoringInput | null;
}

export function startStepwiseRead(db: Db, questionsPerStep = QUESTIONS_PER_STEP): StepwiseRead {
  const version = dataVersion(db);
  const last = (db.prepare('SELECT max(rowid) FROM questions').pluck().get() as number | null) ?? 0;
  const parts: BinaryPart[] = [];
  const typedParts: TypedPart[] = [];
  let next = (db.prepare('SELECT min(rowid) FROM questions').pluck().get() as number | null) ?? 1;
  let done = false;
  const read: StepwiseRead = {
    version,
    input: null,
    step() {
      if (done) return true;
      if (dataVersion(db) !== version) {
        done = true;
        return true;
      }
      if (next <= last) {
        readSnapshot(db, () => {
          // The step ends at its questionsPerStep-th question, however sparse the rowids are.
          const to = (db.prepare('SELECT rowid FROM questions WHERE rowid >= ? ORDER BY rowid LIMIT 1 OFFSET ?').pluck().get(next, questionsPerStep - 1) as number | undefined) ?? last;
          const range = { from: next, to };
          next = to + 1;
          parts.push(readBinaryRange(db, range, 20 * questionsPerStep));
          typedParts.push(readTyped(db, range));
        });
        return false;
      }
      // Then a last step: the references, and the parts put together in export order.
      const binary = readSnapshot(db, () => finishBinary(db, parts));
      const typed = { choice: inExportOrder(typedParts.flatMap((t) => t.choice), byClose, byId), numeric: inExportOrder(typedParts.flatMap((t) => t.numeric), byClose, byId) };
      if (dataVersion(db) === version) read.input = { binary, ...typed };
      done = true;
      return true;
    },
  };
  return read;
}

/** The read handle's data_version (see StepwiseRead). */
export function dataVersion(db: Db): number {
  return db.pragma('data_version', { simple: true }) as number;
}

/**
 * Every revision of the choice and numeric questions whose rowids lie in `range`, grouped by question slot in entry order (as the rest
 * of the service lists revisions; the engine orders by time itself), each made by `make`
 * from its time, entry number and values. The values of all revisions lie in one
 * Float64Array and each revision gets its own stretch of it as a view: a million stored
 * values cross into JavaScript through the collecting function (see the module comment)
 * into typed columns, with no array or boxed number per value, which kept the collector
 * of a mixed diary busy collecting garbage for most of its time.
 */
function readTypedRevisions<F>(db: Db, range: RowidRange, slotOf: SlotOf, questionCount: number, make: (slot: number, at: number, seq: number, values: Float64Array) => F): F[][] {
  // Question by question, each one's revisions from its index, each revision's values in
  // position order from the values' primary key: a revision's values arrive together. The
  // collector's "p" column carries the value here.
  const rows = collectRows(
    db,
    `SELECT count(${COLLECT_FN}(q.rowid, f.at, v.value, f.seq))
     FROM questions q CROSS JOIN forecasts f ON f.question_id = q.id CROSS JOIN forecast_values v ON v.forecast_id = f.id
     WHERE q.type <> 'binary' AND q.rowid BETWEEN ? AND ?`,
    [range.from, range.to],
    slotOf,
    1024,
  );
  const bySlot: { revision: F; seq: number }[][] = Array.from({ length: questionCount }, () => []);
  const { slot, at, p: values, seq } = rows;
  for (let from = 0; from < rows.n; ) {
    let to = from + 1;
    while (to < rows.n && slot[to] === slot[from] && seq[to] === seq[from]) to++;
    bySlot[slot[from]!]!.push({ revision: make(slot[from]!, at[from]!, seq[from]!, values.subarray(from, to)), seq: seq[from]! });
    from = to;
  }
  return bySlot.map((list) => {
    for (let i = 1; i < list.length; i++) {
      if (list[i - 1]!.seq > list[i]!.seq) {
        list.sort((a, b) => a.seq - b.seq);
        break;
      }
    }
    return list.map((r) => r.revision);
  });
}

/** Choice and numeric questions of some rowids, each list in export order. */
interface TypedPart {
  choice: ScoringChoiceQuestion[];
  numeric: ScoringNumericQuestion[];
}

const byClose = (q: { closes_at: number }) => q.closes_at;
const byId = (q: { id: string }) => q.id;

/**
 * The choice and numeric questions whose rowids lie in `range`, in export order, with their
 * revisions' values as numbers (a numeric date question's as days since 1970-01-01, as stored).
 */
function readTyped(db: Db, range: RowidRange): TypedPart {
  type Row = [rowid: number, id: string, title: string, type: 'choice' | 'numeric', closes: number, ordered: number | null, unit: string | null, kind: 'number' | 'date' | null, outcome: string | null, at: number | null, option: number | null, value: number | null, tags: string | null];
  const rows = db
    .prepare(
      `SELECT q.rowid, q.id, q.title, q.type, q.closes_at, q.ordered, q.unit, q.value_kind, r.outcome, r.at, r.option, r.value, ${TAGS_OF_Q}
       FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id WHERE q.type <> 'binary' AND q.rowid BETWEEN ? AND ?`,
    )
    .raw()
    .all(range.from, range.to) as Row[];
  inExportOrder(rows, (row) => row[4], (row) => row[1]);
  const choice: ScoringChoiceQuestion[] = [];
  const numeric: ScoringNumericQuestion[] = [];
  if (rows.length === 0) return { choice, numeric };
  const rates = new Map<string, (number | null)[]>();
  const levels = new Map<string, number[]>();
  const push = <T>(map: Map<string, T[]>, key: string, item: T) => {
    const list = map.get(key);
    if (list) list.push(item);
    else map.set(key, [item]);
  };
  // Options and levels of the range's questions only, each question's in position order.
  const ofRange = (table: string, column: string) =>
    db
      .prepare(`SELECT t.question_id, t.${column} FROM questions q CROSS JOIN ${table} t ON t.question_id = q.id WHERE q.type <> 'binary' AND q.rowid BETWEEN ? AND ? ORDER BY q.rowid, t.position`)
      .raw()
      .all(range.from, range.to);
  for (const [qid, rate] of ofRange('question_options', 'base_rate') as [string, number | null][]) {
    push(rates, qid, rate);
  }
  for (const [qid, level] of ofRange('question_levels', 'level') as [string, number][]) {
    push(levels, qid, level);
  }
  const revisionsBySlot = readTypedRevisions(db, range, slotLookup(rows.map((row) => row[0])), rows.length, (slot, at, seq, values) =>
    rows[slot]![3] === 'choice' ? { at, probs: values, seq } : { at, quantiles: values, seq },
  );
  rows.forEach(([, id, title, type, closes, ordered, unit, kind, outcome, at, option, value, tags], slot) => {
    const base = { id, title, tags: tagList(tags), closes_at: closes };
    const revisions = revisionsBySlot[slot]!;
    if (type === 'choice') {
      const stated = rates.get(id) ?? [];
      choice.push({
        ...base,
        resolution: outcome === null ? null : outcome === 'option' ? { outcome: 'option', option: option!, at: at! } : { outcome: 'void', at: at! },
        option_count: stated.length,
        ordered: ordered === 1,
        option_base_rates: stated.length > 0 && stated.every((r) => r !== null) ? (stated as number[]) : null,
        forecasts: revisions as ScoringChoiceForecast[], // made as a choice question's above
      });
    } else {
      numeric.push({
        ...base,
        resolution: outcome === null ? null : outcome === 'value' ? { outcome: 'value', value: value!, at: at! } : { outcome: 'void', at: at! },
        unit: unit ?? '',
        value_kind: kind ?? 'number',
        levels: levels.get(id) ?? [],
        forecasts: revisions as ScoringNumericForecast[], // made as a numeric question's above
      });
    }
  });
  return { choice, numeric };
}

/**
 * The question `q`'s tags in its own order as one text, joined by line breaks (the tag rule
 * allows none in a tag); null when it has none. One value per question costs far less than
 * a row per tag, each of which better-sqlite3 turns into an array and two strings.
 */
const TAGS_OF_Q = `(SELECT group_concat(tag, char(10) ORDER BY position) FROM question_tags WHERE question_id = q.id)`;

function tagList(joined: string | null): string[] {
  return joined === null ? [] : joined.split('\n');
}

/**
 * Both readers take the questions in export order (close time, then id): sums of doubles
 * depend on their order, and this way a diary and its own export imported elsewhere score
 * bit for bit alike, whatever order the questions were entered in. The rows are read in the
 * table's own order and sorted here: SQLite's ORDER BY walks the close-time index and reads
 * each row at a scattered place, which at 100,000 questions took longer than the reading.
 * Ids compare as SQLite's BINARY collation does (UTF-8 bytes, which order as code points).
 */
function inExportOrder<T>(items: T[], closes: (item: T) => number, id: (item: T) => string): T[] {
  return items.sort((a, b) => closes(a) - closes(b) || compareCodePoints(id(a), id(b)));
}

/** Orders two strings by code point, as UTF-8 bytes order (JavaScript's < orders UTF-16 units). */
function compareCodePoints(a: string, b: string): number {
  if (a === b) return 0;
  for (let i = 0, j = 0; i < a.length && j < b.length; ) {
    const x = a.codePointAt(i)!;
    const y = b.codePointAt(j)!;
    if (x !== y) return x - y;
    i += x > 0xffff ? 2 : 1;
    j += y > 0xffff ? 2 : 1;
  }
  return a.length - b.length;
}

/** Some of the yes/no questions, with each one's rowid at the same index (for references). */
interface BinaryPart {
  questions: StoredQuestion[];
  rowids: number[];
}

/** The yes/no questions whose rowids lie in `range`, with their revisions, in export order. */
function readBinaryRange(db: Db, range: RowidRange, revisionCapacity: number): BinaryPart {
  const rows = db
    .prepare(
      `SELECT q.rowid, q.id, q.title, q.kind, q.closes_at, q.base_rate, q.false_alarm_cost, q.miss_cost, r.outcome, r.at,
         ${TAGS_OF_Q}
       FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id WHERE q.type = 'binary' AND q.rowid BETWEEN ? AND ?`,
    )
    .raw()
    .all(range.from, range.to) as QuestionRow[];
  if (rows.length === 0) return { questions: [], rowids: [] };
  // Each part in export order already, so putting the parts together is a merge of sorted runs.
  inExportOrder(rows, (row) => row[4], (row) => row[1]);
  const rowids = rows.map((row) => row[0]);
  const columns = columnsByQuestion(readRevisions(db, range, slotLookup(rowids), revisionCapacity), rows.length);
  const questions = rows.map(
    ([, id, title, kind, closes, baseRate, fa, miss, outcome, resolvedAt, tags], i) =>
      new StoredQuestion(
        id,
        title,
        kind,
        closes,
        baseRate,
        fa !== null && miss !== null ? { false_alarm: fa, miss } : null,
        outcome ? { outcome, at: resolvedAt! } : null,
        tagList(tags),
        columns[i],
      ),
  );
  return { questions, rowids };
}

/**
 * The parts as one list in export order (a merge: Array.prototype.sort finds each part's
 * sorted run), with their references. References name their
 * question by its rowid (found in the id index SQLite walks anyway), so no id text is made
 * per row; typed questions' rows are skipped, as no part holds their rowids.
 */
function finishBinary(db: Db, parts: readonly BinaryPart[]): ScoringQuestion[] {
  const byRowid = new Map<number, StoredQuestion>();
  const questions: StoredQuestion[] = [];
  for (const part of parts) {
    part.questions.forEach((q, i) => {
      byRowid.set(part.rowids[i]!, q);
      questions.push(q);
    });
  }
  const references = db
    .prepare('SELECT q.rowid, r.at, r.p FROM reference_forecasts r JOIN questions q ON q.id = r.question_id ORDER BY r.question_id, r.at, r.seq')
    .raw()
    .all() as [number, number, number][];
  for (const [rowid, at, p] of references) byRowid.get(rowid)?.references.push({ at, p });
  return inExportOrder(questions, byClose, byId);
}
