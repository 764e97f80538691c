/**
 * "Confident at": how far towards one side a final forecast must be to count as a confident
 * call. A slider for trying values quickly and a box for an exact one, kept in step; the box
 * carries the label, the slider is named after it.
 */
import { useId } from 'react';
import { commaAsPoint, pastedPercentText } from '../../components/decimalComma';
import { FieldFrame, describedBy } from '../../components/FieldFrame';
import { MAX_THRESHOLD_PERCENT, MIN_THRESHOLD_PERCENT } from './selection';

export interface ThresholdFieldProps {
  value: string;
  onChange: (percentText: string) => void;
  hint: string;
  error?: string | undefined;
}

export function ThresholdField({ value, onChange, hint, error }: ThresholdFieldProps) {
  const controlId = useId();
  const numeric = Number(value);
  const sliderValue =
    value.trim() !== '' && Number.isFinite(numeric) ? Math.min(MAX_THRESHOLD_PERCENT, Math.max(MIN_THRESHOLD_PERCENT, numeric)) : MIN_THRESHOLD_PERCENT;
  return (
    <FieldFrame controlId={controlId} label="Confident at" hint={hint} error={error} className="hs-threshold">
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
            value={value}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy(controlId, hint, error)}
            onKeyDown={commaAsPoint}
            onPaste={pastedPercentText}
            onChange={(event) => onChange(event.target.value)}
          />
          <span className="input-suffix" aria-hidden="true">
            %
          </span>
        </span>
      </span>
    </FieldFrame>
  );
}
