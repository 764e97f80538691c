/**
 * The scoring engine: pure functions, no I/O, no dependencies. SCORING.md is the
 * normative definition of every figure; each function cites its source.
 */
export type * from './types';
export { computeScoreReport } from './report';
export { CONFIDENT_THRESHOLD, confidentVerdict } from './confidence';
export { brierIntervalOf, computeScorecardDetail } from './detail';
export {
  forEachScored,
  prepareScoredSet,
  windowEnd,
  type CountableQuestion,
  type CountingEntries,
  type QuestionCounts,
  type ScoredSet,
} from './counting';
export { choiceLogScore, multiCategoryBrier, rankedProbabilityScore, topChoice } from './choice';
export { computeChoiceConfidentCalls, computeChoiceDetail, computeChoiceReport, prepareChoiceSet, type ChoiceScoredSet } from './choice-report';
export {
  centralIntervals,
  intervalScore,
  landedGap,
  nominalLevel,
  quantileScore,
  weightedIntervalScore,
  type CentralInterval,
} from './quantile';
export { computeNumericDetail, computeNumericReport, computeNumericSurprises, prepareNumericSet, type NumericScoredSet } from './numeric-report';
export {
  LOG_CLIP_HIGH,
  LOG_CLIP_LOW,
  brierScore,
  clipProbability,
  logScore,
  shareCertain,
  sharpness,
  timeAveragedSquaredError,
} from './accuracy';
export {
  SCORECARD_BIN_EDGES,
  binIndex,
  brierDecomposition,
  calibrationBins,
  reportBins,
  type BrierDecomposition,
  type CalibrationBin,
} from './calibration';
export { MIN_CALIBRATION_N, calibrationFit } from './logistic';
export { rocAuc, rocCurve } from './discrimination';
export { skillScore } from './skill';
export {
  VALUE_CURVE_ALPHAS,
  costLossDecisions,
  costLossThreshold,
  falseAlarmRate,
  hitRate,
  peirceSkillScore,
  relativeValue,
  valueCurve,
  type ContingencyTable,
  type CostLossCase,
} from './decisions';
export { Z95, normalMeanInterval, wilsonInterval } from './intervals';
// Forecasting helpers (rule of succession, Jeffreys, hazard, glide path, pooling) live
// in their own module; re-exported so callers have one entry point.
export * from './helpers';
