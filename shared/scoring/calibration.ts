/**
 * Calibration bins and the Murphy decomposition of the Brier score.
 */
import { wilsonInterval } from './intervals';
import type { ReportBin } from './types';
import { assertPairs, assertProbability } from './validate';

/**
 * The scorecard's bin edges, `e_k = (2k − 1)/20` for k = 1…10 (SCORING.md): 11 bins
 * centred on 0 %, 10 %, …, 100 %. Computed by division so each edge is the double
 * nearest to 0.05, 0.15, … — the same double a user's typed "0.15" parses to.
 */
export const SCORECARD_BIN_EDGES: readonly number[] = Object.freeze(
  Array.from({ length: 10 }, (_, i) => (2 * (i + 1) - 1) / 20),
);

/**
 * Bin of `p` = the number of edges `e ≤ p` (SCORING.md). With edges [1/3, 2/3] this is
 * scikit-learn `calibration_curve`'s uniform strategy (`searchsorted(..., side='right')`).
 *
 * @param p forecast in [0, 1]
 * @param edges inner bin edges, ascending
 * @returns 0 … edges.length
 */
export function binIndex(p: number, edges: readonly number[]): number {
  assertProbability(p, 'binIndex: p');
  assertEdges(edges, 'binIndex');
  return binOf(p, edges);
}

/** `binIndex` without the checks, for loops whose inputs were validated once up front. */
function binOf(p: number, edges: readonly number[]): number {
  let k = 0;
  while (k < edges.length && edges[k]! <= p) k++;
  return k;
}

function assertEdges(edges: readonly number[], fn: string): void {
  for (let i = 0; i < edges.length; i++) {
    if (!Number.isFinite(edges[i]!) || (i > 0 && edges[i]! <= edges[i - 1]!)) {
      throw new RangeError(`${fn}: bin edges must be finite and strictly ascending; edge ${i} is ${String(edges[i])}.`);
    }
  }
}

export interface CalibrationBin {
  /** 0 … edges.length. */
  index: number;
  n: number;
  /** Number of Yes outcomes in the bin. */
  yes: number;
  mean_p: number;
  /** Observed frequency of Yes, `yes / n`. */
  observed: number;
}

/**
 * Reliability-diagram bins: per non-empty bin its size, mean forecast and observed
 * frequency (SCORING.md; as scikit-learn `calibration_curve` returns `prob_pred` and
 * `prob_true`, which also drops empty bins).
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length
 * @param edges inner bin edges, strictly ascending (SCORECARD_BIN_EDGES for the scorecard)
 * @returns the non-empty bins in index order
 */
export function calibrationBins(
  p: ArrayLike<number>,
  o: ArrayLike<number>,
  edges: readonly number[],
): CalibrationBin[] {
  assertPairs(p, o, 'calibrationBins');
  assertEdges(edges, 'calibrationBins');
  const nb = edges.length + 1;
  const n = new Float64Array(nb);
  const sumP = new Float64Array(nb);
  const yes = new Float64Array(nb);
  for (let i = 0; i < p.length; i++) {
    const k = binOf(p[i]!, edges);
    n[k] = n[k]! + 1;
    sumP[k] = sumP[k]! + p[i]!;
    yes[k] = yes[k]! + o[i]!;
  }
  const bins: CalibrationBin[] = [];
  for (let k = 0; k < nb; k++) {
    if (n[k]! > 0) {
      bins.push({ index: k, n: n[k]!, yes: yes[k]!, mean_p: sumP[k]! / n[k]!, observed: yes[k]! / n[k]! });
    }
  }
  return bins;
}

/**
 * The scorecard's calibration bins as reports list them: the 11 bins of SCORING.md
 * (non-empty only), each with the Wilson 95 % interval of its observed frequency (Wilson
 * 1927). Used for yes/no questions and for the options of choice questions alike.
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length
 */
export function reportBins(p: ArrayLike<number>, o: ArrayLike<number>): ReportBin[] {
  return calibrationBins(p, o, SCORECARD_BIN_EDGES).map((b) => {
    const [wilson_low, wilson_high] = wilsonInterval(b.yes, b.n);
    return { index: b.index, n: b.n, mean_p: b.mean_p, observed: b.observed, wilson_low, wilson_high };
  });
}

export interface BrierDecomposition {
  reliability: number;
  resolution: number;
  uncertainty: number;
  within_bin_variance: number;
  within_bin_covariance: number;
}

/**
 * Five-term decomposition of the Brier score over bins (Murphy 1973, J. Appl. Meteor.
 * 12:595–600, for REL, RES, UNC; Stephenson, Coelho & Jolliffe 2008, Weather and
 * Forecasting 23:752–757, for the two within-bin terms that make it exact when
 * forecasts within a bin differ):
 *
 *   BS = REL − RES + UNC + WBV − WBC
 *
 * with REL = Σ n_k (p̄_k − ō_k)²/N, RES = Σ n_k (ō_k − ō)²/N, UNC = ō(1 − ō),
 * WBV = Σ_k Σ_{i∈k} (p_i − p̄_k)²/N, WBC = 2 Σ_k Σ_{i∈k} (p_i − p̄_k)(o_i − ō_k)/N.
 * When every forecast equals its bin's mean, WBV = WBC = 0 and Murphy's three terms are
 * exact on their own.
 *
 * @param p forecasts in [0, 1], non-empty
 * @param o outcomes (1 Yes, 0 No), same length
 * @param edges inner bin edges, strictly ascending
 */
export function brierDecomposition(
  p: ArrayLike<number>,
  o: ArrayLike<number>,
  edges: readonly number[],
): BrierDecomposition {
  const bins = calibrationBins(p, o, edges);
  const N = p.length;
  const meanP = new Float64Array(edges.length + 1);
  const obs = new Float64Array(edges.length + 1);
  let yesTotal = 0;
  for (const b of bins) yesTotal += b.yes;
  const oBar = yesTotal / N;
  let rel = 0;
  let res = 0;
  for (const b of bins) {
    meanP[b.index] = b.mean_p;
    obs[b.index] = b.observed;
    rel += b.n * (b.mean_p - b.observed) ** 2;
    res += b.n * (b.observed - oBar) ** 2;
  }
  // Second pass against the bin means (not Σp² − n·p̄²) so that nearly equal forecasts
  // do not lose their within-bin spread to cancellation.
  let wbv = 0;
  let wbc = 0;
  for (let i = 0; i < N; i++) {
    const k = binOf(p[i]!, edges);
    const dp = p[i]! - meanP[k]!;
    wbv += dp * dp;
    wbc += dp * (o[i]! - obs[k]!);
  }
  return {
    reliability: rel / N,
    resolution: res / N,
    uncertainty: oBar * (1 - oBar),
    within_bin_variance: wbv / N,
    within_bin_covariance: (2 * wbc) / N,
  };
}
