/**
 * Short confirmations after an action ("Revision saved"), read out politely by screen readers
 * and gone after a few seconds; problems stay longer. One provider near the root; screens call
 * `useToast().show(...)`.
 */
import { createContext, useCallback, useContext, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';

export interface ToastInput {
  message: string;
  tone?: 'success' | 'error' | 'info';
  /** An optional link, e.g. to the question just added. */
  action?: { label: string; href: string };
}

interface ToastItem extends ToastInput {
  id: number;
}

interface ToastApi {
  show: (toast: ToastInput) => void;
}

const ToastContext = createContext<ToastApi | null>(null);

const LIFETIME_MS = { success: 5000, info: 5000, error: 10000 } as const;

export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<ToastItem[]>([]);
  const nextId = useRef(1);

  const dismiss = useCallback((id: number) => setToasts((list) => list.filter((t) => t.id !== id)), []);
  const show = useCallback((toast: ToastInput) => {
    const id = nextId.current++;
    setToasts((list) => [...list.slice(-3), { ...toast, id }]);
  }, []);
  const api = useMemo(() => ({ show }), [show]);

  return (
    <ToastContext.Provider value={api}>
      {children}
      <div className="toast-region" role="status" aria-live="polite" aria-label="Notifications">
        {toasts.map((toast) => (
          <Toast key={toast.id} toast={toast} onDismiss={dismiss} />
        ))}
      </div>
    </ToastContext.Provider>
  );
}

function Toast({ toast, onDismiss }: { toast: ToastItem; onDismiss: (id: number) => void }) {
  const tone = toast.tone ?? 'success';
  const [paused, setPaused] = useState(false);
  useEffect(() => {
    if (paused) return;
    const timer = window.setTimeout(() => onDismiss(toast.id), LIFETIME_MS[tone]);
    return () => window.clearTimeout(timer);
  }, [paused, tone, onDismiss, toast.id]);
  return (
    <div
      className={`toast toast--${tone}`}
      data-testid="toast"
      onMouseEnter={() => setPaused(true)}
      onMouseLeave={() => setPaused(false)}
      onFocus={() => setPaused(true)}
      onBlur={() => setPaused(false)}
    >
      <p className="toast__message">{toast.message}</p>
      {toast.action ? (
        <a className="toast__action" href={toast.action.href} onClick={() => onDismiss(toast.id)}>
          {toast.action.label}
        </a>
      ) : null}
      <button type="button" className="toast__close" aria-label="Dismiss notification" onClick={() => onDismiss(toast.id)}>
        ×
      </button>
    </div>
  );
}

export function useToast(): ToastApi {
  const api = useContext(ToastContext);
  if (!api) throw new Error('useToast was called outside <ToastProvider>; wrap the app in it (see App.tsx).');
  return api;
}
