/**
 * Calibration intercept and slope: the logistic recalibration fit of Cox (1958).
 */
import { LOG_CLIP_HIGH, LOG_CLIP_LOW } from './accuracy';
import { assertOutcomes, assertProbabilities } from './validate';
import type { CalibrationFit } from './types';

/** Fewer scored questions than this and the fit is too noisy to report (SCORING.md). */
export const MIN_CALIBRATION_N = 20;

/** Newton steps plus step halvings; a well-posed fit needs well under 20. */
const MAX_ITERATIONS = 200;
const MAX_HALVINGS = 60;
const STEP_TOLERANCE = 1e-10;

function unfit(reason: string): CalibrationFit {
  return { intercept: null, slope: null, reason };
}

/**
 * Maximum-likelihood fit of `P(o = 1) = σ(a + b · logit(p))` with `p` clipped to
 * [0.001, 0.999] and no penalty (Cox 1958, Biometrika 45:562–565). `b < 1` means the
 * forecasts are too extreme, `b > 1` too timid; a perfectly calibrated forecaster has
 * a = 0, b = 1. Fitted by Newton's method (= IRLS for the logistic model) with step
 * halving, from a = b = 0, as statsmodels `Logit(...).fit(method='newton')` does
 * without the halving.
 *
 * Returns null intercept and slope with a plain-English reason instead of an estimate
 * when (checked in this order): fewer than 20 forecasts; only one outcome occurs; all
 * clipped forecasts are equal; the data are separable — every Yes forecast is ≥ every
 * No forecast or the reverse, the condition under which the one-predictor maximum
 * likelihood estimate does not exist (Albert & Anderson 1984, Biometrika 71:1–10) — or
 * Newton's method fails to converge.
 *
 * @param p final forecasts in [0, 1] (may be empty: then the fit is not reported)
 * @param o outcomes (1 Yes, 0 No), same length
 */
export function calibrationFit(p: ArrayLike<number>, o: ArrayLike<number>): CalibrationFit {
  if (p.length !== o.length) {
    throw new RangeError(
      `calibrationFit: ${p.length} forecasts but ${o.length} outcomes; pass one outcome per forecast.`,
    );
  }
  assertProbabilities(p, 'calibrationFit: forecast');
  assertOutcomes(o, 'calibrationFit: outcome');
  const n = p.length;
  if (n < MIN_CALIBRATION_N) {
    return unfit(`needs at least ${MIN_CALIBRATION_N} scored questions; there ${n === 1 ? 'is' : 'are'} ${n}`);
  }
  const x = new Float64Array(n);
  let yes = 0;
  let minYes = Infinity;
  let maxYes = -Infinity;
  let minNo = Infinity;
  let maxNo = -Infinity;
  for (let i = 0; i < n; i++) {
    const c = p[i]! < LOG_CLIP_LOW ? LOG_CLIP_LOW : p[i]! > LOG_CLIP_HIGH ? LOG_CLIP_HIGH : p[i]!;
    const xi = Math.log(c / (1 - c));
    x[i] = xi;
    if (o[i] === 1) {
      yes++;
      if (xi < minYes) minYes = xi;
      if (xi > maxYes) maxYes = xi;
    } else {
      if (xi < minNo) minNo = xi;
      if (xi > maxNo) maxNo = xi;
    }
  }
  if (yes === 0 || yes === n) {
    return unfit(`every scored question resolved ${yes === 0 ? 'No' : 'Yes'}; the fit needs both outcomes`);
  }
  if (Math.min(minYes, minNo) === Math.max(maxYes, maxNo)) {
    return unfit('every final forecast is the same, so there is no slope to fit');
  }
  if (maxNo <= minYes || maxYes <= minNo) {
    return unfit('the forecasts separate Yes from No perfectly, so the fitted slope would be infinite');
  }

  // Each pass evaluates the log-likelihood, gradient and Hessian at (a, b) together,
  // sharing one exp and one log1p per forecast. If the last Newton step lowered the
  // likelihood it is halved and re-evaluated: the log-likelihood is concave, so halving
  // always ends, and it keeps far-off starts from overshooting. The slack of 1e-12·|ll|
  // stops rounding noise at the optimum from shrinking a good last step.
  let a = 0;
  let b = 0;
  let da = 0;
  let db = 0;
  let best = -Infinity;
  let halvings = 0;
  for (let iter = 0; iter < MAX_ITERATIONS; iter++) {
    let ll = 0;
    let g0 = 0;
    let g1 = 0;
    let h00 = 0;
    let h01 = 0;
    let h11 = 0;
    for (let i = 0; i < n; i++) {
      const xi = x[i]!;
      const eta = a + b * xi;
      const e = Math.exp(-Math.abs(eta)); // ≤ 1, never overflows
      const mu = eta >= 0 ? 1 / (1 + e) : e / (1 + e);
      const y = o[i]!;
      ll += y * eta - (eta > 0 ? eta : 0) - Math.log1p(e);
      const r = y - mu;
      const w = mu * (1 - mu);
      g0 += r;
      g1 += r * xi;
      h00 += w;
      h01 += w * xi;
      h11 += w * xi * xi;
    }
    if (!(ll >= best - 1e-12 * Math.abs(best)) && halvings < MAX_HALVINGS) {
      da /= 2;
      db /= 2;
      a -= da;
      b -= db;
      halvings++;
      continue;
    }
    halvings = 0;
    best = ll;
    const det = h00 * h11 - h01 * h01;
    if (!(det > 0) || !Number.isFinite(det)) break;
    da = (h11 * g0 - h01 * g1) / det;
    db = (h00 * g1 - h01 * g0) / det;
    a += da;
    b += db;
    if (!Number.isFinite(a) || !Number.isFinite(b)) break;
    if (Math.max(Math.abs(da), Math.abs(db)) <= STEP_TOLERANCE * (1 + Math.max(Math.abs(a), Math.abs(b)))) {
      return { intercept: a, slope: b, reason: null };
    }
  }
  return unfit('the fit did not converge, so no estimate is reported');
}
