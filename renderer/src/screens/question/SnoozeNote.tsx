/**
 * A snoozed nudge is marked where the question is shown, with when it comes back and a way
 * to end the snooze now (it then shows on the Desk again if it is still due).
 */
import { useState } from 'react';
import type { NudgeKind, Question } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { describeError } from '../../api/errors';
import { Badge } from '../../components/Badge';
import { Button } from '../../components/Button';
import { useToast } from '../../components/Toast';
import { formatInstant } from '../../dates';
import { useUndoToast } from '../../forgiving/undo';
import '../../forgiving/forgiving.css';

/** Each nudge by name in a sentence: "Its to resolve nudge" read as a slip. */
const SNOOZED_NUDGE: Readonly<Record<NudgeKind, string>> = {
  checkin: 'The check-in nudge',
  closing_soon: 'The closing-soon nudge',
  window_closed: 'The nudge to resolve it',
  overdue: 'The overdue nudge',
};

export function SnoozeNote({ question }: { question: Question }) {
  const undoToast = useUndoToast();
  const toast = useToast();
  const [busy, setBusy] = useState(false);
  const snoozes = question.snoozes;
  if (snoozes.length === 0) return null;

  async function unsnooze() {
    setBusy(true);
    try {
      const { undo } = await api.unsnooze({ question_id: question.id });
      diaryChanged();
      undoToast({ message: `Snooze ended: “${question.title}” is back on the Desk when it is due.`, undo, title: question.title });
    } catch (error) {
      toast.show({ tone: 'error', message: describeError(error) });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="snooze-note" aria-labelledby="snooze-heading" data-testid="snooze-note">
      <div>
        <h2 id="snooze-heading" className="snooze-note__title">
          <Badge tone="ink">Snoozed</Badge> Hidden from the Desk for now
        </h2>
        <ul className="snooze-note__list">
          {snoozes.map((s) => (
            <li key={s.kind}>
              {SNOOZED_NUDGE[s.kind]} comes back <time dateTime={s.until}>{formatInstant(s.until, question.time_zone)}</time>.
            </li>
          ))}
        </ul>
      </div>
      <Button size="sm" onClick={() => void unsnooze()} busy={busy}>
        Unsnooze
      </Button>
    </section>
  );
}
