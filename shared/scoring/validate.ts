/**
 * Input checks shared by the scoring functions. Each throws a RangeError naming the
 * offending value and what a valid one looks like, so a caller's bug surfaces at the
 * boundary instead of as a NaN deep inside a report.
 */

/** Throws unless `p` is a number in [0, 1] (NaN is rejected). */
export function assertProbability(p: number, what: string): void {
  if (!(p >= 0 && p <= 1)) {
    throw new RangeError(`${what} is ${String(p)}; give a probability between 0 and 1.`);
  }
}

/** Throws unless every entry of `ps` is a probability in [0, 1]. */
export function assertProbabilities(ps: ArrayLike<number>, what: string): void {
  // The message is built only on failure: these loops run over every forecast.
  for (let i = 0; i < ps.length; i++) {
    const p = ps[i]!;
    if (!(p >= 0 && p <= 1)) assertProbability(p, `${what}[${i}]`);
  }
}

/** Throws unless every entry of `os` is exactly 0 or 1. */
export function assertOutcomes(os: ArrayLike<number>, what: string): void {
  for (let i = 0; i < os.length; i++) {
    const o = os[i];
    if (o !== 0 && o !== 1) {
      throw new RangeError(`${what}[${i}] is ${String(o)}; give 1 for Yes or 0 for No.`);
    }
  }
}

/** Throws unless forecasts and outcomes are non-empty and of the same length. */
export function assertPairs(p: ArrayLike<number>, o: ArrayLike<number>, fn: string): void {
  if (p.length !== o.length) {
    throw new RangeError(
      `${fn}: ${p.length} forecasts but ${o.length} outcomes; pass one outcome per forecast.`,
    );
  }
  if (p.length === 0) {
    throw new RangeError(`${fn}: no forecasts given; pass at least one forecast with its outcome.`);
  }
  assertProbabilities(p, `${fn}: forecast`);
  assertOutcomes(o, `${fn}: outcome`);
}

/** Throws unless `x` is a finite number. */
export function assertFinite(x: number, what: string): void {
  if (!Number.isFinite(x)) {
    throw new RangeError(`${what} is ${String(x)}; give a finite number.`);
  }
}

/** Throws unless `x` is a finite number greater than 0. */
export function assertPositive(x: number, what: string): void {
  if (!(Number.isFinite(x) && x > 0)) {
    throw new RangeError(`${what} is ${String(x)}; give a finite number greater than 0.`);
  }
}

/** How a message names a question of the input: its position and its id. */
export function describeQuestion(q: { id: string }, i: number): string {
  return `question ${i} (${JSON.stringify(q.id)})`;
}

/**
 * Throws a RangeError naming the question and the field, with a reason from one of the
 * shared rule checks (shared/choice-vector.ts, shared/quantile-levels.ts).
 */
export function failQuestion(q: { id: string }, i: number, field: string, problem: string): never {
  throw new RangeError(`${describeQuestion(q, i)}: ${field} ${problem}.`);
}
