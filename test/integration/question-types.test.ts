/**
 * Multiple-choice and numeric questions through the service, on real diary files: what
 * is stored comes back bit for bit, every rule of the contract refuses a bad request
 * with a message naming the field and writes nothing, the type is fixed, the time checks
 * hold for every type, and resolutions, corrections, deletion and undo keep every value.
 * Rules: INTERFACES.md "Question types", SCORING.md "Multiple-choice questions" and
 * "Numeric questions"; tolerances from shared/choice-vector.ts and shared/quantile-levels.ts.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError } from '../../shared/contract';
import type { ChoiceQuestion, NumericQuestion } from '../../shared/domain';
import { openTestDiary, type TestDiary } from '../support/temp-diary';

const NOW = Date.parse('2026-06-01T12:00:00Z');
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

/** The neighbouring doubles of `x` (one unit in the last place up or down). */
function nextUp(x: number): number {
  const f = new Float64Array([x]);
  const b = new BigInt64Array(f.buffer);
  b[0] = x >= 0 ? b[0]! + 1n : b[0]! - 1n;
  return f[0]!;
}
function nextDown(x: number): number {
  return -nextUp(-x);
}

/** The refusal a call ends in (fails the test when it succeeds). */
async function refusal(promise: Promise<unknown>): Promise<ApiError> {
  try {
    await promise;
  } catch (err) {
    assert.ok(err instanceof ApiError, `an ApiError, got ${String(err)}`);
    return err;
  }
  assert.fail('the request was accepted');
}

/** Every row of every data table, with each value's SQLite type: "nothing written" means this is unchanged. */
function dump(d: TestDiary): string {
  const db = d.service.store.read;
  const tables = (db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' ESCAPE '\\' ORDER BY name").all() as { name: string }[]).map(
    (r) => r.name,
  );
  const out: Record<string, unknown[]> = {};
  for (const table of tables) {
    const columns = (db.prepare('SELECT name FROM pragma_table_info(?)').all(table) as { name: string }[]).map((c) => `"${c.name}"`);
    out[table] = db.prepare(`SELECT ${columns.flatMap((c) => [c, `typeof(${c})`]).join(', ')} FROM "${table}" ORDER BY ${columns.join(', ')}`).raw().all();
  }
  return JSON.stringify(out);
}

async function choiceQuestion(d: TestDiary, over: Record<string, unknown> = {}): Promise<ChoiceQuestion> {
  return d.call('createQuestion', {
    type: 'choice',
    title: 'Which supplier will the client pick?',
    options: ['Kestrowe', 'Ambledene', 'Neither'],
    option_base_rates: [0.45, 0.35, 0.2],
    opened_at: iso(NOW - 30 * DAY),
    closes_at: iso(NOW + 30 * DAY),
    first_forecast: { probs: [0.5, 0.3, 0.2], note: 'first look', at: iso(NOW - 29 * DAY) },
    ...over,
  });
}

async function numericQuestion(d: TestDiary, over: Record<string, unknown> = {}): Promise<NumericQuestion> {
  return d.call('createQuestion', {
    type: 'numeric',
    title: 'Weeks from kickoff to go-live',
    unit: 'weeks',
    opened_at: iso(NOW - 30 * DAY),
    closes_at: iso(NOW + 30 * DAY),
    first_forecast: { quantiles: [9, 13, 20], at: iso(NOW - 29 * DAY) },
    ...over,
  });
}

test('choice and numeric questions come back exactly as given, with their defaults', async () => {
  const d = openTestDiary();
  const c = await choiceQuestion(d, { ordered: true, first_forecast: { probs: [0.1, 0.2, 0.7], at: iso(NOW - 29 * DAY) } });
  assert.equal(c.type, 'choice');
  assert.deepEqual(c.options, ['Kestrowe', 'Ambledene', 'Neither']);
  assert.equal(c.ordered, true);
  assert.deepEqual(c.option_base_rates, [0.45, 0.35, 0.2]);
  // 0.1 + 0.2 + 0.7 is 0.9999999999999999 in doubles: accepted, and stored as typed, never renormalised.
  assert.deepEqual(c.forecasts.map((f) => f.probs), [[0.1, 0.2, 0.7]]);
  assert.equal('p' in c.forecasts[0]!, false);

  const n = await numericQuestion(d);
  assert.equal(n.type, 'numeric');
  assert.deepEqual([n.unit, n.value_kind, n.levels], ['weeks', 'number', [0.1, 0.5, 0.9]]);
  const awkward = [0.1 + 0.2, 1 / 3, 2 ** 53 + 2];
  await d.call('addForecast', { question_id: n.id, quantiles: awkward, at: iso(NOW - DAY) });
  const back: NumericQuestion = await d.call('getQuestion', { id: n.id });
  assert.deepEqual(back.forecasts.map((f) => f.quantiles), [[9, 13, 20], awkward]);

  const date = await numericQuestion(d, {
    title: 'When will the board sign?',
    unit: '',
    value_kind: 'date',
    levels: [0.05, 0.25, 0.5, 0.75, 0.95],
    first_forecast: { quantiles: ['2026-07-01', '2026-07-10', '2026-07-20', '2026-08-01', '2026-09-30'], at: iso(NOW - 29 * DAY) },
  });
  assert.deepEqual(date.forecasts[0]!.quantiles, ['2026-07-01', '2026-07-10', '2026-07-20', '2026-08-01', '2026-09-30']);
  // Stored as days since 1970-01-01 (SCORING.md "Numeric questions"): 2026-07-01 is day 20635.
  const stored = d.service.store.read.prepare('SELECT value FROM forecast_values v JOIN forecasts f ON f.id = v.forecast_id WHERE f.question_id = ? ORDER BY position').pluck().all(date.id);
  assert.deepEqual(stored, [20635, 20644, 20654, 20666, 20726]);

  const list = await d.call('listQuestions', {});
  const byId = new Map<string, Record<string, unknown>>(list.questions.map((q: Record<string, unknown>) => [q.id as string, q]));
  assert.deepEqual(byId.get(c.id), { ...byId.get(c.id), type: 'choice', options: c.options, last_probs: [0.1, 0.2, 0.7], last_p: null, levels: null });
  assert.deepEqual(byId.get(n.id), { ...byId.get(n.id), type: 'numeric', unit: 'weeks', value_kind: 'number', levels: [0.1, 0.5, 0.9], last_quantiles: awkward, forecast_count: 2 });
  assert.deepEqual((byId.get(date.id) as { last_quantiles: unknown }).last_quantiles, date.forecasts[0]!.quantiles);
  // Open questions have nothing resolved to show.
  assert.equal(byId.get(c.id)!.resolved_option, null);
  assert.equal(byId.get(n.id)!.resolved_value, null);
  // Resolved, the list says to what: the option's index, the value (a date as its text).
  await d.call('resolveQuestion', { id: c.id, outcome: 'option', option: 2, at: iso(NOW - 60_000) });
  await d.call('resolveQuestion', { id: n.id, outcome: 'value', value: 16.5, at: iso(NOW - 60_000) });
  await d.call('resolveQuestion', { id: date.id, outcome: 'value', value: '2026-07-24', at: iso(NOW - 60_000) });
  const resolved = new Map<string, Record<string, unknown>>((await d.call('listQuestions', {})).questions.map((q: Record<string, unknown>) => [q.id as string, q]));
  assert.deepEqual([resolved.get(c.id)!.resolved_option, resolved.get(c.id)!.resolved_value], [2, null]);
  assert.deepEqual([resolved.get(n.id)!.resolved_option, resolved.get(n.id)!.resolved_value], [null, 16.5]);
  assert.equal(resolved.get(date.id)!.resolved_value, '2026-07-24');
  for (const id of [c.id, n.id, date.id]) await d.call('reopenQuestion', { id });
  // Search finds a choice question by one of its options too.
  const found = await d.call('listQuestions', { text: 'ambleDENE' });
  assert.deepEqual(found.questions.map((q: { id: string }) => q.id), [c.id]);
});

test('listing the diary does not change how a question is read afterwards (levels and options stay)', async () => {
  // A list reads options, levels and last values as arrays; reading one question by id
  // afterwards must still see every level and option (a shared statement once leaked its
  // row shape from the list to the page and numeric questions came back with no levels).
  const d = openTestDiary();
  await choiceQuestion(d);
  await d.call('listQuestions', {});
  const n = await numericQuestion(d);
  await d.call('listQuestions', {});
  const back: NumericQuestion = await d.call('getQuestion', { id: n.id });
  assert.deepEqual(back.levels, [0.1, 0.5, 0.9]);
  const c = await choiceQuestion(d, { title: 'Which one, again?' });
  await d.call('listQuestions', {});
  const cb: ChoiceQuestion = await d.call('getQuestion', { id: c.id });
  assert.deepEqual(cb.options, ['Kestrowe', 'Ambledene', 'Neither']);
  assert.deepEqual(cb.option_base_rates, [0.45, 0.35, 0.2]);
});

test('a choice vector must sum to 100 % within 1e-6: the one-ulp neighbours of both edges', async () => {
  const d = openTestDiary();
  const q = await choiceQuestion(d, { options: ['A', 'B'], option_base_rates: null, first_forecast: undefined });
  // The largest sum above 1 still within 1e-6, and the smallest below; their neighbours one ulp outside.
  let high = 1 + 1e-6;
  while (Math.abs(nextUp(high) - 1) <= 1e-6) high = nextUp(high);
  while (Math.abs(high - 1) > 1e-6) high = nextDown(high);
  let low = 1 - 1e-6;
  while (Math.abs(nextDown(low) - 1) <= 1e-6) low = nextDown(low);
  while (Math.abs(low - 1) > 1e-6) low = nextUp(low);
  // [1, s − 1] and [0.5, s − 0.5] add up to exactly s (each difference is exact).
  const accepted = [
    [1, high - 1],
    [0.5, low - 0.5],
  ];
  const refused = [
    [1, nextUp(high) - 1],
    [0.5, nextDown(low) - 0.5],
  ];
  for (const probs of accepted) {
    assert.equal(probs[0]! + probs[1]!, probs === accepted[0] ? high : low);
    await d.call('addForecast', { question_id: q.id, probs, at: iso(NOW - DAY) });
  }
  const before = dump(d);
  for (const probs of refused) {
    const err = await refusal(d.call('addForecast', { question_id: q.id, probs, at: iso(NOW - DAY) }));
    assert.equal(err.code, 'invalid');
    assert.match(err.fields[0]!, /^probs: must sum to 100 %, they sum to (100\.0001 % \(0\.0001 % over\)|99\.9999 % \(0\.0001 % short\))$/);
  }
  assert.equal(dump(d), before, 'nothing written');
  const err = await refusal(d.call('addForecast', { question_id: q.id, probs: [0.6, 0.3], at: iso(NOW - DAY) }));
  assert.deepEqual(err.fields, ['probs: must sum to 100 %, they sum to 90 % (10 % short)']);
  // Just outside the tolerance the sum is never rounded to a figure that reads as accepted,
  // and the message says how far off it is, so the user knows what to change.
  const near = async (probs: number[]) => (await refusal(d.call('addForecast', { question_id: q.id, probs, at: iso(NOW - DAY) }))).fields;
  assert.deepEqual(await near([0.4999989, 0.5]), ['probs: must sum to 100 %, they sum to 99.99989 % (0.00011 % short)']);
  assert.deepEqual(await near([0.5000011, 0.5]), ['probs: must sum to 100 %, they sum to 100.00011 % (0.00011 % over)']);
  assert.deepEqual(await near([0.333333, 0.333333]), ['probs: must sum to 100 %, they sum to 66.6666 % (33.3334 % short)']);
  assert.equal(dump(d), before, 'nothing written');
  const stored: ChoiceQuestion = await d.call('getQuestion', { id: q.id });
  assert.deepEqual(stored.forecasts.map((f) => f.probs), accepted);
});

test('quantiles must not decrease: equal neighbours pass, one ulp lower is refused', async () => {
  const d = openTestDiary();
  const q = await numericQuestion(d, { first_forecast: undefined });
  for (const middle of [13, nextUp(13)]) await d.call('addForecast', { question_id: q.id, quantiles: [13, middle, 20], at: iso(NOW - DAY) });
  const before = dump(d);
  const err = await refusal(d.call('addForecast', { question_id: q.id, quantiles: [13, nextDown(13), 20], at: iso(NOW - DAY) }));
  assert.equal(err.fields.length, 1);
  assert.match(err.fields[0]!, /^quantiles: must not decrease from one level to the next: entry 1 \(12\.999999999999998\) is below entry 0 \(13\)$/);
  const dates = await numericQuestion(d, { value_kind: 'date', first_forecast: undefined });
  const late = await refusal(d.call('addForecast', { question_id: dates.id, quantiles: ['2026-07-02', '2026-07-01', '2026-08-01'], at: iso(NOW - DAY) }));
  assert.deepEqual(late.fields, ['quantiles: must not decrease from one level to the next: entry 1 (2026-07-01) is below entry 0 (2026-07-02)']);
  const count = d.service.store.read.prepare('SELECT count(*) FROM forecasts').pluck().get();
  assert.equal(count, 2);
  assert.notEqual(dump(d), before); // the date question was added
});

test('a field of another type, a wrong count or a wrong kind is refused naming the field, and nothing is written', async () => {
  const d = openTestDiary();
  const yesNo = await d.call('createQuestion', { title: 'Yes or no?', closes_at: iso(NOW + DAY), first_forecast: { p: 0.4 } });
  const c = await choiceQuestion(d);
  const n = await numericQuestion(d);
  const dates = await numericQuestion(d, { value_kind: 'date', first_forecast: undefined });
  const before = dump(d);
  const cases: [string, () => Promise<unknown>, string][] = [
    ['p on a choice revision', () => d.call('addForecast', { question_id: c.id, p: 0.5 }), 'p: does not apply: a choice question takes probs, one probability per option'],
    ['probs on a yes/no revision', () => d.call('addForecast', { question_id: yesNo.id, probs: [0.5, 0.5] }), 'probs: does not apply: a yes/no question takes a probability p between 0 and 1'],
    ['nothing on a numeric revision', () => d.call('addForecast', { question_id: n.id, note: 'forgot' }), 'quantiles: is required: a numeric question takes quantiles, one value per level'],
    ['lenses on a choice revision', () => d.call('addForecast', { question_id: c.id, probs: [0.2, 0.3, 0.5], lenses: [{ name: 'outside', p: 0.3 }] }), 'lenses: apply to yes/no questions only; this is a choice question'],
    ['two probabilities for three options', () => d.call('addForecast', { question_id: c.id, probs: [0.5, 0.5] }), 'probs: must give one probability per option (3), not 2'],
    ['two quantiles for three levels', () => d.call('addReference', { question_id: n.id, quantiles: [1, 2], source: 'client' }), 'quantiles: must give one value per level (3), not 2'],
    ['a date for a number question', () => d.call('addForecast', { question_id: n.id, quantiles: ['2026-01-01', '2026-01-02', '2026-01-03'] }), 'quantiles[0]: must be a number (this question\'s values are numbers), not the text "2026-01-01"'],
    ['a number for a date question', () => d.call('addForecast', { question_id: dates.id, quantiles: [1, 2, 3] }), 'quantiles[0]: must be a date YYYY-MM-DD (this question\'s values are dates), not 1'],
    ['base_rate on a choice question', () => choiceQuestion(d, { base_rate: 0.3 }), 'base_rate: applies to yes/no questions only; this is a choice question'],
    ['options on a numeric question', () => numericQuestion(d, { options: ['a', 'b'] }), 'options: applies to choice questions only; this is a numeric question'],
    ['levels not symmetric', () => numericQuestion(d, { levels: [0.1, 0.5], first_forecast: undefined }), 'levels: must be symmetric around 0.5: 0.1 needs 0.9'],
    ['the same option twice', () => choiceQuestion(d, { options: ['A', 'B', 'A'], option_base_rates: null, first_forecast: undefined }), 'options[2]: repeats option 0 ("A"); each option must be different'],
    ['an option that looks like another', () => choiceQuestion(d, { options: ['Café', 'B', 'Cafe\u0301'], option_base_rates: null, first_forecast: undefined }), 'options[2]: repeats option 0 ("Café") (they differ only in characters that do not show, or in how an accent is written); each option must be different'],
    ['an option with a zero-width space more', () => choiceQuestion(d, { options: ['Kestrowe', 'Kestrowe\u200b'], option_base_rates: null, first_forecast: undefined }), 'options[1]: repeats option 0 ("Kestrowe") (they differ only in characters that do not show, or in how an accent is written); each option must be different'],
    ['one option', () => choiceQuestion(d, { options: ['A'], option_base_rates: null, first_forecast: undefined }), 'options: must list at least 2 options'],
    ['base rates that do not sum', () => choiceQuestion(d, { option_base_rates: [0.5, 0.5, 0.5] }), 'option_base_rates: must sum to 100 %, they sum to 150 % (50 % over)'],
    ['a choice question without options', () => d.call('createQuestion', { type: 'choice', title: 'Which?', closes_at: iso(NOW + DAY) }), 'options: are required for a choice question: 2 to 12 labels'],
    ['first forecast of another type', () => choiceQuestion(d, { first_forecast: { p: 0.5 } }), 'first_forecast.p: does not apply: a choice question takes probs, one probability per option'],
  ];
  for (const [what, call, field] of cases) {
    const err = await refusal(call());
    assert.equal(err.code, 'invalid', what);
    assert.ok(err.fields.includes(field), `${what}: ${err.fields.join(' | ')}`);
    assert.match(err.message, /Nothing was changed\.$/, what);
  }
  assert.equal(dump(d), before, 'nothing written');
});

test('the type, the levels, the value kind and the number of options are fixed; options may be relabelled', async () => {
  const d = openTestDiary();
  const c = await choiceQuestion(d);
  const n = await numericQuestion(d);
  const before = dump(d);
  const cases: [() => Promise<unknown>, string][] = [
    [() => d.call('updateQuestion', { id: c.id, changes: { type: 'binary' } }), 'changes.type: is fixed when the question is created (this is a choice question); to ask it another way, add a new question'],
    [() => d.call('updateQuestion', { id: n.id, changes: { levels: [0.25, 0.5, 0.75] } }), 'changes.levels: are fixed when the question is created (0.1, 0.5, 0.9): every revision gives one value per level'],
    [() => d.call('updateQuestion', { id: n.id, changes: { value_kind: 'date' } }), 'changes.value_kind: is fixed (number) when the question is created (this is a numeric question); to ask it another way, add a new question'],
    [() => d.call('updateQuestion', { id: c.id, changes: { options: ['A', 'B'] } }), "changes.options: must keep the question's 3 options (they may be relabelled): every revision gives one probability per option"],
    [() => d.call('updateQuestion', { id: c.id, changes: { unit: 'weeks' } }), 'changes.unit: applies to numeric questions only; this is a choice question'],
    [() => d.call('updateQuestion', { id: n.id, changes: { costs: { false_alarm: 1, miss: 2 } } }), 'changes.costs: applies to yes/no questions only; this is a numeric question'],
  ];
  for (const [call, field] of cases) {
    const err = await refusal(call());
    assert.ok(err.fields.includes(field), err.fields.join(' | '));
  }
  assert.equal(dump(d), before);
  // Giving the fixed fields unchanged is fine (a form sends every field).
  const relabelled: ChoiceQuestion = await d.call('updateQuestion', {
    id: c.id,
    changes: { type: 'choice', options: ['Kestrowe Ltd', 'Ambledene', 'Neither'], ordered: true, option_base_rates: null },
  });
  assert.deepEqual([relabelled.options, relabelled.ordered, relabelled.option_base_rates], [['Kestrowe Ltd', 'Ambledene', 'Neither'], true, null]);
  assert.deepEqual(relabelled.forecasts[0]!.probs, [0.5, 0.3, 0.2]);
  const renamed: NumericQuestion = await d.call('updateQuestion', { id: n.id, changes: { unit: 'working weeks', levels: [0.1, 0.5, 0.9], value_kind: 'number' } });
  assert.equal(renamed.unit, 'working weeks');
  // Below the service, the store refuses a change of type too (migration 5's trigger).
  assert.throws(() => d.service.store.write.prepare("UPDATE questions SET type = 'binary', ordered = NULL WHERE id = ?").run(c.id), /type is fixed/);
});

test('resolving, correcting, reopening and undo keep the option and the value', async () => {
  const d = openTestDiary();
  const c = await choiceQuestion(d);
  const dates = await numericQuestion(d, { value_kind: 'date', first_forecast: { quantiles: ['2026-07-01', '2026-07-20', '2026-09-30'], at: iso(NOW - 29 * DAY) } });
  const wrong: [() => Promise<unknown>, string][] = [
    [() => d.call('resolveQuestion', { id: c.id, outcome: 'yes' }), 'outcome: must be option or void for a choice question (got yes)'],
    [() => d.call('resolveQuestion', { id: c.id, outcome: 'option', option: 3 }), 'option: must be the 0-based index of an option, 0 to 2 (got 3)'],
    [() => d.call('resolveQuestion', { id: c.id, outcome: 'option' }), 'option: is required with outcome option: the 0-based index of the option that came true'],
    [() => d.call('resolveQuestion', { id: c.id, outcome: 'void', option: 1 }), 'option: goes only with outcome option'],
    [() => d.call('resolveQuestion', { id: dates.id, outcome: 'value', value: 16.5 }), "value: must be a date YYYY-MM-DD (this question's values are dates), not 16.5"],
    [() => d.call('resolveQuestion', { id: dates.id, outcome: 'value', value: '2026-02-30' }), 'value: must be a real calendar date YYYY-MM-DD (got "2026-02-30")'],
    [() => d.call('resolveQuestion', { id: c.id, outcome: 'option', option: 1, at: iso(NOW + DAY) }), 'at: must not be in the future'],
  ];
  const before = dump(d);
  for (const [call, field] of wrong) {
    const err = await refusal(call());
    assert.ok(err.fields.some((f) => f.startsWith(field)), err.fields.join(' | '));
  }
  assert.equal(dump(d), before);

  const resolved: ChoiceQuestion = await d.call('resolveQuestion', { id: c.id, outcome: 'option', option: 1, at: iso(NOW - DAY), note: 'signed with Ambledene' });
  assert.deepEqual(resolved.resolution, { outcome: 'option', option: 1, at: iso(NOW - DAY), note: 'signed with Ambledene' });
  const beforeCorrection = dump(d);
  const corrected = await d.call('resolveQuestion', { id: c.id, outcome: 'option', option: 2, at: iso(NOW - DAY), correction_note: 'the deal fell through' });
  assert.deepEqual(corrected.resolution_history.map((h: { outcome: string; option: number; change: string }) => [h.outcome, h.option, h.change]), [['option', 1, 'corrected']]);
  await d.call('undo', { token: corrected.undo });
  assert.equal(dump(d), beforeCorrection, 'undo puts back every row');

  const value = await d.call('resolveQuestion', { id: dates.id, outcome: 'value', value: '2026-08-14', at: iso(NOW - DAY) });
  assert.deepEqual(value.resolution, { outcome: 'value', value: '2026-08-14', at: iso(NOW - DAY), note: '' });
  const reopened = await d.call('reopenQuestion', { id: dates.id, note: 'not signed after all' });
  assert.deepEqual(reopened.resolution_history.map((h: { value: string; change: string }) => [h.value, h.change]), [['2026-08-14', 'reopened']]);
  assert.equal(reopened.resolution, null);
});

test('time checks hold for every type: revisions before the opening or in the future, resolutions in the future', async () => {
  const d = openTestDiary();
  const c = await choiceQuestion(d, { first_forecast: undefined });
  const n = await numericQuestion(d, { first_forecast: undefined });
  const values: [string, { probs?: number[]; quantiles?: number[] }][] = [
    [c.id, { probs: [0.2, 0.3, 0.5] }],
    [n.id, { quantiles: [1, 2, 3] }],
  ];
  for (const [id, value] of values) {
    const early = await refusal(d.call('addForecast', { question_id: id, ...value, at: iso(NOW - 31 * DAY) }));
    assert.match(early.fields[0]!, /^at: must not be before the question opened/);
    const future = await refusal(d.call('addForecast', { question_id: id, ...value, at: iso(NOW + DAY) }));
    assert.match(future.fields[0]!, /^at: must not be in the future/);
    const reference = await refusal(d.call('addReference', { question_id: id, ...value, source: 'client', at: iso(NOW + DAY) }));
    assert.match(reference.fields[0]!, /^at: must not be in the future/);
  }
  const resolution = await refusal(d.call('resolveQuestion', { id: n.id, outcome: 'value', value: 12, at: iso(NOW + DAY) }));
  assert.match(resolution.fields[0]!, /^at: must not be in the future/);
  // A question about the state at its close, answered before the close, asks first (every type).
  const state = await numericQuestion(d, { kind: 'state_at_deadline', first_forecast: undefined });
  const confirm = await refusal(d.call('resolveQuestion', { id: state.id, outcome: 'value', value: 12, at: iso(NOW - DAY) }));
  assert.equal(confirm.code, 'confirm');
  assert.match(confirm.message, /a value given before the close is unusual/);
  const done = await d.call('resolveQuestion', { id: state.id, outcome: 'value', value: 12, at: iso(NOW - DAY), confirm: true });
  assert.equal(done.resolution.value, 12);
});

test('editing a revision and a reference, deleting a question, and undoing each, for choice and numeric questions', async () => {
  const d = openTestDiary();
  const c = await choiceQuestion(d);
  const n = await numericQuestion(d);
  const start = dump(d);
  const withRef = await d.call('addReference', { question_id: c.id, probs: [0.6, 0.3, 0.1], source: 'client', at: iso(NOW - 40 * DAY) });
  assert.deepEqual(withRef.references.map((r: { probs: number[] }) => r.probs), [[0.6, 0.3, 0.1]]);
  const edited: ChoiceQuestion & { undo: string } = await d.call('updateForecast', { id: c.forecasts[0]!.id, probs: [0.25, 0.25, 0.5], note: 'rethought' });
  assert.deepEqual([edited.forecasts[0]!.probs, edited.forecasts[0]!.note], [[0.25, 0.25, 0.5], 'rethought']);
  const noteOnly: NumericQuestion & { undo: string } = await d.call('updateForecast', { id: n.forecasts[0]!.id, note: 'same range' });
  assert.deepEqual(noteOnly.forecasts[0]!.quantiles, [9, 13, 20], 'a value left out stays');
  const deleted = await d.call('deleteQuestion', { id: n.id });
  await d.call('undo', { token: deleted.undo });
  const deletedChoice = await d.call('deleteQuestion', { id: c.id });
  assert.equal(d.service.store.read.prepare('SELECT count(*) FROM question_options').pluck().get(), 0, 'the options go with the question');
  await d.call('undo', { token: deletedChoice.undo });
  await d.call('undo', { token: noteOnly.undo });
  await d.call('undo', { token: edited.undo });
  await d.call('undo', { token: withRef.undo });
  assert.equal(dump(d), start, 'every row back, values included');
});
