/** Facts about a choice or numeric question that its page, dialogs and chart read. */
import type { ChoiceQuestion, NumericQuestion } from '../../../../shared/domain';
import { toStoredValue } from '../../../../shared/numeric-value';
import type { ChoiceHistoryInput, NumericHistoryInput } from '../../chart/typedSeries';

/** The entry in force: latest time, and the later entry when two share a time. */
export function latestEntry<T extends { at: string; seq: number }>(entries: readonly T[]): T | undefined {
  let best: T | undefined;
  for (const e of entries) {
    const t = Date.parse(e.at);
    if (!best || t > Date.parse(best.at) || (t === Date.parse(best.at) && e.seq > best.seq)) best = e;
  }
  return best;
}

/** Oldest first, entry order breaking ties. */
export function byTime<T extends { at: string; seq?: number }>(entries: readonly T[]): T[] {
  return [...entries].sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || (a.seq ?? 0) - (b.seq ?? 0));
}

export function choiceHistoryInput(q: ChoiceQuestion): ChoiceHistoryInput {
  return {
    opened_at: q.opened_at,
    closes_at: q.closes_at,
    resolved_at: q.resolution?.at ?? null,
    options: q.options,
    option_base_rates: q.option_base_rates,
    forecasts: q.forecasts.map((f) => ({ at: f.at, probs: f.probs, seq: f.seq })),
    references: q.references.map((r) => ({ at: r.at, probs: r.probs, source: r.source })),
    outcome_option: q.resolution?.outcome === 'option' ? q.resolution.option : null,
    void: q.resolution?.outcome === 'void',
  };
}

/** Dates become days since 1970-01-01, as the chart's value axis counts them. */
export function numericHistoryInput(q: NumericQuestion): NumericHistoryInput {
  const stored = (values: readonly (number | string)[]) => values.map((v) => toStoredValue(v, q.value_kind));
  return {
    opened_at: q.opened_at,
    closes_at: q.closes_at,
    resolved_at: q.resolution?.at ?? null,
    unit: q.unit,
    value_kind: q.value_kind,
    levels: q.levels,
    forecasts: q.forecasts.map((f) => ({ at: f.at, quantiles: stored(f.quantiles), seq: f.seq })),
    references: q.references.map((r) => ({ at: r.at, quantiles: stored(r.quantiles), source: r.source })),
    value: q.resolution?.outcome === 'value' ? toStoredValue(q.resolution.value, q.value_kind) : null,
    void: q.resolution?.outcome === 'void',
  };
}

/**
 * True when a new revision repeats the latest one's numbers exactly: saving it confirms the
 * forecast still stands (a check-in done), as the yes/no Desk's "Kept … at 30%" says, rather
 * than a change of mind.
 */
export function repeatsLatest(
  question: ChoiceQuestion | NumericQuestion,
  value: { probs: readonly number[] } | { quantiles: readonly (number | string)[] },
): boolean {
  const last = latestEntry<{ at: string; seq: number; probs?: readonly number[]; quantiles?: readonly (number | string)[] }>(question.forecasts);
  if (!last) return false;
  const before = 'probs' in value ? last.probs : last.quantiles;
  const now: readonly (number | string)[] = 'probs' in value ? value.probs : value.quantiles;
  return before !== undefined && before.length === now.length && before.every((v, k) => String(v) === String(now[k]));
}
