/** One choice out of a few, as native radio buttons (arrow keys move between them). */
import { useId, type ReactNode } from 'react';
import { FieldError } from './FieldError';

export interface Choice {
  value: string;
  label: string;
  /** Drawn before the label (hidden from screen readers). */
  icon?: ReactNode;
  /** Styles the choice apart from its neighbours (`choice--<tone>`). */
  tone?: string;
}

export interface ChoiceGroupProps {
  legend: string;
  value: string;
  choices: readonly Choice[];
  onChange: (value: string) => void;
  error?: string | undefined;
}

export function ChoiceGroup({ legend, value, choices, onChange, error }: ChoiceGroupProps) {
  const name = useId();
  const errorId = `${name}-error`;
  return (
    <fieldset className={`form__group ${error ? 'field--invalid' : ''}`} aria-describedby={error ? errorId : undefined}>
      <legend>{legend}</legend>
      <div className="choice-row">
        {choices.map((choice) => (
          <label key={choice.value} className={choice.tone ? `choice choice--${choice.tone}` : 'choice'}>
            <input
              type="radio"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              aria-invalid={error ? true : undefined}
              onChange={() => onChange(choice.value)}
            />
            {choice.icon}
            {choice.label}
          </label>
        ))}
      </div>
      <FieldError id={errorId} message={error} />
    </fieldset>
  );
}
