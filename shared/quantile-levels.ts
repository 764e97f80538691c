/**
 * The rules for a numeric question's quantile levels and forecast quantiles
 * (SCORING.md "Numeric questions"; INTERFACES.md "Question types"), in one place so the
 * scoring engine, the API contract and the diary file agree on what is valid.
 *
 * Each check returns null when the value is valid, or a reason that reads after the
 * field's name ("levels: must …"), so a zod refinement and a RangeError can both use it.
 */

/**
 * The levels a question may use, ascending. Symmetric around 0.5, so the mirror of
 * `ALLOWED_QUANTILE_LEVELS[i]` is `ALLOWED_QUANTILE_LEVELS[6 − i]`; symmetry is checked
 * through this table rather than by computing `1 − τ`, which is not exact in binary
 * (1 − 0.9 is 0.09999999999999998).
 */
export const ALLOWED_QUANTILE_LEVELS: readonly number[] = Object.freeze([0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95]);

/** P10 / P50 / P90, the default of project estimating (SCORING.md). */
export const DEFAULT_QUANTILE_LEVELS: readonly number[] = Object.freeze([0.1, 0.5, 0.9]);

/**
 * Why `levels` is not a valid level set, or null. Valid: drawn from
 * {0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95} (exact values), strictly ascending, containing
 * 0.5, and symmetric (τ present exactly when 1 − τ is).
 */
export function quantileLevelsProblem(levels: ArrayLike<number>): string | null {
  if (levels.length === 0) return 'must list at least the median, 0.5';
  let previous = -1;
  const present = new Array<boolean>(ALLOWED_QUANTILE_LEVELS.length).fill(false);
  for (let i = 0; i < levels.length; i++) {
    const level = levels[i]!;
    const at = ALLOWED_QUANTILE_LEVELS.indexOf(level);
    if (at < 0) {
      return `entry ${i} is ${String(level)}; each level must be one of ${ALLOWED_QUANTILE_LEVELS.join(', ')}`;
    }
    if (at <= previous) return 'must be in ascending order, each level once';
    previous = at;
    present[at] = true;
  }
  const median = ALLOWED_QUANTILE_LEVELS.indexOf(0.5);
  if (!present[median]) return 'must contain the median, 0.5';
  for (let i = 0; i < present.length; i++) {
    const mirror = present.length - 1 - i;
    if (present[i] && !present[mirror]) {
      return `must be symmetric around 0.5: ${ALLOWED_QUANTILE_LEVELS[i]} needs ${ALLOWED_QUANTILE_LEVELS[mirror]}`;
    }
  }
  return null;
}

/**
 * Why `quantiles` is not a valid forecast for a question with `levelCount` levels, or
 * null: one finite number per level, non-decreasing with the level (equal neighbours
 * are allowed: a forecaster may be sure of a value).
 *
 * @param quantiles the values, in the order of the question's levels
 * @param levelCount number of levels of the question
 */
export function quantilesProblem(quantiles: ArrayLike<number>, levelCount: number): string | null {
  if (quantiles.length !== levelCount) {
    return `must give one value per level (${levelCount}), not ${quantiles.length}`;
  }
  for (let i = 0; i < quantiles.length; i++) {
    const q = quantiles[i]!;
    if (typeof q !== 'number' || !Number.isFinite(q)) return `entry ${i} is ${String(q)}; each must be a finite number`;
    if (i > 0 && q < quantiles[i - 1]!) {
      return `must not decrease with the level: entry ${i} (${q}) is below entry ${i - 1} (${quantiles[i - 1]})`;
    }
  }
  return null;
}
