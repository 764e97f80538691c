/**
 * Skill against a baseline.
 */
import { assertFinite } from './validate';

/**
 * Skill score `SS = 1 − BS / BS_ref` (Murphy 1973; Wilks, Statistical Methods in the
 * Atmospheric Sciences, "skill scores"): 1 is perfect, 0 no better than the reference,
 * negative worse. Both scores must come from the same questions.
 *
 * @param score the forecaster's mean score (≥ 0, e.g. a Brier score)
 * @param reference the reference's mean score on the same questions (≥ 0)
 * @returns the skill, or null when the reference is perfect (`BS_ref = 0` leaves
 *   nothing to beat and the ratio is undefined)
 */
export function skillScore(score: number, reference: number): number | null {
  assertFinite(score, 'skillScore: score');
  assertFinite(reference, 'skillScore: reference');
  if (score < 0 || reference < 0) {
    throw new RangeError(
      `skillScore: got score ${score} and reference ${reference}; pass mean scores, which are never negative.`,
    );
  }
  return reference === 0 ? null : 1 - score / reference;
}
