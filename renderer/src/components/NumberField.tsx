/**
 * A number typed as text: the form keeps what the user typed (including an empty or half-typed
 * value) and decides on submit what it means, so nothing is silently rounded or reset.
 *
 * A comma typed into the box is dropped by the browser where the locale writes decimals with a
 * point, so "12,5" reads 125 — right for "1,000", wrong for a decimal comma. Which was meant
 * cannot be told, so the box says what happened and how to write a decimal.
 *
 * A paste the box cannot hold whole ("2,100 pallets") goes in without the box's unit and the
 * spaces around it; text that is still not a number is refused with a word, not dropped
 * silently (`pastedNumber.ts`).
 */
import { useId, useState, type ComponentProps } from 'react';
import { FieldFrame, describedBy } from './FieldFrame';
import { readPastedNumber } from './pastedNumber';
import { useUnreadableNumber } from './unreadableNumber';

export interface NumberFieldProps extends Omit<ComponentProps<'input'>, 'onChange' | 'value' | 'type'> {
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** Unit shown after the box, e.g. "%" or "days". */
  suffix?: string | undefined;
  hint?: string | undefined;
  error?: string | undefined;
}

export function NumberField({ label, value, onChange, suffix, hint, error, required, id, className, onKeyDown, onFocus, onPaste, onBlur, ...rest }: NumberFieldProps) {
  const generated = useId();
  const controlId = id ?? generated;
  const commaId = `${controlId}-comma`;
  // Whether a comma was typed since the box last took focus.
  const [comma, setComma] = useState(false);
  // Pasted text that is not a number, shown until the box takes focus again or changes.
  const [refused, setRefused] = useState<string | null>(null);
  const refusedId = `${controlId}-pasted`;
  const unreadable = useUnreadableNumber(label, value);
  const shownError = unreadable.message ?? error;
  const described = [describedBy(controlId, hint, shownError), comma ? commaId : '', refused !== null ? refusedId : ''].filter(Boolean).join(' ') || undefined;
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={shownError} required={required} className={className}>
      <span className="input-with-suffix">
        <input
          inputMode="decimal"
          {...rest}
          type="number"
          id={controlId}
          className="input input--number"
          value={value}
          required={required}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={described}
          onInput={unreadable.onInput}
          onBlur={(event) => {
            unreadable.onBlur(event);
            onBlur?.(event);
          }}
          onKeyDown={(event) => {
            if (event.key === ',') setComma(true);
            onKeyDown?.(event);
          }}
          onFocus={(event) => {
            setComma(false);
            setRefused(null);
            onFocus?.(event);
          }}
          onPaste={(event) => {
            onPaste?.(event);
            if (event.defaultPrevented) return;
            const read = readPastedNumber(event.clipboardData.getData('text/plain'), suffix);
            if (read.kind === 'as-is') {
              setRefused(null);
              if (event.clipboardData.getData('text/plain').includes(',')) setComma(true);
              return;
            }
            event.preventDefault();
            if (read.kind === 'refused') {
              setRefused(read.text);
              return;
            }
            setRefused(null);
            if (read.text.includes(',')) setComma(true);
            // insertText goes through the browser's own editing, so the change event fires and Undo takes it back.
            document.execCommand('insertText', false, read.text);
          }}
          onChange={(event) => {
            setRefused(null);
            onChange(event.target.value);
          }}
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
      {refused !== null ? (
        <p className="field-warning" id={refusedId} data-testid="paste-warning" aria-live="polite">
          <span aria-hidden="true">⚠ </span>
          Not pasted: “{refused.length > 40 ? `${refused.slice(0, 40)}…` : refused}” is not a number. Type or paste digits only, e.g. 2100 or 12.5.
        </p>
      ) : null}
    </FieldFrame>
  );
}
