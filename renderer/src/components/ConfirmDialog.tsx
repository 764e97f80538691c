/**
 * "Are you sure?" for actions that cannot be undone (deleting a question or a revision).
 * The safe choice has focus when it opens, so a reflexive Enter cancels rather than deletes.
 */
import { useState, type ReactNode } from 'react';
import { describeError } from '../api/errors';
import { Button } from './Button';
import { Dialog } from './Dialog';
import { ErrorBanner } from './ErrorBanner';

export interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  onConfirm: () => Promise<void>;
  onClose: () => void;
  tone?: 'danger' | 'primary';
}

export function ConfirmDialog({ open, title, children, confirmLabel, onConfirm, onClose, tone = 'danger' }: ConfirmDialogProps) {
  return (
    <Dialog open={open} title={title} onClose={onClose} size="sm" role="alertdialog">
      <ConfirmBody confirmLabel={confirmLabel} onConfirm={onConfirm} onClose={onClose} tone={tone}>
        {children}
      </ConfirmBody>
    </Dialog>
  );
}

function ConfirmBody({ children, confirmLabel, onConfirm, onClose, tone }: Omit<ConfirmDialogProps, 'open' | 'title'>) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function confirm() {
    setBusy(true);
    setError(null);
    try {
      await onConfirm();
    } catch (e) {
      setError(describeError(e));
      setBusy(false);
    }
  }
  return (
    <div className="form">
      {error ? <ErrorBanner message={error} /> : null}
      <div className="confirm__message">{children}</div>
      <div className="form__actions">
        <Button onClick={onClose} data-autofocus>
          Cancel
        </Button>
        <Button variant={tone === 'danger' ? 'danger' : 'primary'} onClick={confirm} busy={busy}>
          {confirmLabel}
        </Button>
      </div>
    </div>
  );
}
