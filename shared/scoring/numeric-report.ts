/**
 * The `numeric` member of `score --json` (INTERFACES.md §2) and the Scorecard's list of
 * numeric questions: every figure of SCORING.md "Numeric questions" over one filtered
 * diary. The counting rules are the yes/no ones (`forEachScored`).
 */
import { ALLOWED_QUANTILE_LEVELS, quantileLevelsProblem, quantilesProblem } from '../quantile-levels';
import { forEachScored, type QuestionCounts } from './counting';
import { wilsonInterval } from './intervals';
import {
  centralIntervalsUnchecked,
  intervalScoreAt,
  landedGapAt,
  nominalLevel,
  weightedIntervalScoreAt,
  type CentralInterval,
} from './quantile';
import type {
  CoverageRow,
  LandedSet,
  NumericDetail,
  NumericQuestionRow,
  NumericQuestionScore,
  NumericReport,
  QuantileCalibrationRow,
  ScoreFilter,
  ScoringNumericQuestion,
  Surprise,
  SurpriseDetail,
} from './types';
import { assertFinite, describeQuestion, failQuestion } from './validate';

const byId = (a: { id: string }, b: { id: string }): number => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

/** A date is a whole number of days since 1970-01-01; anything else is a conversion bug. */
function wholeDaysProblem(values: ArrayLike<number>): string | null {
  for (let k = 0; k < values.length; k++) {
    if (!Number.isInteger(values[k]!)) {
      return `entry ${k} is ${String(values[k])}; a date question takes whole days since 1970-01-01`;
    }
  }
  return null;
}

/** Checks one numeric question's fields; the messages name the question and the field. */
function validateNumericQuestion(q: ScoringNumericQuestion, i: number): void {
  if (!Number.isFinite(q.closes_at)) assertFinite(q.closes_at, `${describeQuestion(q, i)}: closes_at`);
  if (typeof q.unit !== 'string') failQuestion(q, i, 'unit', `is ${String(q.unit)}; give text (it may be empty)`);
  if (q.value_kind !== 'number' && q.value_kind !== 'date') {
    failQuestion(q, i, 'value_kind', `is ${JSON.stringify(q.value_kind)}; use "number" or "date"`);
  }
  const date = q.value_kind === 'date';
  const levelsProblem = quantileLevelsProblem(q.levels);
  if (levelsProblem !== null) failQuestion(q, i, 'levels', levelsProblem);
  const r = q.resolution;
  if (r !== null) {
    if (r.outcome === 'value') {
      if (!Number.isFinite(r.value)) failQuestion(q, i, 'resolution value', `is ${String(r.value)}; give a finite number`);
      if (date && !Number.isInteger(r.value)) {
        failQuestion(q, i, 'resolution value', `is ${r.value}; a date question takes whole days since 1970-01-01`);
      }
    } else if (r.outcome !== 'void') {
      failQuestion(q, i, 'outcome', `is ${JSON.stringify((r as { outcome: unknown }).outcome)}; use "value" or "void"`);
    }
    if (!Number.isFinite(r.at)) assertFinite(r.at, `${describeQuestion(q, i)}: resolution time`);
  }
  const m = q.levels.length;
  const fs = q.forecasts;
  for (let j = 0; j < fs.length; j++) {
    const f = fs[j]!;
    if (!Number.isFinite(f.at)) assertFinite(f.at, `${describeQuestion(q, i)}: forecast ${j} time`);
    if (!Number.isFinite(f.seq)) assertFinite(f.seq, `${describeQuestion(q, i)}: forecast ${j} entry order (seq)`);
    const problem = quantilesProblem(f.quantiles, m) ?? (date ? wholeDaysProblem(f.quantiles) : null);
    if (problem !== null) failQuestion(q, i, `forecast ${j} quantiles`, problem);
  }
}

/**
 * The scored numeric questions with their final and first forecasts copied into flat
 * arrays: question i's quantiles are entries `offset[i] … offset[i + 1] − 1`, in the
 * order of its levels.
 */
export interface NumericScoredSet {
  counts: QuestionCounts;
  n: number;
  /** The scored questions, in input order. */
  questions: ScoringNumericQuestion[];
  /** Window end T. */
  T: Float64Array;
  offset: Int32Array;
  /** Final counting forecasts (latest; same time: entered last), flat. */
  q: Float64Array;
  /** First counting forecasts (earliest; same time: entered first), flat. */
  q1: Float64Array;
  /** The outcome y. */
  y: Float64Array;
}

/**
 * Applies the filters and counting rules (SCORING.md "Which forecasts count", as for
 * yes/no questions) to numeric questions and collects the scored ones.
 *
 * @param questions numeric questions; forecasts in any order
 * @param filter tag and inclusive bounds on the window end T (epoch ms)
 * @throws RangeError naming the question and field for any invalid value
 */
export function prepareNumericSet(questions: readonly ScoringNumericQuestion[], filter: ScoreFilter): NumericScoredSet {
  // Sized before validation; an over-long level list is rejected before anything is written.
  let capacity = 0;
  for (const question of questions) capacity += Math.min(question.levels.length, ALLOWED_QUANTILE_LEVELS.length);
  const T = new Float64Array(questions.length);
  const offset = new Int32Array(questions.length + 1);
  const y = new Float64Array(questions.length);
  const q = new Float64Array(capacity);
  const q1 = new Float64Array(capacity);
  const scored: ScoringNumericQuestion[] = [];
  const counts = forEachScored(questions, filter, validateNumericQuestion, (question, end, counting) => {
    const i = scored.length;
    const m = question.levels.length;
    const off = offset[i]!;
    const final = question.forecasts[counting.final]!.quantiles;
    const first = question.forecasts[counting.first]!.quantiles;
    for (let k = 0; k < m; k++) {
      q[off + k] = final[k]!;
      q1[off + k] = first[k]!;
    }
    offset[i + 1] = off + m;
    T[i] = end;
    y[i] = (question.resolution as { value: number }).value;
    scored.push(question);
  });
  const n = scored.length;
  const size = offset[n]!;
  return {
    counts,
    n,
    questions: scored,
    T: T.subarray(0, n),
    offset: offset.subarray(0, n + 1),
    q: q.subarray(0, size),
    q1: q1.subarray(0, size),
    y: y.subarray(0, n),
  };
}

/** Per-question figures of a scored set, index-aligned with it. */
interface NumericScores {
  /** Central intervals of each question's level set, widest first (shared per level set). */
  intervals: CentralInterval[][];
  wis: Float64Array;
  wisFirst: Float64Array;
  /** Interval score of the widest central interval; NaN with the median only. */
  intervalScore: Float64Array;
  /** Gap of "where outcomes landed". */
  gap: Int32Array;
}

function scoreNumericSet(set: NumericScoredSet): NumericScores {
  const { n, offset, q, q1, y, questions } = set;
  const byLevels = new Map<string, CentralInterval[]>();
  const s: NumericScores = {
    intervals: new Array<CentralInterval[]>(n),
    wis: new Float64Array(n),
    wisFirst: new Float64Array(n),
    intervalScore: new Float64Array(n),
    gap: new Int32Array(n),
  };
  for (let i = 0; i < n; i++) {
    const levels = questions[i]!.levels;
    const key = levels.join(',');
    let intervals = byLevels.get(key);
    if (intervals === undefined) {
      intervals = centralIntervalsUnchecked(levels);
      byLevels.set(key, intervals);
    }
    const off = offset[i]!;
    s.intervals[i] = intervals;
    s.wis[i] = weightedIntervalScoreAt(q, off, levels, y[i]!);
    s.wisFirst[i] = weightedIntervalScoreAt(q1, off, levels, y[i]!);
    s.intervalScore[i] = intervals.length === 0 ? NaN : intervalScoreAt(q, off, intervals[0]!, y[i]!);
    s.gap[i] = landedGapAt(q, off, levels.length, y[i]!);
  }
  return s;
}

/** A share with its Wilson 95 % interval (Wilson 1927). */
function share(successes: number, n: number): { rate: number; wilson_low: number; wilson_high: number } {
  const [wilson_low, wilson_high] = wilsonInterval(successes, n);
  return { rate: successes / n, wilson_low, wilson_high };
}

/** Coverage per nominal central level: the share of questions with l ≤ y ≤ u, sorted by level. */
function coverage(set: NumericScoredSet, s: NumericScores): CoverageRow[] {
  const tally = new Map<number, { n: number; inside: number }>();
  for (let i = 0; i < set.n; i++) {
    const off = set.offset[i]!;
    const y = set.y[i]!;
    for (const c of s.intervals[i]!) {
      const t = tally.get(c.level) ?? { n: 0, inside: 0 };
      t.n++;
      if (set.q[off + c.lower]! <= y && y <= set.q[off + c.upper]!) t.inside++;
      tally.set(c.level, t);
    }
  }
  return [...tally.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([level, t]) => ({ level, n: t.n, inside: t.inside, ...share(t.inside, t.n) }));
}

/**
 * Quantile calibration per declared τ: the share of questions with y ≤ q_τ, sorted by τ.
 * Declared levels are exact two-decimal values (shared/quantile-levels.ts), so τ is
 * reported as declared.
 */
function quantileCalibration(set: NumericScoredSet): QuantileCalibrationRow[] {
  const tally = new Map<number, { n: number; below: number }>();
  for (let i = 0; i < set.n; i++) {
    const off = set.offset[i]!;
    const levels = set.questions[i]!.levels;
    for (let k = 0; k < levels.length; k++) {
      const t = tally.get(levels[k]!) ?? { n: 0, below: 0 };
      t.n++;
      if (set.y[i]! <= set.q[off + k]!) t.below++;
      tally.set(levels[k]!, t);
    }
  }
  return [...tally.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([tau, t]) => ({ tau, n: t.n, below: t.below, ...share(t.below, t.n) }));
}

function compareLevelSets(a: readonly number[], b: readonly number[]): number {
  for (let k = 0; k < Math.min(a.length, b.length); k++) if (a[k] !== b[k]) return a[k]! - b[k]!;
  return a.length - b.length;
}

/**
 * Where outcomes landed, per level set (sorted lexicographically by its levels): the
 * count in each gap beside the expected share, the level difference across the gap
 * (τ_1 below the lowest, τ_k − τ_{k−1} between, 1 − τ_m above), rounded to two decimals.
 */
function landed(set: NumericScoredSet, s: NumericScores): LandedSet[] {
  const sets = new Map<string, { levels: readonly number[]; counts: number[] }>();
  for (let i = 0; i < set.n; i++) {
    const levels = set.questions[i]!.levels;
    const key = levels.join(',');
    let entry = sets.get(key);
    if (entry === undefined) {
      entry = { levels, counts: new Array<number>(levels.length + 1).fill(0) };
      sets.set(key, entry);
    }
    entry.counts[s.gap[i]!]!++;
  }
  return [...sets.values()]
    .sort((a, b) => compareLevelSets(a.levels, b.levels))
    .map(({ levels, counts }) => ({
      levels: levels.slice(),
      gaps: counts.map((n, k) => ({
        n,
        expected: nominalLevel(k === 0 ? 0 : levels[k - 1]!, k === levels.length ? 1 : levels[k]!),
      })),
    }));
}

/**
 * `exp(mean ln(WIS_final / WIS_first))` over questions where both are > 0 (the geometric
 * mean of ratios, Cramer et al. 2022, PNAS 119(15):e2113561119); null when none qualify.
 */
function relativeWisVsFirst(s: NumericScores): number | null {
  let count = 0;
  let sumLog = 0;
  for (let i = 0; i < s.wis.length; i++) {
    const ratio = s.wis[i]! / s.wisFirst[i]!;
    // Values near the ends of the double range (a file may hold any finite number) can make
    // a WIS overflow to Infinity; such a question has no ratio (Infinity / Infinity is NaN,
    // and one NaN would make the whole figure NaN), so it is left out like a WIS of 0.
    if (s.wis[i]! > 0 && s.wisFirst[i]! > 0 && Number.isFinite(ratio) && ratio > 0) {
      count++;
      sumLog += Math.log(ratio);
    }
  }
  return count === 0 ? null : Math.exp(sumLog / count);
}

/**
 * Surprises (SCORING.md): the outcome fell outside the widest central interval; size =
 * distance outside / width, null for a zero-width interval. Zero-width ones first, then
 * largest size; ties by id in code units so the output is stable. `extra` adds fields to
 * each (Hindsight's details) from the question's index in the set.
 */
function collectSurprises<S extends Surprise>(set: NumericScoredSet, s: NumericScores, extra: (i: number, surprise: Surprise) => S): S[] {
  const out: S[] = [];
  for (let i = 0; i < set.n; i++) {
    const c = s.intervals[i]![0];
    if (c === undefined) continue;
    const off = set.offset[i]!;
    const low = set.q[off + c.lower]!;
    const high = set.q[off + c.upper]!;
    const y = set.y[i]!;
    if (y >= low && y <= high) continue;
    const q = set.questions[i]!;
    const surprise: Surprise = { id: q.id, title: q.title, value: y, low, high, level: c.level, size: surpriseSize(y, low, high) };
    out.push(extra(i, surprise));
  }
  return out.sort((a, b) => {
    if (a.size === null || b.size === null) {
      if (a.size !== b.size) return a.size === null ? -1 : 1;
      return byId(a, b);
    }
    return b.size - a.size || byId(a, b);
  });
}

/**
 * A surprise's size, distance outside ÷ width; null for a zero-width range. Near the ends of
 * the double range (a file may hold any finite number) either difference can overflow: a
 * width of 2e308 made the size 0, a surprise sized as none. A difference overflows only when
 * both its operands are above about 1e292, far from the subnormals, so halving each is exact
 * and leaves the ratio as it is.
 */
function surpriseSize(y: number, low: number, high: number): number | null {
  const width = high - low;
  if (width === 0) return null;
  const distance = y < low ? low - y : y - high;
  if (Number.isFinite(width) && Number.isFinite(distance)) return distance / width;
  return (y < low ? low / 2 - y / 2 : y / 2 - high / 2) / (high / 2 - low / 2);
}

/** The surprises of `score --json`, in its members. */
function surprises(set: NumericScoredSet, s: NumericScores): Surprise[] {
  return collectSurprises(set, s, (_, surprise) => surprise);
}

/**
 * Hindsight's and the briefing's numeric surprises: the `surprises` of
 * `computeNumericReport` (same filters, counting rules and order) with how far outside
 * the range each outcome fell, in the question's unit, and the final forecast's values.
 *
 * @param questions numeric questions (forecasts in any order)
 * @param filter tag and inclusive bounds on the window end T (epoch ms)
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeNumericSurprises(questions: readonly ScoringNumericQuestion[], filter: ScoreFilter): SurpriseDetail[] {
  const set = prepareNumericSet(questions, filter);
  return collectSurprises(set, scoreNumericSet(set), (i, surprise): SurpriseDetail => {
    const below = surprise.value < surprise.low;
    return {
      ...surprise,
      distance: below ? surprise.low - surprise.value : surprise.value - surprise.high,
      side: below ? 'below' : 'above',
      quantiles: Array.from(set.q.subarray(set.offset[i]!, set.offset[i + 1]!)),
      T: set.T[i]!,
    };
  });
}

/**
 * Computes the `numeric` member of `score --json` (SCORING.md "Numeric questions") over
 * the numeric questions that pass the tag and window-end filters: coverage per central
 * level and quantile calibration per τ (with Wilson intervals), where outcomes landed
 * per level set, relative WIS vs the first forecast, each question's WIS and interval
 * score (in its own unit, so never averaged), and the surprises.
 *
 * With no scored question the lists are empty and `relative_wis_vs_first` is null.
 *
 * @param questions numeric questions (forecasts in any order)
 * @param filter tag and inclusive bounds on the window end T (epoch ms); a `ScoreOptions`
 *   object does
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeNumericReport(questions: readonly ScoringNumericQuestion[], filter: ScoreFilter): NumericReport {
  const set = prepareNumericSet(questions, filter);
  const s = scoreNumericSet(set);
  const rows: NumericQuestionScore[] = new Array(set.n);
  for (let i = 0; i < set.n; i++) {
    const c = s.intervals[i]![0];
    rows[i] = {
      id: set.questions[i]!.id,
      wis: s.wis[i]!,
      interval_score: c === undefined ? null : s.intervalScore[i]!,
      interval_level: c === undefined ? null : c.level,
    };
  }
  return {
    ...set.counts,
    coverage: coverage(set, s),
    quantile_calibration: quantileCalibration(set),
    landed: landed(set, s),
    relative_wis_vs_first: relativeWisVsFirst(s),
    questions: rows.sort(byId),
    surprises: surprises(set, s),
  };
}

/**
 * The Scorecard's list of scored numeric questions (not part of `score --json`): per
 * question its unit, levels, final and first quantiles, outcome, WIS of both forecasts,
 * interval score and landed gap, sorted by window end, ties by id. Same filters and
 * counting rules as `computeNumericReport`.
 *
 * @param questions numeric questions (forecasts in any order)
 * @param filter as for `computeNumericReport`
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeNumericDetail(questions: readonly ScoringNumericQuestion[], filter: ScoreFilter): NumericDetail {
  const set = prepareNumericSet(questions, filter);
  const s = scoreNumericSet(set);
  const rows: NumericQuestionRow[] = new Array(set.n);
  for (let i = 0; i < set.n; i++) {
    const q = set.questions[i]!;
    const from = set.offset[i]!;
    const to = set.offset[i + 1]!;
    const c = s.intervals[i]![0];
    rows[i] = {
      id: q.id,
      title: q.title,
      tags: q.tags.slice(),
      T: set.T[i]!,
      unit: q.unit,
      value_kind: q.value_kind,
      levels: q.levels.slice(),
      quantiles: Array.from(set.q.subarray(from, to)),
      quantiles_first: Array.from(set.q1.subarray(from, to)),
      value: set.y[i]!,
      wis: s.wis[i]!,
      wis_first: s.wisFirst[i]!,
      interval_score: c === undefined ? null : s.intervalScore[i]!,
      interval_level: c === undefined ? null : c.level,
      gap: s.gap[i]!,
    };
  }
  rows.sort((a, b) => a.T - b.T || byId(a, b));
  return { per_question: rows };
}
