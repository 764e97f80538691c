/**
 * The diary's domain types, shared by the main process and the renderer.
 * Times crossing the API are ISO 8601 instants in UTC (`…Z`); the store keeps epoch
 * milliseconds. Probabilities are kept exactly as the user gave them.
 */

export type QuestionKind = 'event_by_deadline' | 'state_at_deadline';
export const QUESTION_KINDS: readonly QuestionKind[] = ['event_by_deadline', 'state_at_deadline'];

export type Outcome = 'yes' | 'no' | 'void';
export const OUTCOMES: readonly Outcome[] = ['yes', 'no', 'void'];

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

/** One revision of the user's own probability. */
export interface Forecast {
  id: string;
  at: string;
  p: number;
  note: string;
  lenses: Lens[];
  /** Entry order across the diary: breaks ties between forecasts with the same time. */
  seq: number;
}

/** A time-stamped probability from a named outside source (a client's view, a consensus). */
export interface ReferenceForecast {
  id: string;
  at: string;
  p: number;
  source: string;
}

export interface Resolution {
  outcome: Outcome;
  at: string;
  note: string;
}

/** How an earlier resolution stopped being the question's resolution. */
export type ResolutionChangeKind = 'corrected' | 'reopened';
export const RESOLUTION_CHANGE_KINDS: readonly ResolutionChangeKind[] = ['corrected', 'reopened'];

/**
 * An earlier resolution, kept when it was corrected (resolved again) or the question was
 * reopened: what it said, when it was recorded and when it was replaced, and why.
 */
export interface ResolutionChange {
  outcome: Outcome;
  /** When the question resolved, as that resolution said. */
  at: string;
  note: string;
  /** When that resolution was written into the diary. */
  recorded_at: string;
  /** When it was corrected or the question reopened. */
  replaced_at: string;
  change: ResolutionChangeKind;
  /** The note given with the correction or the reopening ('' when none). */
  change_note: string;
}

/** A nudge the user asked not to see before `until`. */
export interface ActiveSnooze {
  kind: NudgeKind;
  until: string;
}

export interface Costs {
  false_alarm: number;
  miss: number;
}

export interface Question {
  id: string;
  title: string;
  rule: string;
  kind: QuestionKind;
  tags: string[];
  opened_at: string;
  closes_at: string;
  /** IANA time zone name used to show the close and to place nudges. */
  time_zone: string;
  base_rate: number | null;
  base_rate_note: string;
  costs: Costs | null;
  /** Days between check-ins; null = the diary's default; 0 = no check-ins. */
  checkin_days: number | null;
  forecasts: Forecast[];
  references: ReferenceForecast[];
  resolution: Resolution | null;
  /** Earlier resolutions, oldest first: each correction and each reopening keeps the one it replaced. */
  resolution_history: ResolutionChange[];
  /** The question's snoozes still running (until after now), by kind. */
  snoozes: ActiveSnooze[];
  created_at: string;
  updated_at: string;
}

/** A row of the question list: what the list screen shows, without the full history. */
export interface QuestionSummary {
  id: string;
  title: string;
  kind: QuestionKind;
  tags: string[];
  opened_at: string;
  closes_at: string;
  time_zone: string;
  base_rate: number | null;
  last_p: number | null;
  last_forecast_at: string | null;
  forecast_count: number;
  status: QuestionStatus;
  outcome: Outcome | null;
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
  outcome: Outcome | null,
  nowMs: number,
  closingSoonHours: number,
): QuestionStatus {
  if (outcome === 'void') return 'void';
  if (outcome) return 'resolved';
  if (nowMs >= closesAtMs) return 'awaiting';
  if (nowMs >= closesAtMs - closingSoonHours * 3_600_000) return 'closing';
  return 'open';
}
