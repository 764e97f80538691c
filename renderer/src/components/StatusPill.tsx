import type { AnyOutcome, Outcome, QuestionStatus } from '../../../shared/domain';
import { Badge, type BadgeTone } from './Badge';

const LABELS: Record<QuestionStatus, string> = {
  open: 'Open',
  closing: 'Closing soon',
  awaiting: 'Awaiting resolution',
  resolved: 'Resolved',
  void: 'Void',
};

const TONES: Record<QuestionStatus, BadgeTone> = {
  open: 'ink',
  closing: 'amber',
  awaiting: 'danger',
  resolved: 'success',
  void: 'neutral',
};

export const OUTCOME_LABELS: Record<Outcome, string> = { yes: 'Yes', no: 'No', void: 'Void' };

export function statusLabel(status: QuestionStatus): string {
  return LABELS[status];
}

/** The question's status in words; a resolved yes/no question also says how it resolved. */
export function StatusPill({ status, outcome }: { status: QuestionStatus; outcome?: AnyOutcome | null | undefined }) {
  const text = status === 'resolved' && (outcome === 'yes' || outcome === 'no') ? `Resolved · ${OUTCOME_LABELS[outcome]}` : LABELS[status];
  return (
    <span className="status-pill" data-status={status}>
      <Badge tone={TONES[status]}>{text}</Badge>
    </span>
  );
}
