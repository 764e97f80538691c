/**
 * A modal dialog on the native <dialog> element (showModal makes the page behind it inert).
 * On top of that: Tab and Shift+Tab cycle inside the dialog, focus goes back to whatever
 * opened it, and every way of closing it — Escape, the × button, a click outside, a form's
 * Cancel — is one close request. When a form inside holds typed text (it says so with
 * `useDiscardGuard`), a close request first asks "Discard your changes?"; Keep editing is
 * the default. Leaving the screen behind it (Back, a link) asks the same way, and a reload
 * gets the browser's own prompt (leaveGuard.ts): the dialog goes with its screen, and what
 * was typed would go with it unasked. Mounted only while open, so a form inside starts
 * fresh each time.
 */
import {
  createContext,
  useCallback,
  useContext,
  useEffect,
  useId,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
  type KeyboardEvent,
  type MouseEvent,
  type ReactNode,
} from 'react';
import { useLeaveGuard } from '../leaveGuard';
import { DiscardDialog } from './DiscardDialog';

export interface DialogProps {
  open: boolean;
  title: string;
  onClose: () => void;
  children: ReactNode;
  /** A short line under the title, read out with it. */
  description?: string | undefined;
  size?: 'sm' | 'md' | 'lg';
  /** 'alertdialog' for a confirmation that interrupts (e.g. delete). */
  role?: 'dialog' | 'alertdialog';
}

export function Dialog(props: DialogProps) {
  return props.open ? <OpenDialog {...props} /> : null;
}

interface DialogControls {
  /** Records whether the part `key` holds typed text a close would throw away. */
  setDirty: (key: string, dirty: boolean) => void;
  /** Close as Escape or × would: asks first when something is unsaved. */
  requestClose: () => void;
}

const DialogContext = createContext<DialogControls | null>(null);

/** Tells the enclosing dialog (if any) that closing now would throw typed text away. */
export function useDiscardGuard(dirty: boolean): void {
  const controls = useContext(DialogContext);
  const key = useId();
  useEffect(() => {
    if (!controls) return;
    controls.setDirty(key, dirty);
    return () => controls.setDirty(key, false);
  }, [controls, key, dirty]);
}

/** The close request of the enclosing dialog, for a form's Cancel button; `fallback` outside a dialog. */
export function useCloseRequest(fallback: () => void): () => void {
  const controls = useContext(DialogContext);
  return controls ? controls.requestClose : fallback;
}

const FOCUSABLE = [
  'a[href]',
  'button:not([disabled])',
  'input:not([disabled]):not([type="hidden"])',
  'select:not([disabled])',
  'textarea:not([disabled])',
  '[tabindex]:not([tabindex="-1"])',
].join(',');

function focusables(root: HTMLElement): HTMLElement[] {
  // Only this dialog's own controls: a dialog opened on top of it keeps its own cycle.
  return [...root.querySelectorAll<HTMLElement>(FOCUSABLE)].filter((el) => el.getClientRects().length > 0 && el.closest('dialog') === root);
}

function outside(dialog: HTMLElement, event: MouseEvent): boolean {
  const box = dialog.getBoundingClientRect();
  return event.clientX < box.left || event.clientX > box.right || event.clientY < box.top || event.clientY > box.bottom;
}

function OpenDialog({ title, onClose, children, description, size = 'md', role = 'dialog' }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();
  const onCloseRef = useRef(onClose);
  onCloseRef.current = onClose;
  const dirty = useRef(new Set<string>());
  const [asking, setAsking] = useState(false);
  // Where the user was going when the question was asked by leaving, not by closing.
  const [leave, setLeave] = useState<(() => void) | null>(null);
  useLeaveGuard(() => dirty.current.size > 0, (proceed) => {
    setLeave(() => proceed);
    setAsking(true);
  });
  // A press that starts outside the dialog and ends outside it is a click on the backdrop;
  // one that starts inside (selecting text, dragging a slider) and ends outside is not.
  const pressStartedOutside = useRef(false);

  const requestClose = useCallback(() => {
    if (dirty.current.size > 0) setAsking(true);
    else onCloseRef.current();
  }, []);
  const controls = useMemo<DialogControls>(
    () => ({
      setDirty: (key, isDirty) => {
        if (isDirty) dirty.current.add(key);
        else dirty.current.delete(key);
      },
      requestClose,
    }),
    [requestClose],
  );

  useLayoutEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    if (!dialog.open) dialog.showModal();
    // A marked field first, else the first control of the body, so focus does not start on ×.
    const body = dialog.querySelector<HTMLElement>('.dialog__body');
    const own = focusables(dialog);
    const first = dialog.querySelector<HTMLElement>('[data-autofocus]') ?? own.find((el) => body?.contains(el)) ?? own[0];
    first?.focus();
    // A number box that opens holding the current figure (Revise starts at your last forecast)
    // has it selected, so typing a new number replaces it rather than making 70 into 7055.
    if (first instanceof HTMLInputElement && first.type === 'number' && first.value !== '') first.select();
    return () => {
      if (dialog.open) dialog.close();
      // After every dialog closing in this update has closed (Discard closes the prompt and
      // its form together; while a modal is open the page is inert and refuses focus), and
      // never into a dialog that closed too.
      queueMicrotask(() => {
        if (opener && opener.isConnected && !opener.closest('dialog:not([open])')) opener.focus();
      });
    };
  }, []);

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    // Escape fires `cancel`; stop the native close and treat it as a close request (the form
    // may hold typed text, or be mid-save).
    const onCancel = (event: Event) => {
      event.preventDefault();
      requestClose();
    };
    dialog.addEventListener('cancel', onCancel);
    return () => dialog.removeEventListener('cancel', onCancel);
  }, [requestClose]);

  function onKeyDown(event: KeyboardEvent<HTMLDialogElement>) {
    const dialog = ref.current;
    if (event.key !== 'Tab' || !dialog || (event.target as HTMLElement).closest('dialog') !== dialog) return;
    const items = focusables(dialog);
    if (items.length === 0) return;
    const first = items[0]!;
    const last = items[items.length - 1]!;
    if (event.shiftKey && document.activeElement === first) {
      event.preventDefault();
      last.focus();
    } else if (!event.shiftKey && document.activeElement === last) {
      event.preventDefault();
      first.focus();
    }
  }

  function onMouseDown(event: MouseEvent<HTMLDialogElement>) {
    pressStartedOutside.current = event.target === ref.current && outside(ref.current, event);
  }

  function onClick(event: MouseEvent<HTMLDialogElement>) {
    const dialog = ref.current;
    if (dialog && event.target === dialog && pressStartedOutside.current && outside(dialog, event)) requestClose();
    pressStartedOutside.current = false;
  }

  return (
    <DialogContext.Provider value={controls}>
      <dialog
        ref={ref}
        className={`dialog dialog--${size}`}
        role={role === 'alertdialog' ? 'alertdialog' : undefined}
        aria-modal="true"
        aria-labelledby={titleId}
        aria-describedby={description ? descriptionId : undefined}
        onKeyDown={onKeyDown}
        onMouseDown={onMouseDown}
        onClick={onClick}
      >
        <header className="dialog__header">
          <h2 id={titleId} className="dialog__title">
            {title}
          </h2>
          <button type="button" className="dialog__close" aria-label="Close dialog" onClick={requestClose}>
            ×
          </button>
        </header>
        {description ? (
          <p id={descriptionId} className="dialog__description">
            {description}
          </p>
        ) : null}
        <div className="dialog__body">{children}</div>
        <DiscardDialog
          open={asking}
          what={title}
          onKeep={() => {
            setAsking(false);
            setLeave(null);
          }}
          onDiscard={() => {
            setAsking(false);
            onCloseRef.current();
            leave?.();
          }}
        />
      </dialog>
    </DialogContext.Provider>
  );
}
