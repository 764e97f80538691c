/**
 * The example diary (`forelog demo`, main/service/demo-types.ts) through the service, as
 * a first-time user meets it: every Scorecard section of the choice and numeric types has
 * data and every figure is computable, and Hindsight lists the choice miss and the wide
 * miss of a range (issue 9, "Example diary").
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { openTestDiary } from '../support/temp-diary';

test('the example diary fills the choice and numeric sections of the Scorecard', async () => {
  const d = openTestDiary({ timeZone: 'Europe/London' });
  await d.call('loadDemo', {});
  const { report, choice_detail, numeric_detail } = await d.call('score', {});

  const c = report.choice;
  assert.ok(c.scored >= 3 && c.open >= 1, `choice: ${c.scored} scored, ${c.open} open`);
  for (const figure of [c.brier, c.log_score, c.rps, c.skill.vs_uniform, c.skill.vs_base_rate, c.skill.vs_first, c.top_choice.mean_confidence, c.top_choice.hit_rate]) {
    assert.ok(typeof figure === 'number' && Number.isFinite(figure), JSON.stringify(c));
  }
  assert.ok(c.rps_n >= 1 && c.bins.length >= 3);
  assert.deepEqual(c.confident_misses.map((m: { id: string }) => m.id), ['demo-wendlebrook-data-platform']);
  assert.equal(choice_detail.per_question.length, c.scored);

  const n = report.numeric;
  assert.ok(n.scored >= 4 && n.open >= 1, `numeric: ${n.scored} scored, ${n.open} open`);
  assert.ok(n.coverage.some((r: { level: number; n: number }) => r.level === 0.8 && r.n >= 3), JSON.stringify(n.coverage));
  assert.ok(n.quantile_calibration.length >= 5 && n.landed.length >= 2);
  assert.ok(typeof n.relative_wis_vs_first === 'number' && Number.isFinite(n.relative_wis_vs_first));
  for (const q of n.questions) assert.ok(Number.isFinite(q.wis), `${q.id}: WIS ${q.wis}`);
  assert.equal(n.surprises[0].id, 'demo-norrowby-routing-weeks', 'the wide miss of a range comes first');
  assert.ok(numeric_detail.per_question.some((q: { value_kind: string }) => q.value_kind === 'date'), 'a date-valued question is scored');

  const h = await d.call('hindsight', {});
  assert.deepEqual(h.choice_entries.map((e: { id: string }) => e.id), ['demo-wendlebrook-data-platform']);
  const wide = h.numeric_surprises[0];
  // 29 weeks against a final 80 % range of 12–21 weeks (main/service/demo-types.ts).
  assert.deepEqual([wide.id, wide.value, wide.low, wide.high, wide.distance, wide.unit], ['demo-norrowby-routing-weeks', 29, 12, 21, 8, 'weeks']);
  assert.ok(wide.forecasts.every((f: { note: string }) => f.note.length > 0), 'the notes of the time come with it');
});

test('the example diary is removed in one step, the user’s own questions kept, and every removed question comes back with undo', async () => {
  const d = openTestDiary({ timeZone: 'Europe/London' });
  const { added } = await d.call('loadDemo', {});
  // A newcomer tries the example out, then writes a call of their own.
  await d.call('addForecast', { question_id: 'demo-norrowby-phase2-sow', p: 0.55, note: 'trying the revise form' });
  const own = await d.call('createQuestion', { title: 'Quellmoor signs phase 2', closes_at: '2031-03-31T16:00:00Z', first_forecast: { p: 0.6 } });
  const first = await d.call('diaryInfo', {});
  assert.equal(first.question_count, added + 1);
  assert.equal(first.example_questions, added);
  const before = d.service.diary.exportText('json').text;

  const { removed, undo } = await d.call('removeDemo', {});
  assert.equal(removed, added);
  assert.equal(undo.length, added);
  const info = await d.call('diaryInfo', {});
  assert.equal(info.question_count, 1);
  assert.equal(info.example_questions, 0);
  assert.deepEqual((await d.call('listQuestions', {})).questions.map((q: { id: string }) => q.id), [own.id]);
  // Nothing left to remove: an answer, not a refusal.
  assert.deepEqual(await d.call('removeDemo', {}), { removed: 0, undo: [] });

  // Undone newest first, the diary is exactly as it was.
  for (const token of [...undo].reverse()) await d.call('undo', { token });
  assert.equal(d.service.diary.exportText('json').text, before);
  assert.equal((await d.call('diaryInfo', {})).example_questions, added);
});
