/**
 * A numeric forecast as typed: one box per quantile level of the question (P10 / P50 / P90
 * by default), holding a number in the question's unit or, for a date question, a calendar
 * date. This module names the levels, reads the boxes and refuses a set that decreases with
 * the level, saying which two values are the wrong way round. The rule itself (one finite
 * value per level, non-decreasing) lives in shared/quantile-levels.ts.
 */
import type { ValueKind } from '../../../shared/domain';
import { levelName } from '../../../shared/forecast-text';
import { DECIMAL_NUMBER, dateToDays } from '../../../shared/numeric-value';
import { formatDay, formatDecimal } from '../dates';
import { quantilesProblem } from '../../../shared/quantile-levels';
import type { Parsed } from '../percent';

export type { ValueKind };

export { levelName };

/**
 * The box label: "P10 (low)", "P50 (median)", "P90 (high)". Only the ends of the question's
 * levels are its low and high; the levels between them go by their names ("P5 (low)", "P25",
 * "P50 (median)", "P75", "P95 (high)"), not a second "low" and "high".
 */
export function levelLabel(level: number, levels: readonly number[] = [level]): string {
  if (level === 0.5) return `${levelName(level)} (median)`;
  if (level === levels[0] && level < 0.5) return `${levelName(level)} (low)`;
  if (level === levels[levels.length - 1] && level > 0.5) return `${levelName(level)} (high)`;
  return levelName(level);
}

/** One sentence on what a level means, for the hint under the boxes. */
export function levelsHint(levels: readonly number[], unit: string): string {
  const low = levels[0];
  const high = levels[levels.length - 1];
  const inUnit = unit ? ` in ${unit}` : '';
  if (low === undefined || high === undefined || low === high) return `Your median${inUnit}: as likely above as below.`;
  const width = Math.round((high - low) * 100);
  const article = width === 80 || width === 8 || width === 18 ? 'an' : 'a';
  return `${levelName(low)}: only a ${Math.round(low * 100)}% chance the outcome is lower; ${levelName(high)}: only a ${Math.round((1 - high) * 100)}% chance it is higher. Together ${article} ${width}% range${inUnit}.`;
}

/** A value as readings show it (the boxes hold it unformatted): "13.5 weeks", "1,500 £k", a date in the user's format. */
export function formatValue(value: number, kind: ValueKind, unit: string, locale?: string): string {
  // A date value is a calendar day (days since 1970-01-01), shown in the user's own date
  // format like every other date; read as UTC so the day never shifts with a time zone.
  if (kind === 'date') return formatDay(value * 86_400_000, 'UTC', {}, locale);
  const text = formatDecimal(value + 0, 12, locale); // + 0: -0 reads "0"
  return unit ? `${text} ${unit}` : text;
}

/** One box's text as a value: a number, or for a date question a day from a date box ("YYYY-MM-DD"). */
export function readValue(text: string, kind: ValueKind): Parsed<number | null> {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, value: null };
  if (kind === 'date') {
    const days = dateToDays(trimmed);
    return days === null ? { ok: false, error: 'must be a calendar date' } : { ok: true, value: days };
  }
  if (!DECIMAL_NUMBER.test(trimmed)) return { ok: false, error: 'must be a number, e.g. 12.5' };
  const n = Number(trimmed);
  return Number.isFinite(n) ? { ok: true, value: n } : { ok: false, error: 'is too large a number to hold (beyond about ±1.8e308)' };
}

export interface NumericProblems {
  /** A problem with one level's box, by level index. */
  levels: Record<number, string>;
  /** A problem with the set as a whole (the order). */
  order?: string;
}

/**
 * The boxes as one value per level, or what is wrong: a box that is empty or not a value,
 * or a set that decreases with the level — "P90 (12 weeks) is below P50 (13 weeks)".
 *
 * @param texts the boxes in the order of `levels`
 * @param levels the question's quantile levels, ascending
 */
export function readNumericForecast(
  texts: readonly string[],
  levels: readonly number[],
  kind: ValueKind,
  unit: string,
): Parsed<number[]> & { problems?: NumericProblems } {
  const problems: Record<number, string> = {};
  const values: number[] = [];
  texts.forEach((text, k) => {
    const read = readValue(text, kind);
    if (!read.ok) problems[k] = read.error;
    else if (read.value === null) problems[k] = kind === 'date' ? 'pick a date' : 'enter a value';
    else values.push(read.value);
  });
  const firstBad = Object.keys(problems)[0];
  if (firstBad !== undefined) {
    const k = Number(firstBad);
    return { ok: false, error: `${levelName(levels[k]!)}: ${problems[k]}.`, problems: { levels: problems } };
  }
  const problem = quantilesProblem(values, levels.length);
  if (problem !== null) {
    const k = values.findIndex((v, i) => i > 0 && v < values[i - 1]!);
    if (k < 0) return { ok: false, error: `The values ${problem}.`, problems: { levels: {}, order: problem } };
    const order =
      `${levelName(levels[k]!)} (${formatValue(values[k]!, kind, unit)}) is ${kind === 'date' ? 'before' : 'below'} ` +
      `${levelName(levels[k - 1]!)} (${formatValue(values[k - 1]!, kind, unit)}); each value must be at least the one before it.`;
    return { ok: false, error: order, problems: { levels: { [k]: order }, order } };
  }
  return { ok: true, value: values };
}
