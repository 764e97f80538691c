/**
 * Words and numbers for the thinking tools. A helper's figure is an estimate, so it is shown
 * to one decimal of a percent at most (36.4%, 80%, 9.5%), and intervals in whole percents
 * (short of 0% and 100% kept apart from them, see formatRange);
 * the same rounding fills a form's box, so the user saves exactly what they were shown.
 */
import { readDecimal } from '../../../shared/numeric-value';

/** e.g. 0.363636 → "36.4", 0.8 → "80", 0.095163 → "9.5" (percent text for a form's box). */
export function estimateText(p: number): string {
  return String(Number((p * 100).toFixed(1)));
}

/** e.g. 0.363636 → "36.4%". */
export function formatEstimate(p: number): string {
  return `${estimateText(p)}%`;
}

/**
 * e.g. (0.1723, 0.5678) → "17–57%". An end within 1% of 0 or 1 (and not on it) keeps one
 * significant digit of its distance from it, so it never reads as 0% or 100%:
 * (0.0021, 0.0103) → "0.2–1%" (6 of 1,200 cases), (0.9953, 0.99989) → "99.5–99.99%", where
 * whole percents said "0–1%" and "100%" of a rate the tool has just said is neither.
 */
export function formatRange(low: number, high: number): string {
  return `${rangeEnd(low)}–${rangeEnd(high)}%`;
}

/** Whole percents from 1% to 99%; closer to 0 or 1 (and not on them), one significant digit of the distance. */
function rangeEnd(p: number): string {
  if (p > 0 && p < 0.01) return String(Number((p * 100).toPrecision(1)));
  if (p > 0.99 && p < 1) return String(Number((100 - Number(((1 - p) * 100).toPrecision(1))).toPrecision(12)));
  return String(Math.round(p * 100));
}

/** e.g. "3 Jun 2025": the calendar day of an instant on `timeZone`'s clocks (dates.ts). */
export { formatDay, plural } from '../dates';

/**
 * A text box's number, or null when it is empty or not a finite number. The tools compute as
 * the user types, so a half-typed value just means "no result yet" rather than an error.
 */
export function numberOrNull(text: string): number | null {
  return readDecimal(text);
}
