/**
 * A question with 150,000 revisions imports, reads, scores and charts. Such a
 * list once went through `Math.min(...list)`, which passes every element as an argument
 * and overflows the stack; shared/extent.ts is the one-pass replacement.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { chartSeries, historyData } from '../../renderer/src/chart/series';
import { extent } from '../../shared/extent';
import { openTestDiary } from '../support/temp-diary';

const REVISIONS = 150_000;
const START = Date.parse('2026-01-01T00:00:00Z');

test('extent finds the smallest and largest of a list far longer than any argument list', () => {
  const values = Array.from({ length: 1_000_000 }, (_, i) => (i * 7919) % 1_000_003);
  values[123_456] = -5;
  values[654_321] = 2_000_000;
  assert.deepEqual(extent(values), { min: -5, max: 2_000_000 });
  assert.deepEqual(extent([]), { min: Infinity, max: -Infinity });
});

test('a question with 150,000 revisions imports without an opened_at, then reads, scores and charts', async () => {
  const d = openTestDiary({ now: '2026-06-01T12:00:00Z' });
  // Newest first, so the opening time must come from the smallest, not the first.
  const forecasts = Array.from({ length: REVISIONS }, (_, i) => ({ at: new Date(START + (REVISIONS - i) * 60_000).toISOString(), p: (i % 99) / 100 + 0.005 }));
  const file = {
    format: 'forelog-diary',
    version: 1,
    questions: [
      { id: 'long', title: 'Revised every minute', closes_at: '2026-05-01T00:00:00Z', forecasts, resolution: { outcome: 'yes', at: '2026-05-01T00:00:00Z' } },
    ],
  };
  const added = await d.service.dispatch('importText', { format: 'json', text: JSON.stringify(file) });
  assert.deepEqual(added, { ok: true, value: { added: 1, skipped: 0 } });

  const q = await d.call('getQuestion', { id: 'long' });
  assert.equal(q.forecasts.length, REVISIONS);
  assert.equal(q.opened_at, new Date(START + 60_000).toISOString(), 'opened at the earliest revision');

  const score = await d.call('score', {});
  assert.equal(score.report.scored, 1);
  const hindsight = await d.call('hindsight', { threshold: 0.5, include_hits: true });
  assert.equal(hindsight.entries[0]?.forecasts.length ?? REVISIONS, REVISIONS);

  const series = chartSeries(historyData(q), Date.parse('2026-06-01T12:00:00Z'));
  assert.ok(series.xMin < START + 60_000 && series.xMax > Date.parse('2026-05-01T00:00:00Z'));
});
