/**
 * The engine reads a question's revisions from `forecast_columns` when a loader gives them:
 * the figures must be exactly those of the same revisions given as a list, and a bad value
 * in a column is refused with the same message.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { computeScoreReport, computeScorecardDetail, type ForecastColumns, type ScoringQuestion } from '../../shared/scoring';

const DAY = 86_400_000;
const options = { default_costs: { false_alarm: 1, miss: 3 } };

function listQuestions(): ScoringQuestion[] {
  const out: ScoringQuestion[] = [];
  let seq = 0;
  for (let i = 0; i < 40; i++) {
    const opened = Date.UTC(2025, 0, 1) + i * DAY;
    const closes = opened + 30 * DAY;
    // Out of time order, with a same-time pair and a late revision after the close.
    const forecasts = [
      { at: opened + 10 * DAY, p: ((i * 7) % 10) / 10, seq: seq++ },
      { at: opened + 2 * DAY, p: ((i * 3) % 10) / 10, seq: seq++ },
      { at: opened + 10 * DAY, p: ((i * 5 + 1) % 11) / 10, seq: seq++ },
      { at: closes + DAY, p: 1, seq: seq++ },
    ];
    out.push({
      id: `q${i}`,
      title: `Question ${i}`,
      tags: i % 2 ? ['renewals'] : [],
      kind: 'event_by_deadline',
      closes_at: closes,
      resolution: i % 9 === 8 ? { outcome: 'void', at: closes } : { outcome: i % 3 ? 'yes' : 'no', at: closes - (i % 4) * DAY },
      base_rate: i % 5 ? 0.4 : null,
      costs: null,
      forecasts,
      references: i % 4 === 0 ? [{ at: opened + 5 * DAY, p: 0.5 }] : [],
    });
  }
  return out;
}

/** The same questions with their revisions moved into shared columns, in reverse table order. */
function columnQuestions(questions: ScoringQuestion[]): ScoringQuestion[] {
  const total = questions.reduce((n, q) => n + q.forecasts.length, 0);
  const at = new Float64Array(total + 2).fill(NaN); // a value outside every range: never read
  const p = new Float64Array(total + 2).fill(NaN);
  const seq = new Float64Array(total + 2).fill(NaN);
  let row = 1;
  return questions.map((q) => {
    const start = row;
    for (const f of [...q.forecasts].reverse()) {
      at[row] = f.at;
      p[row] = f.p;
      seq[row] = f.seq;
      row++;
    }
    const columns: ForecastColumns = { at, p, seq, start, end: row };
    return { ...q, forecasts: [], forecast_columns: columns };
  });
}

test('figures from forecast columns equal those from the same forecasts as a list', () => {
  const list = listQuestions();
  const cols = columnQuestions(list);
  assert.deepEqual(computeScoreReport(cols, options), computeScoreReport(list, options));
  assert.deepEqual(computeScorecardDetail(cols, { ...options, tag: 'renewals' }), computeScorecardDetail(list, { ...options, tag: 'renewals' }));
  assert.ok(computeScoreReport(cols, options).scored > 30);
});

test('a bad value in a column is refused, naming the question and the forecast', () => {
  const cols = columnQuestions(listQuestions());
  const q = cols[3]!;
  q.forecast_columns!.p[q.forecast_columns!.start + 1] = 1.0000000000000002;
  assert.throws(() => computeScoreReport(cols, options), (err: unknown) => err instanceof RangeError && /question 3 \("q3"\): forecast 1/.test(err.message));
  q.forecast_columns!.p[q.forecast_columns!.start + 1] = 1;
  q.forecast_columns!.at[q.forecast_columns!.start] = NaN;
  assert.throws(() => computeScoreReport(cols, options), (err: unknown) => err instanceof RangeError && /question 3 \("q3"\): forecast 0 time/.test(err.message));
});
