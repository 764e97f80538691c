/**
 * Confidence intervals used by the scorecard.
 */
import { assertFinite } from './validate';

/** Two-sided 95 % standard normal quantile, as SCORING.md fixes it. */
export const Z95 = 1.959964;

/**
 * Wilson score interval for a binomial proportion (Wilson 1927, JASA 22:209–212;
 * evaluated as in Newcombe 1998, Statistics in Medicine 17:857–872, method 3).
 *
 * @param successes number of successes x, an integer with 0 ≤ x ≤ n
 * @param n number of trials, an integer ≥ 1 (an empty bin has no interval)
 * @param z normal quantile, 1.959964 for 95 % by default
 * @returns [low, high], clamped to [0, 1]; the low end is exactly 0 when x = 0 and the
 *   high end exactly 1 when x = n, where rounding would otherwise leave ±1e-17.
 */
export function wilsonInterval(successes: number, n: number, z: number = Z95): [number, number] {
  if (!Number.isInteger(n) || n < 1) {
    throw new RangeError(`wilsonInterval: n is ${String(n)}; give a whole number of trials ≥ 1.`);
  }
  if (!Number.isInteger(successes) || successes < 0 || successes > n) {
    throw new RangeError(
      `wilsonInterval: successes is ${String(successes)}; give a whole number from 0 to n = ${n}.`,
    );
  }
  if (!(Number.isFinite(z) && z > 0)) {
    throw new RangeError(`wilsonInterval: z is ${String(z)}; give a positive normal quantile.`);
  }
  const z2 = z * z;
  const denom = n + z2;
  const centre = (successes + z2 / 2) / denom;
  const half = (z / denom) * Math.sqrt((successes * (n - successes)) / n + z2 / 4);
  const low = successes === 0 ? 0 : Math.max(0, centre - half);
  const high = successes === n ? 1 : Math.min(1, centre + half);
  return [low, high];
}

/**
 * Normal-approximation interval for a mean: mean ± z · sd / √n with the sample standard
 * deviation (n − 1 denominator). Common practice for an interval around an average score.
 *
 * @param values per-question scores (finite numbers)
 * @param z normal quantile, 1.959964 for 95 % by default
 * @returns [low, high], or null when fewer than two values make the spread unknown
 */
export function normalMeanInterval(values: ArrayLike<number>, z: number = Z95): [number, number] | null {
  const n = values.length;
  if (n < 2) return null;
  let mean = 0;
  for (let i = 0; i < n; i++) {
    assertFinite(values[i]!, `normalMeanInterval: value[${i}]`);
    mean += values[i]!;
  }
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i]! - mean;
    ss += d * d;
  }
  const half = z * Math.sqrt(ss / (n - 1) / n);
  return [mean - half, mean + half];
}
