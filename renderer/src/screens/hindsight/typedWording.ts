/**
 * Hindsight's one-sentence readings of a choice question's confident call and a numeric
 * question's surprise (SCORING.md "Confident miss", "Surprise"). Pure, so tests read the
 * sentences the user does.
 */
import type { ChoiceHindsightEntry, NumericHindsightEntry } from '../../../../shared/hindsight-entries';
import { toStoredValue } from '../../../../shared/numeric-value';
import { formatValue } from '../../forecastEntry/numericEntry';
import { plural } from '../../tools/format';
import { wholePercent } from './wording';

/**
 * "Kestrowe 45%, Ambledene 35%, Neither 20%": every option with its chance, for the base
 * rates, the final forecast and each revision alike, so the option that came true can be
 * read against its base rate, not only the favourite's.
 */
export function everyOption(options: readonly string[], probs: readonly number[]): string {
  return options.map((o, k) => `${o} ${wholePercent(probs[k] ?? 0)}`).join(', ');
}

/** "You gave Kestrowe 85%; Ambledene came true, at 10%." */
export function choiceVerdictSentence(e: Pick<ChoiceHindsightEntry, 'options' | 'top_option' | 'top_p' | 'outcome_option' | 'outcome_p' | 'verdict'>): string {
  const top = e.options[e.top_option] ?? `option ${e.top_option + 1}`;
  if (e.verdict === 'hit') return `You gave ${top} ${wholePercent(e.top_p)}, and it came true.`;
  return `You gave ${top} ${wholePercent(e.top_p)}; ${e.options[e.outcome_option] ?? `option ${e.outcome_option + 1}`} came true, at ${wholePercent(e.outcome_p)}.`;
}

/** "26 weeks: 10 weeks above your 80% range (10 weeks – 16 weeks); 1.7 times its width outside." */
export function surpriseSentence(e: Pick<NumericHindsightEntry, 'value' | 'low' | 'high' | 'level' | 'side' | 'distance' | 'size' | 'unit' | 'value_kind'>): string {
  const show = (v: number | string) => formatValue(toStoredValue(v, e.value_kind), e.value_kind, e.unit);
  const range = `${Math.round(e.level * 100)}%`;
  const distance = e.value_kind === 'date' ? plural(e.distance, 'day') : formatValue(e.distance, 'number', e.unit);
  const width = e.size === null ? 'a range of zero width' : `${Number(e.size.toPrecision(2))} times its width outside`;
  return `${show(e.value)}: ${distance} ${e.side} your ${range} range (${show(e.low)} – ${show(e.high)}); ${width}.`;
}
