import { useId, type ComponentProps } from 'react';
import { FieldFrame, describedBy } from './FieldFrame';

export interface TextFieldProps extends Omit<ComponentProps<'input'>, 'onChange' | 'value'> {
  label: string;
  value: string;
  onChange: (value: string) => void;
  hint?: string | undefined;
  error?: string | undefined;
}

export function TextField({ label, value, onChange, hint, error, required, id, className, ...rest }: TextFieldProps) {
  const generated = useId();
  const controlId = id ?? generated;
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={error} required={required} className={className}>
      <input
        type="text"
        {...rest}
        id={controlId}
        className="input"
        value={value}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(controlId, hint, error)}
        onChange={(event) => onChange(event.target.value)}
      />
    </FieldFrame>
  );
}
