/**
 * Consequences of acting on forecasts: the cost-loss model (Thompson 1952, Bull. AMS
 * 33:223–226; Murphy 1977, Monthly Weather Review 105:803–816), the 2×2 contingency
 * table it produces, and relative economic value (Richardson 2000, QJRMS 126:649–667).
 */
import { assertOutcomes, assertPositive, assertProbability } from './validate';
import type { DecisionSummary, ValuePoint } from './types';

/**
 * Decision threshold of the cost-loss model, `α = FA / (FA + M)`: acting pays off in
 * expectation exactly when the probability of the event exceeds α (Thompson 1952).
 *
 * @param falseAlarm cost of acting when nothing happens, > 0
 * @param miss cost of not acting when it happens, > 0
 */
export function costLossThreshold(falseAlarm: number, miss: number): number {
  assertPositive(falseAlarm, 'costLossThreshold: false-alarm cost');
  assertPositive(miss, 'costLossThreshold: miss cost');
  const total = falseAlarm + miss;
  if (Number.isFinite(total)) return falseAlarm / total;
  // Two costs near Number.MAX_VALUE add up to Infinity, and FA / Infinity would be 0 (act
  // on anything); the same ratio written with M / FA stays finite.
  return 1 / (1 + miss / falseAlarm);
}

export interface ContingencyTable {
  hits: number;
  false_alarms: number;
  misses: number;
  correct_rejections: number;
}

function assertTable(t: ContingencyTable, fn: string): void {
  for (const [name, v] of [
    ['hits', t.hits],
    ['false_alarms', t.false_alarms],
    ['misses', t.misses],
    ['correct_rejections', t.correct_rejections],
  ] as const) {
    if (!Number.isInteger(v) || v < 0) {
      throw new RangeError(`${fn}: ${name} is ${String(v)}; give a whole count ≥ 0.`);
    }
  }
}

/**
 * Hit rate (probability of detection) `H = hits / (hits + misses)` (Wilks, Statistical
 * Methods in the Atmospheric Sciences, ch. 7, 2×2 contingency tables).
 *
 * @returns H, or null when no event occurred (no denominator)
 */
export function hitRate(t: ContingencyTable): number | null {
  assertTable(t, 'hitRate');
  const d = t.hits + t.misses;
  return d === 0 ? null : t.hits / d;
}

/**
 * False alarm rate (probability of false detection) `F = false alarms / (false alarms +
 * correct rejections)` (Wilks, ch. 7; not the false alarm *ratio*).
 *
 * @returns F, or null when the event always occurred (no denominator)
 */
export function falseAlarmRate(t: ContingencyTable): number | null {
  assertTable(t, 'falseAlarmRate');
  const d = t.false_alarms + t.correct_rejections;
  return d === 0 ? null : t.false_alarms / d;
}

/**
 * Peirce skill score (Hanssen–Kuipers discriminant, true skill statistic) `H − F`
 * (Peirce 1884, Science 4:453–454; Wilks, ch. 7). 0 for random or constant decisions,
 * 1 for perfect ones.
 *
 * @returns H − F, or null when H or F is undefined
 */
export function peirceSkillScore(t: ContingencyTable): number | null {
  const h = hitRate(t);
  const f = falseAlarmRate(t);
  return h === null || f === null ? null : h - f;
}

/**
 * Relative economic value of a yes/no warning system for a user with cost-loss ratio
 * α (Richardson 2000, QJRMS 126:649–667, with the climatological expense
 * `min(α, s)`):
 *
 *   V = (min(α, s) − F·α·(1 − s) + H·s·(1 − α) − s) / (min(α, s) − s·α)
 *
 * 1 means as good as perfect foresight, 0 no better than the best of always/never
 * acting. At α = s it equals the Peirce skill score H − F.
 *
 * @param alpha cost-loss ratio, in [0, 1]
 * @param s sample frequency of the event, in [0, 1]
 * @param h hit rate, or null when undefined
 * @param f false alarm rate, or null when undefined
 * @returns V, or null when H or F is undefined or the denominator is 0 (s = 0 or 1,
 *   α = 0 or 1: climatology is already perfect and there is no value to gain)
 */
export function relativeValue(alpha: number, s: number, h: number | null, f: number | null): number | null {
  assertProbability(alpha, 'relativeValue: alpha');
  assertProbability(s, 'relativeValue: sample frequency');
  if (h === null || f === null) return null;
  assertProbability(h, 'relativeValue: hit rate');
  assertProbability(f, 'relativeValue: false alarm rate');
  const climate = Math.min(alpha, s);
  const denom = climate - s * alpha;
  if (denom === 0) return null;
  return (climate - f * alpha * (1 - s) + h * s * (1 - alpha) - s) / denom;
}

/** The cost ratios of the value curve: α = k/100 for k = 1…99, each by one division. */
export const VALUE_CURVE_ALPHAS: readonly number[] = Object.freeze(Array.from({ length: 99 }, (_, i) => (i + 1) / 100));

/**
 * The value curve (SCORING.md; Richardson 2000, §3 for probability forecasts):
 * `relativeValue` at α = k/100 for k = 1…99. At each cost ratio α the forecasts are read
 * as the decisions a user with that ratio would take — act when p > α (Thompson 1952;
 * Murphy 1977) — which gives that user's own hit rate H(α) and false alarm rate F(α).
 * The curve shows which users, by cost ratio, would have gained by acting on these calls;
 * at α = s it equals the Peirce score of the decisions thresholded at s.
 *
 * @param p final forecasts of the scored questions, each in [0, 1]
 * @param o outcomes, 1 Yes and 0 No, same length as `p`
 * @returns 99 points `{ alpha, value }`; value null where H(α) or F(α) is undefined (one
 *   outcome only) or the denominator is 0; every value null when nothing is scored
 */
export function valueCurve(p: ArrayLike<number>, o: ArrayLike<number>): ValuePoint[] {
  if (p.length !== o.length) throw new RangeError(`valueCurve: p and o must have the same length (got ${p.length} and ${o.length}).`);
  const n = p.length;
  let yes = 0;
  for (let i = 0; i < n; i++) {
    assertProbability(p[i]!, 'valueCurve: forecast');
    if (o[i] !== 0 && o[i] !== 1) throw new RangeError(`valueCurve: outcomes must be 0 or 1 (got ${String(o[i])} at index ${i}).`);
    yes += o[i]!;
  }
  if (n === 0) return VALUE_CURVE_ALPHAS.map((alpha) => ({ alpha, value: null }));
  const s = yes / n;
  return VALUE_CURVE_ALPHAS.map((alpha) => {
    let hits = 0;
    let falseAlarms = 0;
    for (let i = 0; i < n; i++) {
      if (p[i]! > alpha) {
        if (o[i] === 1) hits++;
        else falseAlarms++;
      }
    }
    const table = { hits, misses: yes - hits, false_alarms: falseAlarms, correct_rejections: n - yes - falseAlarms };
    return { alpha, value: relativeValue(alpha, s, hitRate(table), falseAlarmRate(table)) };
  });
}

/** One scored question as the cost-loss model sees it. */
export interface CostLossCase {
  /** Final forecast. */
  p: number;
  /** 1 Yes, 0 No. */
  o: number;
  false_alarm: number;
  miss: number;
  /** Stated base rate, or null to act on the sample frequency instead. */
  base_rate: number | null;
}

/**
 * A summed cost, or null when the sum is larger than a double holds: each cost may be any
 * finite number, and two near Number.MAX_VALUE add up to Infinity, which is no total.
 */
function representable(total: number): number | null {
  return Number.isFinite(total) ? total : null;
}

/**
 * Decisions and realised costs over scored questions (SCORING.md "Consequences"): each
 * question has its own threshold α = FA/(FA + M) and the forecast says act when p > α
 * (Thompson 1952; Murphy 1977). Returns the 2×2 table, H, F, Peirce, and the summed
 * costs of the user's decisions, of acting when the base rate exceeds α (questions
 * without one use the sample frequency ō), of always acting, and of never acting.
 * Perfect foresight costs 0 and is not listed. A total larger than a double holds is null.
 *
 * @param cases scored questions (may be empty: counts and costs are then 0, rates null)
 */
export function costLossDecisions(cases: readonly CostLossCase[]): DecisionSummary {
  let yesCount = 0;
  for (let i = 0; i < cases.length; i++) {
    const c = cases[i]!;
    // Messages are built only for a failing value: this runs once per scored question.
    if (!(c.p >= 0 && c.p <= 1)) assertProbability(c.p, `costLossDecisions: case ${i} forecast`);
    if (c.o !== 0 && c.o !== 1) assertOutcomes([c.o], `costLossDecisions: case ${i} outcome`);
    if (c.base_rate !== null && !(c.base_rate >= 0 && c.base_rate <= 1)) {
      assertProbability(c.base_rate, `costLossDecisions: case ${i} base rate`);
    }
    yesCount += c.o;
  }
  const oBar = cases.length === 0 ? 0 : yesCount / cases.length;
  const t: ContingencyTable = { hits: 0, false_alarms: 0, misses: 0, correct_rejections: 0 };
  let cost = 0;
  let costBaseRate = 0;
  let costAlways = 0;
  let costNever = 0;
  for (const c of cases) {
    const alpha = costLossThreshold(c.false_alarm, c.miss);
    const act = c.p > alpha;
    const actOnBaseRate = (c.base_rate ?? oBar) > alpha;
    if (c.o === 1) {
      if (act) t.hits++;
      else {
        t.misses++;
        cost += c.miss;
      }
      if (!actOnBaseRate) costBaseRate += c.miss;
      costNever += c.miss;
    } else {
      if (act) {
        t.false_alarms++;
        cost += c.false_alarm;
      } else t.correct_rejections++;
      if (actOnBaseRate) costBaseRate += c.false_alarm;
      costAlways += c.false_alarm;
    }
  }
  return {
    ...t,
    hit_rate: hitRate(t),
    false_alarm_rate: falseAlarmRate(t),
    peirce: peirceSkillScore(t),
    cost: representable(cost),
    cost_base_rate: representable(costBaseRate),
    cost_always: representable(costAlways),
    cost_never: representable(costNever),
  };
}
