/**
 * Numbers on the Scorecard and Hindsight's calibration summary as people read them: scores
 * to three decimals, rates as whole percents, intervals as "21–94%". One place, so the
 * headline, the tables, the chart tooltips and Hindsight never disagree about how a figure
 * is written.
 */
import type { ScoreJson } from '../../../../shared/contract';
import { formatCount, userLocale } from '../../dates';

/** How many questions a view holds by standing, every type together: what "Here: 2 open, …" counts. */
export function viewTotals(report: ScoreJson): Record<'scored' | 'unscored' | 'void' | 'open', number> {
  const all = [report, report.choice, report.numeric];
  const total = (key: 'scored' | 'unscored' | 'void' | 'open') => all.reduce((sum, r) => sum + r[key], 0);
  return { scored: total('scored'), unscored: total('unscored'), void: total('void'), open: total('open') };
}

/** The typographic minus, so negative skill scores read as numbers and not as hyphens. */
function signed(text: string): string {
  return text.startsWith('-') ? `−${text.slice(1)}` : text;
}

/** e.g. 0.2026 → "0.203"; null → "—". Scores are small numbers where the third decimal matters. */
export function score3(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  // Rounding −0.0004 to three decimals would show "−0.000".
  const fixed = x.toFixed(3);
  return signed(fixed === '-0.000' ? '0.000' : fixed);
}

/**
 * What always saying 50% scores on the Brier scale, as every screen writes it beside a Brier
 * score (the Scorecard, Hindsight, the running chart's reference line), so one is never
 * "0.25" and another "0.250".
 */
export const ALWAYS_HALF_BRIER = '0.25';

/** Two decimals, for the short form in a sentence ("Brier 0.20 over 22 questions"). */
export function score2(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  const fixed = x.toFixed(2);
  return signed(fixed === '-0.00' ? '0.00' : fixed);
}

/** e.g. 0.667 → "67%"; null → "—". */
export function pct(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  return signed(`${Math.round(x * 100)}%`);
}

/** e.g. [0.21, 0.94] → "21–94%". */
export function pctInterval(low: number, high: number): string {
  return `${signed(String(Math.round(low * 100)))}–${signed(String(Math.round(high * 100)))}%`;
}

/** e.g. [0.099, 0.306] → "0.099–0.306". */
export function scoreInterval(iv: readonly [number, number]): string {
  return `${score3(iv[0])}–${score3(iv[1])}`;
}

const unitScoreFormats = new Map<string, Intl.NumberFormat>();

/**
 * A score in a numeric question's own unit (WIS, interval score): always two decimals,
 * digits grouped as the user's locale groups them — 1.9 → "1.90", 1.3333 → "1.33",
 * 9000 → "9,000.00" — so a column of them lines up and one figure is never written with
 * three decimals in one row and none in the next. A score above 0 too small for two
 * decimals reads "under 0.01", never "0.00": 0 means a perfect forecast. (Relative WIS, a
 * ratio, has two decimals too: `score2`.)
 */
export function unitScore(x: number, locale = userLocale()): string {
  let format = unitScoreFormats.get(locale);
  if (!format) {
    format = new Intl.NumberFormat(locale, { minimumFractionDigits: 2, maximumFractionDigits: 2 });
    unitScoreFormats.set(locale, format);
  }
  if (x > 0 && x < 0.005) return `under ${format.format(0.01)}`;
  return format.format(x + 0); // + 0: -0 reads "0.00"
}

/** "1 question" / "22 questions". */
export function questions(n: number): string {
  return `${formatCount(n)} question${n === 1 ? '' : 's'}`;
}

/**
 * A cost in the user's own units, digits grouped: whole numbers as such, otherwise up to
 * two decimals. A total too large to add up (null: larger than a double holds) says so.
 */
export function cost(x: number | null): string {
  return x === null ? 'too large to add up' : formatCount(Number(x.toFixed(2)));
}

/** A probability bin (index 0–10) by its centre: "90%". */
export function binLabel(index: number): string {
  return `${index * 10}%`;
}

/** e.g. 3.99 → "4.0 days", 1 → "1.0 day". */
export function days(x: number): string {
  const rounded = Math.abs(x).toFixed(1);
  return `${rounded} day${rounded === '1.0' ? '' : 's'}`;
}

/** An axis tick: up to two decimals, no trailing zeros ("0.25", "−0.5", "1"). */
export function tick(value: number | string): string {
  return signed(String(Number(Number(value).toFixed(2))));
}

export interface IdentityRow {
  /** '' for the first term, else '+' or '−' (U+2212), after folding in the term's own sign. */
  op: '' | '+' | '\u2212';
  symbol: string;
  /** The term's size; its sign is in `op`. */
  value: number;
}

/**
 * BS = REL − RES + UNC + WBV − WBC, written so every number is read once and every sign once:
 * a term that is itself negative turns its operator round ("− WBC" with WBC = −0.001 is
 * "+ 0.001"), never "− (−0.001)".
 */
export function identityRows(t: { rel: number; res: number; unc: number; wbv: number; wbc: number }): IdentityRow[] {
  const terms: [1 | -1, string, number][] = [
    [1, 'REL', t.rel],
    [-1, 'RES', t.res],
    [1, 'UNC', t.unc],
    [1, 'WBV', t.wbv],
    [-1, 'WBC', t.wbc],
  ];
  return terms.map(([sign, symbol, value], i) => {
    const signed = sign * value;
    // A zero keeps the formula's own operator ("− 0.000 RES", not "+ 0.000 RES").
    const op = i === 0 ? '' : signed < 0 || (signed === 0 && sign < 0) ? '\u2212' : '+';
    // The first term keeps its own sign in the number (it has no operator to carry it).
    return { op, symbol, value: i === 0 ? value : Math.abs(value) };
  });
}
