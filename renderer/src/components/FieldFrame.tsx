/**
 * The label / control / hint / error layout every form control shares, so each control gets
 * a visible label and its hint and error are announced with it (aria-describedby).
 */
import type { ReactNode } from 'react';
import { FieldError } from './FieldError';

export interface FieldFrameProps {
  controlId: string;
  label: string;
  hint?: string | undefined;
  error?: string | undefined;
  required?: boolean | undefined;
  className?: string | undefined;
  children: ReactNode;
}

export function hintId(controlId: string): string {
  return `${controlId}-hint`;
}

export function errorId(controlId: string): string {
  return `${controlId}-error`;
}

/** The ids a control should list in aria-describedby, given which texts are shown. */
export function describedBy(controlId: string, hint?: string, error?: string): string | undefined {
  const ids = [hint ? hintId(controlId) : '', error ? errorId(controlId) : ''].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}

export function FieldFrame({ controlId, label, hint, error, required, className, children }: FieldFrameProps) {
  return (
    <div className={['field', error ? 'field--invalid' : '', className ?? ''].filter(Boolean).join(' ')}>
      <label className="field__label" htmlFor={controlId}>
        {label}
        {required ? <span className="field__required" aria-hidden="true"> *</span> : null}
      </label>
      {children}
      {hint ? (
        <p className="field__hint" id={hintId(controlId)}>
          {hint}
        </p>
      ) : null}
      <FieldError id={errorId(controlId)} message={error} />
    </div>
  );
}
