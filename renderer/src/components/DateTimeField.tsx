/**
 * A date and time on a named time zone's clocks ("31/03/2026, 17:00, Europe/London"), which is
 * how people think of a deadline. The date is typed in the user's own order (dd/mm/yyyy in
 * the UK, mm/dd/yyyy in the US; a calendar button helps), the time as the locale writes it,
 * and the line under the boxes reads the result back in words with its zone label, so a
 * slip (the 3rd of April for the 4th of March) shows before saving.
 *
 * The form keeps "YYYY-MM-DDTHH:MM" (or '' while the boxes are empty or do not yet hold a
 * date and time); `localToIso` (dates.ts) turns it and the zone into the instant the diary
 * stores. Text that is not a date is reported to the form, which will not save it.
 */
import { useId, useMemo, useState } from 'react';
import { parseLocalDateTime } from '../../../shared/time';
import {
  dateOrder,
  formatDateText,
  formatInstant,
  formatTimeText,
  localToIso,
  parseDateText,
  parseTimeText,
  splitDateTimeText,
  timePlaceholder,
  timeZoneNames,
  wallText,
  zoneName,
} from '../dates';
import { useFieldProblem, useSaveRefused } from '../forms';
import { afterPress } from './afterPress';
import { CalendarButton } from './CalendarButton';
import { FieldError } from './FieldError';
import { errorId, hintId } from './FieldFrame';

export interface DateTimeFieldProps {
  label: string;
  /** "YYYY-MM-DDTHH:MM" or '' */
  local: string;
  onLocalChange: (local: string) => void;
  timeZone: string;
  /** When given, the zone can be changed beside the date; otherwise it is shown as text. */
  onTimeZoneChange?: ((timeZone: string) => void) | undefined;
  hint?: string | undefined;
  error?: string | undefined;
  required?: boolean | undefined;
  id?: string | undefined;
}

interface Texts {
  date: string;
  time: string;
}

function textsFor(local: string): Texts {
  const wall = parseLocalDateTime(local);
  return wall ? { date: formatDateText(wall), time: formatTimeText(wall) } : { date: '', time: '' };
}

type Reading = { local: string; problem: null } | { local: ''; problem: string | null };

/** What the two boxes mean together. */
function read(texts: Texts): Reading {
  const date = texts.date.trim();
  const time = texts.time.trim();
  if (date === '' && time === '') return { local: '', problem: null };
  if (date === '') return { local: '', problem: `add the date (${dateOrder().placeholder})` };
  const day = parseDateText(date);
  if (!day.ok) return { local: '', problem: day.error };
  if (time === '') return { local: '', problem: `add the time (${timePlaceholder()})` };
  const clock = parseTimeText(time);
  if (!clock.ok) return { local: '', problem: clock.error };
  return { local: wallText(day.value, clock.value), problem: null };
}

export function DateTimeField({ label, local, onLocalChange, timeZone, onTimeZoneChange, hint, error, required, id }: DateTimeFieldProps) {
  const generated = useId();
  const controlId = id ?? generated;
  const timeId = `${controlId}-time`;
  const readbackId = `${controlId}-readback`;
  const zones = useMemo(() => (onTimeZoneChange ? timeZoneNames(timeZone) : []), [onTimeZoneChange, timeZone]);
  const [texts, setTexts] = useState<Texts>(() => textsFor(local));
  const [touched, setTouched] = useState(false);
  const refused = useSaveRefused();
  const reading = read(texts);

  // The form changed the value itself (a reset, "now"): show that instead of the old text.
  if (local !== reading.local && !(local === '' && reading.problem !== null)) {
    const synced = textsFor(local);
    if (read(synced).local === local) setTexts(synced);
  }

  useFieldProblem(reading.problem ? `${label}: ${reading.problem}` : null);

  function change(next: Texts) {
    // A date and time pasted or typed into the date box ("04/12/2026 14:30", a copied read-back line) fills both boxes.
    const whole = splitDateTimeText(next.date, timeZone) ?? next;
    setTexts(whole);
    onLocalChange(read(whole).local);
  }

  const shownError = (touched || refused || error) && reading.problem ? sentence(reading.problem) : error;
  const iso = reading.local ? localToIso(reading.local, timeZone) : null;
  const readback = iso ? formatInstant(iso, timeZone, { weekday: true }) : null;
  const described = [hint ? hintId(controlId) : '', readback ? readbackId : '', shownError ? errorId(controlId) : ''].filter(Boolean).join(' ') || undefined;
  const order = dateOrder();

  return (
    <div
      className={['field', 'datetime', shownError ? 'field--invalid' : ''].filter(Boolean).join(' ')}
      onBlur={(event) => {
        // Moving from the date box to the time box is still typing; leaving the field is not.
        // The message it may bring waits for the press that left it (afterPress).
        if (!event.currentTarget.contains(event.relatedTarget as Node | null)) afterPress(() => setTouched(true));
      }}
    >
      <label className="field__label" htmlFor={controlId}>
        {label}
        {required ? <span className="field__required" aria-hidden="true"> *</span> : null}
      </label>
      <span className="datetime__row">
        <input
          type="text"
          id={controlId}
          className="input input--date"
          inputMode="numeric"
          autoComplete="off"
          placeholder={order.placeholder}
          value={texts.date}
          required={required}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={described}
          onChange={(event) => change({ ...texts, date: event.target.value })}
        />
        <input
          type="text"
          id={timeId}
          className="input input--time"
          autoComplete="off"
          placeholder={timePlaceholder()}
          value={texts.time}
          aria-label={`${label}: time`}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={described}
          onChange={(event) => change({ ...texts, time: event.target.value })}
        />
        <CalendarButton
          label={label}
          current={reading.local.slice(0, 10)}
          boxId={controlId}
          onPick={(date) => change({ ...texts, date: formatDateText(date) })}
        />
        {onTimeZoneChange ? (
          <select
            className="input input--select datetime__zone"
            value={timeZone}
            aria-label={`Time zone for ${label.toLowerCase()}`}
            title="Time zone"
            onChange={(event) => onTimeZoneChange(event.target.value)}
          >
            {zones.map((zone) => (
              <option key={zone} value={zone}>
                {zoneName(zone)}
              </option>
            ))}
          </select>
        ) : (
          <span className="datetime__zone-text">{zoneName(timeZone)}</span>
        )}
      </span>
      {readback ? (
        <p className="field__hint datetime__readback" id={readbackId} data-testid="datetime-readback">
          {readback}
        </p>
      ) : null}
      {hint ? (
        <p className="field__hint" id={hintId(controlId)}>
          {hint}
        </p>
      ) : null}
      <FieldError id={errorId(controlId)} message={shownError} />
    </div>
  );
}

function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
