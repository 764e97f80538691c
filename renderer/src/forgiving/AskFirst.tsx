/**
 * "Are you sure?" for what the diary calls unusual but possible. The diary answers such a
 * request with the code `confirm` and its reason, and changes nothing (docs/api.md,
 * "Warnings that ask first"); `sendAskingFirst` shows the reason in a dialog and, if the
 * user goes ahead, sends the same request again with `confirm: true`. One dialog near the
 * root serves every screen, on top of whatever dialog asked.
 */
import { createContext, useCallback, useContext, useMemo, useRef, useState, type ReactNode } from 'react';
import { RequestError } from '../api/errors';
import { ConfirmDialog } from '../components/ConfirmDialog';
import { warningText } from './warningText';

export interface Warning {
  /** The diary's reason, as it answered. */
  reason: string;
  confirmLabel: string;
}

type Ask = (warning: Warning) => Promise<boolean>;

const AskContext = createContext<Ask | null>(null);


export function AskFirstProvider({ children }: { children: ReactNode }) {
  const [pending, setPending] = useState<Warning | null>(null);
  const answer = useRef<((yes: boolean) => void) | null>(null);
  const ask = useCallback<Ask>(
    (warning) =>
      new Promise<boolean>((resolve) => {
        answer.current?.(false);
        answer.current = resolve;
        setPending(warning);
      }),
    [],
  );
  const settle = useCallback((yes: boolean) => {
    answer.current?.(yes);
    answer.current = null;
    setPending(null);
  }, []);
  const value = useMemo(() => ask, [ask]);
  return (
    <AskContext.Provider value={value}>
      {children}
      <ConfirmDialog
        open={pending !== null}
        title="This is unusual — go ahead?"
        confirmLabel={pending?.confirmLabel ?? 'Go ahead'}
        tone="primary"
        onConfirm={async () => settle(true)}
        onClose={() => settle(false)}
      >
        <p data-testid="ask-first-reason">{pending ? warningText(pending.reason) : ''}</p>
        <p className="muted">Nothing has been changed yet. Cancel to leave it as it is.</p>
      </ConfirmDialog>
    </AskContext.Provider>
  );
}

export function useAskFirst(): Ask {
  const ask = useContext(AskContext);
  if (!ask) throw new Error('useAskFirst was called outside <AskFirstProvider>; wrap the app in it (see App.tsx).');
  return ask;
}

/**
 * Sends `send(false)`; when the diary answers `confirm`, asks with its reason and, if the user
 * goes ahead, sends `send(true)`. Resolves null when the user chose not to; other refusals
 * are thrown as they came.
 */
export async function sendAskingFirst<T>(
  ask: Ask,
  warning: Omit<Warning, 'reason'>,
  send: (confirm: boolean) => Promise<T>,
): Promise<T | null> {
  try {
    return await send(false);
  } catch (error) {
    if (!(error instanceof RequestError) || error.code !== 'confirm') throw error;
    if (!(await ask({ ...warning, reason: error.message }))) return null;
    return await send(true);
  }
}
