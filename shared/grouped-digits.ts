/**
 * Whole numbers written with their digits grouped in threes by commas ("30,000"), as en-GB
 * and en-US both write them, without touching Intl: the first Intl call of a process
 * loads ICU's locale data (about 20 ms here), which every command-line start paid for a
 * few numbers in messages built at module load.
 */

/**
 * `n` with its digits grouped: `groupedDigits(1234567)` is "1,234,567", `groupedDigits(-1000)`
 * is "-1,000". For a safe integer this is what `n.toLocaleString('en-GB')` gives; anything
 * else (a fraction, beyond 2^53 − 1, not finite) goes to Intl, which knows its rounding.
 */
export function groupedDigits(n: number): string {
  if (!Number.isSafeInteger(n)) return n.toLocaleString('en-GB');
  const digits = String(Math.abs(n));
  let out = '';
  for (let end = digits.length; end > 0; end -= 3) out = (end > 3 ? ',' : '') + digits.slice(Math.max(0, end - 3), end) + out;
  return n < 0 || Object.is(n, -0) ? `-${out}` : out;
}
