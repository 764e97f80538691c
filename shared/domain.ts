/**
 * The diary's domain types, shared by the main process and the renderer.
 * Times crossing the API are ISO 8601 instants in UTC (`…Z`); the store keeps epoch
 * milliseconds. Probabilities are kept exactly as the user gave them.
 */

export type QuestionKind = 'event_by_deadline' | 'state_at_deadline';
export const QUESTION_KINDS: readonly QuestionKind[] = ['event_by_deadline', 'state_at_deadline'];

/**
 * What kind of answer a question asks for (SCORING.md; INTERFACES.md "Question types"),
 * fixed when the question is created: `binary` (yes/no, the default), `choice` (exactly one
 * of 2–12 options comes true) or `numeric` (a quantity in a unit, or a calendar date).
 */
export const QUESTION_TYPES = ['binary', 'choice', 'numeric'] as const;
export type QuestionType = (typeof QUESTION_TYPES)[number];

/** A numeric question's values are plain numbers, or calendar dates (`YYYY-MM-DD` across the API and in files). */
export const VALUE_KINDS = ['number', 'date'] as const;
export type ValueKind = (typeof VALUE_KINDS)[number];

/**
 * A numeric question's value as the API and the diary file carry it: a finite number, or
 * for a `date` question a calendar date `YYYY-MM-DD`.
 */
export type NumericValue = number | string;

/** How a yes/no question resolved. */
export type Outcome = 'yes' | 'no' | 'void';
export const OUTCOMES: readonly Outcome[] = ['yes', 'no', 'void'];

/**
 * How a question of any type resolved: yes/no for binary questions, `option` (a choice
 * question's option came true) or `value` (a numeric question's value is known), or void.
 */
export type AnyOutcome = Outcome | 'option' | 'value';
export const ANY_OUTCOMES: readonly AnyOutcome[] = ['yes', 'no', 'void', 'option', 'value'];

/** Where a question stands now, derived from its close, its resolution and the settings. */
export type QuestionStatus = 'open' | 'closing' | 'awaiting' | 'resolved' | 'void';
export const QUESTION_STATUSES: readonly QuestionStatus[] = ['open', 'closing', 'awaiting', 'resolved', 'void'];

/** Reminders Forelog gives about an unresolved question. */
export type NudgeKind = 'checkin' | 'closing_soon' | 'window_closed' | 'overdue';
export const NUDGE_KINDS: readonly NudgeKind[] = ['checkin', 'closing_soon', 'window_closed', 'overdue'];

/** Each nudge kind in a sentence or a listing ("its check-in nudge"). */
export const NUDGE_KIND_NAMES: Readonly<Record<NudgeKind, string>> = {
  checkin: 'check-in',
  closing_soon: 'closing soon',
  window_closed: 'to resolve',
  overdue: 'overdue',
};

/** One perspective estimate recorded with a revision (outside view, inside view, …). */
export interface Lens {
  name: string;
  p: number;
  weight: number;
}

/** One revision of the user's own probability (a yes/no question). */
export interface Forecast {
  id: string;
  at: string;
  p: number;
  note: string;
  lenses: Lens[];
  /** Entry order across the diary: breaks ties between forecasts with the same time. */
  seq: number;
}

/** One revision of the user's probabilities over a choice question's options. */
export interface ChoiceForecast {
  id: string;
  at: string;
  /** One probability per option, in option order, summing to 1 within 1e-6; kept as given. */
  probs: number[];
  note: string;
  seq: number;
}

/** One revision of the user's quantiles for a numeric question. */
export interface NumericForecast {
  id: string;
  at: string;
  /** One value per level of the question, in level order, non-decreasing. */
  quantiles: NumericValue[];
  note: string;
  seq: number;
}

/** A time-stamped probability from a named outside source (a client's view, a consensus). */
export interface ReferenceForecast {
  id: string;
  at: string;
  p: number;
  source: string;
}

/** An outside source's probabilities over a choice question's options. */
export interface ChoiceReference {
  id: string;
  at: string;
  probs: number[];
  source: string;
}

/** An outside source's quantiles for a numeric question. */
export interface NumericReference {
  id: string;
  at: string;
  quantiles: NumericValue[];
  source: string;
}

/** How a yes/no question resolved. */
export interface Resolution {
  outcome: Outcome;
  at: string;
  note: string;
}

/** How a choice question resolved: `option` is the 0-based index of the option that came true. */
export type ChoiceResolution = { outcome: 'option'; option: number; at: string; note: string } | { outcome: 'void'; at: string; note: string };

/** How a numeric question resolved: the value it took (a number, or a `YYYY-MM-DD` date). */
export type NumericResolution = { outcome: 'value'; value: NumericValue; at: string; note: string } | { outcome: 'void'; at: string; note: string };

/** A resolution of a question of any type. */
export type AnyResolution = Resolution | ChoiceResolution | NumericResolution;

/** How an earlier resolution stopped being the question's resolution. */
export type ResolutionChangeKind = 'corrected' | 'reopened';
export const RESOLUTION_CHANGE_KINDS: readonly ResolutionChangeKind[] = ['corrected', 'reopened'];

/** How an earlier resolution was replaced: when, and why. */
export interface ResolutionChangeFacts {
  /** When that resolution was written into the diary. */
  recorded_at: string;
  /** When it was corrected or the question reopened. */
  replaced_at: string;
  change: ResolutionChangeKind;
  /** The note given with the correction or the reopening ('' when none). */
  change_note: string;
}

/**
 * An earlier resolution, kept when it was corrected (resolved again) or the question was
 * reopened: what it said (`outcome`, `at` — when the question resolved, as it said —
 * `note`, and a choice question's `option` or a numeric question's `value`), when it was
 * recorded and when it was replaced, and why.
 */
export type ResolutionChange<R extends AnyResolution = Resolution> = R & ResolutionChangeFacts;

/** A nudge the user asked not to see before `until`. */
export interface ActiveSnooze {
  kind: NudgeKind;
  until: string;
}

export interface Costs {
  false_alarm: number;
  miss: number;
}

/** What every question carries, whatever its type. */
export interface QuestionBase {
  id: string;
  title: string;
  rule: string;
  kind: QuestionKind;
  tags: string[];
  opened_at: string;
  closes_at: string;
  /** IANA time zone name used to show the close and to place nudges. */
  time_zone: string;
  /** Where the base rate (or a choice question's option base rates) came from. */
  base_rate_note: string;
  /** Days between check-ins; null = the diary's default; 0 = no check-ins. */
  checkin_days: number | null;
  /** The question's snoozes still running (until after now), by kind. */
  snoozes: ActiveSnooze[];
  created_at: string;
  updated_at: string;
}

/** A yes/no question. */
export interface BinaryQuestion extends QuestionBase {
  type: 'binary';
  base_rate: number | null;
  costs: Costs | null;
  forecasts: Forecast[];
  references: ReferenceForecast[];
  resolution: Resolution | null;
  /** Earlier resolutions, oldest first: each correction and each reopening keeps the one it replaced. */
  resolution_history: ResolutionChange[];
}

/** A multiple-choice question: exactly one of its options comes true. */
export interface ChoiceQuestion extends QuestionBase {
  type: 'choice';
  /** 2–12 unique labels, in the order the user gave them (the order matters when `ordered`). */
  options: string[];
  /** The options are ordered categories (ranges of a quantity, early / on time / late): scored by the RPS too. */
  ordered: boolean;
  /** One stated base rate per option, summing to 1 within 1e-6; null when not stated. */
  option_base_rates: number[] | null;
  forecasts: ChoiceForecast[];
  references: ChoiceReference[];
  resolution: ChoiceResolution | null;
  resolution_history: ResolutionChange<ChoiceResolution>[];
}

/** A numeric question: a quantity in a unit, or a calendar date, forecast as quantiles. */
export interface NumericQuestion extends QuestionBase {
  type: 'numeric';
  /** Shown beside values, e.g. "weeks" or "£k"; may be empty. */
  unit: string;
  value_kind: ValueKind;
  /** The quantile levels, ascending, symmetric around 0.5 and containing it (shared/quantile-levels.ts). */
  levels: number[];
  forecasts: NumericForecast[];
  references: NumericReference[];
  resolution: NumericResolution | null;
  resolution_history: ResolutionChange<NumericResolution>[];
}

/** A question of any type; narrow on `type`. */
export type Question = BinaryQuestion | ChoiceQuestion | NumericQuestion;

export const isBinary = (q: Question): q is BinaryQuestion => q.type === 'binary';
export const isChoice = (q: Question): q is ChoiceQuestion => q.type === 'choice';
export const isNumeric = (q: Question): q is NumericQuestion => q.type === 'numeric';

/** A row of the question list: what the list screen shows, without the full history. */
export interface QuestionSummary {
  id: string;
  title: string;
  type: QuestionType;
  kind: QuestionKind;
  tags: string[];
  opened_at: string;
  closes_at: string;
  time_zone: string;
  base_rate: number | null;
  /** The last revision of a yes/no question; null for other types or with no revision. */
  last_p: number | null;
  /** Choice questions: the option labels and the last revision's probabilities; otherwise null. */
  options: string[] | null;
  last_probs: number[] | null;
  /** Numeric questions: unit, value kind, levels and the last revision's quantiles; otherwise null. */
  unit: string | null;
  value_kind: ValueKind | null;
  levels: number[] | null;
  last_quantiles: NumericValue[] | null;
  last_forecast_at: string | null;
  forecast_count: number;
  status: QuestionStatus;
  outcome: AnyOutcome | null;
  /** A choice question resolved to an option: its index in `options`; otherwise null. */
  resolved_option: number | null;
  /** A numeric question resolved to a value: the value (a `YYYY-MM-DD` text for dates); otherwise null. */
  resolved_value: NumericValue | null;
  /** Event-by-deadline forecast left well above its glide path for longer than its check-in cadence. */
  stale: boolean;
}

/** A nudge due now, with what the Desk shows beside it. */
export interface DueNudge {
  /** The question's id. */
  id: string;
  title: string;
  kind: NudgeKind;
  due_at: string;
  closes_at: string;
  time_zone: string;
  type: QuestionType;
  /** The last yes/no revision; null for other types (the Desk reads the question for theirs). */
  last_p: number | null;
  last_forecast_at: string | null;
  stale: boolean;
}

/** A nudge that is due but hidden by a snooze, and when it comes back. */
export interface SnoozedNudge extends DueNudge {
  until: string;
}

export interface QuietHours {
  /** Local wall-clock "HH:MM" in the diary's time zone. */
  start: string;
  end: string;
}

export interface Settings {
  default_false_alarm_cost: number;
  default_miss_cost: number;
  default_checkin_days: number;
  closing_soon_hours: number;
  overdue_after_days: number;
  /** IANA name; questions without their own zone use it. */
  time_zone: string;
  quiet_hours: QuietHours | null;
}

export function defaultSettings(systemTimeZone: string): Settings {
  return {
    default_false_alarm_cost: 1,
    default_miss_cost: 1,
    default_checkin_days: 7,
    closing_soon_hours: 24,
    overdue_after_days: 3,
    time_zone: systemTimeZone,
    quiet_hours: null,
  };
}

/**
 * Status of a question at `nowMs`: resolved and void come from the resolution; otherwise
 * `awaiting` once the window has closed, `closing` inside the closing-soon warning, else `open`.
 */
export function questionStatus(
  closesAtMs: number,
  outcome: AnyOutcome | null,
  nowMs: number,
  closingSoonHours: number,
): QuestionStatus {
  if (outcome === 'void') return 'void';
  if (outcome) return 'resolved';
  if (nowMs >= closesAtMs) return 'awaiting';
  if (nowMs >= closesAtMs - closingSoonHours * 3_600_000) return 'closing';
  return 'open';
}
