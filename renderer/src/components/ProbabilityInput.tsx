/**
 * A probability entered in percent, with a slider and a number box kept in step: the slider
 * for a quick gut number, the box for an exact one (e.g. 2.5%). The value is the percent text
 * as typed; `percentToProbability` turns it into the 0–1 number the diary stores. Under the
 * box, PercentAdvice warns at 0% and 100% and asks about a fraction such as 0.5.
 */
import { useId, useState } from 'react';
import { commaAsPoint, pastedPercentText } from './decimalComma';
import { FieldFrame, describedBy } from './FieldFrame';
import { PercentAdvice, hasPercentAdvice } from './PercentAdvice';
import { useUnreadableNumber } from './unreadableNumber';

export interface ProbabilityInputProps {
  label: string;
  value: string;
  onChange: (percentText: string) => void;
  hint?: string | undefined;
  error?: string | undefined;
  required?: boolean | undefined;
  /** Take focus when its dialog opens (see Dialog: native autofocus runs before showModal). */
  autoFocus?: boolean | undefined;
  id?: string | undefined;
}

export function ProbabilityInput({ label, value, onChange, hint, error, required, autoFocus, id }: ProbabilityInputProps) {
  const generated = useId();
  const controlId = id ?? generated;
  const adviceId = `${controlId}-advice`;
  // What was last typed into the box (not set by the slider or a helper), for the 0.5 question.
  const [typed, setTyped] = useState<string | null>(null);
  const numeric = Number(value);
  const sliderValue = value.trim() !== '' && Number.isFinite(numeric) ? Math.min(100, Math.max(0, numeric)) : 50;
  const unreadable = useUnreadableNumber(label, value);
  const shownError = unreadable.message ?? error;
  const described = [describedBy(controlId, hint, shownError), hasPercentAdvice(value) ? adviceId : ''].filter(Boolean).join(' ') || undefined;
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={shownError} required={required} className="probability">
      <span className="probability__row">
        <input
          type="range"
          className={`probability__slider ${value.trim() === '' ? 'probability__slider--unset' : ''}`}
          min={0}
          max={100}
          step={1}
          value={sliderValue}
          aria-label={`${label} (slider)`}
          aria-valuetext={value.trim() === '' ? 'not set' : `${sliderValue}%`}
          onChange={(event) => onChange(event.target.value)}
        />
        <span className="input-with-suffix">
          <input
            type="number"
            inputMode="decimal"
            id={controlId}
            className="input input--number input--percent"
            min={0}
            max={100}
            step="any"
            value={value}
            required={required}
            data-autofocus={autoFocus ? '' : undefined}
            aria-invalid={shownError ? true : undefined}
            aria-describedby={described}
            onInput={unreadable.onInput}
            onBlur={unreadable.onBlur}
            onKeyDown={commaAsPoint}
            onPaste={pastedPercentText}
            onChange={(event) => {
              setTyped(event.target.value);
              onChange(event.target.value);
            }}
          />
          <span className="input-suffix" aria-hidden="true">
            %
          </span>
        </span>
      </span>
      <PercentAdvice value={value} onChange={onChange} id={adviceId} boxId={controlId} typed={typed} />
    </FieldFrame>
  );
}
