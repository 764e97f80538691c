/** Whole domain objects for tests that work on questions without a diary file. */
import type { Forecast, Question } from '../../shared/domain';

export function forecast(at: string, seq: number, p = 0.5): Forecast {
  return { id: `f${seq}`, at, p, note: '', lenses: [], seq };
}

/** An open event-by-deadline question in UTC, opened 2025-01-06 09:00Z; override any field. */
export function question(over: Partial<Question> & { id: string }): Question {
  return {
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
