/**
 * Input and output shapes of the scoring engine.
 *
 * The service maps store rows into `ScoringQuestion` (yes/no), `ScoringChoiceQuestion`
 * and `ScoringNumericQuestion`; times are epoch milliseconds so the engine never parses
 * dates. `ScoreReport` is exactly the `score --json` object of INTERFACES.md §2, and
 * `ChoiceReport` / `NumericReport` its `choice` and `numeric` members (snake_case keys,
 * every key present, `null` for undefined figures).
 */

/** One revision of the user's own probability. */
export interface ScoringForecast {
  at: number;
  p: number;
  /** Entry order: with the same `at`, the larger `seq` was entered later. */
  seq: number;
}

/** A probability from an outside source, for the `vs_reference` skill score. */
export interface ScoringReference {
  at: number;
  p: number;
}

export interface ScoringQuestion {
  id: string;
  title: string;
  tags: string[];
  kind: 'event_by_deadline' | 'state_at_deadline';
  closes_at: number;
  resolution: { outcome: 'yes' | 'no' | 'void'; at: number } | null;
  base_rate: number | null;
  costs: { false_alarm: number; miss: number } | null;
  /** Any order. */
  forecasts: ScoringForecast[];
  /**
   * Optional: the same revisions as `forecasts`, as columns. A loader reading a large diary
   * sets it so that no object is made per revision; the engine then reads these rows and
   * never touches `forecasts`. Whoever replaces `forecasts` must drop this.
   */
  forecast_columns?: ForecastColumns;
  /** Any order; two references at the same time: the later one in this array stands. */
  references: ScoringReference[];
}

/** Rows `start` (inclusive) to `end` (exclusive) of parallel arrays, any order, as in `ScoringForecast`. */
export interface ForecastColumns {
  at: Float64Array;
  p: Float64Array;
  seq: Float64Array;
  start: number;
  end: number;
}

/** Which questions a report covers; the same for every question type. */
export interface ScoreFilter {
  /** Keep only questions carrying this tag. */
  tag?: string;
  /** Inclusive lower bound on the window end T (ms). */
  from?: number;
  /** Inclusive upper bound on the window end T (ms). */
  to?: number;
}

export interface ScoreOptions extends ScoreFilter {
  /** Costs for questions that have none of their own. */
  default_costs: { false_alarm: number; miss: number };
}

export interface Decomposition {
  reliability: number | null;
  resolution: number | null;
  uncertainty: number | null;
  within_bin_variance: number | null;
  within_bin_covariance: number | null;
}

export interface ReportBin {
  index: number;
  n: number;
  mean_p: number;
  observed: number;
  wilson_low: number;
  wilson_high: number;
}

export interface CalibrationFit {
  intercept: number | null;
  slope: number | null;
  /** Plain-English reason when intercept and slope are null; otherwise null. */
  reason: string | null;
}

export interface SkillScores {
  vs_base_rate: number | null;
  vs_climatology: number | null;
  vs_even: number | null;
  vs_first: number | null;
  vs_reference: number | null;
}

export interface DecisionSummary {
  hits: number;
  false_alarms: number;
  misses: number;
  correct_rejections: number;
  hit_rate: number | null;
  false_alarm_rate: number | null;
  peirce: number | null;
  /** Summed costs; null when a total is larger than a double holds (about 1.8e308). */
  cost: number | null;
  cost_base_rate: number | null;
  cost_always: number | null;
  cost_never: number | null;
}

export interface ValuePoint {
  alpha: number;
  value: number | null;
}

export interface ConfidentMiss {
  id: string;
  title: string;
  p: number;
  outcome: 'yes' | 'no';
}

/** The `score --json` object (INTERFACES.md §2). */
export interface ScoreReport {
  scored: number;
  unscored: number;
  void: number;
  open: number;
  brier: number | null;
  brier_time_avg: number | null;
  log_score: number | null;
  decomposition: Decomposition;
  bins: ReportBin[];
  calibration: CalibrationFit;
  auc: number | null;
  sharpness: number | null;
  share_certain: number | null;
  skill: SkillScores;
  decisions: DecisionSummary;
  value_curve: ValuePoint[];
  confident_misses: ConfidentMiss[];
}

/** One scored question as the Scorecard screen lists it. */
export interface ScoredQuestionRow {
  id: string;
  title: string;
  tags: string[];
  /** Window end, epoch ms. */
  T: number;
  /** Final counting forecast. */
  p: number;
  /** First counting forecast. */
  p1: number;
  outcome: 'yes' | 'no';
  /** (p − o)². */
  brier: number;
}

export interface RunningBrierPoint {
  /** Window end, epoch ms; questions sharing a window end make one point. */
  T: number;
  /** Mean Brier score of the questions whose window ended at or before T. */
  brier: number;
  n: number;
}

export interface RocPoint {
  fpr: number;
  tpr: number;
}

/** Extra figures for the Scorecard screen (not part of the CLI JSON). */
export interface ScorecardDetail {
  per_question: ScoredQuestionRow[];
  running_brier: RunningBrierPoint[];
  /** Empty when either outcome is absent. */
  roc: RocPoint[];
  brier_interval: [number, number] | null;
  log_interval: [number, number] | null;
  /** How many Yes and No questions the AUC compares. */
  auc_n: { yes: number; no: number };
}

// ---------------------------------------------------------------------------------------
// Multiple-choice questions (SCORING.md "Multiple-choice questions").

/** One revision of the user's probabilities over a choice question's options. */
export interface ScoringChoiceForecast {
  at: number;
  /** One probability per option, in option order, summing to 1 within 1e-6. */
  probs: readonly number[] | Float64Array;
  /** Entry order: with the same `at`, the larger `seq` was entered later. */
  seq: number;
}

export interface ScoringChoiceQuestion {
  id: string;
  title: string;
  tags: string[];
  closes_at: number;
  /** `option` is the 0-based index of the option that came true. */
  resolution: { outcome: 'option'; option: number; at: number } | { outcome: 'void'; at: number } | null;
  /** Number of options K, 2 to 12 (labels are the service's business). */
  option_count: number;
  /** Ordered categories (e.g. ranges of a quantity): scored by the RPS as well. */
  ordered: boolean;
  /** One stated base rate per option, summing to 1 within 1e-6; null when not stated. */
  option_base_rates: readonly number[] | Float64Array | null;
  /** Any order. */
  forecasts: ScoringChoiceForecast[];
}

export interface ChoiceSkillScores {
  vs_uniform: number | null;
  vs_base_rate: number | null;
  vs_first: number | null;
}

export interface TopChoiceSummary {
  /** Number of scored questions. */
  n: number;
  /** Mean of the top choices' final probabilities. */
  mean_confidence: number | null;
  /** Share of questions whose top choice came true. */
  hit_rate: number | null;
  wilson_low: number | null;
  wilson_high: number | null;
}

export interface ChoiceConfidentMiss {
  id: string;
  title: string;
  /** The top choice (0-based). */
  option: number;
  /** Its final probability. */
  p: number;
  /** The option that came true (0-based). */
  outcome_option: number;
}

/**
 * A confident call on a choice question at a chosen threshold, for Hindsight and the
 * briefing (not part of the CLI JSON): a miss when the top choice did not come true, a
 * hit when it did.
 */
export interface ChoiceConfidentCall extends ChoiceConfidentMiss {
  verdict: 'miss' | 'hit';
  /** The final probability of the option that came true. */
  outcome_p: number;
  /** The final counting forecast, one probability per option. */
  probs: number[];
  /** Window end T, epoch ms. */
  T: number;
}

/** The `choice` member of `score --json` (INTERFACES.md §2). */
export interface ChoiceReport {
  scored: number;
  unscored: number;
  void: number;
  open: number;
  brier: number | null;
  log_score: number | null;
  rps: number | null;
  /** Number of scored ordered questions the RPS averages over. */
  rps_n: number;
  skill: ChoiceSkillScores;
  top_choice: TopChoiceSummary;
  /** Option calibration: every option of every scored question as a yes/no forecast. */
  bins: ReportBin[];
  confident_misses: ChoiceConfidentMiss[];
}

/** One scored choice question as the Scorecard lists it (not part of the CLI JSON). */
export interface ChoiceQuestionRow {
  id: string;
  title: string;
  tags: string[];
  /** Window end, epoch ms. */
  T: number;
  ordered: boolean;
  /** Final counting forecast. */
  probs: number[];
  /** First counting forecast. */
  probs_first: number[];
  outcome_option: number;
  /** Multi-category Brier score Σ (p_k − o_k)², in [0, 2]. */
  brier: number;
  /** −ln max(p_j, 0.001). */
  log_score: number;
  /** Ranked probability score; null for an unordered question. */
  rps: number | null;
  top_option: number;
  top_p: number;
}

export interface ChoiceDetail {
  /** Sorted by window end, ties by id. */
  per_question: ChoiceQuestionRow[];
}

// ---------------------------------------------------------------------------------------
// Numeric questions (SCORING.md "Numeric questions").

/** One revision of the user's quantiles for a numeric question. */
export interface ScoringNumericForecast {
  at: number;
  /** One value per level of the question, non-decreasing; dates in days since 1970-01-01. */
  quantiles: readonly number[] | Float64Array;
  /** Entry order: with the same `at`, the larger `seq` was entered later. */
  seq: number;
}

export interface ScoringNumericQuestion {
  id: string;
  title: string;
  tags: string[];
  closes_at: number;
  /** `value` is the outcome y; for a date, whole days since 1970-01-01. */
  resolution: { outcome: 'value'; value: number; at: number } | { outcome: 'void'; at: number } | null;
  /** Shown beside values and scores, e.g. "weeks"; may be empty. */
  unit: string;
  /** 'date': values are whole days since 1970-01-01 (the service converts), scores in days. */
  value_kind: 'number' | 'date';
  /** Quantile levels, ascending (shared/quantile-levels.ts). */
  levels: readonly number[];
  /** Any order. */
  forecasts: ScoringNumericForecast[];
}

export interface CoverageRow {
  /** Nominal central level, upper τ − lower τ rounded to two decimals (0.8 for {0.1, 0.9}). */
  level: number;
  /** Scored questions with an interval at this level. */
  n: number;
  /** Of those, how many had l ≤ y ≤ u. */
  inside: number;
  rate: number;
  wilson_low: number;
  wilson_high: number;
}

export interface QuantileCalibrationRow {
  tau: number;
  /** Scored questions with this level. */
  n: number;
  /** Of those, how many had y ≤ q_τ. */
  below: number;
  rate: number;
  wilson_low: number;
  wilson_high: number;
}

export interface LandedGap {
  /** Outcomes in this gap (an outcome equal to a quantile counts in the gap below it). */
  n: number;
  /** Expected share: the level difference across the gap, rounded to two decimals. */
  expected: number;
}

export interface LandedSet {
  levels: number[];
  /** Below the lowest quantile, between consecutive quantiles, above the highest. */
  gaps: LandedGap[];
}

export interface NumericQuestionScore {
  id: string;
  /** Weighted interval score, in the question's unit (days for dates). */
  wis: number;
  /** Interval score of the widest central interval; null with the median only. */
  interval_score: number | null;
  /** That interval's nominal level; null with the median only. */
  interval_level: number | null;
}

export interface Surprise {
  id: string;
  title: string;
  /** The outcome y. */
  value: number;
  /** The widest central interval [low, high] of the final forecast. */
  low: number;
  high: number;
  level: number;
  /** Distance outside the interval divided by its width; null for a zero-width interval. */
  size: number | null;
}

/**
 * A surprise with what Hindsight and the briefing show beside it (not part of the CLI
 * JSON): how far outside the range the outcome fell, in the question's unit (days for a
 * date), on which side, and the final forecast's values.
 */
export interface SurpriseDetail extends Surprise {
  /** y − high above the range, low − y below it; always > 0. */
  distance: number;
  side: 'below' | 'above';
  /** The final counting forecast, one value per level. */
  quantiles: number[];
  /** Window end T, epoch ms. */
  T: number;
}

/** The `numeric` member of `score --json` (INTERFACES.md §2). */
export interface NumericReport {
  scored: number;
  unscored: number;
  void: number;
  open: number;
  coverage: CoverageRow[];
  quantile_calibration: QuantileCalibrationRow[];
  landed: LandedSet[];
  relative_wis_vs_first: number | null;
  questions: NumericQuestionScore[];
  surprises: Surprise[];
}

/** One scored numeric question as the Scorecard lists it (not part of the CLI JSON). */
export interface NumericQuestionRow {
  id: string;
  title: string;
  tags: string[];
  /** Window end, epoch ms. */
  T: number;
  unit: string;
  value_kind: 'number' | 'date';
  levels: number[];
  /** Final counting forecast. */
  quantiles: number[];
  /** First counting forecast. */
  quantiles_first: number[];
  /** The outcome y. */
  value: number;
  wis: number;
  wis_first: number;
  interval_score: number | null;
  interval_level: number | null;
  /** Which gap of "where outcomes landed" y fell in: 0 below the lowest quantile … levels.length above the highest. */
  gap: number;
}

export interface NumericDetail {
  /** Sorted by window end, ties by id. */
  per_question: NumericQuestionRow[];
}
