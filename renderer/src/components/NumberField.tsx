/**
 * A number typed as text: the form keeps what the user typed (including an empty or half-typed
 * value) and decides on submit what it means, so nothing is silently rounded or reset.
 *
 * A comma typed into the box is dropped by the browser where the locale writes decimals with a
 * point, so "12,5" reads 125 — right for "1,000", wrong for a decimal comma. Which was meant
 * cannot be told, so the box says what happened and how to write a decimal.
 */
import { useId, useState, type ComponentProps } from 'react';
import { FieldFrame, describedBy } from './FieldFrame';

export interface NumberFieldProps extends Omit<ComponentProps<'input'>, 'onChange' | 'value' | 'type'> {
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** Unit shown after the box, e.g. "%" or "days". */
  suffix?: string | undefined;
  hint?: string | undefined;
  error?: string | undefined;
}

export function NumberField({ label, value, onChange, suffix, hint, error, required, id, className, onKeyDown, onFocus, ...rest }: NumberFieldProps) {
  const generated = useId();
  const controlId = id ?? generated;
  const commaId = `${controlId}-comma`;
  // Whether a comma was typed since the box last took focus.
  const [comma, setComma] = useState(false);
  const described = [describedBy(controlId, hint, error), comma ? commaId : ''].filter(Boolean).join(' ') || undefined;
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={error} required={required} className={className}>
      <span className="input-with-suffix">
        <input
          inputMode="decimal"
          {...rest}
          type="number"
          id={controlId}
          className="input input--number"
          value={value}
          required={required}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          onKeyDown={(event) => {
            if (event.key === ',') setComma(true);
            onKeyDown?.(event);
          }}
          onFocus={(event) => {
            setComma(false);
            onFocus?.(event);
          }}
          onChange={(event) => onChange(event.target.value)}
        />
        {suffix ? (
          <span className="input-suffix" aria-hidden="true">
            {suffix}
          </span>
        ) : null}
      </span>
      {comma ? (
        <p className="field-warning" id={commaId} data-testid="comma-warning" aria-live="polite">
          <span aria-hidden="true">⚠ </span>
          Commas are dropped here{value === '' ? '' : `, so this reads as ${value}`}. For a decimal, type a point (12.5).
        </p>
      ) : null}
    </FieldFrame>
  );
}
