/**
 * The diary's warning without its closing advice for API callers ("Nothing was changed. If
 * … confirm (the request's confirm: true)."): in the app the dialog's buttons are the advice.
 */
export function warningText(reason: string): string {
  const cut = reason.indexOf(' Nothing was changed.');
  return cut > 0 ? reason.slice(0, cut) : reason;
}
