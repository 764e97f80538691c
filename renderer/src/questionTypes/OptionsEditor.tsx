/**
 * A choice question's option labels: one box per option, with buttons to add one (up to 12)
 * and remove one (down to 2). When the count is fixed (editing a question that has
 * forecasts over its options), the labels can still be reworded.
 */
import { useId } from 'react';
import { Button } from '../components/Button';
import { FieldError } from '../components/FieldError';
import { MAX_OPTIONS, MIN_OPTIONS } from './definition';
import '../forecastEntry/forecastEntry.css';

export interface OptionsEditorProps {
  value: readonly string[];
  onChange: (labels: string[]) => void;
  /** Problems by option index. */
  problems?: Record<number, string> | undefined;
  /** A problem with the list as a whole (the count). */
  error?: string | undefined;
  /** The number of options is fixed (an existing question): no add or remove. */
  fixedCount?: boolean;
}

export function OptionsEditor({ value, onChange, problems, error, fixedCount = false }: OptionsEditorProps) {
  const id = useId();
  const set = (k: number, text: string) => onChange(value.map((v, i) => (i === k ? text : v)));
  // A box's own problem stands beside it, as a sentence like every field's; the same words
  // again under the list ("Option 1: write the option…") only repeated it.
  const boxProblems = Object.keys(problems ?? {}).length > 0;
  return (
    <fieldset className="choice-entry options-editor" aria-describedby={`${id}-hint`}>
      <legend className="field__label">Options</legend>
      <p className="field__hint" id={`${id}-hint`}>
        {fixedCount
          ? 'Reword an option if you must; the number of options is fixed once the question exists.'
          : `${MIN_OPTIONS} to ${MAX_OPTIONS} options, exactly one of which comes true; add “Other” if the list may not cover every case.`}
      </p>
      <ol className="choice-entry__options">
        {value.map((label, k) => {
          const boxId = `${id}-${k}`;
          const problem = problems?.[k];
          return (
            <li key={k} className={['options-editor__row', problem ? 'field--invalid' : ''].filter(Boolean).join(' ')}>
              <label htmlFor={boxId} className="options-editor__label">
                Option {k + 1}
              </label>
              <input
                id={boxId}
                className="input"
                value={label}
                aria-invalid={problem ? true : undefined}
                aria-describedby={problem ? `${boxId}-error` : undefined}
                onChange={(event) => set(k, event.target.value)}
              />
              {!fixedCount ? (
                <Button size="sm" disabled={value.length <= MIN_OPTIONS} onClick={() => onChange(value.filter((_, i) => i !== k))} aria-label={`Remove option ${k + 1}`}>
                  Remove
                </Button>
              ) : null}
              <FieldError id={`${boxId}-error`} message={problem && problem.charAt(0).toUpperCase() + problem.slice(1)} />
            </li>
          );
        })}
      </ol>
      {!fixedCount ? (
        <div>
          <Button size="sm" disabled={value.length >= MAX_OPTIONS} onClick={() => onChange([...value, ''])}>
            Add an option
          </Button>
        </div>
      ) : null}
      <FieldError id={`${id}-error`} message={boxProblems ? undefined : error} />
    </fieldset>
  );
}
