/**
 * A choice forecast as typed: one percent box per option. This module reads the boxes (the
 * live total, which boxes are blank), spreads what is left of 100 % over the blank ones, and
 * turns the boxes into the probability vector the diary stores, refusing anything the
 * contract would refuse (shared/choice-vector.ts holds the rule: the probabilities, added in
 * order, sum to 1 within 1e-6) with a sentence that says what to do.
 */
import { sumMiss, sumsToOne } from '../../../shared/choice-vector';
import { percentToProbability, type Parsed } from '../percent';

/** What the boxes add up to so far, for the live total under them. */
export interface ChoiceTotal {
  /** Sum of the filled boxes' probabilities, added in option order as the contract adds them. */
  sum: number;
  /** Indices of the empty boxes. */
  blanks: number[];
  /** Indices of boxes that hold something other than a percent from 0 to 100. */
  invalid: number[];
  /** True when every box is filled and valid and the sum is 1 within the tolerance. */
  complete: boolean;
}

export function choiceTotal(texts: readonly string[]): ChoiceTotal {
  let sum = 0;
  const blanks: number[] = [];
  const invalid: number[] = [];
  texts.forEach((text, k) => {
    const parsed = percentToProbability(text);
    if (!parsed.ok) invalid.push(k);
    else if (parsed.value === null) blanks.push(k);
    else sum += parsed.value;
  });
  return { sum, blanks, invalid, complete: blanks.length === 0 && invalid.length === 0 && sumsToOne(sum) };
}

/**
 * A share of 100% as people read it: up to two decimals, no trailing zeros ("33.33%", "90%");
 * a sum the contract refuses that two decimals would show as 100% gets the digits that show
 * it is not ("99.99989%").
 */
export function totalText(sum: number): string {
  const shown = Number((sum * 100).toFixed(2));
  return shown === 100 && !sumsToOne(sum) ? `${sumMiss(sum).percent}%` : `${shown}%`;
}

/** A refused total with what to change: "90% (10% short)", "100.00011% (0.00011% over)". */
function refusedTotal(sum: number): string {
  const miss = sumMiss(sum);
  return `${miss.percent}% (${miss.off}% ${miss.side})`;
}

/** Decimal places typed in a percent box ("12.5" → 1, "40" → 0, "1e-3" → 3). */
function decimals(text: string): number {
  const t = text.trim().toLowerCase();
  const [mantissa = '', exponent] = t.split('e');
  const fraction = mantissa.includes('.') ? mantissa.split('.')[1]!.length : 0;
  return Math.max(0, fraction - (exponent === undefined ? 0 : Number(exponent)));
}

/** The most decimal places spreading works in; finer than any share a person states. */
const MAX_SPREAD_DECIMALS = 6;

export type SpreadResult = { ok: true; texts: string[] } | { ok: false; reason: string };

/**
 * Fills the blank boxes with what is left of 100 %, shared evenly. The shares are decimals
 * (two places, or as many as the user typed, up to six) and the first boxes take the odd
 * hundredths, so the boxes add to exactly 100 in decimal: 100 − 10 over three blanks gives
 * 30, 30, 30; 100 over three gives 33.34, 33.33, 33.33.
 *
 * @param texts the boxes as typed, in option order
 * @returns the new box texts, or why nothing can be spread (no blank box, a box that is not
 *   a percent, the filled boxes already over 100 %)
 */
export function spreadRest(texts: readonly string[]): SpreadResult {
  const total = choiceTotal(texts);
  if (total.invalid.length) return { ok: false, reason: `Fix option ${total.invalid[0]! + 1} first: ${invalidReason(texts[total.invalid[0]!]!)}.` };
  if (total.blanks.length === 0) return { ok: false, reason: 'Leave blank the options you want the rest spread over.' };
  const places = Math.min(MAX_SPREAD_DECIMALS, Math.max(2, ...texts.map(decimals)));
  const unit = 10 ** places;
  // Whole units of 10^-places percent: exact integer arithmetic for what is left.
  let filledUnits = 0;
  texts.forEach((text, k) => {
    if (!total.blanks.includes(k)) filledUnits += Math.round(Number(text.trim()) * unit);
  });
  const left = 100 * unit - filledUnits;
  if (left < 0) return { ok: false, reason: `The filled options already add to ${totalText(total.sum)}; lower some so they add to at most 100%.` };
  const count = total.blanks.length;
  const each = Math.floor(left / count);
  const extra = left - each * count;
  const out = texts.slice();
  total.blanks.forEach((k, i) => {
    out[k] = unitsText(each + (i < extra ? 1 : 0), places);
  });
  return { ok: true, texts: out };
}

/** An integer count of 10^-places percent as decimal text without trailing zeros. */
function unitsText(units: number, places: number): string {
  const whole = Math.floor(units / 10 ** places);
  const fraction = String(units - whole * 10 ** places).padStart(places, '0').replace(/0+$/, '');
  return fraction ? `${whole}.${fraction}` : String(whole);
}

function invalidReason(text: string): string {
  const parsed = percentToProbability(text);
  return parsed.ok ? '' : parsed.error;
}

export interface ChoiceProblems {
  /** A problem with one option's box, by option index. */
  options: Record<number, string>;
  /** A problem with the set as a whole (the total). */
  total?: string;
}

/**
 * The boxes as a probability vector, or what is wrong: an option's box that is not a percent,
 * a blank option, or a total other than 100 % ("they add to 90 %"). The check is the
 * contract's own (`sumsToOne` on the probabilities added in option order).
 */
export function readChoiceForecast(texts: readonly string[]): Parsed<number[]> & { problems?: ChoiceProblems } {
  const options: Record<number, string> = {};
  const probs: number[] = [];
  texts.forEach((text, k) => {
    const parsed = percentToProbability(text);
    if (!parsed.ok) options[k] = parsed.error;
    else if (parsed.value === null) options[k] = 'give a chance, 0 if none, or use “Spread the rest”';
    else probs.push(parsed.value);
  });
  const firstBad = Object.keys(options)[0];
  if (firstBad !== undefined) {
    const k = Number(firstBad);
    return { ok: false, error: `Option ${k + 1}: ${options[k]}.`, problems: { options } };
  }
  let sum = 0;
  for (const p of probs) sum += p;
  if (!sumsToOne(sum)) {
    // Shares of 1 typed into percent boxes (0.6, 0.4) add to 1%: say how to write them, with
    // the user's own first share as the example.
    const example = probs.findIndex((p) => p > 0);
    const fractions = example >= 0 && probs.every((p) => p <= 0.01) && sumsToOne(sum * 100);
    const hint = fractions ? ` The boxes take percents: write ${Number((probs[example]! * 10_000).toPrecision(12))} for ${texts[example]!.trim()}.` : '';
    const total = `The chances must add to 100%; they add to ${refusedTotal(sum)}.${hint}`;
    return { ok: false, error: total, problems: { options, total } };
  }
  return { ok: true, value: probs };
}
