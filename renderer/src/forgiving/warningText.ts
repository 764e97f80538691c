import { isValidTimeZone } from '../../../shared/time';
import { formatInstant, localToIso } from '../dates';

/**
 * A time as the diary writes it for every caller ("2027-03-13 17:00 Europe/London", its
 * `onClock`): a date, a 24-hour wall time and the zone it is read on.
 */
const ON_CLOCK = /\b(\d{4}-\d{2}-\d{2}) (\d{2}:\d{2}) ([A-Za-z_]+(?:\/[A-Za-z0-9_+-]+)+|UTC)\b/g;

/**
 * The diary's warning as the app shows it: without its closing advice for API callers
 * ("Nothing was changed. If … confirm (the request's confirm: true)."), since in the app the
 * dialog's buttons are the advice, and with its times written as every other date in the
 * window ("13 Mar 2027, 17:00 GMT", the user's locale and clock) rather than as the diary's
 * neutral text.
 */
export function warningText(reason: string): string {
  const cut = reason.indexOf(' Nothing was changed.');
  const text = cut > 0 ? reason.slice(0, cut) : reason;
  return text.replace(ON_CLOCK, (whole, date: string, time: string, zone: string) => {
    if (!isValidTimeZone(zone)) return whole;
    const iso = localToIso(`${date}T${time}`, zone);
    return iso === null ? whole : formatInstant(iso, zone);
  });
}
