/**
 * Hindsight for choice and numeric questions: confident calls on the top choice and
 * surprises of a range, each with every revision and the note written at the time. Which
 * questions count, their final forecasts and the selection itself come from
 * shared/scoring (`computeChoiceConfidentCalls`, `computeNumericSurprises`, which the
 * service calls), the one home of those rules; this module only adds what the user wrote.
 */
import type { ChoiceQuestion, NumericQuestion } from '../../shared/domain';
import type { ChoiceHindsightEntry, NumericHindsightEntry } from '../../shared/hindsight-entries';
import { fromStoredValue } from '../../shared/numeric-value';
import type { ChoiceConfidentCall, SurpriseDetail } from '../../shared/scoring';
import { toIso } from '../../shared/time';

/** Revisions oldest first (same time: entered first), each marked counted when made at or before the window end T. */
function revisions<F extends { at: string; seq: number; note: string }>(forecasts: readonly F[], T: number): (F & { counted: boolean })[] {
  return forecasts
    .map((f) => ({ f, at: Date.parse(f.at) }))
    .sort((a, b) => a.at - b.at || a.f.seq - b.f.seq)
    .map(({ f, at }) => ({ ...f, counted: at <= T }));
}

/**
 * Choice questions whose top choice was held at the threshold or more: misses (another
 * option came true), and hits when asked for; misses first, the most confident first.
 *
 * @param all the selection's confident calls, as `computeChoiceConfidentCalls` gives them
 *   (the caller keeps them while the diary is unchanged: paging asks again and again)
 * @param details the full questions for some ids (notes, options, rule)
 * @param limit how many entries to return in full, from the first; all when undefined
 *   (the counts always cover every call)
 */
export function choiceHindsight(
  all: readonly ChoiceConfidentCall[],
  details: (ids: string[]) => ChoiceQuestion[],
  limit?: number,
): { entries: ChoiceHindsightEntry[]; misses: number; hits: number } {
  const misses = all.filter((c) => c.verdict === 'miss').length;
  const calls = all.slice(0, limit);
  const byId = new Map(details(calls.map((c) => c.id)).map((q) => [q.id, q]));
  const entries = calls.map((c): ChoiceHindsightEntry => {
    const q = byId.get(c.id)!;
    return {
      id: q.id,
      title: q.title,
      rule: q.rule,
      tags: q.tags,
      verdict: c.verdict,
      options: q.options,
      ordered: q.ordered,
      top_option: c.option,
      top_p: c.p,
      outcome_option: c.outcome_option,
      outcome_p: c.outcome_p,
      final_probs: c.probs,
      window_end: toIso(c.T),
      option_base_rates: q.option_base_rates,
      base_rate_note: q.base_rate_note,
      resolution: { at: q.resolution!.at, note: q.resolution!.note },
      forecasts: revisions(q.forecasts, c.T).map((f) => ({ at: f.at, probs: f.probs, note: f.note, counted: f.counted })),
    };
  });
  return { entries, misses, hits: all.length - misses };
}

/**
 * Numeric questions whose outcome fell outside the widest range of the final forecast,
 * the largest surprise (distance outside ÷ width) first, ranges of zero width before them.
 *
 * @param all the selection's surprises, as `computeNumericSurprises` gives them (dates as
 *   days; the caller keeps them while the diary is unchanged)
 * @param details the full questions for some ids (notes, unit, rule)
 * @param limit how many surprises to return in full, from the first; all when undefined
 *   (the count always covers every one)
 */
export function numericHindsight(
  all: readonly SurpriseDetail[],
  details: (ids: string[]) => NumericQuestion[],
  limit?: number,
): { entries: NumericHindsightEntry[]; count: number } {
  const surprises = all.slice(0, limit);
  const byId = new Map(details(surprises.map((s) => s.id)).map((q) => [q.id, q]));
  const entries = surprises.map((s): NumericHindsightEntry => {
    const q = byId.get(s.id)!;
    const value = (x: number) => fromStoredValue(x, q.value_kind);
    return {
      id: q.id,
      title: q.title,
      rule: q.rule,
      tags: q.tags,
      unit: q.unit,
      value_kind: q.value_kind,
      levels: q.levels,
      value: value(s.value),
      low: value(s.low),
      high: value(s.high),
      level: s.level,
      side: s.side,
      distance: s.distance,
      size: s.size,
      final_quantiles: s.quantiles.map(value),
      window_end: toIso(s.T),
      resolution: { at: q.resolution!.at, note: q.resolution!.note },
      forecasts: revisions(q.forecasts, s.T).map((f) => ({ at: f.at, quantiles: f.quantiles, note: f.note, counted: f.counted })),
    };
  });
  return { entries, count: all.length };
}

