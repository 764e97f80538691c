/**
 * A form as every screen and dialog writes it: no browser validation bubbles (the form
 * checks on save and says everything at once, see forms.ts), the banner for what no field
 * shows, the channel controls report their own problems on, and — inside a dialog — the
 * guard that asks before typed text is thrown away.
 */
import type { FormEvent, ReactNode } from 'react';
import { FieldProblemsContext, type FormState } from '../forms';
import { Button } from './Button';
import { useDiscardGuard } from './Dialog';
import { ErrorBanner } from './ErrorBanner';

export interface FormProps {
  form: FormState;
  /** The form's accessible name. */
  label: string;
  onSubmit: (event: FormEvent<HTMLFormElement>) => void;
  /** True while the form holds changes a close would throw away. */
  dirty: boolean;
  className?: string;
  children: ReactNode;
}

export function Form({ form, label, onSubmit, dirty, className = 'form', children }: FormProps) {
  useDiscardGuard(dirty);
  return (
    <FieldProblemsContext.Provider value={form.problems}>
      <form ref={form.formRef} className={className} noValidate onSubmit={onSubmit} aria-label={label}>
        {form.banner ? <ErrorBanner message={form.banner.message} details={form.banner.details} /> : null}
        {children}
      </form>
    </FieldProblemsContext.Provider>
  );
}

/** The foot of a form: Cancel (`cancel` asks first when typed text would be lost) and the submit button, busy while saving. */
export function FormActions({ cancel, busy, children }: { cancel: () => void; busy: boolean; children: ReactNode }) {
  return (
    <div className="form__actions">
      <Button onClick={cancel}>Cancel</Button>
      <Button type="submit" variant="primary" busy={busy}>
        {children}
      </Button>
    </div>
  );
}
