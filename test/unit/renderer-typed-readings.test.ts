/**
 * The plain readings of the Scorecard's choice and numeric sections
 * (renderer/src/screens/scorecard/typedReadings.ts), built from the engine's own rows:
 * every sentence gives its count and sample size, and the Wilson interval where the figure has one;
 * and Hindsight's readings of a choice miss and a numeric surprise (screens/hindsight/typedWording.ts).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { wilsonInterval } from '../../shared/scoring/intervals';
import {
  choiceSkillSentence,
  coverageReading,
  coverageSentence,
  coverageVerdict,
  gapSentence,
  quantileSentence,
  revisingSentence,
  topChoiceSentence,
} from '../../renderer/src/screens/scorecard/typedReadings';
import { choiceVerdictSentence, surpriseSentence } from '../../renderer/src/screens/hindsight/typedWording';

function row(successes: number, n: number) {
  const [wilson_low, wilson_high] = wilsonInterval(successes, n);
  return { n, rate: successes / n, wilson_low, wilson_high };
}


/** A calendar day in the user's own format (this process's locale), as the screens show it. */
const day = (iso: string) => new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(Date.parse(iso));
test('coverage reads as the issue words it, with the Wilson interval', () => {
  // Issue 9's example: 9 in 20 is 45 %, Wilson 95 % interval 26–66 % (Wilson 1927; values from
  // the engine's wilsonInterval, which test/unit/scoring-*.test.ts checks against published ones).
  const coverage = { level: 0.8, inside: 9, ...row(9, 20) };
  assert.equal(coverageSentence(coverage), 'Your 80% ranges caught the outcome 9 times in 20 (45%, 95% interval 26–66%).');
  assert.equal(coverageVerdict(coverage), 'too narrow: widen these ranges');
  assert.equal(coverageVerdict({ level: 0.8, inside: 16, ...row(16, 20) }), 'consistent with 80%');
  assert.equal(coverageVerdict({ level: 0.5, inside: 20, ...row(20, 20) }), 'wider than needed');
  // One reading wherever it is shown: the verdict is a sentence of its own, not a bracket after a full stop.
  assert.equal(coverageReading(coverage), 'Your 80% ranges caught the outcome 9 times in 20 (45%, 95% interval 26–66%). That is too narrow: widen these ranges.');
});

test('quantile calibration names the level and what a calibrated one would show', () => {
  assert.equal(
    quantileSentence({ tau: 0.9, below: 17, ...row(17, 20) }),
    'The outcome fell at or below your P90 17 times in 20 (85%, 95% interval 64–95%); a calibrated P90 would be 90%.',
  );
});

test('top choice: confidence against hit rate, with the count', () => {
  const [wilson_low, wilson_high] = wilsonInterval(6, 10);
  assert.equal(
    topChoiceSentence({ n: 10, mean_confidence: 0.72, hit_rate: 0.6, wilson_low, wilson_high }),
    'Your top choice carried 72% on average and came true 6 times in 10 (60%, 95% interval 31–83%): less often than you said.',
  );
  assert.equal(topChoiceSentence({ n: 0, mean_confidence: null, hit_rate: null, wilson_low: null, wilson_high: null }), 'No choice question is scored yet.');
});

test('skill and revising read as better or worse, and say why a figure is missing', () => {
  assert.equal(choiceSkillSentence('vs_uniform', 0.25, 8), 'Better than spreading evenly over the options: your Brier score was 25% lower.');
  assert.equal(choiceSkillSentence('vs_first', -0.1, 8), 'Worse than your first forecasts left unrevised: your Brier score was 10% higher.');
  assert.match(choiceSkillSentence('vs_base_rate', null, 8), /option base rates/);
  assert.equal(
    revisingSentence(0.8, 12),
    'Revising helped: your final ranges scored 0.80 times your first ones (geometric mean over questions where both score above 0; 12 questions scored).',
  );
  assert.match(revisingSentence(null, 1), /1 question scored/);
});

test('where outcomes landed: each gap with its count, share and expected share', () => {
  const gaps = [
    { n: 6, expected: 0.1 },
    { n: 4, expected: 0.4 },
    { n: 4, expected: 0.4 },
    { n: 6, expected: 0.1 },
  ];
  assert.equal(gapSentence([0.1, 0.5, 0.9], gaps, 0), '6 of 20 landed below P10 (30%; expected 10%).');
  assert.equal(gapSentence([0.1, 0.5, 0.9], gaps, 1), '4 of 20 landed between P10 and P50 (20%; expected 40%).');
  assert.equal(gapSentence([0.1, 0.5, 0.9], gaps, 3), '6 of 20 landed above P90 (30%; expected 10%).');
});

test('Hindsight reads a choice miss and a numeric surprise in one sentence each', () => {
  assert.equal(
    choiceVerdictSentence({ options: ['Kestrowe', 'Ambledene', 'Neither'], top_option: 0, top_p: 0.85, outcome_option: 1, outcome_p: 0.1, verdict: 'miss' }),
    'You gave Kestrowe 85%; Ambledene came true, at 10%.',
  );
  assert.equal(
    surpriseSentence({ value: 26, low: 10, high: 16, level: 0.8, side: 'above', distance: 10, size: 10 / 6, unit: 'weeks', value_kind: 'number' }),
    '26 weeks: 10 weeks above your 80% range (10 weeks – 16 weeks); 1.7 times its width outside.',
  );
  assert.equal(
    surpriseSentence({ value: '2026-12-20', low: '2026-11-20', high: '2026-12-15', level: 0.9, side: 'above', distance: 5, size: 5 / 25, unit: '', value_kind: 'date' }),
    `${day('2026-12-20')}: 5 days above your 90% range (${day('2026-11-20')} – ${day('2026-12-15')}); 0.2 times its width outside.`,
  );
});
