import { test } from 'node:test';
import assert from 'node:assert/strict';
import {
  brierScore,
  clipProbability,
  logScore,
  shareCertain,
  sharpness,
  timeAveragedSquaredError,
} from '../../shared/scoring/index';

const close = (actual: number, expected: number, tol: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: got ${actual}, expected ${expected} ± ${tol}`);

test('Brier score of single forecasts matches the worked examples', () => {
  // Source: Brier score article, Wikipedia, "Examples" (Brier 1950 defines the score).
  const cases: [number, number, number][] = [
    [0.7, 1, 0.09],
    [0.7, 0, 0.49],
    [0.3, 1, 0.49],
    [0.5, 1, 0.25],
    [0.5, 0, 0.25],
    [1, 1, 0],
    [1, 0, 1],
  ];
  for (const [p, o, expected] of cases) close(brierScore([p], [o]), expected, 1e-12, `p=${p} o=${o}`);
});

test("Brier's original two-category form is twice the binary form", () => {
  // Source: CHECK-VALUES.md, Brier 1950: 0.7 and the event occurs → 0.18 in the original form.
  close(2 * brierScore([0.7], [1]), 0.18, 1e-12, 'two-category Brier');
});

test('Brier score matches the scikit-learn brier_score_loss docstring example', () => {
  // Source: scikit-learn brier_score_loss docstring: y=[0,1,1,0], p=[0.1,0.9,0.8,0.3] → 0.0375.
  close(brierScore([0.1, 0.9, 0.8, 0.3], [0, 1, 1, 0]), 0.0375, 1e-12, 'brier');
});

test('log score matches the scikit-learn log_loss docstring example', () => {
  // Source: scikit-learn log_loss docstring: true-class probabilities 0.9, 0.9, 0.8, 0.65
  // → 0.21616… (natural log). Here as P(Yes) with outcomes Yes, No, No, Yes.
  const value = logScore([0.9, 0.1, 0.2, 0.65], [1, 0, 0, 1]);
  close(value, 0.21616, 5e-6, 'log score');
  // Derived from the definition −mean(ln q): the same figure to full precision.
  close(value, -(2 * Math.log(0.9) + Math.log(0.8) + Math.log(0.65)) / 4, 1e-15, 'log score');
});

test('log score clips forecasts to [0.001, 0.999]', () => {
  // Derived from SCORING.md: a 0 % forecast on a Yes costs ln(1000), not infinity.
  close(logScore([0], [1]), Math.log(1000), 1e-12, 'p=0, yes');
  close(logScore([1], [0]), Math.log(1000), 1e-12, 'p=1, no');
  close(logScore([1], [1]), -Math.log(0.999), 1e-15, 'p=1, yes');
  assert.equal(clipProbability(0.0004), 0.001);
  assert.equal(clipProbability(0.9995), 0.999);
  assert.equal(clipProbability(0.42), 0.42);
});

test('time-averaged squared error weights each standing forecast by how long it stood', () => {
  // Derived from SCORING.md: 0.2 stands 100 ms, 0.4 stands 800 ms, outcome Yes:
  // (0.64·100 + 0.36·800) / 900.
  close(timeAveragedSquaredError([0, 100], [0.2, 0.4], 2, 1, 0, 900), (0.64 * 100 + 0.36 * 800) / 900, 1e-15, 'ta');
  // Same time twice: the one entered later stands (the earlier lasts zero time).
  close(timeAveragedSquaredError([0, 0, 100], [0.9, 0.2, 0.4], 3, 1, 0, 900), (0.64 * 100 + 0.36 * 800) / 900, 1e-15, 'ties');
  // Window starting later than the first forecast: only the part inside counts.
  close(timeAveragedSquaredError([0, 100], [0.2, 0.4], 2, 1, 50, 150), (0.64 * 50 + 0.36 * 50) / 100, 1e-15, 'sub-window');
  // A window of zero length: the forecast standing at its end.
  close(timeAveragedSquaredError([0, 100], [0.2, 0.4], 2, 0, 100, 100), 0.16, 1e-15, 'zero length');
  // Entries after the window end never stand inside it.
  close(timeAveragedSquaredError([0, 100, 2000], [0.2, 0.4, 1], 3, 1, 0, 900), (0.64 * 100 + 0.36 * 800) / 900, 1e-15, 'late');
});

test('sharpness and share of certain forecasts follow their definitions', () => {
  // Derived from SCORING.md: mean(2·|p − 0.5|); 0 for always 50 %, 1 for always 0 or 1.
  assert.equal(sharpness([0.5, 0.5]), 0);
  assert.equal(sharpness([0, 1, 1]), 1);
  close(sharpness([0.7, 0.2]), (0.4 + 0.6) / 2, 1e-15, 'sharpness');
  assert.equal(shareCertain([0, 0.5, 1, 0.999]), 0.5);
});

test('accuracy functions reject invalid input with a RangeError', () => {
  assert.throws(() => brierScore([1.2], [1]), RangeError);
  assert.throws(() => brierScore([-0.1], [1]), RangeError);
  assert.throws(() => brierScore([Number.NaN], [1]), RangeError);
  assert.throws(() => brierScore([], []), RangeError);
  assert.throws(() => brierScore([0.5, 0.5], [1]), RangeError);
  assert.throws(() => brierScore([0.5], [2]), RangeError);
  assert.throws(() => logScore([0.5], [0.5]), RangeError);
  assert.throws(() => sharpness([]), RangeError);
  assert.throws(() => shareCertain([2]), RangeError);
  assert.throws(() => clipProbability(Number.NaN), RangeError);
  assert.throws(() => timeAveragedSquaredError([100], [0.5], 1, 1, 0, 900), RangeError, 'nothing stands at start');
  assert.throws(() => timeAveragedSquaredError([100, 0], [0.5, 0.5], 2, 1, 100, 900), RangeError, 'unsorted');
  assert.throws(() => timeAveragedSquaredError([0], [0.5], 1, 1, 900, 100), RangeError, 'end before start');
  assert.throws(() => timeAveragedSquaredError([0], [0.5], 0, 1, 0, 100), RangeError, 'count 0');
});
