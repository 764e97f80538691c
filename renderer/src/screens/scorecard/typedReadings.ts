/**
 * The plain readings of the choice and numeric Scorecard sections, one sentence per figure,
 * each with the number of questions it rests on (definitions: SCORING.md "Multiple-choice
 * questions" and "Numeric questions"). Pure, so the tests read the same sentences the user does.
 */
import type {
  ChoiceSkillScores,
  CoverageRow,
  LandedGap,
  QuantileCalibrationRow,
  TopChoiceSummary,
} from '../../../../shared/scoring/types';
import { levelName } from '../../forecastEntry/numericEntry';
import { pct, pctInterval, questions, score2 } from './format';
import { formatCount } from '../../dates';

/** "9 times in 20". */
function times(k: number, n: number): string {
  return `${k} time${k === 1 ? '' : 's'} in ${n}`;
}

/** "(45 %, 95 % interval 26–66 %)" — the share and its Wilson interval. */
function shareWithInterval(rate: number, low: number, high: number): string {
  return `(${pct(rate)}, 95% interval ${pctInterval(low, high)})`;
}

/** "Your 80% ranges caught the outcome 9 times in 20 (45%, 95% interval 26–66%)." */
export function coverageSentence(row: CoverageRow): string {
  return `Your ${pct(row.level)} ranges caught the outcome ${times(row.inside, row.n)} ${shareWithInterval(row.rate, row.wilson_low, row.wilson_high)}.`;
}

/** What a coverage row says about width: too narrow, too wide, or consistent with its level. */
export function coverageVerdict(row: CoverageRow): string {
  if (row.wilson_high < row.level) return 'too narrow: widen these ranges';
  if (row.wilson_low > row.level) return 'wider than needed';
  return `consistent with ${pct(row.level)}`;
}

/**
 * The sentence and its verdict as one reading, "… (45%, 95% interval 26–66%). That is too
 * narrow: widen these ranges." — the tile and the chart's list say it the same way, never as
 * a second bracket after the sentence's full stop.
 */
export function coverageReading(row: CoverageRow): string {
  return `${coverageSentence(row)} That is ${coverageVerdict(row)}.`;
}

/** "The outcome fell at or below your P90 17 times in 20 (85%, 95% interval 64–95%); a calibrated P90 would be 90%." */
export function quantileSentence(row: QuantileCalibrationRow): string {
  const name = levelName(row.tau);
  return `The outcome fell at or below your ${name} ${times(row.below, row.n)} ${shareWithInterval(row.rate, row.wilson_low, row.wilson_high)}; a calibrated ${name} would be ${pct(row.tau)}.`;
}

/** "Your top choice carried 72% on average and came true 6 times in 10 (60%, 95% interval 31–83%)." */
export function topChoiceSentence(top: TopChoiceSummary): string {
  if (top.n === 0 || top.hit_rate === null || top.mean_confidence === null) return 'No choice question is scored yet.';
  const hits = Math.round(top.hit_rate * top.n);
  const gap = top.mean_confidence - top.hit_rate;
  const verdict = Math.abs(gap) < 0.05 ? 'about as often as you said' : gap > 0 ? 'less often than you said' : 'more often than you said';
  return (
    `Your top choice carried ${pct(top.mean_confidence)} on average and came true ${times(hits, top.n)} ` +
    `${shareWithInterval(top.hit_rate, top.wilson_low ?? 0, top.wilson_high ?? 1)}: ${verdict}.`
  );
}

/** One skill score in words, against what it compares. */
export function choiceSkillSentence(key: keyof ChoiceSkillScores, value: number | null, n: number): string {
  const against = {
    vs_uniform: 'spreading evenly over the options',
    vs_base_rate: 'your stated option base rates',
    vs_first: 'your first forecasts left unrevised',
  }[key];
  if (value === null) {
    return key === 'vs_base_rate'
      ? 'No scored choice question here has option base rates, or they scored a perfect 0.'
      : `Nothing to compare against ${against} (${questions(n)}).`;
  }
  if (value === 0) return `Exactly as good as ${against}.`;
  const better = value > 0;
  return `${better ? 'Better' : 'Worse'} than ${against}: your Brier score was ${pct(Math.abs(value))} ${better ? 'lower' : 'higher'}.`;
}

/** "Revising helped: your final ranges scored 0.80 times your first ones (12 questions)." */
export function revisingSentence(ratio: number | null, n: number): string {
  if (ratio === null) return `No question here has both a first and a final range with a score above 0 (${questions(n)} scored).`;
  // Two decimals are shown, so a ratio that rounds to 1.00 reads as no change.
  const verdict = ratio < 0.995 ? 'Revising helped' : ratio >= 1.005 ? 'Revising hurt' : 'Revising made little difference';
  return `${verdict}: your final ranges scored ${score2(ratio)} times your first ones (geometric mean over questions where both score above 0; ${questions(n)} scored).`;
}

/** A gap of "where outcomes landed" by its edges: "below P10", "between P10 and P50", "above P90". */
export function gapName(levels: readonly number[], k: number): string {
  if (k === 0) return `below ${levelName(levels[0]!)}`;
  if (k === levels.length) return `above ${levelName(levels[levels.length - 1]!)}`;
  return `between ${levelName(levels[k - 1]!)} and ${levelName(levels[k]!)}`;
}

/** "3 of 20 landed below P10 (15%; expected 10%)." */
export function gapSentence(levels: readonly number[], gaps: readonly LandedGap[], k: number): string {
  const total = gaps.reduce((sum, g) => sum + g.n, 0);
  const gap = gaps[k]!;
  return `${formatCount(gap.n)} of ${formatCount(total)} landed ${gapName(levels, k)} (${pct(total ? gap.n / total : null)}; expected ${pct(gap.expected)}).`;
}
