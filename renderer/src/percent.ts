/** Probabilities are stored as 0–1 and shown and typed in percent. */

/** e.g. 0.4 → "40%", 0.425 → "42.5%", 1/3 → "33.33%"; null → "—". */
export function formatPercent(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '—';
  return `${Number((p * 100).toFixed(2))}%`;
}

/** The text a percent box starts with for a stored probability. */
export function percentText(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '';
  return String(Number((p * 100).toPrecision(12)));
}

export type Parsed<T> = { ok: true; value: T } | { ok: false; error: string };

/**
 * Percent text → probability. Dividing by 100 in binary floating point leaves noise
 * (33.3 / 100 = 0.33299999999999996); rounding to 15 significant digits removes it while
 * keeping every digit a person can type, so the diary stores the number the user meant.
 * An empty box is `null` (not given).
 */
export function percentToProbability(text: string): Parsed<number | null> {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, value: null };
  const n = Number(trimmed);
  if (!Number.isFinite(n)) return { ok: false, error: 'must be a number of percent, e.g. 35' };
  if (n < 0 || n > 100) return { ok: false, error: 'must be between 0% and 100%' };
  return { ok: true, value: Number((n / 100).toPrecision(15)) };
}
