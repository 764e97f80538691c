/**
 * The question list a page at a time (docs/api.md, listQuestions): every order a user can
 * pick, pages that fit together without gaps or repeats, search and filters counted over all
 * pages, the "needs attention" order agreeing with the Desk, and refusals that name the field.
 * Hindsight's pages likewise. Real SQLite files in temp folders.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ApiError, LIST_PAGE_MAX, LIST_SORTS } from '../../shared/contract';
import { questionStatus, type QuestionSummary } from '../../shared/domain';
import { openTestDiary, type TestDiary } from '../support/temp-diary';

const DAY = 86_400_000;
const HOUR = 3_600_000;
const NOW = '2026-06-01T12:00:00Z';

/** Twelve questions with titles, closes, last forecasts and base rates that differ, some alike. */
async function diary(): Promise<{ d: TestDiary; ids: string[] }> {
  const d = openTestDiary({ now: NOW });
  const ids: string[] = [];
  const now = d.clock.now;
  for (let i = 0; i < 12; i++) {
    const q = await d.call('createQuestion', {
      title: `${['alpha', 'Bravo', 'charlie', 'Delta'][i % 4]} question ${String(i).padStart(2, '0')}`,
      opened_at: new Date(now - 20 * DAY).toISOString(),
      closes_at: new Date(now + (i + 1) * 5 * DAY).toISOString(),
      tags: i % 3 === 0 ? ['client:northgate'] : ['internal'],
      ...(i % 4 === 1 ? {} : { base_rate: (i % 5) / 10 }),
      ...(i % 5 === 4 ? {} : { first_forecast: { p: ((i * 7) % 10) / 10 || 0.05, note: i === 7 ? 'Harbour hearing slipped' : 'first look', at: new Date(now - 20 * DAY).toISOString() } }),
      checkin_days: 0,
    });
    ids.push(q.id);
  }
  return { d, ids };
}

type Row = QuestionSummary;
const list = async (d: TestDiary, req: object) => (await d.call('listQuestions', req)) as { questions: Row[]; matched: number; total: number; offset: number; sort: string; direction: string };

async function refused(d: TestDiary, op: 'listQuestions' | 'hindsight', req: object, field: RegExp): Promise<void> {
  await assert.rejects(d.call(op, req as never), (err: unknown) => {
    assert.ok(err instanceof ApiError);
    assert.equal(err.code, 'invalid');
    assert.ok(err.fields.some((f) => field.test(f)), `${err.fields.join('; ')} names ${field}`);
    return true;
  });
}

test('each sort key orders the whole list, both ways, with unknown values last', async () => {
  const { d } = await diary();
  const key: Record<string, (r: Row) => number | string | null> = {
    title: (r) => r.title.toLowerCase(),
    closes: (r) => Date.parse(r.closes_at),
    last_p: (r) => r.last_p,
    base_rate: (r) => r.base_rate,
  };
  for (const [sort, of] of Object.entries(key)) {
    for (const direction of ['asc', 'desc'] as const) {
      const { questions, matched, sort: echoed, direction: dir } = await list(d, { sort, direction });
      assert.equal(matched, 12);
      assert.equal(echoed, sort);
      assert.equal(dir, direction);
      const values = questions.map(of);
      const known = values.filter((v) => v !== null);
      assert.deepEqual(values.slice(known.length), values.filter((v) => v === null), `${sort} ${direction}: nulls last`);
      const sorted = [...known].sort((a, b) => (a! < b! ? -1 : a! > b! ? 1 : 0));
      assert.deepEqual(known, direction === 'asc' ? sorted : sorted.reverse(), `${sort} ${direction}`);
    }
  }
});

test('pages fit together: every question once, in order, whatever the page size', async () => {
  const { d } = await diary();
  for (const sort of LIST_SORTS) {
    for (const direction of ['asc', 'desc'] as const) {
      const whole = (await list(d, { sort, direction })).questions.map((q) => q.id);
      assert.equal(whole.length, 12);
      for (const limit of [1, 5, 12, 13]) {
        const paged: string[] = [];
        for (let offset = 0; offset < 12; offset += limit) {
          const page = await list(d, { sort, direction, offset, limit });
          assert.equal(page.offset, offset);
          assert.equal(page.matched, 12);
          assert.equal(page.questions.length, Math.min(limit, 12 - offset));
          paged.push(...page.questions.map((q) => q.id));
        }
        assert.deepEqual(paged, whole, `${sort} ${direction} in pages of ${limit}`);
      }
    }
  }
  // At and past the end: an empty page that still counts the matches.
  for (const offset of [12, 13, 1_000_000]) {
    const page = await list(d, { offset, limit: 5 });
    assert.deepEqual(page.questions, []);
    assert.equal(page.matched, 12);
  }
  assert.equal((await list(d, { limit: LIST_PAGE_MAX })).questions.length, 12);
});

test('later pages follow a change to the diary at once, from this process or another one', async () => {
  const { d, ids } = await diary();
  const titles = async (offset: number) => (await list(d, { sort: 'title', offset, limit: 5 })).questions.map((q) => q.title);
  await list(d, { sort: 'title', offset: 0, limit: 5 });
  const second = await titles(5);
  assert.equal(second.length, 5);
  assert.deepEqual(await titles(5), second, 'the same page twice');
  // Renamed to sort first: every later page shifts by one.
  await d.call('updateQuestion', { id: ids[11]!, changes: { title: 'aardvark question' } });
  const next = await titles(5); // before any first page, which would drop the kept order anyway
  const whole = (await list(d, { sort: 'title', offset: 0, limit: 100 })).questions.map((q) => q.title);
  assert.equal(whole[0], 'aardvark question');
  assert.deepEqual(next, whole.slice(5, 10), "this process's edit is in the next later page");
  assert.notDeepEqual(whole.slice(5, 10), second);
  const other = openTestDiary({ now: NOW, dbPath: d.dbPath });
  await other.call('deleteQuestion', { id: ids[1]! });
  const after = await list(d, { sort: 'title', offset: 5, limit: 5 });
  assert.equal(after.matched, 11, "another process's delete is counted");
  assert.ok(!after.questions.some((q) => q.id === ids[1]));
});

test("every page's tag counts and question count follow a change from this process or another one", async () => {
  const { d, ids } = await diary();
  const totals = async () => {
    const page = (await d.call('listQuestions', { limit: 1 })) as { tags: { tag: string; count: number }[]; total: number };
    return { tags: page.tags, total: page.total };
  };
  assert.deepEqual(await totals(), { tags: [{ tag: 'client:northgate', count: 4 }, { tag: 'internal', count: 8 }], total: 12 });
  await d.call('updateQuestion', { id: ids[1]!, changes: { tags: ['internal', 'port'] } });
  assert.deepEqual(await totals(), { tags: [{ tag: 'client:northgate', count: 4 }, { tag: 'internal', count: 8 }, { tag: 'port', count: 1 }], total: 12 });
  const other = openTestDiary({ now: NOW, dbPath: d.dbPath });
  await other.call('deleteQuestion', { id: ids[0]! });
  assert.deepEqual(await totals(), { tags: [{ tag: 'client:northgate', count: 3 }, { tag: 'internal', count: 8 }, { tag: 'port', count: 1 }], total: 11 }, "another process's delete");
});

test('the search of notes follows each revision note as it is written, cleared, restored and deleted', async () => {
  // The notes are searched through an index of the noted revisions only (migration 7), which
  // must follow every way a note changes.
  const { d, ids } = await diary();
  const search = async () => (await list(d, { text: 'ferry strike' })).questions.map((q) => q.id);
  assert.deepEqual(await search(), []);
  const added = await d.call('addForecast', { question_id: ids[2]!, p: 0.3, note: 'Ferry strike called off' });
  assert.deepEqual(await search(), [ids[2]], 'a new revision\'s note is found');
  const revision = added.forecasts.find((f: { note: string }) => f.note === 'Ferry strike called off')!;
  const cleared = await d.call('updateForecast', { id: revision.id, p: 0.3, note: '' });
  assert.deepEqual(await search(), [], 'a cleared note is no longer found');
  await d.call('undo', { token: cleared.undo });
  assert.deepEqual(await search(), [ids[2]], 'undo brings the note back into the search');
  await d.call('updateForecast', { id: revision.id, p: 0.3, note: 'Harbour reopened' });
  assert.deepEqual(await search(), [], 'an edited note is searched by its new words');
  assert.deepEqual((await list(d, { text: 'harbour reopened' })).questions.map((q) => q.id), [ids[2]]);
  await d.call('deleteForecast', { id: revision.id });
  assert.equal((await list(d, { text: 'harbour reopened' })).matched, 0, "a deleted revision's note is gone");
});

test('search, status and tag filter before paging, and `matched` counts every page', async () => {
  const { d, ids } = await diary();
  const north = await list(d, { tag: 'client:northgate', limit: 2 });
  assert.equal(north.matched, 4);
  assert.equal(north.total, 12);
  assert.equal(north.questions.length, 2);
  const found = await list(d, { text: 'HARBOUR', limit: 5 });
  assert.deepEqual(found.questions.map((q) => q.id), [ids[7]], 'notes written with revisions are searched');
  const bravo = await list(d, { text: 'bravo', sort: 'title', offset: 1, limit: 1 });
  assert.equal(bravo.matched, 3);
  assert.equal(bravo.questions[0]!.title, 'Bravo question 05');
  // Each word on its own, in any order and any field: "question bravo" finds "Bravo question 05";
  // a word of the title and one of a revision's note find that question; a word found nowhere finds none.
  assert.equal((await list(d, { text: 'question  bravo' })).matched, 3);
  assert.deepEqual((await list(d, { text: 'harbour delta' })).questions.map((q) => q.id), [ids[7]]);
  assert.equal((await list(d, { text: 'harbour bravo' })).matched, 0);
  const manyWords = Array.from({ length: 60 }, (_, k) => k.toString(36)).join(' ');
  assert.equal((await list(d, { text: manyWords })).matched, 0, 'sixty words are searched, not refused');
  // LIKE's wildcards are taken literally.
  assert.equal((await list(d, { text: '%' })).matched, 0);
  assert.equal((await list(d, { text: 'question_0' })).matched, 0);
  await d.call('resolveQuestion', { id: ids[0]!, outcome: 'no' });
  const resolved = await list(d, { status: 'resolved', limit: 1 });
  assert.equal(resolved.matched, 1);
  assert.equal(resolved.questions[0]!.id, ids[0]);
  assert.equal((await list(d, { status: 'open' })).matched, 11);
  // Reading a page leaves whole-question reads intact (they share cached statements).
  assert.deepEqual((await d.call('getQuestion', { id: ids[3]! })).tags, ['client:northgate']);
  assert.deepEqual((await list(d, { limit: 1, sort: 'title' })).questions[0]!.tags, ['client:northgate']);
});

test('status at the edges agrees with questionStatus, one millisecond either side', async () => {
  const d = openTestDiary({ now: NOW });
  const hours = (await d.call('getSettings', {})).closing_soon_hours as number;
  const q = await d.call('createQuestion', { title: 'Edge case', closes_at: new Date(d.clock.now + 10 * DAY).toISOString() });
  const closes = Date.parse(q.closes_at);
  for (const at of [closes - hours * HOUR - 1, closes - hours * HOUR, closes - hours * HOUR + 1, closes - 1, closes, closes + 1]) {
    d.clock.now = at;
    const [row] = (await list(d, {})).questions;
    const expected = questionStatus(closes, null, at, hours);
    assert.equal(row!.status, expected, `at close ${at - closes} ms`);
    assert.equal((await list(d, { status: expected })).matched, 1);
  }
});

test('needs attention: closed and waiting, then check-ins due, then closing soon, then the rest, resolved last', async () => {
  const d = openTestDiary({ now: NOW });
  const now = d.clock.now;
  const make = async (title: string, opened: number, closes: number, checkin_days: number) =>
    (
      await d.call('createQuestion', {
        title,
        opened_at: new Date(now + opened).toISOString(),
        closes_at: new Date(now + closes).toISOString(),
        checkin_days,
        first_forecast: { p: 0.5, at: new Date(now + opened).toISOString() },
      })
    ).id as string;
  const later = await make('Open, nothing due', -DAY, 40 * DAY, 0);
  const resolved = await make('Resolved already', -10 * DAY, 30 * DAY, 0);
  const closing = await make('Closing within the day', -DAY, 2 * HOUR, 0);
  const checkin = await make('Check-in due', -8 * DAY, 20 * DAY, 7);
  const waiting2 = await make('Closed yesterday', -30 * DAY, -DAY, 0);
  const waiting1 = await make('Closed last week', -30 * DAY, -7 * DAY, 0);
  await d.call('resolveQuestion', { id: resolved, outcome: 'yes' });
  const order = (await list(d, {})).questions.map((q) => q.id);
  assert.deepEqual(order, [waiting1, waiting2, checkin, closing, later, resolved]);
  const due = await d.call('due', {});
  const dueIds = new Set(due.nudges.map((n: { id: string }) => n.id));
  assert.deepEqual(order.slice(0, 4).filter((id) => dueIds.has(id)), [waiting1, waiting2, checkin, closing], 'the Desk lists the first four');
  assert.ok(!dueIds.has(later) && !dueIds.has(resolved));
  assert.deepEqual((await list(d, { direction: 'desc' })).questions.map((q) => q.id), [...order].reverse());
});

test('bad paging and sorting requests are refused, naming the field, and change nothing', async () => {
  const { d } = await diary();
  await refused(d, 'listQuestions', { sort: 'colour' }, /^sort: must be one of attention, title/);
  await refused(d, 'listQuestions', { direction: 'up' }, /^direction: must be asc or desc/);
  await refused(d, 'listQuestions', { limit: -1 }, /^limit: must be a whole number from 1 to 1,000$/);
  await refused(d, 'listQuestions', { limit: 0 }, /^limit: /);
  await refused(d, 'listQuestions', { limit: LIST_PAGE_MAX + 1 }, /^limit: /);
  await refused(d, 'listQuestions', { limit: 2.5 }, /^limit: /);
  await refused(d, 'listQuestions', { limit: '10' }, /^limit: /);
  await refused(d, 'listQuestions', { offset: -1 }, /^offset: must be a whole number, 0 or more/);
  await refused(d, 'listQuestions', { offset: 2 ** 53 }, /^offset: must be a whole number, 0 or more \(at most 9,007,199,254,740,991\)$/);
  await refused(d, 'listQuestions', { offset: 0.5 }, /^offset: /);
  await refused(d, 'listQuestions', { offset: Number.NaN }, /^offset: /);
  await refused(d, 'hindsight', { limit: 0 }, /^limit: /);
  await refused(d, 'hindsight', { offset: -3 }, /^offset: /);
  assert.equal((await list(d, {})).total, 12);
});

test('hindsight pages its calls and counts misses and hits over the whole selection', async () => {
  const d = openTestDiary({ now: NOW });
  const start = d.clock.now - 40 * DAY;
  const ids: string[] = [];
  // Misses at 0.81…0.89 on a No, hits at 0.91…0.93 on a Yes.
  for (const [i, p, outcome] of [...[1, 2, 3, 4, 5, 6, 7, 8, 9].map((k) => [k, 0.8 + k / 100, 'no'] as const), ...[1, 2, 3].map((k) => [9 + k, 0.9 + k / 100, 'yes'] as const)]) {
    const q = await d.call('createQuestion', {
      title: `Call ${i}`,
      opened_at: new Date(start).toISOString(),
      closes_at: new Date(start + 30 * DAY).toISOString(),
      first_forecast: { p, at: new Date(start).toISOString() },
    });
    await d.call('resolveQuestion', { id: q.id, outcome, at: new Date(start + 30 * DAY).toISOString() });
    ids.push(q.id);
  }
  const whole = await d.call('hindsight', { include_hits: true });
  assert.equal(whole.misses, 9);
  assert.equal(whole.hits, 3);
  assert.equal(whole.offset, 0);
  const order = whole.entries.map((e: { id: string }) => e.id);
  assert.deepEqual(order.slice(0, 9), ids.slice(0, 9).reverse(), 'misses, the most confident first');
  assert.deepEqual(order.slice(9), ids.slice(9).reverse(), 'then hits, the most confident first');
  const paged: string[] = [];
  for (let offset = 0; offset < 12; offset += 5) {
    const page = await d.call('hindsight', { include_hits: true, offset, limit: 5 });
    assert.equal(page.misses, 9);
    assert.equal(page.hits, 3);
    assert.equal(page.report.scored, 12, 'the calibration summary covers the whole selection');
    paged.push(...page.entries.map((e: { id: string }) => e.id));
  }
  assert.deepEqual(paged, order);
  const missesOnly = await d.call('hindsight', { limit: 2 });
  assert.equal(missesOnly.entries.length, 2);
  assert.equal(missesOnly.misses, 9);
  assert.equal(missesOnly.hits, 0);
});
