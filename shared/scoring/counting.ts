/**
 * Which questions and forecasts count (SCORING.md "Which forecasts count"), and the
 * per-question figures every score is built from, laid out as parallel typed arrays so
 * a diary of thousands of questions is scored without per-forecast allocations.
 */
import { timeAverageUnchecked } from './accuracy';
import { assertFinite, assertPositive, assertProbability } from './validate';
import type { ScoreOptions, ScoringQuestion } from './types';

/**
 * Window end `T = min(close time, resolution time)` (SCORING.md): an event-by-deadline
 * question that happened early ends when it resolved. An open question's window ends
 * at its close.
 */
export function windowEnd(q: Pick<ScoringQuestion, 'closes_at' | 'resolution'>): number {
  assertFinite(q.closes_at, 'windowEnd: closes_at');
  if (q.resolution === null) return q.closes_at;
  assertFinite(q.resolution.at, 'windowEnd: resolution time');
  return Math.min(q.closes_at, q.resolution.at);
}

/** The scored questions and their per-question figures, index-aligned. */
export interface ScoredSet {
  counts: { scored: number; unscored: number; void: number; open: number };
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

/** Reusable buffers for one question's entries; grown on demand, never shrunk. */
class Scratch {
  at = new Float64Array(64);
  p = new Float64Array(64);
  key = new Float64Array(64);

  ensure(n: number): void {
    if (n <= this.at.length) return;
    const size = Math.max(n, this.at.length * 2);
    this.at = new Float64Array(size);
    this.p = new Float64Array(size);
    this.key = new Float64Array(size);
  }
}

const INSERTION_SORT_MAX = 64;

/**
 * Sorts the first `n` entries of (at, key, p) by time, then key (entry order), in place.
 * Already sorted input — the usual case, the store returns revisions in order — costs
 * one pass; short unsorted runs use insertion sort, long ones an index sort.
 */
function sortEntries(s: Scratch, n: number): void {
  const { at, key, p } = s;
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
      const v = p[i]!;
      let j = i - 1;
      while (j >= 0 && (at[j]! > a || (at[j] === a && key[j]! > k))) {
        at[j + 1] = at[j]!;
        key[j + 1] = key[j]!;
        p[j + 1] = p[j]!;
        j--;
      }
      at[j + 1] = a;
      key[j + 1] = k;
      p[j + 1] = v;
    }
    return;
  }
  const order = Array.from({ length: n }, (_, i) => i).sort(
    (x, y) => at[x]! - at[y]! || key[x]! - key[y]! || x - y,
  );
  const at2 = order.map((i) => at[i]!);
  const key2 = order.map((i) => key[i]!);
  const p2 = order.map((i) => p[i]!);
  for (let i = 0; i < n; i++) {
    at[i] = at2[i]!;
    key[i] = key2[i]!;
    p[i] = p2[i]!;
  }
}

/** Copies the question's forecasts at or before `end` into `own`; returns how many. */
function collectCounting(q: ScoringQuestion, end: number, own: Scratch): number {
  let count = 0;
  const cols = q.forecast_columns;
  if (cols !== undefined) {
    own.ensure(cols.end - cols.start);
    const { at, p, seq } = cols;
    for (let r = cols.start; r < cols.end; r++) {
      if (at[r]! <= end) {
        own.at[count] = at[r]!;
        own.p[count] = p[r]!;
        own.key[count] = seq[r]!;
        count++;
      }
    }
    return count;
  }
  const fs = q.forecasts;
  own.ensure(fs.length);
  for (let j = 0; j < fs.length; j++) {
    const f = fs[j]!;
    if (f.at <= end) {
      own.at[count] = f.at;
      own.p[count] = f.p;
      own.key[count] = f.seq;
      count++;
    }
  }
  return count;
}

function isProbability(p: number): boolean {
  return p >= 0 && p <= 1;
}

function describe(q: ScoringQuestion, i: number): string {
  return `question ${i} (${JSON.stringify(q.id)})`;
}

/**
 * Checks one question's fields. The cheap tests run first and a message is built only
 * for a value that fails, because this runs over every forecast of the diary.
 */
function validateQuestion(q: ScoringQuestion, i: number): void {
  if (!Number.isFinite(q.closes_at)) assertFinite(q.closes_at, `${describe(q, i)}: closes_at`);
  if (q.resolution !== null) {
    const { outcome, at } = q.resolution;
    if (outcome !== 'yes' && outcome !== 'no' && outcome !== 'void') {
      throw new RangeError(`${describe(q, i)}: outcome is ${JSON.stringify(outcome)}; use "yes", "no" or "void".`);
    }
    if (!Number.isFinite(at)) assertFinite(at, `${describe(q, i)}: resolution time`);
  }
  if (q.base_rate !== null && !isProbability(q.base_rate)) assertProbability(q.base_rate, `${describe(q, i)}: base rate`);
  if (q.costs !== null) {
    const { false_alarm, miss } = q.costs;
    if (!(false_alarm > 0 && Number.isFinite(false_alarm))) assertPositive(false_alarm, `${describe(q, i)}: false-alarm cost`);
    if (!(miss > 0 && Number.isFinite(miss))) assertPositive(miss, `${describe(q, i)}: miss cost`);
  }
  const cols = q.forecast_columns;
  if (cols !== undefined) {
    for (let r = cols.start; r < cols.end; r++) {
      const j = r - cols.start;
      if (!Number.isFinite(cols.at[r]!)) assertFinite(cols.at[r]!, `${describe(q, i)}: forecast ${j} time`);
      if (!isProbability(cols.p[r]!)) assertProbability(cols.p[r]!, `${describe(q, i)}: forecast ${j}`);
      if (!Number.isFinite(cols.seq[r]!)) assertFinite(cols.seq[r]!, `${describe(q, i)}: forecast ${j} entry order (seq)`);
    }
  } else {
    const fs = q.forecasts;
    for (let j = 0; j < fs.length; j++) {
      const f = fs[j]!;
      if (!Number.isFinite(f.at)) assertFinite(f.at, `${describe(q, i)}: forecast ${j} time`);
      if (!isProbability(f.p)) assertProbability(f.p, `${describe(q, i)}: forecast ${j}`);
      if (!Number.isFinite(f.seq)) assertFinite(f.seq, `${describe(q, i)}: forecast ${j} entry order (seq)`);
    }
  }
  const rs = q.references;
  for (let j = 0; j < rs.length; j++) {
    const r = rs[j]!;
    if (!Number.isFinite(r.at)) assertFinite(r.at, `${describe(q, i)}: reference ${j} time`);
    if (!isProbability(r.p)) assertProbability(r.p, `${describe(q, i)}: reference ${j}`);
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
  const from = options.from ?? -Infinity;
  const to = options.to ?? Infinity;
  if (options.from !== undefined) assertFinite(options.from, 'options: from');
  if (options.to !== undefined) assertFinite(options.to, 'options: to');
  if (from > to) {
    throw new RangeError(`options: from (${from}) is after to (${to}); give from ≤ to.`);
  }

  const counts = { scored: 0, unscored: 0, void: 0, open: 0 };
  const capacity = questions.length;
  const T = new Float64Array(capacity);
  const p = new Float64Array(capacity);
  const p1 = new Float64Array(capacity);
  const o = new Float64Array(capacity);
  const timeAvg = new Float64Array(capacity);
  const refOwn = new Float64Array(capacity);
  const refRef = new Float64Array(capacity);
  const scoredQuestions: ScoringQuestion[] = [];
  const own = new Scratch();
  const ref = new Scratch();

  for (let qi = 0; qi < questions.length; qi++) {
    const q = questions[qi]!;
    validateQuestion(q, qi);
    if (options.tag !== undefined && !q.tags.includes(options.tag)) continue;
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

    const count = collectCounting(q, end, own);
    if (count === 0) {
      counts.unscored++;
      continue;
    }
    sortEntries(own, count);

    const k = counts.scored++;
    const outcome = q.resolution.outcome === 'yes' ? 1 : 0;
    const t1 = own.at[0]!;
    scoredQuestions.push(q);
    T[k] = end;
    o[k] = outcome;
    p[k] = own.p[count - 1]!;
    p1[k] = own.p[0]!;
    timeAvg[k] = timeAverageUnchecked(own.at, own.p, count, outcome, t1, end);

    const rs = q.references;
    ref.ensure(rs.length);
    let rcount = 0;
    for (let j = 0; j < rs.length; j++) {
      const r = rs[j]!;
      if (r.at <= end) {
        ref.at[rcount] = r.at;
        ref.p[rcount] = r.p;
        ref.key[rcount] = j; // same time: the later reference in the list stands
        rcount++;
      }
    }
    if (rcount === 0) {
      refOwn[k] = NaN;
      refRef[k] = NaN;
    } else {
      sortEntries(ref, rcount);
      const s = Math.max(t1, ref.at[0]!);
      refOwn[k] = timeAverageUnchecked(own.at, own.p, count, outcome, s, end);
      refRef[k] = timeAverageUnchecked(ref.at, ref.p, rcount, outcome, s, end);
    }
  }

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
