/**
 * How the Hindsight screen puts figures into words: one place, so an entry, the calibration
 * summary and the empty states never write the same number two ways.
 */
import { recalibrate } from '../../../../shared/scoring';
import type { CalibrationFit } from '../../../../shared/scoring/types';

/** e.g. 0.85 → "85%", 0.333 → "33%"; a value strictly inside (0, 1) never reads as 0% or 100%. */
export function wholePercent(p: number): string {
  const r = Math.round(Number((p * 100).toFixed(9)));
  if (r === 0 && p > 0) return '<1%';
  if (r === 100 && p < 1) return '>99%';
  return `${r}%`;
}

/** "You said 85%; it did not happen." — the final forecast against the outcome. */
export function verdictSentence(finalP: number, outcome: 'yes' | 'no'): string {
  return `You said ${wholePercent(finalP)}; ${outcome === 'yes' ? 'it happened' : 'it did not happen'}.`;
}

/** What "confident" means at a threshold: "final forecast 80% or more, or 20% or less". */
export function confidentMeaning(threshold: number): string {
  return `final forecast ${wholePercent(threshold)} or more, or ${wholePercent(Number((1 - threshold).toFixed(12)))} or less`;
}

/** The stated probability the calibration reading translates ("your 90% behaves like …", PRODUCT.md). */
export const READING_P = 0.9;

/** The calibration slope in words, or why it is missing. */
export function slopeReading(fit: CalibrationFit): string {
  if (fit.slope === null || fit.intercept === null) return `Calibration slope not reported: ${fit.reason ?? 'no fit for this selection'}.`;
  const direction =
    fit.slope < 1 ? 'below 1: calls were too extreme' : fit.slope > 1 ? 'above 1: calls were too timid' : '1: neither too extreme nor too timid';
  const behaved = recalibrate(READING_P, fit.intercept, fit.slope);
  return `Calibration slope ${fit.slope.toFixed(2)} (${direction}); a stated ${wholePercent(READING_P)} behaved like ${wholePercent(behaved)}.`;
}
