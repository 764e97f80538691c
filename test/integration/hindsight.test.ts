/**
 * Hindsight and reference leads on a real diary: the confident calls a user reviews before
 * a new engagement, with the notes written at the time, agree with the scorecard's own
 * confident misses (INTERFACES.md: ≥ 0.8 on a No or ≤ 0.2 on a Yes).
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { openTestDiary } from '../support/temp-diary';

const DAY = 86_400_000;

async function diary() {
  const d = openTestDiary({ now: '2026-01-01T09:00:00Z' });
  const make = async (title: string, path: [number, number, string][], outcome: 'yes' | 'no', refs: [number, number][] = [], tags = ['renewals']) => {
    // Recorded afterwards, as a user writes up calls already made: every time lies in the past.
    const start = d.clock.now - 40 * DAY;
    const q = await d.call('createQuestion', {
      title,
      opened_at: new Date(start).toISOString(),
      closes_at: new Date(start + 30 * DAY).toISOString(),
      tags,
      first_forecast: { p: path[0]![1], note: path[0]![2], at: new Date(start).toISOString() },
    });
    for (const [day, p, note] of path.slice(1)) await d.call('addForecast', { question_id: q.id, p, note, at: new Date(start + day * DAY).toISOString() });
    for (const [day, p] of refs) await d.call('addReference', { question_id: q.id, p, source: "client's view", at: new Date(start + day * DAY).toISOString() });
    await d.call('resolveQuestion', { id: q.id, outcome, at: new Date(start + 30 * DAY).toISOString(), note: `resolved ${outcome}` });
    return q;
  };
  const miss = await make('Board approves the business case', [[0, 0.6, 'looks likely'], [10, 0.85, 'sponsor confident']], 'no');
  const typed20 = await make('Pilot slips a quarter', [[0, 0.2, 'plan is tight but funded']], 'yes');
  const hit = await make('Renewal signed', [[0, 0.5, 'unclear'], [5, 0.9, 'verbal yes']], 'yes', [[1, 0.4], [20, 0.7]]);
  await make('Unconfident call', [[0, 0.55, 'coin flip']], 'no', [], ['other']);
  return { d, miss, typed20, hit };
}

test('confident misses come with the notes written at the time, in the scorecard’s order', async () => {
  const { d, miss, typed20 } = await diary();
  const h = await d.call('hindsight', {});
  assert.equal(h.threshold, 0.8);
  assert.deepEqual(h.entries.map((e: { id: string }) => e.id), [miss.id, typed20.id], 'a typed 20% on a Yes counts');
  const { report } = await d.call('score', {});
  assert.deepEqual(report.confident_misses.map((m: { id: string }) => m.id), h.entries.map((e: { id: string }) => e.id));
  const first = h.entries[0];
  assert.equal(first.verdict, 'miss');
  assert.equal(first.final_p, 0.85);
  assert.deepEqual(first.forecasts.map((f: { note: string }) => f.note), ['looks likely', 'sponsor confident']);
  assert.equal(first.resolution.note, 'resolved no');
  assert.equal(h.report.scored, 4);
  // The Brier score's interval is the Scorecard's, for the whole selection and for a tag.
  const { detail } = await d.call('score', {});
  assert.ok(Array.isArray(h.brier_interval));
  assert.deepEqual(h.brier_interval, detail.brier_interval);
  const tagged = await d.call('hindsight', { tag: 'other' });
  assert.deepEqual(tagged.brier_interval, (await d.call('score', { tag: 'other' })).detail.brier_interval);
});

test('hits on request, threshold adjustable, filtered by tag', async () => {
  const { d, hit } = await diary();
  const withHits = await d.call('hindsight', { include_hits: true });
  assert.equal(withHits.entries.at(-1).id, hit.id);
  assert.equal(withHits.entries.at(-1).verdict, 'hit');
  const strict = await d.call('hindsight', { threshold: 0.9 });
  assert.equal(strict.entries.length, 0);
  const other = await d.call('hindsight', { tag: 'other', threshold: 0.5, include_hits: true });
  assert.equal(other.entries.length, 1);
  assert.equal(other.entries[0].verdict, 'miss', '0.55 leaned Yes and it was No: a miss at threshold 0.5');
  await assert.rejects(d.call('hindsight', { threshold: 0.3 }), /threshold: must be between 0.5 and 1/);
});

test('reference lead: days the user settled on the right side before the reference', async () => {
  const { d } = await diary();
  const { leads } = await d.call('score', {});
  // Renewal: own forecast crosses 50% for good on day 5 (0.9); the reference on day 20
  // (0.7). Lead 15 days (derived from SCORING.md's standing-forecast rule).
  assert.deepEqual(leads[0], { tag: null, n: 1, mean_days: 15 });
  assert.deepEqual(leads.find((l: { tag: string }) => l.tag === 'renewals'), { tag: 'renewals', n: 1, mean_days: 15 });
});

test('briefing: a self-contained printable page for a tag', async () => {
  const { d } = await diary();
  const b = await d.call('briefing', { tag: 'renewals' });
  assert.match(b.title, /renewals/);
  assert.match(b.html, /^<!doctype html>/i);
  assert.match(b.html, /Board approves the business case/);
  assert.match(b.html, /sponsor confident/);
  assert.doesNotMatch(b.html, /<script/i);
});
