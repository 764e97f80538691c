import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  computeScoreReport,
  computeScorecardDetail,
  relativeValue,
  wilsonInterval,
  type ScoreOptions,
  type ScoreReport,
  type ScoringForecast,
  type ScoringQuestion,
} from '../../shared/scoring/index';

const close = (actual: number, expected: number, tol: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: got ${actual}, expected ${expected} ± ${tol}`);

const DAY = 86_400_000;
const T0 = Date.UTC(2026, 0, 1);
const OPTS: ScoreOptions = { default_costs: { false_alarm: 1, miss: 1 } };

/** Seeded PRNG (mulberry32) so the random checks are reproducible. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

let nextSeq = 1;
/** Forecasts at the given day offsets from T0, in entry order. */
function fc(...entries: [number, number][]): ScoringForecast[] {
  return entries.map(([day, p]) => ({ at: T0 + day * DAY, p, seq: nextSeq++ }));
}

function question(id: string, outcome: 'yes' | 'no' | 'void' | null, forecasts: ScoringForecast[], extra: Partial<ScoringQuestion> = {}): ScoringQuestion {
  return {
    id,
    title: `Question ${id}`,
    tags: [],
    kind: 'state_at_deadline',
    closes_at: T0 + 10 * DAY,
    resolution: outcome === null ? null : { outcome, at: T0 + 10 * DAY },
    base_rate: null,
    costs: null,
    forecasts,
    references: [],
    ...extra,
  };
}

/** A random diary whose forecasts are revised a few times before each window end. */
function randomDiary(seed: number, n: number): ScoringQuestion[] {
  const rand = mulberry32(seed);
  const qs: ScoringQuestion[] = [];
  for (let i = 0; i < n; i++) {
    const truth = rand();
    const fs: [number, number][] = [];
    const k = 1 + Math.floor(rand() * 5);
    for (let j = 0; j < k; j++) fs.push([j * 2 + rand(), Math.round(rand() * 100) / 100]);
    qs.push(
      question(`q${String(i).padStart(3, '0')}`, rand() < truth ? 'yes' : 'no', fc(...fs), {
        base_rate: i % 3 === 0 ? Math.round(truth * 10) / 10 : null,
        references: i % 4 === 0 ? [{ at: T0 + 3 * DAY, p: truth }] : [],
        costs: i % 5 === 0 ? { false_alarm: 1, miss: 3 } : null,
      }),
    );
  }
  return qs;
}

test('an empty selection gives every key, with null for undefined figures', () => {
  // INTERFACES.md §2: figures that are undefined are null, never absent.
  const r = computeScoreReport([], OPTS);
  assert.deepEqual(Object.keys(r).sort(), [
    'auc', 'bins', 'brier', 'brier_time_avg', 'calibration', 'confident_misses', 'decisions', 'decomposition',
    'log_score', 'open', 'scored', 'share_certain', 'sharpness', 'skill', 'unscored', 'value_curve', 'void',
  ]);
  assert.deepEqual([r.scored, r.unscored, r.void, r.open], [0, 0, 0, 0]);
  assert.equal(r.brier, null);
  assert.equal(r.log_score, null);
  assert.deepEqual(Object.values(r.decomposition), [null, null, null, null, null]);
  assert.deepEqual(r.bins, []);
  assert.equal(r.calibration.slope, null);
  assert.equal(typeof r.calibration.reason, 'string');
  assert.deepEqual(Object.values(r.skill), [null, null, null, null, null]);
  assert.equal(r.decisions.hit_rate, null);
  assert.equal(r.value_curve.length, 99);
  assert.ok(r.value_curve.every((pt) => pt.value === null));
  assert.deepEqual(r.confident_misses, []);
});

test('counting: scored, unscored, void and open after the tag and window-end filters', () => {
  const qs = [
    question('s1', 'yes', fc([1, 0.7]), { tags: ['work'] }),
    question('s2', 'no', fc([1, 0.2])),
    // Resolved, but the only forecast came after the window end → unscored.
    question('u1', 'no', fc([11, 0.2]), { tags: ['work'] }),
    question('u2', 'yes', []),
    question('v1', 'void', fc([1, 0.9]), { tags: ['work'] }),
    question('o1', null, fc([1, 0.5]), { tags: ['work'] }),
  ];
  const r = computeScoreReport(qs, OPTS);
  assert.deepEqual([r.scored, r.unscored, r.void, r.open], [2, 2, 1, 1]);
  const work = computeScoreReport(qs, { ...OPTS, tag: 'work' });
  assert.deepEqual([work.scored, work.unscored, work.void, work.open], [1, 1, 1, 1]);
  assert.equal(computeScoreReport(qs, { ...OPTS, tag: 'none' }).scored, 0);

  // Window end T = min(close, resolution): resolved on day 4 of a 10-day window.
  const early = question('e', 'yes', fc([1, 0.6]), { kind: 'event_by_deadline', resolution: { outcome: 'yes', at: T0 + 4 * DAY } });
  const day4 = T0 + 4 * DAY;
  assert.equal(computeScoreReport([early], { ...OPTS, from: day4, to: day4 }).scored, 1, 'bounds are inclusive');
  assert.equal(computeScoreReport([early], { ...OPTS, from: day4 + 1 }).scored, 0);
  assert.equal(computeScoreReport([early], { ...OPTS, to: day4 - 1 }).scored, 0);
  // Resolved after the close: T is the close.
  const late = question('l', 'no', fc([1, 0.3]), { resolution: { outcome: 'no', at: T0 + 20 * DAY } });
  assert.equal(computeScoreReport([late], { ...OPTS, to: T0 + 10 * DAY }).scored, 1);
  // An open question's T is its close.
  const open = question('o', null, []);
  assert.equal(computeScoreReport([open], { ...OPTS, from: T0 + 10 * DAY, to: T0 + 10 * DAY }).open, 1);
  assert.equal(computeScoreReport([open], { ...OPTS, to: T0 + 9 * DAY }).open, 0);
});

test('final and first forecasts: latest and earliest counting ones, ties broken by entry order', () => {
  // SCORING.md: final = latest counting forecast (same time: entered last); first = earliest.
  const f: ScoringForecast[] = [
    { at: T0 + 5 * DAY, p: 0.8, seq: 7 },
    { at: T0 + DAY, p: 0.2, seq: 3 },
    { at: T0 + 5 * DAY, p: 0.6, seq: 9 },
    { at: T0 + DAY, p: 0.3, seq: 2 },
  ];
  const d = computeScorecardDetail([question('a', 'yes', f)], OPTS);
  assert.equal(d.per_question[0]!.p, 0.6);
  assert.equal(d.per_question[0]!.p1, 0.3);
  // Times already ascending, but the tied pair listed against entry order.
  const tied: ScoringForecast[] = [
    { at: T0 + DAY, p: 0.3, seq: 5 },
    { at: T0 + DAY, p: 0.2, seq: 4 },
  ];
  const t = computeScorecardDetail([question('t', 'yes', tied)], OPTS);
  assert.equal(t.per_question[0]!.p, 0.3);
  assert.equal(t.per_question[0]!.p1, 0.2);
});

test('a long revision history in any order scores like the same history in order', () => {
  // Derived from SCORING.md (figures depend on times and, for ties, entry order only);
  // 300 revisions with many shared times exercise the sort used for long histories.
  const rand = mulberry32(21);
  const ordered: ScoringForecast[] = [];
  for (let i = 0; i < 300; i++) ordered.push({ at: T0 + Math.floor(i / 3) * 3_600_000, p: Math.round(rand() * 100) / 100, seq: i });
  const shuffled = ordered.slice();
  for (let i = shuffled.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [shuffled[i], shuffled[j]] = [shuffled[j]!, shuffled[i]!];
  }
  const refs = { references: [{ at: T0 + DAY, p: 0.4 }, { at: T0 + 2 * DAY, p: 0.7 }] };
  const a = computeScoreReport([question('h', 'yes', ordered, refs)], OPTS);
  const b = computeScoreReport([question('h', 'yes', shuffled, refs)], OPTS);
  assert.deepEqual(b, a);
  // Derived: the final forecast is the last entered at the latest time.
  close(a.brier!, (ordered[299]!.p - 1) ** 2, 1e-15, 'final forecast');
});

test('a forecast exactly at T counts; a forecast after T is never scored', () => {
  // SCORING.md: a forecast counts only if its time is ≤ T.
  const base = fc([1, 0.4]);
  const atT = { at: T0 + 10 * DAY, p: 0.9, seq: nextSeq++ };
  const afterT = { at: T0 + 10 * DAY + 1, p: 0.01, seq: nextSeq++ };
  const withAtT = computeScoreReport([question('a', 'yes', [...base, atT])], OPTS);
  close(withAtT.brier!, 0.01, 1e-15, 'final forecast is the one at T');
  const plain = computeScoreReport([question('a', 'yes', base)], OPTS);
  const withLate = computeScoreReport([question('a', 'yes', [...base, afterT])], OPTS);
  assert.deepEqual(withLate, plain);
  // Early resolution: a forecast after the resolution but before the close is late too.
  const early = { kind: 'event_by_deadline' as const, resolution: { outcome: 'yes' as const, at: T0 + 4 * DAY } };
  const a = computeScoreReport([question('e', 'yes', fc([1, 0.4]), early)], OPTS);
  const b = computeScoreReport([question('e', 'yes', [...fc([1, 0.4]), { at: T0 + 6 * DAY, p: 1, seq: nextSeq++ }], early)], OPTS);
  assert.deepEqual(b, a);
});

test('scores do not depend on the order revisions were entered', () => {
  // SCORING.md defines everything by forecast times; entry order only breaks exact ties.
  const qs = randomDiary(3, 60);
  const base = computeScoreReport(qs, OPTS);
  const rand = mulberry32(99);
  const shuffled = qs.map((q) => {
    const fs = q.forecasts.slice();
    for (let i = fs.length - 1; i > 0; i--) {
      const j = Math.floor(rand() * (i + 1));
      [fs[i], fs[j]] = [fs[j]!, fs[i]!];
    }
    // Entered in the shuffled order: new entry numbers follow the new order.
    return { ...q, forecasts: fs.map((f, k) => ({ ...f, seq: 10_000 + k })) };
  });
  assert.deepEqual(computeScoreReport(shuffled, OPTS), base);
  assert.deepEqual(computeScorecardDetail(shuffled, OPTS), computeScorecardDetail(qs, OPTS));
});

test('a perfect forecaster scores 0', () => {
  // Derived from Brier 1950: (p − o)² = 0 when p = o.
  const qs = Array.from({ length: 30 }, (_, i) =>
    question(`p${i}`, i % 3 ? 'no' : 'yes', fc([0, i % 3 ? 0 : 1])),
  );
  const r = computeScoreReport(qs, OPTS);
  assert.equal(r.brier, 0);
  assert.equal(r.brier_time_avg, 0);
  assert.equal(r.decomposition.reliability, 0);
  assert.equal(r.auc, 1);
  assert.equal(r.sharpness, 1);
  assert.equal(r.share_certain, 1);
  assert.equal(r.skill.vs_even, 1);
  assert.equal(r.skill.vs_climatology, 1);
  assert.equal(r.decisions.cost, 0);
  assert.equal(r.decisions.peirce, 1);
  // Separable by construction: the calibration slope would be infinite.
  assert.equal(r.calibration.slope, null);
  assert.match(r.calibration.reason!, /separate/);
  // The log score clips 0 and 1 to 0.001 and 0.999 (SCORING.md).
  close(r.log_score!, -Math.log(0.999), 1e-15, 'log score');
});

test('always saying 50 % scores 0.25', () => {
  // Source: Brier score article, Wikipedia, "Examples" (0.5 either way → 0.25).
  const qs = Array.from({ length: 25 }, (_, i) => question(`h${i}`, i % 2 ? 'no' : 'yes', fc([0, 0.5], [3, 0.5])));
  const r = computeScoreReport(qs, OPTS);
  assert.equal(r.brier, 0.25);
  assert.equal(r.brier_time_avg, 0.25);
  assert.equal(r.skill.vs_even, 0);
  assert.equal(r.sharpness, 0);
  assert.equal(r.auc, 0.5);
  close(r.log_score!, Math.log(2), 1e-15, 'log score');
  assert.match(r.calibration.reason!, /same/);
});

test('adding a void question changes nothing but the void count', () => {
  // SCORING.md: void questions are never scored.
  const qs = randomDiary(5, 40);
  const base = computeScoreReport(qs, OPTS);
  const withVoid = computeScoreReport([...qs, question('zz-void', 'void', fc([1, 0.99]), { base_rate: 0.1 })], OPTS);
  assert.deepEqual(withVoid, { ...base, void: base.void + 1 });
});

test('decomposition identity holds on a scored diary to 1e-12', () => {
  // Derived: BS = REL − RES + UNC + WBV − WBC is exact (SCORING.md, Stephenson et al. 2008).
  const r = computeScoreReport(randomDiary(17, 500), OPTS);
  const d = r.decomposition;
  close(d.reliability! - d.resolution! + d.uncertainty! + d.within_bin_variance! - d.within_bin_covariance!, r.brier!, 1e-12, 'identity');
  // Bins: non-empty only, with Wilson intervals of their observed frequency.
  assert.equal(r.bins.reduce((s, b) => s + b.n, 0), r.scored);
  for (const b of r.bins) {
    assert.ok(b.n > 0);
    const [lo, hi] = wilsonInterval(Math.round(b.observed * b.n), b.n);
    close(b.wilson_low, lo, 1e-15, `bin ${b.index} low`);
    close(b.wilson_high, hi, 1e-15, `bin ${b.index} high`);
  }
  // 500 overlapping random questions: the calibration fit is reported.
  assert.equal(r.calibration.reason, null);
  assert.equal(typeof r.calibration.slope, 'number');
});

test('time-averaged Brier and the skill scores on a worked example', () => {
  // Derived from SCORING.md's definitions, by hand.
  const a = question('a', 'yes', fc([0, 0.2], [1, 0.4]), {
    base_rate: 0.3,
    references: [{ at: T0 + 5 * DAY, p: 0.6 }, { at: T0 + 12 * DAY, p: 1 }],
  });
  const b = question('b', 'no', fc([2, 0.85]));
  const r: ScoreReport = computeScoreReport([a, b], OPTS);
  // a: final 0.4 → 0.36; b: 0.85 → 0.7225.
  close(r.brier!, (0.36 + 0.7225) / 2, 1e-15, 'brier');
  // a stands at 0.2 for 1 day and 0.4 for 9 days; b has one forecast, from day 2 to 10.
  close(r.brier_time_avg!, ((0.64 * 1 + 0.36 * 9) / 10 + 0.7225) / 2, 1e-15, 'time-averaged');
  // vs_base_rate: only a has a base rate: 1 − 0.36 / 0.49.
  close(r.skill.vs_base_rate!, 1 - 0.36 / 0.49, 1e-15, 'vs_base_rate');
  // vs_first: first forecasts 0.2 (a) and 0.85 (b).
  close(r.skill.vs_first!, 1 - (0.36 + 0.7225) / (0.64 + 0.7225), 1e-15, 'vs_first');
  close(r.skill.vs_climatology!, 1 - r.brier! / 0.25, 1e-15, 'vs_climatology (ō = ½)');
  close(r.skill.vs_even!, 1 - r.brier! / 0.25, 1e-15, 'vs_even');
  // vs_reference: only a; s = day 5 (later of first own, day 0, and first reference), the
  // reference at day 12 is after T. Over [5, 10]: own 0.4 → 0.36, reference 0.6 → 0.16.
  close(r.skill.vs_reference!, 1 - 0.36 / 0.16, 1e-12, 'vs_reference');
  // Decisions at α = ½: a no act (miss), b act (false alarm).
  assert.deepEqual([r.decisions.hits, r.decisions.false_alarms, r.decisions.misses, r.decisions.correct_rejections], [0, 1, 1, 0]);
  // Value curve: at α = 0.3 both final forecasts (0.4, 0.85) exceed α, so a user with that
  // ratio acts on both: H = 1, F = 1, s = ½; by hand (0.3 − 0.15 + 0.35 − 0.5) / 0.15 = 0.
  close(r.value_curve[29]!.value!, relativeValue(0.3, 0.5, 1, 1)!, 1e-15, 'V(0.3)');
  close(r.value_curve[29]!.value!, 0, 1e-12, 'V(0.3) by hand');
  // At α = 0.6 only b acts (false alarm): H = 0, F = 1: (0.5 − 0.3 + 0 − 0.5) / (0.5 − 0.3).
  close(r.value_curve[59]!.value!, -0.3 / 0.2, 1e-12, 'V(0.6) by hand');
});

test('vs_reference averages both sides over the same window after the later first forecast', () => {
  // Derived from SCORING.md: own forecast from day 0, reference from day 2; window [2, 10].
  const q = question('r', 'no', fc([0, 0.9], [6, 0.1]), { references: [{ at: T0 + 2 * DAY, p: 0.5 }, { at: T0 + 8 * DAY, p: 0.3 }] });
  const r = computeScoreReport([q], OPTS);
  const own = (0.81 * 4 + 0.01 * 4) / 8;
  const ref = (0.25 * 6 + 0.09 * 2) / 8;
  close(r.skill.vs_reference!, 1 - own / ref, 1e-12, 'vs_reference');
  // Two references at the same time: the later one in the list stands (types.ts).
  const tied = question('t', 'no', fc([0, 0.9], [6, 0.1]), {
    references: [{ at: T0 + 2 * DAY, p: 0.9 }, { at: T0 + 8 * DAY, p: 0.3 }, { at: T0 + 2 * DAY, p: 0.5 }],
  });
  close(computeScoreReport([tied], OPTS).skill.vs_reference!, 1 - own / ref, 1e-12, 'tied references');
  // No reference at or before T → null.
  const none = computeScoreReport([question('n', 'no', fc([0, 0.9]), { references: [{ at: T0 + 11 * DAY, p: 0.5 }] })], OPTS);
  assert.equal(none.skill.vs_reference, null);
});

test('skill is null when the reference is perfect', () => {
  // SCORING.md: SS null when BS_ref = 0. First forecasts perfect → vs_first null; all Yes → UNC = 0.
  const r = computeScoreReport([question('a', 'yes', fc([0, 1], [1, 0.7]), { base_rate: 1 })], OPTS);
  assert.equal(r.skill.vs_first, null);
  assert.equal(r.skill.vs_climatology, null);
  assert.equal(r.skill.vs_base_rate, null);
  close(r.skill.vs_even!, 1 - 0.09 / 0.25, 1e-15, 'vs_even');
});

test('per-question costs and the diary default decide each question', () => {
  // Derived from SCORING.md: α = FA/(FA + M); questions without costs use the default.
  const qs = [
    question('a', 'no', fc([0, 0.3]), { costs: { false_alarm: 1, miss: 9 } }), // α 0.1: act → false alarm 1
    question('b', 'no', fc([0, 0.3])), // default α 0.25 (1, 3): act → false alarm 1
  ];
  const r = computeScoreReport(qs, { default_costs: { false_alarm: 1, miss: 3 } });
  assert.equal(r.decisions.false_alarms, 2);
  assert.equal(r.decisions.cost, 2);
  const timid = computeScoreReport(qs, { default_costs: { false_alarm: 3, miss: 1 } });
  assert.equal(timid.decisions.false_alarms, 1);
});

test('the value curve at α = s equals the Peirce score of the decisions', () => {
  // Source: Richardson 2000 (V at α = s equals H − F); table hits 20, misses 5, false
  // alarms 15, correct rejections 60, so s = 0.25 = α at k = 25.
  const qs: ScoringQuestion[] = [];
  const add = (count: number, outcome: 'yes' | 'no', p: number) => {
    for (let i = 0; i < count; i++) qs.push(question(`${outcome}${p}-${i}`, outcome, fc([0, p])));
  };
  add(20, 'yes', 0.9);
  add(5, 'yes', 0.1);
  add(15, 'no', 0.9);
  add(60, 'no', 0.1);
  const r = computeScoreReport(qs, OPTS);
  assert.deepEqual([r.decisions.hits, r.decisions.misses, r.decisions.false_alarms, r.decisions.correct_rejections], [20, 5, 15, 60]);
  close(r.decisions.peirce!, 0.8 - 0.2, 1e-12, 'Peirce');
  assert.equal(r.value_curve[24]!.alpha, 0.25);
  close(r.value_curve[24]!.value!, r.decisions.peirce!, 1e-12, 'V(α = s)');
});

test('confident misses: ≥ 0.8 on a No or ≤ 0.2 on a Yes, worst first, ties by id', () => {
  // INTERFACES.md §2.
  const qs = [
    question('c', 'no', fc([0, 0.8])),
    question('b', 'yes', fc([0, 0.2])),
    question('a', 'yes', fc([0, 0.05])),
    question('d', 'no', fc([0, 0.95])),
    question('e', 'no', fc([0, 0.79])),
    question('f', 'yes', fc([0, 0.21])),
    question('g', 'yes', fc([0, 0.95])),
  ];
  const r = computeScoreReport(qs, OPTS);
  assert.deepEqual(r.confident_misses.map((m) => [m.id, m.p, m.outcome]), [
    ['a', 0.05, 'yes'],
    ['d', 0.95, 'no'],
    ['b', 0.2, 'yes'],
    ['c', 0.8, 'no'],
  ]);
  assert.equal(r.confident_misses[0]!.title, 'Question a');
});

test('scorecard detail: rows by window end, running Brier, ROC and intervals', () => {
  const early = { resolution: { outcome: 'yes' as const, at: T0 + 3 * DAY } };
  const qs = [
    question('b', 'no', fc([0, 0.3])), // T = day 10, (0.3)² = 0.09
    question('a', 'yes', fc([0, 0.6]), early), // T = day 3, 0.16
    question('c', 'yes', fc([0, 0.8]), { tags: ['x'] }), // T = day 10, 0.04
  ];
  const d = computeScorecardDetail(qs, OPTS);
  assert.deepEqual(d.per_question.map((r) => r.id), ['a', 'b', 'c']);
  assert.deepEqual(d.per_question[2], { id: 'c', title: 'Question c', tags: ['x'], T: T0 + 10 * DAY, p: 0.8, p1: 0.8, outcome: 'yes', brier: (0.8 - 1) ** 2 });
  // Questions sharing a window end make one point.
  assert.equal(d.running_brier.length, 2);
  assert.equal(d.running_brier[0]!.n, 1);
  close(d.running_brier[0]!.brier, 0.16, 1e-15, 'running 1');
  assert.equal(d.running_brier[1]!.n, 3);
  close(d.running_brier[1]!.brier, (0.16 + 0.09 + 0.04) / 3, 1e-15, 'running 2');
  // ROC from (0, 0) to (1, 1); AUC counts.
  assert.deepEqual(d.roc[0], { fpr: 0, tpr: 0 });
  assert.deepEqual(d.roc[d.roc.length - 1], { fpr: 1, tpr: 1 });
  assert.deepEqual(d.auc_n, { yes: 2, no: 1 });
  // Brier interval: mean ± 1.959964·sd/√n (common practice), sd with n − 1.
  const se = [0.16, 0.09, 0.04];
  const m = (0.16 + 0.09 + 0.04) / 3;
  const sd = Math.sqrt(se.reduce((s, x) => s + (x - m) ** 2, 0) / 2);
  close(d.brier_interval![0], Math.max(0, m - (1.959964 * sd) / Math.sqrt(3)), 1e-15, 'brier low');
  close(d.brier_interval![1], m + (1.959964 * sd) / Math.sqrt(3), 1e-15, 'brier high');
  assert.ok(d.log_interval![0] >= 0 && d.log_interval![1] > d.log_interval![0]);
  // Fewer than two scored questions: no interval.
  const one = computeScorecardDetail([qs[0]!], OPTS);
  assert.equal(one.brier_interval, null);
  assert.equal(one.log_interval, null);
  assert.deepEqual(one.roc, []);
});

test('invalid questions and options are rejected with a RangeError naming them', () => {
  assert.throws(() => computeScoreReport([question('bad', 'yes', fc([0, 1.2]))], OPTS), /"bad".*forecast 0/);
  assert.throws(() => computeScoreReport([question('nan', 'yes', fc([0, Number.NaN]))], OPTS), RangeError);
  assert.throws(() => computeScoreReport([question('t', 'yes', [{ at: Number.NaN, p: 0.5, seq: 1 }])], OPTS), RangeError);
  assert.throws(() => computeScoreReport([question('c', 'yes', fc([0, 0.5]), { costs: { false_alarm: 0, miss: 1 } })], OPTS), RangeError);
  assert.throws(() => computeScoreReport([question('b', 'yes', fc([0, 0.5]), { base_rate: -0.1 })], OPTS), RangeError);
  assert.throws(() => computeScoreReport([question('r', 'yes', fc([0, 0.5]), { references: [{ at: T0, p: 2 }] })], OPTS), RangeError);
  assert.throws(() => computeScoreReport([], { default_costs: { false_alarm: 1, miss: 0 } }), RangeError);
  assert.throws(() => computeScoreReport([], { ...OPTS, from: T0 + 1, to: T0 }), RangeError);
});
