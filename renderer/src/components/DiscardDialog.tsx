/**
 * "Discard your changes?" — asked before typed text is thrown away (a dialog closed by
 * Escape, ×, a click outside or Cancel; leaving Settings). Keep editing has focus, so a
 * reflexive Enter or Escape keeps the text.
 */
import { Button } from './Button';
import { Dialog } from './Dialog';

export interface DiscardDialogProps {
  open: boolean;
  /** What holds the text, e.g. "New question" or "Settings". */
  what: string;
  onKeep: () => void;
  onDiscard: () => void;
}

export function DiscardDialog({ open, what, onKeep, onDiscard }: DiscardDialogProps) {
  return (
    <Dialog open={open} title="Discard your changes?" onClose={onKeep} size="sm" role="alertdialog">
      <div className="form" data-testid="discard-prompt">
        <p>What you changed in “{what}” has not been saved. Discarding it cannot be undone.</p>
        <div className="form__actions">
          <Button onClick={onKeep} data-autofocus>
            Keep editing
          </Button>
          <Button variant="danger" onClick={onDiscard}>
            Discard
          </Button>
        </div>
      </div>
    </Dialog>
  );
}
