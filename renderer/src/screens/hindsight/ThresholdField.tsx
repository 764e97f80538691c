/**
 * "Confident at": how far towards one side a final forecast must be to count as a confident
 * call. A slider for trying values quickly and a box for an exact one, kept in step; the box
 * carries the label, the slider is named after it.
 *
 * The box keeps what is typed in it: an empty box, or text it cannot read ("60-70"), is not
 * passed on (the screen would take it for no choice, put the default 80 back in the box and
 * throw the typing away); it says what to type instead, and the list stays as it was. Left
 * empty, the box shows the number in use again.
 */
import { useId, useState } from 'react';
import { commaAsPoint, pastedPercentText } from '../../components/decimalComma';
import { FieldFrame, describedBy } from '../../components/FieldFrame';
import { useUnreadableNumber } from '../../components/unreadableNumber';
import { MAX_THRESHOLD_PERCENT, MIN_THRESHOLD_PERCENT, parseThreshold } from './selection';

export interface ThresholdFieldProps {
  value: string;
  onChange: (percentText: string) => void;
  hint: string;
  error?: string | undefined;
}

export function ThresholdField({ value, onChange, hint, error }: ThresholdFieldProps) {
  const controlId = useId();
  // The box's own text; a value set from elsewhere (the slider, Reset, Back) replaces it.
  const [text, setText] = useState(value);
  const [given, setGiven] = useState(value);
  if (value !== given) {
    setGiven(value);
    setText(value);
  }
  const unreadable = useUnreadableNumber('Confident at', text);
  const empty = text.trim() === '' && !unreadable.now;
  const emptyProblem = empty ? parseThreshold(text) : null;
  const shownError = unreadable.message ?? (emptyProblem && 'problem' in emptyProblem ? emptyProblem.problem : unreadable.now ? undefined : error);
  const numeric = Number(value);
  const sliderValue =
    value.trim() !== '' && Number.isFinite(numeric) ? Math.min(MAX_THRESHOLD_PERCENT, Math.max(MIN_THRESHOLD_PERCENT, numeric)) : MIN_THRESHOLD_PERCENT;
  return (
    <FieldFrame controlId={controlId} label="Confident at" hint={hint} error={shownError} className="hs-threshold">
      <span className="hs-threshold__row">
        <input
          type="range"
          className="hs-threshold__slider"
          min={MIN_THRESHOLD_PERCENT}
          max={MAX_THRESHOLD_PERCENT}
          step={1}
          value={sliderValue}
          aria-label="Confident at (slider)"
          aria-valuetext={`${sliderValue}%`}
          onChange={(event) => onChange(event.target.value)}
        />
        <span className="input-with-suffix">
          <input
            type="number"
            inputMode="decimal"
            id={controlId}
            className="input input--number hs-threshold__box"
            min={MIN_THRESHOLD_PERCENT}
            max={MAX_THRESHOLD_PERCENT}
            step="any"
            value={text}
            aria-invalid={shownError ? true : undefined}
            aria-describedby={describedBy(controlId, hint, shownError)}
            onKeyDown={commaAsPoint}
            onPaste={pastedPercentText}
            onInput={unreadable.onInput}
            onBlur={(event) => {
              unreadable.onBlur(event);
              // Left empty, the box shows again the number the list is using.
              if (event.currentTarget.value === '' && !event.currentTarget.validity.badInput) setText(value);
            }}
            onChange={(event) => {
              setText(event.target.value);
              if (event.target.value.trim() !== '') onChange(event.target.value);
            }}
          />
          <span className="input-suffix" aria-hidden="true">
            %
          </span>
        </span>
      </span>
    </FieldFrame>
  );
}
