/**
 * What every form does on save: check every field at once — what only the form can know (a
 * percent typed as text, a date in the user's order, a tag still in its box) and the
 * diary's own rules for the request it is about to send (the same contract schema the
 * diary runs) — and show each message beside its field in plain words. Only a request
 * that passes is sent; if the diary still refuses it, its `field: reason` lines land beside
 * the same fields (fieldMessages.ts), and reasons for fields the form does not show go
 * into a banner.
 *
 * Controls that hold something the form cannot see in its own state (a half-typed tag, a
 * "did you mean 50%?" not yet answered, a date that is not a date) report it with
 * `useFieldProblem`; a save is refused while any is open, and the keyboard goes to the
 * first.
 */
import { createContext, useCallback, useContext, useEffect, useId, useMemo, useRef, useState } from 'react';
import type { ZodType } from 'zod';
import { RequestError, describeError } from './api/errors';
import { placeReasons, schemaReasons, type FieldPlacement } from './fieldMessages';
import { sentence } from './components/FieldError';

export type { FieldPlacement } from './fieldMessages';

export interface FormBanner {
  message: string;
  details: string[];
}

/** Lets controls inside a form report problems the form's own state cannot show. */
export interface FieldProblems {
  set: (key: string, problem: string | null) => void;
  /** How many saves were refused so far: a control shows its problem once one was. */
  refused: number;
}

export const FieldProblemsContext = createContext<FieldProblems | null>(null);

/** Whether the enclosing form has refused a save (so half-typed values now count as wrong). */
export function useSaveRefused(): boolean {
  return (useContext(FieldProblemsContext)?.refused ?? 0) > 0;
}

/**
 * Reports `problem` (null: none) to the enclosing form, which refuses to save while it stands.
 * The control shows the message itself (at the latest once a save was refused) and marks its
 * box aria-invalid, so the keyboard is taken to it.
 */
export function useFieldProblem(problem: string | null): void {
  const problems = useContext(FieldProblemsContext);
  const key = useId();
  useEffect(() => {
    if (!problems) return;
    problems.set(key, problem);
    return () => problems.set(key, null);
  }, [problems, key, problem]);
}

export function useForm() {
  const formRef = useRef<HTMLFormElement>(null);
  const [busy, setBusy] = useState(false);
  const [errors, setErrors] = useState<ReadonlyMap<string, string>>(new Map());
  const [banner, setBanner] = useState<FormBanner | null>(null);
  const [attempt, setAttempt] = useState(0);
  const open = useRef(new Map<string, string>());
  const problems = useMemo<FieldProblems>(
    () => ({
      set: (key, problem) => {
        if (problem === null) open.current.delete(key);
        else open.current.set(key, problem);
      },
      refused: attempt,
    }),
    [attempt],
  );

  // After a refused save, take the keyboard to the first field that needs attention.
  useEffect(() => {
    if (attempt === 0) return;
    const form = formRef.current;
    const target = form?.querySelector<HTMLElement>('[aria-invalid="true"], [data-field-question]') ?? form?.querySelector<HTMLElement>('[role="alert"]');
    target?.focus();
  }, [attempt]);

  const show = useCallback((found: Readonly<Record<string, string>>) => {
    setErrors(new Map(Object.entries(found).map(([k, v]) => [k, sentence(v)])));
    setBanner(null);
    setAttempt((n) => n + 1);
  }, []);

  /**
   * Every problem found before sending: the form's own (`found`, field → reason), then the
   * contract's reasons for fields without one yet, then what controls reported. Shows them
   * all and returns false, or returns true when there are none.
   */
  function check(found: Record<string, string>, contract?: { schema: ZodType; request: unknown; placement: FieldPlacement }): boolean {
    const all: Record<string, string> = { ...found };
    if (contract) {
      const { shown } = placeReasons(schemaReasons(contract.schema, contract.request), contract.placement);
      for (const [field, reason] of shown) if (!(field in all)) all[field] = reason;
    }
    if (Object.keys(all).length === 0 && open.current.size === 0) return true;
    show(all);
    return false;
  }

  /** Shows messages the form found itself; returns false so callers can `return reject(...)`. */
  function reject(found: Record<string, string>): false {
    show(found);
    return false;
  }

  /** Runs the request; returns true when it succeeded. */
  async function submit(action: () => Promise<void>, placement: FieldPlacement): Promise<boolean> {
    setBusy(true);
    try {
      await action();
      setErrors(new Map());
      setBanner(null);
      return true;
    } catch (error) {
      const placed = error instanceof RequestError && error.fields.length > 0 ? placeReasons(error.fields, placement) : { shown: new Map<string, string>(), elsewhere: [] };
      setErrors(placed.shown);
      if (placed.shown.size === 0 || placed.elsewhere.length > 0) {
        setBanner({
          message: placed.shown.size > 0 ? 'Some details were not accepted; see the marked fields and the list below.' : describeError(error),
          details: placed.elsewhere,
        });
      } else {
        setBanner(null);
      }
      setAttempt((n) => n + 1);
      return false;
    } finally {
      setBusy(false);
    }
  }

  /** Takes every message down, for when the form goes back to its saved values. */
  const clear = useCallback(() => {
    setErrors(new Map());
    setBanner(null);
  }, []);

  return { formRef, busy, banner, problems, error: (field: string) => errors.get(field), check, reject, submit, clear };
}

export type FormState = ReturnType<typeof useForm>;
