/**
 * A choice or numeric forecast in a few words, for lists and cards where the yes/no ones show
 * a percent: the top option and its chance, or the median with the range.
 */
import type { QuestionSummary } from '../../../shared/domain';
import { toStoredValue } from '../../../shared/numeric-value';
import { formatPercent } from '../percent';
import { formatValue, type ValueKind } from '../forecastEntry/numericEntry';

/** "Ambledene 60%" — the option with the highest chance (ties: the first), as SCORING.md's top choice. */
export function choiceSummary(options: readonly string[], probs: readonly number[]): string {
  let top = 0;
  for (let k = 1; k < probs.length; k++) if (probs[k]! > probs[top]!) top = k;
  return `${options[top] ?? `Option ${top + 1}`} ${formatPercent(probs[top])}`;
}

/** "13 weeks (9 – 20)": the median with the outermost quantiles, dates likewise. */
export function numericSummary(levels: readonly number[], quantiles: readonly number[], kind: ValueKind, unit: string, locale?: string): string {
  const median = quantiles[levels.indexOf(0.5)];
  if (median === undefined) return '—';
  const m = quantiles.length;
  const centre = formatValue(median, kind, unit, locale);
  if (m < 2) return centre;
  const low = formatValue(quantiles[0]!, kind, '', locale);
  const high = formatValue(quantiles[m - 1]!, kind, '', locale);
  return `${centre} (${low} – ${high})`;
}

/**
 * How a choice or numeric question resolved, in a few words for the list's status ("Ambledene",
 * "2,940 pallets", "12 Nov 2026"); null for yes/no questions (the pill says Yes or No itself),
 * open and void ones.
 */
export function resolvedText(q: Pick<QuestionSummary, 'type' | 'options' | 'value_kind' | 'unit' | 'resolved_option' | 'resolved_value'>, locale?: string): string | null {
  // typeof, not !== null: a row from a diary service without these fields says nothing rather than "Option NaN".
  if (q.type === 'choice' && typeof q.resolved_option === 'number') return q.options?.[q.resolved_option] ?? `Option ${q.resolved_option + 1}`;
  if (q.type === 'numeric' && (typeof q.resolved_value === 'number' || typeof q.resolved_value === 'string') && q.value_kind) {
    return formatValue(toStoredValue(q.resolved_value, q.value_kind), q.value_kind, q.unit ?? '', locale);
  }
  return null;
}

/** The Questions list's "last forecast" cell for a question of any type; "—" with none. */
export function lastForecastText(q: Pick<QuestionSummary, 'type' | 'last_p' | 'options' | 'last_probs' | 'levels' | 'last_quantiles' | 'value_kind' | 'unit'>, locale?: string): string {
  if (q.type === 'choice') return q.options && q.last_probs ? choiceSummary(q.options, q.last_probs) : '—';
  if (q.type === 'numeric') {
    if (!q.levels || !q.last_quantiles || !q.value_kind) return '—';
    const kind = q.value_kind;
    return numericSummary(q.levels, q.last_quantiles.map((v) => toStoredValue(v, kind)), kind, q.unit ?? '', locale);
  }
  return formatPercent(q.last_p);
}
