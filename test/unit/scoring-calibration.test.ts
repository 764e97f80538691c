import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  MIN_CALIBRATION_N,
  SCORECARD_BIN_EDGES,
  binIndex,
  brierDecomposition,
  brierScore,
  calibrationBins,
  calibrationFit,
  wilsonInterval,
} from '../../shared/scoring/index';
import { mulberry32 } from '../bench/make-diary';

const close = (actual: number, expected: number, tol: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: got ${actual}, expected ${expected} ± ${tol}`);


test('scorecard bins: edges (2k − 1)/20, a forecast falls in the bin of edges ≤ p', () => {
  // Derived from SCORING.md: bin 0 is [0, 0.05), bin 1 [0.05, 0.15), …, bin 10 [0.95, 1].
  assert.equal(SCORECARD_BIN_EDGES.length, 10);
  assert.equal(binIndex(0, SCORECARD_BIN_EDGES), 0);
  assert.equal(binIndex(0.0499, SCORECARD_BIN_EDGES), 0);
  assert.equal(binIndex(0.05, SCORECARD_BIN_EDGES), 1);
  assert.equal(binIndex(0.15, SCORECARD_BIN_EDGES), 2);
  assert.equal(binIndex(0.35, SCORECARD_BIN_EDGES), 4);
  assert.equal(binIndex(0.5, SCORECARD_BIN_EDGES), 5);
  assert.equal(binIndex(0.95, SCORECARD_BIN_EDGES), 10);
  assert.equal(binIndex(1, SCORECARD_BIN_EDGES), 10);
});

test('general binning reproduces the scikit-learn calibration_curve docstring example', () => {
  // Source: scikit-learn calibration_curve docstring, 3 uniform bins (edges 1/3, 2/3):
  // prob_true [0, 0.5, 1], prob_pred [0.2, 0.525, 0.85].
  const o = [0, 0, 0, 0, 1, 1, 1, 1, 1];
  const p = [0.1, 0.2, 0.3, 0.4, 0.65, 0.7, 0.8, 0.9, 1.0];
  const bins = calibrationBins(p, o, [1 / 3, 2 / 3]);
  assert.deepEqual(bins.map((b) => b.observed), [0, 0.5, 1]);
  const expectedMean = [0.2, 0.525, 0.85];
  bins.forEach((b, i) => close(b.mean_p, expectedMean[i]!, 1e-12, `mean forecast of bin ${i}`));
  // The same inputs in the scorecard's bins, by hand (derived from SCORING.md's edges):
  // 0.1→1, 0.2→2, 0.3→3, 0.4→4, 0.65→7, 0.7→7, 0.8→8, 0.9→9, 1.0→10.
  const ours = calibrationBins(p, o, SCORECARD_BIN_EDGES);
  assert.deepEqual(ours.map((b) => [b.index, b.n, b.observed]), [
    [1, 1, 0], [2, 1, 0], [3, 1, 0], [4, 1, 0], [7, 2, 1], [8, 1, 1], [9, 1, 1], [10, 1, 1],
  ]);
  close(ours.find((b) => b.index === 7)!.mean_p, 0.675, 1e-12, 'bin 7 mean');
});

test('Murphy decomposition: forecasts equal to their bin values', () => {
  // Source: CHECK-VALUES.md (derived from Murphy 1973's formulas): 0.1 ×5 (1 event),
  // 0.6 ×4 (2 events), 0.9 ×5 (4 events) → BS 0.195714…, REL 0.01, RES 0.0642857…, UNC 0.25.
  const p = [...Array(5).fill(0.1), ...Array(4).fill(0.6), ...Array(5).fill(0.9)] as number[];
  const o = [1, 0, 0, 0, 0, 1, 1, 0, 0, 1, 1, 1, 1, 0];
  const d = brierDecomposition(p, o, SCORECARD_BIN_EDGES);
  const bs = brierScore(p, o);
  close(bs, 2.74 / 14, 1e-12, 'BS');
  close(bs, 0.195714, 5e-7, 'BS');
  close(d.reliability, 0.01, 1e-12, 'REL');
  close(d.resolution, 0.9 / 14, 1e-12, 'RES');
  close(d.resolution, 0.0642857, 5e-8, 'RES');
  close(d.uncertainty, 0.25, 1e-15, 'UNC');
  close(d.within_bin_variance, 0, 1e-15, 'WBV');
  close(d.within_bin_covariance, 0, 1e-15, 'WBC');
  close(d.reliability - d.resolution + d.uncertainty, bs, 1e-12, 'REL − RES + UNC = BS');
});

test('within-bin terms close the gap when forecasts in a bin differ', () => {
  // Source: CHECK-VALUES.md (derived; Stephenson, Coelho & Jolliffe 2008): f = [0.1, 0.3,
  // 0.7, 0.9], o = [0, 1, 1, 1] in two bins → REL − RES + UNC = 0.19, BS = 0.15.
  const p = [0.1, 0.3, 0.7, 0.9];
  const o = [0, 1, 1, 1];
  const d = brierDecomposition(p, o, [0.5]);
  close(brierScore(p, o), 0.15, 1e-12, 'BS');
  close(d.reliability - d.resolution + d.uncertainty, 0.19, 1e-12, 'three-term sum');
  // Derived: WBV = 4·0.01/4, WBC = 2·(0.05 + 0.05)/4.
  close(d.within_bin_variance, 0.01, 1e-12, 'WBV');
  close(d.within_bin_covariance, 0.05, 1e-12, 'WBC');
  close(d.reliability - d.resolution + d.uncertainty + d.within_bin_variance - d.within_bin_covariance, 0.15, 1e-12, 'identity');
});

test('decomposition identity BS = REL − RES + UNC + WBV − WBC holds to 1e-12 on random data', () => {
  // Derived: the identity is exact algebra (SCORING.md); only rounding may separate the sides.
  const rand = mulberry32(7);
  for (let trial = 0; trial < 50; trial++) {
    const n = 1 + Math.floor(rand() * 400);
    const p: number[] = [];
    const o: number[] = [];
    for (let i = 0; i < n; i++) {
      const pi = trial % 5 === 0 ? Math.round(rand() * 20) / 20 : rand();
      p.push(pi);
      o.push(rand() < pi ? 1 : 0);
    }
    const d = brierDecomposition(p, o, SCORECARD_BIN_EDGES);
    const rhs = d.reliability - d.resolution + d.uncertainty + d.within_bin_variance - d.within_bin_covariance;
    close(rhs, brierScore(p, o), 1e-12, `trial ${trial} (n=${n})`);
  }
});

test('Wilson intervals match Newcombe 1998, Table II', () => {
  // Source: Newcombe 1998, Statistics in Medicine 17:857–872, Table II (method 3, Wilson score).
  const cases: [number, number, number, number][] = [
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ];
  for (const [x, n, low, high] of cases) {
    const [l, h] = wilsonInterval(x, n);
    close(l, low, 5e-5, `${x}/${n} low`);
    close(h, high, 5e-5, `${x}/${n} high`);
  }
  assert.equal(wilsonInterval(0, 20)[0], 0);
  assert.equal(wilsonInterval(20, 20)[1], 1);
  assert.throws(() => wilsonInterval(3, 2), RangeError);
  assert.throws(() => wilsonInterval(0, 0), RangeError);
  assert.throws(() => wilsonInterval(1.5, 4), RangeError);
});

test('calibration fit recovers the exact two-group solution', () => {
  // Derived from the logistic model: with forecasts at only two values the maximum
  // likelihood fit reproduces each group's observed frequency, so
  // logit(0.3) = a + b·logit(0.2) and logit(0.6) = a + b·logit(0.8).
  const p = [...Array(10).fill(0.2), ...Array(10).fill(0.8)] as number[];
  const o = [1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0];
  const logit = (x: number) => Math.log(x / (1 - x));
  const b = (logit(0.6) - logit(0.3)) / (logit(0.8) - logit(0.2));
  const a = logit(0.3) - b * logit(0.2);
  const fit = calibrationFit(p, o);
  assert.equal(fit.reason, null);
  close(fit.slope!, b, 1e-9, 'slope');
  close(fit.intercept!, a, 1e-9, 'intercept');
});

test('calibration fit is not reported, with a reason, where SCORING.md says so', () => {
  const rand = mulberry32(11);
  const mixed = (n: number) => {
    const p: number[] = [];
    const o: number[] = [];
    for (let i = 0; i < n; i++) {
      p.push(0.1 + 0.8 * rand());
      o.push(i % 3 === 0 ? 1 : 0);
    }
    return { p, o };
  };
  // N < 20.
  const small = mixed(MIN_CALIBRATION_N - 1);
  const f1 = calibrationFit(small.p, small.o);
  assert.equal(f1.intercept, null);
  assert.equal(f1.slope, null);
  assert.match(f1.reason!, /at least 20/);
  // Exactly 20 with overlap is reported.
  const twenty = mixed(20);
  twenty.p[0] = 0.9; // a Yes above…
  twenty.p[1] = 0.1; // …and a No below the rest keep the data overlapping
  assert.equal(calibrationFit(twenty.p, twenty.o).reason, null);
  // One outcome only.
  const allYes = calibrationFit(twenty.p, twenty.o.map(() => 1));
  assert.equal(allYes.slope, null);
  assert.match(allYes.reason!, /both outcomes/);
  // All forecasts equal (after clipping: 0 and 0.0005 both become 0.001).
  const equal = calibrationFit(twenty.p.map((_, i) => (i % 2 ? 0 : 0.0005)), twenty.o);
  assert.equal(equal.slope, null);
  assert.match(equal.reason!, /same/);
  // Separable: every Yes forecast above every No forecast, and quasi-separable (touching).
  const sep = calibrationFit(twenty.o.map((y, i) => (y ? 0.6 + i / 100 : 0.5 - i / 100)), twenty.o);
  assert.equal(sep.slope, null);
  assert.match(sep.reason!, /separate/);
  // Touching: the lowest Yes (i = 0) and the highest No (i = 1) are both 0.5.
  const touching = calibrationFit(twenty.o.map((y, i) => (y ? 0.5 + i / 100 : 0.5 - (i - 1) / 100)), twenty.o);
  assert.equal(touching.slope, null);
  assert.match(touching.reason!, /separate/);
  // Reversed separation (Yes always lower) is just as divergent.
  const reversed = calibrationFit(twenty.o.map((y, i) => (y ? 0.2 - i / 200 : 0.7 + i / 200)), twenty.o);
  assert.equal(reversed.slope, null);
  assert.match(reversed.reason!, /separate/);
  assert.throws(() => calibrationFit([0.5, 2], [0, 1]), RangeError);
  assert.throws(() => calibrationFit([0.5], [0, 1]), RangeError);
});

test('binning and decomposition reject invalid input', () => {
  assert.throws(() => calibrationBins([], [], SCORECARD_BIN_EDGES), RangeError);
  assert.throws(() => binIndex(1.2, SCORECARD_BIN_EDGES), RangeError);
  assert.throws(() => binIndex(0.5, [0.5, 0.5]), RangeError);
  assert.throws(() => calibrationBins([0.5], [1], [0.6, 0.4]), RangeError);
  assert.throws(() => brierDecomposition([Number.NaN], [1], SCORECARD_BIN_EDGES), RangeError);
});
