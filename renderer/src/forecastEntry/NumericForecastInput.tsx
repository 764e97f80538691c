/**
 * A numeric forecast typed as one value per quantile level of the question (P10 / P50 / P90
 * by default), in the question's unit, or as calendar dates for a date question. The value
 * is the box texts; `readNumericForecast` (numericEntry.ts) reads them on submit and refuses
 * a set that decreases with the level.
 */
import { useId } from 'react';
import { DateField } from '../components/DateField';
import { FieldError } from '../components/FieldError';
import { NumberField } from '../components/NumberField';
import { levelLabel, levelsHint, type NumericProblems, type ValueKind } from './numericEntry';
import './forecastEntry.css';

export interface NumericForecastInputProps {
  label: string;
  levels: readonly number[];
  kind: ValueKind;
  unit: string;
  /** One text per level: a number, or "YYYY-MM-DD" for a date question. */
  value: readonly string[];
  onChange: (texts: string[]) => void;
  problems?: NumericProblems | undefined;
  autoFocus?: boolean | undefined;
}

export function NumericForecastInput({ label, levels, kind, unit, value, onChange, problems, autoFocus }: NumericForecastInputProps) {
  const id = useId();
  const hintId = `${id}-hint`;

  function set(k: number, text: string) {
    const next = value.slice();
    next[k] = text;
    onChange(next);
  }

  return (
    <fieldset className="numeric-entry" aria-describedby={hintId}>
      <legend className="field__label">
        {label}
        {kind === 'number' && unit ? <span className="numeric-entry__unit"> ({unit})</span> : null}
      </legend>
      <p className="field__hint" id={hintId}>
        {levelsHint(levels, kind === 'date' ? '' : unit)}
      </p>
      <div className="numeric-entry__levels">
        {/* A set that decreases is reported beside the level that breaks the order. */}
        {levels.map((level, k) =>
          kind === 'date' ? (
            <DateField key={level} label={levelLabel(level, levels)} value={value[k] ?? ''} onChange={(text) => set(k, text)} error={problems?.levels[k]} />
          ) : (
            <NumberField
              key={level}
              label={levelLabel(level, levels)}
              value={value[k] ?? ''}
              onChange={(text) => set(k, text)}
              suffix={unit || undefined}
              step="any"
              error={problems?.levels[k]}
              data-autofocus={autoFocus && k === 0 ? '' : undefined}
            />
          ),
        )}
      </div>
      {/* A reason for the set as a whole (from the diary) that no single box carries. */}
      <FieldError id={`${id}-order`} message={problems?.order && !Object.values(problems.levels).includes(problems.order) ? problems.order : undefined} />
    </fieldset>
  );
}
