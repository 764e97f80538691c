/**
 * What every form does on submit: check what only the form can check (percent ranges, a
 * missing date), send, and on refusal put each of the diary's `field: reason` lines beside
 * the field it names; reasons for fields the form does not show go into a banner.
 */
import { useEffect, useRef, useState } from 'react';
import { RequestError, describeError, fieldReasons } from './api/errors';

export interface FormBanner {
  message: string;
  details: string[];
}

function sentence(reason: string): string {
  return reason.charAt(0).toUpperCase() + reason.slice(1);
}

export interface SubmitOptions {
  /** Field names the form shows (request paths, e.g. "closes_at", "first_forecast.p"). */
  fields: readonly string[];
  /** Request-path prefix to drop before matching, e.g. "changes" for updateQuestion. */
  prefix?: string;
  /** Request paths shown by another field, e.g. { opened_at: 'closes_at' }. */
  aliases?: Readonly<Record<string, string>>;
}

export function useForm() {
  const formRef = useRef<HTMLFormElement>(null);
  const [busy, setBusy] = useState(false);
  const [errors, setErrors] = useState<ReadonlyMap<string, string>>(new Map());
  const [banner, setBanner] = useState<FormBanner | null>(null);
  const [attempt, setAttempt] = useState(0);

  // After a refused submit, take the keyboard to the first field that needs attention.
  useEffect(() => {
    if (attempt === 0) return;
    const form = formRef.current;
    const target = form?.querySelector<HTMLElement>('[aria-invalid="true"]') ?? form?.querySelector<HTMLElement>('[role="alert"]');
    target?.focus();
  }, [attempt]);

  /** Shows messages the form found itself; returns false so callers can `return reject(...)`. */
  function reject(found: Record<string, string>): false {
    setErrors(new Map(Object.entries(found).map(([k, v]) => [k, sentence(v)])));
    setBanner(null);
    setAttempt((n) => n + 1);
    return false;
  }

  /** Runs the request; returns true when it succeeded. */
  async function submit(action: () => Promise<void>, options: SubmitOptions): Promise<boolean> {
    setBusy(true);
    try {
      await action();
      setErrors(new Map());
      setBanner(null);
      return true;
    } catch (error) {
      const shown = new Map<string, string>();
      const elsewhere: string[] = [];
      if (error instanceof RequestError && error.fields.length > 0) {
        for (const [field, reason] of fieldReasons(error.fields, options.prefix)) {
          const target = options.aliases?.[field] ?? field;
          if (options.fields.includes(target)) {
            const before = shown.get(target);
            shown.set(target, before ? `${before}; ${reason}` : sentence(reason));
          } else {
            elsewhere.push(field ? `${field}: ${reason}` : reason);
          }
        }
      }
      setErrors(shown);
      if (shown.size === 0 || elsewhere.length > 0) {
        setBanner({
          message: shown.size > 0 ? 'Some details were not accepted; see the marked fields and the list below.' : describeError(error),
          details: elsewhere,
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

  return { formRef, busy, banner, error: (field: string) => errors.get(field), reject, submit };
}
