/**
 * The glide path of a question's standing forecast: for an unresolved event-by-deadline
 * question, where the latest probability drifts by the close if nothing happens (constant
 * hazard, shared/scoring `glidePath`). The path starts at the later of the forecast and the
 * window's opening, as the staleness check does, since nothing can happen before the window.
 */
import type { BinaryQuestion, Settings } from '../../../shared/domain';
import { glidePath, glidePathSeries, isStale } from '../../../shared/scoring';
import { lastForecast } from '../screens/question/questionFacts';

/** Intervals the chart draws the curve with: smooth at any chart width, still a small JSON. */
export const GLIDE_STEPS = 48;

export interface GlideStart {
  p: number;
  /** Where the path starts (epoch ms). */
  from: number;
  /** When the latest forecast was made (epoch ms). */
  revisedAt: number;
  closesAt: number;
}

/** The path's starting point, or null when the question has no glide path. */
export function glideStart(question: BinaryQuestion): GlideStart | null {
  if (question.kind !== 'event_by_deadline' || question.resolution !== null) return null;
  const last = lastForecast(question);
  if (!last) return null;
  const revisedAt = Date.parse(last.at);
  const closesAt = Date.parse(question.closes_at);
  const from = Math.max(revisedAt, Date.parse(question.opened_at));
  if (!(from < closesAt)) return null;
  return { p: last.p, from, revisedAt, closesAt };
}

/** The path as chart points (ISO time, probability), from the start to exactly the close. */
export function glideSeries(question: BinaryQuestion): { at: string; p: number }[] {
  const start = glideStart(question);
  if (!start) return [];
  return glidePathSeries(start.p, start.from, start.closesAt, GLIDE_STEPS).map((g) => ({ at: new Date(g.t).toISOString(), p: g.p }));
}

export interface Staleness {
  p: number;
  /** What the glide path says the forecast would be now. */
  now: number;
  /** Whole days since the latest revision. */
  days: number;
}

/**
 * Whether the standing forecast has gone stale against its glide path (shared/scoring
 * `isStale`, with the question's check-in cadence or the diary's default), and by how much.
 */
export function staleness(question: BinaryQuestion, settings: Pick<Settings, 'default_checkin_days'>, nowMs: number): Staleness | null {
  const start = glideStart(question);
  if (!start) return null;
  const stale = isStale({
    kind: question.kind,
    p: start.p,
    lastRevisedAt: start.revisedAt,
    openedAt: Date.parse(question.opened_at),
    closesAt: start.closesAt,
    now: nowMs,
    checkinDays: question.checkin_days ?? settings.default_checkin_days,
  });
  if (!stale) return null;
  return { p: start.p, now: glidePath(start.p, start.from, start.closesAt, nowMs), days: Math.floor((nowMs - start.revisedAt) / 86_400_000) };
}
