/**
 * The `choice` member of `score --json` (INTERFACES.md §2) and the Scorecard's list of
 * choice questions: every figure of SCORING.md "Multiple-choice questions" over one
 * filtered diary. The counting rules are the yes/no ones (`forEachScored`).
 */
import { MAX_OPTIONS, choiceVectorProblem, optionCountProblem, optionIndexProblem } from '../choice-vector';
import { mean } from './accuracy';
import { reportBins } from './calibration';
import {
  choiceLogScoreAt,
  multiCategoryBrierAt,
  rankedProbabilityScoreAt,
  topChoiceAt,
} from './choice';
import { CONFIDENT_THRESHOLD } from './confidence';
import { forEachScored, type QuestionCounts } from './counting';
import { wilsonInterval } from './intervals';
import { skillScore } from './skill';
import type {
  ChoiceConfidentCall,
  ChoiceConfidentMiss,
  ChoiceDetail,
  ChoiceQuestionRow,
  ChoiceReport,
  ChoiceSkillScores,
  ScoreFilter,
  ScoringChoiceQuestion,
  TopChoiceSummary,
} from './types';
import { assertFinite, describeQuestion, failQuestion } from './validate';

/** Checks one choice question's fields; the messages name the question and the field. */
function validateChoiceQuestion(q: ScoringChoiceQuestion, i: number): void {
  if (!Number.isFinite(q.closes_at)) assertFinite(q.closes_at, `${describeQuestion(q, i)}: closes_at`);
  const K = q.option_count;
  const countProblem = optionCountProblem(K);
  if (countProblem !== null) failQuestion(q, i, 'option_count', countProblem);
  if (typeof q.ordered !== 'boolean') failQuestion(q, i, 'ordered', `is ${String(q.ordered)}; give true or false`);
  if (q.option_base_rates !== null) {
    const problem = choiceVectorProblem(q.option_base_rates, K);
    if (problem !== null) failQuestion(q, i, 'option_base_rates', problem);
  }
  const r = q.resolution;
  if (r !== null) {
    if (r.outcome === 'option') {
      const problem = optionIndexProblem(r.option, K);
      if (problem !== null) failQuestion(q, i, 'resolution option', problem);
    } else if (r.outcome !== 'void') {
      failQuestion(q, i, 'outcome', `is ${JSON.stringify((r as { outcome: unknown }).outcome)}; use "option" or "void"`);
    }
    if (!Number.isFinite(r.at)) assertFinite(r.at, `${describeQuestion(q, i)}: resolution time`);
  }
  const fs = q.forecasts;
  for (let j = 0; j < fs.length; j++) {
    const f = fs[j]!;
    if (!Number.isFinite(f.at)) assertFinite(f.at, `${describeQuestion(q, i)}: forecast ${j} time`);
    if (!Number.isFinite(f.seq)) assertFinite(f.seq, `${describeQuestion(q, i)}: forecast ${j} entry order (seq)`);
    const problem = choiceVectorProblem(f.probs, K);
    if (problem !== null) failQuestion(q, i, `forecast ${j} probs`, problem);
  }
}

/**
 * The scored choice questions with their final and first forecasts copied into flat
 * arrays: question i's K options are entries `offset[i] … offset[i + 1] − 1`.
 */
export interface ChoiceScoredSet {
  counts: QuestionCounts;
  n: number;
  /** The scored questions, in input order. */
  questions: ScoringChoiceQuestion[];
  /** Window end T. */
  T: Float64Array;
  offset: Int32Array;
  /** Final counting forecasts (latest; same time: entered last), flat. */
  p: Float64Array;
  /** First counting forecasts (earliest; same time: entered first), flat. */
  p1: Float64Array;
  /** Index of the option that came true. */
  outcome: Int32Array;
}

/**
 * Applies the filters and counting rules (SCORING.md "Which forecasts count", as for
 * yes/no questions) to choice questions and collects the scored ones.
 *
 * @param questions choice questions; forecasts in any order
 * @param filter tag and inclusive bounds on the window end T (epoch ms)
 * @throws RangeError naming the question and field for any invalid value
 */
export function prepareChoiceSet(questions: readonly ScoringChoiceQuestion[], filter: ScoreFilter): ChoiceScoredSet {
  // Sized before validation, so an absurd option count must not allocate: it is
  // rejected by the validation that runs before anything is written.
  let capacity = 0;
  for (const q of questions) {
    const K = q.option_count;
    capacity += Number.isInteger(K) && K >= 0 && K <= MAX_OPTIONS ? K : 0;
  }
  const T = new Float64Array(questions.length);
  const offset = new Int32Array(questions.length + 1);
  const outcome = new Int32Array(questions.length);
  const p = new Float64Array(capacity);
  const p1 = new Float64Array(capacity);
  const scored: ScoringChoiceQuestion[] = [];
  const counts = forEachScored(questions, filter, validateChoiceQuestion, (q, end, counting) => {
    const i = scored.length;
    const K = q.option_count;
    const off = offset[i]!;
    const final = q.forecasts[counting.final]!.probs;
    const first = q.forecasts[counting.first]!.probs;
    for (let k = 0; k < K; k++) {
      p[off + k] = final[k]!;
      p1[off + k] = first[k]!;
    }
    offset[i + 1] = off + K;
    T[i] = end;
    outcome[i] = (q.resolution as { option: number }).option;
    scored.push(q);
  });
  const n = scored.length;
  const size = offset[n]!;
  return {
    counts,
    n,
    questions: scored,
    T: T.subarray(0, n),
    offset: offset.subarray(0, n + 1),
    p: p.subarray(0, size),
    p1: p1.subarray(0, size),
    outcome: outcome.subarray(0, n),
  };
}

/** Per-question figures of a scored set, index-aligned with it. */
interface ChoiceScores {
  brier: Float64Array;
  brierFirst: Float64Array;
  log: Float64Array;
  /** NaN for an unordered question. */
  rps: Float64Array;
  top: Int32Array;
  topP: Float64Array;
}

function scoreChoiceSet(set: ChoiceScoredSet): ChoiceScores {
  const { n, offset, p, p1, outcome, questions } = set;
  const s: ChoiceScores = {
    brier: new Float64Array(n),
    brierFirst: new Float64Array(n),
    log: new Float64Array(n),
    rps: new Float64Array(n),
    top: new Int32Array(n),
    topP: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    const off = offset[i]!;
    const K = offset[i + 1]! - off;
    const j = outcome[i]!;
    s.brier[i] = multiCategoryBrierAt(p, off, K, j);
    s.brierFirst[i] = multiCategoryBrierAt(p1, off, K, j);
    s.log[i] = choiceLogScoreAt(p, off, j);
    s.rps[i] = questions[i]!.ordered ? rankedProbabilityScoreAt(p, off, K, j) : NaN;
    const top = topChoiceAt(p, off, K);
    s.top[i] = top;
    s.topP[i] = p[off + top]!;
  }
  return s;
}

/**
 * Skill (SCORING.md: multi-category Brier, same questions on both sides, `SS = 1 −
 * BS/BS_ref`, null when `BS_ref = 0` or no question qualifies).
 */
function choiceSkill(set: ChoiceScoredSet, s: ChoiceScores, brier: number): ChoiceSkillScores {
  const { n, offset, outcome, questions } = set;
  let uniform = 0;
  let baseN = 0;
  let baseOwn = 0;
  let baseRef = 0;
  for (let i = 0; i < n; i++) {
    const K = offset[i + 1]! - offset[i]!;
    // The uniform forecast 1/K on every option scores (1 − 1/K)² + (K − 1)/K² = 1 − 1/K.
    uniform += 1 - 1 / K;
    const b = questions[i]!.option_base_rates;
    if (b !== null) {
      baseN++;
      baseOwn += s.brier[i]!;
      baseRef += multiCategoryBrierAt(b, 0, K, outcome[i]!);
    }
  }
  return {
    vs_uniform: skillScore(brier, uniform / n),
    vs_base_rate: baseN === 0 ? null : skillScore(baseOwn / baseN, baseRef / baseN),
    vs_first: skillScore(brier, mean(s.brierFirst)),
  };
}

function topChoiceSummary(set: ChoiceScoredSet, s: ChoiceScores): TopChoiceSummary {
  const { n, outcome } = set;
  let hits = 0;
  for (let i = 0; i < n; i++) if (s.top[i] === outcome[i]) hits++;
  const [wilson_low, wilson_high] = wilsonInterval(hits, n);
  return { n, mean_confidence: mean(s.topP), hit_rate: hits / n, wilson_low, wilson_high };
}

/** One-vs-rest: every option of every scored question as a yes/no forecast (p_k, o_k). */
function optionBins(set: ChoiceScoredSet): ChoiceReport['bins'] {
  const { n, offset, p, outcome } = set;
  const o = new Float64Array(p.length);
  for (let i = 0; i < n; i++) o[offset[i]! + outcome[i]!] = 1;
  return reportBins(p, o);
}

/**
 * Confident calls at `threshold` (SCORING.md "Confident miss": the top choice had ≥ 0.8,
 * the threshold compared as stated, and did not come true; a hit when it did). Misses
 * first, then hits; within each the highest p first, ties by id in code units (not
 * locale) so the output is stable.
 */
function choiceConfidentCalls(set: ChoiceScoredSet, s: ChoiceScores, threshold: number, includeHits: boolean): ChoiceConfidentCall[] {
  const calls: ChoiceConfidentCall[] = [];
  for (let i = 0; i < set.n; i++) {
    const top = s.top[i]!;
    const p = s.topP[i]!;
    if (!(p >= threshold)) continue;
    const verdict = top === set.outcome[i] ? 'hit' : 'miss';
    if (verdict === 'hit' && !includeHits) continue;
    const q = set.questions[i]!;
    const off = set.offset[i]!;
    calls.push({
      id: q.id,
      title: q.title,
      option: top,
      p,
      outcome_option: set.outcome[i]!,
      verdict,
      outcome_p: set.p[off + set.outcome[i]!]!,
      probs: Array.from(set.p.subarray(off, set.offset[i + 1]!)),
      T: set.T[i]!,
    });
  }
  return calls.sort((a, b) => (a.verdict !== b.verdict ? (a.verdict === 'miss' ? -1 : 1) : b.p - a.p || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)));
}

/** The confident misses of `score --json`: the calls above at the threshold of INTERFACES.md, in its members. */
function choiceConfidentMisses(set: ChoiceScoredSet, s: ChoiceScores): ChoiceConfidentMiss[] {
  return choiceConfidentCalls(set, s, CONFIDENT_THRESHOLD, false).map(({ id, title, option, p, outcome_option }) => ({ id, title, option, p, outcome_option }));
}

/**
 * Hindsight's and the briefing's confident calls on choice questions: the top choice's
 * final probability at or above `threshold` and another option came true (a miss), or
 * it came true (a hit, only with `includeHits`). Same filters and counting rules as
 * `computeChoiceReport`; at the default threshold the misses are its `confident_misses`.
 *
 * @param questions choice questions (forecasts in any order)
 * @param filter tag and inclusive bounds on the window end T (epoch ms)
 * @param threshold from 0.5 to 1
 * @param includeHits also list the confident calls that came true
 * @throws RangeError for a threshold outside [0.5, 1] or any invalid question
 */
export function computeChoiceConfidentCalls(
  questions: readonly ScoringChoiceQuestion[],
  filter: ScoreFilter,
  threshold: number = CONFIDENT_THRESHOLD,
  includeHits = false,
): ChoiceConfidentCall[] {
  if (!(threshold >= 0.5 && threshold <= 1)) {
    throw new RangeError(`computeChoiceConfidentCalls: threshold is ${String(threshold)}; give a probability from 0.5 to 1, such as 0.8.`);
  }
  const set = prepareChoiceSet(questions, filter);
  return choiceConfidentCalls(set, scoreChoiceSet(set), threshold, includeHits);
}

/**
 * Computes the `choice` member of `score --json` (SCORING.md "Multiple-choice
 * questions") over the choice questions that pass the tag and window-end filters, each
 * scored question with weight 1: mean multi-category Brier, log and (ordered questions
 * only) ranked probability scores; skill vs the uniform forecast, the stated option base
 * rates and the first forecast; the top choice's confidence against its hit rate;
 * option calibration bins; confident misses.
 *
 * With no scored question every figure is null, `bins` and `confident_misses` empty and
 * `top_choice.n` 0; `rps` is null when no scored question is ordered.
 *
 * @param questions choice questions (forecasts in any order)
 * @param filter tag and inclusive bounds on the window end T (epoch ms); a `ScoreOptions`
 *   object does
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeChoiceReport(questions: readonly ScoringChoiceQuestion[], filter: ScoreFilter): ChoiceReport {
  const set = prepareChoiceSet(questions, filter);
  const { n, counts } = set;
  if (n === 0) {
    return {
      ...counts,
      brier: null,
      log_score: null,
      rps: null,
      rps_n: 0,
      skill: { vs_uniform: null, vs_base_rate: null, vs_first: null },
      top_choice: { n: 0, mean_confidence: null, hit_rate: null, wilson_low: null, wilson_high: null },
      bins: [],
      confident_misses: [],
    };
  }
  const s = scoreChoiceSet(set);
  const brier = mean(s.brier);
  let rpsN = 0;
  let rpsSum = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isNaN(s.rps[i]!)) {
      rpsN++;
      rpsSum += s.rps[i]!;
    }
  }
  return {
    ...counts,
    brier,
    log_score: mean(s.log),
    rps: rpsN === 0 ? null : rpsSum / rpsN,
    rps_n: rpsN,
    skill: choiceSkill(set, s, brier),
    top_choice: topChoiceSummary(set, s),
    bins: optionBins(set),
    confident_misses: choiceConfidentMisses(set, s),
  };
}

/**
 * The Scorecard's list of scored choice questions (not part of `score --json`): per
 * question its final and first forecasts, outcome, scores and top choice, sorted by
 * window end, ties by id. Same filters and counting rules as `computeChoiceReport`.
 *
 * @param questions choice questions (forecasts in any order)
 * @param filter as for `computeChoiceReport`
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeChoiceDetail(questions: readonly ScoringChoiceQuestion[], filter: ScoreFilter): ChoiceDetail {
  const set = prepareChoiceSet(questions, filter);
  const s = scoreChoiceSet(set);
  const rows: ChoiceQuestionRow[] = new Array(set.n);
  for (let i = 0; i < set.n; i++) {
    const q = set.questions[i]!;
    const from = set.offset[i]!;
    const to = set.offset[i + 1]!;
    rows[i] = {
      id: q.id,
      title: q.title,
      tags: q.tags.slice(),
      T: set.T[i]!,
      ordered: q.ordered,
      probs: Array.from(set.p.subarray(from, to)),
      probs_first: Array.from(set.p1.subarray(from, to)),
      outcome_option: set.outcome[i]!,
      brier: s.brier[i]!,
      log_score: s.log[i]!,
      rps: q.ordered ? s.rps[i]! : null,
      top_option: s.top[i]!,
      top_p: s.topP[i]!,
    };
  }
  rows.sort((a, b) => a.T - b.T || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return { per_question: rows };
}
