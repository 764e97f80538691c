/**
 * The scorecard: every figure of SCORING.md over one filtered diary, in the exact shape
 * of `score --json` (INTERFACES.md §2).
 */
import { brierScore, logScore, mean, shareCertain, sharpness } from './accuracy';
import { SCORECARD_BIN_EDGES, brierDecomposition, reportBins } from './calibration';
import { prepareScoredSet, type ScoredSet } from './counting';
import { CONFIDENT_THRESHOLD, confidentVerdict } from './confidence';
import { costLossDecisions, valueCurve, type CostLossCase } from './decisions';
import { rocAuc } from './discrimination';
import { calibrationFit } from './logistic';
import { skillScore } from './skill';
import type { ConfidentMiss, ScoreOptions, ScoreReport, ScoringQuestion, SkillScores } from './types';

function skillScores(set: ScoredSet, brier: number, uncertainty: number): SkillScores {
  const { n, p, p1, o, refOwn, refRef, questions } = set;
  let baseN = 0;
  let baseOwn = 0;
  let baseRef = 0;
  let refN = 0;
  let ownSum = 0;
  let refSum = 0;
  for (let i = 0; i < n; i++) {
    const b = questions[i]!.base_rate;
    if (b !== null) {
      baseN++;
      baseOwn += (p[i]! - o[i]!) ** 2;
      baseRef += (b - o[i]!) ** 2;
    }
    if (!Number.isNaN(refOwn[i]!)) {
      refN++;
      ownSum += refOwn[i]!;
      refSum += refRef[i]!;
    }
  }
  return {
    vs_base_rate: baseN === 0 ? null : skillScore(baseOwn / baseN, baseRef / baseN),
    vs_climatology: skillScore(brier, uncertainty),
    vs_even: skillScore(brier, 0.25),
    vs_first: skillScore(brier, brierScore(p1, o)),
    vs_reference: refN === 0 ? null : skillScore(ownSum / refN, refSum / refN),
  };
}

function costCases(set: ScoredSet, options: ScoreOptions): CostLossCase[] {
  const cases: CostLossCase[] = new Array(set.n);
  for (let i = 0; i < set.n; i++) {
    const q = set.questions[i]!;
    const costs = q.costs ?? options.default_costs;
    cases[i] = { p: set.p[i]!, o: set.o[i]!, false_alarm: costs.false_alarm, miss: costs.miss, base_rate: q.base_rate };
  }
  return cases;
}

/** INTERFACES.md §2: a final forecast ≥ 80 % on a No, or ≤ 20 % on a Yes, is a confident miss. */
function confidentMisses(set: ScoredSet): ConfidentMiss[] {
  const misses: ConfidentMiss[] = [];
  for (let i = 0; i < set.n; i++) {
    const p = set.p[i]!;
    const yes = set.o[i] === 1;
    if (confidentVerdict(p, set.o[i]!, CONFIDENT_THRESHOLD) === 'miss') {
      const q = set.questions[i]!;
      misses.push({ id: q.id, title: q.title, p, outcome: yes ? 'yes' : 'no' });
    }
  }
  // Worst first; equal misses in id order (code units, not locale) so output is stable.
  return misses.sort((a, b) => {
    const d = Math.abs(b.p - (b.outcome === 'yes' ? 1 : 0)) - Math.abs(a.p - (a.outcome === 'yes' ? 1 : 0));
    return d !== 0 ? d : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
  });
}

/**
 * Computes the scorecard (SCORING.md, every section but "Helpers") over the questions
 * that pass the tag and window-end filters. Each scored question has weight 1.
 *
 * Figures that need at least one scored question are null when there is none; the
 * calibration fit carries its own reason when it is not reported; H, F, Peirce, AUC and
 * skill scores are null where their definitions are (one outcome only, a perfect
 * reference). Counts and summed costs are 0 for an empty selection.
 *
 * @param questions the diary (forecasts and references in any order)
 * @param options tag filter, inclusive bounds on the window end T (epoch ms), and the
 *   diary's default costs for questions without their own
 * @param set `prepareScoredSet(questions, options)` when the caller has it already (it is
 *   only read); computed here otherwise
 * @throws RangeError naming the question and field for any invalid input
 */
export function computeScoreReport(questions: readonly ScoringQuestion[], options: ScoreOptions, set: ScoredSet = prepareScoredSet(questions, options)): ScoreReport {
  const { n, p, o, counts } = set;
  const decisions = costLossDecisions(costCases(set, options));
  const value_curve = valueCurve(p.subarray(0, n), o.subarray(0, n));
  const calibration = calibrationFit(p, o);
  const confident_misses = confidentMisses(set);
  if (n === 0) {
    return {
      ...counts,
      brier: null,
      brier_time_avg: null,
      log_score: null,
      decomposition: {
        reliability: null,
        resolution: null,
        uncertainty: null,
        within_bin_variance: null,
        within_bin_covariance: null,
      },
      bins: [],
      calibration,
      auc: null,
      sharpness: null,
      share_certain: null,
      skill: { vs_base_rate: null, vs_climatology: null, vs_even: null, vs_first: null, vs_reference: null },
      decisions,
      value_curve,
      confident_misses,
    };
  }
  const brier = brierScore(p, o);
  const decomposition = brierDecomposition(p, o, SCORECARD_BIN_EDGES);
  const bins = reportBins(p, o);
  return {
    ...counts,
    brier,
    brier_time_avg: mean(set.timeAvg),
    log_score: logScore(p, o),
    decomposition,
    bins,
    calibration,
    auc: rocAuc(p, o),
    sharpness: sharpness(p),
    share_certain: shareCertain(p),
    skill: skillScores(set, brier, decomposition.uncertainty),
    decisions,
    value_curve,
    confident_misses,
  };
}
