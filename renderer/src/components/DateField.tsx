/**
 * A calendar day typed in the user's own order (31/03/2026 in the UK), for filters. The value
 * is "YYYY-MM-DD" once the box holds a date, '' when it is empty, and the text as typed
 * otherwise, so the filter's own check (`dayRange` in dates.ts) says it is not a date rather
 * than silently dropping it.
 */
import { useId, useState } from 'react';
import { parseLocalDateTime } from '../../../shared/time';
import { dateOrder, formatDateText, parseDateText } from '../dates';
import { afterPress } from './afterPress';
import { CalendarButton } from './CalendarButton';
import { FieldFrame, describedBy } from './FieldFrame';

export interface DateFieldProps {
  label: string;
  /** "YYYY-MM-DD", '' or the text typed. */
  value: string;
  onChange: (value: string) => void;
  hint?: string | undefined;
  error?: string | undefined;
}

const pad = (n: number) => String(n).padStart(2, '0');

function isoDay(date: { year: number; month: number; day: number }): string {
  return `${String(date.year).padStart(4, '0')}-${pad(date.month)}-${pad(date.day)}`;
}

/** What the box holds, as the value the filter keeps. */
function valueOf(text: string): string {
  if (text.trim() === '') return '';
  const day = parseDateText(text);
  return day.ok ? isoDay(day.value) : text;
}

function textOf(value: string): string {
  const wall = parseLocalDateTime(`${value}T00:00`);
  return wall ? formatDateText(wall) : value;
}

export function DateField({ label, value, onChange, hint, error }: DateFieldProps) {
  const controlId = useId();
  const [text, setText] = useState(() => textOf(value));
  const [typing, setTyping] = useState(false);
  // Set from outside (a reset, a link): show the new day.
  if (valueOf(text) !== value && textOf(value) !== text) setText(textOf(value));
  const typed = text.trim() === '' ? null : parseDateText(text);
  // Its own reading says more than the filter's "must be a date"; half a date is not yet
  // wrong while the box is being typed in.
  const problem = typed && !typed.ok ? (typing ? undefined : typed.error) : error;
  const shownError = problem ? sentence(problem) : undefined;

  function change(next: string) {
    setText(next);
    onChange(valueOf(next));
  }

  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={shownError} className="date-field">
      <span className="datetime__row">
        <input
          type="text"
          id={controlId}
          className="input input--date"
          inputMode="numeric"
          autoComplete="off"
          placeholder={dateOrder().placeholder}
          value={text}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={describedBy(controlId, hint, shownError)}
          onChange={(event) => {
            setTyping(true);
            change(event.target.value);
          }}
          onBlur={() => afterPress(() => setTyping(false))}
        />
        <CalendarButton label={label} current={valueOf(text).length === 10 ? valueOf(text) : ''} boxId={controlId} onPick={(date) => change(formatDateText(date))} />
      </span>
    </FieldFrame>
  );
}

function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
