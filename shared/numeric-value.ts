/**
 * A numeric question's values across the API and in diary files: finite numbers, or for
 * a question of value kind `date` calendar dates written `YYYY-MM-DD`. The store and the
 * scoring engine keep a date as the number of days since 1970-01-01 (SCORING.md "Numeric
 * questions"), so a date is turned into a whole number of days once, here.
 */
import type { NumericValue, ValueKind } from './domain';

const DAY_MS = 86_400_000;

/**
 * A number as people and files write one: decimal notation with an optional exponent (what
 * String(number) writes and a spreadsheet saves). Number() alone would also take "", "0x1A"
 * (26), "0b1" and "Infinity". The one rule for typed and CSV numbers.
 */
export const DECIMAL_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Typed text (spaces at either end ignored) as a finite number, or null when it is not one in decimal notation. */
export function readDecimal(text: string): number | null {
  const trimmed = text.trim();
  if (!DECIMAL_NUMBER.test(trimmed)) return null;
  const n = Number(trimmed);
  return Number.isFinite(n) ? n : null;
}
const DATE_TEXT = /^(\d{4})-(\d{2})-(\d{2})$/;

/** The calendar date `YYYY-MM-DD` (years 0001–9999) as days since 1970-01-01, or null when it is no such date. */
export function dateToDays(text: string): number | null {
  const m = DATE_TEXT.exec(text);
  if (!m) return null;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (year < 1 || month < 1 || month > 12 || day < 1) return null;
  const d = new Date(0);
  d.setUTCFullYear(year, month - 1, day);
  if (d.getUTCFullYear() !== year || d.getUTCMonth() !== month - 1 || d.getUTCDate() !== day) return null;
  return Math.round(d.getTime() / DAY_MS);
}

/** Days since 1970-01-01 as the date `YYYY-MM-DD`. */
export function daysToDate(days: number): string {
  const d = new Date(days * DAY_MS);
  const year = String(d.getUTCFullYear()).padStart(4, '0');
  return `${year}-${String(d.getUTCMonth() + 1).padStart(2, '0')}-${String(d.getUTCDate()).padStart(2, '0')}`;
}

/**
 * Why `value` is not a value of a question of `kind`, or null: a finite number for
 * `number`, a real calendar date `YYYY-MM-DD` for `date`. Reads after the field's name.
 */
export function numericValueProblem(value: unknown, kind: ValueKind): string | null {
  if (kind === 'date') {
    if (typeof value !== 'string') return `must be a date YYYY-MM-DD (this question's values are dates), not ${describe(value)}`;
    return dateToDays(value) === null ? `must be a real calendar date YYYY-MM-DD (got "${value}")` : null;
  }
  if (typeof value !== 'number') return `must be a number (this question's values are numbers), not ${describe(value)}`;
  return Number.isFinite(value) ? null : `must be a finite number (got ${String(value)})`;
}

function describe(value: unknown): string {
  return typeof value === 'string' ? `the text "${value}"` : String(value);
}

/** A valid value (see `numericValueProblem`) as the number the store and the engine keep: dates as days. */
export function toStoredValue(value: NumericValue, kind: ValueKind): number {
  if (kind === 'number') return value as number;
  return dateToDays(value as string)!;
}

/** A stored value as the API and files carry it: dates back to `YYYY-MM-DD`. */
export function fromStoredValue(value: number, kind: ValueKind): NumericValue {
  return kind === 'date' ? daysToDate(value) : value;
}
