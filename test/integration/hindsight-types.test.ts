/**
 * Hindsight and the briefing for choice and numeric questions on a real diary
 * (docs/scoring.md "Hindsight: confident calls"; SCORING.md "Confident miss" and
 * "Surprise"): choice confident misses and numeric surprises beside the yes/no entries,
 * with the notes written at the time, and the filters applied to every list.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { openTestDiary } from '../support/temp-diary';

const OPENED = '2026-01-05T09:00:00.000Z';
const CLOSES = '2026-04-30T16:00:00.000Z';
const RESOLVED = '2026-04-20T10:00:00.000Z';

async function diary() {
  const d = openTestDiary({ now: '2026-06-01T12:00:00Z', timeZone: 'Europe/London' });
  const base = (title: string, tags: string[]) => ({ title, opened_at: OPENED, closes_at: CLOSES, tags });

  const choice = async (title: string, tags: string[], path: [string, number[], string][], option: number, extra: object = {}) => {
    const q = await d.call('createQuestion', {
      ...base(title, tags),
      type: 'choice',
      options: ['Brackenfold <Systems>', 'Orrin & Co', 'Neither'],
      ...extra,
      first_forecast: { probs: path[0]![1], note: path[0]![2], at: path[0]![0] },
    });
    for (const [at, probs, note] of path.slice(1)) await d.call('addForecast', { question_id: q.id, probs, note, at });
    await d.call('resolveQuestion', { id: q.id, outcome: 'option', option, at: RESOLVED, note: `option ${option} came true` });
    return q.id as string;
  };
  const numeric = async (title: string, tags: string[], path: [string, (number | string)[], string][], value: number | string, extra: object = {}) => {
    const q = await d.call('createQuestion', {
      ...base(title, tags),
      type: 'numeric',
      unit: 'weeks',
      ...extra,
      first_forecast: { quantiles: path[0]![1], note: path[0]![2], at: path[0]![0] },
    });
    for (const [at, quantiles, note] of path.slice(1)) await d.call('addForecast', { question_id: q.id, quantiles, note, at });
    await d.call('resolveQuestion', { id: q.id, outcome: 'value', value, at: RESOLVED, note: `came to ${value}` });
    return q.id as string;
  };

  const miss = await choice(
    'Which supplier will the client pick?',
    ['client:a'],
    [
      ['2026-02-01T09:00:00.000Z', [0.55, 0.3, 0.15], 'technical front-runner'],
      ['2026-03-01T09:00:00.000Z', [0.85, 0.12, 0.03], 'panel chair says "safe pair of hands"'],
    ],
    1,
    { ordered: false, option_base_rates: [0.45, 0.35, 0.2], base_rate_note: '20 awards' },
  );
  const milder = await choice('Which format will the board choose?', ['client:b'], [['2026-02-01T09:00:00.000Z', [0.1, 0.75, 0.15], 'hinted']], 0);
  const hit = await choice('Which site goes first?', ['client:a'], [['2026-02-01T09:00:00.000Z', [0.9, 0.05, 0.05], 'obvious']], 0);
  const wide = await numeric(
    'Weeks from kickoff to go-live',
    ['client:a'],
    [
      ['2026-02-01T09:00:00.000Z', [10, 14, 20], 'vendor says twelve'],
      ['2026-03-01T09:00:00.000Z', [12, 15, 21], 'narrowed'],
    ],
    29,
  );
  const early = await numeric(
    'When will the board sign?',
    ['client:b'],
    [['2026-02-01T09:00:00.000Z', ['2026-03-01', '2026-03-10', '2026-03-20'], 'monthly board']],
    '2026-02-25',
    { unit: '', value_kind: 'date' },
  );
  await numeric('Tickets at quarter end', ['client:a'], [['2026-02-01T09:00:00.000Z', [150, 200, 260], 'falling']], 212);
  return { d, miss, milder, hit, wide, early };
}

test('choice confident misses and numeric surprises come beside the yes/no entries, with the notes of the time', async () => {
  const { d, miss, wide, early } = await diary();
  const h = await d.call('hindsight', {});
  assert.deepEqual(h.entries, [], 'no yes/no question here');
  assert.deepEqual(h.choice_entries.map((e: { id: string }) => e.id), [miss]);
  const m = h.choice_entries[0];
  assert.deepEqual(
    [m.verdict, m.top_option, m.top_p, m.outcome_option, m.outcome_p, m.final_probs],
    ['miss', 0, 0.85, 1, 0.12, [0.85, 0.12, 0.03]],
  );
  assert.deepEqual(m.options, ['Brackenfold <Systems>', 'Orrin & Co', 'Neither']);
  assert.deepEqual([m.option_base_rates, m.base_rate_note], [[0.45, 0.35, 0.2], '20 awards']);
  assert.deepEqual(
    m.forecasts.map((f: { note: string; counted: boolean; probs: number[] }) => [f.note, f.counted, f.probs]),
    [
      ['technical front-runner', true, [0.55, 0.3, 0.15]],
      ['panel chair says "safe pair of hands"', true, [0.85, 0.12, 0.03]],
    ],
  );
  assert.deepEqual(m.resolution, { at: RESOLVED, note: 'option 1 came true' });
  // The same misses as score --json's choice member (INTERFACES.md), at its threshold.
  const { report } = await d.call('score', {});
  if (report.choice) assert.deepEqual(report.choice.confident_misses.map((c: { id: string }) => c.id), [miss]);

  // Surprises, largest first: 29 against 12–21 is 8 weeks above (8/9 of the width); 25 Feb
  // against 1–20 March is 4 days before (4/19). Derived by hand from SCORING.md "Surprise".
  assert.deepEqual(h.numeric_surprises.map((s: { id: string }) => s.id), [wide, early]);
  const [w, e] = h.numeric_surprises;
  assert.deepEqual([w.value, w.low, w.high, w.level, w.side, w.distance, w.size, w.unit], [29, 12, 21, 0.8, 'above', 8, 8 / 9, 'weeks']);
  assert.deepEqual(w.final_quantiles, [12, 15, 21]);
  assert.deepEqual(w.forecasts.map((f: { note: string }) => f.note), ['vendor says twelve', 'narrowed']);
  assert.deepEqual([e.value_kind, e.value, e.low, e.high, e.side, e.distance, e.size], ['date', '2026-02-25', '2026-03-01', '2026-03-20', 'below', 4, 4 / 19]);
  assert.deepEqual(e.forecasts[0].quantiles, ['2026-03-01', '2026-03-10', '2026-03-20']);
});

test('the threshold and include_hits apply to choice calls; tag and date filters to every list', async () => {
  const { d, miss, milder, hit, wide, early } = await diary();
  const at70 = await d.call('hindsight', { threshold: 0.7, include_hits: true });
  assert.deepEqual(
    at70.choice_entries.map((e: { id: string; verdict: string }) => [e.id, e.verdict]),
    [
      [miss, 'miss'],
      [milder, 'miss'],
      [hit, 'hit'],
    ],
  );
  const tagged = await d.call('hindsight', { tag: 'client:b', threshold: 0.7 });
  assert.deepEqual(tagged.choice_entries.map((e: { id: string }) => e.id), [milder]);
  assert.deepEqual(tagged.numeric_surprises.map((s: { id: string }) => s.id), [early]);
  assert.deepEqual((await d.call('hindsight', { tag: 'client:a' })).numeric_surprises.map((s: { id: string }) => s.id), [wide]);
  // Window ends (the resolutions, 20 April) fall outside a range that ends in March.
  const before = await d.call('hindsight', { from: '2026-01-01', to: '2026-03-31' });
  assert.deepEqual([before.choice_entries, before.numeric_surprises], [[], []]);
  assert.equal((await d.call('hindsight', { from: '2026-04-20', to: '2026-04-20' })).numeric_surprises.length, 2);
});

test('choice_limit and numeric_limit list only the first calls of their list; the counts cover the whole selection', async () => {
  const { d, miss, milder, hit, wide, early } = await diary();
  const whole = await d.call('hindsight', { threshold: 0.7, include_hits: true });
  assert.deepEqual([whole.choice_miss_count, whole.choice_hit_count, whole.numeric_surprise_count], [2, 1, 2], 'without limits: every call, counted');
  assert.equal(whole.choice_entries.length, 3);
  const paged = await d.call('hindsight', { threshold: 0.7, include_hits: true, choice_limit: 1, numeric_limit: 1 });
  assert.deepEqual(paged.choice_entries.map((e: { id: string }) => e.id), [miss], 'the first of misses-then-hits');
  assert.deepEqual(paged.numeric_surprises.map((s: { id: string }) => s.id), [wide], 'the largest surprise first');
  assert.deepEqual([paged.choice_miss_count, paged.choice_hit_count, paged.numeric_surprise_count], [2, 1, 2]);
  const more = await d.call('hindsight', { threshold: 0.7, include_hits: true, choice_limit: 3, numeric_limit: 2 });
  assert.deepEqual(more.choice_entries.map((e: { id: string }) => e.id), [miss, milder, hit]);
  assert.deepEqual(more.numeric_surprises.map((s: { id: string }) => s.id), [wide, early]);
  assert.deepEqual(paged.report, whole.report, 'the calibration summary covers the whole selection either way');
  await assert.rejects(d.call('hindsight', { choice_limit: 0 }), /choice_limit: must be a whole number from 1 to 1,000/);
  await assert.rejects(d.call('hindsight', { numeric_limit: 1.5 }), /numeric_limit: must be a whole number from 1 to 1,000/);
});

test('kept choice calls and surprises follow the diary, and each threshold and hits choice is its own answer', async () => {
  const { d, miss, milder, hit, wide, early } = await diary();
  const ids = (list: { id: string }[]) => list.map((e) => e.id);
  assert.deepEqual(ids((await d.call('hindsight', {})).choice_entries), [miss]);
  assert.deepEqual(ids((await d.call('hindsight', { threshold: 0.7, include_hits: true })).choice_entries), [miss, milder, hit]);
  assert.deepEqual(ids((await d.call('hindsight', { threshold: 0.7 })).choice_entries), [miss, milder], 'hits only when asked for');
  assert.deepEqual(ids((await d.call('hindsight', {})).choice_entries), [miss], 'the earlier answer is not leaked into the default one');
  await d.call('deleteQuestion', { id: miss });
  await d.call('deleteQuestion', { id: wide });
  const after = await d.call('hindsight', {});
  assert.deepEqual([ids(after.choice_entries), after.choice_miss_count], [[], 0], 'a deleted question is gone at once');
  assert.deepEqual([ids(after.numeric_surprises), after.numeric_surprise_count], [[early], 1]);
});

test('a revision after the window end is shown but marked as not counted', async () => {
  const { d, wide } = await diary();
  await d.call('addForecast', { question_id: wide, quantiles: [28, 29, 30], note: 'knew by then', at: '2026-05-01T09:00:00.000Z' });
  const [w] = (await d.call('hindsight', {})).numeric_surprises;
  assert.deepEqual(w.final_quantiles, [12, 15, 21], 'the late revision does not count');
  assert.deepEqual(w.forecasts.map((f: { note: string; counted: boolean }) => [f.note, f.counted]), [
    ['vendor says twelve', true],
    ['narrowed', true],
    ['knew by then', false],
  ]);
});

test('the briefing prints the choice misses and the surprises for its tag, user text escaped', async () => {
  const { d } = await diary();
  const { html } = await d.call('briefing', { tag: 'client:a' });
  assert.match(html, /<section id="choice-misses">/);
  assert.match(html, /Top choice “Brackenfold &lt;Systems&gt;” at 85%<\/span>; what came true: <span class="outcome">Orrin &amp; Co<\/span>, given 12%/);
  assert.match(html, /panel chair says &quot;safe pair of hands&quot;/);
  assert.match(html, /<span class="label">Option base rates<\/span>Brackenfold &lt;Systems&gt; 45% · Orrin &amp; Co 35% · Neither 20% — 20 awards/);
  assert.match(html, /<section id="surprises">/);
  assert.match(html, /80% range 12–21 weeks<\/span>; the outcome <span class="outcome">29 weeks<\/span> was 8 weeks above it \(0\.89 × the range&#39;s width\)/);
  assert.doesNotMatch(html, /When will the board sign/, 'client:b is not in this briefing');
  const other = (await d.call('briefing', { tag: 'client:b' })).html;
  assert.match(other, /the outcome <span class="outcome">25 Feb 2026<\/span> was 4 days before it/);
  assert.doesNotMatch(other, /id="choice-misses"/, 'no choice miss at the default threshold for client:b');
  // Open questions of every type, each with its standing number in compact form.
  await d.call('createQuestion', { title: 'Which vendor for fraud scoring?', closes_at: '2026-09-30T16:00:00.000Z', tags: ['client:a'], type: 'choice', options: ['Ferncastle', 'Tarnwell'], first_forecast: { probs: [0.35, 0.65] } });
  await d.call('createQuestion', { title: 'Fee income for the half-year', closes_at: '2026-09-30T16:00:00.000Z', tags: ['client:a'], type: 'numeric', unit: '£k', first_forecast: { quantiles: [1350, 1480, 1600] } });
  const openHtml = (await d.call('briefing', { tag: 'client:a' })).html;
  assert.match(openHtml, /<td>Which vendor for fraud scoring\?<\/td><td>[^<]+<\/td><td class="num">Tarnwell 65%<\/td><td class="num">—<\/td>/);
  assert.match(openHtml, /<td>Fee income for the half-year<\/td><td>[^<]+<\/td><td class="num">P10–P90 1,350–1,600 £k<\/td>/);
  // A briefing of yes/no questions only has neither section.
  const none = (await d.call('briefing', { tag: 'nothing-here' })).html;
  assert.doesNotMatch(none, /id="choice-misses"|id="surprises"/);
});
