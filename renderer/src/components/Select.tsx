import { useId, type ComponentProps } from 'react';
import { FieldFrame, describedBy } from './FieldFrame';

export interface SelectOption {
  value: string;
  label: string;
}

export interface SelectProps extends Omit<ComponentProps<'select'>, 'onChange' | 'value'> {
  label: string;
  value: string;
  options: readonly SelectOption[];
  onChange: (value: string) => void;
  hint?: string | undefined;
  error?: string | undefined;
}

export function Select({ label, value, options, onChange, hint, error, required, id, className, ...rest }: SelectProps) {
  const generated = useId();
  const controlId = id ?? generated;
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={error} required={required} className={className}>
      <select
        {...rest}
        id={controlId}
        className="input input--select"
        value={value}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(controlId, hint, error)}
        onChange={(event) => onChange(event.target.value)}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}
