/**
 * The rules for a multiple-choice question's options and probability vectors
 * (SCORING.md "Multiple-choice questions"; INTERFACES.md "Question types"), in one place
 * so the scoring engine, the API contract and the diary file agree on what is valid.
 *
 * Each check returns null when the value is valid, or a reason that reads after the
 * field's name ("probs: must …"), so a zod refinement and a RangeError can both use it.
 */

/** A choice question has 2 to 12 options. */
export const MIN_OPTIONS = 2;
export const MAX_OPTIONS = 12;

/**
 * A probability vector must sum to 1 within this tolerance: typed decimals such as
 * 0.1 + 0.2 + 0.7 rarely add to exactly 1 in binary floating point, and a user who
 * typed three percentages that add to 100 % must not be refused.
 */
export const CHOICE_SUM_TOLERANCE = 1e-6;

/**
 * Why `count` is not a valid number of options, or null.
 *
 * @param count number of options K; valid when a whole number from 2 to 12
 */
export function optionCountProblem(count: number): string | null {
  if (!Number.isInteger(count) || count < MIN_OPTIONS || count > MAX_OPTIONS) {
    return `must be ${MIN_OPTIONS} to ${MAX_OPTIONS} options (got ${String(count)})`;
  }
  return null;
}

/**
 * True when `sum` is 1 within the tolerance, as the rule states it: `|sum − 1| ≤ 1e-6`
 * (NaN fails).
 */
export function sumsToOne(sum: number): boolean {
  return Math.abs(sum - 1) <= CHOICE_SUM_TOLERANCE;
}

/** How a sum that is not 1 within the tolerance reads: its percent and its distance from 100 %. */
export interface SumMiss {
  /** The sum as a percent, to as many decimals as `off` has ("99.99989"), digits grouped. */
  percent: string;
  /** How far the sum is from 100 %, in percent ("0.00011"), digits grouped. */
  off: string;
  /** Whether the sum falls short of 100 % or goes over it. */
  side: 'short' | 'over';
}

/**
 * A refused sum as a person can act on it: "99.99989 %, 0.00011 % short", never a rounded
 * "100 %" that reads as a sum the rule accepts. The distance takes at least three significant
 * digits, and more when moving the sum by the distance shown would still miss the tolerance
 * (66.6667 % is 33.3333 % short, not 33.3 %); the percent is rounded to the same decimal
 * place, so the two add up to 100 as shown.
 *
 * @param sum the probabilities added in option order, not 1 within the tolerance (finite)
 */
export function sumMiss(sum: number): SumMiss {
  const side = sum < 1 ? 'short' : 'over';
  const gap = Math.abs(1 - sum) * 100;
  let q = 3;
  while (q < 17 && !sumsToOne(sum + (side === 'short' ? 1 : -1) * (Number(gap.toPrecision(q)) / 100))) q++;
  const off = Number(gap.toPrecision(q));
  // A refused sum is at least 0.0001 % off, so `off` never prints in exponent form.
  const decimals = Math.min(20, (String(off).split('.')[1] ?? '').length);
  const grouped = new Intl.NumberFormat('en-GB', { maximumFractionDigits: decimals });
  return { percent: grouped.format(sum * 100), off: grouped.format(off), side };
}

/**
 * Why `probs` is not a valid probability vector over `count` options, or null: it must
 * hold one entry per option, each a number in [0, 1], and the entries, added in order
 * in double precision, must sum to 1 within 1e-6. Values are stored as given, never
 * renormalised.
 *
 * @param probs the vector (a plain array or a Float64Array)
 * @param count number of options K of the question
 */
export function choiceVectorProblem(probs: ArrayLike<number>, count: number): string | null {
  if (probs.length !== count) {
    return `must give one probability per option (${count}), not ${probs.length}`;
  }
  let sum = 0;
  for (let k = 0; k < probs.length; k++) {
    const p = probs[k]!;
    if (typeof p !== 'number' || !(p >= 0 && p <= 1)) {
      return `entry ${k} is ${String(p)}; each must be a probability between 0 and 1`;
    }
    sum += p;
  }
  if (!sumsToOne(sum)) {
    return `must sum to 1 (within ${CHOICE_SUM_TOLERANCE}); these sum to ${sum}`;
  }
  return null;
}

/**
 * Why `option` is not the index of one of `count` options, or null.
 *
 * @param option 0-based index of the option that came true
 * @param count number of options K
 */
export function optionIndexProblem(option: number, count: number): string | null {
  if (!Number.isInteger(option) || option < 0 || option >= count) {
    return `must be the 0-based index of an option, 0 to ${count - 1} (got ${String(option)})`;
  }
  return null;
}
