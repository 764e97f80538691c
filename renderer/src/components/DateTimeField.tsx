/**
 * A date and time on a named time zone's clocks ("31 March, 17:00, Europe/London"), which is
 * how people think of a deadline. The form keeps the wall-clock text and the zone; `localToIso`
 * (renderer/src/dates.ts) turns the pair into the instant the diary stores.
 */
import { useId, useMemo } from 'react';
import { timeZoneNames } from '../dates';
import { FieldFrame, describedBy } from './FieldFrame';

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

export function DateTimeField({ label, local, onLocalChange, timeZone, onTimeZoneChange, hint, error, required, id }: DateTimeFieldProps) {
  const generated = useId();
  const controlId = id ?? generated;
  const zones = useMemo(() => (onTimeZoneChange ? timeZoneNames(timeZone) : []), [onTimeZoneChange, timeZone]);
  return (
    <FieldFrame controlId={controlId} label={label} hint={hint} error={error} required={required} className="datetime">
      <span className="datetime__row">
        <input
          type="datetime-local"
          id={controlId}
          className="input input--datetime"
          value={local}
          required={required}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(controlId, hint, error)}
          onChange={(event) => onLocalChange(event.target.value)}
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
                {zone.replaceAll('_', ' ')}
              </option>
            ))}
          </select>
        ) : (
          <span className="datetime__zone-text">{timeZone.replaceAll('_', ' ')}</span>
        )}
      </span>
    </FieldFrame>
  );
}
