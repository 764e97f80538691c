/**
 * The scoring engine's input as read from a real diary file: every probability comes back
 * bit for bit as it was stored, the revisions belong to the right questions in the order
 * the counting rules need, and the input behaves like a plain list wherever the service
 * copies or replaces it.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { callOrThrow } from '../../main/service/dispatch';
import { openDiary } from '../../main/service/index';
import type { OperationName } from '../../shared/contract';
import { loadScoringInput, loadScoringQuestions, startStepwiseRead, type ScoringInput } from '../../main/service/scoring-source';
import { buildMixedDiaryFile } from '../bench/make-diary';
import { randomDiaryFile } from '../support/random-diary';
import { computeScoreReport, computeScorecardDetail, type ScoringQuestion } from '../../shared/scoring';
import { openTestDiary } from '../support/temp-diary';

/** The neighbouring double towards +∞ (`up`) or −∞. */
function nextDouble(x: number, up: boolean): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  if (x === 0) return up ? Number.MIN_VALUE : -Number.MIN_VALUE;
  view.setBigUint64(0, (x > 0) === up ? bits + 1n : bits - 1n);
  return view.getFloat64(0);
}

function bits(x: number): bigint {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  return view.getBigUint64(0);
}

const AWKWARD: [string, number][] = [
  ['one ulp above 0.8', nextDouble(0.8, true)],
  ['one ulp below 0.8', nextDouble(0.8, false)],
  ['0.8 itself', 0.8],
  ['0.1 + 0.2', 0.1 + 0.2],
  ['the smallest subnormal, 5e-324', 5e-324],
  ['1 - 2^-53, the largest double below 1', 1 - 2 ** -53],
  ['one ulp above 0.1', nextDouble(0.1, true)],
  ['the smallest normal double, 2^-1022', 2 ** -1022],
  ['0', 0],
  ['1', 1],
];

const base = { rule: 'Yes if it happens.', closes_at: '2026-03-31T17:00:00Z', opened_at: '2026-01-05T09:00:00Z' };

test('awkward probabilities read back bit-identical through the scoring input', async () => {
  const d = openTestDiary({ now: '2026-02-01T12:00:00Z' });
  const ids = new Map<string, number>();
  for (const [name, p] of AWKWARD) {
    const q = await d.call('createQuestion', { ...base, title: `Holds ${name}`, first_forecast: { p, at: '2026-01-10T09:00:00Z' } });
    await d.call('addReference', { question_id: q.id, p, source: 'sector survey', at: '2026-01-11T09:00:00Z' });
    ids.set(q.id, p);
  }
  const input = loadScoringQuestions(d.service.store.read);
  assert.equal(input.length, AWKWARD.length);
  for (const q of input) {
    const stored = ids.get(q.id)!;
    assert.equal(bits(q.forecasts[0]!.p), bits(stored), `${q.title}: read ${q.forecasts[0]!.p}, stored ${stored}`);
    assert.equal(bits(q.references[0]!.p), bits(stored), `${q.title}: the reference`);
  }
  for (const q of input) {
    const stored = ids.get(q.id)!;
    const cols = q.forecast_columns!;
    assert.equal(cols.end - cols.start, 1, q.title);
    assert.equal(bits(cols.p[cols.start]!), bits(stored), `${q.title}: the column`);
  }
});

test('the final forecast the engine scores is the stored double, one ulp from 0.8 included', async () => {
  const d = openTestDiary({ now: '2026-04-10T12:00:00Z' });
  const above = nextDouble(0.8, true);
  const below = nextDouble(0.8, false);
  for (const [title, p, outcome] of [['Above', above, 'yes'], ['Below', below, 'no']] as const) {
    const q = await d.call('createQuestion', { ...base, title, first_forecast: { p: 0.5, at: '2026-01-10T09:00:00Z' } });
    await d.call('addForecast', { question_id: q.id, p, at: '2026-02-10T09:00:00Z' });
    await d.call('resolveQuestion', { id: q.id, outcome, at: '2026-04-01T09:00:00Z' });
  }
  const input = loadScoringQuestions(d.service.store.read);
  const rows = computeScorecardDetail(input, { default_costs: { false_alarm: 1, miss: 1 } }).per_question;
  const byTitle = new Map(rows.map((r) => [r.title, r]));
  assert.equal(bits(byTitle.get('Above')!.p), bits(above));
  assert.equal(bits(byTitle.get('Below')!.p), bits(below));
  const report = computeScoreReport(input, { default_costs: { false_alarm: 1, miss: 1 } });
  assert.equal(report.brier, ((above - 1) ** 2 + below ** 2) / 2);
});

test('revisions reach their own questions; the same time is settled by entry order, not table order', async () => {
  const d = openTestDiary({ now: '2026-04-10T12:00:00Z' });
  // Imported out of time order, with two revisions at one instant: the one written later in
  // the file (entered last) is the final forecast.
  await d.call('importDiary', {
    diary: {
      format: 'forelog-diary',
      version: 1,
      questions: [
        {
          id: 'a',
          title: 'Alpha',
          tags: ['renewals', 'client:wendlebrook', 'delivery'],
          opened_at: '2026-01-01T00:00:00Z',
          closes_at: '2026-03-01T00:00:00Z',
          forecasts: [
            { at: '2026-02-01T00:00:00Z', p: 0.3 },
            { at: '2026-01-05T00:00:00Z', p: 0.9 },
            { at: '2026-02-01T00:00:00Z', p: 0.35 },
            { at: '2026-03-05T00:00:00Z', p: 0.99 },
          ],
          references: [
            { at: '2026-01-20T00:00:00Z', p: 0.6, source: 'panel' },
            { at: '2026-01-10T00:00:00Z', p: 0.4, source: 'panel' },
          ],
          resolution: { outcome: 'no', at: '2026-03-02T00:00:00Z' },
        },
        { id: 'b', title: 'Beta', opened_at: '2026-01-01T00:00:00Z', closes_at: '2026-03-01T00:00:00Z', forecasts: [{ at: '2026-01-02T00:00:00Z', p: 0.2 }] },
        { id: 'c', title: 'Gamma', opened_at: '2026-01-01T00:00:00Z', closes_at: '2026-03-01T00:00:00Z', forecasts: [] },
      ],
    },
  });
  const input = new Map(loadScoringQuestions(d.service.store.read).map((q) => [q.id, q]));
  const a = input.get('a')!;
  const entered = [...a.forecasts].sort((x, y) => x.seq - y.seq);
  assert.deepEqual(
    entered.map((f) => [f.at, f.p]),
    [
      [Date.parse('2026-02-01T00:00:00Z'), 0.3],
      [Date.parse('2026-01-05T00:00:00Z'), 0.9],
      [Date.parse('2026-02-01T00:00:00Z'), 0.35],
      [Date.parse('2026-03-05T00:00:00Z'), 0.99],
    ],
    'every revision of Alpha, with seq following the order it was entered',
  );
  assert.deepEqual(a.tags, ['renewals', 'client:wendlebrook', 'delivery'], 'in the order the question lists them');
  assert.deepEqual(a.references, [{ at: Date.parse('2026-01-10T00:00:00Z'), p: 0.4 }, { at: Date.parse('2026-01-20T00:00:00Z'), p: 0.6 }]);
  assert.deepEqual(a.resolution, { outcome: 'no', at: Date.parse('2026-03-02T00:00:00Z') });
  assert.deepEqual(input.get('b')!.forecasts.map((f) => f.p), [0.2]);
  assert.deepEqual(input.get('c')!.forecasts, []);
  const row = computeScorecardDetail([a], { default_costs: { false_alarm: 1, miss: 1 } }).per_question[0]!;
  assert.equal(row.p, 0.35, 'the final counting forecast: same time as 0.3, entered after it; 0.99 is late');
  assert.equal(row.p1, 0.9);
});

test("choice and numeric revisions reach their own questions in entry order, each one's values in position order and bit for bit", async () => {
  const d = openTestDiary({ now: '2026-04-10T12:00:00Z' });
  const third = 1 / 3;
  const up = nextDouble(0.8, true);
  // Entered out of time order, two at one instant, and the two questions' revisions
  // interleaved in the table (the file lists questions one after the other, so the second
  // question's are written by a second import).
  const choice = (id: string, forecasts: { at: string; probs: number[] }[]) => ({
    id, title: `Choice ${id}`, type: 'choice', options: ['a', 'b', 'c'], opened_at: '2026-01-01T00:00:00Z', closes_at: '2026-03-01T00:00:00Z', forecasts,
  });
  const numeric = (id: string, forecasts: { at: string; quantiles: number[] }[]) => ({
    id, title: `Numeric ${id}`, type: 'numeric', unit: 'weeks', opened_at: '2026-01-01T00:00:00Z', closes_at: '2026-03-01T00:00:00Z', forecasts,
  });
  const c1 = [
    { at: '2026-02-01T00:00:00Z', probs: [third, third, 1 - 2 * third] },
    { at: '2026-01-05T00:00:00Z', probs: [0.1, 0.2, 0.7] },
    { at: '2026-02-01T00:00:00Z', probs: [up, 0.1, 1 - up - 0.1] },
  ];
  const n1 = [
    { at: '2026-02-10T00:00:00Z', quantiles: [0.1 + 0.2, 5e-324 + 1, 12] },
    { at: '2026-01-07T00:00:00Z', quantiles: [-3, 2 ** -1022, 7.5] },
  ];
  const file = (questions: unknown[]) => ({ diary: { format: 'forelog-diary', version: 1, questions } });
  await d.call('importDiary', file([choice('c1', c1), numeric('n1', n1)]));
  await d.call('importDiary', file([choice('c2', [{ at: '2026-01-03T00:00:00Z', probs: [1, 0, 0] }]), numeric('n2', [{ at: '2026-01-04T00:00:00Z', quantiles: [1, 2, 3] }])]));
  const input = loadScoringInput(d.service.store.read);
  const read = <T>(list: T[], id: string) => (list as (T & { id: string })[]).find((q) => q.id === id)!;
  const asRead = (values: ArrayLike<number>) => Array.from(values, bits);
  assert.deepEqual(
    read(input.choice, 'c1').forecasts.map((f) => [f.at, asRead(f.probs)]),
    c1.map((f) => [Date.parse(f.at), asRead(f.probs)]),
    'every revision of c1 in the order entered, values bit for bit',
  );
  assert.deepEqual(
    read(input.numeric, 'n1').forecasts.map((f) => [f.at, asRead(f.quantiles)]),
    n1.map((f) => [Date.parse(f.at), asRead(f.quantiles)]),
  );
  assert.deepEqual(read(input.choice, 'c2').forecasts.map((f) => Array.from(f.probs)), [[1, 0, 0]]);
  assert.deepEqual(read(input.numeric, 'n2').forecasts.map((f) => Array.from(f.quantiles)), [[1, 2, 3]]);
  const seqs = read(input.choice, 'c1').forecasts.map((f) => f.seq);
  assert.deepEqual([...seqs].sort((x, y) => x - y), seqs, 'entry order');
});

test('a copy or a replaced forecast list is scored from what it holds', async () => {
  const d = openTestDiary({ now: '2026-04-10T12:00:00Z' });
  const q = await d.call('createQuestion', { ...base, title: 'Copied', first_forecast: { p: 0.7, at: '2026-01-10T09:00:00Z' } });
  await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: '2026-04-01T09:00:00Z' });
  const options = { default_costs: { false_alarm: 1, miss: 1 } };
  const [loaded] = loadScoringQuestions(d.service.store.read) as [ScoringQuestion];

  const copy = { ...loaded, costs: { false_alarm: 1, miss: 9 } };
  assert.deepEqual(copy.forecasts.map((f) => f.p), [0.7]);
  assert.equal(computeScoreReport([copy], options).brier, computeScoreReport([loaded], options).brier);

  loaded.forecasts = [{ at: Date.parse('2026-01-10T09:00:00Z'), p: 0.2, seq: 1 }];
  assert.equal(loaded.forecast_columns, undefined, 'a replaced list drops the columns it no longer matches');
  assert.equal(computeScoreReport([loaded], options).brier, (0.2 - 1) ** 2);
});

test('revisions written to several questions in turn each reach their own question', async () => {
  const d = openTestDiary({ now: '2026-02-01T12:00:00Z' });
  const qs = [];
  for (const title of ['North', 'South', 'East', 'Quiet']) qs.push(await d.call('createQuestion', { ...base, title }));
  // Round-robin, so no question's revisions sit together in the table.
  for (let round = 0; round < 5; round++) {
    for (const [k, q] of qs.slice(0, 3).entries()) {
      await d.call('addForecast', { question_id: q.id, p: (round * 3 + k) / 20, at: `2026-01-${String(10 + round).padStart(2, '0')}T09:00:00Z` });
    }
  }
  const input = new Map(loadScoringQuestions(d.service.store.read).map((q) => [q.id, q]));
  for (const q of qs) {
    const whole = await d.call('getQuestion', { id: q.id });
    const expected = whole.forecasts.map((f: { at: string; p: number; seq: number }) => ({ at: Date.parse(f.at), p: f.p, seq: f.seq }));
    const got = [...input.get(q.id)!.forecasts].sort((x, y) => x.seq - y.seq);
    assert.deepEqual(got, [...expected].sort((x, y) => x.seq - y.seq), q.title);
  }
  assert.deepEqual(input.get(qs[3]!.id)!.forecasts, []);
  assert.equal(input.get(qs[0]!.id)!.forecasts.length, 5);
});

// Issue-level checks of the one-ulp defect: values one ulp from an edge, written to a real
// diary file and scored from it, land on the side the rule's own inequality puts them.
test('one ulp above the cost threshold α = 0.2 is a false alarm; α itself is not (p > α acts)', async () => {
  const d = openTestDiary({ now: '2026-04-10T12:00:00Z' });
  const costs = { false_alarm: 1, miss: 4 }; // α = 1 / (1 + 4) = 0.2
  for (const [title, p] of [['Just above', 0.20000000000000004], ['Exactly α', 0.2]] as const) {
    const q = await d.call('createQuestion', { ...base, title, costs, first_forecast: { p, at: '2026-01-10T09:00:00Z' } });
    await d.call('resolveQuestion', { id: q.id, outcome: 'no', at: '2026-04-01T09:00:00Z' });
  }
  const report = computeScoreReport(loadScoringQuestions(d.service.store.read), { default_costs: costs });
  assert.equal(report.decisions.false_alarms, 1);
  assert.equal(report.decisions.correct_rejections, 1);
});

test('AUC sees 0.14999999999999997 (Yes) below 0.15 (No): 0, as scikit-learn roc_auc_score gives', async () => {
  // scikit-learn: roc_auc_score([1, 0], [0.14999999999999997, 0.15]) == 0.0 (the value
  // stated with the defect report; recomputable with /usr/bin/python3).
  const d = openTestDiary({ now: '2026-04-10T12:00:00Z' });
  for (const [title, p, outcome] of [['Yes one ulp lower', 0.14999999999999997, 'yes'], ['No at 0.15', 0.15, 'no']] as const) {
    const q = await d.call('createQuestion', { ...base, title, first_forecast: { p, at: '2026-01-10T09:00:00Z' } });
    await d.call('resolveQuestion', { id: q.id, outcome, at: '2026-04-01T09:00:00Z' });
  }
  const report = computeScoreReport(loadScoringQuestions(d.service.store.read), { default_costs: { false_alarm: 1, miss: 1 } });
  assert.equal(report.auc, 0);
  // The two sit on either side of the bin edge 0.15 (bin of p = number of edges ≤ p).
  assert.deepEqual(report.bins.map((b) => [b.index, b.n]), [[1, 1], [2, 1]]);
});

test("each question's tags reach the engine in the question's own order, whatever order the table holds them in", async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', { title: 'Tagged', closes_at: '2026-09-01T00:00:00Z', tags: ['alpha', 'beta', 'gamma'], first_forecast: { p: 0.6 } });
  const plain = await d.call('createQuestion', { title: 'One tag', closes_at: '2026-09-01T00:00:00Z', tags: ['solo'], first_forecast: { p: 0.4 } });
  const typed = await d.call('createQuestion', {
    title: 'Which one?',
    closes_at: '2026-09-01T00:00:00Z',
    type: 'choice',
    options: ['A', 'B'],
    tags: ['one', 'two'],
    first_forecast: { probs: [0.5, 0.5] },
  });
  // Reverse the positions behind the app's back: the rows now lie in the table against their order.
  const write = d.service.store.write;
  write.prepare('UPDATE question_tags SET position = 2 - position WHERE question_id = ?').run(q.id);
  write.prepare('UPDATE question_tags SET position = 1 - position WHERE question_id = ?').run(typed.id);
  const input = loadScoringInput(d.service.store.read);
  assert.deepEqual(input.binary.find((x) => x.id === q.id)!.tags, ['gamma', 'beta', 'alpha']);
  assert.deepEqual(input.binary.find((x) => x.id === plain.id)!.tags, ['solo']);
  assert.deepEqual(input.choice.find((x) => x.id === typed.id)!.tags, ['two', 'one']);
  assert.deepEqual((await d.call('getQuestion', { id: q.id })).tags, ['gamma', 'beta', 'alpha'], 'the question page agrees');
});

test('a diary and its own export imported elsewhere score bit for bit alike, whatever order the questions were entered in', async () => {
  // Sums of doubles depend on their order. The engine reads the questions in the order
  // export writes them (close time, then id), so entering them in another order, as a
  // person does, gives the very figures the exported file gives on another machine.
  const d = openTestDiary();
  const kinds = ['binary', 'choice', 'numeric'] as const;
  for (let i = 0; i < 40; i++) {
    const type = kinds[i % 3]!;
    const close = `2026-0${1 + (i % 5)}-${String(28 - (i % 27)).padStart(2, '0')}T00:00:00Z`;
    const p = ((i * 7919) % 997) / 997;
    const q = await d.call('createQuestion', {
      title: `Q${i}`,
      type,
      opened_at: '2025-12-01T00:00:00Z',
      closes_at: close,
      ...(type === 'choice' ? { options: ['a', 'b', 'c'] } : {}),
      first_forecast: type === 'binary' ? { p, at: '2025-12-02T00:00:00Z' } : type === 'choice' ? { probs: [p / 2, p / 2, 1 - p], at: '2025-12-02T00:00:00Z' } : { quantiles: [p, 1 + p, 3 + p * 7], at: '2025-12-02T00:00:00Z' },
    });
    const outcome = type === 'binary' ? { outcome: i % 2 ? 'yes' : 'no' } : type === 'choice' ? { outcome: 'option', option: i % 3 } : { outcome: 'value', value: (i % 5) * 1.3 };
    await d.call('resolveQuestion', { id: q.id, ...outcome, at: close });
  }
  const elsewhere = openTestDiary();
  await elsewhere.call('importText', { format: 'json', text: (await d.call('exportText', { format: 'json' })).text });
  assert.equal(JSON.stringify(await elsewhere.call('score', {})), JSON.stringify(await d.call('score', {})));
});

test('questions closing at the same instant reach the engine in export order, ids compared as the file orders them', async () => {
  // The export orders by close time, then id in SQLite's BINARY collation (UTF-8 bytes, i.e.
  // code points); JavaScript's own < compares UTF-16 units, which puts U+1F600 (a surrogate
  // pair, D83D…) before U+FFFD. Both types are read this way.
  const d = openTestDiary();
  const ids = ['b', 'a\u{1F600}', 'a\uFFFD', 'a', 'A', 'a\u00e9', 'a\u{10000}z'];
  const question = (id: string, type: 'binary' | 'choice') => ({
    id,
    title: `Question ${id}`,
    closes_at: '2026-05-01T00:00:00Z',
    opened_at: '2026-01-01T00:00:00Z',
    ...(type === 'choice' ? { type, options: ['x', 'y'], forecasts: [{ at: '2026-01-02T00:00:00Z', probs: [0.5, 0.5] }] } : { forecasts: [{ at: '2026-01-02T00:00:00Z', p: 0.5 }] }),
  });
  const questions = [
    ...ids.map((id) => question(id, 'binary')),
    ...ids.map((id) => question(`c${id}`, 'choice')),
    { ...question('early', 'binary'), closes_at: '2026-04-30T23:59:59.999Z' },
  ];
  await d.call('importText', { format: 'json', text: JSON.stringify({ format: 'forelog-diary', version: 1, questions }) });
  const exported = JSON.parse((await d.call('exportText', { format: 'json' })).text) as { questions: { id: string; type?: string }[] };
  const exportOrder = exported.questions.map((q) => q.id);
  assert.deepEqual(exportOrder.slice(0, 4), ['early', 'A', 'a', 'a\u00e9'], 'the export itself orders by close, then code point');
  const input = loadScoringInput(d.service.store.read);
  assert.deepEqual(input.binary.map((q) => q.id), exportOrder.filter((id) => !id.startsWith('c')));
  assert.deepEqual(input.choice.map((q) => q.id), exportOrder.filter((id) => id.startsWith('c')));
  assert.ok(input.binary.findIndex((q) => q.id === 'a\uFFFD') < input.binary.findIndex((q) => q.id === 'a\u{1F600}'), 'U+FFFD before U+1F600');
});

/** The input as plain data: each question's fields with its revisions as a list (not the shared columns). */
function plain(input: ScoringInput): unknown {
  const strip = (q: object) => ({ ...q, forecast_columns: undefined });
  return { binary: input.binary.map(strip), choice: input.choice, numeric: input.numeric };
}

/** A diary of every shape the reader handles, with question rowids spread by deletions. */
async function variedDiary() {
  const d = openTestDiary({ now: '2026-06-01T12:00:00Z' });
  await d.call('importDiary', { diary: randomDiaryFile(120, 7) as never });
  const mixed = buildMixedDiaryFile(30);
  await d.call('importDiary', { diary: mixed as never });
  const listed = await d.call('listQuestions', { limit: 200 });
  for (const q of listed.questions.slice(0, 40).filter((_: unknown, i: number) => i % 3 === 0)) await d.call('deleteQuestion', { id: q.id });
  return d;
}

test('read in steps of a few questions, the scoring input is the one read in one go, in the same order', async () => {
  const d = await variedDiary();
  const whole = loadScoringInput(d.service.store.read);
  assert.ok(whole.binary.length > 100 && whole.choice.length > 0 && whole.numeric.length > 0);
  for (const per of [1, 7, 1000]) {
    const read = startStepwiseRead(d.service.store.read, per);
    let steps = 0;
    while (!read.step()) steps++;
    assert.ok(read.input !== null, `steps of ${per}`);
    assert.ok(per > 100 || steps > 10, `steps of ${per} took ${steps} steps`);
    assert.deepEqual(plain(read.input!), plain(whole), `steps of ${per}`);
    // Scored the same, bit for bit (SCORING.md: the same input gives the same figures).
    const options = { default_costs: { false_alarm: 1, miss: 3 } };
    assert.deepEqual(computeScoreReport(read.input!.binary, options), computeScoreReport(whole.binary, options));
  }
});

test('a read in steps that a commit interrupts gives nothing, and the service then reads the diary as it is', async () => {
  const d = await variedDiary();
  const read = startStepwiseRead(d.service.store.read, 5);
  assert.equal(read.step(), false);
  const q = await d.call('createQuestion', { ...base, title: 'Added between two steps', first_forecast: { p: 0.9, at: '2026-01-10T09:00:00Z' } });
  while (!read.step());
  assert.equal(read.input, null, 'the steps no longer stand for one state of the diary');

  // Through the service: a warm-up begun, a write, then the Scorecard sees the write.
  assert.equal(d.service.diary.warmScoringInput(), false);
  await d.call('resolveQuestion', { id: q.id, outcome: 'yes', at: '2026-03-31T17:00:00Z' });
  assert.deepEqual(await d.call('score', {}), await coldCall(d, 'score', {}));
});

/** What a newly opened service (nothing read ahead, nothing kept) answers on the same diary file. */
async function coldCall(d: ReturnType<typeof openTestDiary>, op: OperationName, request: object): Promise<unknown> {
  const fresh = openDiary({ dbPath: d.dbPath, now: () => d.clock.now, timeZone: 'UTC' });
  try {
    return await callOrThrow(fresh.dispatch, op, request);
  } finally {
    fresh.close();
  }
}

test('warming up ahead of need reads the input in steps until it is current, and the figures are those of a cold read', async () => {
  const d = await variedDiary();
  let calls = 0;
  while (!d.service.diary.warmScoringInput()) calls++;
  assert.ok(calls >= 1);
  assert.equal(d.service.diary.warmScoringInput(), true, 'nothing left to do while the diary stays as it is');
  for (const [op, request] of [['score', {}], ['hindsight', {}], ['hindsight', { include_hits: true }], ['score', { tag: 'pricing' }]] as const) {
    assert.deepEqual(await d.call(op, request as never), await coldCall(d, op, request), op);
  }
});

test('a read in steps takes as many steps as the questions need, however far apart their rowids lie', async () => {
  const d = await variedDiary();
  const write = d.service.store.write;
  const [far] = write.prepare("SELECT id FROM questions WHERE type = 'binary' LIMIT 1").pluck().all() as string[];
  write.prepare('UPDATE questions SET rowid = 9000000000000000 WHERE id = ?').run(far);
  const whole = loadScoringInput(d.service.store.read);
  const read = startStepwiseRead(d.service.store.read, 50);
  let steps = 0;
  while (!read.step()) steps++;
  const questions = whole.binary.length + whole.choice.length + whole.numeric.length;
  assert.ok(steps <= Math.ceil(questions / 50) + 2, `${steps} steps for ${questions} questions`);
  assert.deepEqual(plain(read.input!), plain(whole));
});
