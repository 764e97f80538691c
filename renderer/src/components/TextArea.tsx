import { useId, type ComponentProps } from 'react';
import { FieldFrame, describedBy } from './FieldFrame';

export interface TextAreaProps extends Omit<ComponentProps<'textarea'>, 'onChange' | 'value'> {
  label: string;
  value: string;
  onChange: (value: string) => void;
  hint?: string | undefined;
  error?: string | undefined;
}

export function TextArea({ label, value, onChange, hint, error, required, id, className, rows = 3, ...rest }: TextAreaProps) {
  const generated = useId();
  const controlId = id ?? generated;
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={error} required={required} className={className}>
      <textarea
        {...rest}
        id={controlId}
        rows={rows}
        className="input input--area"
        value={value}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(controlId, hint, error)}
        onChange={(event) => onChange(event.target.value)}
      />
    </FieldFrame>
  );
}
