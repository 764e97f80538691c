import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  ALLOWED_QUANTILE_LEVELS,
  DEFAULT_QUANTILE_LEVELS,
  quantileLevelsProblem,
  quantilesProblem,
} from '../../shared/quantile-levels';
import {
  centralIntervals,
  computeNumericDetail,
  computeNumericReport,
  computeNumericSurprises,
  intervalScore,
  landedGap,
  nominalLevel,
  quantileScore,
  weightedIntervalScore,
  wilsonInterval,
  type ScoringNumericQuestion,
} from '../../shared/scoring/index';
import { DAY, T0, close, mulberry32, nextDown, nextUp, nf, numericQuestion, shuffled } from './scoring-support';

/** A random diary of numeric questions over several level sets, revised a few times. */
function randomNumericDiary(seed: number, n: number): ScoringNumericQuestion[] {
  const rand = mulberry32(seed);
  const sets = [[0.5], [0.1, 0.5, 0.9], [0.05, 0.25, 0.5, 0.75, 0.95], [...ALLOWED_QUANTILE_LEVELS]];
  return Array.from({ length: n }, (_, i) => {
    const levels = sets[i % sets.length]!;
    const centre = Math.floor(rand() * 100);
    const entries: [number, number[]][] = [];
    const revisions = 1 + Math.floor(rand() * 4);
    for (let r = 0; r < revisions; r++) {
      const spread = 1 + Math.floor(rand() * 20);
      const qs = levels.map((tau) => centre + Math.round((tau - 0.5) * 2 * spread + (rand() - 0.5) * 4));
      qs.sort((a, b) => a - b);
      entries.push([r * 2 + Math.floor(rand() * 3), qs]);
    }
    const y = centre + Math.round((rand() - 0.5) * 60);
    return numericQuestion(`n${String(i).padStart(3, '0')}`, y, nf(...entries), { levels, tags: i % 4 === 0 ? ['work'] : [] });
  });
}

test('quantile score is twice the scikit-learn mean_pinball_loss docstring values', () => {
  // Source: scikit-learn mean_pinball_loss docstring: y = [1, 2, 3];
  // q = [0, 2, 3], τ = 0.1 → 0.0333…; q = [1, 2, 4], τ = 0.1 → 0.3; q = [0, 2, 3], τ = 0.9 → 0.3;
  // q = [1, 2, 4], τ = 0.9 → 0.0333…; q = y → 0. SCORING.md's QS_τ is twice the pinball loss.
  const y = [1, 2, 3];
  const meanQs = (q: number[], tau: number) => q.reduce((s, qi, i) => s + quantileScore(qi, y[i]!, tau), 0) / q.length;
  close(meanQs([0, 2, 3], 0.1), 2 * (0.1 / 3), 1e-15, 'q=[0,2,3] τ=0.1');
  close(meanQs([1, 2, 4], 0.1), 2 * 0.3, 1e-15, 'q=[1,2,4] τ=0.1');
  close(meanQs([0, 2, 3], 0.9), 2 * 0.3, 1e-15, 'q=[0,2,3] τ=0.9');
  close(meanQs([1, 2, 4], 0.9), 2 * (0.1 / 3), 1e-15, 'q=[1,2,4] τ=0.9');
  assert.equal(meanQs(y, 0.1), 0);
  assert.equal(meanQs(y, 0.9), 0);
});

test('quantile score at y equal to q and its one-ulp neighbours', () => {
  // Derived from QS_τ = 2(1{y < q} − τ)(q − y): 0 at y = q, never negative either side.
  const q = 7.3;
  assert.equal(quantileScore(q, q, 0.1), 0);
  const above = quantileScore(q, nextUp(q), 0.1); // y > q: 2(0 − τ)(q − y) = 2τ(y − q)
  const below = quantileScore(q, nextDown(q), 0.1); // y < q: 2(1 − τ)(q − y)
  assert.ok(above > 0 && above < 1e-15, `above ${above}`);
  assert.ok(below > 0 && below < 1e-14, `below ${below}`);
  close(above, 2 * 0.1 * (nextUp(q) - q), 1e-30, 'above exactly');
  close(below, 2 * 0.9 * (q - nextDown(q)), 1e-30, 'below exactly');
});

test('interval score of [10, 20] at α = 0.2: worked example', () => {
  // Derived from Gneiting & Raftery 2007, eq. 43 (CHECK-VALUES.md): 15 → 10; 25 → 10 + 10·5;
  // 5 → 60.
  assert.equal(intervalScore(10, 20, 15, 0.2), 10);
  assert.equal(intervalScore(10, 20, 25, 0.2), 60);
  assert.equal(intervalScore(10, 20, 5, 0.2), 60);
  // The same through the report, for a {0.1, 0.5, 0.9} question (the widest interval, 80 %).
  const r = computeNumericReport(
    [numericQuestion('in', 15, nf([0, [10, 14, 20]])), numericQuestion('out', 25, nf([0, [10, 14, 20]]))],
    {},
  );
  assert.deepEqual(
    r.questions.map((q) => [q.id, q.interval_score, q.interval_level]),
    [
      ['in', 10, 0.8],
      ['out', 60, 0.8],
    ],
  );
});

test('WIS with {0.1, 0.5, 0.9} equals Bracher et al.’s (½|y − m| + (α/2)·IS_α)/(K + ½)', () => {
  // Derived identity (Bracher et al. 2021; CHECK-VALUES.md), K = 1, α = 0.2, on random values.
  const rand = mulberry32(8);
  for (let i = 0; i < 500; i++) {
    const q = [rand() * 100 - 50, rand() * 100 - 50, rand() * 100 - 50].sort((a, b) => a - b);
    const y = rand() * 160 - 80;
    const bracher = (0.5 * Math.abs(y - q[1]!) + 0.1 * intervalScore(q[0]!, q[2]!, y, 0.2)) / 1.5;
    const wis = weightedIntervalScore(q, [0.1, 0.5, 0.9], y);
    close(wis, bracher, 1e-12 * Math.max(1, bracher), `case ${i}`);
  }
});

test('WIS with the median alone is |y − m|', () => {
  // SCORING.md; exact, since 2 · ½ · (m − y) loses nothing.
  const rand = mulberry32(9);
  for (let i = 0; i < 200; i++) {
    const m = rand() * 1000 - 500;
    const y = rand() * 1000 - 500;
    assert.equal(weightedIntervalScore([m], [0.5], y), Math.abs(y - m));
  }
  const r = computeNumericReport([numericQuestion('m', 12, nf([0, [9]]), { levels: [0.5] })], {});
  assert.deepEqual(r.questions, [{ id: 'm', wis: 3, interval_score: null, interval_level: null }]);
  assert.deepEqual(r.surprises, []);
  assert.deepEqual(r.coverage, []);
});

test('coverage: 8 of 20 inside the 80 % ranges → 0.4, Wilson 0.2188–0.6134', () => {
  // Source: Wilson 1927 formula (CHECK-VALUES.md; statsmodels cross-check in scoring-reference).
  const qs = Array.from({ length: 20 }, (_, i) => numericQuestion(`c${String(i).padStart(2, '0')}`, i < 8 ? 15 : 30, nf([0, [10, 15, 20]])));
  const r = computeNumericReport(qs, {});
  assert.equal(r.coverage.length, 1);
  const row = r.coverage[0]!;
  assert.deepEqual([row.level, row.n, row.inside, row.rate], [0.8, 20, 8, 0.4]);
  close(row.wilson_low, 0.2188, 5e-5, 'Wilson low');
  close(row.wilson_high, 0.6134, 5e-5, 'Wilson high');
});

test('coverage counts the ends of a range as inside (l ≤ y ≤ u), one ulp out is outside', () => {
  // SCORING.md: inside when l ≤ y ≤ u.
  const l = 10.1;
  const u = 19.7;
  const f = () => nf([0, [l, 15, u]]);
  const qs = [
    numericQuestion('a', l, f()),
    numericQuestion('b', u, f()),
    numericQuestion('c', nextDown(l), f()),
    numericQuestion('d', nextUp(u), f()),
  ];
  const r = computeNumericReport(qs, {});
  assert.equal(r.coverage[0]!.inside, 2);
  assert.deepEqual(r.surprises.map((s) => s.id).sort(), ['c', 'd']);
});

test('coverage and quantile calibration per level, sorted, with Wilson intervals', () => {
  // SCORING.md: a question with {0.05, 0.1, 0.5, 0.9, 0.95} has an 80 % and a 90 % range.
  const five = [0.05, 0.1, 0.5, 0.9, 0.95];
  const qs = [
    numericQuestion('a', 12, nf([0, [10, 11, 12, 13, 14]]), { levels: five }), // 90 % in, 80 % in
    numericQuestion('b', 13.5, nf([0, [10, 11, 12, 13, 14]]), { levels: five }), // 90 % in, 80 % out
    numericQuestion('c', 5, nf([0, [10, 12, 14]])), // 80 % out
  ];
  const r = computeNumericReport(qs, {});
  const row = (level: number, n: number, inside: number) => {
    const [wilson_low, wilson_high] = wilsonInterval(inside, n);
    return { level, n, inside, rate: inside / n, wilson_low, wilson_high };
  };
  assert.deepEqual(r.coverage, [row(0.8, 3, 1), row(0.9, 2, 2)]);
  // y ≤ q_τ: a (12) at τ 0.5 is equal, so below; b (13.5) is below only 0.95; c (5) below all.
  const cal = (tau: number, n: number, below: number) => {
    const [wilson_low, wilson_high] = wilsonInterval(below, n);
    return { tau, n, below, rate: below / n, wilson_low, wilson_high };
  };
  assert.deepEqual(r.quantile_calibration, [cal(0.05, 2, 0), cal(0.1, 3, 1), cal(0.5, 3, 2), cal(0.9, 3, 2), cal(0.95, 2, 2)]);
  // One ulp above the median is no longer at or below it.
  const above = computeNumericReport([numericQuestion('a', nextUp(12), nf([0, [10, 12, 14]]))], {});
  assert.equal(above.quantile_calibration[1]!.below, 0);
});

test('nominal levels: upper τ − lower τ rounded to two decimals', () => {
  // INTERFACES.md: 0.95 − 0.05 is 0.8999999999999999 in binary; reported as 0.9.
  assert.equal(nominalLevel(0.05, 0.95), 0.9);
  assert.equal(nominalLevel(0.1, 0.9), 0.8);
  assert.equal(nominalLevel(0.25, 0.75), 0.5);
  assert.deepEqual(
    centralIntervals([...ALLOWED_QUANTILE_LEVELS]).map((c) => [c.lower, c.upper, c.level, c.alpha]),
    [
      [0, 6, 0.9, 0.1],
      [1, 5, 0.8, 0.2],
      [2, 4, 0.5, 0.5],
    ],
  );
  assert.deepEqual(centralIntervals([0.5]), []);
});

test('where outcomes landed: an outcome equal to a quantile counts in the gap below it', () => {
  // SCORING.md (Gneiting, Balabdaoui & Raftery 2007): gaps below, between, above.
  const q = [10, 15, 20];
  assert.equal(landedGap(q, 9), 0);
  assert.equal(landedGap(q, 10), 0);
  assert.equal(landedGap(q, nextUp(10)), 1);
  assert.equal(landedGap(q, 15), 1);
  assert.equal(landedGap(q, nextUp(15)), 2);
  assert.equal(landedGap(q, 20), 2);
  assert.equal(landedGap(q, nextUp(20)), 3);
  // Equal quantiles: y at both goes below both.
  assert.equal(landedGap([10, 15, 15], 15), 1);

  const qs = [
    numericQuestion('a', 15, nf([0, [10, 15, 20]])),
    numericQuestion('b', nextUp(15), nf([0, [10, 15, 20]])),
    numericQuestion('c', 40, nf([0, [10, 15, 20]])),
    numericQuestion('d', 3, nf([0, [1, 2, 3, 4, 5]]), { levels: [0.05, 0.25, 0.5, 0.75, 0.95] }),
    numericQuestion('e', 3, nf([0, [3]]), { levels: [0.5] }),
  ];
  const r = computeNumericReport(qs, {});
  // Sorted lexicographically by level set; expected = level differences (two decimals).
  assert.deepEqual(r.landed, [
    {
      levels: [0.05, 0.25, 0.5, 0.75, 0.95],
      gaps: [
        { n: 0, expected: 0.05 },
        { n: 0, expected: 0.2 },
        { n: 1, expected: 0.25 },
        { n: 0, expected: 0.25 },
        { n: 0, expected: 0.2 },
        { n: 0, expected: 0.05 },
      ],
    },
    {
      levels: [0.1, 0.5, 0.9],
      gaps: [
        { n: 0, expected: 0.1 },
        { n: 1, expected: 0.4 },
        { n: 1, expected: 0.4 },
        { n: 1, expected: 0.1 },
      ],
    },
    { levels: [0.5], gaps: [{ n: 1, expected: 0.5 }, { n: 0, expected: 0.5 }] },
  ]);
});

test('relative WIS vs first: the geometric mean of ratios where both are above 0', () => {
  // SCORING.md (Cramer et al. 2022), by hand with the median alone (WIS = |y − m|).
  const median = { levels: [0.5] };
  const qs = [
    numericQuestion('a', 10, nf([0, [18]], [2, [12]]), median), // 2 / 8
    numericQuestion('b', 10, nf([0, [13]], [2, [16]]), median), // 6 / 3
    numericQuestion('c', 10, nf([0, [14]], [2, [10]]), median), // final 0: left out
    numericQuestion('d', 10, nf([0, [10]], [2, [11]]), median), // first 0: left out
  ];
  const r = computeNumericReport(qs, {});
  close(r.relative_wis_vs_first, Math.sqrt((2 / 8) * (6 / 3)), 1e-15, 'relative WIS');
  assert.equal(computeNumericReport(qs.slice(2), {}).relative_wis_vs_first, null);
  // A single forecast is its own first: ratio 1.
  assert.equal(computeNumericReport([numericQuestion('e', 10, nf([0, [7]]), median)], {}).relative_wis_vs_first, 1);
  // A WIS past the double range (values near ±Number.MAX_VALUE) gives no ratio: the
  // question is left out rather than turning the figure into NaN.
  const huge = numericQuestion('f', Number.MAX_VALUE, nf([0, [-Number.MAX_VALUE]], [2, [-Number.MAX_VALUE]]), median);
  assert.equal(computeNumericReport([huge], {}).relative_wis_vs_first, null);
  close(computeNumericReport([...qs, huge], {}).relative_wis_vs_first, Math.sqrt((2 / 8) * (6 / 3)), 1e-15, 'relative WIS beside an overflowing question');
});

test('surprises: outside the widest range, sized by distance over width, worst first', () => {
  // SCORING.md; INTERFACES.md: null size (zero width) first, then largest size, ties by id.
  const five = { levels: [0.05, 0.25, 0.5, 0.75, 0.95] };
  const qs = [
    numericQuestion('b', 25, nf([0, [10, 15, 20]])), // 5 / 10 = 0.5
    numericQuestion('a', 5, nf([0, [10, 15, 20]])), // 5 / 10 = 0.5, tie → by id
    numericQuestion('c', 50, nf([0, [0, 5, 10, 15, 20]]), five), // 30 / 20 = 1.5, at 90 %
    numericQuestion('z', 8, nf([0, [7, 7, 7]])), // zero width
    numericQuestion('y', 7, nf([0, [7, 7, 7]])), // zero width, but inside
    numericQuestion('x', 20, nf([0, [10, 15, 20]])), // on the boundary: inside
    numericQuestion('m', 100, nf([0, [1]]), { levels: [0.5] }), // no interval: never a surprise
  ];
  const r = computeNumericReport(qs, {});
  assert.deepEqual(r.surprises, [
    { id: 'z', title: 'Question z', value: 8, low: 7, high: 7, level: 0.8, size: null },
    { id: 'c', title: 'Question c', value: 50, low: 0, high: 20, level: 0.9, size: 1.5 },
    { id: 'a', title: 'Question a', value: 5, low: 10, high: 20, level: 0.8, size: 0.5 },
    { id: 'b', title: 'Question b', value: 25, low: 10, high: 20, level: 0.8, size: 0.5 },
  ]);
  // Questions listed by id, interval figures null with the median only.
  assert.deepEqual(r.questions.map((q) => q.id), ['a', 'b', 'c', 'm', 'x', 'y', 'z']);
  assert.deepEqual(r.questions[3], { id: 'm', wis: 99, interval_score: null, interval_level: null });
  assert.equal(r.questions[2]!.interval_level, 0.9);
  // 2/α with α = 2 × 0.05: width 20 + 10 · 2 · 30... exactly (u − l) + (2/α)(y − u).
  assert.equal(r.questions[2]!.interval_score, 20 + (2 / 0.1) * 30);
});

test('surprises near the ends of the double range: a width or distance past it still gives the true size', () => {
  // Size = distance / width (SCORING.md). Here high − low (2e308) or y − high overflows to
  // Infinity, which made the size 0 (a surprise sized and sorted as none) or Infinity; halved
  // operands give the exact ratio, as both ends and the outcome are far above the smallest doubles.
  const M = Number.MAX_VALUE;
  const qs = [
    numericQuestion('wide', M, nf([0, [-1e308, 0, 1e308]])), // (M − 1e308) / 2e308
    numericQuestion('far', M, nf([0, [-1e308, -1e308, -0.5e308]])), // (M + 0.5e308) / 0.5e308
    numericQuestion('near', 25, nf([0, [10, 15, 20]])), // 0.5
  ];
  const r = computeNumericReport(qs, {});
  assert.deepEqual(r.surprises.map((x) => x.id), ['far', 'near', 'wide']);
  close(r.surprises[0]!.size!, (M / 2 + 0.25e308) / 0.25e308, 1e-15, 'far');
  close(r.surprises[2]!.size!, (M / 2 - 0.5e308) / 1e308, 1e-15, 'wide');
  const details = computeNumericSurprises(qs, {});
  assert.deepEqual(details.map((x) => [x.id, x.size]), r.surprises.map((x) => [x.id, x.size]));
});

test('counting: final and first forecasts, late forecasts, window end and filters as for yes/no', () => {
  // SCORING.md "Which forecasts count".
  const f = [
    { at: T0 + 5 * DAY, quantiles: [1, 2, 3], seq: 7 },
    { at: T0 + DAY, quantiles: [4, 5, 6], seq: 3 },
    { at: T0 + 5 * DAY, quantiles: [7, 8, 9], seq: 9 },
    { at: T0 + DAY, quantiles: [10, 11, 12], seq: 2 },
  ];
  const row = computeNumericDetail([numericQuestion('a', 8, f)], {}).per_question[0]!;
  assert.deepEqual(row.quantiles, [7, 8, 9]);
  assert.deepEqual(row.quantiles_first, [10, 11, 12]);

  const base = nf([1, [10, 15, 20]]);
  const atT = { at: T0 + 10 * DAY, quantiles: [16, 16, 16], seq: 100 };
  const afterT = { at: T0 + 10 * DAY + 1, quantiles: [0, 1, 2], seq: 101 };
  assert.equal(computeNumericReport([numericQuestion('t', 16, [...base, atT])], {}).questions[0]!.wis, 0);
  const plain = computeNumericReport([numericQuestion('t', 16, base)], {});
  assert.deepEqual(computeNumericReport([numericQuestion('t', 16, [...base, afterT])], {}), plain);

  const early = { resolution: { outcome: 'value' as const, value: 3, at: T0 + 4 * DAY } };
  const e1 = computeNumericReport([numericQuestion('e', 3, nf([1, [1, 2, 3]]), early)], {});
  const e2 = computeNumericReport([numericQuestion('e', 3, nf([1, [1, 2, 3]], [6, [3, 3, 3]]), early)], {});
  assert.deepEqual(e2, e1);
  const day4 = T0 + 4 * DAY;
  assert.equal(computeNumericReport([numericQuestion('e', 3, nf([1, [1, 2, 3]]), early)], { from: day4, to: day4 }).scored, 1);
  assert.equal(computeNumericReport([numericQuestion('e', 3, nf([1, [1, 2, 3]]), early)], { to: day4 - 1 }).scored, 0);

  const qs = [
    numericQuestion('s', 1, nf([1, [0, 1, 2]]), { tags: ['work'] }),
    numericQuestion('u', 1, nf([11, [0, 1, 2]]), { tags: ['work'] }),
    numericQuestion('v', 'void', nf([1, [0, 1, 2]]), { tags: ['work'] }),
    numericQuestion('o', null, nf([1, [0, 1, 2]]), { tags: ['work'] }),
    numericQuestion('x', 1, nf([1, [0, 1, 2]])),
  ];
  const all = computeNumericReport(qs, {});
  assert.deepEqual([all.scored, all.unscored, all.void, all.open], [2, 1, 1, 1]);
  const work = computeNumericReport(qs, { tag: 'work' });
  assert.deepEqual([work.scored, work.unscored, work.void, work.open], [1, 1, 1, 1]);
});

test('numeric scores do not depend on the order revisions were entered', () => {
  const qs = randomNumericDiary(21, 120);
  const rand = mulberry32(22);
  const untied = (q: ScoringNumericQuestion) => new Set(q.forecasts.map((f) => f.at)).size === q.forecasts.length;
  const reordered = qs.map((q) => ({ ...q, forecasts: shuffled(q.forecasts, rand).map((f, k) => ({ ...f, seq: 10_000 + k })) }));
  const a = qs.filter(untied);
  const b = reordered.filter(untied);
  assert.ok(a.length > 60);
  assert.deepEqual(computeNumericReport(b, {}), computeNumericReport(a, {}));
  assert.deepEqual(computeNumericDetail(b, {}), computeNumericDetail(a, {}));
});

test('adding a void numeric question changes nothing but the void count', () => {
  // SCORING.md: void questions are never scored.
  const qs = randomNumericDiary(6, 60);
  const base = computeNumericReport(qs, {});
  const withVoid = computeNumericReport([...qs, numericQuestion('zz', 'void', nf([1, [0, 0, 0]]))], {});
  assert.deepEqual(withVoid, { ...base, void: base.void + 1 });
});

test('an empty selection gives every key, with empty lists and null', () => {
  // INTERFACES.md §2: counts 0 and figures null when there are none.
  assert.deepEqual(computeNumericReport([], {}), {
    scored: 0,
    unscored: 0,
    void: 0,
    open: 0,
    coverage: [],
    quantile_calibration: [],
    landed: [],
    relative_wis_vs_first: null,
    questions: [],
    surprises: [],
  });
});

test('date questions are scored in days', () => {
  // SCORING.md: a date is the number of days since 1970-01-01. 2026-03-02 is day 20514.
  const day = (iso: string) => Date.UTC(+iso.slice(0, 4), +iso.slice(5, 7) - 1, +iso.slice(8, 10)) / DAY;
  const q = numericQuestion('go-live', day('2026-03-20'), nf([0, [day('2026-03-02'), day('2026-03-13'), day('2026-03-27')]]), {
    value_kind: 'date',
    unit: '',
  });
  assert.equal(day('2026-03-02'), 20514);
  const r = computeNumericReport([q], {});
  // QS: 0.1 → 2·0.1·18 = 3.6; 0.5 → 2·0.5·7 = 7; 0.9 → 2·0.1·7 = 1.4; mean 4.
  close(r.questions[0]!.wis, 4, 1e-12, 'WIS in days');
  assert.equal(r.questions[0]!.interval_score, 25);
  assert.throws(
    () => computeNumericReport([{ ...q, forecasts: nf([0, [20514.5, 20520, 20530]]) }], {}),
    /"go-live".*forecast 0 quantiles entry 0 is 20514.5; a date question takes whole days/,
  );
});

test('level sets: drawn from the allowed levels, ascending, symmetric, with the median', () => {
  // SCORING.md "Numeric questions".
  assert.deepEqual(DEFAULT_QUANTILE_LEVELS, [0.1, 0.5, 0.9]);
  assert.equal(quantileLevelsProblem(DEFAULT_QUANTILE_LEVELS), null);
  assert.equal(quantileLevelsProblem([0.5]), null);
  assert.equal(quantileLevelsProblem(ALLOWED_QUANTILE_LEVELS), null);
  assert.equal(quantileLevelsProblem([0.05, 0.25, 0.5, 0.75, 0.95]), null);
  assert.match(quantileLevelsProblem([])!, /median/);
  assert.match(quantileLevelsProblem([0.2, 0.5, 0.8])!, /entry 0 is 0.2; each level must be one of/);
  assert.match(quantileLevelsProblem([0.9, 0.5, 0.1])!, /ascending/);
  assert.match(quantileLevelsProblem([0.1, 0.5, 0.5, 0.9])!, /ascending order, each level once/);
  assert.match(quantileLevelsProblem([0.1, 0.9])!, /median/);
  assert.match(quantileLevelsProblem([0.1, 0.5])!, /symmetric around 0.5: 0.1 needs 0.9/);
  assert.match(quantileLevelsProblem([0.05, 0.1, 0.5, 0.9])!, /0.05 needs 0.95/);
  // Exact values only: 1 − 0.9 is 0.09999999999999998, not the level 0.1.
  assert.match(quantileLevelsProblem([1 - 0.9, 0.5, 0.9])!, /entry 0/);
  assert.match(quantileLevelsProblem([nextUp(0.1), 0.5, 0.9])!, /entry 0/);
});

test('forecast quantiles: one finite value per level, non-decreasing', () => {
  // INTERFACES.md "Question types".
  assert.equal(quantilesProblem([1, 2, 3], 3), null);
  assert.equal(quantilesProblem([2, 2, 2], 3), null);
  assert.equal(quantilesProblem(new Float64Array([-5, 0, 5]), 3), null);
  assert.match(quantilesProblem([1, 2], 3)!, /one value per level \(3\), not 2/);
  assert.match(quantilesProblem([3, 2, 4], 3)!, /must not decrease with the level: entry 1 \(2\) is below entry 0 \(3\)/);
  assert.match(quantilesProblem([1, nextDown(1), 4], 3)!, /must not decrease/);
  assert.match(quantilesProblem([1, Number.NaN, 4], 3)!, /entry 1 is NaN/);
  assert.match(quantilesProblem([1, 2, Infinity], 3)!, /entry 2 is Infinity/);
});

test('invalid numeric input is rejected with a RangeError naming the question and field', () => {
  const ok = (extra: Partial<ScoringNumericQuestion> = {}) => numericQuestion('q', 5, nf([0, [1, 5, 9]]), extra);
  const rejects = (q: ScoringNumericQuestion, pattern: RegExp) => assert.throws(() => computeNumericReport([q], {}), pattern);
  rejects(ok({ levels: [0.2, 0.5, 0.8] }), /"q".*levels entry 0 is 0.2/);
  rejects(numericQuestion('q', 5, nf([0, [9, 5, 1]])), /"q".*forecast 0 quantiles must not decrease/);
  rejects(numericQuestion('q', 5, nf([0, [1, 5]])), /"q".*forecast 0 quantiles must give one value per level/);
  rejects(ok({ resolution: { outcome: 'value', value: Number.NaN, at: T0 } }), /"q".*resolution value is NaN/);
  rejects(ok({ resolution: { outcome: 'yes', at: T0 } as unknown as ScoringNumericQuestion['resolution'] }), /"q".*outcome is "yes"/);
  rejects(ok({ value_kind: 'money' as unknown as 'number' }), /"q".*value_kind/);
  rejects(ok({ unit: undefined as unknown as string }), /"q".*unit/);
  rejects(ok({ value_kind: 'date', resolution: { outcome: 'value', value: 5.5, at: T0 } }), /"q".*whole days/);
  rejects(numericQuestion('q', 5, [{ at: T0, quantiles: [1, 5, 9], seq: Number.NaN }]), /"q".*seq/);
  assert.throws(() => computeNumericReport([], { from: T0 + 1, to: T0 }), /from .* is after to/);
  // The single-forecast functions check their input too.
  assert.throws(() => quantileScore(1, 2, 0), /strictly between 0 and 1/);
  assert.throws(() => quantileScore(1, 2, 1), /strictly between 0 and 1/);
  assert.throws(() => quantileScore(Number.NaN, 2, 0.5), RangeError);
  assert.throws(() => intervalScore(20, 10, 15, 0.2), /ends below its start/);
  assert.throws(() => intervalScore(10, 20, 15, 1), RangeError);
  assert.throws(() => weightedIntervalScore([1, 2, 3], [0.1, 0.5], 2), /levels must be symmetric/);
  assert.throws(() => weightedIntervalScore([3, 2, 1], [0.1, 0.5, 0.9], 2), /quantiles must not decrease/);
  assert.throws(() => landedGap([1, 2], Infinity), RangeError);
  assert.throws(() => centralIntervals([0.1, 0.9]), /median/);
});

test('scorecard detail lists numeric questions by window end, then id', () => {
  const early = { resolution: { outcome: 'value' as const, value: 4, at: T0 + 3 * DAY } };
  const qs = [
    numericQuestion('b', 12, nf([0, [10, 15, 20]], [1, [11, 13, 16]])),
    numericQuestion('a', 4, nf([0, [1, 5, 9]]), early),
  ];
  const d = computeNumericDetail(qs, {});
  assert.deepEqual(d.per_question.map((r) => r.id), ['a', 'b']);
  const b = d.per_question[1]!;
  assert.deepEqual(
    { ...b, wis: Math.round(b.wis * 1e12) / 1e12, wis_first: Math.round(b.wis_first * 1e12) / 1e12 },
    {
      id: 'b',
      title: 'Question b',
      tags: [],
      T: T0 + 10 * DAY,
      unit: 'weeks',
      value_kind: 'number',
      levels: [0.1, 0.5, 0.9],
      quantiles: [11, 13, 16],
      quantiles_first: [10, 15, 20],
      value: 12,
      // (2·0.1·1 + 2·0.5·1 + 2·0.1·4) / 3 and (2·0.1·2 + 2·0.5·3 + 2·0.1·8) / 3.
      wis: Math.round(((0.2 + 1 + 0.8) / 3) * 1e12) / 1e12,
      wis_first: Math.round(((0.4 + 3 + 1.6) / 3) * 1e12) / 1e12,
      interval_score: 5,
      interval_level: 0.8,
      gap: 1,
    },
  );
});

test('surprise details: the report\'s surprises with the distance outside in the unit, the side and the final values', () => {
  // SCORING.md "Surprise": size = distance outside / width of the widest central interval.
  const qs = [
    numericQuestion('above', 29, nf([0, [10, 14, 20]], [3, [12, 15, 21]])), // 8 above 12–21: size 8/9
    numericQuestion('below', 4, nf([0, [10, 14, 20]])), // 6 below 10–20: size 0.6
    numericQuestion('inside', 15, nf([0, [10, 14, 20]])),
  ];
  const details = computeNumericSurprises(qs, {});
  const report = computeNumericReport(qs, {}).surprises;
  assert.deepEqual(
    details.map(({ id, title, value, low, high, level, size }) => ({ id, title, value, low, high, level, size })),
    report,
  );
  assert.deepEqual(
    details.map((d) => [d.id, d.distance, d.side, d.quantiles]),
    [
      ['above', 8, 'above', [12, 15, 21]],
      ['below', 6, 'below', [10, 14, 20]],
    ],
  );
  assert.deepEqual(computeNumericSurprises(qs, { tag: 'nobody' }), []);
});
