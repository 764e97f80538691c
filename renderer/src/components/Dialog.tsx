/**
 * A modal dialog on the native <dialog> element (showModal makes the page behind it inert).
 * On top of that: Tab and Shift+Tab cycle inside the dialog, Escape asks the owner to close,
 * and focus goes back to whatever opened it. Mounted only while open, so a form inside starts
 * fresh each time.
 */
import { useEffect, useId, useLayoutEffect, useRef, type KeyboardEvent, type ReactNode } from 'react';

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

const FOCUSABLE = [
  'a[href]',
  'button:not([disabled])',
  'input:not([disabled]):not([type="hidden"])',
  'select:not([disabled])',
  'textarea:not([disabled])',
  '[tabindex]:not([tabindex="-1"])',
].join(',');

function focusables(root: HTMLElement): HTMLElement[] {
  return [...root.querySelectorAll<HTMLElement>(FOCUSABLE)].filter((el) => el.getClientRects().length > 0);
}

function OpenDialog({ title, onClose, children, description, size = 'md', role = 'dialog' }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();
  const onCloseRef = useRef(onClose);
  onCloseRef.current = onClose;

  useLayoutEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    if (!dialog.open) dialog.showModal();
    // A marked field first, else the first control of the body, so focus does not start on ×.
    const body = dialog.querySelector<HTMLElement>('.dialog__body');
    const first = dialog.querySelector<HTMLElement>('[data-autofocus]') ?? (body ? focusables(body)[0] : undefined) ?? focusables(dialog)[0];
    first?.focus();
    return () => {
      if (dialog.open) dialog.close();
      if (opener && opener.isConnected) opener.focus();
    };
  }, []);

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    // Escape fires `cancel`; the owner decides (it may be mid-save), so stop the native close.
    const onCancel = (event: Event) => {
      event.preventDefault();
      onCloseRef.current();
    };
    dialog.addEventListener('cancel', onCancel);
    return () => dialog.removeEventListener('cancel', onCancel);
  }, []);

  function onKeyDown(event: KeyboardEvent<HTMLDialogElement>) {
    if (event.key !== 'Tab' || !ref.current) return;
    const items = focusables(ref.current);
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

  return (
    <dialog
      ref={ref}
      className={`dialog dialog--${size}`}
      role={role === 'alertdialog' ? 'alertdialog' : undefined}
      aria-modal="true"
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onKeyDown={onKeyDown}
    >
      <header className="dialog__header">
        <h2 id={titleId} className="dialog__title">
          {title}
        </h2>
        <button type="button" className="dialog__close" aria-label="Close dialog" onClick={() => onCloseRef.current()}>
          ×
        </button>
      </header>
      {description ? (
        <p id={descriptionId} className="dialog__description">
          {description}
        </p>
      ) : null}
      <div className="dialog__body">{children}</div>
    </dialog>
  );
}
