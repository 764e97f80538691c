/**
 * Which questions and forecasts count (SCORING.md "Which forecasts count"), for every
 * question type, and the yes/no per-question figures every yes/no score is built from,
 * laid out as parallel typed arrays so a diary of thousands of questions is scored
 * without per-forecast allocations. The choice and numeric engines use the same
 * `forEachScored`, so the rules live here once.
 */
import { timeAverageUnchecked } from './accuracy';
import { assertFinite, assertPositive, assertProbability, describeQuestion } from './validate';
import type { ForecastColumns, ScoreFilter, ScoreOptions, ScoringQuestion } from './types';

/**
 * Window end `T = min(close time, resolution time)` (SCORING.md): an event-by-deadline
 * question that happened early ends when it resolved. An open question's window ends
 * at its close.
 */
export function windowEnd(q: Pick<CountableQuestion, 'closes_at' | 'resolution'>): number {
  assertFinite(q.closes_at, 'windowEnd: closes_at');
  if (q.resolution === null) return q.closes_at;
  assertFinite(q.resolution.at, 'windowEnd: resolution time');
  return Math.min(q.closes_at, q.resolution.at);
}

/** The scored yes/no questions and their per-question figures, index-aligned. */
export interface ScoredSet {
  counts: QuestionCounts;
  /** Number of scored questions. */
  n: number;
  /** The scored questions, in input order. */
  questions: ScoringQuestion[];
  /** Window end T. */
  T: Float64Array;
  /** Final counting forecast (latest; same time: entered last). */
  p: Float64Array;
  /** First counting forecast (earliest; same time: entered first). */
  p1: Float64Array;
  /** Outcome, 1 Yes, 0 No. */
  o: Float64Array;
  /** Time-averaged squared error of the standing forecast over [t1, T]. */
  timeAvg: Float64Array;
  /**
   * For `vs_reference`: own and reference squared errors time-averaged over [s, T],
   * s = later of the first own and first reference forecast; NaN when the question
   * has no reference forecast at or before T.
   */
  refOwn: Float64Array;
  refRef: Float64Array;
}

/** What the counting rules read of a question, whatever its type. */
export interface CountableQuestion {
  tags: readonly string[];
  closes_at: number;
  /** Any outcome but 'void' means resolved and scorable. */
  resolution: { outcome: string; at: number } | null;
  forecasts: readonly { at: number; seq: number }[];
  /** When given, the revisions are read from these columns and `forecasts` is not read (yes/no loader). */
  forecast_columns?: ForecastColumns;
}

export interface QuestionCounts {
  scored: number;
  /** Resolved (not void) with no forecast at or before T. */
  unscored: number;
  void: number;
  open: number;
}

/**
 * One question's counting entries (time ≤ T), sorted by time, then entry order. `index`
 * points into the list they came from, so a caller reads any payload (a probability, a
 * vector, quantiles) without the sort having to move it. Buffers are reused from question
 * to question, grown on demand, never shrunk.
 */
export class CountingEntries {
  count = 0;
  at = new Float64Array(64);
  key = new Float64Array(64);
  index = new Float64Array(64);

  ensure(n: number): void {
    if (n <= this.at.length) return;
    const size = Math.max(n, this.at.length * 2);
    this.at = new Float64Array(size);
    this.key = new Float64Array(size);
    this.index = new Float64Array(size);
  }

  /** The final forecast: the latest counting entry (same time: entered last). */
  get final(): number {
    return this.index[this.count - 1]!;
  }

  /** The first forecast: the earliest counting entry (same time: entered first). */
  get first(): number {
    return this.index[0]!;
  }
}

const INSERTION_SORT_MAX = 64;

/**
 * Sorts the first `n` entries of (at, key, index) by time, then key (entry order), in
 * place. Already sorted input — the usual case, the store returns revisions in order —
 * costs one pass; short unsorted runs use insertion sort, long ones an index sort.
 */
function sortEntries(s: CountingEntries, n: number): void {
  const { at, key, index } = s;
  let sorted = true;
  for (let i = 1; i < n; i++) {
    if (at[i]! < at[i - 1]! || (at[i] === at[i - 1] && key[i]! < key[i - 1]!)) {
      sorted = false;
      break;
    }
  }
  if (sorted) return;
  if (n <= INSERTION_SORT_MAX) {
    for (let i = 1; i < n; i++) {
      const a = at[i]!;
      const k = key[i]!;
      const v = index[i]!;
      let j = i - 1;
      while (j >= 0 && (at[j]! > a || (at[j] === a && key[j]! > k))) {
        at[j + 1] = at[j]!;
        key[j + 1] = key[j]!;
        index[j + 1] = index[j]!;
        j--;
      }
      at[j + 1] = a;
      key[j + 1] = k;
      index[j + 1] = v;
    }
    return;
  }
  const order = Array.from({ length: n }, (_, i) => i).sort(
    (x, y) => at[x]! - at[y]! || key[x]! - key[y]! || x - y,
  );
  const at2 = order.map((i) => at[i]!);
  const key2 = order.map((i) => key[i]!);
  const index2 = order.map((i) => index[i]!);
  for (let i = 0; i < n; i++) {
    at[i] = at2[i]!;
    key[i] = key2[i]!;
    index[i] = index2[i]!;
  }
}

/**
 * Collects the entries with time ≤ `end` into `into`, sorted (SCORING.md: a forecast
 * counts only if its time is ≤ T). Same-time entries are ordered by `seq` for the user's
 * own forecasts, and by list position for entries that have no entry order
 * (references: the later one in the list stands).
 *
 * @returns the number of counting entries (also left in `into.count`)
 */
function gatherCounting(
  entries: readonly { at: number; seq?: number }[],
  end: number,
  into: CountingEntries,
  order: 'seq' | 'position',
): number {
  into.ensure(entries.length);
  let count = 0;
  for (let j = 0; j < entries.length; j++) {
    const e = entries[j]!;
    if (e.at <= end) {
      into.at[count] = e.at;
      into.key[count] = order === 'seq' ? e.seq! : j;
      into.index[count] = j;
      count++;
    }
  }
  into.count = count;
  if (count > 1) sortEntries(into, count);
  return count;
}

/**
 * `gatherCounting` for revisions given as columns (`ScoringQuestion.forecast_columns`):
 * `into.index` holds each entry's row relative to `cols.start`.
 */
function gatherCountingColumns(cols: ForecastColumns, end: number, into: CountingEntries): number {
  into.ensure(cols.end - cols.start);
  const { at, seq } = cols;
  let count = 0;
  for (let r = cols.start; r < cols.end; r++) {
    if (at[r]! <= end) {
      into.at[count] = at[r]!;
      into.key[count] = seq[r]!;
      into.index[count] = r - cols.start;
      count++;
    }
  }
  into.count = count;
  if (count > 1) sortEntries(into, count);
  return count;
}

/**
 * The counting rules of SCORING.md "Which forecasts count", once for every question type:
 * validates each question (all of them, so a bad record fails whatever the filter),
 * applies the tag and window-end filters, classifies the rest as open / void / unscored
 * (resolved with no forecast at or before T) / scored, and hands each scored question to
 * `onScored` with its window end and its counting forecasts sorted (final last, first
 * first). Forecasts later than T are never read beyond their time.
 *
 * @param questions the diary; forecasts in any order
 * @param filter tag and inclusive bounds on T (ms)
 * @param validate throws a RangeError naming the question and field
 * @param onScored called in input order; `counting` is reused, read it before returning
 * @throws RangeError for invalid bounds (from > to, non-finite) or an invalid question
 */
export function forEachScored<Q extends CountableQuestion>(
  questions: readonly Q[],
  filter: ScoreFilter,
  validate: (q: Q, i: number) => void,
  onScored: (q: Q, end: number, counting: CountingEntries) => void,
): QuestionCounts {
  const from = filter.from ?? -Infinity;
  const to = filter.to ?? Infinity;
  if (filter.from !== undefined) assertFinite(filter.from, 'options: from');
  if (filter.to !== undefined) assertFinite(filter.to, 'options: to');
  if (from > to) {
    throw new RangeError(`options: from (${from}) is after to (${to}); give from ≤ to.`);
  }
  const counts: QuestionCounts = { scored: 0, unscored: 0, void: 0, open: 0 };
  const own = new CountingEntries();
  for (let qi = 0; qi < questions.length; qi++) {
    const q = questions[qi]!;
    validate(q, qi);
    if (filter.tag !== undefined && !q.tags.includes(filter.tag)) continue;
    const end = windowEnd(q);
    if (end < from || end > to) continue;
    if (q.resolution === null) {
      counts.open++;
      continue;
    }
    if (q.resolution.outcome === 'void') {
      counts.void++;
      continue;
    }
    const cols = q.forecast_columns;
    const count = cols !== undefined ? gatherCountingColumns(cols, end, own) : gatherCounting(q.forecasts, end, own, 'seq');
    if (count === 0) {
      counts.unscored++;
      continue;
    }
    counts.scored++;
    onScored(q, end, own);
  }
  return counts;
}

function isProbability(p: number): boolean {
  return p >= 0 && p <= 1;
}

/**
 * Checks one question's fields. The cheap tests run first and a message is built only
 * for a value that fails, because this runs over every forecast of the diary.
 */
function validateQuestion(q: ScoringQuestion, i: number): void {
  if (!Number.isFinite(q.closes_at)) assertFinite(q.closes_at, `${describeQuestion(q, i)}: closes_at`);
  if (q.resolution !== null) {
    const { outcome, at } = q.resolution;
    if (outcome !== 'yes' && outcome !== 'no' && outcome !== 'void') {
      throw new RangeError(`${describeQuestion(q, i)}: outcome is ${JSON.stringify(outcome)}; use "yes", "no" or "void".`);
    }
    if (!Number.isFinite(at)) assertFinite(at, `${describeQuestion(q, i)}: resolution time`);
  }
  if (q.base_rate !== null && !isProbability(q.base_rate)) assertProbability(q.base_rate, `${describeQuestion(q, i)}: base rate`);
  if (q.costs !== null) {
    const { false_alarm, miss } = q.costs;
    if (!(false_alarm > 0 && Number.isFinite(false_alarm))) assertPositive(false_alarm, `${describeQuestion(q, i)}: false-alarm cost`);
    if (!(miss > 0 && Number.isFinite(miss))) assertPositive(miss, `${describeQuestion(q, i)}: miss cost`);
  }
  const cols = q.forecast_columns;
  if (cols !== undefined) {
    for (let r = cols.start; r < cols.end; r++) {
      const j = r - cols.start;
      if (!Number.isFinite(cols.at[r]!)) assertFinite(cols.at[r]!, `${describeQuestion(q, i)}: forecast ${j} time`);
      if (!isProbability(cols.p[r]!)) assertProbability(cols.p[r]!, `${describeQuestion(q, i)}: forecast ${j}`);
      if (!Number.isFinite(cols.seq[r]!)) assertFinite(cols.seq[r]!, `${describeQuestion(q, i)}: forecast ${j} entry order (seq)`);
    }
  } else {
    const fs = q.forecasts;
    for (let j = 0; j < fs.length; j++) {
      const f = fs[j]!;
      if (!Number.isFinite(f.at)) assertFinite(f.at, `${describeQuestion(q, i)}: forecast ${j} time`);
      if (!isProbability(f.p)) assertProbability(f.p, `${describeQuestion(q, i)}: forecast ${j}`);
      if (!Number.isFinite(f.seq)) assertFinite(f.seq, `${describeQuestion(q, i)}: forecast ${j} entry order (seq)`);
    }
  }
  const rs = q.references;
  for (let j = 0; j < rs.length; j++) {
    const r = rs[j]!;
    if (!Number.isFinite(r.at)) assertFinite(r.at, `${describeQuestion(q, i)}: reference ${j} time`);
    if (!isProbability(r.p)) assertProbability(r.p, `${describeQuestion(q, i)}: reference ${j}`);
  }
}

/**
 * Applies the tag and window-end filters, classifies every remaining question as
 * scored / unscored (resolved Yes/No with no forecast at or before T) / void / open,
 * and computes the per-question figures of the scored ones (SCORING.md "Which forecasts
 * count"). Forecasts later than T are kept by the caller but never read here.
 *
 * @param questions the diary; forecasts and references in any order
 * @param options tag, inclusive bounds on T (ms), and the default costs (checked here
 *   so a bad setting fails before any figure is produced)
 * @throws RangeError naming the question and field for any invalid value
 */
export function prepareScoredSet(questions: readonly ScoringQuestion[], options: ScoreOptions): ScoredSet {
  assertPositive(options.default_costs.false_alarm, 'options: default false-alarm cost');
  assertPositive(options.default_costs.miss, 'options: default miss cost');

  const capacity = questions.length;
  const T = new Float64Array(capacity);
  const p = new Float64Array(capacity);
  const p1 = new Float64Array(capacity);
  const o = new Float64Array(capacity);
  const timeAvg = new Float64Array(capacity);
  const refOwn = new Float64Array(capacity);
  const refRef = new Float64Array(capacity);
  const scoredQuestions: ScoringQuestion[] = [];
  const ref = new CountingEntries();
  // The sorted entries' probabilities, for the time averages.
  let ownP = new Float64Array(64);
  let refP = new Float64Array(64);

  const counts = forEachScored(questions, options, validateQuestion, (q, end, own) => {
    const count = own.count;
    if (ownP.length < count) ownP = new Float64Array(Math.max(count, ownP.length * 2));
    // Columns, when the loader gave them, are read in place: `forecasts` is not touched.
    const cols = q.forecast_columns;
    if (cols !== undefined) for (let i = 0; i < count; i++) ownP[i] = cols.p[cols.start + own.index[i]!]!;
    else {
      const fs = q.forecasts;
      for (let i = 0; i < count; i++) ownP[i] = fs[own.index[i]!]!.p;
    }

    const k = scoredQuestions.length;
    const outcome = q.resolution!.outcome === 'yes' ? 1 : 0;
    const t1 = own.at[0]!;
    scoredQuestions.push(q);
    T[k] = end;
    o[k] = outcome;
    // Sorted by time, then entry order: the final forecast is the last entry, the first the first.
    p[k] = ownP[count - 1]!;
    p1[k] = ownP[0]!;
    timeAvg[k] = timeAverageUnchecked(own.at, ownP, count, outcome, t1, end);

    const rs = q.references;
    const rcount = gatherCounting(rs, end, ref, 'position');
    if (rcount === 0) {
      refOwn[k] = NaN;
      refRef[k] = NaN;
    } else {
      if (refP.length < rcount) refP = new Float64Array(Math.max(rcount, refP.length * 2));
      for (let i = 0; i < rcount; i++) refP[i] = rs[ref.index[i]!]!.p;
      const s = Math.max(t1, ref.at[0]!);
      refOwn[k] = timeAverageUnchecked(own.at, ownP, count, outcome, s, end);
      refRef[k] = timeAverageUnchecked(ref.at, refP, rcount, outcome, s, end);
    }
  });

  const n = counts.scored;
  return {
    counts,
    n,
    questions: scoredQuestions,
    T: T.subarray(0, n),
    p: p.subarray(0, n),
    p1: p1.subarray(0, n),
    o: o.subarray(0, n),
    timeAvg: timeAvg.subarray(0, n),
    refOwn: refOwn.subarray(0, n),
    refRef: refRef.subarray(0, n),
  };
}
