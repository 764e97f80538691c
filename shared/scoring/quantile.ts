/**
 * Scores of one quantile forecast of a numeric question (SCORING.md "Numeric
 * questions"): the quantile score, the weighted interval score, the interval score of a
 * central interval, the central intervals of a level set and the gap an outcome landed
 * in. Values are in the question's unit (dates in days since 1970-01-01).
 *
 * The exported functions check their input; the `…At` forms read quantiles at an offset
 * of a flat array without checks, for the report, which validates every forecast once.
 */
import { quantileLevelsProblem, quantilesProblem } from '../quantile-levels';
import { assertFinite } from './validate';

/**
 * A central interval level as reports show it: `upper τ − lower τ` rounded to two
 * decimals (INTERFACES.md), so {0.05, 0.95} reads 0.9 and not 0.8999999999999999.
 */
export function nominalLevel(lowerTau: number, upperTau: number): number {
  return Math.round((upperTau - lowerTau) * 100) / 100;
}

/**
 * Quantile score `QS_τ(q, y) = 2 (1{y < q} − τ)(q − y)` (Gneiting & Raftery 2007, JASA
 * 102:359–378; Gneiting 2011, JASA 106:746–762): twice the pinball loss, as
 * scikit-learn `mean_pinball_loss(alpha = τ)` computes it for one value. 0 when q = y;
 * never negative.
 *
 * @param q the forecast's τ-quantile, finite
 * @param y the outcome, finite
 * @param tau the level, 0 < τ < 1
 */
export function quantileScore(q: number, y: number, tau: number): number {
  assertFinite(q, 'quantileScore: q');
  assertFinite(y, 'quantileScore: y');
  if (!(tau > 0 && tau < 1)) {
    throw new RangeError(`quantileScore: tau is ${String(tau)}; give a level strictly between 0 and 1, such as 0.1.`);
  }
  return quantileScoreUnchecked(q, y, tau);
}

/**
 * The same product split by the indicator, so each branch is a non-negative product and
 * y = q gives +0 rather than −0; bit for bit the formula otherwise.
 */
function quantileScoreUnchecked(q: number, y: number, tau: number): number {
  return y < q ? 2 * (1 - tau) * (q - y) : 2 * tau * (y - q);
}

/**
 * Interval score of the central interval `[l, u]` at level `1 − α` (Gneiting & Raftery
 * 2007, eq. 43): `(u − l) + (2/α)(l − y)·1{y < l} + (2/α)(y − u)·1{y > u}` — the width,
 * plus a penalty growing with the miss distance, steeper for a narrower-nominal interval.
 *
 * @param l lower end, finite
 * @param u upper end, finite, ≥ l
 * @param y the outcome, finite
 * @param alpha 0 < α < 1 (0.2 for an 80 % interval)
 */
export function intervalScore(l: number, u: number, y: number, alpha: number): number {
  assertFinite(l, 'intervalScore: l');
  assertFinite(u, 'intervalScore: u');
  assertFinite(y, 'intervalScore: y');
  if (u < l) throw new RangeError(`intervalScore: the interval [${l}, ${u}] ends below its start; give l ≤ u.`);
  if (!(alpha > 0 && alpha < 1)) {
    throw new RangeError(`intervalScore: alpha is ${String(alpha)}; give a value strictly between 0 and 1, such as 0.2.`);
  }
  return intervalScoreUnchecked(l, u, y, alpha);
}

function intervalScoreUnchecked(l: number, u: number, y: number, alpha: number): number {
  const k = 2 / alpha;
  return u - l + (y < l ? k * (l - y) : 0) + (y > u ? k * (y - u) : 0);
}

/** A central interval of a level set: the quantiles at `lower` and `upper` (indices). */
export interface CentralInterval {
  lower: number;
  upper: number;
  /** Nominal level, rounded to two decimals. */
  level: number;
  /** `α = 2 × lower τ`: exact, where `1 − level` would not be (1 − 0.9 ≠ 0.1 in binary). */
  alpha: number;
}

/**
 * The central intervals of a symmetric level set, widest first: `[q_{τ}, q_{1−τ}]` for
 * every level τ < 0.5 (e.g. {0.1, 0.5, 0.9} has one, at 80 %). Empty for the median alone.
 *
 * @param levels a valid level set (shared/quantile-levels.ts)
 */
export function centralIntervals(levels: readonly number[]): CentralInterval[] {
  const problem = quantileLevelsProblem(levels);
  if (problem !== null) throw new RangeError(`centralIntervals: levels ${problem}.`);
  return centralIntervalsUnchecked(levels);
}

/** `centralIntervals` of a level set already validated. */
export function centralIntervalsUnchecked(levels: readonly number[]): CentralInterval[] {
  const m = levels.length;
  const out: CentralInterval[] = [];
  for (let i = 0; i < Math.floor(m / 2); i++) {
    out.push({ lower: i, upper: m - 1 - i, level: nominalLevel(levels[i]!, levels[m - 1 - i]!), alpha: 2 * levels[i]! });
  }
  return out;
}

function assertForecast(quantiles: ArrayLike<number>, levels: readonly number[], y: number, fn: string): void {
  const levelProblem = quantileLevelsProblem(levels);
  if (levelProblem !== null) throw new RangeError(`${fn}: levels ${levelProblem}.`);
  const problem = quantilesProblem(quantiles, levels.length);
  if (problem !== null) throw new RangeError(`${fn}: quantiles ${problem}.`);
  assertFinite(y, `${fn}: y`);
}

/**
 * Weighted interval score of one forecast (Bracher, Ray, Gneiting & Reich 2021, PLoS
 * Comput Biol 17(2):e1008618): the mean of `QS_τ` over the question's levels. With a
 * symmetric set containing the median this equals their `WIS_{α_{0:K}}`; with the
 * median alone it is `|y − m|`. In the question's unit, so never averaged across
 * questions.
 *
 * @param quantiles one value per level, non-decreasing, finite
 * @param levels a valid level set, ascending
 * @param y the outcome, finite
 */
export function weightedIntervalScore(quantiles: ArrayLike<number>, levels: readonly number[], y: number): number {
  assertForecast(quantiles, levels, y, 'weightedIntervalScore');
  return weightedIntervalScoreAt(quantiles, 0, levels, y);
}

/** `weightedIntervalScore` of the quantiles at `off`, unchecked. */
export function weightedIntervalScoreAt(q: ArrayLike<number>, off: number, levels: readonly number[], y: number): number {
  let sum = 0;
  for (let i = 0; i < levels.length; i++) sum += quantileScoreUnchecked(q[off + i]!, y, levels[i]!);
  return sum / levels.length;
}

/** Interval score of the central interval `c` of the quantiles at `off`, unchecked. */
export function intervalScoreAt(q: ArrayLike<number>, off: number, c: CentralInterval, y: number): number {
  return intervalScoreUnchecked(q[off + c.lower]!, q[off + c.upper]!, y, c.alpha);
}

/**
 * Which gap of "where outcomes landed" (Gneiting, Balabdaoui & Raftery 2007, JRSS B
 * 69:243–268, the PIT histogram for quantile forecasts) the outcome fell in: the number
 * of quantiles strictly below y. 0 is below (or at) the lowest quantile, `m` above the
 * highest; an outcome equal to a quantile counts in the gap below it (SCORING.md).
 *
 * @param quantiles non-decreasing, finite
 * @param y the outcome, finite
 * @returns 0 … quantiles.length
 */
export function landedGap(quantiles: ArrayLike<number>, y: number): number {
  const problem = quantilesProblem(quantiles, quantiles.length);
  if (problem !== null) throw new RangeError(`landedGap: quantiles ${problem}.`);
  assertFinite(y, 'landedGap: y');
  return landedGapAt(quantiles, 0, quantiles.length, y);
}

/** `landedGap` of the m quantiles at `off`, unchecked. */
export function landedGapAt(q: ArrayLike<number>, off: number, m: number, y: number): number {
  let gap = 0;
  while (gap < m && q[off + gap]! < y) gap++;
  return gap;
}
