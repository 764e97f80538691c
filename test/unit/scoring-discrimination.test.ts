import { test } from 'node:test';
import assert from 'node:assert/strict';
import { rocAuc, rocCurve } from '../../shared/scoring/index';

test('AUC matches the scikit-learn roc_auc_score docstring example', () => {
  // Source: scikit-learn roc_auc_score docstring; Fawcett 2006, Pattern Recognition
  // Letters 27:861–874: y = [0, 0, 1, 1], p = [0.1, 0.4, 0.35, 0.8] → 0.75.
  assert.equal(rocAuc([0.1, 0.4, 0.35, 0.8], [0, 0, 1, 1]), 0.75);
});

test('AUC counts ties as one half', () => {
  // Derived from Hanley & McNeil 1982 (Mann–Whitney with ties ½): every pair tied → 0.5;
  // pairs (0.5 vs 0.5: ½), (0.5 vs 0.2: 1), (0.9 vs 0.5: 1), (0.9 vs 0.2: 1) → 3.5/4.
  assert.equal(rocAuc([0.3, 0.3, 0.3, 0.3], [0, 1, 0, 1]), 0.5);
  assert.equal(rocAuc([0.5, 0.9, 0.5, 0.2], [1, 1, 0, 0]), 3.5 / 4);
  // Perfect and perfectly wrong ranking.
  assert.equal(rocAuc([0.1, 0.2, 0.8, 0.9], [0, 0, 1, 1]), 1);
  assert.equal(rocAuc([0.1, 0.2, 0.8, 0.9], [1, 1, 0, 0]), 0);
});

test('AUC equals the brute-force pair count on random data', () => {
  // Derived from the Mann–Whitney definition, counted pair by pair.
  let seed = 12345;
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  for (let trial = 0; trial < 20; trial++) {
    const p: number[] = [];
    const o: number[] = [];
    for (let i = 0; i < 60; i++) {
      p.push(Math.round(rand() * 10) / 10);
      o.push(rand() < 0.4 ? 1 : 0);
    }
    let pairs = 0;
    let total = 0;
    for (let i = 0; i < p.length; i++) {
      for (let j = 0; j < p.length; j++) {
        if (o[i] === 1 && o[j] === 0) {
          total++;
          pairs += p[i]! > p[j]! ? 1 : p[i] === p[j] ? 0.5 : 0;
        }
      }
    }
    assert.equal(rocAuc(p, o), total === 0 ? null : pairs / total, `trial ${trial}`);
  }
});

test('AUC is null when only one outcome occurs', () => {
  // SCORING.md: null when either outcome is absent.
  assert.equal(rocAuc([0.2, 0.7], [1, 1]), null);
  assert.equal(rocAuc([0.2, 0.7], [0, 0]), null);
  assert.throws(() => rocAuc([], []), RangeError);
  assert.throws(() => rocAuc([0.2, 1.7], [0, 1]), RangeError);
});

test('ROC curve matches the scikit-learn roc_curve docstring example', () => {
  // Source: scikit-learn roc_curve docstring: y = [1, 1, 2, 2], scores [0.1, 0.4, 0.35, 0.8]
  // → fpr [0, 0, 0.5, 0.5, 1], tpr [0, 0.5, 0.5, 1, 1].
  const curve = rocCurve([0.1, 0.4, 0.35, 0.8], [0, 0, 1, 1]);
  assert.deepEqual(curve.map((pt) => pt.fpr), [0, 0, 0.5, 0.5, 1]);
  assert.deepEqual(curve.map((pt) => pt.tpr), [0, 0.5, 0.5, 1, 1]);
  // Derived: the trapezoidal area under these points is the AUC.
  let area = 0;
  for (let i = 1; i < curve.length; i++) {
    area += ((curve[i]!.fpr - curve[i - 1]!.fpr) * (curve[i]!.tpr + curve[i - 1]!.tpr)) / 2;
  }
  assert.equal(area, 0.75);
  // Tied forecasts across outcomes make one diagonal step.
  assert.deepEqual(rocCurve([0.3, 0.3], [0, 1]), [{ fpr: 0, tpr: 0 }, { fpr: 1, tpr: 1 }]);
  assert.deepEqual(rocCurve([0.3, 0.4], [1, 1]), []);
});
