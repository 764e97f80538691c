/**
 * A choice or numeric question's definition as typed in Quick add or Edit: the options of a
 * choice question, the quantile levels of a numeric one, and the plain words for each type.
 * The rules themselves live in shared/choice-vector.ts and shared/quantile-levels.ts; this
 * module reads the boxes and says in a sentence what to fix.
 */
import { MAX_OPTIONS, MIN_OPTIONS } from '../../../shared/choice-vector';
import { DEFAULT_QUANTILE_LEVELS } from '../../../shared/quantile-levels';
import { optionLook } from '../../../shared/validation';
import type { Parsed } from '../percent';
import { readChoiceForecast, type ChoiceProblems } from '../forecastEntry/choiceEntry';
import { levelName } from '../forecastEntry/numericEntry';

export type QuestionType = 'binary' | 'choice' | 'numeric';

export const TYPE_CHOICES: readonly { value: QuestionType; label: string }[] = [
  { value: 'binary', label: 'Yes / no' },
  { value: 'choice', label: 'Multiple choice' },
  { value: 'numeric', label: 'Number or date' },
];

export const TYPE_HINTS: Readonly<Record<QuestionType, string>> = {
  binary: 'A chance that it happens.',
  choice: 'Exactly one of 2 to 12 options comes true; give each a chance.',
  numeric: 'A quantity or a date; give a range (low, median, high).',
};

export { MAX_OPTIONS, MIN_OPTIONS };

/** The level sets offered when a numeric question is created (each valid by shared/quantile-levels.ts). */
export const LEVEL_PRESETS: readonly { value: string; levels: readonly number[] }[] = [
  DEFAULT_QUANTILE_LEVELS,
  [0.05, 0.5, 0.95],
  [0.25, 0.5, 0.75],
  [0.1, 0.25, 0.5, 0.75, 0.9],
  [0.05, 0.25, 0.5, 0.75, 0.95],
  [0.5],
].map((levels) => ({ value: levels.join(','), levels }));

/** "P10 / P50 / P90 (an 80% range)" for the level picker. */
export function levelsText(levels: readonly number[]): string {
  const names = levels.map(levelName).join(' / ');
  if (levels.length < 2) return `${names} (the median only)`;
  const width = Math.round((levels[levels.length - 1]! - levels[0]!) * 100);
  return `${names} (${width === 80 ? 'an' : 'a'} ${width}% range)`;
}

/**
 * The option boxes as labels, or what is wrong: fewer than 2 or more than 12, an empty
 * label, a label given twice (compared trimmed, as saved, and as it looks: `optionLook`).
 */
export function readOptions(texts: readonly string[]): Parsed<string[]> & { problems?: Record<number, string> } {
  const labels = texts.map((t) => t.trim());
  const looks = labels.map(optionLook);
  const problems: Record<number, string> = {};
  labels.forEach((label, k) => {
    if (label === '') problems[k] = 'write the option, or remove it';
    else {
      const first = looks.indexOf(looks[k]!);
      if (first < k) problems[k] = `repeats option ${first + 1}; each option must differ`;
    }
  });
  const firstBad = Object.keys(problems)[0];
  if (firstBad !== undefined) {
    const k = Number(firstBad);
    return { ok: false, error: `Option ${k + 1}: ${problems[k]}.`, problems };
  }
  if (labels.length < MIN_OPTIONS || labels.length > MAX_OPTIONS) {
    return { ok: false, error: `A choice question has ${MIN_OPTIONS} to ${MAX_OPTIONS} options; this one has ${labels.length}.` };
  }
  return { ok: true, value: labels };
}

/** Optional option base rates: all blank is "not stated" (null); otherwise they must add to 100%. */
export function readOptionBaseRates(texts: readonly string[]): Parsed<number[] | null> & { problems?: ChoiceProblems } {
  if (texts.every((t) => t.trim() === '')) return { ok: true, value: null };
  return readChoiceForecast(texts);
}
