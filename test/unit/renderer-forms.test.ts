/**
 * What forms say: a percent box's advice (renderer/src/percent.ts) at the edges it draws —
 * exactly 0% and 100% stored, a fraction strictly between 0 and 1 typed — with the numbers
 * one step either side; the diary's `field: reason` lines in plain words beside the right
 * field (renderer/src/fieldMessages.ts); the Brier identity's signs
 * and a score in a numeric question's unit, always two decimals
 * (renderer/src/screens/scorecard/format.ts); and the thinking tools' intervals
 * (renderer/src/tools/format.ts).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createQuestionRequest, settingsPatch } from '../../shared/contract';
import { plainReason, placeReasons, schemaReasons } from '../../renderer/src/fieldMessages';
import { percentAdvice, percentToProbability } from '../../renderer/src/percent';
import { readDecimal } from '../../shared/numeric-value';
import { cost, identityRows, score3, unitScore } from '../../renderer/src/screens/scorecard/format';
import { formatCount } from '../../renderer/src/dates';
import { formatRange } from '../../renderer/src/tools/format';

test('0% and 100% are saved but warned about, with the value the log score uses', () => {
  assert.deepEqual(percentAdvice('0'), {
    kind: 'certain',
    message: 'A single miss at 0% dominates the log score; it is scored as 0.1%.',
  });
  assert.deepEqual(percentAdvice('100'), {
    kind: 'certain',
    message: 'A single miss at 100% dominates the log score; it is scored as 99.9%.',
  });
  assert.deepEqual(percentToProbability('0'), { ok: true, value: 0 }, 'saved as typed');
  // One step inside each edge of what is stored: no warning. The smallest positive probability
  // (5e-324) is typed as a fraction of a percent, so it is asked about rather than warned about.
  assert.equal(percentAdvice('99.9999999999999')?.kind, undefined, 'stored as 0.999999999999999, below 1');
  assert.deepEqual(percentToProbability('5e-322'), { ok: true, value: Number.MIN_VALUE });
  assert.equal(percentAdvice('5e-322')?.kind, 'fraction');
  // A number too small to store is stored as 0, and warned about as 0.
  assert.deepEqual(percentToProbability('5e-324'), { ok: true, value: 0 });
  assert.equal(percentAdvice('5e-324')?.kind, 'certain');
  // Typed digits beyond what the diary keeps round to 1: the warning follows what is stored.
  assert.deepEqual(percentToProbability('99.99999999999999'), { ok: true, value: 1 });
  assert.equal(percentAdvice('99.99999999999999')?.kind, 'certain');
  assert.equal(percentAdvice('50'), null);
  assert.equal(percentAdvice(''), null);
  assert.equal(percentAdvice('150'), null, 'out of range is an error, not advice');
  // Only decimal notation is a percent: Number() would read "0x32" as 50 and "0b1" as 1.
  for (const text of ['0x32', '0b1', '0o7', 'Infinity']) assert.deepEqual(percentToProbability(text), { ok: false, error: 'must be a number of percent, e.g. 35' }, text);
  assert.equal(percentAdvice('0x32'), null);
  // Every other typed number (costs, settings, thresholds, the thinking tools) follows the same rule.
  for (const text of ['0x10', '0b1', 'Infinity', '1e400', '']) assert.equal(readDecimal(text), null, text);
  assert.equal(readDecimal(' 1e3 '), 1000);
  assert.equal(readDecimal('.5'), 0.5);
});

test('a fraction typed into a percent box asks whether the percent was meant', () => {
  assert.deepEqual(percentAdvice('0.5'), { kind: 'fraction', typed: '0.5', meant: '50' });
  assert.deepEqual(percentAdvice(' 0.35 '), { kind: 'fraction', typed: '0.35', meant: '35' });
  assert.deepEqual(percentAdvice('0.07'), { kind: 'fraction', typed: '0.07', meant: '7' });
  // The edges: 1 is one percent, not a fraction; the largest number below 1 is.
  assert.equal(percentAdvice('1'), null);
  assert.deepEqual(percentAdvice('0.9999999999999999'), { kind: 'fraction', typed: '0.9999999999999999', meant: '100' });
  assert.equal(percentAdvice('1.5'), null);
});

test('the diary’s reasons read as sentences without internal names', () => {
  assert.equal(plainReason('must be after the opening time (opened_at)'), 'Must be after the opening time');
  assert.equal(plainReason('must not be empty'), 'Must not be empty');
  // The diary's neutral time is written as the window writes dates, not left as 2026-09-24 08:48 Europe/London.
  assert.match(
    plainReason("must not be before the question opened (2026-09-24 08:48 Europe/London); if it happened earlier, first move the question's opening time (opened_at) back"),
    /^Must not be before the question opened \((24 Sept? 2026, 08:48|Sep 24, 2026, 8:48 AM) GMT\+1\); if it happened earlier, first move the question's opening time back$/,
  );
  assert.equal(plainReason('is not a valid tag: a tag is 1–64 lower-case letters'), 'This is not a valid tag: a tag is 1–64 lower-case letters');
  assert.equal(plainReason('lists the same tag twice'), 'This lists the same tag twice');
  assert.equal(plainReason('must be event_by_deadline or state_at_deadline'), 'Must be event by deadline or state at deadline');
  assert.equal(plainReason('must not be before closes_at', { closes_at: 'Closes' }), 'Must not be before “Closes”');
});

test('each reason lands beside its field; others are listed by name, never by request path', () => {
  const placed = placeReasons(
    ['changes.closes_at: must be after the opening time (opened_at)', 'changes.tags[1]: is not a valid tag: x', 'changes.base_rate_note: must be at most 20,000 characters', 'id: not found'],
    { fields: ['closes_at', 'tags'], labels: { closes_at: 'Closes', tags: 'Tags', base_rate_note: 'Reference class' }, prefix: 'changes' },
  );
  assert.deepEqual([...placed.shown], [
    ['closes_at', 'Must be after the opening time'],
    ['tags', 'This is not a valid tag: x'],
  ]);
  assert.deepEqual(placed.elsewhere, ['Reference class: Must be at most 20,000 characters', 'id: Not found']);
  for (const line of [...placed.shown.values(), ...placed.elsewhere]) assert.doesNotMatch(line, /[a-z]+_[a-z]+/, line);
});

test('the form runs the diary’s own rules and gets every problem at once', () => {
  const lines = schemaReasons(createQuestionRequest, { title: '   ', closes_at: '', tags: ['Not A Tag'], base_rate: 2 });
  const { shown } = placeReasons(lines, { fields: ['title', 'closes_at', 'tags', 'base_rate'] });
  assert.deepEqual([...shown.keys()].sort(), ['base_rate', 'closes_at', 'tags', 'title']);
  assert.deepEqual(schemaReasons(settingsPatch, { closing_soon_hours: 24 }), []);
  assert.deepEqual(schemaReasons(settingsPatch, { closing_soon_hours: 0, overdue_after_days: 91 }), [
    'closing_soon_hours: must be at least 1 hour',
    'overdue_after_days: must be at most 90 days',
  ]);
});

test('the Brier identity turns a negative term’s operator round instead of writing − (−x)', () => {
  const rows = identityRows({ rel: 0.118, res: 0.136, unc: 0.25, wbv: 0.0004, wbc: -0.001 });
  assert.deepEqual(
    rows.map((r) => `${r.op}${score3(r.value)} ${r.symbol}`),
    ['0.118 REL', '\u22120.136 RES', '+0.250 UNC', '+0.000 WBV', '+0.001 WBC'],
  );
  // The sign edge of WBC, one step either side of zero: − for a positive WBC, − kept at 0, + below.
  const op = (wbc: number) => identityRows({ rel: 0, res: 0, unc: 0, wbv: 0, wbc })[4]!.op;
  assert.equal(op(Number.MIN_VALUE), '\u2212');
  assert.equal(op(0), '\u2212');
  assert.equal(op(-Number.MIN_VALUE), '+');
  // Summing the rows as shown gives the identity back.
  const t = { rel: 0.05, res: 0.02, unc: 0.24, wbv: 0.003, wbc: -0.002 };
  const sum = identityRows(t).reduce((acc, r) => (r.op === '\u2212' ? acc - r.value : acc + r.value), 0);
  assert.equal(sum, t.rel - t.res + t.unc + t.wbv - t.wbc);
});

test('a total cost is digit-grouped like every count, and one too large to add up says so instead of "Infinity"', () => {
  assert.equal(cost(1_234_567.891), formatCount(1_234_567.89));
  assert.notEqual(cost(1_234_567), '1234567');
  assert.equal(cost(7), '7');
  assert.equal(cost(0.125), formatCount(0.13));
  assert.equal(cost(null), 'too large to add up');
});

test('a tool\'s interval is in whole percents, and an end short of 0 or 1 is never shown as 0% or 100%', () => {
  assert.equal(formatRange(0.1723, 0.5678), '17–57%');
  assert.equal(formatRange(0, 1), '0–100%');
  assert.equal(formatRange(0.4601, 1), '46–100%');
  // 6 of 1,200 cases by the rule of succession (low and high as the helper computes them):
  // once "0–1%", as if the rate could be nil.
  assert.equal(formatRange(0.002089590132589864, 0.010277034820937546), '0.2–1%');
  assert.equal(formatRange(0.00271, 0.1109), '0.3–11%');
  assert.equal(formatRange(0.9953355411912086, 0.9998920811953182), '99.5–99.99%');
  assert.equal(formatRange(0.004, 0.006), '0.4–0.6%');
});

test('a refusal shown in a banner writes the diary’s times as the window writes dates', async () => {
  const { describeError } = await import('../../renderer/src/api/errors');
  const shown = describeError(new Error("The request was not accepted: changes.opened_at: must not be after the question's first revision (2026-11-02 09:30 Europe/London). Nothing was changed."));
  assert.match(shown, /first revision \((2 Nov 2026, 09:30|Nov 2, 2026, 9:30 AM) GMT\)\. Nothing was changed\.$/);
});

test('a score in a numeric question\'s unit always has two decimals, grouped as the locale groups digits, and a tiny one is not written as a perfect 0', () => {
  // What the Scorecard showed before: "1.9", "1.333", "0.005", "980", "9000" in one column.
  assert.deepEqual([1.9, 4 / 3, 980, 9000, 19.333333, 0].map((x) => unitScore(x, 'en-GB')), ['1.90', '1.33', '980.00', '9,000.00', '19.33', '0.00']);
  assert.equal(unitScore(1234.5, 'de-DE'), '1.234,50');
  assert.equal(unitScore(0.004, 'en-US'), 'under 0.01');
  assert.equal(unitScore(0.005, 'en-US'), '0.01');
  assert.equal(unitScore(-0, 'en-GB'), '0.00');
});
