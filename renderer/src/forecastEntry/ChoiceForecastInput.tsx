/**
 * A choice forecast typed as a percentage per option, with the live total under the boxes
 * and a button that spreads what is left of 100 % evenly over the options left blank. The
 * value is the box texts; `readChoiceForecast` (choiceEntry.ts) turns them into the stored
 * probabilities on submit. A share of 1 typed into a box ("0.5") is asked about as in every
 * percent box ("Did you mean 50%?"), unless the boxes already add to 100%: then it was meant.
 */
import { useId, useState } from 'react';
import { Button } from '../components/Button';
import { FieldError } from '../components/FieldError';
import { PercentAdvice, hasPercentAdvice } from '../components/PercentAdvice';
import { commaAsPoint, pastedPercentText } from '../components/decimalComma';
import { useUnreadableNumber } from '../components/unreadableNumber';
import { choiceTotal, spreadRest, totalText, type ChoiceProblems } from './choiceEntry';
import './forecastEntry.css';

export interface ChoiceForecastInputProps {
  /** The group's name, e.g. "Your chances". */
  label: string;
  options: readonly string[];
  /** One percent text per option. */
  value: readonly string[];
  onChange: (texts: string[]) => void;
  problems?: ChoiceProblems | undefined;
  hint?: string | undefined;
  /** Take focus when its dialog opens (the first box). */
  autoFocus?: boolean | undefined;
}

export function ChoiceForecastInput({ label, options, value, onChange, problems, hint, autoFocus }: ChoiceForecastInputProps) {
  const id = useId();
  const [spreadNote, setSpreadNote] = useState<string | null>(null);
  // What was last typed into each box (not filled by "Spread the rest"), for the 0.5 question.
  const [typed, setTyped] = useState<readonly (string | null)[]>([]);
  const total = choiceTotal(value);
  const totalId = `${id}-total`;
  const hintId = `${id}-hint`;
  const totalError = problems?.total;

  function set(k: number, text: string) {
    setSpreadNote(null);
    const next = value.slice();
    next[k] = text;
    onChange(next);
  }

  function spread() {
    const result = spreadRest(value);
    if (result.ok) {
      setSpreadNote(null);
      onChange(result.texts);
    } else {
      setSpreadNote(result.reason);
    }
  }

  const totalState = total.invalid.length ? 'invalid' : total.complete ? 'complete' : 'open';
  return (
    <fieldset className={['choice-entry', totalError ? 'choice-entry--invalid' : ''].filter(Boolean).join(' ')} aria-describedby={[hint ? hintId : '', totalId].filter(Boolean).join(' ')}>
      <legend className="field__label">{label}</legend>
      {hint ? (
        <p className="field__hint" id={hintId}>
          {hint}
        </p>
      ) : null}
      <ol className="choice-entry__options">
        {options.map((option, k) => (
          <OptionBox
            key={k}
            option={option}
            boxId={`${id}-${k}`}
            text={value[k] ?? ''}
            error={problems?.options[k]}
            autoFocus={autoFocus === true && k === 0}
            typed={total.complete ? null : (typed[k] ?? null)}
            onType={(text) => {
              const next = typed.slice();
              next[k] = text;
              setTyped(next);
              set(k, text);
            }}
            onSet={(text) => set(k, text)}
          />
        ))}
      </ol>
      <div className="choice-entry__footer">
        <p className={`choice-entry__total choice-entry__total--${totalState}`} id={totalId} role="status" data-testid="choice-total">
          Total {totalText(total.sum)}
          {total.blanks.length ? ` · ${total.blanks.length} blank` : ''}
          {total.complete ? ' ✓' : ''}
        </p>
        <Button size="sm" onClick={spread}>
          Spread the rest
        </Button>
      </div>
      {spreadNote ? (
        <p className="field__hint" role="status" data-testid="spread-note">
          {spreadNote}
        </p>
      ) : null}
      <FieldError id={`${id}-total-error`} message={totalError} />
    </fieldset>
  );
}

interface OptionBoxProps {
  option: string;
  boxId: string;
  text: string;
  error: string | undefined;
  autoFocus: boolean;
  /** What was last typed into the box, for the 0.5 question; null when not to ask. */
  typed: string | null;
  /** Typed into the box. */
  onType: (text: string) => void;
  /** Set by the box's advice ("Use 50%"). */
  onSet: (text: string) => void;
}

/** One option's percent box, with its own message when what it holds is not a number. */
function OptionBox({ option, boxId, text, error, autoFocus, typed, onType, onSet }: OptionBoxProps) {
  const unreadable = useUnreadableNumber(option, text);
  const shownError = unreadable.message ?? error;
  const adviceId = `${boxId}-advice`;
  const described = [shownError ? `${boxId}-error` : '', hasPercentAdvice(text, false) ? adviceId : ''].filter(Boolean).join(' ');
  return (
    <li className={['choice-entry__option', shownError ? 'field--invalid' : ''].filter(Boolean).join(' ')}>
      <label htmlFor={boxId} className="choice-entry__label">
        {option}
      </label>
      <span className="input-with-suffix">
        <input
          type="number"
          inputMode="decimal"
          id={boxId}
          className="input input--number input--percent"
          min={0}
          max={100}
          step="any"
          value={text}
          data-autofocus={autoFocus ? '' : undefined}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={described || undefined}
          onInput={unreadable.onInput}
          onBlur={unreadable.onBlur}
          onKeyDown={commaAsPoint}
          onPaste={pastedPercentText}
          onChange={(event) => onType(event.target.value)}
        />
        <span className="input-suffix" aria-hidden="true">
          %
        </span>
      </span>
      <FieldError id={`${boxId}-error`} message={shownError} />
      <PercentAdvice value={text} onChange={onSet} id={adviceId} boxId={boxId} typed={typed} warnCertain={false} />
    </li>
  );
}
