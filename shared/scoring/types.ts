/**
 * Input and output shapes of the scoring engine.
 *
 * The service maps store rows into `ScoringQuestion`; times are epoch milliseconds so the
 * engine never parses dates. `ScoreReport` is exactly the `score --json` object of
 * INTERFACES.md §2 (snake_case keys, every key present, `null` for undefined figures).
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

export interface ScoreOptions {
  /** Keep only questions carrying this tag. */
  tag?: string;
  /** Inclusive lower bound on the window end T (ms). */
  from?: number;
  /** Inclusive upper bound on the window end T (ms). */
  to?: number;
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
  cost: number;
  cost_base_rate: number;
  cost_always: number;
  cost_never: number;
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
