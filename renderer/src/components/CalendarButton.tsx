/**
 * A button beside a typed date that opens the browser's own calendar (a hidden date input's
 * picker) for people who would rather point than type. The typed box stays the field: the
 * calendar only fills it, in the user's own date order.
 */
import { useRef } from 'react';
import { parseLocalDateTime } from '../../../shared/time';

export interface CalendarButtonProps {
  /** Names the field, e.g. "Closes". */
  label: string;
  /** The date shown now, "YYYY-MM-DD", or ''. */
  current: string;
  onPick: (date: { year: number; month: number; day: number }) => void;
  /** The typed box, focused instead when this browser has no calendar to open. */
  boxId: string;
}

export function CalendarButton({ label, current, onPick, boxId }: CalendarButtonProps) {
  const picker = useRef<HTMLInputElement>(null);

  function open() {
    const input = picker.current;
    if (!input) return;
    input.value = current;
    try {
      input.showPicker();
    } catch {
      document.getElementById(boxId)?.focus();
    }
  }

  return (
    <span className="calendar-button">
      <button type="button" className="btn btn--secondary btn--sm calendar-button__button" aria-label={`${label}: choose the date on a calendar`} title="Choose on a calendar" onClick={open}>
        <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" focusable="false">
          <rect x="1.5" y="2.5" width="13" height="12" rx="1.5" fill="none" stroke="currentColor" strokeWidth="1.4" />
          <path d="M1.5 6.5h13M5 1v3M11 1v3" stroke="currentColor" strokeWidth="1.4" fill="none" />
        </svg>
      </button>
      <input
        ref={picker}
        type="date"
        className="calendar-button__picker"
        tabIndex={-1}
        aria-hidden="true"
        onChange={(event) => {
          const picked = parseLocalDateTime(`${event.target.value}T00:00`);
          if (picked) {
            onPick(picked);
            document.getElementById(boxId)?.focus();
          }
        }}
      />
    </span>
  );
}
