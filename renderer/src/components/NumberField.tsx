/**
 * A number typed as text: the form keeps what the user typed (including an empty or half-typed
 * value) and decides on submit what it means, so nothing is silently rounded or reset.
 */
import { useId, type ComponentProps } from 'react';
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

export function NumberField({ label, value, onChange, suffix, hint, error, required, id, className, ...rest }: NumberFieldProps) {
  const generated = useId();
  const controlId = id ?? generated;
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
          aria-describedby={describedBy(controlId, hint, error)}
          onChange={(event) => onChange(event.target.value)}
        />
        {suffix ? (
          <span className="input-suffix" aria-hidden="true">
            {suffix}
          </span>
        ) : null}
      </span>
    </FieldFrame>
  );
}
