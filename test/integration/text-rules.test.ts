/**
 * Control characters in text fields are refused with a reason naming the character, in
 * every text field of every way in (API requests, diary files, CSV), and the validator's
 * idea of an empty title agrees with the store's CHECK (length(trim(title)) > 0), so no
 * title reaches SQLite only to fail there as an "internal" error. A text over its limit is
 * refused with its length.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import fc from 'fast-check';
import * as v from '../../shared/validation';
import { exportJson, openTestDiary } from '../support/temp-diary';

const CLOSES = '2030-01-01T00:00:00Z';

test('a title of "\\u0000" is refused as invalid naming U+0000, not stored and not an internal error', async () => {
  const d = openTestDiary();
  for (const title of ['\u0000', 'a\u0000', '\u0000Quellmoor signs', ' \u0000 ']) {
    const answer = await d.service.dispatch('createQuestion', { title, closes_at: CLOSES });
    assert.equal(answer.ok, false, JSON.stringify(title));
    if (answer.ok) continue;
    assert.equal(answer.error.code, 'invalid');
    assert.match(answer.error.fields[0]!, /^title: must be one line without control characters .*\(found U\+0000 at character \d+\)$/);
  }
  assert.equal((await d.call('listQuestions', {})).total, 0);
});

test('a text over its limit is refused with the length it has, so the writer knows how much to cut', async () => {
  const d = openTestDiary();
  const refusal = async (op: 'createQuestion', req: object): Promise<string> => {
    const answer = await d.service.dispatch(op, req);
    assert.equal(answer.ok, false);
    return answer.ok ? '' : answer.error.fields.join('; ');
  };
  // Counted after trimming, as the limit is.
  assert.equal(await refusal('createQuestion', { title: `  ${'t'.repeat(704)}  `, closes_at: CLOSES }), 'title: must be at most 300 characters; it has 704');
  assert.equal(
    await refusal('createQuestion', { title: 'x', rule: 'r'.repeat(20_500), closes_at: CLOSES }),
    'rule: must be at most 20,000 characters; it has 20,500',
  );
  assert.equal((await d.call('listQuestions', {})).total, 0);
});

test('every text field refuses NUL and other C0 controls; notes keep tab and line breaks', async () => {
  const d = openTestDiary();
  const q = await d.call('createQuestion', {
    title: 'Controls',
    rule: 'Yes if\tsigned.\r\nOtherwise no.',
    base_rate_note: 'line one\nline two',
    closes_at: CLOSES,
    first_forecast: { p: 0.5, note: 'tab\there\nand a line', lenses: [{ name: 'outside view', p: 0.4 }] },
  });
  assert.equal(q.rule, 'Yes if\tsigned.\r\nOtherwise no.');
  assert.equal(q.forecasts[0].note, 'tab\there\nand a line');
  const before = exportJson(d.service);
  const refused: [string, unknown, string][] = [
    ['createQuestion', { title: 'Two\nlines', closes_at: CLOSES }, 'title'],
    ['createQuestion', { title: 'Tab\there', closes_at: CLOSES }, 'title'],
    ['createQuestion', { title: 'x', rule: 'bell\u0007', closes_at: CLOSES }, 'rule'],
    ['createQuestion', { title: 'x', base_rate_note: 'nul\u0000', closes_at: CLOSES }, 'base_rate_note'],
    ['createQuestion', { title: 'x', closes_at: CLOSES, first_forecast: { p: 0.5, note: 'esc\u001b[31m' } }, 'first_forecast.note'],
    ['updateQuestion', { id: q.id, changes: { title: 'del\u007f' } }, 'changes.title'],
    ['addForecast', { question_id: q.id, p: 0.5, note: 'form feed\u000c' }, 'note'],
    ['addForecast', { question_id: q.id, p: 0.5, lenses: [{ name: 'in\nside', p: 0.5 }] }, 'lenses[0].name'],
    ['updateForecast', { id: q.forecasts[0].id, note: 'vertical tab\u000b' }, 'note'],
    ['addReference', { question_id: q.id, p: 0.5, source: 'desk\u0000' }, 'source'],
    ['resolveQuestion', { id: q.id, outcome: 'yes', note: '\u0000' }, 'note'],
    ['getQuestion', { id: `${q.id}\u0000` }, 'id'],
    ['listQuestions', { text: 'find\u0000me' }, 'text'],
  ];
  for (const [op, request, field] of refused) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, `${op} ${JSON.stringify(request)}`);
    if (answer.ok) continue;
    assert.equal(answer.error.code, 'invalid', op);
    assert.match(answer.error.fields[0]!, new RegExp(`^${field.replace(/[[\]]/g, '\\$&')}: must .*control characters`), op);
  }
  assert.equal(exportJson(d.service), before);
});

test('diary files and CSV are held to the same text rules, naming the record or row', async () => {
  const d = openTestDiary();
  const file = JSON.stringify({
    format: 'forelog-diary',
    version: 1,
    questions: [
      { title: 'Fine', closes_at: CLOSES, forecasts: [] },
      { id: 'q\u0000', title: 'Bad id', closes_at: CLOSES, forecasts: [] },
    ],
  });
  const json = await d.service.dispatch('importText', { format: 'json', text: file });
  assert.equal(json.ok, false);
  if (!json.ok) assert.match(json.error.message, /Question 2 \(questions\[1\], “Bad id”\) is not valid: field id: must be one line without control characters/);
  const csv = `title,closes_at,forecast_at,p,note\r\nFine,${CLOSES},2026-01-01T00:00:00Z,0.5,"a \u0000 note"\r\n`;
  const fromCsv = await d.service.dispatch('importText', { format: 'csv', text: csv });
  assert.equal(fromCsv.ok, false);
  if (!fromCsv.ok) assert.match(fromCsv.error.message, /control characters/);
  assert.equal((await d.call('listQuestions', {})).total, 0);
});

test('half of a surrogate pair is refused in every way in; whole characters outside the BMP are kept exactly', async () => {
  // SQLite stores UTF-8, which cannot hold an unpaired surrogate: "a\ud800b" came back as
  // "a\ufffd\ufffd\ufffdb", another and longer text (a 300-character title of them would
  // export as 900 characters that import then refuses).
  const d = openTestDiary();
  const q = await d.call('createQuestion', { title: 'Rocket \u{1F680} launch', closes_at: CLOSES, first_forecast: { p: 0.5, note: '\u{1F600}' } });
  assert.equal((await d.call('getQuestion', { id: q.id })).title, 'Rocket \u{1F680} launch');
  assert.equal(q.forecasts[0].note, '\u{1F600}');
  const before = exportJson(d.service);
  const refused: [string, unknown, string, string][] = [
    ['createQuestion', { title: 'a\ud800b', closes_at: CLOSES }, 'title', 'U+D800 at character 2'],
    ['createQuestion', { title: 'x', rule: 'tail \udc00', closes_at: CLOSES }, 'rule', 'U+DC00 at character 6'],
    ['addForecast', { question_id: q.id, p: 0.5, note: '\ude00\ud83d' }, 'note', 'U+DE00 at character 1'],
    ['addReference', { question_id: q.id, p: 0.5, source: 'desk\ud83d' }, 'source', 'U+D83D at character 5'],
  ];
  for (const [op, request, field, found] of refused) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, op);
    if (!answer.ok) assert.equal(answer.error.fields[0], `${field}: must be Unicode text: found ${found}, half of a surrogate pair without its other half; remove it or write the whole character`, op);
  }
  const file = '{"format":"forelog-diary","version":1,"questions":[{"title":"Half \\ud800","closes_at":"2030-01-01T00:00:00Z","forecasts":[]}]}';
  const json = await d.service.dispatch('importText', { format: 'json', text: file });
  assert.equal(json.ok, false);
  if (!json.ok) assert.match(json.error.message, /Question 1 \(questions\[0\]\) .*field title: must be Unicode text: found U\+D800 at character 6/);
  const csv = `title,closes_at,forecast_at,p,lenses\r\nFine,${CLOSES},2026-01-01T00:00:00Z,0.5,"[{""name"":""in\\udc00"",""p"":0.5}]"\r\n`;
  const fromCsv = await d.service.dispatch('importText', { format: 'csv', text: csv });
  assert.equal(fromCsv.ok, false);
  if (!fromCsv.ok) assert.match(fromCsv.error.message, /Row 2, column lenses: \[0\]\.name: must be Unicode text: found U\+DC00/);
  assert.equal(exportJson(d.service), before);
});

test('a title, source, lens name or option of invisible characters only is refused in every way in, naming the field', async () => {
  // Zero-width space, joiners, word joiner, soft hyphen, variation selector, Hangul filler,
  // blank Braille: trim() keeps them all, so such a title was accepted and showed as nothing.
  const d = openTestDiary();
  const q = await d.call('createQuestion', { title: 'Visible', closes_at: CLOSES });
  const before = exportJson(d.service);
  const INVISIBLE = ' \u200b\u200c\u200d\u2060\u00ad\ufe0f\u3164\u2800 ';
  const refused: [string, unknown, string][] = [
    ['createQuestion', { title: INVISIBLE, closes_at: CLOSES }, 'title'],
    ['createQuestion', { title: '\u200b', closes_at: CLOSES }, 'title'],
    ['updateQuestion', { id: q.id, changes: { title: '\u2060\u2060' } }, 'changes.title'],
    ['addReference', { question_id: q.id, p: 0.5, source: '\u200b' }, 'source'],
    ['addForecast', { question_id: q.id, p: 0.5, lenses: [{ name: '\u200d', p: 0.5 }] }, 'lenses[0].name'],
    ['createQuestion', { type: 'choice', title: 'Pick', closes_at: CLOSES, options: ['Kestrowe', '\u200b'] }, 'options[1]'],
  ];
  for (const [op, request, field] of refused) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, `${op} ${JSON.stringify(request)}`);
    if (answer.ok) continue;
    assert.equal(answer.error.code, 'invalid', op);
    assert.match(answer.error.fields.join('\n'), new RegExp(`^${field.replace(/[[\]]/g, '\\$&')}: .*only invisible characters`, 'm'), op);
  }
  const file = JSON.stringify({ format: 'forelog-diary', version: 1, questions: [{ id: 'z1', title: '\u200b\u200b', closes_at: CLOSES, forecasts: [] }] });
  const json = await d.service.dispatch('importText', { format: 'json', text: file });
  assert.equal(json.ok, false);
  if (!json.ok) assert.match(json.error.message, /Question 1 \(questions\[0\], id "z1"\) .*field title: must not be empty: it holds only invisible characters/);
  const csv = `title,closes_at,forecast_at,p\r\n\u200b,${CLOSES},2026-01-01T00:00:00Z,0.5\r\n`;
  const fromCsv = await d.service.dispatch('importText', { format: 'csv', text: csv });
  assert.equal(fromCsv.ok, false);
  if (!fromCsv.ok) assert.match(fromCsv.error.message, /Row 2, column title: .*only invisible characters/);
  assert.equal(exportJson(d.service), before);
  // A visible title keeps its invisible characters exactly (a joiner inside an emoji, a soft hyphen).
  const kept = await d.call('createQuestion', { title: 'Team \u{1F469}\u200d\u{1F4BB} re\u00adview', closes_at: CLOSES });
  assert.equal(kept.title, 'Team \u{1F469}\u200d\u{1F4BB} re\u00adview');
});

/** Strings rich in the characters where the two notions of "empty" could differ. */
const tricky = fc.string({
  unit: fc.oneof(
    fc.constantFrom(' ', '\t', '\n', '\r', '\u0000', '\u000b', '\u00a0', '\u2028', '\u3000', '\ufeff', '\u200b', '\u0085', '\u007f'),
    fc.string({ unit: 'binary', minLength: 1, maxLength: 1 }),
  ),
  maxLength: 8,
});

test('a title the validator accepts is one the store accepts: SQLite finds length(trim(title)) > 0', () => {
  const d = openTestDiary();
  const storeCheck = d.service.store.read.prepare('SELECT length(trim(?)) > 0 AS filled');
  fc.assert(
    fc.property(tricky, (raw) => {
      const r = v.title.safeParse(raw);
      if (r.success) assert.equal((storeCheck.get(r.data) as { filled: number }).filled, 1, JSON.stringify(raw));
    }),
    { seed: 8_2026, numRuns: 2000 },
  );
});

test('whatever the title, creating a question is stored or refused as invalid, never an internal error', async () => {
  const d = openTestDiary();
  await fc.assert(
    fc.asyncProperty(tricky, async (title) => {
      const answer = await d.service.dispatch('createQuestion', { title, closes_at: CLOSES });
      if (!answer.ok) assert.equal(answer.error.code, 'invalid', `${JSON.stringify(title)}: ${answer.error.message}`);
    }),
    { seed: 8_2026, numRuns: 300 },
  );
});
