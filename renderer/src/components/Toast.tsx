/**
 * Short confirmations after an action ("Revision saved"), read out politely by screen readers
 * and gone after a few seconds; problems stay longer. One provider near the root; screens call
 * `useToast().show(...)`.
 *
 * A toast may carry one action: a link (`href`, e.g. to the question just added) or a button
 * (`onClick`, e.g. Undo). A toast with an action stays longer, holds still while the pointer
 * or the keyboard is on it, and can be reached from anywhere with F6 (the same key moves
 * between the parts of a browser window); Escape dismisses the toast that has focus.
 */
import { createContext, useCallback, useContext, useEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';

import { withToast, type ToastInput, type ToastItem } from './toastList';

export type { ToastAction, ToastInput } from './toastList';

interface ToastApi {
  show: (toast: ToastInput) => void;
}

const ToastContext = createContext<ToastApi | null>(null);

const LIFETIME_MS = { success: 5000, info: 5000, error: 10000 } as const;
/** Long enough to read the message, notice the action and reach it by keyboard. */
const ACTION_LIFETIME_MS = 10000;

/** The key that takes the keyboard to the newest toast's action (and back). */
export const TOAST_KEY = 'F6';

export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<ToastItem[]>([]);
  const nextId = useRef(1);
  const region = useRef<HTMLDivElement>(null);
  const cameFrom = useRef<HTMLElement | null>(null);

  const dismiss = useCallback((id: number) => {
    // A toast that goes while it has the keyboard hands it back rather than dropping it on the page.
    const box = region.current;
    if (box && document.activeElement instanceof HTMLElement && box.contains(document.activeElement)) {
      const back = cameFrom.current?.isConnected ? cameFrom.current : document.getElementById('main');
      back?.focus();
    }
    setToasts((list) => list.filter((t) => t.id !== id));
  }, []);
  const show = useCallback((toast: ToastInput) => {
    const id = nextId.current++;
    // The same message again (Undo pressed twice) shows the one already there again rather than a twin.
    setToasts((list) => withToast(list, toast, id));
  }, []);
  const api = useMemo(() => ({ show }), [show]);

  // F6 goes to the newest toast's action, and from there back to where the user was.
  useEffect(() => {
    function onKeyDown(event: globalThis.KeyboardEvent) {
      if (event.key !== TOAST_KEY || event.altKey || event.ctrlKey || event.metaKey) return;
      const box = region.current;
      if (!box) return;
      const actions = [...box.querySelectorAll<HTMLElement>('.toast__action')];
      const inside = document.activeElement instanceof HTMLElement && box.contains(document.activeElement);
      if (inside) {
        event.preventDefault();
        if (cameFrom.current?.isConnected) cameFrom.current.focus();
        return;
      }
      const newest = actions.at(-1);
      if (!newest) return;
      event.preventDefault();
      cameFrom.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      newest.focus();
    }
    window.addEventListener('keydown', onKeyDown);
    return () => window.removeEventListener('keydown', onKeyDown);
  }, []);

  return (
    <ToastContext.Provider value={api}>
      {children}
      <div ref={region} className="toast-region" role="status" aria-live="polite" aria-label="Notifications">
        {toasts.map((toast) => (
          <Toast key={toast.id} toast={toast} onDismiss={dismiss} />
        ))}
      </div>
    </ToastContext.Provider>
  );
}

/** How much of a quoted name a toast shows; a question's title may run to 300 characters. */
const QUOTE_SHOWN = 100;

/**
 * A toast names what it acted on in quotes (“…”). A long title quoted whole made one toast
 * taller than a small window and hid the page and the other toasts, so a quote longer than
 * a usual title is cut to its first words; the rest of the message, which says what
 * happened and what to do, stays whole. The action link leads to the full title.
 */
export function shortenQuotes(message: string): string {
  return message.replace(/“([^”]*)”/g, (whole, quoted: string) => {
    const chars = [...quoted];
    return chars.length > QUOTE_SHOWN ? `“${chars.slice(0, QUOTE_SHOWN).join('').trimEnd()}…”` : whole;
  });
}

function Toast({ toast, onDismiss }: { toast: ToastItem; onDismiss: (id: number) => void }) {
  const tone = toast.tone ?? 'success';
  const [paused, setPaused] = useState(false);
  const lifetime = toast.action ? Math.max(ACTION_LIFETIME_MS, LIFETIME_MS[tone]) : LIFETIME_MS[tone];
  useEffect(() => {
    if (paused) return;
    const timer = window.setTimeout(() => onDismiss(toast.id), lifetime);
    return () => window.clearTimeout(timer);
    // A repeat (toast.shown) starts the time again.
  }, [paused, lifetime, onDismiss, toast.id, toast.shown]);

  function onKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    if (event.key === 'Escape') {
      event.stopPropagation();
      onDismiss(toast.id);
    }
  }

  const action = toast.action;
  return (
    <div
      className={`toast toast--${tone}`}
      data-testid="toast"
      onMouseEnter={() => setPaused(true)}
      onMouseLeave={() => setPaused(false)}
      onFocus={() => setPaused(true)}
      onBlur={() => setPaused(false)}
      onKeyDown={onKeyDown}
    >
      {/* A new paragraph per showing, so a screen reader reads a repeated message again. */}
      <p key={toast.shown} className="toast__message">
        {shortenQuotes(toast.message)}
      </p>
      {action && 'href' in action ? (
        <a className="toast__action" href={action.href} onClick={() => onDismiss(toast.id)} aria-keyshortcuts={TOAST_KEY}>
          {action.label}
        </a>
      ) : null}
      {action && 'onClick' in action ? (
        <button
          type="button"
          className="toast__action toast__action--button"
          aria-keyshortcuts={TOAST_KEY}
          onClick={() => {
            onDismiss(toast.id);
            action.onClick();
          }}
        >
          {action.label}
        </button>
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
