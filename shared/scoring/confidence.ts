/**
 * Confident calls (PRODUCT.md "Hindsight"; INTERFACES.md `confident_misses`): a final
 * forecast at least `threshold` towards one side. A miss when the other side happened;
 * a hit when that side did.
 */

/** The default threshold of INTERFACES.md: ≥ 0.8 on a No or ≤ 0.2 on a Yes is a miss. */
export const CONFIDENT_THRESHOLD = 0.8;

/**
 * Classifies one scored question's final forecast.
 *
 * @param p final counting forecast, in [0, 1]
 * @param o outcome, 1 Yes or 0 No
 * @param threshold in [0.5, 1]
 * @returns 'miss' (p ≥ t on a No, or p ≤ 1 − t on a Yes), 'hit' (p ≥ t on a Yes, or
 *   p ≤ 1 − t on a No), or null when the call was not confident. At t = 0.5 a final 50 %
 *   is on both sides: it counts as a miss, the reading that hides nothing.
 *
 * The low cut 1 − t is rounded to 12 decimals: 1 − 0.8 is 0.19999999999999996 in binary
 * floating point, and a typed 20 % must count as ≤ 20 %.
 */
export function confidentVerdict(p: number, o: number, threshold: number): 'miss' | 'hit' | null {
  if (!(threshold >= 0.5 && threshold <= 1)) {
    throw new RangeError(`confidentVerdict: threshold is ${String(threshold)}; give a probability from 0.5 to 1, such as 0.8.`);
  }
  const low = Number((1 - threshold).toFixed(12));
  const high = p >= threshold;
  const lowSide = p <= low;
  if (!high && !lowSide) return null;
  if ((high && o === 0) || (lowSide && o === 1)) return 'miss';
  return 'hit';
}
