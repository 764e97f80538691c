/** Probabilities are stored as 0–1 and shown and typed in percent. */
import { DECIMAL_NUMBER } from '../../shared/numeric-value';
import { LOG_CLIP_HIGH, LOG_CLIP_LOW } from '../../shared/scoring';

/** e.g. 0.4 → "40%", 0.425 → "42.5%", 1/3 → "33.33%"; null → "—". */
export function formatPercent(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '—';
  return `${Number((p * 100).toFixed(2))}%`;
}

/** The text a percent box starts with for a stored probability. */
export function percentText(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '';
  return String(Number((p * 100).toPrecision(12)));
}

export type Parsed<T> = { ok: true; value: T } | { ok: false; error: string };

/**
 * Percent text → probability. Dividing by 100 in binary floating point leaves noise
 * (33.3 / 100 = 0.33299999999999996); rounding to 15 significant digits removes it while
 * keeping every digit a person can type, so the diary stores the number the user meant.
 * An empty box is `null` (not given).
 */
export function percentToProbability(text: string): Parsed<number | null> {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, value: null };
  const n = Number(trimmed);
  if (!DECIMAL_NUMBER.test(trimmed) || !Number.isFinite(n)) return { ok: false, error: 'must be a number of percent, e.g. 35' };
  if (n < 0 || n > 100) return { ok: false, error: 'must be between 0% and 100%' };
  return { ok: true, value: Number((n / 100).toPrecision(15)) };
}

/**
 * What a percent box should say about a number that is allowed but probably not meant:
 * - 0% or 100%: certainty. Saved as typed, but the log score clips it (docs/scoring.md), so
 *   one miss at 0% costs as much as a miss at 0.1% — and that one miss dominates the average.
 * - a number between 0 and 1 ("0.5"): a probability typed as a fraction into a percent box;
 *   the form asks whether 50% was meant before saving 0.5%.
 */
export type PercentAdvice =
  | { kind: 'certain'; message: string }
  | { kind: 'fraction'; typed: string; meant: string };

export function percentAdvice(text: string): PercentAdvice | null {
  const parsed = percentToProbability(text);
  if (!parsed.ok || parsed.value === null) return null;
  const p = parsed.value;
  if (p === 0 || p === 1) {
    const clipped = formatPercent(p === 0 ? LOG_CLIP_LOW : LOG_CLIP_HIGH);
    return {
      kind: 'certain',
      message: `A single miss at ${formatPercent(p)} dominates the log score; it is scored as ${clipped}.`,
    };
  }
  const n = Number(text.trim());
  if (n > 0 && n < 1) return { kind: 'fraction', typed: text.trim(), meant: String(Number((n * 100).toPrecision(12))) };
  return null;
}
