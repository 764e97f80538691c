import { clockTimesAsShown } from '../dates';

/**
 * The diary's warning as the app shows it: without its closing advice for API callers
 * ("Nothing was changed. If … confirm (the request's confirm: true)."), since in the app the
 * dialog's buttons are the advice, and with its times written as the window writes dates.
 */
export function warningText(reason: string): string {
  const cut = reason.indexOf(' Nothing was changed.');
  return clockTimesAsShown(cut > 0 ? reason.slice(0, cut) : reason);
}
