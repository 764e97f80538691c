/**
 * Words and numbers for the thinking tools. A helper's figure is an estimate, so it is shown
 * to one decimal of a percent at most (36.4%, 80%, 9.5%), and intervals in whole percents;
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

/** e.g. (0.1723, 0.5678) → "17–57%". */
export function formatRange(low: number, high: number): string {
  return `${Math.round(low * 100)}–${Math.round(high * 100)}%`;
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
