/** Facts about one question that its page and dialogs read. */
import type { Forecast, BinaryQuestion } from '../../../../shared/domain';
import { formatInstant } from '../../dates';

/** The forecast in force: latest time, and the later entry when two share a time. */
export function lastForecast(question: BinaryQuestion): Forecast | undefined {
  let best: Forecast | undefined;
  for (const f of question.forecasts) {
    if (!best || Date.parse(f.at) > Date.parse(best.at) || (Date.parse(f.at) === Date.parse(best.at) && f.seq > best.seq)) best = f;
  }
  return best;
}

export function sortedForecasts(question: BinaryQuestion): Forecast[] {
  return [...question.forecasts].sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || a.seq - b.seq);
}

/**
 * What reopening does, in the confirmation and in the message after it. A question whose
 * window is still open goes back to being open (revisable until its close), not to waiting
 * for a resolution, which only a closed window does.
 */
export function reopenWording(q: { closes_at: string; time_zone: string }, now: number): { effect: string; done: string } {
  if (Date.parse(q.closes_at) > now) {
    const when = formatInstant(q.closes_at, q.time_zone);
    return { effect: `the question is open again: you can revise it until its close, ${when}`, done: `Reopened; it is open again until its close, ${when}.` };
  }
  return { effect: 'the question waits for a resolution again', done: 'Reopened; the question awaits a resolution again.' };
}
