/** Whole domain objects for tests that work on questions without a diary file. */
import type { BinaryQuestion, Forecast } from '../../shared/domain';
import type { PlanQuestion } from '../../main/nudges/plan';

export function forecast(at: string, seq: number, p = 0.5): Forecast {
  return { id: `f${seq}`, at, p, note: '', lenses: [], seq };
}

/** An open event-by-deadline question in UTC, opened 2025-01-06 09:00Z; override any field. */
export function question(over: Partial<BinaryQuestion> & { id: string }): BinaryQuestion {
  return {
    type: 'binary',
    title: `Question ${over.id}`,
    rule: 'Resolves Yes if it happens.',
    kind: 'event_by_deadline',
    tags: [],
    opened_at: '2025-01-06T09:00:00.000Z',
    closes_at: '2030-01-01T00:00:00.000Z',
    time_zone: 'UTC',
    base_rate: null,
    base_rate_note: '',
    costs: null,
    checkin_days: null,
    forecasts: [],
    references: [],
    resolution: null,
    resolution_history: [],
    snoozes: [],
    created_at: '2025-01-06T09:00:00.000Z',
    updated_at: '2025-01-06T09:00:00.000Z',
    ...over,
  };
}

/**
 * An unresolved question as the nudge planner sees it, opened 2025-01-06 09:00Z in UTC with
 * no revision; times are given as ISO text for readability. Override any field.
 */
export function planQuestion(over: {
  id: string;
  title?: string;
  opened_at?: string;
  closes_at?: string;
  time_zone?: string;
  checkin_days?: number | null;
  last_forecast_at?: string | null;
}): PlanQuestion {
  return {
    id: over.id,
    title: over.title ?? `Question ${over.id}`,
    opened_at: Date.parse(over.opened_at ?? '2025-01-06T09:00:00.000Z'),
    closes_at: Date.parse(over.closes_at ?? '2030-01-01T00:00:00.000Z'),
    time_zone: over.time_zone ?? 'UTC',
    checkin_days: over.checkin_days ?? null,
    last_forecast_at: over.last_forecast_at ? Date.parse(over.last_forecast_at) : null,
  };
}
