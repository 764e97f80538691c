/**
 * Discrimination: how well the forecasts rank Yes questions above No questions,
 * whatever their calibration.
 */
import { assertPairs } from './validate';
import type { RocPoint } from './types';

/**
 * Splits forecasts by outcome into two ascending typed arrays (numeric sort, no
 * comparator), the shape that pair counting and threshold sweeps need.
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length
 * @param caller name used in error messages
 */
function splitByOutcome(
  p: ArrayLike<number>,
  o: ArrayLike<number>,
  caller: string,
): { yes: Float64Array; no: Float64Array } {
  assertPairs(p, o, caller);
  let nYes = 0;
  for (let i = 0; i < o.length; i++) if (o[i] === 1) nYes++;
  const yes = new Float64Array(nYes);
  const no = new Float64Array(o.length - nYes);
  let iy = 0;
  let ino = 0;
  for (let i = 0; i < p.length; i++) {
    if (o[i] === 1) yes[iy++] = p[i]!;
    else no[ino++] = p[i]!;
  }
  yes.sort();
  no.sort();
  return { yes, no };
}

/**
 * ROC AUC as the Mann–Whitney probability that a Yes question's forecast exceeds a No
 * question's, ties counting ½ (Hanley & McNeil 1982, Radiology 143:29–36; equals the
 * trapezoidal area under the ROC curve, as scikit-learn `roc_auc_score` computes it).
 * 0.5 is no better than chance, 1 is perfect ranking.
 *
 * Counts pairs exactly (whole and half numbers) in O(n log n) by sorting each group.
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length
 * @returns the AUC, or null when all outcomes are the same (no pair to compare)
 */
export function rocAuc(p: ArrayLike<number>, o: ArrayLike<number>): number | null {
  const { yes, no } = splitByOutcome(p, o, 'rocAuc');
  if (yes.length === 0 || no.length === 0) return null;
  let below = 0; // No forecasts strictly below the current Yes forecast
  let notAbove = 0; // No forecasts at or below it
  let pairs = 0;
  for (let i = 0; i < yes.length; i++) {
    const y = yes[i]!;
    while (below < no.length && no[below]! < y) below++;
    if (notAbove < below) notAbove = below;
    while (notAbove < no.length && no[notAbove]! <= y) notAbove++;
    pairs += below + (notAbove - below) / 2;
  }
  return pairs / (yes.length * no.length);
}

/**
 * ROC curve points: for each distinct forecast value taken as a threshold, from the
 * highest down, the false and true positive rates of calling Yes when `p ≥ threshold`
 * (Fawcett 2006, Pattern Recognition Letters 27:861–874, Algorithm 1; scikit-learn
 * `roc_curve` with `drop_intermediate=False`). Starts at (0, 0) and ends at (1, 1).
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length
 * @returns the points, or [] when all outcomes are the same (a rate has no denominator)
 */
export function rocCurve(p: ArrayLike<number>, o: ArrayLike<number>): RocPoint[] {
  const { yes, no } = splitByOutcome(p, o, 'rocCurve');
  if (yes.length === 0 || no.length === 0) return [];
  const points: RocPoint[] = [{ fpr: 0, tpr: 0 }];
  let iy = yes.length - 1;
  let ino = no.length - 1;
  while (iy >= 0 || ino >= 0) {
    const threshold = Math.max(iy >= 0 ? yes[iy]! : -Infinity, ino >= 0 ? no[ino]! : -Infinity);
    while (iy >= 0 && yes[iy]! >= threshold) iy--;
    while (ino >= 0 && no[ino]! >= threshold) ino--;
    points.push({ fpr: (no.length - 1 - ino) / no.length, tpr: (yes.length - 1 - iy) / yes.length });
  }
  return points;
}
