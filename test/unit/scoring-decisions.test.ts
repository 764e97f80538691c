import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  VALUE_CURVE_ALPHAS,
  costLossDecisions,
  costLossThreshold,
  falseAlarmRate,
  hitRate,
  peirceSkillScore,
  relativeValue,
  valueCurve,
  type CostLossCase,
} from '../../shared/scoring/index';

const close = (actual: number, expected: number, tol: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: got ${actual}, expected ${expected} ± ${tol}`);

// Finley's 1884 tornado forecasts (Wilks, Statistical Methods in the Atmospheric Sciences,
// 2nd ed., Table 7.1): hits 28, false alarms 72, misses 23, correct rejections 2680.
const FINLEY = { hits: 28, false_alarms: 72, misses: 23, correct_rejections: 2680 };

test("Finley's tornado table: hit rate, false alarm rate and Peirce score", () => {
  // Source: Wilks, Table 7.1 (2nd ed.): H 0.549, F 0.0262, Peirce (Hanssen–Kuipers) 0.523.
  close(hitRate(FINLEY)!, 0.549, 5e-4, 'H');
  close(falseAlarmRate(FINLEY)!, 0.0262, 5e-5, 'F');
  close(peirceSkillScore(FINLEY)!, 0.523, 5e-4, 'Peirce');
});

test("relative value at α = s equals Peirce on Finley's table", () => {
  // Source: Richardson 2000 (V is largest at α = s, where it equals H − F); Finley's
  // table gives 0.5229 (CHECK-VALUES.md).
  const s = 51 / 2803;
  const v = relativeValue(s, s, hitRate(FINLEY), falseAlarmRate(FINLEY))!;
  close(v, 0.5229, 5e-5, 'V(α = s)');
  close(v, peirceSkillScore(FINLEY)!, 1e-12, 'V(α = s) = H − F');
  // Derived from the formula: V is largest at α = s.
  for (const alpha of [s / 2, s * 0.9, s * 1.1, 0.1, 0.5]) {
    assert.ok(relativeValue(alpha, s, hitRate(FINLEY), falseAlarmRate(FINLEY))! < v, `α=${alpha}`);
  }
});

test("the cost-loss model reproduces Finley's table from decisions", () => {
  // Derived from SCORING.md: act when p > α; α = 1/(1 + 1) = 0.5 with equal costs.
  const cases: CostLossCase[] = [];
  const add = (count: number, p: number, o: number) => {
    for (let i = 0; i < count; i++) cases.push({ p, o, false_alarm: 1, miss: 1, base_rate: null });
  };
  add(28, 1, 1);
  add(72, 1, 0);
  add(23, 0, 1);
  add(2680, 0, 0);
  const d = costLossDecisions(cases);
  assert.deepEqual([d.hits, d.false_alarms, d.misses, d.correct_rejections], [28, 72, 23, 2680]);
  close(d.peirce!, 0.523, 5e-4, 'Peirce');
  assert.equal(d.cost, 72 + 23);
  assert.equal(d.cost_always, 2752);
  assert.equal(d.cost_never, 51);
  // No base rate given: the sample frequency 51/2803 < 0.5, so the base-rate policy never acts.
  assert.equal(d.cost_base_rate, 51);
});

test('decisions use each question’s own threshold and costs', () => {
  // Derived from SCORING.md: α = FA/(FA + M).
  assert.equal(costLossThreshold(1, 4), 0.2);
  // Costs may be any positive finite number: two near Number.MAX_VALUE, whose sum overflows,
  // still give their ratio (equal costs: act above ½), not α = 0 (act on anything).
  const M = Number.MAX_VALUE;
  assert.equal(costLossThreshold(M, M), 0.5);
  assert.equal(costLossThreshold(M, M / 4), 0.8);
  assert.equal(costLossThreshold(M, 1), 1);
  assert.equal(costLossDecisions([{ p: 0.3, o: 0, false_alarm: M, miss: M, base_rate: null }]).false_alarms, 0);
  const d = costLossDecisions([
    // α = 0.2: 0.3 > 0.2 → act; Yes → hit.
    { p: 0.3, o: 1, false_alarm: 1, miss: 4, base_rate: 0.1 },
    // α = 0.8: 0.7 ≤ 0.8 → no act; Yes → miss (cost 1). Base rate 0.9 > 0.8 → acts, no cost.
    { p: 0.7, o: 1, false_alarm: 4, miss: 1, base_rate: 0.9 },
    // α = 0.25: 0.6 > 0.25 → act; No → false alarm (cost 1). No base rate: the sample
    // frequency ō = 2/4 > 0.25 → the base-rate policy acts too (cost 1).
    { p: 0.6, o: 0, false_alarm: 1, miss: 3, base_rate: null },
    // α = 0.5: exactly at the threshold does not act (p > α is strict); No → correct rejection.
    { p: 0.5, o: 0, false_alarm: 3, miss: 3, base_rate: 0.2 },
  ]);
  assert.deepEqual([d.hits, d.false_alarms, d.misses, d.correct_rejections], [1, 1, 1, 1]);
  assert.equal(d.cost, 1 + 1);
  // Base-rate policy: q1 b 0.1 ≤ 0.2 → no act, Yes → miss 4; q2 acts → 0; q3 acts, No → 1; q4 no act → 0.
  assert.equal(d.cost_base_rate, 4 + 1);
  assert.equal(d.cost_always, 1 + 3);
  assert.equal(d.cost_never, 4 + 1);
  assert.equal(d.hit_rate, 0.5);
  assert.equal(d.false_alarm_rate, 0.5);
  assert.equal(d.peirce, 0);
});

test('rates are null where their denominators are zero', () => {
  // SCORING.md: H, F null when the denominator is 0; V null where H or F is undefined.
  const onlyYes = { hits: 3, false_alarms: 0, misses: 1, correct_rejections: 0 };
  assert.equal(falseAlarmRate(onlyYes), null);
  assert.equal(peirceSkillScore(onlyYes), null);
  assert.equal(hitRate({ hits: 0, false_alarms: 1, misses: 0, correct_rejections: 2 }), null);
  assert.equal(relativeValue(0.3, 0.4, null, 0.1), null);
  assert.equal(relativeValue(0.3, 0, 0.5, 0.1), null, 's = 0: denominator 0');
  const empty = costLossDecisions([]);
  assert.deepEqual([empty.hits, empty.cost, empty.cost_base_rate, empty.hit_rate, empty.peirce], [0, 0, 0, null, null]);
});

test('value curve: α = k/100, forecasts re-read at each α, Peirce at α = s', () => {
  // Derived from SCORING.md: α computed as k/100, never by repeated addition.
  assert.equal(VALUE_CURVE_ALPHAS.length, 99);
  VALUE_CURVE_ALPHAS.forEach((a, i) => assert.equal(a, (i + 1) / 100));
  assert.equal(VALUE_CURVE_ALPHAS[29], 0.3);
  // A table with s = 0.25 at any α in [0.1, 0.9): hits 20 (p 0.9), misses 5 (p 0.1),
  // false alarms 15 (p 0.9), correct rejections 60 (p 0.1) → H = 0.8, F = 0.2.
  const p = [...Array(20).fill(0.9), ...Array(5).fill(0.1), ...Array(15).fill(0.9), ...Array(60).fill(0.1)];
  const o = [...Array(25).fill(1), ...Array(75).fill(0)];
  const curve = valueCurve(p, o);
  assert.equal(curve.length, 99);
  assert.equal(curve[24]!.alpha, 0.25);
  // Richardson 2000: at α = s the value equals the Peirce score H − F = 0.6.
  close(curve[24]!.value!, 0.6, 1e-12, 'V(α = s)');
  // By hand at α = 0.3: (0.25 − 0.2·0.3·0.75 + 0.8·0.25·0.7 − 0.25) / (0.25 − 0.25·0.3).
  close(curve[29]!.value!, 0.095 / 0.175, 1e-12, 'V(0.3)');
  close(curve[29]!.value!, relativeValue(0.3, 0.25, 0.8, 0.2)!, 1e-15, 'V(0.3) via relativeValue');
  // At α = 0.95 nobody acts (p ≤ α): H = F = 0, V = 0 — no better than never acting
  // (derived from the formula: min(α, s) − s = 0 in the numerator).
  close(curve[94]!.value!, 0, 1e-12, 'V(0.95)');
  // Nothing scored, or one outcome only (F undefined): every value null.
  assert.ok(valueCurve([], []).every((pt) => pt.value === null));
  assert.ok(valueCurve([0.7, 0.2], [1, 1]).every((pt) => pt.value === null));
  assert.throws(() => valueCurve([1.5], [1]), RangeError);
  assert.throws(() => valueCurve([0.5], [2]), RangeError);
  assert.throws(() => valueCurve([0.5, 0.4], [1]), RangeError);
});

test('cost-loss inputs are validated', () => {
  assert.throws(() => costLossThreshold(0, 1), RangeError);
  assert.throws(() => costLossThreshold(1, -2), RangeError);
  assert.throws(() => costLossThreshold(Number.NaN, 1), RangeError);
  assert.throws(() => costLossDecisions([{ p: 1.5, o: 1, false_alarm: 1, miss: 1, base_rate: null }]), RangeError);
  assert.throws(() => costLossDecisions([{ p: 0.5, o: 1, false_alarm: 1, miss: 1, base_rate: 2 }]), RangeError);
  assert.throws(() => hitRate({ hits: -1, false_alarms: 0, misses: 0, correct_rejections: 0 }), RangeError);
  assert.throws(() => relativeValue(1.5, 0.5, 0.5, 0.5), RangeError);
});

test('a summed cost larger than a double holds is null, not Infinity; the decisions themselves still count', () => {
  const big = Number.MAX_VALUE;
  const d = costLossDecisions([
    { p: 0.1, o: 1, false_alarm: big, miss: big, base_rate: null },
    { p: 0.2, o: 1, false_alarm: big, miss: big, base_rate: null },
  ]);
  assert.equal(d.misses, 2);
  assert.equal(d.cost, null);
  assert.equal(d.cost_never, null);
  assert.equal(d.cost_always, 0);
});
