/**
 * Extra figures for the Scorecard screen: the per-question list, the running Brier
 * score, the ROC curve and intervals around the mean scores. Not part of `score --json`.
 */
import { LOG_CLIP_HIGH, LOG_CLIP_LOW } from './accuracy';
import { prepareScoredSet, type ScoredSet } from './counting';
import { rocCurve } from './discrimination';
import { normalMeanInterval } from './intervals';
import type { RunningBrierPoint, ScoreOptions, ScorecardDetail, ScoredQuestionRow, ScoringQuestion } from './types';

function clampInterval(iv: [number, number] | null, low: number, high: number): [number, number] | null {
  return iv === null ? null : [Math.max(low, iv[0]), Math.min(high, iv[1])];
}

/**
 * The 95 % interval around the mean final Brier score of a scored set, as the Scorecard shows
 * it (`brier_interval` below): normal approximation, clamped to [0, 1]; null with fewer than
 * two questions. Hindsight shows the same interval beside the same figure.
 */
export function brierIntervalOf(set: ScoredSet): [number, number] | null {
  const briers = new Float64Array(set.n);
  for (let i = 0; i < set.n; i++) briers[i] = (set.p[i]! - set.o[i]!) ** 2;
  return clampInterval(normalMeanInterval(briers), 0, 1);
}

/**
 * Per-question rows sorted by window end (ties by id), the cumulative mean Brier score
 * by window end (questions sharing a window end make one point), ROC curve points, and
 * 95 % normal-approximation intervals for the mean Brier and log scores (mean ± 1.96·sd/√n,
 * common practice; clamped to the score's range, [0, 1] and [0, ∞); null when fewer than
 * two questions are scored). Uses the same filters and counting rules as
 * `computeScoreReport`.
 *
 * @param questions the diary (forecasts and references in any order)
 * @param options as for `computeScoreReport`
 * @param set `prepareScoredSet(questions, options)` when the caller has it already (only read)
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeScorecardDetail(questions: readonly ScoringQuestion[], options: ScoreOptions, set: ScoredSet = prepareScoredSet(questions, options)): ScorecardDetail {
  const { n, T, p, p1, o } = set;
  const rows: ScoredQuestionRow[] = new Array(n);
  const logLoss = new Float64Array(n);
  let yes = 0;
  for (let i = 0; i < n; i++) {
    const q = set.questions[i]!;
    const c = p[i]! < LOG_CLIP_LOW ? LOG_CLIP_LOW : p[i]! > LOG_CLIP_HIGH ? LOG_CLIP_HIGH : p[i]!;
    logLoss[i] = -Math.log(o[i] === 1 ? c : 1 - c);
    yes += o[i]!;
    rows[i] = {
      id: q.id,
      title: q.title,
      tags: q.tags.slice(),
      T: T[i]!,
      p: p[i]!,
      p1: p1[i]!,
      outcome: o[i] === 1 ? 'yes' : 'no',
      brier: (p[i]! - o[i]!) ** 2,
    };
  }
  const brierInterval = brierIntervalOf(set);
  rows.sort((a, b) => a.T - b.T || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));

  const running: RunningBrierPoint[] = [];
  let sum = 0;
  for (let i = 0; i < n; i++) {
    sum += rows[i]!.brier;
    const point = { T: rows[i]!.T, brier: sum / (i + 1), n: i + 1 };
    if (running.length > 0 && running[running.length - 1]!.T === point.T) running[running.length - 1] = point;
    else running.push(point);
  }

  return {
    per_question: rows,
    running_brier: running,
    roc: n === 0 ? [] : rocCurve(p, o),
    brier_interval: brierInterval,
    log_interval: clampInterval(normalMeanInterval(logLoss), 0, Infinity),
    auc_n: { yes, no: n - yes },
  };
}
