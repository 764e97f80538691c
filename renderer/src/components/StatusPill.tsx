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

/**
 * The question's status in words; a resolved question also says how it resolved: Yes or No,
 * or for another type what `resolved` says (the option, the value).
 */
export function StatusPill({ status, outcome, resolved }: { status: QuestionStatus; outcome?: AnyOutcome | null | undefined; resolved?: string | null | undefined }) {
  const how = outcome === 'yes' || outcome === 'no' ? OUTCOME_LABELS[outcome] : resolved;
  const text = status === 'resolved' && how ? `Resolved · ${how}` : LABELS[status];
  return (
    <span className="status-pill" data-status={status}>
      <Badge tone={TONES[status]}>{text}</Badge>
    </span>
  );
}
