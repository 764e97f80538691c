/**
 * The diary file's reader reads plain yes/no revisions by hand (shared/diary-file.ts,
 * plainRevision): whatever a record holds, it must come out exactly as the schema makes it,
 * and a bad record must be refused with the schema's own words.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { diaryItems, fileQuestion, questionRecordName, DiaryFileError } from '../../shared/diary-file';
import { formatPath } from '../../shared/validation';

const at = fc.constantFrom<unknown>(
  '2026-03-31T16:00:00.000Z',
  '2026-03-31T17:00:00+01:00',
  '2026-02-30T16:00:00.000Z',
  '2026-03-31',
  'soon',
  '0999-01-01T00:00:00.000Z',
  '9999-12-31T23:59:59.999Z',
  1774972800000,
  null,
);
const p = fc.oneof(fc.constantFrom<unknown>(0, 1, 0.5, -0, 1.0000001, -0.1, '0.5', null, Number.NaN, Infinity), fc.double({ min: 0, max: 1 }));
const note = fc.constantFrom<unknown>(undefined, '', 'why', 'a\tb\nc', 'bell\u0007', 'x'.repeat(20_000), 'x'.repeat(20_001), 3);
const extra = fc.constantFrom<Record<string, unknown>>({}, {}, {}, { lenses: [] }, { lenses: [{ name: 'base', p: 0.4 }] }, { probs: [0.5, 0.5] }, { id: 'r1' }, { __proto__: null });

const revision = fc.record({ at, p, note, extra }).map(({ at, p, note, extra }) => {
  const r: Record<string, unknown> = { at, p, ...extra };
  if (note !== undefined) r.note = note;
  return r;
});

const record = fc
  .record({
    type: fc.constantFrom<unknown>(undefined, 'binary', 'choice', 'other'),
    forecasts: fc.oneof(fc.array(revision, { maxLength: 4 }), fc.constant('none')),
    title: fc.constantFrom('  Will it ship?  ', '', 'Ok'),
    closes_at: fc.constantFrom('2026-06-01T00:00:00.000Z', '2020-01-01T00:00:00.000Z'),
  })
  .map(({ type, forecasts, title, closes_at }) => {
    const r: Record<string, unknown> = { id: 'q1', title, opened_at: '2025-01-01T00:00:00.000Z', closes_at, forecasts };
    if (type !== undefined) r.type = type;
    return r;
  });

function readOne(raw: unknown) {
  const items = [...diaryItems({ format: 'forelog-diary', version: 1, questions: [raw] })];
  assert.equal(items.length, 1);
  const item = items[0]!;
  assert.equal(item.kind, 'question');
  return item.kind === 'question' ? item.question : null;
}

test('a record reads exactly as the schema reads it, and a bad one is refused in the schema’s words', () => {
  fc.assert(
    fc.property(record, (raw) => {
      const expected = fileQuestion.safeParse(raw);
      if (expected.success) {
        assert.deepEqual(readOne(raw), expected.data);
        // Key order too: what is stored and compared is read field by field, but keep it identical.
        assert.deepEqual(Object.keys(readOne(raw)!), Object.keys(expected.data));
        return;
      }
      const issue = expected.error.issues[0]!;
      assert.throws(
        () => readOne(raw),
        (err: unknown) =>
          err instanceof DiaryFileError &&
          err.message === `${questionRecordName(0)} is not valid: field ${formatPath(issue.path) || '(record)'}: ${issue.message}. Nothing was imported.`,
      );
    }),
    { seed: 20261202, numRuns: 3000 },
  );
});

test('plain revisions come out with their times as epoch milliseconds and their notes as given', () => {
  const q = readOne({
    title: 'Ships?',
    closes_at: '2026-06-01T00:00:00.000Z',
    forecasts: [
      { at: '2026-03-31T17:00:00+01:00', p: 0.25 },
      { at: '2026-04-01T00:00:00.000Z', p: 1, note: 'sure' },
    ],
  })!;
  assert.deepEqual(q.forecasts, [
    { at: Date.UTC(2026, 2, 31, 16), p: 0.25 },
    { at: Date.UTC(2026, 3, 1), p: 1, note: 'sure' },
  ]);
});
