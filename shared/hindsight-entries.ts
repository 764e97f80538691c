/**
 * Hindsight's entries for choice and numeric questions (PRODUCT.md "Hindsight review and
 * briefing"; SCORING.md "Confident miss" and "Surprise"), as the `hindsight` operation
 * returns them beside the yes/no entries and as the briefing prints them: each with what
 * was written at the time.
 */

/** A value as the API carries it: a number, or for a date question `YYYY-MM-DD`. */
type Value = number | string;

/** A revision as Hindsight shows it; `counted` is false for one made after the window end. */
interface Counted {
  at: string;
  note: string;
  counted: boolean;
}

/**
 * A choice question whose top choice (the option with the highest final probability;
 * ties: the lowest index) was held at or above the threshold: a miss when another option
 * came true, a hit when it did (hits only when asked for).
 */
export interface ChoiceHindsightEntry {
  id: string;
  title: string;
  rule: string;
  tags: string[];
  verdict: 'miss' | 'hit';
  options: string[];
  ordered: boolean;
  /** The top choice (0-based) and its final probability. */
  top_option: number;
  top_p: number;
  /** The option that came true (0-based) and the final probability it had. */
  outcome_option: number;
  outcome_p: number;
  /** The final counting forecast, one probability per option. */
  final_probs: number[];
  /** Window end T (ISO). */
  window_end: string;
  option_base_rates: number[] | null;
  base_rate_note: string;
  resolution: { at: string; note: string };
  /** Every revision, oldest first (same time: entered first). */
  forecasts: (Counted & { probs: number[] })[];
}

/**
 * A numeric question whose outcome fell outside the widest central range of the final
 * forecast (a surprise), with how far outside, in the question's unit (days for a date).
 */
export interface NumericHindsightEntry {
  id: string;
  title: string;
  rule: string;
  tags: string[];
  unit: string;
  value_kind: 'number' | 'date';
  levels: number[];
  /** The outcome. */
  value: Value;
  /** The widest central range of the final forecast, e.g. P10–P90 for level 0.8. */
  low: Value;
  high: Value;
  level: number;
  side: 'below' | 'above';
  /** How far outside the range the outcome fell, in the question's unit (days for a date); > 0. */
  distance: number;
  /** `distance` divided by the range's width; null for a range of zero width. */
  size: number | null;
  /** The final counting forecast, one value per level. */
  final_quantiles: Value[];
  /** Window end T (ISO). */
  window_end: string;
  resolution: { at: string; note: string };
  /** Every revision, oldest first (same time: entered first). */
  forecasts: (Counted & { quantiles: Value[] })[];
}
