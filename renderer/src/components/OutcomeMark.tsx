/**
 * How Yes, No and Void look wherever they are actions (the Desk's one-click resolve, the
 * resolve dialog's choices): each with its own icon and its own style — Yes filled, No
 * outlined, Void plain and set apart — so they differ in shape and words, not only in colour,
 * and two identical buttons never sit side by side.
 */
import type { Outcome } from '../../../shared/domain';
import { Button } from './Button';

export const OUTCOME_HINTS: Record<Outcome, string> = {
  yes: 'It happened',
  no: 'It did not happen',
  void: 'It cannot be resolved fairly; never scored',
};

/** The icon of an outcome, hidden from screen readers (the label says it). */
export function OutcomeIcon({ outcome }: { outcome: Outcome }) {
  return (
    <svg className="outcome-icon" width="14" height="14" viewBox="0 0 14 14" aria-hidden="true" focusable="false">
      {outcome === 'yes' ? <path d="M2.5 7.5l3 3 6-7" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round" /> : null}
      {outcome === 'no' ? <path d="M3 3l8 8M11 3l-8 8" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" /> : null}
      {outcome === 'void' ? (
        <>
          <circle cx="7" cy="7" r="5" fill="none" stroke="currentColor" strokeWidth="1.8" />
          <path d="M3.5 10.5l7-7" stroke="currentColor" strokeWidth="1.8" />
        </>
      ) : null}
    </svg>
  );
}

export interface OutcomeButtonProps {
  outcome: Outcome;
  label: string;
  onClick: () => void;
  disabled?: boolean;
}

export function OutcomeButton({ outcome, label, onClick, disabled }: OutcomeButtonProps) {
  return (
    <Button size="sm" variant="secondary" className={`outcome-btn outcome-btn--${outcome}`} data-outcome={outcome} title={`${label}: ${OUTCOME_HINTS[outcome]}`} disabled={disabled} onClick={onClick}>
      <OutcomeIcon outcome={outcome} />
      {label}
    </Button>
  );
}
