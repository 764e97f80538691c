/**
 * Scores of one multiple-choice forecast (SCORING.md "Multiple-choice questions"). A
 * forecast is a vector `p_1 … p_K` over K exclusive and exhaustive options; the outcome
 * is the 0-based index `j` of the option that came true (`o_k = 1` for k = j, else 0).
 *
 * The exported functions check their input; the `…At` forms read a vector at an offset
 * of a flat array without checks, for the report, which validates every forecast once.
 */
import { choiceVectorProblem, optionCountProblem, optionIndexProblem } from '../choice-vector';
import { LOG_CLIP_LOW } from './accuracy';

function assertChoice(p: ArrayLike<number>, j: number | null, fn: string): void {
  const countProblem = optionCountProblem(p.length);
  if (countProblem !== null) throw new RangeError(`${fn}: the forecast ${countProblem}; give one probability per option.`);
  const problem = choiceVectorProblem(p, p.length);
  if (problem !== null) throw new RangeError(`${fn}: the forecast ${problem}.`);
  if (j === null) return;
  const jProblem = optionIndexProblem(j, p.length);
  if (jProblem !== null) throw new RangeError(`${fn}: the outcome ${jProblem}.`);
}

/**
 * Multi-category Brier score of one forecast, `Σ_k (p_k − o_k)²` (Brier 1950, Monthly
 * Weather Review 78:1–3, the original form): 0 is perfect, 2 is all probability on a
 * wrong option, and `1 − 1/K` is what the uniform forecast earns. For K = 2 it is twice
 * the yes/no Brier score of either option.
 *
 * @param p probabilities, one per option (2 ≤ K ≤ 12), each in [0, 1], summing to 1 within 1e-6
 * @param j index of the option that came true, 0 ≤ j < K
 */
export function multiCategoryBrier(p: ArrayLike<number>, j: number): number {
  assertChoice(p, j, 'multiCategoryBrier');
  return multiCategoryBrierAt(p, 0, p.length, j);
}

/** `multiCategoryBrier` of the K entries of `p` from `off`, unchecked. */
export function multiCategoryBrierAt(p: ArrayLike<number>, off: number, K: number, j: number): number {
  let sum = 0;
  for (let k = 0; k < K; k++) {
    const d = p[off + k]! - (k === j ? 1 : 0);
    sum += d * d;
  }
  return sum;
}

/**
 * Ranked probability score of one forecast over ordered options (Epstein 1969, J. Appl.
 * Meteor. 8:985–987; Murphy 1971, J. Appl. Meteor. 10:155–156, normalised form):
 * `Σ_{m=1}^{K−1} (P_m − O_m)² / (K − 1)` with cumulative `P_m = Σ_{k≤m} p_k` and
 * `O_m = Σ_{k≤m} o_k`. In [0, 1]; probability on an option next to the true one costs
 * less than on a far one. For K = 2 it equals the yes/no Brier score of the first option.
 *
 * @param p probabilities in option order, one per option (2 ≤ K ≤ 12), summing to 1 within 1e-6
 * @param j index of the option that came true, 0 ≤ j < K
 */
export function rankedProbabilityScore(p: ArrayLike<number>, j: number): number {
  assertChoice(p, j, 'rankedProbabilityScore');
  return rankedProbabilityScoreAt(p, 0, p.length, j);
}

/** `rankedProbabilityScore` of the K entries of `p` from `off`, unchecked. */
export function rankedProbabilityScoreAt(p: ArrayLike<number>, off: number, K: number, j: number): number {
  // The last cumulative term (m = K) is 1 − 1 = 0 and is left out, as the formula does.
  let cumulative = 0;
  let sum = 0;
  for (let m = 0; m < K - 1; m++) {
    cumulative += p[off + m]!;
    const d = cumulative - (m >= j ? 1 : 0);
    sum += d * d;
  }
  return sum / (K - 1);
}

/**
 * Log score of one forecast, `−ln max(p_j, 0.001)` (Good 1952, JRSS B 14:107–114;
 * natural log; scikit-learn `log_loss` in its multi-class form): only the probability
 * given to what happened counts. The clip at 0.001 (SCORING.md) makes a 0 on the true
 * option cost ln 1000 ≈ 6.9 instead of infinity.
 *
 * @param p probabilities, one per option (2 ≤ K ≤ 12), summing to 1 within 1e-6
 * @param j index of the option that came true, 0 ≤ j < K
 */
export function choiceLogScore(p: ArrayLike<number>, j: number): number {
  assertChoice(p, j, 'choiceLogScore');
  return choiceLogScoreAt(p, 0, j);
}

/** `choiceLogScore` of the vector at `off`, unchecked. */
export function choiceLogScoreAt(p: ArrayLike<number>, off: number, j: number): number {
  const pj = p[off + j]!;
  // 0 − ln, not −ln: a certain, correct forecast scores +0 rather than −0.
  return 0 - Math.log(pj < LOG_CLIP_LOW ? LOG_CLIP_LOW : pj);
}

/**
 * The top choice (Guo et al. 2017, ICML, "confidence" of a classifier): the option with
 * the highest probability; ties go to the lowest index, so the answer never depends on
 * anything but the vector.
 *
 * @param p probabilities, one per option (2 ≤ K ≤ 12), summing to 1 within 1e-6
 * @returns the 0-based index of the top option
 */
export function topChoice(p: ArrayLike<number>): number {
  assertChoice(p, null, 'topChoice');
  return topChoiceAt(p, 0, p.length);
}

/** `topChoice` of the K entries of `p` from `off`, unchecked. */
export function topChoiceAt(p: ArrayLike<number>, off: number, K: number): number {
  let best = 0;
  for (let k = 1; k < K; k++) if (p[off + k]! > p[off + best]!) best = k;
  return best;
}
