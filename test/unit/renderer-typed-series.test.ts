/**
 * What the choice and numeric history charts plot (renderer/src/chart/typedSeries.ts): one
 * step line per option carried to the resolution, references grouped by source, a numeric
 * question's outer and inner bands and median, and the value axis covering the outcome.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { choiceSeries, numericSeries } from '../../renderer/src/chart/typedSeries';

const frame = { opened_at: '2026-01-01T00:00:00Z', closes_at: '2026-03-01T00:00:00Z', resolved_at: '2026-02-20T00:00:00Z' };
const t = (iso: string) => Date.parse(iso);

test('a choice history: one line per option, in entry order, carried to the resolution', () => {
  const series = choiceSeries(
    {
      ...frame,
      options: ['A', 'B'],
      option_base_rates: [0.7, 0.3],
      // Entered out of order and two at the same time: the later entry (seq 3) stands last.
      forecasts: [
        { at: '2026-01-10T00:00:00Z', probs: [0.6, 0.4], seq: 3 },
        { at: '2026-01-02T00:00:00Z', probs: [0.5, 0.5], seq: 1 },
        { at: '2026-01-10T00:00:00Z', probs: [0.2, 0.8], seq: 2 },
      ],
      references: [
        { at: '2026-01-05T00:00:00Z', probs: [0.9, 0.1], source: 'client' },
        { at: '2026-01-06T00:00:00Z', probs: [0.8, 0.2], source: 'client' },
      ],
      outcome_option: 0,
      void: false,
    },
    t('2026-06-01T00:00:00Z'),
  );
  assert.deepEqual(
    series.options[0]!.points,
    [
      { x: t('2026-01-02T00:00:00Z'), y: 0.5 },
      { x: t('2026-01-10T00:00:00Z'), y: 0.2 },
      { x: t('2026-01-10T00:00:00Z'), y: 0.6 },
      { x: t(frame.resolved_at), y: 0.6, hold: true },
    ],
  );
  assert.equal(series.options[1]!.baseRate, 0.3);
  assert.deepEqual(series.references, [
    {
      source: 'client',
      perOption: [
        [
          { x: t('2026-01-05T00:00:00Z'), y: 0.9 },
          { x: t('2026-01-06T00:00:00Z'), y: 0.8 },
        ],
        [
          { x: t('2026-01-05T00:00:00Z'), y: 0.1 },
          { x: t('2026-01-06T00:00:00Z'), y: 0.2 },
        ],
      ],
    },
  ]);
  assert.ok(series.axis.xMin < t(frame.opened_at) && series.axis.xMax > t(frame.closes_at));
});

test('a numeric history: outer band, inner band with five levels, median, and an axis that shows the outcome', () => {
  const series = numericSeries(
    {
      ...frame,
      unit: 'weeks',
      value_kind: 'number',
      levels: [0.05, 0.25, 0.5, 0.75, 0.95],
      forecasts: [{ at: '2026-01-02T00:00:00Z', quantiles: [5, 8, 10, 12, 15], seq: 1 }],
      references: [{ at: '2026-01-03T00:00:00Z', quantiles: [6, 7, 9, 11, 12], source: 'plan' }],
      value: 30,
      void: false,
    },
    t('2026-06-01T00:00:00Z'),
  );
  assert.deepEqual(series.low.map((p) => p.y), [5, 5]);
  assert.deepEqual(series.high.map((p) => p.y), [15, 15]);
  assert.deepEqual(series.innerLow.map((p) => p.y), [8, 8]);
  assert.deepEqual(series.innerHigh.map((p) => p.y), [12, 12]);
  assert.deepEqual(series.median.map((p) => p.y), [10, 10]);
  assert.deepEqual(series.references[0]!.points, [{ x: t('2026-01-03T00:00:00Z'), y: 9, low: 6, high: 12 }]);
  assert.ok(series.yMin < 5 && series.yMax > 30, 'the outcome far outside the range is on the chart');
});

test('with three levels there is no inner band; with the median alone, no band at all', () => {
  const base = { ...frame, unit: '', value_kind: 'number' as const, references: [], value: null, void: false };
  const three = numericSeries({ ...base, levels: [0.1, 0.5, 0.9], forecasts: [{ at: '2026-01-02T00:00:00Z', quantiles: [1, 2, 3], seq: 1 }] }, 0);
  assert.equal(three.innerLow.length, 0);
  const median = numericSeries({ ...base, levels: [0.5], forecasts: [{ at: '2026-01-02T00:00:00Z', quantiles: [2], seq: 1 }] }, 0);
  assert.equal(median.low.length, 0);
  assert.deepEqual(median.median.map((p) => p.y), [2, 2]);
});
