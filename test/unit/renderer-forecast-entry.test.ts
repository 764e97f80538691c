/**
 * How a choice or numeric forecast is typed (renderer/src/forecastEntry): the live total
 * and its edge at 100 % ± 1e-6 (the contract's tolerance, shared/choice-vector.ts), spreading
 * the rest over blank options, and refusing a numeric set that decreases with the level
 * with a message that names the two levels; a question's options and levels as typed; the
 * few words lists show for a choice or numeric forecast.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { choiceTotal, readChoiceForecast, spreadRest, totalText } from '../../renderer/src/forecastEntry/choiceEntry';
import {
  levelLabel,
  levelName,
  readNumericForecast,
  readValue,
} from '../../renderer/src/forecastEntry/numericEntry';
import { LEVEL_PRESETS, levelsText, readOptionBaseRates, readOptions } from '../../renderer/src/questionTypes/definition';
import { choiceSummary, lastForecastText, numericSummary, resolvedText } from '../../renderer/src/questionTypes/summaries';
import { quantileLevelsProblem } from '../../shared/quantile-levels';

test('the live total adds the filled boxes and lists the blank and the unreadable ones', () => {
  assert.deepEqual(choiceTotal(['50', '', '30']), { sum: 0.8, blanks: [1], invalid: [], complete: false });
  assert.deepEqual(choiceTotal(['50', 'abc', '150']).invalid, [1, 2]);
  assert.equal(choiceTotal(['10', '20', '70']).complete, true, '0.1 + 0.2 + 0.7 is 1 within 1e-6, not exactly 1');
  assert.equal(totalText(choiceTotal(['33.333', '33.333', '']).sum), '66.67%');
});

test('a choice forecast must add to 100 %: the edge is 1e-6 either side, as the contract has it', () => {
  assert.deepEqual(readChoiceForecast(['50', '30', '20']), { ok: true, value: [0.5, 0.3, 0.2] });
  const short = readChoiceForecast(['50', '30', '10']);
  assert.equal(short.ok, false);
  assert.equal(!short.ok && short.error, 'The chances must add to 100%; they add to 90% (10% short).');
  // 1e-6 of a probability is 0.0001 of a percent; the edge itself is not a binary number
  // (0.499999 + 0.5 misses 1 − 1e-6 by rounding), so: 0.00009 % off is accepted, 0.00011 % refused.
  assert.equal(readChoiceForecast(['49.99991', '50']).ok, true);
  assert.equal(readChoiceForecast(['50.00009', '50']).ok, true);
  assert.equal(readChoiceForecast(['49.99989', '50']).ok, false);
  assert.equal(readChoiceForecast(['50.00011', '50']).ok, false);
  // A refused total is never shown rounded to 100%: the live total and the message give the
  // digits that show it is off, and the message says by how much.
  const under = readChoiceForecast(['49.99989', '50']);
  assert.equal(!under.ok && under.error, 'The chances must add to 100%; they add to 99.99989% (0.00011% short).');
  assert.equal(totalText(choiceTotal(['49.99989', '50']).sum), '99.99989%');
  const over = readChoiceForecast(['50.00011', '50']);
  assert.equal(!over.ok && over.error, 'The chances must add to 100%; they add to 100.00011% (0.00011% over).');
  assert.equal(totalText(choiceTotal(['50.00011', '50']).sum), '100.00011%');
  assert.equal(totalText(choiceTotal(['49.99991', '50']).sum), '100%');
});

test('shares of 1 typed into the percent boxes are refused with how to write them', () => {
  const fractions = readChoiceForecast(['0.6', '0.3', '0.1']);
  assert.equal(!fractions.ok && fractions.error, 'The chances must add to 100%; they add to 1% (99% short). The boxes take percents: write 60 for 0.6.');
  // Percents that merely fall short get no such hint, nor do fractions that do not add to 1.
  const short = readChoiceForecast(['0.5', '0.3']);
  assert.equal(!short.ok && short.error, 'The chances must add to 100%; they add to 0.8% (99.2% short).');
  const certain = readChoiceForecast(['0', '1', '0']);
  assert.equal(!certain.ok && certain.error, 'The chances must add to 100%; they add to 1% (99% short). The boxes take percents: write 100 for 1.');
});

test('a blank or unreadable option is named, and nothing else is said until it is fixed', () => {
  const blank = readChoiceForecast(['50', '', '50']);
  assert.equal(!blank.ok && blank.error, 'Option 2: give a chance, 0 if none, or use “Spread the rest”.');
  assert.deepEqual(blank.problems?.options, { 1: 'give a chance, 0 if none, or use “Spread the rest”' });
  const over = readChoiceForecast(['50', '101']);
  assert.equal(!over.ok && over.error, 'Option 2: must be between 0% and 100%.');
});

test('spreading the rest shares what is left evenly over the blank boxes, adding to exactly 100', () => {
  assert.deepEqual(spreadRest(['10', '', '', '']), { ok: true, texts: ['10', '30', '30', '30'] });
  assert.deepEqual(spreadRest(['', '', '']), { ok: true, texts: ['33.34', '33.33', '33.33'] });
  assert.deepEqual(spreadRest(['12.345', '', '']), { ok: true, texts: ['12.345', '43.828', '43.827'] });
  assert.deepEqual(spreadRest(['100', '']), { ok: true, texts: ['100', '0'] });
  // Every spread result is accepted as it stands.
  for (const texts of [['', '', ''], ['7', '', '', '', '', '', ''], ['33.3', '', '']]) {
    const spread = spreadRest(texts);
    assert.ok(spread.ok);
    assert.equal(readChoiceForecast(spread.texts).ok, true, texts.join('|'));
  }
});

test('spreading refuses with a reason: no blank box, a bad box, already over 100 %', () => {
  assert.deepEqual(spreadRest(['50', '50']), { ok: false, reason: 'Leave blank the options you want the rest spread over.' });
  assert.deepEqual(spreadRest(['x', '']), { ok: false, reason: 'Fix option 1 first: must be a number of percent, e.g. 35.' });
  assert.deepEqual(spreadRest(['70', '40', '']), {
    ok: false,
    reason: 'The filled options already add to 110%; lower some so they add to at most 100%.',
  });
});

test('levels are named as percentiles', () => {
  assert.equal(levelName(0.05), 'P5');
  assert.equal(levelName(0.9), 'P90');
  assert.deepEqual([0.1, 0.5, 0.9].map((l, _, all) => levelLabel(l, all)), ['P10 (low)', 'P50 (median)', 'P90 (high)']);
  // Five levels: one low and one high, the quartiles by their names.
  const five = [0.05, 0.25, 0.5, 0.75, 0.95];
  assert.deepEqual(five.map((l) => levelLabel(l, five)), ['P5 (low)', 'P25', 'P50 (median)', 'P75', 'P95 (high)']);
});

test('a numeric forecast must not decrease with the level; the message names the two levels', () => {
  const levels = [0.1, 0.5, 0.9];
  assert.deepEqual(readNumericForecast(['9', '13', '20'], levels, 'number', 'weeks'), { ok: true, value: [9, 13, 20] });
  assert.equal(readNumericForecast(['13', '13', '13'], levels, 'number', 'weeks').ok, true, 'equal neighbours are allowed');
  const down = readNumericForecast(['9', '13', '12'], levels, 'number', 'weeks');
  assert.equal(!down.ok && down.error, 'P90 (12 weeks) is below P50 (13 weeks); each value must be at least the one before it.');
  assert.deepEqual(down.problems?.levels, { 2: down.problems?.order });
  // One ulp below the previous value is decreasing.
  const ulp = readNumericForecast(['1', String(1 - Number.EPSILON / 2), '2'], levels, 'number', '');
  assert.equal(ulp.ok, false);
  const blank = readNumericForecast(['9', '', '20'], levels, 'number', 'weeks');
  assert.equal(!blank.ok && blank.error, 'P50: enter a value.');
  // A number beyond the largest a diary holds is told so, not called "not a number"; only
  // decimal notation is a number (Number() would read "0x1A" as 26 and "" as 0).
  assert.deepEqual(readValue('1e999', 'number'), { ok: false, error: 'is too large a number to hold (beyond about ±1.8e308)' });
  assert.deepEqual(readValue('-1e400', 'number'), { ok: false, error: 'is too large a number to hold (beyond about ±1.8e308)' });
  assert.deepEqual(readValue('-1.7976931348623157e308', 'number'), { ok: true, value: -Number.MAX_VALUE });
  assert.deepEqual(readValue('5e-324', 'number'), { ok: true, value: 5e-324 });
  for (const text of ['0x1A', '0b11', 'Infinity', '1,500', '12.5.1']) assert.deepEqual(readValue(text, 'number'), { ok: false, error: 'must be a number, e.g. 12.5' }, text);
});

test('a date question reads calendar days and says "before" for a decreasing set', () => {
  assert.deepEqual(readValue('2026-03-31', 'date'), { ok: true, value: 20543 });
  assert.deepEqual(readValue('2026-02-30', 'date'), { ok: false, error: 'must be a calendar date' });
  const levels = [0.1, 0.5, 0.9];
  assert.deepEqual(readNumericForecast(['2026-03-01', '2026-03-31', '2026-05-01'], levels, 'date', ''), {
    ok: true,
    value: [20513, 20543, 20574],
  });
  const back = readNumericForecast(['2026-03-31', '2026-03-30', '2026-05-01'], levels, 'date', '');
  // Dates show in the user's own format (this process's locale; see renderer/src/dates.ts).
  const day = (iso: string) => new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(Date.parse(iso));
  assert.equal(!back.ok && back.error, `P50 (${day('2026-03-30')}) is before P10 (${day('2026-03-31')}); each value must be at least the one before it.`);
});

test('a choice question needs 2 to 12 distinct, non-empty options', () => {
  assert.deepEqual(readOptions([' Kestrowe ', 'Ambledene', 'Neither']), { ok: true, value: ['Kestrowe', 'Ambledene', 'Neither'] });
  const repeat = readOptions(['Kestrowe', 'Ambledene', 'Kestrowe ']);
  assert.equal(!repeat.ok && repeat.error, 'Option 3: repeats option 1; each option must differ.');
  // Labels that look the same (a zero-width space more, an accent written as a separate mark) are the same option.
  const lookAlike = readOptions(['Kestrowe', 'Café', 'Kestrowe\u200b', 'Cafe\u0301']);
  assert.deepEqual(!lookAlike.ok && lookAlike.problems, { 2: 'repeats option 1; each option must differ', 3: 'repeats option 2; each option must differ' });
  const empty = readOptions(['Kestrowe', ' ']);
  assert.equal(!empty.ok && empty.error, 'Option 2: write the option, or remove it.');
  assert.equal(readOptions(['Only']).ok, false);
  assert.equal(readOptions(Array.from({ length: 12 }, (_, k) => `o${k}`)).ok, true);
  const thirteen = readOptions(Array.from({ length: 13 }, (_, k) => `o${k}`));
  assert.equal(!thirteen.ok && thirteen.error, 'A choice question has 2 to 12 options; this one has 13.');
  assert.deepEqual(readOptionBaseRates(['', '', '']), { ok: true, value: null });
  assert.equal(readOptionBaseRates(['50', '', '']).ok, false, 'base rates are all given or none');
});

test('every level set offered is one the diary accepts', () => {
  for (const preset of LEVEL_PRESETS) assert.equal(quantileLevelsProblem(preset.levels), null, preset.value);
  assert.equal(levelsText([0.1, 0.5, 0.9]), 'P10 / P50 / P90 (an 80% range)');
  assert.equal(levelsText([0.5]), 'P50 (the median only)');
});

test('a choice or numeric forecast in a few words for lists', () => {
  assert.equal(choiceSummary(['Kestrowe', 'Ambledene', 'Neither'], [0.3, 0.6, 0.1]), 'Ambledene 60%');
  assert.equal(choiceSummary(['A', 'B'], [0.5, 0.5]), 'A 50%', 'a tie goes to the first option');
  assert.equal(numericSummary([0.1, 0.5, 0.9], [9, 13, 20], 'number', 'weeks'), '13 weeks (9 – 20)');
  assert.equal(numericSummary([0.5], [13], 'number', ''), '13');
  // Numbers as the locale groups them, to 12 significant digits (no binary noise: 0.1 + 0.2 reads 0.3).
  assert.equal(numericSummary([0.1, 0.5, 0.9], [1400, 1500, 1600.25], 'number', '£k', 'en-GB'), '1,500 £k (1,400 – 1,600.25)');
  assert.equal(numericSummary([0.5], [0.1 + 0.2], 'number', '', 'en-GB'), '0.3');
  assert.equal(numericSummary([0.5], [-1234567.5], 'number', 'EUR', 'de-DE'), '-1.234.567,5 EUR');
  assert.equal(numericSummary([0.5], [1.5e21], 'number', '', 'en-GB'), '1,500,000,000,000,000,000,000');
  // Dates in the user's own format: day/month/year in a UK locale, month first in a US one.
  assert.equal(numericSummary([0.1, 0.5, 0.9], [20513, 20543, 20574], 'date', '', 'en-GB'), '31 Mar 2026 (1 Mar 2026 – 1 May 2026)');
  assert.equal(numericSummary([0.5], [20543], 'date', '', 'en-US'), 'Mar 31, 2026');
  assert.equal(numericSummary([0.5], [-0], 'number', '', 'en-GB'), '0', 'no minus sign on zero');
});

test('the Questions list shows the last forecast of every type', () => {
  const none = { options: null, last_probs: null, levels: null, last_quantiles: null, value_kind: null, unit: null };
  assert.equal(lastForecastText({ ...none, type: 'binary', last_p: 0.35 }), '35%');
  assert.equal(lastForecastText({ ...none, type: 'choice', last_p: null, options: ['A', 'B'], last_probs: [0.2, 0.8] }), 'B 80%');
  assert.equal(lastForecastText({ ...none, type: 'choice', last_p: null, options: ['A', 'B'] }), '—');
  assert.equal(
    lastForecastText({ ...none, type: 'numeric', last_p: null, levels: [0.1, 0.5, 0.9], last_quantiles: ['2026-03-01', '2026-03-31', '2026-05-01'], value_kind: 'date', unit: '' }, 'en-GB'),
    '31 Mar 2026 (1 Mar 2026 – 1 May 2026)',
  );
});

test('the Questions list says how a choice or numeric question resolved: the option, the value or the date', () => {
  const none = { options: null, value_kind: null, unit: null, resolved_option: null, resolved_value: null };
  assert.equal(resolvedText({ ...none, type: 'choice', options: ['Kestrowe', 'Ambledene'], resolved_option: 1 }), 'Ambledene');
  assert.equal(resolvedText({ ...none, type: 'numeric', value_kind: 'number', unit: 'pallets', resolved_value: 2940 }, 'en-GB'), '2,940 pallets');
  assert.equal(resolvedText({ ...none, type: 'numeric', value_kind: 'date', unit: '', resolved_value: '2026-11-12' }, 'en-GB'), '12 Nov 2026');
  // Not resolved to an option or value (open, void), or yes/no: nothing to add.
  assert.equal(resolvedText({ ...none, type: 'choice', options: ['A', 'B'] }), null);
  assert.equal(resolvedText({ ...none, type: 'binary' }), null);
});
