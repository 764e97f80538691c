/**
 * The diary file's reader reads plain yes/no revisions by hand (shared/diary-file.ts,
 * plainRevision): whatever a record holds, it must come out exactly as the schema makes it,
 * and a bad record must be refused with the schema's own words.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { diaryItems, fileQuestion, questionRecordName, DiaryFileError } from '../../shared/diary-file';
import { formatPath, issueReason } from '../../shared/validation';

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

const revision = fc.oneof(
  { arbitrary: fc.record({ at: fc.constant<unknown>('2026-03-31T16:00:00.000Z'), p: fc.double({ min: 0, max: 1, noNaN: true }), note: fc.constantFrom<unknown>(undefined, '', 'why'), extra: fc.constant({}) }), weight: 6 },
  { arbitrary: fc.record({ at, p, note, extra }), weight: 1 },
).map(({ at, p, note, extra }) => {
  const r: Record<string, unknown> = { at, p, ...extra };
  if (note !== undefined) r.note = note;
  return r;
});

const AT = '2026-03-01T00:00:00.000Z';
/** Each field of a question record: [valid values (undefined: absent), wrong values]; mostly valid, so that many records pass. */
const FIELDS: Record<string, [unknown[], unknown[]]> = {
  id: [[undefined, 'q1', ' q 1 ', 'x'.repeat(200)], ['', 'x'.repeat(201), 'tab\tid', 7]],
  title: [['  Will it ship?  ', 'Ok', 'x'.repeat(300)], ['', '   ', 'line\nbreak', 'x'.repeat(301), undefined, 3]],
  rule: [[undefined, '', 'Resolves yes if…', 'a\tb\nc'], ['nul\u0000', 4]],
  kind: [[undefined, 'event_by_deadline', 'state_at_deadline'], ['other']],
  tags: [[undefined, [], ['client:a', 'b']], [['a', 'a'], ['Bad'], Array.from({ length: 33 }, (_, i) => `t${i}`), 'a']],
  opened_at: [[undefined, '2025-01-01T00:00:00.000Z', '2026-05-31T23:00:00-01:00'], ['2027-01-01T00:00:00.000Z', 'later']],
  closes_at: [['2026-06-01T00:00:00.000Z'], ['2020-01-01T00:00:00.000Z', undefined, 'never']],
  time_zone: [[undefined, 'Europe/London', 'UTC'], ['Mars/Base', 3]],
  base_rate: [[undefined, null, 0, 0.3], [1.5, '0.3']],
  base_rate_note: [[undefined, '', 'from the survey'], ['bell\u0007']],
  costs: [[undefined, null, { false_alarm: 1, miss: 2 }], [{ false_alarm: 0, miss: 1 }, { false_alarm: 1 }, { false_alarm: 1, miss: 1, extra: 1 }, [1, 2]]],
  checkin_days: [[undefined, null, 0, 7, 365], [366, 1.5, -1]],
  references: [
    [undefined, [], [{ at: AT, p: 0.5, source: '  sector survey ' }]],
    [[{ at: AT, p: 0.5, source: '' }], [{ at: AT, p: 0.5, source: 's', extra: 1 }], [{ at: AT, p: 2, source: 's' }], [{ at: AT, probs: [0.5, 0.5], source: 's' }], 'none'],
  ],
  resolution: [
    [undefined, null, { outcome: 'yes', at: AT }, { outcome: 'no', at: AT, note: 'late' }, { outcome: 'void', at: AT, note: '' }],
    [{ outcome: 'void', at: AT, note: 'nul\u0000' }, { outcome: 'option', option: 0, at: AT }, { outcome: 'maybe', at: AT }, { outcome: 'yes', at: AT, value: 3 }, { outcome: 'yes' }],
  ],
  type: [[undefined, 'binary'], ['choice', 'other']],
};
const fieldValue = ([valid, wrong]: [unknown[], unknown[]]) =>
  fc.oneof({ arbitrary: fc.constantFrom(...valid), weight: 12 }, { arbitrary: fc.constantFrom(...wrong), weight: 1 });
const fields = Object.fromEntries(Object.entries(FIELDS).map(([key, values]) => [key, fieldValue(values)]));

const record = fc
  .record({
    ...fields,
    forecasts: fc.oneof({ arbitrary: fc.array(revision, { maxLength: 4 }), weight: 12 }, { arbitrary: fc.constant('none'), weight: 1 }),
    extra: fc.constantFrom<Record<string, unknown>>({}, {}, {}, {}, {}, {}, { unknown: 1 }, { resolution_history: [] }, { options: ['a', 'b'] }),
  })
  .map(({ extra, ...given }) => {
    const r: Record<string, unknown> = {};
    for (const [key, value] of Object.entries(given)) if (value !== undefined) r[key] = value;
    return { ...r, ...extra };
  });

function readOne(raw: unknown) {
  const items = [...diaryItems({ format: 'forelog-diary', version: 1, questions: [raw] })];
  assert.equal(items.length, 1);
  const item = items[0]!;
  assert.equal(item.kind, 'question');
  return item.kind === 'question' ? item.question : null;
}

test('a record reads exactly as the schema reads it, and a bad one is refused in the schema’s words', () => {
  let passed = 0;
  let refused = 0;
  fc.assert(
    fc.property(record, (raw) => {
      const expected = fileQuestion.safeParse(raw, { reportInput: true });
      if (expected.success) {
        passed++;
        assert.deepEqual(readOne(raw), expected.data);
        // Key order too: what is stored and compared is read field by field, but keep it identical.
        assert.deepEqual(Object.keys(readOne(raw)!), Object.keys(expected.data));
        return;
      }
      refused++;
      const issue = expected.error.issues[0]!;
      assert.throws(
        () => readOne(raw),
        (err: unknown) =>
          err instanceof DiaryFileError &&
          err.message === `${questionRecordName(0, raw)} is not valid: field ${formatPath(issue.path) || '(record)'}: ${issueReason(issue, true)}. Nothing was imported.`,
      );
    }),
    { seed: 20261202, numRuns: 4000 },
  );
  // Both ways are exercised: records that pass and records refused.
  assert.ok(passed > 400 && refused > 400, `${passed} passed, ${refused} refused`);
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

test('a refused record is named by its place and its title, or its id when it has no title a message can show', () => {
  const refusal = (record: Record<string, unknown>): string => {
    const file = { format: 'forelog-diary', version: 1, questions: [{ title: 'Fine', closes_at: '2031-01-01T00:00:00Z', forecasts: [] }, record] };
    try {
      [...diaryItems(file)];
    } catch (err) {
      assert.ok(err instanceof DiaryFileError);
      return err.message;
    }
    return assert.fail('the file was accepted');
  };
  const badP = { closes_at: '2031-01-01T00:00:00Z', forecasts: [{ at: '2030-01-01T00:00:00Z', p: 7 }] };
  assert.equal(
    refusal({ id: 'q7', title: '  Depot lease renewed ', ...badP }),
    'Question 2 (questions[1], “Depot lease renewed”) is not valid: field forecasts[0].p: must be a probability between 0 and 1. Nothing was imported.',
  );
  // No title, or one that cannot be shown on one line: the id instead.
  assert.match(refusal({ id: 'q7', ...badP }), /^Question 2 \(questions\[1\], id "q7"\) is not valid: field title: /);
  assert.match(refusal({ id: 'q7', title: 'two\nlines', ...badP }), /^Question 2 \(questions\[1\], id "q7"\) is not valid: field title: /);
  // Neither: the place alone.
  assert.match(refusal({ title: 42, ...badP }), /^Question 2 \(questions\[1\]\) is not valid: field title: /);
  // A long title is quoted by its first 60 characters.
  const long = `Northgate ${'renewal '.repeat(30)}`.trim();
  assert.ok(refusal({ title: long, ...badP }).startsWith(`Question 2 (questions[1], “${long.slice(0, 60).trimEnd()}…”) is not valid: field forecasts[0].p`));
  assert.equal(questionRecordName(3), 'Question 4 (questions[3])');
});
