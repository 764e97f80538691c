/**
 * A forecast of any question type in one line of plain text, for places that show the
 * standing forecast without a chart: the calendar export's event description, the
 * briefing's open questions, a compact list cell. Stored values are never changed; only
 * the reading is rounded.
 */
import type { NumericValue } from './domain';

/** A probability as a percentage for reading, to at most one decimal: 0.125 → "12.5%". */
export function percentText(p: number): string {
  return `${Number((p * 100).toFixed(1))}%`;
}

/** A quantile level as estimators name it: 0.1 → "P10", 0.05 → "P5". */
export function levelName(level: number): string {
  return `P${Math.round(level * 100)}`;
}

/** "Kestrowe 50%, Ambledene 30%, Neither 20%": each option with its probability, in option order. */
export function choiceForecastText(options: readonly string[], probs: readonly number[]): string {
  return options.map((label, k) => `${label} ${percentText(probs[k] ?? 0)}`).join(', ');
}

/** "P10 9 · P50 13 · P90 20 weeks": each level with its value, then the unit (dates as written). */
export function numericForecastText(levels: readonly number[], quantiles: readonly NumericValue[], unit: string): string {
  const values = levels.map((level, i) => `${levelName(level)} ${String(quantiles[i])}`).join(' · ');
  return unit ? `${values} ${unit}` : values;
}
