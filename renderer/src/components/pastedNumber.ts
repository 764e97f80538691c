/**
 * Text pasted into a number box. The browser's number box takes a paste only when the whole
 * text is a number: "2,100 pallets" copied from a report left the box empty, and the form
 * then said "Enter a value" as if nothing had been pasted. The box's own unit (its suffix)
 * and spaces around the number are taken off, since the box already says the unit; what
 * remains goes in as typed (a comma is dropped, as when typed, and the box says so). Text
 * that is still not a number is refused with a message naming it, never silently.
 */

/** A number as a number box takes it, thousands commas allowed ("2,100.5", "-3", "1e3"). */
const NUMBER_TEXT = /^[-+]?(?:\d[\d,]*)?(?:\.\d*)?(?:[eE][-+]?\d+)?$/;

export type PastedNumber =
  /** Let the browser paste it as it is. */
  | { kind: 'as-is' }
  /** Paste this instead (the unit or spaces taken off). */
  | { kind: 'cleaned'; text: string }
  /** Not a number: paste nothing and say so. */
  | { kind: 'refused'; text: string };

export function readPastedNumber(pasted: string, unit?: string): PastedNumber {
  let text = pasted.trim();
  const u = unit?.trim();
  if (u && text.length > u.length && text.toLowerCase().endsWith(u.toLowerCase())) text = text.slice(0, -u.length).trim();
  if (text === '' || !/\d/.test(text) || !NUMBER_TEXT.test(text)) return { kind: 'refused', text: pasted.trim() };
  return text === pasted ? { kind: 'as-is' } : { kind: 'cleaned', text };
}
