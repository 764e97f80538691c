/**
 * The smallest and largest of a list of numbers, in one pass. `Math.min(...list)` passes
 * every element as an argument, and a long list (a question with 150,000 revisions)
 * overflows the stack; use this for any list whose length a user decides.
 */
export interface Extent {
  /** Infinity for an empty list. */
  min: number;
  /** -Infinity for an empty list. */
  max: number;
}

export function extent(values: Iterable<number>): Extent {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return { min, max };
}
