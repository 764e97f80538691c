/**
 * The maths behind Forelog's thinking tools: the base-rate helper (rule of succession
 * with a Jeffreys interval, rate to window), the glide path and its staleness flag,
 * lens pooling, recalibration and the "did I see it first?" lead over a reference.
 *
 * Pure functions only: no I/O, no dependencies. Times are epoch milliseconds, as the
 * store keeps them. Every function validates its arguments and throws a RangeError
 * naming the offending argument, so a bad value never turns silently into NaN on screen.
 * The definitions follow /shared/SCORING.md ("Helpers"); each function cites its source.
 */

import type { QuestionKind } from '../domain';

const MS_PER_DAY = 86_400_000;

/** Probabilities are clipped to [0.001, 0.999] before taking log-odds (SCORING.md). */
export const PROBABILITY_CLIP = 0.001;

/** Staleness: how far the forecast may sit above its glide path before it is flagged. */
export const STALE_MARGIN = 0.1;

/** Check-in grace period used when a question has none (0): a week, common practice. */
export const DEFAULT_STALE_DAYS = 7;

// ---------------------------------------------------------------------------------------
// Argument checks. Each message says what was wrong and what the caller should pass.

function requireFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number (got ${String(value)}); pass a real number.`);
  }
}

function requireProbability(name: string, value: number): void {
  if (typeof value !== 'number' || !(value >= 0 && value <= 1)) {
    throw new RangeError(`${name} must be a probability between 0 and 1 (got ${String(value)}); pass a value in [0, 1].`);
  }
}

function requirePositive(name: string, value: number): void {
  if (typeof value !== 'number' || !(value > 0) || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number greater than 0 (got ${String(value)}); pass a positive value.`);
  }
}

function requireNonNegative(name: string, value: number): void {
  if (typeof value !== 'number' || !(value >= 0) || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number of at least 0 (got ${String(value)}); pass zero or a positive value.`);
  }
}

function requireCount(name: string, value: number): void {
  if (!Number.isSafeInteger(value) || value < 0) {
    throw new RangeError(`${name} must be a whole number of at least 0 (got ${String(value)}); pass a count of cases.`);
  }
}

// ---------------------------------------------------------------------------------------
// Log-odds utilities.

/**
 * Log-odds `ln(p / (1 − p))` of a probability clipped to `[clip, 1 − clip]`.
 *
 * Parameters: `p` in [0, 1]; `clip` in [0, 0.5), default 0.001 as SCORING.md prescribes
 * for every log-odds it takes (so 0 and 1 map to about ∓6.9 instead of ∓∞). With
 * `clip = 0`, 0 and 1 give −∞ and +∞.
 * Source: the logistic (log-odds) transform, Cox (1958) Biometrika 45:562–565.
 */
export function logit(p: number, clip: number = PROBABILITY_CLIP): number {
  requireProbability('p', p);
  if (typeof clip !== 'number' || !(clip >= 0 && clip < 0.5)) {
    throw new RangeError(`clip must be at least 0 and below 0.5 (got ${String(clip)}); pass e.g. 0.001.`);
  }
  const q = Math.min(Math.max(p, clip), 1 - clip);
  // log(q) − log1p(−q) keeps precision for q near 0 and near 1 alike.
  return Math.log(q) - Math.log1p(-q);
}

/**
 * Logistic function `1 / (1 + e^(−x))`, the inverse of `logit`.
 *
 * Parameters: `x` any number except NaN; −∞ gives 0 and +∞ gives 1. Evaluated in the
 * form that never overflows (`e^x / (1 + e^x)` for negative x).
 * Source: Cox (1958) Biometrika 45:562–565.
 */
export function sigmoid(x: number): number {
  if (typeof x !== 'number' || Number.isNaN(x)) {
    throw new RangeError(`x must be a number (got ${String(x)}); pass a log-odds value.`);
  }
  if (x >= 0) return 1 / (1 + Math.exp(-x));
  const e = Math.exp(x);
  return e / (1 + e);
}

// ---------------------------------------------------------------------------------------
// Gamma and beta functions.

// Lanczos coefficients for g = 7, n = 9 (the widely published set computed by Godfrey);
// relative error about 1e-15 for x > 0.
const LANCZOS_G = 7;
const LANCZOS_LEAD = 0.99999999999980993;
const LANCZOS_COEFFICIENTS: readonly number[] = [
  676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
];
const HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);

/**
 * Natural log of the gamma function, `ln Γ(x)`, for `x > 0`.
 *
 * Uses the Lanczos approximation (g = 7, 9 terms), relative error about 1e-15; the
 * reflection formula is not needed because every caller passes x > 0.
 * Source: Lanczos (1964) SIAM J. Numer. Anal. B 1:86–96; Press et al., Numerical Recipes
 * (3rd ed., §6.1).
 */
export function logGamma(x: number): number {
  requirePositive('x', x);
  const z = x - 1;
  let sum = LANCZOS_LEAD;
  LANCZOS_COEFFICIENTS.forEach((c, i) => {
    sum += c / (z + i + 1);
  });
  const t = z + LANCZOS_G + 0.5;
  return HALF_LOG_TWO_PI + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/**
 * Remainder of Stirling's series, `ln Γ(x) − [(x − ½) ln x − x + ½ ln 2π]`, for x ≥ 10.
 * Eight terms B_2k / (2k(2k − 1) x^(2k−1)) leave an error below 1e-16 there. Working
 * with this remainder lets `logBeta` cancel the huge (x ln x) parts analytically.
 */
function stirlingRemainder(x: number): number {
  const r = 1 / x;
  const r2 = r * r;
  return (
    r *
    (1 / 12 +
      r2 *
        (-1 / 360 +
          r2 *
            (1 / 1260 +
              r2 * (-1 / 1680 + r2 * (1 / 1188 + r2 * (-691 / 360360 + r2 * (1 / 156 + r2 * (-3617 / 122400))))))))
  );
}

/**
 * Natural log of the beta function, `ln B(a, b) = ln Γ(a) + ln Γ(b) − ln Γ(a + b)`, for
 * `a, b > 0`.
 *
 * Edge cases: for large arguments (say a = 1.8 million, b = ½, the sunrise problem) the
 * three log-gammas are each about 2.4e7 and their difference would lose eight digits;
 * when the larger argument is ≥ 10 the leading Stirling terms are cancelled by hand and
 * only the small remainders are subtracted, the scheme of SLATEC DLBETA (Fullerton 1977),
 * also used by R's `lbeta`.
 * Source: Abramowitz & Stegun 6.1.41 (Stirling's series) and 6.2.2; SLATEC DLBETA.
 */
export function logBeta(a: number, b: number): number {
  requirePositive('a', a);
  requirePositive('b', b);
  const p = Math.min(a, b);
  const q = Math.max(a, b);
  const ratio = p / (p + q);
  if (p >= 10) {
    const corr = stirlingRemainder(p) + stirlingRemainder(q) - stirlingRemainder(p + q);
    return -0.5 * Math.log(q) + HALF_LOG_TWO_PI + corr + (p - 0.5) * Math.log(ratio) + q * Math.log1p(-ratio);
  }
  if (q >= 10) {
    const corr = stirlingRemainder(q) - stirlingRemainder(p + q);
    return logGamma(p) + corr + p - p * Math.log(p + q) + (q - 0.5) * Math.log1p(-ratio);
  }
  return logGamma(p) + logGamma(q) - logGamma(p + q);
}

const CF_EPSILON = 1e-15;
const CF_TINY = 1e-300;

/**
 * Continued fraction for I_x(a, b), evaluated by the modified Lentz method (Numerical
 * Recipes `betacf`). Converges quickly for x < (a + 1)/(a + b + 2); the number of terms
 * needed grows like √max(a, b), so the cap scales with it.
 */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const maxTerms = 200 + Math.ceil(20 * Math.sqrt(Math.max(a, b)));
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < CF_TINY) d = CF_TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= maxTerms; m++) {
    const m2 = 2 * m;
    // Even step of the recurrence.
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < CF_TINY) d = CF_TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < CF_TINY) c = CF_TINY;
    d = 1 / d;
    h *= d * c;
    // Odd step.
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < CF_TINY) d = CF_TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < CF_TINY) c = CF_TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < CF_EPSILON) return h;
  }
  throw new RangeError(
    `the incomplete beta continued fraction did not converge for x = ${x}, a = ${a}, b = ${b}; ` +
      'use smaller shape parameters (counts up to tens of millions are supported).',
  );
}

/**
 * Regularized incomplete beta function `I_x(a, b)`, the Beta(a, b) distribution function.
 *
 * Parameters: `x` in [0, 1]; `a, b > 0` finite. Returns a value in [0, 1].
 * Edge cases: `I_0 = 0`, `I_1 = 1`. For x above the mean-ish point (a + 1)/(a + b + 2)
 * the symmetry `I_x(a, b) = 1 − I_(1−x)(b, a)` is used so the continued fraction always
 * converges fast. Relative accuracy (checked against 40-digit mpmath values) is about
 * 1e-13 for shapes up to a few thousand and about 1e-10 when a shape is in the millions,
 * where the prefactor's exponent and the longer continued fraction each cost digits.
 * Source: Abramowitz & Stegun 26.5.8 (continued fraction); Press et al., Numerical
 * Recipes (3rd ed., §6.4 `betai`/`betacf`; §5.2 modified Lentz method, Lentz 1976).
 */
export function regularizedIncompleteBeta(x: number, a: number, b: number): number {
  requireProbability('x', x);
  requirePositive('a', a);
  requirePositive('b', b);
  if (x === 0) return 0;
  if (x === 1) return 1;
  const logFront = a * Math.log(x) + b * Math.log1p(-x) - logBeta(a, b);
  if (x < (a + 1) / (a + b + 2)) {
    return Math.min(1, (Math.exp(logFront) * betaContinuedFraction(x, a, b)) / a);
  }
  return Math.max(0, 1 - (Math.exp(logFront) * betaContinuedFraction(1 - x, b, a)) / b);
}

const QUANTILE_MAX_STEPS = 2000;

/**
 * Quantile (inverse distribution function) of Beta(a, b): the `x` with `I_x(a, b) = q`.
 *
 * Parameters: `q` in [0, 1]; `a, b > 0` finite. Returns x in [0, 1]; `q = 0` gives 0 and
 * `q = 1` gives 1.
 * Method: Newton's method on `I_x(a, b) − q` (the derivative is the Beta density) kept
 * inside a shrinking bracket, falling back to bisection whenever a Newton step would
 * leave it (Numerical Recipes `rtsafe`). Stops when the step or the bracket is within a
 * few units in the last place of x, far below the 1e-12 the helpers need.
 * Source: Press et al., Numerical Recipes (3rd ed., §6.4 inverse incomplete beta and
 * §9.4 safeguarded Newton).
 */
export function betaQuantile(q: number, a: number, b: number): number {
  requireProbability('q', q);
  requirePositive('a', a);
  requirePositive('b', b);
  if (q === 0) return 0;
  if (q === 1) return 1;
  const logB = logBeta(a, b);
  let lo = 0;
  let hi = 1;
  let x = a / (a + b);
  for (let step = 0; step < QUANTILE_MAX_STEPS; step++) {
    const f = regularizedIncompleteBeta(x, a, b) - q;
    if (f === 0) return x;
    if (f < 0) lo = x;
    else hi = x;
    const density = Math.exp((a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) - logB);
    const newton = x - f / density;
    const next = Number.isFinite(newton) && newton > lo && newton < hi ? newton : 0.5 * (lo + hi);
    if (Math.abs(next - x) <= 4 * Number.EPSILON * next || hi - lo <= 4 * Number.EPSILON * hi) return next;
    x = next;
  }
  return x;
}

// ---------------------------------------------------------------------------------------
// Base-rate helper.

export interface Interval {
  low: number;
  high: number;
}

/**
 * Jeffreys interval for a binomial proportion: quantiles `(1 − level)/2` and
 * `(1 + level)/2` of Beta(k + ½, n − k + ½).
 *
 * Parameters: `k` events in `n` trials, whole numbers with 0 ≤ k ≤ n; `level` in (0, 1),
 * default 0.95.
 * Edge cases: the lower limit is 0 when k = 0 and the upper limit is 1 when k = n, the
 * modification Brown, Cai & DasGupta recommend (so n = 0 gives [0, 1]).
 * Source: Brown, Cai & DasGupta (2001) Statistical Science 16:101–133, §4.1.2.
 */
export function jeffreysInterval(k: number, n: number, level = 0.95): Interval {
  requireCount('n', n);
  requireCount('k', k);
  if (k > n) {
    throw new RangeError(`k must not exceed n (got k = ${k}, n = ${n}); pass the number of cases where it happened out of n.`);
  }
  if (typeof level !== 'number' || !(level > 0 && level < 1)) {
    throw new RangeError(`level must lie strictly between 0 and 1 (got ${String(level)}); pass e.g. 0.95.`);
  }
  const tail = (1 - level) / 2;
  const a = k + 0.5;
  const b = n - k + 0.5;
  return {
    low: k === 0 ? 0 : betaQuantile(tail, a, b),
    high: k === n ? 1 : betaQuantile(1 - tail, a, b),
  };
}

export interface SuccessionEstimate extends Interval {
  estimate: number;
}

/**
 * Laplace's rule of succession: after `k` of `n` comparable cases, the chance of the next
 * one is `(k + 1)/(n + 2)`, shown with the 95 % Jeffreys interval for the underlying rate.
 *
 * Parameters: whole numbers 0 ≤ k ≤ n; n up to several million is fine (Laplace's own
 * sunrise example, 1,826,213 of 1,826,213, gives 1826214/1826215).
 * Edge cases: 0 of 0 gives 0.5 with the interval [0, 1].
 * Source: Laplace (1814) Essai philosophique sur les probabilités; SCORING.md "Helpers";
 * interval: Brown, Cai & DasGupta (2001).
 */
export function ruleOfSuccession(k: number, n: number): SuccessionEstimate {
  const { low, high } = jeffreysInterval(k, n, 0.95);
  return { estimate: (k + 1) / (n + 2), low, high };
}

/**
 * Probability of at least one event in a window under a constant hazard (Poisson
 * process): `1 − exp(−r·w)`.
 *
 * Parameters: `ratePerPeriod` r ≥ 0 (expected events per period), `periods` w ≥ 0 (the
 * window in the same periods). Either being 0 gives 0. Computed with `expm1` so tiny
 * rates keep their precision.
 * Source: the exponential waiting-time law of the Poisson process (Feller, An
 * Introduction to Probability Theory and Its Applications, vol. 1); SCORING.md "Helpers".
 */
export function rateToWindow(ratePerPeriod: number, periods: number): number {
  requireNonNegative('ratePerPeriod', ratePerPeriod);
  requireNonNegative('periods', periods);
  return -Math.expm1(-ratePerPeriod * periods);
}

// ---------------------------------------------------------------------------------------
// Glide path.

/**
 * Glide path of an event-by-deadline forecast: with probability `p` stated at `t0` for
 * an event before `T`, and a constant hazard, the probability still due once the window
 * has run to `t` with nothing happening is `g(t) = 1 − (1 − p)^((T − t)/(T − t0))`.
 *
 * Parameters: `p` in [0, 1]; times `t0 < T` and `t` as epoch milliseconds (any common
 * unit works). Edge cases: `t` before `t0` gives `p` (no time has run yet); `t` at or
 * after `T` gives 0 (the window is spent); p = 1 stays 1 until T.
 * Source: constant-hazard survival `S(t) = e^(−λt)` solved for λ from `p`; SCORING.md
 * "Helpers" (glide path).
 */
export function glidePath(p: number, t0: number, T: number, t: number): number {
  requireProbability('p', p);
  requireFinite('t0', t0);
  requireFinite('T', T);
  requireFinite('t', t);
  if (!(T > t0)) {
    throw new RangeError(`T must be later than t0 (got t0 = ${t0}, T = ${T}); pass the window close after the forecast time.`);
  }
  if (t <= t0) return p;
  if (t >= T) return 0;
  const remaining = (T - t) / (T - t0);
  // 1 − (1 − p)^f written with log1p/expm1 so small p keeps its digits.
  return -Math.expm1(remaining * Math.log1p(-p));
}

export interface GlidePoint {
  t: number;
  p: number;
}

/**
 * The glide path sampled at `steps + 1` evenly spaced times from `t0` to `T` inclusive,
 * for charts.
 *
 * Parameters: as `glidePath`; `steps` a whole number ≥ 1. Each time is computed as
 * `t0 + (T − t0)·i/steps` (not by repeated addition) so the last point is exactly `T`.
 * Source: see `glidePath`.
 */
export function glidePathSeries(p: number, t0: number, T: number, steps: number): GlidePoint[] {
  if (!Number.isSafeInteger(steps) || steps < 1) {
    throw new RangeError(`steps must be a whole number of at least 1 (got ${String(steps)}); pass how many intervals to draw.`);
  }
  requireProbability('p', p);
  requireFinite('t0', t0);
  requireFinite('T', T);
  const points: GlidePoint[] = [];
  for (let i = 0; i <= steps; i++) {
    const t = i === steps ? T : t0 + ((T - t0) * i) / steps;
    points.push({ t, p: glidePath(p, t0, T, t) });
  }
  return points;
}

export interface StaleCheck {
  kind: QuestionKind;
  /** The current (latest) forecast. */
  p: number;
  /** When the current forecast was made (epoch ms). */
  lastRevisedAt: number;
  /** When the window opened (epoch ms); the hazard only runs inside the window. */
  openedAt?: number;
  closesAt: number;
  now: number;
  /** The question's check-in cadence in days; 0 means none set, so a week is used. */
  checkinDays: number;
}

/**
 * Whether an event-by-deadline forecast has gone stale against its glide path.
 *
 * Reading of SCORING.md/PRODUCT.md: the glide path is drawn from the current forecast
 * `p` at its own time, so `g(now) ≤ p` always; the gap `p − g(now)` is how far the
 * forecast has fallen behind what a constant hazard says it should be by now, with
 * nothing having happened. The forecast is stale when that gap exceeds 0.10 AND it has
 * not been revised for more than the check-in period (`checkinDays`; 0 → 7 days, common
 * practice). The glide path starts at the later of the forecast time and the window's
 * opening, since the event cannot happen before the window opens.
 *
 * Edge cases: state-at-deadline questions are never stale (no hazard runs down); once
 * `now ≥ closesAt` the question awaits resolution rather than revision, so it is not
 * stale; a forecast dated after `now` is not stale.
 * Source: SCORING.md "Helpers" (glide path); PRODUCT.md "Glide path".
 */
export function isStale(check: StaleCheck): boolean {
  const { kind, p, lastRevisedAt, openedAt, closesAt, now, checkinDays } = check;
  if (kind !== 'event_by_deadline' && kind !== 'state_at_deadline') {
    throw new RangeError(`kind must be 'event_by_deadline' or 'state_at_deadline' (got ${String(kind)}); pass the question's kind.`);
  }
  requireProbability('p', p);
  requireFinite('lastRevisedAt', lastRevisedAt);
  if (openedAt !== undefined) requireFinite('openedAt', openedAt);
  requireFinite('closesAt', closesAt);
  requireFinite('now', now);
  requireNonNegative('checkinDays', checkinDays);
  if (kind !== 'event_by_deadline') return false;
  if (now >= closesAt) return false;
  const graceDays = checkinDays === 0 ? DEFAULT_STALE_DAYS : checkinDays;
  if (!(now - lastRevisedAt > graceDays * MS_PER_DAY)) return false;
  const start = openedAt === undefined ? lastRevisedAt : Math.max(lastRevisedAt, openedAt);
  if (start >= closesAt) return false;
  return p - glidePath(p, start, closesAt, now) > STALE_MARGIN;
}

// ---------------------------------------------------------------------------------------
// Lenses and recalibration.

export interface WeightedLens {
  p: number;
  weight: number;
}

/**
 * Pool several perspective estimates by the weighted mean of their log-odds, optionally
 * extremized: `σ(a · Σ wᵢ logit(pᵢ) / Σ wᵢ)`.
 *
 * Parameters: `lenses` non-empty, each `p` in [0, 1] (clipped to [0.001, 0.999] before
 * the log-odds) and `weight` ≥ 0 finite, with a positive total weight; `extremize` a ≥ 1
 * finite (1 = plain log-odds average, the default).
 * Edge cases: a lens with weight 0 is ignored; a single lens returns its clipped `p`
 * when a = 1.
 * Source: Satopää et al. (2014) Int. J. Forecasting 30:344–356 (logit aggregator);
 * SCORING.md "Helpers" (lens pooling).
 */
/** Weights beyond this (or below its inverse) are pooled relative to the largest; see poolLenses. */
const WEIGHT_SCALE_LIMIT = 2 ** 500;

export function poolLenses(lenses: readonly WeightedLens[], extremize = 1): number {
  if (!Array.isArray(lenses) || lenses.length === 0) {
    throw new RangeError('lenses must be a non-empty list; add at least one lens estimate before pooling.');
  }
  if (typeof extremize !== 'number' || !Number.isFinite(extremize) || !(extremize >= 1)) {
    throw new RangeError(`extremize must be a finite number of at least 1 (got ${String(extremize)}); pass 1 for no extremizing.`);
  }
  let weightSum = 0;
  let weighted = 0;
  let largest = 0;
  lenses.forEach((lens, i) => {
    requireProbability(`lenses[${i}].p`, lens.p);
    requireNonNegative(`lenses[${i}].weight`, lens.weight);
    weightSum += lens.weight;
    weighted += lens.weight * logit(lens.p);
    if (lens.weight > largest) largest = lens.weight;
  });
  if (!(weightSum > 0)) {
    throw new RangeError('lenses must have a positive total weight (all weights are 0); give at least one lens a weight above 0.');
  }
  // Only the weights' ratios count. Near the ends of the double range the sums overflow
  // (1e308 + 1e308 is Infinity, and Infinity / Infinity NaN) or lose their digits among
  // subnormals (5e-324 · logit(0.2) rounds to a multiple of 5e-324); there the weights are
  // taken relative to the largest. Ordinary weights keep the formula exactly as written.
  if (largest > WEIGHT_SCALE_LIMIT || largest < 1 / WEIGHT_SCALE_LIMIT) {
    weightSum = 0;
    weighted = 0;
    for (const lens of lenses) {
      const w = lens.weight / largest;
      weightSum += w;
      weighted += w * logit(lens.p);
    }
  }
  return sigmoid((extremize * weighted) / weightSum);
}

/**
 * Recalibrated value of a stated probability under a fitted calibration line:
 * `σ(a + b · logit(p))`, `p` clipped to [0.001, 0.999].
 *
 * Parameters: `p` in [0, 1]; `intercept` a and `slope` b finite (from the scorecard's
 * logistic calibration fit). a = 0, b = 1 is the identity on [0.001, 0.999].
 * Source: Cox (1958) Biometrika 45:562–565; SCORING.md "Calibration intercept and slope".
 */
export function recalibrate(p: number, intercept: number, slope: number): number {
  requireProbability('p', p);
  requireFinite('intercept', intercept);
  requireFinite('slope', slope);
  return sigmoid(intercept + slope * logit(p));
}

// ---------------------------------------------------------------------------------------
// Lead over a reference forecast.

export interface TimedForecast {
  at: number;
  p: number;
}

export interface OwnForecast extends TimedForecast {
  /** Entry order: among forecasts with the same time the higher seq stands. */
  seq: number;
}

export interface ReferenceLead {
  own_at: number | null;
  ref_at: number | null;
  lead_days: number | null;
}

/**
 * The time from which a forecast history stood on the right side of 50 % without
 * crossing back before `T`, or null if it never settled there (or has no counting
 * forecast). `ordered` is sorted by time with ties in standing order (the last stands).
 */
function settledFrom(ordered: readonly TimedForecast[], outcome: 'yes' | 'no'): number | null {
  const right = (p: number): boolean => (outcome === 'yes' ? p > 0.5 : p < 0.5);
  // The standing forecast changes only at forecast times; keep the last one at each time.
  const steps: TimedForecast[] = [];
  for (const f of ordered) {
    const last = steps[steps.length - 1];
    if (last && last.at === f.at) last.p = f.p;
    else steps.push({ at: f.at, p: f.p });
  }
  // Walk back from T while the standing forecast is on the right side.
  let from: number | null = null;
  for (const step of steps.reverse()) {
    if (!right(step.p)) break;
    from = step.at;
  }
  return from;
}

function checkOutcome(outcome: string): asserts outcome is 'yes' | 'no' {
  if (outcome !== 'yes' && outcome !== 'no') {
    throw new RangeError(`outcome must be 'yes' or 'no' (got ${String(outcome)}); void questions have no lead to compute.`);
  }
}

/**
 * "Did I see it before they did?": for a question resolved `outcome`, the first time
 * from which the user's standing forecast was on the right side of 50 % (> 0.5 for Yes,
 * < 0.5 for No) and stayed there through `T`, the same for the reference forecasts, and
 * the lead `(ref_at − own_at)` in days (positive: the user got there first).
 *
 * Parameters: `own` forecasts {at, p, seq} and `refs` {at, p} with times in epoch ms and
 * p in [0, 1], in any order; `T` the window end (epoch ms). Only forecasts at or before
 * `T` count (SCORING.md "Which forecasts count"). The standing forecast at t is the
 * latest with time ≤ t; own ties are broken by `seq`, reference ties by list order
 * (later entry stands).
 * Edge cases: a side with no counting forecast, or whose final standing forecast is on
 * the wrong side (or exactly 0.5), gets null, and then `lead_days` is null.
 * Source: SCORING.md "Which forecasts count" (standing forecast), derived definition.
 */
export function referenceLead(
  own: readonly OwnForecast[],
  refs: readonly TimedForecast[],
  outcome: 'yes' | 'no',
  T: number,
): ReferenceLead {
  checkOutcome(outcome);
  requireFinite('T', T);
  if (!Array.isArray(own)) throw new RangeError('own must be a list of forecasts; pass [] when there are none.');
  if (!Array.isArray(refs)) throw new RangeError('refs must be a list of reference forecasts; pass [] when there are none.');
  own.forEach((f, i) => {
    requireFinite(`own[${i}].at`, f.at);
    requireProbability(`own[${i}].p`, f.p);
    requireFinite(`own[${i}].seq`, f.seq);
  });
  refs.forEach((f, i) => {
    requireFinite(`refs[${i}].at`, f.at);
    requireProbability(`refs[${i}].p`, f.p);
  });
  const ownOrdered = own.filter((f) => f.at <= T).sort((x, y) => x.at - y.at || x.seq - y.seq);
  // Array.prototype.sort is stable, so same-time references keep their list order.
  const refOrdered = refs.filter((f) => f.at <= T).sort((x, y) => x.at - y.at);
  const own_at = settledFrom(ownOrdered, outcome);
  const ref_at = settledFrom(refOrdered, outcome);
  const lead_days = own_at === null || ref_at === null ? null : (ref_at - own_at) / MS_PER_DAY;
  return { own_at, ref_at, lead_days };
}
