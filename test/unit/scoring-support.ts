/**
 * Builders and helpers for the choice and numeric scoring tests: a seeded PRNG, questions
 * from day offsets, and the one-ulp neighbours of a double.
 */
import assert from 'node:assert/strict';
import type {
  ScoringChoiceForecast,
  ScoringChoiceQuestion,
  ScoringNumericForecast,
  ScoringNumericQuestion,
} from '../../shared/scoring/index';
export { mulberry32 } from '../bench/make-diary';

export const DAY = 86_400_000;
export const T0 = Date.UTC(2026, 0, 1);

export const close = (actual: number | null, expected: number, tol: number, what: string): void =>
  assert.ok(actual !== null && Math.abs(actual - expected) <= tol, `${what}: got ${actual}, expected ${expected} ± ${tol}`);


/** Fisher–Yates with the given PRNG; returns a new array. */
export function shuffled<T>(xs: readonly T[], rand: () => number): T[] {
  const out = xs.slice();
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}

const view = new DataView(new ArrayBuffer(8));

/** The next double above x (x finite, > 0). */
export function nextUp(x: number): number {
  view.setFloat64(0, x);
  view.setBigUint64(0, view.getBigUint64(0) + 1n);
  return view.getFloat64(0);
}

/** The next double below x (x finite, > 0). */
export function nextDown(x: number): number {
  view.setFloat64(0, x);
  view.setBigUint64(0, view.getBigUint64(0) - 1n);
  return view.getFloat64(0);
}

let nextSeq = 1;

/** Choice forecasts at day offsets from T0, in entry order. */
export function cf(...entries: [number, number[]][]): ScoringChoiceForecast[] {
  return entries.map(([day, probs]) => ({ at: T0 + day * DAY, probs, seq: nextSeq++ }));
}

/** Numeric forecasts at day offsets from T0, in entry order. */
export function nf(...entries: [number, number[]][]): ScoringNumericForecast[] {
  return entries.map(([day, quantiles]) => ({ at: T0 + day * DAY, quantiles, seq: nextSeq++ }));
}

/**
 * A choice question closing (and resolved) on day 10. `outcome`: the index of the option
 * that came true, 'void', or null while open. K is the first forecast's length (3 without
 * forecasts) unless given.
 */
export function choiceQuestion(
  id: string,
  outcome: number | 'void' | null,
  forecasts: ScoringChoiceForecast[],
  extra: Partial<ScoringChoiceQuestion> = {},
): ScoringChoiceQuestion {
  const at = T0 + 10 * DAY;
  return {
    id,
    title: `Question ${id}`,
    tags: [],
    closes_at: at,
    resolution: outcome === null ? null : outcome === 'void' ? { outcome: 'void', at } : { outcome: 'option', option: outcome, at },
    option_count: forecasts[0]?.probs.length ?? 3,
    ordered: false,
    option_base_rates: null,
    forecasts,
    ...extra,
  };
}

/** A numeric question closing (and resolved) on day 10 with levels {0.1, 0.5, 0.9} unless given. */
export function numericQuestion(
  id: string,
  outcome: number | 'void' | null,
  forecasts: ScoringNumericForecast[],
  extra: Partial<ScoringNumericQuestion> = {},
): ScoringNumericQuestion {
  const at = T0 + 10 * DAY;
  return {
    id,
    title: `Question ${id}`,
    tags: [],
    closes_at: at,
    resolution: outcome === null ? null : outcome === 'void' ? { outcome: 'void', at } : { outcome: 'value', value: outcome, at },
    unit: 'weeks',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
    forecasts,
    ...extra,
  };
}
