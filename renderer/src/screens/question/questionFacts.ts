/** Facts about one question that its page and dialogs read. */
import type { Forecast, BinaryQuestion } from '../../../../shared/domain';

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
