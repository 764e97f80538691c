import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  CHOICE_SUM_TOLERANCE,
  MAX_OPTIONS,
  MIN_OPTIONS,
  choiceVectorProblem,
  optionCountProblem,
  optionIndexProblem,
  sumsToOne,
} from '../../shared/choice-vector';
import {
  choiceLogScore,
  computeChoiceConfidentCalls,
  computeChoiceDetail,
  computeChoiceReport,
  computeScoreReport,
  multiCategoryBrier,
  rankedProbabilityScore,
  topChoice,
  wilsonInterval,
  type ScoreOptions,
  type ScoringChoiceQuestion,
  type ScoringQuestion,
} from '../../shared/scoring/index';
import { DAY, T0, cf, choiceQuestion, close, mulberry32, nextDown, nextUp, shuffled } from './scoring-support';

/** A random diary of choice questions, some ordered, some with base rates, revised a few times. */
function randomChoiceDiary(seed: number, n: number): ScoringChoiceQuestion[] {
  const rand = mulberry32(seed);
  const vector = (K: number): number[] => {
    const w = Array.from({ length: K }, () => 1 + Math.floor(rand() * 20));
    const total = w.reduce((s, x) => s + x, 0);
    return w.map((x) => x / total);
  };
  return Array.from({ length: n }, (_, i) => {
    const K = 2 + Math.floor(rand() * 6);
    const entries: [number, number[]][] = [];
    const revisions = 1 + Math.floor(rand() * 4);
    for (let r = 0; r < revisions; r++) entries.push([r * 2 + Math.floor(rand() * 3), vector(K)]);
    return choiceQuestion(`c${String(i).padStart(3, '0')}`, Math.floor(rand() * K), cf(...entries), {
      ordered: i % 2 === 0,
      option_base_rates: i % 3 === 0 ? vector(K) : null,
      tags: i % 4 === 0 ? ['work'] : [],
    });
  });
}

test('choice log score matches the scikit-learn multi-class log_loss docstring example', () => {
  // Source: scikit-learn log_loss docstring: labels spam, ham, ham, spam, probabilities
  // [.1, .9], [.9, .1], [.8, .2], [.35, .65] (columns ham, spam) → 0.21616…
  const HAM = 0;
  const SPAM = 1;
  const qs = [
    choiceQuestion('a', SPAM, cf([0, [0.1, 0.9]])),
    choiceQuestion('b', HAM, cf([0, [0.9, 0.1]])),
    choiceQuestion('c', HAM, cf([0, [0.8, 0.2]])),
    choiceQuestion('d', SPAM, cf([0, [0.35, 0.65]])),
  ];
  const r = computeChoiceReport(qs, {});
  close(r.log_score, 0.21616, 5e-6, 'log score');
  // Derived from the definition −mean ln p_j: the same figure to full precision.
  close(r.log_score, -(2 * Math.log(0.9) + Math.log(0.8) + Math.log(0.65)) / 4, 1e-15, 'log score');
  close(choiceLogScore([0.35, 0.65], SPAM), -Math.log(0.65), 1e-15, 'one question');
});

test('ordered K = 3 worked example: multi-category Brier 0.78, RPS 0.265', () => {
  // Derived from Brier 1950 and Epstein 1969 / Murphy 1971 (CHECK-VALUES.md):
  // p = (0.2, 0.5, 0.3), third option true → 0.04 + 0.25 + 0.49 and ((0.2)² + (0.7)²)/2.
  const p = [0.2, 0.5, 0.3];
  close(multiCategoryBrier(p, 2), 0.78, 1e-15, 'Brier');
  close(rankedProbabilityScore(p, 2), 0.265, 1e-15, 'RPS');
  const r = computeChoiceReport([choiceQuestion('o', 2, cf([0, p]), { ordered: true })], {});
  close(r.brier, 0.78, 1e-15, 'report Brier');
  close(r.rps, 0.265, 1e-15, 'report RPS');
  assert.equal(r.rps_n, 1);
  // Derived: the RPS rewards probability near the true category. All on the neighbouring
  // option scores better than all on the far one; the Brier score cannot tell them apart.
  assert.ok(rankedProbabilityScore([0, 1, 0], 2) < rankedProbabilityScore([1, 0, 0], 2));
  assert.equal(multiCategoryBrier([0, 1, 0], 2), multiCategoryBrier([1, 0, 0], 2));
});

test('the uniform forecast over K options scores 1 − 1/K, so vs_uniform is 0', () => {
  // Derived from Brier 1950 (CHECK-VALUES.md): (1 − 1/K)² + (K − 1)/K² = 1 − 1/K.
  for (let K = MIN_OPTIONS; K <= MAX_OPTIONS; K++) {
    const uniform = Array.from({ length: K }, () => 1 / K);
    close(multiCategoryBrier(uniform, K - 1), 1 - 1 / K, 1e-15, `K = ${K}`);
    const r = computeChoiceReport([choiceQuestion(`u${K}`, 0, cf([0, uniform]))], {});
    close(r.skill.vs_uniform, 0, 1e-14, `vs_uniform K = ${K}`);
  }
});

test('K = 2 choice questions reproduce the yes/no figures (SCORING.md)', () => {
  // Derived (SCORING.md, CHECK-VALUES.md): multi-category Brier = 2 × yes/no Brier, RPS =
  // yes/no Brier of the first option, log score equal while p stays in [0.001, 0.999]
  // (where the yes/no clip is inactive); skill, confident misses follow.
  const rand = mulberry32(2);
  const choice: ScoringChoiceQuestion[] = [];
  const binary: ScoringQuestion[] = [];
  for (let i = 0; i < 300; i++) {
    const id = `k${String(i).padStart(3, '0')}`;
    const p = (1 + Math.floor(rand() * 999)) / 1000;
    const p1 = (1 + Math.floor(rand() * 999)) / 1000;
    const b = Math.round(rand() * 100) / 100;
    const yes = rand() < 0.5;
    const at = T0 + 10 * DAY;
    choice.push(
      choiceQuestion(id, yes ? 0 : 1, cf([0, [p1, 1 - p1]], [3, [p, 1 - p]]), {
        ordered: true,
        option_base_rates: i % 2 ? [b, 1 - b] : null,
      }),
    );
    binary.push({
      id,
      title: `Question ${id}`,
      tags: [],
      kind: 'state_at_deadline',
      closes_at: at,
      resolution: { outcome: yes ? 'yes' : 'no', at },
      base_rate: i % 2 ? b : null,
      costs: null,
      forecasts: [
        { at: T0, p: p1, seq: 1 },
        { at: T0 + 3 * DAY, p, seq: 2 },
      ],
      references: [],
    });
  }
  const c = computeChoiceReport(choice, {});
  const y = computeScoreReport(binary, { default_costs: { false_alarm: 1, miss: 1 } });
  close(c.brier, 2 * y.brier!, 1e-12, 'Brier = 2 × yes/no');
  close(c.rps, y.brier!, 1e-12, 'RPS = yes/no Brier');
  close(c.log_score, y.log_score!, 1e-12, 'log score');
  close(c.skill.vs_first, y.skill.vs_first!, 1e-12, 'vs_first');
  close(c.skill.vs_base_rate, y.skill.vs_base_rate!, 1e-12, 'vs_base_rate');
  close(c.skill.vs_uniform, y.skill.vs_even!, 1e-12, 'vs_uniform = vs_even');
  assert.deepEqual(
    c.confident_misses.map((m) => m.id),
    y.confident_misses.map((m) => m.id),
  );
});

test('the log score clips the true option at 0.001 from below only', () => {
  // SCORING.md: −ln max(p_j, 0.001). A 0 on what happened costs ln 1000, not infinity.
  close(choiceLogScore([0, 1], 0), Math.log(1000), 1e-12, 'p_j = 0');
  close(choiceLogScore([0.0004, 0.9996], 0), Math.log(1000), 1e-12, 'below the clip');
  // The clip is max(p_j, 0.001) as the formula states: a certain, correct forecast scores 0.
  assert.equal(choiceLogScore([1, 0], 0), 0);
});

test('skill against the uniform forecast, stated base rates and the first forecast', () => {
  // Derived from SCORING.md's definitions, by hand.
  const a = choiceQuestion('a', 0, cf([0, [0.5, 0.3, 0.2]], [2, [0.6, 0.3, 0.1]]), { option_base_rates: [0.2, 0.5, 0.3] });
  const b = choiceQuestion('b', 1, cf([1, [0.7, 0.3]]));
  const r = computeChoiceReport([a, b], {});
  const brierA = 0.16 + 0.09 + 0.01; // final (0.6, 0.3, 0.1), first option true
  const brierB = 0.49 + 0.49; // (0.7, 0.3), second option true
  close(r.brier, (brierA + brierB) / 2, 1e-15, 'Brier');
  // Uniform: 1 − 1/3 and 1 − 1/2.
  close(r.skill.vs_uniform, 1 - (brierA + brierB) / 2 / ((2 / 3 + 1 / 2) / 2), 1e-15, 'vs_uniform');
  // Base rates only on a: (0.2 − 1)² + 0.5² + 0.3².
  close(r.skill.vs_base_rate, 1 - brierA / (0.64 + 0.25 + 0.09), 1e-15, 'vs_base_rate');
  // First forecasts: a (0.5, 0.3, 0.2) → 0.25 + 0.09 + 0.04; b has one forecast.
  close(r.skill.vs_first, 1 - (brierA + brierB) / (0.25 + 0.09 + 0.04 + brierB), 1e-15, 'vs_first');
  // Null rules (as for yes/no): no stated base rates; a perfect first forecast.
  const none = computeChoiceReport([b], {});
  assert.equal(none.skill.vs_base_rate, null);
  const perfectFirst = computeChoiceReport([choiceQuestion('p', 1, cf([0, [0, 1]], [1, [0.2, 0.8]]), { option_base_rates: [0, 1] })], {});
  assert.equal(perfectFirst.skill.vs_first, null);
  assert.equal(perfectFirst.skill.vs_base_rate, null);
  close(perfectFirst.skill.vs_uniform, 1 - 0.08 / 0.5, 1e-15, 'vs_uniform');
});

test('top choice: the highest final probability (ties: lowest index), confidence vs hit rate', () => {
  // SCORING.md, after Guo et al. 2017.
  assert.equal(topChoice([0.4, 0.4, 0.2]), 0);
  assert.equal(topChoice([0.2, 0.4, 0.4]), 1);
  const qs = [
    choiceQuestion('a', 0, cf([0, [0.4, 0.4, 0.2]])), // top 0, hit
    choiceQuestion('b', 2, cf([0, [0.1, 0.3, 0.6]])), // top 2, hit
    choiceQuestion('c', 0, cf([0, [0.3, 0.7]])), // top 1, miss
  ];
  const r = computeChoiceReport(qs, {});
  const [low, high] = wilsonInterval(2, 3);
  assert.deepEqual(r.top_choice, { n: 3, mean_confidence: (0.4 + 0.6 + 0.7) / 3, hit_rate: 2 / 3, wilson_low: low, wilson_high: high });
});

test('option calibration bins every option of every question as a yes/no forecast', () => {
  // SCORING.md (one-vs-rest), by hand: pairs (0.7, 1) (0.2, 0) (0.1, 0) and (0.1, 0) (0.7, 0) (0.2, 1).
  const qs = [choiceQuestion('a', 0, cf([0, [0.7, 0.2, 0.1]])), choiceQuestion('b', 2, cf([0, [0.1, 0.7, 0.2]]))];
  const r = computeChoiceReport(qs, {});
  const bin = (index: number, n: number, mean_p: number, yes: number) => {
    const [wilson_low, wilson_high] = wilsonInterval(yes, n);
    return { index, n, mean_p, observed: yes / n, wilson_low, wilson_high };
  };
  assert.deepEqual(r.bins, [bin(1, 2, 0.1, 0), bin(2, 2, 0.2, 1), bin(7, 2, 0.7, 1)]);
});

test('confident misses: top choice ≥ 0.8 and wrong, worst first, ties by id', () => {
  // SCORING.md; INTERFACES.md (highest p first; ties by id).
  const below = nextDown(0.8);
  const qs = [
    choiceQuestion('d', 1, cf([0, [0.8, 0.2]])), // exactly 0.8 counts
    choiceQuestion('e', 1, cf([0, [below, 0.2]])), // one ulp below does not
    choiceQuestion('c', 2, cf([0, [0.05, 0.9, 0.05]])),
    choiceQuestion('b', 0, cf([0, [0.05, 0.9, 0.05]])),
    choiceQuestion('a', 1, cf([0, [0.05, 0.95]])), // top choice came true: not a miss
  ];
  const r = computeChoiceReport(qs, {});
  assert.deepEqual(r.confident_misses, [
    { id: 'b', title: 'Question b', option: 1, p: 0.9, outcome_option: 0 },
    { id: 'c', title: 'Question c', option: 1, p: 0.9, outcome_option: 2 },
    { id: 'd', title: 'Question d', option: 0, p: 0.8, outcome_option: 1 },
  ]);
});

test('confident calls at a chosen threshold: the report\'s misses at 0.8, more at 0.7, hits when asked', () => {
  // SCORING.md "Confident miss" with Hindsight's threshold in place of 0.8 (PRODUCT.md Hindsight).
  const below = nextDown(0.8);
  const qs = [
    choiceQuestion('d', 1, cf([0, [0.8, 0.2]])),
    choiceQuestion('e', 1, cf([0, [below, 0.2]])),
    choiceQuestion('c', 2, cf([0, [0.05, 0.9, 0.05]])),
    choiceQuestion('a', 1, cf([0, [0.05, 0.95]])), // a hit
    choiceQuestion('f', 0, cf([0, [0.1, 0.75, 0.15]])),
  ];
  const misses = (t: number) => computeChoiceConfidentCalls(qs, {}, t).map((c) => c.id);
  assert.deepEqual(misses(0.8), computeChoiceReport(qs, {}).confident_misses.map((m) => m.id));
  assert.deepEqual(misses(0.8), ['c', 'd']);
  assert.deepEqual(misses(0.75), ['c', 'd', 'e', 'f']);
  const withHits = computeChoiceConfidentCalls(qs, {}, 0.8, true);
  assert.deepEqual(withHits.map((c) => [c.id, c.verdict]), [['c', 'miss'], ['d', 'miss'], ['a', 'hit']]);
  const c = withHits[0]!;
  assert.deepEqual([c.option, c.p, c.outcome_option, c.outcome_p, c.probs, c.T], [1, 0.9, 2, 0.05, [0.05, 0.9, 0.05], T0 + 10 * DAY]);
  // Filters apply: a tag nobody carries leaves nothing.
  assert.deepEqual(computeChoiceConfidentCalls(qs, { tag: 'nobody' }, 0.8, true), []);
  assert.throws(() => computeChoiceConfidentCalls(qs, {}, nextDown(0.5)), /threshold is 0\.49999/);
});

test('counting: final and first forecasts, late forecasts, window end and filters as for yes/no', () => {
  // SCORING.md "Which forecasts count": final = latest counting (same time: entered last).
  const f = [
    { at: T0 + 5 * DAY, probs: [0.9, 0.1], seq: 7 },
    { at: T0 + DAY, probs: [0.3, 0.7], seq: 3 },
    { at: T0 + 5 * DAY, probs: [0.6, 0.4], seq: 9 },
    { at: T0 + DAY, probs: [0.2, 0.8], seq: 2 },
  ];
  const row = computeChoiceDetail([choiceQuestion('a', 0, f)], {}).per_question[0]!;
  assert.deepEqual(row.probs, [0.6, 0.4]);
  assert.deepEqual(row.probs_first, [0.2, 0.8]);

  // A forecast exactly at T counts; one a millisecond later never does.
  const base = cf([1, [0.4, 0.6]]);
  const atT = { at: T0 + 10 * DAY, probs: [1, 0], seq: 100 };
  const afterT = { at: T0 + 10 * DAY + 1, probs: [0, 1], seq: 101 };
  assert.equal(computeChoiceReport([choiceQuestion('t', 0, [...base, atT])], {}).brier, 0);
  const plain = computeChoiceReport([choiceQuestion('t', 0, base)], {});
  assert.deepEqual(computeChoiceReport([choiceQuestion('t', 0, [...base, afterT])], {}), plain);

  // Window end T = min(close, resolution): a forecast after an early resolution is late.
  const early = { resolution: { outcome: 'option' as const, option: 0, at: T0 + 4 * DAY } };
  const e1 = computeChoiceReport([choiceQuestion('e', 0, cf([1, [0.4, 0.6]]), early)], {});
  const e2 = computeChoiceReport([choiceQuestion('e', 0, cf([1, [0.4, 0.6]], [6, [1, 0]]), early)], {});
  assert.deepEqual(e2, e1);
  const day4 = T0 + 4 * DAY;
  assert.equal(computeChoiceReport([choiceQuestion('e', 0, cf([1, [0.4, 0.6]]), early)], { from: day4, to: day4 }).scored, 1);
  assert.equal(computeChoiceReport([choiceQuestion('e', 0, cf([1, [0.4, 0.6]]), early)], { from: day4 + 1 }).scored, 0);

  // Classification after the tag filter.
  const qs = [
    choiceQuestion('s', 1, cf([1, [0.5, 0.5]]), { tags: ['work'] }),
    choiceQuestion('u', 1, cf([11, [0.5, 0.5]]), { tags: ['work'] }),
    choiceQuestion('v', 'void', cf([1, [0.5, 0.5]]), { tags: ['work'] }),
    choiceQuestion('o', null, cf([1, [0.5, 0.5]]), { tags: ['work'] }),
    choiceQuestion('x', 0, cf([1, [0.5, 0.5]])),
  ];
  const all = computeChoiceReport(qs, {});
  assert.deepEqual([all.scored, all.unscored, all.void, all.open], [2, 1, 1, 1]);
  // The yes/no report's options object serves as the filter.
  const options: ScoreOptions = { tag: 'work', default_costs: { false_alarm: 1, miss: 1 } };
  const work = computeChoiceReport(qs, options);
  assert.deepEqual([work.scored, work.unscored, work.void, work.open], [1, 1, 1, 1]);
});

test('choice scores do not depend on the order revisions were entered', () => {
  // SCORING.md defines everything by forecast times; entry order only breaks exact ties.
  const qs = randomChoiceDiary(11, 120);
  const rand = mulberry32(12);
  const reordered = qs.map((q) => ({
    ...q,
    forecasts: shuffled(q.forecasts, rand).map((f, k) => ({ ...f, seq: 10_000 + k })),
  }));
  // Same times may now tie in a different entry order; keep only questions without ties.
  const untied = (q: ScoringChoiceQuestion) => new Set(q.forecasts.map((f) => f.at)).size === q.forecasts.length;
  const a = qs.filter(untied);
  const b = reordered.filter(untied);
  assert.ok(a.length > 60);
  assert.deepEqual(computeChoiceReport(b, {}), computeChoiceReport(a, {}));
  assert.deepEqual(computeChoiceDetail(b, {}), computeChoiceDetail(a, {}));
});

test('adding a void question changes nothing but the void count', () => {
  // SCORING.md: void questions are never scored.
  const qs = randomChoiceDiary(5, 50);
  const base = computeChoiceReport(qs, {});
  const withVoid = computeChoiceReport([...qs, choiceQuestion('zz', 'void', cf([1, [0.99, 0.01]]), { ordered: true })], {});
  assert.deepEqual(withVoid, { ...base, void: base.void + 1 });
});

test('an empty selection gives every key, with null for undefined figures', () => {
  // INTERFACES.md §2: counts 0 and figures null when there are none.
  const r = computeChoiceReport([], {});
  assert.deepEqual(r, {
    scored: 0,
    unscored: 0,
    void: 0,
    open: 0,
    brier: null,
    log_score: null,
    rps: null,
    rps_n: 0,
    skill: { vs_uniform: null, vs_base_rate: null, vs_first: null },
    top_choice: { n: 0, mean_confidence: null, hit_rate: null, wilson_low: null, wilson_high: null },
    bins: [],
    confident_misses: [],
  });
  // Unordered questions only: no RPS.
  const unordered = computeChoiceReport([choiceQuestion('a', 0, cf([0, [0.5, 0.5]]))], {});
  assert.equal(unordered.rps, null);
  assert.equal(unordered.rps_n, 0);
});

test('RPS averages over ordered questions only', () => {
  // SCORING.md: mean over ordered questions.
  const qs = [
    choiceQuestion('a', 2, cf([0, [0.2, 0.5, 0.3]]), { ordered: true }),
    choiceQuestion('b', 0, cf([0, [0.5, 0.5]]), { ordered: true }),
    choiceQuestion('c', 0, cf([0, [0, 0, 1]])),
  ];
  const r = computeChoiceReport(qs, {});
  assert.equal(r.rps_n, 2);
  close(r.rps, (0.265 + 0.25) / 2, 1e-15, 'RPS');
});

test('scorecard detail lists choice questions by window end, then id', () => {
  const early = { resolution: { outcome: 'option' as const, option: 1, at: T0 + 3 * DAY } };
  const qs = [
    choiceQuestion('b', 0, cf([0, [0.6, 0.4]])),
    choiceQuestion('a', 1, cf([0, [0.5, 0.25, 0.25]]), early),
    choiceQuestion('c', 2, cf([0, [0.2, 0.5, 0.3]]), { ordered: true, tags: ['x'] }),
  ];
  const d = computeChoiceDetail(qs, {});
  assert.deepEqual(d.per_question.map((r) => r.id), ['a', 'b', 'c']);
  const c = d.per_question[2]!;
  assert.deepEqual(
    { ...c, brier: Math.round(c.brier * 1e12) / 1e12, rps: Math.round(c.rps! * 1e12) / 1e12 },
    {
      id: 'c',
      title: 'Question c',
      tags: ['x'],
      T: T0 + 10 * DAY,
      ordered: true,
      probs: [0.2, 0.5, 0.3],
      probs_first: [0.2, 0.5, 0.3],
      outcome_option: 2,
      brier: 0.78,
      log_score: -Math.log(0.3),
      rps: 0.265,
      top_option: 1,
      top_p: 0.5,
    },
  );
  assert.equal(d.per_question[1]!.rps, null);
});

test('probability vectors: the sum tolerance 1e-6 at its one-ulp neighbours', () => {
  // SCORING.md: each in [0, 1], summing to 1 within 1e-6, compared as |Σ − 1| ≤ 1e-6.
  // Above 1 a sum is a multiple of 2⁻⁵², below 1 of 2⁻⁵³: the last sums that pass.
  const high = 1 + Math.floor(CHOICE_SUM_TOLERANCE * 2 ** 52) / 2 ** 52;
  const low = 1 - Math.floor(CHOICE_SUM_TOLERANCE * 2 ** 53) / 2 ** 53;
  assert.ok(high - 1 <= 1e-6 && nextUp(high) - 1 > 1e-6, 'high is the edge');
  assert.ok(1 - low <= 1e-6 && 1 - nextDown(low) > 1e-6, 'low is the edge');
  assert.equal(sumsToOne(high), true);
  assert.equal(sumsToOne(nextUp(high)), false);
  assert.equal(sumsToOne(low), true);
  assert.equal(sumsToOne(nextDown(low)), false);
  assert.equal(sumsToOne(Number.NaN), false);
  // As vectors: 0.5 + (s − 0.5) adds back to s exactly.
  assert.equal(choiceVectorProblem([0.5, high - 0.5], 2), null);
  assert.match(choiceVectorProblem([0.5, nextUp(high) - 0.5], 2)!, /sum to 1/);
  assert.equal(choiceVectorProblem([0.5, low - 0.5], 2), null);
  assert.match(choiceVectorProblem([0.5, nextDown(low) - 0.5], 2)!, /sum to 1/);
  // The engine applies the same rule.
  assert.equal(computeChoiceReport([choiceQuestion('h', 0, cf([0, [0.5, high - 0.5]]))], {}).scored, 1);
  assert.throws(
    () => computeChoiceReport([choiceQuestion('h', 0, cf([0, [0.5, nextUp(high) - 0.5]]))], {}),
    /question 0 \("h"\): forecast 0 probs must sum to 1/,
  );
  // Typed percentages that add to 100 % in decimal pass (0.1 + 0.2 + 0.7 ≠ 1 in binary).
  assert.equal(choiceVectorProblem([0.1, 0.2, 0.7], 3), null);
});

test('choice rules: option counts, vectors and option indices', () => {
  // INTERFACES.md: 2 to 12 options; one probability per option; a 0-based option index.
  assert.equal(optionCountProblem(2), null);
  assert.equal(optionCountProblem(12), null);
  assert.match(optionCountProblem(1)!, /2 to 12/);
  assert.match(optionCountProblem(13)!, /2 to 12/);
  assert.match(optionCountProblem(2.5)!, /2 to 12/);
  assert.match(choiceVectorProblem([0.5, 0.5], 3)!, /one probability per option \(3\), not 2/);
  assert.match(choiceVectorProblem([1.2, -0.2], 2)!, /entry 0 is 1.2/);
  assert.match(choiceVectorProblem([Number.NaN, 1], 2)!, /entry 0 is NaN/);
  assert.equal(choiceVectorProblem(new Float64Array([0.25, 0.75]), 2), null);
  assert.equal(optionIndexProblem(0, 3), null);
  assert.equal(optionIndexProblem(2, 3), null);
  assert.match(optionIndexProblem(3, 3)!, /0 to 2/);
  assert.match(optionIndexProblem(-1, 3)!, /0 to 2/);
  assert.match(optionIndexProblem(1.5, 3)!, /0 to 2/);
});

test('invalid choice input is rejected with a RangeError naming the question and field', () => {
  const ok = (extra: Partial<ScoringChoiceQuestion> = {}) => choiceQuestion('q', 0, cf([0, [0.5, 0.5]]), extra);
  const rejects = (q: ScoringChoiceQuestion, pattern: RegExp) => assert.throws(() => computeChoiceReport([q], {}), pattern);
  rejects(choiceQuestion('q', 0, cf([0, [0.5, 0.3, 0.2]]), { option_count: 2 }), /"q".*forecast 0 probs must give one probability per option/);
  rejects(choiceQuestion('q', 0, cf([0, [0.6, 0.6]])), /"q".*forecast 0 probs must sum to 1/);
  rejects(ok({ option_count: 1 }), /"q".*option_count must be 2 to 12/);
  rejects(ok({ option_count: 13 }), /option_count/);
  rejects(ok({ option_base_rates: [0.5, 0.6] }), /"q".*option_base_rates must sum to 1/);
  rejects(ok({ resolution: { outcome: 'option', option: 2, at: T0 } }), /"q".*resolution option must be the 0-based index/);
  rejects(ok({ resolution: { outcome: 'yes', at: T0 } as unknown as ScoringChoiceQuestion['resolution'] }), /"q".*outcome is "yes"/);
  rejects(ok({ ordered: 'yes' as unknown as boolean }), /"q".*ordered/);
  rejects(ok({ closes_at: Number.NaN }), /"q".*closes_at/);
  rejects(choiceQuestion('q', 0, [{ at: Number.NaN, probs: [0.5, 0.5], seq: 1 }]), /"q".*forecast 0 time/);
  rejects(choiceQuestion('q', 0, [{ at: T0, probs: [0.5, 0.5], seq: Number.NaN }]), /"q".*seq/);
  // Invalid questions fail even when the filter would leave them out.
  assert.throws(() => computeChoiceReport([ok({ option_count: 1, tags: [] })], { tag: 'other' }), RangeError);
  assert.throws(() => computeChoiceReport([], { from: T0 + 1, to: T0 }), /from .* is after to/);
  // The single-forecast functions check their input too.
  assert.throws(() => multiCategoryBrier([0.5, 0.5], 2), /outcome must be the 0-based index/);
  assert.throws(() => multiCategoryBrier([1], 0), /2 to 12 options/);
  assert.throws(() => rankedProbabilityScore([0.6, 0.6], 0), /sum to 1/);
  assert.throws(() => choiceLogScore([0.5, 0.5], -1), RangeError);
  assert.throws(() => topChoice([0.3, 0.3, 0.3]), /sum to 1/);
});
