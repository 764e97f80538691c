import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import {
  choiceLogScore,
  computeChoiceReport,
  computeNumericReport,
  computeScoreReport,
  quantileScore,
  wilsonInterval,
  type ScoringChoiceQuestion,
  type ScoringNumericQuestion,
  type ScoringQuestion,
} from '../../shared/scoring/index';

// Expected values from independent implementations: scikit-learn brier_score_loss,
// log_loss (on the clipped forecasts; multi-class for choice questions), roc_auc_score,
// mean_pinball_loss; statsmodels Logit fitted by Newton's method on logit(clip(p)) with
// an intercept, and proportion_confint(method='wilson').
// Regenerate with `npm run reference-values` (test/fixtures/reference/generate.py).
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

interface ChoiceDataset {
  name: string;
  probs: number[][];
  option: number[];
  expected: { log_score: number };
}

interface NumericDataset {
  name: string;
  levels: number[];
  quantiles: number[][];
  y: number[];
  /** scikit-learn mean_pinball_loss(y, q_τ, alpha=τ), keyed by τ as Python prints it. */
  expected: { mean_pinball_loss: Record<string, number> };
}

interface WilsonRow {
  successes: number;
  n: number;
  wilson_low: number;
  wilson_high: number;
}

const file = new URL('../fixtures/reference/values.json', import.meta.url);
const { datasets, choice, numeric, wilson } = JSON.parse(readFileSync(file, 'utf8')) as {
  datasets: Dataset[];
  choice: ChoiceDataset[];
  numeric: NumericDataset[];
  wilson: WilsonRow[];
};

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

test('choice and numeric reference data sets are present', () => {
  assert.ok(choice.length >= 3 && numeric.length >= 3, 'values.json holds choice and numeric data sets');
  for (const ds of choice) assert.equal(ds.probs.length, ds.option.length);
  for (const ds of numeric) assert.equal(ds.quantiles.length, ds.y.length);
});

for (const ds of choice) {
  test(`choice log score matches scikit-learn multi-class log_loss on "${ds.name}" (n = ${ds.option.length})`, () => {
    const K = ds.probs[0]!.length;
    const questions: ScoringChoiceQuestion[] = ds.probs.map((probs, i) => ({
      id: `${ds.name}-${i}`,
      title: `${ds.name} ${i}`,
      tags: [],
      closes_at: 1_000_000,
      resolution: { outcome: 'option', option: ds.option[i]!, at: 1_000_000 },
      option_count: K,
      ordered: false,
      option_base_rates: null,
      forecasts: [{ at: 0, probs, seq: i }],
    }));
    const r = computeChoiceReport(questions, {});
    assert.equal(r.scored, ds.option.length);
    // Source: scikit-learn log_loss(labels, probs, labels=range(K)); no entry is below
    // the 0.001 clip, so the two definitions coincide.
    close(r.log_score, ds.expected.log_score, 1e-9, 'log score');
    const perQuestion = ds.probs.reduce((s, probs, i) => s + choiceLogScore(probs, ds.option[i]!), 0) / ds.probs.length;
    close(perQuestion, ds.expected.log_score, 1e-9, 'mean of choiceLogScore');
  });
}

for (const ds of numeric) {
  test(`quantile scores match scikit-learn mean_pinball_loss on "${ds.name}" (n = ${ds.y.length})`, () => {
    let wisFromReference = 0;
    ds.levels.forEach((tau, k) => {
      // Source: scikit-learn mean_pinball_loss(alpha=τ); SCORING.md's QS_τ is twice it.
      const expected = 2 * ds.expected.mean_pinball_loss[String(tau)]!;
      const actual = ds.y.reduce((s, y, i) => s + quantileScore(ds.quantiles[i]![k]!, y, tau), 0) / ds.y.length;
      close(actual, expected, 1e-9, `QS at τ = ${tau}`);
      wisFromReference += expected / ds.levels.length;
    });
    const questions: ScoringNumericQuestion[] = ds.y.map((y, i) => ({
      id: `${ds.name}-${String(i).padStart(3, '0')}`,
      title: `${ds.name} ${i}`,
      tags: [],
      closes_at: 1_000_000,
      resolution: { outcome: 'value', value: y, at: 1_000_000 },
      unit: '',
      value_kind: 'number',
      levels: ds.levels,
      forecasts: [{ at: 0, quantiles: ds.quantiles[i]!, seq: i }],
    }));
    const r = computeNumericReport(questions, {});
    assert.equal(r.scored, ds.y.length);
    // Derived: the mean over questions of WIS (a mean over levels) is the mean over levels
    // of the per-level means, so it follows from the same reference figures.
    const meanWis = r.questions.reduce((s, q) => s + q.wis, 0) / r.questions.length;
    close(meanWis, wisFromReference, 1e-9, 'mean WIS');
  });
}

test('Wilson intervals match statsmodels proportion_confint(method="wilson")', () => {
  // Source: statsmodels; its z is 1.959963985… rather than SCORING.md's 1.959964, hence 1e-7.
  for (const row of wilson) {
    const [low, high] = wilsonInterval(row.successes, row.n);
    close(low, row.wilson_low, 1e-7, `${row.successes}/${row.n} low`);
    close(high, row.wilson_high, 1e-7, `${row.successes}/${row.n} high`);
  }
});
