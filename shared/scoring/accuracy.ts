/**
 * Accuracy of probability forecasts for yes/no outcomes: Brier score, its time average,
 * the log score, and sharpness. Outcomes are 1 for Yes and 0 for No throughout.
 */
import { assertFinite, assertOutcomes, assertPairs, assertProbabilities, assertProbability } from './validate';

/** The log score (and the calibration fit) clip probabilities to this range. */
export const LOG_CLIP_LOW = 0.001;
export const LOG_CLIP_HIGH = 0.999;

/**
 * Clips `p` to [0.001, 0.999] so that ln and logit stay finite (SCORING.md: log score
 * and calibration fit only; the Brier score uses `p` as given).
 */
export function clipProbability(p: number): number {
  assertProbability(p, 'clipProbability: p');
  return p < LOG_CLIP_LOW ? LOG_CLIP_LOW : p > LOG_CLIP_HIGH ? LOG_CLIP_HIGH : p;
}

/**
 * Arithmetic mean of per-question figures, summed in order (each scored question has
 * weight 1, SCORING.md). The caller guarantees at least one value and finite entries.
 */
export function mean(xs: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < xs.length; i++) s += xs[i]!;
  return s / xs.length;
}

/**
 * Brier score, `mean((p − o)²)` (Brier 1950, Monthly Weather Review 78:1–3, in its
 * binary form; same as scikit-learn `brier_score_loss`). 0 is perfect, 0.25 is what
 * always saying 50 % earns.
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length as `p`
 */
export function brierScore(p: ArrayLike<number>, o: ArrayLike<number>): number {
  assertPairs(p, o, 'brierScore');
  let sum = 0;
  for (let i = 0; i < p.length; i++) {
    const d = p[i]! - o[i]!;
    sum += d * d;
  }
  return sum / p.length;
}

/**
 * Log score, `−mean(ln q)` with `q = p` for Yes and `1 − p` for No (Good 1952, JRSS B
 * 14:107–114; natural log, lower is better; same as scikit-learn `log_loss` on the
 * clipped forecasts). `p` is clipped to [0.001, 0.999] first, so one forecast of 0 % on
 * an event that happened costs ln 1000 ≈ 6.9 instead of infinity.
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length as `p`
 */
export function logScore(p: ArrayLike<number>, o: ArrayLike<number>): number {
  assertPairs(p, o, 'logScore');
  let sum = 0;
  for (let i = 0; i < p.length; i++) {
    const c = clipProbability(p[i]!);
    sum -= Math.log(o[i] === 1 ? c : 1 - c);
  }
  return sum / p.length;
}

/**
 * Squared error of the standing forecast averaged over the window `[start, end]`,
 * weighted by how long each forecast stood (SCORING.md "time-averaged Brier"). The
 * standing forecast at `t` is the latest entry with time ≤ `t`; entries later than `end`
 * never stand inside the window. When `start = end` the result is the squared error of
 * the forecast standing at `end`.
 *
 * @param times entry times, ascending; entries with the same time in entry order (the
 *   later one stands). Only the first `count` entries are read, so callers can pass
 *   reusable scratch buffers.
 * @param ps the probabilities entered at those times, in [0, 1]
 * @param count number of entries to read, ≥ 1
 * @param o outcome, 1 Yes or 0 No
 * @param start window start; a forecast must already stand then (`times[0] ≤ start`)
 * @param end window end, ≥ `start`
 */
export function timeAveragedSquaredError(
  times: ArrayLike<number>,
  ps: ArrayLike<number>,
  count: number,
  o: number,
  start: number,
  end: number,
): number {
  if (!Number.isInteger(count) || count < 1 || count > times.length || count > ps.length) {
    throw new RangeError(
      `timeAveragedSquaredError: count is ${String(count)}; give 1 to the number of entries passed.`,
    );
  }
  assertOutcomes([o], 'timeAveragedSquaredError: outcome');
  assertFinite(start, 'timeAveragedSquaredError: start');
  assertFinite(end, 'timeAveragedSquaredError: end');
  if (end < start) {
    throw new RangeError(`timeAveragedSquaredError: the window ends (${end}) before it starts (${start}); give start ≤ end.`);
  }
  for (let i = 0; i < count; i++) {
    const t = times[i]!;
    if (!Number.isFinite(t)) assertFinite(t, `timeAveragedSquaredError: time[${i}]`);
    if (!(ps[i]! >= 0 && ps[i]! <= 1)) assertProbability(ps[i]!, `timeAveragedSquaredError: p[${i}]`);
    if (i > 0 && t < times[i - 1]!) {
      throw new RangeError('timeAveragedSquaredError: entry times are not ascending; sort them by time, then entry order.');
    }
  }
  if (times[0]! > start) {
    throw new RangeError(
      'timeAveragedSquaredError: no forecast stands at the window start; start the window at or after the first entry.',
    );
  }
  return timeAverageUnchecked(times, ps, count, o, start, end);
}

/**
 * `timeAveragedSquaredError` without the input checks, for callers that have already
 * validated and sorted the entries (the scorer runs it for every scored question).
 */
export function timeAverageUnchecked(
  times: ArrayLike<number>,
  ps: ArrayLike<number>,
  count: number,
  o: number,
  start: number,
  end: number,
): number {
  if (end === start) {
    let k = 0;
    while (k + 1 < count && times[k + 1]! <= end) k++;
    const d = ps[k]! - o;
    return d * d;
  }
  let sum = 0;
  for (let i = 0; i < count; i++) {
    const lo = times[i]! > start ? times[i]! : start;
    const next = i + 1 < count ? times[i + 1]! : end;
    const hi = next < end ? next : end;
    if (hi > lo) {
      const d = ps[i]! - o;
      sum += d * d * (hi - lo);
    }
  }
  return sum / (end - start);
}

/**
 * Sharpness, `mean(2·|p − 0.5|)`: 0 when every forecast is 50 %, 1 when every forecast is
 * 0 or 1 (SCORING.md; a rescaled mean distance from 50 %, cf. Murphy 1973's
 * refinement). Says nothing about accuracy on its own.
 *
 * @param p forecasts in [0, 1], non-empty
 */
export function sharpness(p: ArrayLike<number>): number {
  if (p.length === 0) throw new RangeError('sharpness: no forecasts given; pass at least one.');
  assertProbabilities(p, 'sharpness: forecast');
  let sum = 0;
  for (let i = 0; i < p.length; i++) sum += Math.abs(2 * p[i]! - 1);
  return sum / p.length;
}

/**
 * Share of forecasts that are exactly 0 or exactly 1 (SCORING.md): certainty that a
 * proper score punishes without limit when wrong.
 *
 * @param p forecasts in [0, 1], non-empty
 */
export function shareCertain(p: ArrayLike<number>): number {
  if (p.length === 0) throw new RangeError('shareCertain: no forecasts given; pass at least one.');
  assertProbabilities(p, 'shareCertain: forecast');
  let k = 0;
  for (let i = 0; i < p.length; i++) if (p[i] === 0 || p[i] === 1) k++;
  return k / p.length;
}
