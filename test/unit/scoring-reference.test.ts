import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { computeScoreReport, type ScoringQuestion } from '../../shared/scoring/index';

// Expected values from independent implementations: scikit-learn brier_score_loss,
// log_loss (on the clipped forecasts), roc_auc_score; statsmodels Logit fitted by Newton's
// method on logit(clip(p)) with an intercept, and proportion_confint(method='wilson').
// Regenerate with `/usr/bin/python3 test/fixtures/reference/generate.py`.
interface Dataset {
  name: string;
  p: number[];
  o: number[];
  expected: {
    brier: number;
    log_score: number;
    auc: number;
    intercept: number;
    slope: number;
    bins: { index: number; n: number; events: number; wilson_low: number; wilson_high: number }[];
  };
}

const file = new URL('../fixtures/reference/values.json', import.meta.url);
const { datasets } = JSON.parse(readFileSync(file, 'utf8')) as { datasets: Dataset[] };

const close = (actual: number | null, expected: number, tol: number, what: string) =>
  assert.ok(actual !== null && Math.abs(actual - expected) <= tol, `${what}: got ${actual}, expected ${expected} ± ${tol}`);

function asQuestions(ds: Dataset): ScoringQuestion[] {
  return ds.p.map((p, i) => ({
    id: `${ds.name}-${i}`,
    title: `${ds.name} ${i}`,
    tags: [],
    kind: 'state_at_deadline',
    closes_at: 1_000_000,
    resolution: { outcome: ds.o[i] === 1 ? 'yes' : 'no', at: 1_000_000 },
    base_rate: null,
    costs: null,
    forecasts: [{ at: 0, p, seq: i }],
    references: [],
  }));
}

test('reference data sets are present', () => {
  assert.ok(datasets.length >= 3, 'values.json holds at least three data sets');
  for (const ds of datasets) assert.equal(ds.p.length, ds.o.length);
});

for (const ds of datasets) {
  test(`engine matches scikit-learn and statsmodels on "${ds.name}" (n = ${ds.p.length})`, () => {
    const r = computeScoreReport(asQuestions(ds), { default_costs: { false_alarm: 1, miss: 1 } });
    assert.equal(r.scored, ds.p.length);
    // Source: scikit-learn brier_score_loss.
    close(r.brier, ds.expected.brier, 1e-9, 'brier');
    // Source: scikit-learn log_loss on np.clip(p, 0.001, 0.999).
    close(r.log_score, ds.expected.log_score, 1e-9, 'log score');
    // Source: scikit-learn roc_auc_score.
    close(r.auc, ds.expected.auc, 1e-9, 'AUC');
    // Source: statsmodels Logit(o, [1, logit(clip(p))]).fit(method='newton').
    assert.equal(r.calibration.reason, null);
    close(r.calibration.intercept, ds.expected.intercept, 1e-6, 'intercept');
    close(r.calibration.slope, ds.expected.slope, 1e-6, 'slope');
    // Source: statsmodels proportion_confint(method='wilson'), which uses z = 1.959963985…
    // rather than SCORING.md's 1.959964, hence 1e-7 rather than 1e-9.
    assert.deepEqual(
      r.bins.map((b) => [b.index, b.n, Math.round(b.observed * b.n)]),
      ds.expected.bins.map((b) => [b.index, b.n, b.events]),
    );
    r.bins.forEach((b, i) => {
      close(b.wilson_low, ds.expected.bins[i]!.wilson_low, 1e-7, `bin ${b.index} Wilson low`);
      close(b.wilson_high, ds.expected.bins[i]!.wilson_high, 1e-7, `bin ${b.index} Wilson high`);
    });
  });
}
